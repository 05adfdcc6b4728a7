// Pass/fail checks of probe measurements against limits. A check names a probe, a metric and a limit
// (max, min, or both); the result says what was measured, against what, and why it passed or failed.
// A check that cannot be evaluated (unknown probe, no edge, a quantity that could not be measured)
// FAILS with the reason — it never throws and never passes by default.
import { bandVolts, type BandSpec, type EdgeDirection, type EdgeMeasurement } from './edge-types.js';
import { formatPercent, formatSI } from './format.js';
import type { CheckLimit, LimitUnit } from './limits.js';
import { measureProbe, type MeasureOptions, type ProbeMeasurements } from './summary.js';
import type { Samples } from './levels.js';
import { keyedRecord } from '../keyed.js';

export const METRIC_NAMES = [
  'overshoot',
  'undershoot',
  'preshoot',
  'ringback',
  'ringbackMargin',
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
  'belowLowRail',
  'aboveHighRail',
  'crosstalk',
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
  /** Number (from 1) of the edge the deciding value came from, when it came from one. */
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
  ringback: { units: ['V', '%'], kind: 'edge', describe: 'return below the settled level after first reaching the far reference level (90 % rising, 10 % falling), worst over edges' },
  ringbackMargin: { units: ['V'], kind: 'edge', describe: 'after first crossing vih (rising) / vil (falling), the closest approach back toward it, as a margin; negative inside the undefined band' },
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
  belowLowRail: { units: ['V'], kind: 'probe', describe: "how far the probe goes below the driver's low rail (below ground for a 0 V low level)" },
  aboveHighRail: { units: ['V'], kind: 'probe', describe: "how far the probe goes above the driver's high rail (its supply)" },
  crosstalk: { units: ['V', '%'], kind: 'probe', describe: "largest departure of a quiet net's probe from its resting level, in volts or % of the largest aggressor swing" },
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
  /** Number of the edge the value came from, when it came from one. */
  edge: number | null;
  time: number | null;
  label: string;
}

/** The items a check compares with its limit, or a failure message when there are none to compare. */
type Gathered = { items: Item[]; note: string } | { failure: string };

function edgeLabel(e: EdgeMeasurement): string {
  return `${e.direction} edge ${e.number} at ${formatSI(e.t50, 's')}`;
}

/** Evaluate checks against measurements already made (e.g. from summary.json). */
export function evaluateChecks(checks: readonly CheckSpec[], probes: Readonly<Record<string, ProbeMeasurements>>): CheckResult[] {
  return checks.map((c) => evaluateOne(c, probes));
}

type ProbeMetric = 'min' | 'max' | 'final' | 'noiseMarginHigh' | 'noiseMarginLow' | 'belowLowRail' | 'aboveHighRail' | 'crosstalk';

/** A probe-level metric: one value for the whole record. */
function probeItems(metric: ProbeMetric, m: ProbeMeasurements, probe: string, pct = false): Gathered {
  const nm = m.noiseMargins;
  const xt = m.crosstalk;
  const xtReason = xt === undefined ? `probe "${probe}" is not on a quiet net (crosstalk is measured on nets whose driver holds a level)` : 'no switching driver to compare with';
  const pick: Record<ProbeMetric, { value: number | null; reason?: string; edge: number | null }> = {
    min: { value: m.min, reason: m.reasons.min, edge: null },
    max: { value: m.max, reason: m.reasons.max, edge: null },
    final: { value: m.final, reason: m.reasons.final, edge: null },
    noiseMarginHigh: { value: nm?.high ?? null, reason: m.reasons['noiseMargins.high'] ?? m.reasons.noiseMargins, edge: nm?.highEdge ?? null },
    noiseMarginLow: { value: nm?.low ?? null, reason: m.reasons['noiseMargins.low'] ?? m.reasons.noiseMargins, edge: nm?.lowEdge ?? null },
    belowLowRail: { value: m.rails?.belowLowRailV ?? null, reason: m.reasons.rails, edge: null },
    aboveHighRail: { value: m.rails?.aboveHighRailV ?? null, reason: m.reasons.rails, edge: null },
    crosstalk: { value: xt ? (pct ? xt.peakPct : Math.abs(xt.peakV)) : null, reason: xt && (!pct || xt.peakPct !== null) ? undefined : xtReason, edge: null },
  };
  const { value, reason, edge } = pick[metric];
  const e = edge !== null ? m.edges.find((x) => x.number === edge) : undefined;
  return { items: [{ value, lowValue: value, reason, edge, time: e?.t50 ?? null, label: e ? `the state after ${edgeLabel(e)}` : `probe ${probe}` }], note: '' };
}

