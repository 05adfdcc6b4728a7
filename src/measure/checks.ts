// Pass/fail checks of probe measurements against limits. A check names a probe, a metric and a limit
// (max, min, or both); the result says what was measured, against what, and why it passed or failed.
// A check that cannot be evaluated (unknown probe, no edge, a quantity that could not be measured)
// FAILS with the reason — it never throws and never passes by default.
import { bandVolts, type BandSpec, type EdgeDirection, type EdgeMeasurement } from './edges.js';
import { formatPercent, formatSI } from './format.js';
import type { CheckLimit, LimitUnit } from './limits.js';
import { measureProbe, type MeasureOptions, type ProbeMeasurements } from './summary.js';
import type { Samples } from './levels.js';

export const METRIC_NAMES = [
  'overshoot',
  'undershoot',
  'preshoot',
  'ringback',
  'settling',
  'delay',
  'delayThreshold',
  'rise',
  'fall',
  'rise2080',
  'fall2080',
  'min',
  'max',
  'final',
  'noiseMarginHigh',
  'noiseMarginLow',
  'crossings',
  'monotonic',
  'edges',
] as const;

export type MetricName = (typeof METRIC_NAMES)[number];

/** Which edges an edge metric looks at. */
export type EdgeSelection = 'rising' | 'falling' | 'all';

export interface CheckSpec {
  probe: string;
  /** One of METRIC_NAMES; anything else fails with a message. */
  metric: string;
  /** Upper limit: the worst (largest) value over the selected edges must not exceed it. */
  max?: CheckLimit;
  /** Lower limit: the smallest value over the selected edges must not be below it. */
  min?: CheckLimit;
  /** Settling only: half-width of the band, '%' of the amplitude or volts; default ±5 %. */
  band?: CheckLimit;
  /** Edge metrics only: which edges (default 'all'; rise* → rising, fall* → falling). */
  edges?: EdgeSelection;
}

export interface CheckResult {
  probe: string;
  metric: string;
  /** Human-readable limit, e.g. "max 10 %", "min 0.2 V", "max 5 ns (±3 % band)". */
  limit: string;
  /** The deciding measured value in the limit's unit (V, s, %, count), or null when not measurable. */
  measured: number | null;
  measuredText: string;
  unit: LimitUnit | null;
  pass: boolean;
  message: string;
  /** Edge (index) the deciding value came from, when it came from one. */
  edge: number | null;
  /** Instant (s) of that edge's 50 % crossing (or of the source edge, for delays). */
  time: number | null;
}

interface MetricDef {
  units: LimitUnit[];
  kind: 'edge' | 'delay' | 'probe' | 'count' | 'monotonic';
  dir?: EdgeDirection;
  describe: string;
}

/** Metric catalogue: allowed limit units and meaning (documented in docs/measurements.md). */
export const METRICS: Readonly<Record<MetricName, MetricDef>> = {
  overshoot: { units: ['V', '%'], kind: 'edge', describe: 'post-transition overshoot beyond the final state level, worst over edges' },
  undershoot: { units: ['V', '%'], kind: 'edge', describe: 'post-transition undershoot back past the final state level, worst over edges' },
  preshoot: { units: ['V', '%'], kind: 'edge', describe: 'pre-transition preshoot beyond the initial state level, worst over edges' },
  ringback: { units: ['V', '%'], kind: 'edge', describe: 'largest return toward the threshold after first crossing it, worst over edges' },
  settling: { units: ['s'], kind: 'edge', describe: 'time from the 50 % instant until the waveform stays within ±band of the final level' },
  delay: { units: ['s'], kind: 'delay', describe: 'source 50 % instant to probe 50 % instant, per matched edge' },
  delayThreshold: {
    units: ['s'],
    kind: 'delay',
    describe: 'source 50 % instant to the probe crossing vih (rising) / vil (falling): last crossing for max, first for min',
  },
  rise: { units: ['s'], kind: 'edge', dir: 'rising', describe: '10–90 % rise time' },
  fall: { units: ['s'], kind: 'edge', dir: 'falling', describe: '90–10 % fall time' },
  rise2080: { units: ['s'], kind: 'edge', dir: 'rising', describe: '20–80 % rise time' },
  fall2080: { units: ['s'], kind: 'edge', dir: 'falling', describe: '80–20 % fall time' },
  min: { units: ['V'], kind: 'probe', describe: 'minimum sample value' },
  max: { units: ['V'], kind: 'probe', describe: 'maximum sample value' },
  final: { units: ['V'], kind: 'probe', describe: 'last sample value' },
  noiseMarginHigh: { units: ['V'], kind: 'probe', describe: 'lowest level while high minus vih, worst over the record' },
  noiseMarginLow: { units: ['V'], kind: 'probe', describe: 'vil minus highest level while low, worst over the record' },
  crossings: { units: ['count'], kind: 'edge', describe: 'threshold crossings per edge (vih/vil with thresholds, else 50 %), worst over edges' },
  monotonic: { units: ['V', '%'], kind: 'monotonic', describe: 'every edge monotonic between 10 % and 90 % (optional max reversal)' },
  edges: { units: ['count'], kind: 'count', describe: 'number of complete edges of the selected direction' },
};

