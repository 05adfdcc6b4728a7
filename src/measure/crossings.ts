// Per-edge crossing metrics: the reference level instants and transition durations (IEEE Std
// 181-2011), the count of 50 % and threshold crossings, monotonicity, and the threshold instants.
import type { ReferenceLevels } from './levels.js';
import type { EdgeMeasurement, EdgeReasons } from './edge-types.js';
import type { EdgeSpan } from './spans.js';
import { countCrossings, crossIndex, firstCrossing, lastCrossing, timeAt, type Trace } from './trace.js';

const PPM = 1e-6;

type Instants = Pick<EdgeMeasurement, 't10' | 't20' | 't50' | 't80' | 't90' | 't50Last' | 'duration1090' | 'duration2080' | 'slewRate'>;

/**
 * Reference level instants: the lower one is the last crossing of the start level before t50, the
 * upper one the first crossing of the end level after t50; t50 is the first 50 % crossing.
 */
export function referenceInstants(tr: Trace, s: EdgeSpan, ref: ReferenceLevels, amplitude: number): Instants & { reasons: EdgeReasons } {
  const reasons: EdgeReasons = {};
  const rising = s.dir === 1;
  const i50 = Math.floor(s.c50);
  const cStart = crossIndex(tr.v, s.o, rising ? ref.p10 : ref.p90);
  const cStart20 = lastCrossing(tr, s.o, i50 + 1, rising ? ref.p20 : ref.p80, s.dir);
  const cEnd = s.complete ? firstCrossing(tr, i50, s.g, rising ? ref.p90 : ref.p10, s.dir) : -1;
  const cEnd80 = firstCrossing(tr, i50, s.complete ? s.g : tr.n - 1, rising ? ref.p80 : ref.p20, s.dir);
  const tA = timeAt(tr, cStart);
  const tA20 = cStart20 >= 0 ? timeAt(tr, cStart20) : null;
  const tB = cEnd >= 0 ? timeAt(tr, cEnd) : null;
  const tB80 = cEnd80 >= 0 ? timeAt(tr, cEnd80) : null;
  if (!s.complete) reasons[rising ? 't90' : 't10'] = `the record ends before the waveform reached the ${rising ? 90 : 10} % reference level`;
  const duration1090 = tB !== null ? tB - tA : null;
  const duration2080 = tA20 !== null && tB80 !== null ? tB80 - tA20 : null;
  if (duration1090 === null) reasons.duration1090 = `the record ends before the waveform reached the ${rising ? 90 : 10} % reference level`;
  if (duration2080 === null) reasons.duration2080 = `the record ends before the waveform reached the ${rising ? 80 : 20} % reference level`;
  const slewRate = duration1090 !== null && duration1090 > 0 ? (0.8 * amplitude * s.dir) / duration1090 : null;
  if (slewRate === null) reasons.slewRate = reasons.duration1090 ?? 'zero transition duration';
  const c50Last = lastCrossing(tr, s.o, s.crossEnd, ref.p50, s.dir);
  return {
    t10: rising ? tA : tB,
    t20: rising ? tA20 : tB80,
    t50: timeAt(tr, s.c50),
    t80: rising ? tB80 : tA20,
    t90: rising ? tB : tA,
    t50Last: timeAt(tr, c50Last >= 0 ? c50Last : s.c50),
    duration1090,
    duration2080,
    slewRate,
    reasons,
  };
}

/** Largest move against the edge's direction from its start to its first sample in the target zone. */
export function monotonicity(tr: Trace, s: EdgeSpan, amplitude: number, hysteresis: number): Pick<EdgeMeasurement, 'monotonic' | 'reversalV'> {
  const end = s.complete ? s.g : tr.n - 1;
  let runMax = -Infinity;
  let reversal = 0;
  for (let i = s.o; i <= end; i++) {
    const u = s.dir * tr.v[i]!;
    if (u > runMax) runMax = u;
    else if (runMax - u > reversal) reversal = runMax - u;
  }
  return { monotonic: reversal <= Math.max(hysteresis * amplitude, PPM * amplitude), reversalV: reversal };
}

/** Crossings of the 50 % level and of the edge's threshold, from this edge's start to the next one's. */
export function crossingCounts(tr: Trace, s: EdgeSpan, ref: ReferenceLevels, threshold: number | null, halfH: number): Pick<EdgeMeasurement, 'crossings' | 'thresholdCrossings'> {
  return {
    crossings: countCrossings(tr, s.o, s.crossEnd, ref.p50, halfH),
    thresholdCrossings: threshold === null ? null : countCrossings(tr, s.o, s.crossEnd, threshold, halfH),
  };
}

/**
 * First crossing of the threshold in the edge's direction (the edge's start when it already began
 * beyond it), as a fractional index; −1 when it never crossed before the next edge's 50 % instant.
 */
export function thresholdCrossingIndex(tr: Trace, s: EdgeSpan, threshold: number): number {
  if (s.dir * tr.v[s.o]! >= s.dir * threshold) return s.o;
  return firstCrossing(tr, s.o, Math.min(s.jEnd + 1, tr.n - 1), threshold, s.dir);
}

/** The first and last crossing instants of the threshold (the last one before the state ends). */
export function thresholdInstants(tr: Trace, s: EdgeSpan, threshold: number, first: number): Pick<EdgeMeasurement, 'thresholdFirst' | 'thresholdLast'> {
  if (first < 0) return { thresholdFirst: null, thresholdLast: null };
  if (!s.complete) return { thresholdFirst: timeAt(tr, first), thresholdLast: null };
  const last = lastCrossing(tr, s.o, s.stateEnd, threshold, s.dir);
  return { thresholdFirst: timeAt(tr, first), thresholdLast: timeAt(tr, last >= 0 ? last : first) };
}