/** Number of complete edges of the selected direction. */
function countItems(m: ProbeMeasurements, selection: EdgeSelection, probe: string): Gathered {
  const n = m.edges.filter((e) => e.complete && (selection === 'all' || e.direction === selection)).length;
  return { items: [{ value: n, lowValue: n, edge: null, time: null, label: `probe ${probe}` }], note: '' };
}

/** Per matched source edge: delay50, or the threshold delays (last crossing for max, first for min). */
function delayItems(metric: 'delay' | 'delayThreshold', m: ProbeMeasurements, selection: EdgeSelection, probe: string): Gathered {
  if (m.delays === null) return { failure: `probe "${probe}" has no delay measurements: ${m.reasons.delays ?? 'no source waveform'}` };
  let ds = m.delays.filter((d) => selection === 'all' || d.direction === selection);
  if (ds.length === 0) return { failure: `the source waveform of probe "${probe}" has no ${selection === 'all' ? '' : selection + ' '}edge${m.reasons.delays ? `: ${m.reasons.delays}` : ''}` };
  // Source edges whose probe edge would come after the end of the record are skipped, as long as
  // some source edge did reach the probe.
  let note = '';
  const cut = ds.filter((d) => d.cutOff);
  if (cut.length > 0 && cut.length < ds.length) {
    note = ` (${cut.length} source edge(s) near the end of the record, with no probe edge after them, not checked)`;
    ds = ds.filter((d) => !d.cutOff);
  }
  const plain = metric === 'delay';
  const items = ds.map((d) => ({
    value: plain ? d.delay50 : d.delayThresholdLast,
    lowValue: plain ? d.delay50 : d.delayThresholdFirst,
    reason: plain ? d.reasons.delay50 : d.reasons.delayThresholdLast,
    lowReason: plain ? d.reasons.delay50 : d.reasons.delayThresholdFirst,
    edge: d.probeEdge,
    time: d.sourceT50,
    label: `${d.direction} source edge ${d.sourceEdge} at ${formatSI(d.sourceT50, 's')}`,
  }));
  return { items, note };
}

type EdgeMetric = Exclude<MetricName, ProbeMetric | 'delay' | 'delayThreshold' | 'edges'>;

/** The value of one edge for an edge metric, and why it is null when it is; a failure when a band was not measured. */
function edgeValue(metric: EdgeMetric, e: EdgeMeasurement, spec: CheckSpec, amplitude: number | null): { value: number | null; reason?: string } | { failure: string } {
  const pct = (spec.max ?? spec.min)?.unit === '%';
  const r = e.reasons;
  switch (metric) {
    case 'overshoot':
      return { value: pct ? e.overshootPct : e.overshootV, reason: r.overshootV };
    case 'undershoot':
      return { value: pct ? e.undershootPct : e.undershootV, reason: r.undershootV };
    case 'preshoot':
      return { value: pct ? e.preshootPct : e.preshootV, reason: r.preshootV };
    case 'ringback':
      return { value: pct ? e.ringbackPct : e.ringbackV, reason: r.ringbackV };
    case 'ringbackMargin':
      return { value: e.ringbackMarginV, reason: r.ringbackMarginV };
    case 'rise':
    case 'fall':
      return { value: e.duration1090, reason: r.duration1090 };
    case 'rise2080':
    case 'fall2080':
      return { value: e.duration2080, reason: r.duration2080 };
    case 'crossings':
      return { value: e.thresholdCrossings ?? e.crossings };
    case 'monotonic':
      return { value: pct ? (amplitude ? (100 * e.reversalV) / amplitude : null) : e.reversalV };
    case 'settling': {
      const bandV = amplitude !== null ? bandVolts(checkBand(spec), amplitude) : null;
      const s = e.settling.find((x) => bandV !== null && Math.abs(x.bandV - bandV) <= 1e-9 * Math.max(Math.abs(bandV), 1e-30));
      if (!s) return { failure: `settling in a ±${fmtLimit(spec.band ?? DEFAULT_BAND)} band was not measured for probe "${spec.probe}" (measure with settleBands including it, e.g. via checkWaveforms)` };
      return { value: s.time, reason: s.reason };
    }
  }
}