export function isMetricName(s: string): s is MetricName {
  return (METRIC_NAMES as readonly string[]).includes(s);
}

const DEFAULT_BAND: CheckLimit = { value: 5, unit: '%', text: '5%' };

function fmt(value: number | null, unit: LimitUnit | null): string {
  if (value === null) return 'n/a';
  switch (unit) {
    case '%':
      return formatPercent(value);
    case 'V':
      return formatSI(value, 'V');
    case 's':
      return formatSI(value, 's');
    default:
      return String(value);
  }
}

function fmtLimit(l: CheckLimit): string {
  return fmt(l.value, l.unit);
}

/** "max 10 %", "min 0.2 V", "0.2 V … 0.5 V", "max 5 ns (±3 % band)". */
export function describeLimit(spec: CheckSpec): string {
  let s: string;
  if (spec.max && spec.min) s = `${fmtLimit(spec.min)} … ${fmtLimit(spec.max)}`;
  else if (spec.max) s = `max ${fmtLimit(spec.max)}`;
  else if (spec.min) s = `min ${fmtLimit(spec.min)}`;
  else s = spec.metric === 'monotonic' ? 'monotonic' : '(no limit)';
  if (spec.metric === 'settling') s += ` (±${fmtLimit(spec.band ?? DEFAULT_BAND)} band)`;
  if (spec.edges && spec.edges !== 'all') s += ` [${spec.edges} edges]`;
  return s;
}

/** Problems with a check spec (empty when it can be evaluated). */
export function validateCheck(spec: CheckSpec): string[] {
  const p: string[] = [];
  if (!isMetricName(spec.metric)) {
    p.push(`unknown metric "${spec.metric}"; known: ${METRIC_NAMES.join(', ')}`);
    return p;
  }
  const def = METRICS[spec.metric];
  if (!spec.max && !spec.min && spec.metric !== 'monotonic') p.push(`metric "${spec.metric}" needs "max" and/or "min"`);
  for (const key of ['max', 'min'] as const) {
    const l = spec[key];
    if (l && !def.units.includes(l.unit)) {
      p.push(`"${key}" of metric "${spec.metric}" is ${l.text ?? `${l.value} ${l.unit}`}: expected ${def.units.map(unitWord).join(' or ')}`);
    }
    if (l && !Number.isFinite(l.value)) p.push(`"${key}" is not a finite number`);
  }
  if (spec.max && spec.min && spec.max.unit === spec.min.unit && spec.min.value > spec.max.value) {
    p.push(`"min" (${fmtLimit(spec.min)}) is above "max" (${fmtLimit(spec.max)})`);
  }
  if (spec.band) {
    if (spec.metric !== 'settling') p.push(`"band" only applies to metric "settling"`);
    else if (spec.band.unit !== '%' && spec.band.unit !== 'V') p.push(`"band" must be a percentage of the amplitude or volts, got ${spec.band.text ?? spec.band.value}`);
    else if (!(spec.band.value > 0)) p.push(`"band" must be positive`);
  }
  if (spec.edges !== undefined && !['rising', 'falling', 'all'].includes(spec.edges)) p.push(`"edges" must be "rising", "falling" or "all"`);
  if (spec.edges !== undefined && def.kind !== 'edge' && def.kind !== 'delay' && def.kind !== 'count' && def.kind !== 'monotonic') {
    p.push(`"edges" does not apply to metric "${spec.metric}"`);
  }
  return p;
}

