// The shapes of the edge analysis: what is measured per transition (IEEE Std 181-2011 terms), the
// options, and the settling bands. Definitions: docs/measurements.md.

export type EdgeDirection = 'rising' | 'falling';

/** Logic input thresholds (V): a rising edge is "high" above vih, a falling one "low" below vil. */
export interface LogicLevels {
  vih: number;
  vil: number;
}

/** A settling band: a fraction of the amplitude (0.05 = ±5 %) or a half-width in volts. */
export type BandSpec = { fraction: number } | { volts: number };

export const DEFAULT_SETTLE_BAND: BandSpec = { fraction: 0.05 };

export function bandVolts(band: BandSpec, amplitude: number): number {
  return 'fraction' in band ? Math.abs(band.fraction * amplitude) : Math.abs(band.volts);
}

export interface EdgeOptions {
  /** Sample interval (s); sample i is at t0 + i·dt. */
  dt: number;
  t0?: number;
  /** Logic thresholds; without them the 50 % reference level plays their part in margins and counts. */
  thresholds?: LogicLevels;
  /** Settling bands to measure; default [±5 % of the amplitude]. The first decides `settledAfter`. */
  settleBands?: BandSpec[];
  /**
   * Hysteresis as a fraction of the amplitude (default 0): threshold crossings are counted only when
   * the waveform moves from below (threshold − h/2) to above (threshold + h/2) or back, and reversals
   * up to h do not make an edge non-monotonic. A floor of 1 ppm of the amplitude always applies, so
   * that rounding noise on a plateau that sits exactly on a threshold is not counted.
   */
  hysteresis?: number;
}

export interface SettlingResult {
  /** Half-width of the band (V). */
  bandV: number;
  /** Half-width of the band as % of the amplitude. */
  bandPct: number;
  /** Settling time (s) from the 50 % instant, or null (see `reason`). */
  time: number | null;
  /** Absolute instant (s) after which the waveform stays in the band, or null. */
  settledAt: number | null;
  reason?: string;
}

export interface EdgeMeasurement {
  /** Edge number, counted from 1 in time order. */
  number: number;
  direction: EdgeDirection;
  /** False when the record ends before the waveform reached the 90 % (rising) / 10 % (falling) level. */
  complete: boolean;
  /** The state levels the edge starts from and ends at (V). */
  fromLevel: number;
  toLevel: number;
  /**
   * Whether the waveform was settled, within the first settling band of `fromLevel`, when this edge
   * began: false when the previous state was still ringing (its numbers then depend on what came
   * before). The first edge is settled before when every sample before it is in the band.
   */
  settledBefore: boolean;
  /** Whether it settled within the first band of `toLevel` before the next edge or the end of the record; null for an incomplete edge. */
  settledAfter: boolean | null;
  /** Reference level instants (s): the instants at which the 10, 20, 50, 80, 90 % levels are crossed. */
  t10: number | null;
  t20: number | null;
  t50: number;
  t80: number | null;
  t90: number | null;
  /** Last crossing of the 50 % level in the edge's direction before the next edge (≠ t50 if non-monotonic). */
  t50Last: number;
  /** Transition durations (s): |t90 − t10| and |t80 − t20|. */
  duration1090: number | null;
  duration2080: number | null;
  /** Mean slope between the 10 % and 90 % instants (V/s, signed). */
  slewRate: number | null;
  /** Crossings of the 50 % reference level from the start of this edge to the start of the next. */
  crossings: number;
  /** Crossings of the logic threshold (vih rising, vil falling) in the same span; null without thresholds. */
  thresholdCrossings: number | null;
  /** The logic threshold (or the 50 % level) the edge's noise margin and threshold instants use. */
  threshold: number;
  /** First crossing of `threshold` in the edge's direction (s), null if never crossed. */
  thresholdFirst: number | null;
  /** Last crossing of `threshold` in the edge's direction before the state ends (s). */
  thresholdLast: number | null;
  /** True when the waveform never reverses by more than the hysteresis between the 10 % and 90 % instants. */
  monotonic: boolean;
  /** Largest reversal against the edge's direction between the 10 % and 90 % instants (V, ≥ 0). */
  reversalV: number;
  /** Post-transition overshoot beyond the final state level (V ≥ 0, % of amplitude), and its instant. */
  overshootV: number | null;
  overshootPct: number | null;
  overshootTime: number | null;
  /** Post-transition undershoot (IEEE 181): deviation back past the final state level after first reaching it. */
  undershootV: number | null;
  undershootPct: number | null;
  undershootTime: number | null;
  /** Pre-transition preshoot: deviation beyond the initial state level away from the final one. */
  preshootV: number | null;
  preshootPct: number | null;
  /**
   * Ringback depth: after the edge first crossed its far reference level (90 % rising, 10 % falling),
   * how far the waveform came back short of the final state level (V ≥ 0, % of amplitude), and where.
   */
  ringbackV: number | null;
  ringbackPct: number | null;
  ringbackTime: number | null;
  ringbackLevel: number | null;
  /**
   * Ringback margin (V): after the edge first crossed its logic threshold (vih rising, vil falling),
   * the closest the waveform came back toward it — stateExtreme − vih, or vil − stateExtreme;
   * negative when it re-entered the undefined band. Null without thresholds or if never crossed.
   */
  ringbackMarginV: number | null;
  /**
   * The worst level held in the new state: for a rising edge the lowest value after it first crossed the
   * threshold and before the next transition (highest value for a falling edge).
   */
  stateExtreme: number | null;
  /** Instant (s) of the sample that set `stateExtreme`. */
  stateExtremeTime: number | null;
  /** Noise margin of this state (V): stateExtreme − vih (rising) or vil − stateExtreme (falling). */
  noiseMargin: number | null;
  /** With thresholds: did the waveform return into the undefined band (between vil and vih) after crossing? */
  reentersUndefinedBand: boolean | null;
  /** With thresholds: did it go all the way back past the opposite threshold (a glitch)? */
  reachesOppositeLevel: boolean | null;
  settling: SettlingResult[];
  /** Why a field above is null, keyed by the field's name. */
  reasons: EdgeReasons;
}

/** The measured fields of an edge, by name. */
export type EdgeKey = Exclude<keyof EdgeMeasurement, 'reasons'>;
export type EdgeReasons = Partial<Record<EdgeKey, string>>;

export interface Runt {
  /** State the excursion started from and returned to. */
  from: 'low' | 'high';
  /** First crossing of the 50 % level (s). */
  time: number;
  /** Furthest value reached (V) and when. */
  peak: number;
  peakTime: number;
  /** Whether the record ended before the excursion returned to its state. */
  unfinished: boolean;
}

export interface EdgeAnalysis {
  edges: EdgeMeasurement[];
  runts: Runt[];
  /** State of the waveform before its first edge (null when it never reached either state zone). */
  initialState: 'low' | 'high' | null;
  /**
   * The worst level held in the initial state before the first edge (highest for low, lowest for high),
   * measured like `stateExtreme` of an edge; null when the initial state is unknown.
   */
  initialStateExtreme: number | null;
  /** Why `edges` is empty (null when it is not). */
  noEdgeReason: string | null;
}