/** The complete edges of the selected direction, or why there are none. */
function selectedEdges(m: ProbeMeasurements, selection: EdgeSelection, probe: string): { edges: EdgeMeasurement[]; note: string } | { failure: string } {
  if (m.edges.length === 0) return { failure: `probe "${probe}" has no edge: ${m.noEdgeReason ?? 'no transition found'}` };
  const sel = m.edges.filter((e) => selection === 'all' || e.direction === selection);
  if (sel.length === 0) return { failure: `probe "${probe}" has no ${selection} edge (it has ${m.edgeCount.rising} rising, ${m.edgeCount.falling} falling)` };
  const complete = sel.filter((e) => e.complete);
  if (complete.length === 0) return { failure: `probe "${probe}" has no complete ${selection === 'all' ? '' : selection + ' '}edge: the record ends during the transition` };
  return { edges: complete, note: complete.length < sel.length ? ` (${sel.length - complete.length} edge(s) cut off by the end of the record not checked)` : '' };
}

/** Per complete edge of the selected direction, the metric's value. */
function edgeItems(metric: EdgeMetric, m: ProbeMeasurements, spec: CheckSpec, selection: EdgeSelection): Gathered {
  const sel = selectedEdges(m, selection, spec.probe);
  if ('failure' in sel) return sel;
  const items: Item[] = [];
  for (const e of sel.edges) {
    const v = edgeValue(metric, e, spec, m.levels?.amplitude ?? null);
    if ('failure' in v) return v;
    items.push({ value: v.value, lowValue: v.value, reason: v.reason, edge: e.number, time: e.t50, label: edgeLabel(e) });
  }
  return { items, note: sel.note };
}

/** The values a check's limit applies to. */
function gather(metric: MetricName, m: ProbeMeasurements, spec: CheckSpec): Gathered {
  const def = METRICS[metric];
  const selection: EdgeSelection = def.dir ?? spec.edges ?? 'all';
  switch (def.kind) {
    case 'probe':
      return probeItems(metric as ProbeMetric, m, spec.probe, (spec.max ?? spec.min)?.unit === '%');
    case 'count':
      return countItems(m, selection, spec.probe);
    case 'delay':
      return delayItems(metric as 'delay' | 'delayThreshold', m, selection, spec.probe);
    default:
      return edgeItems(metric as EdgeMetric, m, spec, selection);
  }
}

/** The header of every result of a check: what was checked against which limit. */
function resultBase(spec: CheckSpec): Omit<CheckResult, 'measured' | 'measuredText' | 'pass' | 'message' | 'edge' | 'time'> {
  return { probe: spec.probe, metric: spec.metric, limit: describeLimit(spec), unit: (spec.max ?? spec.min)?.unit ?? (spec.metric === 'monotonic' ? 'V' : null) };
}

function failed(spec: CheckSpec, message: string, extra: Partial<CheckResult> = {}): CheckResult {
  return { ...resultBase(spec), measured: null, measuredText: 'n/a', pass: false, message, edge: null, time: null, ...extra };
}

