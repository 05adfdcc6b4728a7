// The measurement columns of sweep.csv and how each point's values are computed.
//
// Every value is the one a check with that metric would compare (src/measure evaluateChecks): the
// worst over the probe's edges for edge metrics (largest overshoot, longest settling, ...), and null
// (an empty CSV cell) when it cannot be measured (no edge, not settled before the record ends, ...).
import type { Net } from '../../sim/model.js';
import type { SimResult } from '../../sim/result.js';
import { measureNet } from '../output/measure-net.js';
import { evaluateChecks, formatSI, type CheckLimit, type CheckResult, type CheckSpec, type LimitUnit, type MetricName } from '../measure/index.js';
import { netChecks, netThresholds } from '../scenario/checks.js';

export interface MetricColumn {
  /** Column key after the probe name: "overshoot_pct", "settling_s", "settling_1pct_s". */
  key: string;
  metric: MetricName;
  unit: LimitUnit;
  /** Settling band, for settling columns other than the default ±5 %. */
  band?: CheckLimit;
  /** Only for probes with logic thresholds. */
  needsThresholds?: boolean;
  /** The worst value is the smallest (a margin), not the largest. */
  smallestWorst?: boolean;
}

const SUFFIX: Record<LimitUnit, string> = { '%': 'pct', V: 'V', s: 's', count: '' };

function key(metric: string, unit: LimitUnit, band?: CheckLimit): string {
  const b = band ? `_${bandKey(band)}` : '';
  return unit === 'count' ? `${metric}${b}` : `${metric}${b}_${SUFFIX[unit]}`;
}

/** "1pct" for ±1 %, "10mV" for ±10 mV. */
export function bandKey(band: CheckLimit): string {
  return band.unit === '%' ? `${band.value}pct` : formatSI(band.value, 'V', 6).replace(/\s/g, '').replace('µ', 'u');
}

function same(a: CheckLimit | undefined, b: CheckLimit | undefined): boolean {
  if (!a || !b) return !a && !b;
  return a.unit === b.unit && a.value === b.value;
}

/** The default ±5 % band is the plain "settling" column. */
function isDefaultBand(b: CheckLimit | undefined): boolean {
  return !b || (b.unit === '%' && b.value === 5);
}

/**
 * The metric columns, in order. `bands`: settling bands besides ±5 % (from the scenario's checks and
 * from --pick / --metric), each measured and given its own column.
 */
export function metricColumns(bands: readonly CheckLimit[] = []): MetricColumn[] {
  const c = (metric: MetricName, unit: LimitUnit, extra: Partial<MetricColumn> = {}): MetricColumn => ({ key: key(metric, unit, extra.band), metric, unit, ...extra });
  const cols: MetricColumn[] = [
    c('overshoot', '%'),
    c('overshoot', 'V'),
    c('undershoot', '%'),
    c('undershoot', 'V'),
    c('ringback', 'V'),
    c('ringback', '%'),
    c('ringbackMargin', 'V', { needsThresholds: true, smallestWorst: true }),
    c('settling', 's'),
  ];
  const seen: CheckLimit[] = [];
  for (const b of bands) {
    if (isDefaultBand(b) || seen.some((s) => same(s, b))) continue;
    seen.push(b);
    cols.push(c('settling', 's', { band: b }));
  }
  cols.push(
    c('rise', 's'),
    c('fall', 's'),
    c('delay', 's'),
    c('delayThreshold', 's', { needsThresholds: true }),
    c('min', 'V'),
    c('max', 'V'),
    c('final', 'V'),
    c('crossings', 'count'),
    c('edges', 'count'),
    c('noiseMarginHigh', 'V', { needsThresholds: true }),
    c('noiseMarginLow', 'V', { needsThresholds: true }),
    c('belowLowRail', 'V'),
  );
  return cols;
}

/** Crosstalk columns, for scenarios with several nets (empty on probes that are not on a quiet net). */
export function crosstalkColumns(): MetricColumn[] {
  return (['V', '%'] as const).map((unit) => ({ key: key('crosstalk', unit, undefined), metric: 'crosstalk' as const, unit }));
}

/** The settling bands a scenario's checks use (for the extra settling columns). */
export function checkBands(net: Net): CheckLimit[] {
  return netChecks(net)
    .filter((c) => c.metric === 'settling' && c.band)
    .map((c) => c.band!);
}

/**
 * Which way is worse for a metric, for the worst over several receivers: larger for aberrations,
 * times, counts and rail excursions, smaller for noise and ringback margins. Levels (min, max, final) and edge counts have no
 * worse direction and get no worst column.
 */
export const WORSE: Partial<Record<MetricName, 'larger' | 'smaller'>> = {
  overshoot: 'larger',
  undershoot: 'larger',
  ringback: 'larger',
  settling: 'larger',
  rise: 'larger',
  fall: 'larger',
  delay: 'larger',
  delayThreshold: 'larger',
  crossings: 'larger',
  noiseMarginHigh: 'smaller',
  noiseMarginLow: 'smaller',
  ringbackMargin: 'smaller',
  belowLowRail: 'larger',
};