function unitWord(u: LimitUnit): string {
  return u === '%' ? 'a percentage ("10%")' : u === 'V' ? 'volts ("0.2V")' : u === 's' ? 'seconds ("5ns")' : 'a plain count ("1")';
}

/** The settling band a check asks for, as a BandSpec. */
export function checkBand(spec: CheckSpec): BandSpec {
  const b = spec.band ?? DEFAULT_BAND;
  return b.unit === 'V' ? { volts: b.value } : { fraction: b.value / 100 };
}

/** Settling bands the checks of one probe need measured (always including the default ±5 %). */
export function requiredSettleBands(checks: readonly CheckSpec[], probe: string): BandSpec[] {
  const out: BandSpec[] = [{ fraction: 0.05 }];
  const key = (b: BandSpec): string => ('fraction' in b ? `f${b.fraction}` : `v${b.volts}`);
  const seen = new Set(out.map(key));
  for (const c of checks) {
    if (c.probe !== probe || c.metric !== 'settling') continue;
    const b = checkBand(c);
    if (!seen.has(key(b))) {
      seen.add(key(b));
      out.push(b);
    }
  }
  return out;
}

interface Item {
  /** Value compared with `max`. */
  value: number | null;
  /** Value compared with `min` (differs from `value` only for delayThreshold). */
  lowValue: number | null;
  reason?: string;
  lowReason?: string;
  edge: number | null;
  time: number | null;
  label: string;
}

function edgeLabel(e: EdgeMeasurement): string {
  return `${e.direction} edge ${e.index} at ${formatSI(e.t50, 's')}`;
}

/** Evaluate checks against measurements already made (e.g. from summary.json). */
export function evaluateChecks(checks: readonly CheckSpec[], probes: Readonly<Record<string, ProbeMeasurements>>): CheckResult[] {
  return checks.map((c) => evaluateOne(c, probes));
}