/** `monotonic` without a limit: every edge must be monotonic; reports the largest reversal. */
function monotonicVerdict(spec: CheckSpec, m: ProbeMeasurements, note: string): CheckResult {
  const selection = spec.edges ?? 'all';
  const edges = m.edges.filter((e) => e.complete && (selection === 'all' || e.direction === selection));
  const worst = edges.reduce((a, e) => (e.reversalV > a.reversalV ? e : a), edges[0]!);
  const measured = worst.reversalV;
  const at = { measured, measuredText: formatSI(measured, 'V'), edge: worst.number, time: worst.t50 };
  const bad = edges.filter((e) => !e.monotonic);
  if (bad.length > 0) return failed(spec, `${bad.length} of ${edges.length} edges are not monotonic; worst: ${edgeLabel(worst)} reverses by ${formatSI(measured, 'V')}${note}`, at);
  return { ...resultBase(spec), ...at, unit: 'V', pass: true, message: `all ${edges.length} edges are monotonic${note}` };
}

/** Compares the gathered values with the limits: the largest with `max`, the smallest with `min`. */
function compareItems(spec: CheckSpec, items: Item[], note: string): CheckResult {
  const base = resultBase(spec);
  const unit = base.unit;
  for (const side of ['max', 'min'] as const) {
    if (!spec[side]) continue;
    const missing = items.filter((i) => (side === 'max' ? i.value : i.lowValue) === null);
    const f = missing[0];
    if (f) {
      const why = (side === 'max' ? f.reason : f.lowReason ?? f.reason) ?? 'not measurable';
      return failed(spec, `${spec.metric} could not be measured for ${f.label}: ${why}${missing.length > 1 ? ` (and ${missing.length - 1} more)` : ''}`, { edge: f.edge, time: f.time });
    }
  }
  const hiItem = items.reduce((a, b) => (b.value! > a.value! ? b : a));
  const loItem = items.reduce((a, b) => (b.lowValue! < a.lowValue! ? b : a));
  const hi = hiItem.value!;
  const lo = loItem.lowValue!;
  const result = (pass: boolean, item: Item, value: number, message: string): CheckResult => ({
    ...base,
    measured: value,
    measuredText: fmt(value, unit),
    pass,
    message: message + note,
    edge: item.edge,
    time: item.time,
  });
  const where = (i: Item): string => (items.length > 1 || i.edge !== null ? ` (worst: ${i.label})` : '');
  const name = spec.metric;
  if (spec.max && hi > spec.max.value) return result(false, hiItem, hi, `${name} ${fmt(hi, unit)} exceeds max ${fmtLimit(spec.max)}${where(hiItem)}`);
  if (spec.min && lo < spec.min.value) return result(false, loItem, lo, `${name} ${fmt(lo, unit)} is below min ${fmtLimit(spec.min)}${where(loItem)}`);
  if (spec.max) {
    const extra = spec.min ? `; smallest ${fmt(lo, unit)} ≥ min ${fmtLimit(spec.min)}` : '';
    return result(true, hiItem, hi, `${name} ${fmt(hi, unit)} within max ${fmtLimit(spec.max)}${where(hiItem)}${extra}`);
  }
  return result(true, loItem, lo, `${name} ${fmt(lo, unit)} meets min ${fmtLimit(spec.min!)}${where(loItem)}`);
}

function evaluateOne(spec: CheckSpec, probes: Readonly<Record<string, ProbeMeasurements>>): CheckResult {
  const problems = validateCheck(spec);
  if (problems.length > 0) return failed(spec, `invalid check: ${problems.join('; ')}`);
  const m = Object.prototype.hasOwnProperty.call(probes, spec.probe) ? probes[spec.probe] : undefined;
  if (!m) return failed(spec, `no probe named "${spec.probe}" (probes: ${Object.keys(probes).join(', ') || 'none'})`);
  const metric = spec.metric as MetricName;
  const g = gather(metric, m, spec);
  if ('failure' in g) return failed(spec, g.failure);
  if (metric === 'monotonic' && !spec.max) return monotonicVerdict(spec, m, g.note);
  return compareItems(spec, g.items, g.note);
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
  const measurements = keyedRecord<ProbeMeasurements>();
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