/** The aggregate over several receivers' probes: a pseudo-probe whose columns hold the worst value. */
export interface WorstOf {
  /** Its name in sweep.csv headers and in --pick ("worst"). */
  name: string;
  probes: string[];
  columns: MetricColumn[];
}

/** The worst of each column over `probes`: null when any of them cannot be measured. */
export function worstValues(worst: WorstOf, probes: readonly string[], cols: readonly MetricColumn[], values: readonly (number | null)[]): (number | null)[] {
  return worst.columns.map((col) => {
    const c = cols.indexOf(col) >= 0 ? cols.indexOf(col) : cols.findIndex((x) => x.key === col.key);
    let acc: number | null = null;
    for (const p of worst.probes) {
      const v = values[probes.indexOf(p) * cols.length + c];
      if (v === null || v === undefined) return null;
      acc = acc === null ? v : WORSE[col.metric] === 'smaller' ? Math.min(acc, v) : Math.max(acc, v);
    }
    return acc;
  });
}

/** A check that measures a column's value and always passes (its `measured` is the value: the worst over edges). */
export function columnCheck(probe: string, col: MetricColumn): CheckSpec {
  const limit = col.smallestWorst ? { min: { value: -Number.MAX_VALUE, unit: col.unit } } : { max: { value: Number.MAX_VALUE, unit: col.unit } };
  const spec: CheckSpec = { probe, metric: col.metric, ...limit };
  if (col.band) spec.band = col.band;
  return spec;
}

/** Header of a probe's metric column: "rx.overshoot_pct". */
export function columnName(probe: string, col: MetricColumn): string {
  return `${probe}.${col.key}`;
}

export interface CheckSummary {
  failed: number;
  /**
   * The worst normalised excess over all checks: for a max limit (measured − max)/|max|, for a min
   * limit (min − measured)/|min| (divided by 1 when the limit is 0). Positive means failing; the
   * sample with the largest is the Monte Carlo worst case. null when some check was not measurable
   * (which counts as worse than any number).
   */
  margin: number | null;
}

/**
 * The check that decides a sample's margin (see checkSummary): the first unmeasurable one, else the one
 * with the largest normalised excess; null without checks.
 */
export function decidingCheck(checks: readonly CheckSpec[], results: readonly CheckResult[]): number | null {
  let best: number | null = null;
  let worst = -Infinity;
  for (let i = 0; i < results.length; i++) {
    const r = results[i]!;
    const spec = checks[i]!;
    if (r.measured === null) return i;
    const scale = (l: CheckLimit) => (l.value === 0 ? 1 : Math.abs(l.value));
    let m = -Infinity;
    if (spec.max && spec.max.unit === r.unit) m = Math.max(m, (r.measured - spec.max.value) / scale(spec.max));
    if (spec.min && spec.min.unit === r.unit) m = Math.max(m, (spec.min.value - r.measured) / scale(spec.min));
    if (!spec.max && !spec.min) m = r.pass ? -1 : 1;
    if (best === null || m > worst) {
      best = i;
      worst = m;
    }
  }
  return best;
}

export function checkSummary(checks: readonly CheckSpec[], results: readonly CheckResult[]): CheckSummary {
  let margin: number | null = -Infinity;
  results.forEach((r, i) => {
    const spec = checks[i]!;
    if (r.measured === null) {
      margin = null;
      return;
    }
    if (margin === null) return;
    const scale = (l: CheckLimit) => (l.value === 0 ? 1 : Math.abs(l.value));
    // Limits in another unit than the measured value's cannot be compared (validated scenarios have none).
    if (spec.max && spec.max.unit === r.unit) margin = Math.max(margin, (r.measured - spec.max.value) / scale(spec.max));
    if (spec.min && spec.min.unit === r.unit) margin = Math.max(margin, (spec.min.value - r.measured) / scale(spec.min));
    if (!spec.max && !spec.min) margin = Math.max(margin, r.pass ? -1 : 1); // "monotonic" without a limit
  });
  return { failed: results.filter((r) => !r.pass).length, margin: margin === -Infinity ? -1 : margin };
}

export interface PointValues {
  /** Metric values, probe-major: probes × columns. */
  values: (number | null)[];
  /** Scenario checks, when it has any. */
  checks: CheckSummary | null;
}

/** Measures a simulated point: every column of every probe, and the scenario's checks. */
export function pointValues(net: Net, result: SimResult, probes: readonly string[], cols: readonly MetricColumn[]): PointValues {
  const specs: CheckSpec[] = [];
  for (const p of probes) for (const c of cols) specs.push(columnCheck(p, c));
  const m = measureNet(net, result, specs);
  const measured = evaluateChecks(specs, m.measurements);
  const values: (number | null)[] = [];
  let k = 0;
  for (const p of probes) {
    const hasT = netThresholds(net, p) !== undefined;
    for (const c of cols) {
      const r = measured[k++]!;
      values.push(c.needsThresholds && !hasT ? null : r.measured);
    }
  }
  const checks = netChecks(net);
  return { values, checks: checks.length > 0 ? checkSummary(checks, m.results) : null };
}