function evaluateOne(spec: CheckSpec, probes: Readonly<Record<string, ProbeMeasurements>>): CheckResult {
  const limit = describeLimit(spec);
  const unit: LimitUnit | null = (spec.max ?? spec.min)?.unit ?? (spec.metric === 'monotonic' ? 'V' : null);
  const fail = (message: string, extra: Partial<CheckResult> = {}): CheckResult => ({
    probe: spec.probe,
    metric: spec.metric,
    limit,
    measured: null,
    measuredText: 'n/a',
    unit,
    pass: false,
    message,
    edge: null,
    time: null,
    ...extra,
  });
  const problems = validateCheck(spec);
  if (problems.length > 0) return fail(`invalid check: ${problems.join('; ')}`);
  const metric = spec.metric as MetricName;
  const def = METRICS[metric];
  const m = Object.prototype.hasOwnProperty.call(probes, spec.probe) ? probes[spec.probe] : undefined;
  if (!m) return fail(`no probe named "${spec.probe}" (probes: ${Object.keys(probes).join(', ') || 'none'})`);
  const A = m.levels?.amplitude ?? null;

  // ---- gather the values the limit applies to ----
  let items: Item[] = [];
  let note = '';
  const selection: EdgeSelection = def.dir ?? spec.edges ?? 'all';
  if (def.kind === 'probe') {
    const value = metric === 'min' ? m.min : metric === 'max' ? m.max : metric === 'final' ? m.final : metric === 'noiseMarginHigh' ? m.noiseMargins?.high ?? null : m.noiseMargins?.low ?? null;
    const reasonKey = metric === 'noiseMarginHigh' ? 'noiseMargins.high' : metric === 'noiseMarginLow' ? 'noiseMargins.low' : metric;
    const edge = metric === 'noiseMarginHigh' ? m.noiseMargins?.highEdge ?? null : metric === 'noiseMarginLow' ? m.noiseMargins?.lowEdge ?? null : null;
    items = [{ value, lowValue: value, reason: m.reasons[reasonKey] ?? m.reasons.noiseMargins, edge, time: edge !== null ? m.edges[edge]?.t50 ?? null : null, label: `probe ${spec.probe}` }];
  } else if (def.kind === 'count') {
    const n = m.edges.filter((e) => e.complete && (selection === 'all' || e.direction === selection)).length;
    items = [{ value: n, lowValue: n, edge: null, time: null, label: `probe ${spec.probe}` }];
  } else if (def.kind === 'delay') {
    if (m.delays === null) return fail(`probe "${spec.probe}" has no delay measurements: ${m.reasons.delays ?? 'no source waveform'}`);
    let ds = m.delays.filter((d) => selection === 'all' || d.direction === selection);
    if (ds.length === 0) return fail(`the source waveform of probe "${spec.probe}" has no ${selection === 'all' ? '' : selection + ' '}edge${m.reasons.delays ? `: ${m.reasons.delays}` : ''}`);
    // Source edges whose probe edge would come after the end of the record are skipped, as long as
    // some source edge did reach the probe.
    const cut = ds.filter((d) => d.cutOff);
    if (cut.length > 0 && cut.length < ds.length) {
      note = ` (${cut.length} source edge(s) near the end of the record, with no probe edge after them, not checked)`;
      ds = ds.filter((d) => !d.cutOff);
    }
    for (const d of ds) {
      // delay: 50 % to 50 %. delayThreshold: max compares the settled (last) threshold crossing, min the first.
      const plain = metric === 'delay';
      items.push({
        value: plain ? d.delay50 : d.delayThresholdLast,
        lowValue: plain ? d.delay50 : d.delayThresholdFirst,
        reason: plain ? d.reasons.delay50 : d.reasons.delayThresholdLast,
        lowReason: plain ? d.reasons.delay50 : d.reasons.delayThresholdFirst,
        edge: d.probeEdge,
        time: d.sourceT50,
        label: `${d.direction} source edge ${d.sourceEdge} at ${formatSI(d.sourceT50, 's')}`,
      });
    }
  } else {
    if (m.edges.length === 0) return fail(`probe "${spec.probe}" has no edge: ${m.noEdgeReason ?? 'no transition found'}`);
    const sel = m.edges.filter((e) => selection === 'all' || e.direction === selection);
    if (sel.length === 0) return fail(`probe "${spec.probe}" has no ${selection} edge (it has ${m.edgeCount.rising} rising, ${m.edgeCount.falling} falling)`);
    const complete = sel.filter((e) => e.complete);
    if (complete.length < sel.length) note = ` (${sel.length - complete.length} edge(s) cut off by the end of the record not checked)`;
    if (complete.length === 0) return fail(`probe "${spec.probe}" has no complete ${selection === 'all' ? '' : selection + ' '}edge: the record ends during the transition`);
    const pct = (spec.max ?? spec.min)?.unit === '%';
    let bandV: number | null = null;
    if (metric === 'settling') bandV = A !== null ? bandVolts(checkBand(spec), A) : null;
    for (const e of complete) {
      let value: number | null = null;
      let reason: string | undefined;
      switch (metric) {
        case 'overshoot':
          value = pct ? e.overshootPct : e.overshootV;
          reason = e.reasons.overshootV;
          break;
        case 'undershoot':
          value = pct ? e.undershootPct : e.undershootV;
          reason = e.reasons.undershootV;
          break;
        case 'preshoot':
          value = pct ? e.preshootPct : e.preshootV;
          reason = e.reasons.preshootV;
          break;
        case 'ringback':
          value = pct ? e.ringbackPct : e.ringbackV;
          reason = e.reasons.ringbackV;
          break;
        case 'rise':
        case 'fall':
          value = e.duration1090;
          reason = e.reasons.duration1090;
          break;
        case 'rise2080':
        case 'fall2080':
          value = e.duration2080;
          reason = e.reasons.duration2080;
          break;
        case 'crossings':
          value = e.thresholdCrossings ?? e.crossings;
          break;
        case 'monotonic':
          value = pct ? (A ? (100 * e.reversalV) / A : null) : e.reversalV;
          break;
        case 'settling': {
          const s = e.settling.find((x) => bandV !== null && Math.abs(x.bandV - bandV) <= 1e-9 * Math.max(Math.abs(bandV), 1e-30));
          if (!s) return fail(`settling in a ±${fmtLimit(spec.band ?? DEFAULT_BAND)} band was not measured for probe "${spec.probe}" (measure with settleBands including it, e.g. via checkWaveforms)`);
          value = s.time;
          reason = s.reason;
          break;
        }
        default:
          break;
      }
      items.push({ value, lowValue: value, reason, edge: e.index, time: e.t50, label: edgeLabel(e) });
    }
    if (metric === 'monotonic' && !spec.max) {
      const bad = complete.filter((e) => !e.monotonic);
      const worst = complete.reduce((a, e) => (e.reversalV > a.reversalV ? e : a), complete[0]!);
      const measured = worst.reversalV;
      if (bad.length > 0) {
        return fail(`${bad.length} of ${complete.length} edges are not monotonic; worst: ${edgeLabel(worst)} reverses by ${formatSI(measured, 'V')}${note}`, {
          measured,
          measuredText: formatSI(measured, 'V'),
          edge: worst.index,
          time: worst.t50,
        });
      }
      return {
        probe: spec.probe,
        metric: spec.metric,
        limit,
        measured,
        measuredText: formatSI(measured, 'V'),
        unit: 'V',
        pass: true,
        message: `all ${complete.length} edges are monotonic${note}`,
        edge: worst.index,
        time: worst.t50,
      };
    }
  }

  // ---- compare ----
  for (const side of ['max', 'min'] as const) {
    if (!spec[side]) continue;
    const f = items.find((i) => (side === 'max' ? i.value : i.lowValue) === null);
    if (f) {
      const why = (side === 'max' ? f.reason : f.lowReason ?? f.reason) ?? 'not measurable';
      const more = items.filter((i) => (side === 'max' ? i.value : i.lowValue) === null).length - 1;
      return fail(`${spec.metric} could not be measured for ${f.label}: ${why}${more > 0 ? ` (and ${more} more)` : ''}`, { edge: f.edge, time: f.time });
    }
  }
  const hiItem = items.reduce((a, b) => (b.value! > a.value! ? b : a));
  const loItem = items.reduce((a, b) => (b.lowValue! < a.lowValue! ? b : a));
  const hi = hiItem.value!;
  const lo = loItem.lowValue!;
  const result = (pass: boolean, item: Item, value: number, message: string): CheckResult => ({
    probe: spec.probe,
    metric: spec.metric,
    limit,
    measured: value,
    measuredText: fmt(value, unit),
    unit,
    pass,
    message: message + note,
    edge: item.edge,
    time: item.time,
  });
  const where = (i: Item): string => (items.length > 1 || i.edge !== null ? ` (worst: ${i.label})` : '');
  const name = spec.metric;
  if (spec.max && hi > spec.max.value) {
    return result(false, hiItem, hi, `${name} ${fmt(hi, unit)} exceeds max ${fmtLimit(spec.max)}${where(hiItem)}`);
  }
  if (spec.min && lo < spec.min.value) {
    return result(false, loItem, lo, `${name} ${fmt(lo, unit)} is below min ${fmtLimit(spec.min)}${where(loItem)}`);
  }
  if (spec.max) {
    const extra = spec.min ? `; smallest ${fmt(lo, unit)} ≥ min ${fmtLimit(spec.min)}` : '';
    return result(true, hiItem, hi, `${name} ${fmt(hi, unit)} within max ${fmtLimit(spec.max)}${where(hiItem)}${extra}`);
  }
  return result(true, loItem, lo, `${name} ${fmt(lo, unit)} meets min ${fmtLimit(spec.min!)}${where(loItem)}`);
}

/** A probe waveform to measure: samples, sample interval and the measurement options. */
export interface ProbeWaveform {
  values: Samples;
  dt: number;
  options?: MeasureOptions;
}

/**
 * Measure every probe (with the settling bands the checks need) and evaluate the checks.
 * Returns the measurements too, so callers can write them to summary.json.
 */
export function checkWaveforms(
  checks: readonly CheckSpec[],
  waveforms: Readonly<Record<string, ProbeWaveform>>,
): { measurements: Record<string, ProbeMeasurements>; results: CheckResult[] } {
  const measurements: Record<string, ProbeMeasurements> = {};
  for (const [name, w] of Object.entries(waveforms)) {
    const bands = [...(w.options?.settleBands ?? []), ...requiredSettleBands(checks, name)];
    measurements[name] = measureProbe(w.values, w.dt, { ...w.options, settleBands: dedupeBands(bands) });
  }
  return { measurements, results: evaluateChecks(checks, measurements) };
}

function dedupeBands(bands: BandSpec[]): BandSpec[] {
  const seen = new Set<string>();
  return bands.filter((b) => {
    const k = 'fraction' in b ? `f${b.fraction}` : `v${b.volts}`;
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
}
