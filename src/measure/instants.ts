// Where each measurement was taken: the instant of a level (the worst overshoot, the deepest
// ringback, a state's worst level) or the two instants of a span (10 % to 90 %, the 50 % instant to
// the settling instant, the source's 50 % to the probe's). Read from measurements already made; used
// to put cursors on a number (the explore page) and to say when a check's deciding value happened.
import type { CheckResult, MetricName } from './checks.js';
import type { DelayMeasurement } from './delay.js';
import type { EdgeMeasurement } from './edge-types.js';
import type { ProbeMeasurements } from './summary.js';

/** An instant (`b` absent) or a span from `a` to `b` (s), a ≤ b. */
export interface MeasuredAt {
  a: number;
  b?: number;
}

const span = (x: number | null, y: number | null): MeasuredAt | null => {
  if (x === null && y === null) return null;
  if (x === null || y === null) return { a: (x ?? y)! };
  return x === y ? { a: x } : { a: Math.min(x, y), b: Math.max(x, y) };
};
const instant = (x: number | null | undefined): MeasuredAt | null => (x === null || x === undefined ? null : { a: x });

/** The instants of an edge metric. `band` picks the settling band (index into edge.settling; default 0). */
export function edgeMetricAt(metric: MetricName, e: EdgeMeasurement, band = 0): MeasuredAt | null {
  switch (metric) {
    case 'overshoot':
      return instant(e.overshootTime);
    case 'undershoot':
      return instant(e.undershootTime);
    case 'ringback':
      return instant(e.ringbackTime);
    case 'ringbackMargin':
      // the margin is the state's worst level against the threshold
      return e.ringbackMarginV === null ? null : instant(e.stateExtremeTime);
    case 'preshoot':
      // the preshoot is looked for before the start reference instant
      return instant(e.direction === 'rising' ? e.t10 : e.t90);
    case 'settling': {
      const s = e.settling[band];
      return s ? span(e.t50, s.settledAt) : null;
    }
    case 'rise':
    case 'fall':
    case 'monotonic':
      return span(e.t10, e.t90);
    case 'rise2080':
    case 'fall2080':
      return span(e.t20, e.t80);
    case 'crossings':
      return span(e.thresholdFirst, e.thresholdLast);
    case 'noiseMarginHigh':
    case 'noiseMarginLow':
      return instant(e.stateExtremeTime);
    default:
      return instant(e.t50);
  }
}

/** The instants of a delay: from the source edge's 50 % instant to the probe's 50 % instant or threshold crossing. */
export function delayAt(d: DelayMeasurement, probeEdge: EdgeMeasurement | undefined, which: 'delay' | 'first' | 'last' = 'delay'): MeasuredAt | null {
  if (which === 'delay') return span(d.sourceT50, d.probeT50);
  const t = which === 'first' ? probeEdge?.thresholdFirst ?? null : probeEdge?.thresholdLast ?? null;
  return span(d.sourceT50, t);
}

/** The edge with this number (edges are numbered from 1 in time order). */
export function edgeNumbered(m: ProbeMeasurements, n: number): EdgeMeasurement | undefined {
  const e = m.edges[n - 1];
  return e && e.number === n ? e : m.edges.find((x) => x.number === n);
}

/** The instants of a probe-level metric. */
export function probeMetricAt(metric: MetricName, m: ProbeMeasurements): MeasuredAt | null {
  switch (metric) {
    case 'min':
    case 'belowLowRail':
      return instant(m.minTime);
    case 'max':
    case 'aboveHighRail':
      return instant(m.maxTime);
    case 'final':
      return { a: m.t0 + m.duration };
    case 'crosstalk':
      return m.crosstalk ? { a: m.crosstalk.peakTime } : null;
    case 'noiseMarginHigh':
    case 'noiseMarginLow': {
      const k = metric === 'noiseMarginHigh' ? m.noiseMargins?.highEdge : m.noiseMargins?.lowEdge;
      const e = k === null || k === undefined ? undefined : edgeNumbered(m, k);
      return e ? instant(e.stateExtremeTime) : null;
    }
    default:
      return null;
  }
}

/**
 * Where a check's deciding value was measured: the instant of the worst overshoot, the span from the
 * 50 % instant to the settling instant, the source-to-probe span of a delay, … Null when the check has
 * no deciding value or the value has no instant (an edge count).
 */
export function checkAt(r: CheckResult, probes: Readonly<Record<string, ProbeMeasurements>>, bandIndex = 0): MeasuredAt | null {
  const m = Object.prototype.hasOwnProperty.call(probes, r.probe) ? probes[r.probe] : undefined;
  if (!m || r.measured === null) return null;
  const metric = r.metric as MetricName;
  if (metric === 'delay' || metric === 'delayThreshold') {
    const d = m.delays?.find((x) => x.probeEdge === r.edge && (r.time === null || x.sourceT50 === r.time));
    if (!d) return null;
    const e = d.probeEdge === null ? undefined : edgeNumbered(m, d.probeEdge);
    if (metric === 'delay') return delayAt(d, e, 'delay');
    // max limits compare the last threshold crossing, min limits the first: the deciding one matches the measured value
    const last = d.delayThresholdLast, first = d.delayThresholdFirst;
    return delayAt(d, e, first !== null && r.measured === first && r.measured !== last ? 'first' : 'last');
  }
  const probeLevel = probeMetricAt(metric, m);
  if (probeLevel || ['min', 'max', 'final', 'belowLowRail', 'aboveHighRail', 'crosstalk'].includes(metric)) return probeLevel;
  if (r.edge === null) return null;
  const e = edgeNumbered(m, r.edge);
  return e ? edgeMetricAt(metric, e, bandIndex) : null;
}
