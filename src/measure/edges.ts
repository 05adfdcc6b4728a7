// Transitions ("edges") of a two-level waveform and their metrics, following the terms of
// IEEE Std 181-2011. Every edge in the record is found and measured; see docs/measurements.md for the
// exact definitions, which are repeated briefly beside each computation below.
import type { Samples, StateLevels } from './levels.js';
import { formatSI } from './format.js';

export type EdgeDirection = 'rising' | 'falling';

/** Logic input thresholds (V): a rising edge is "high" above vih, a falling one "low" below vil. */
export interface LogicLevels {
  vih: number;
  vil: number;
}

/** A settling band: a fraction of the amplitude (0.05 = ±5 %) or a half-width in volts. */
export type BandSpec = { fraction: number } | { volts: number };

export const DEFAULT_SETTLE_BAND: BandSpec = { fraction: 0.05 };

export interface EdgeOptions {
  /** Sample interval (s); sample i is at t0 + i·dt. */
  dt: number;
  t0?: number;
  /** Logic thresholds; without them the mid reference level (50 %) plays their part. */
  thresholds?: LogicLevels;
  /** Settling bands to measure; default [±5 % of the amplitude]. */
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
  index: number;
  direction: EdgeDirection;
  /** False when the record ends before the waveform reached the 90 % (rising) / 10 % (falling) level. */
  complete: boolean;
  /** Level the edge starts from and ends at (the state levels). */
  fromLevel: number;
  toLevel: number;
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
  /** The logic threshold (or the 50 % level) this edge's ringback and noise margin are measured against. */
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
  /** Post-transition undershoot: deviation back past the final state level after first reaching it. */
  undershootV: number | null;
  undershootPct: number | null;
  undershootTime: number | null;
  /** Pre-transition preshoot: deviation beyond the initial state level away from the final one. */
  preshootV: number | null;
  preshootPct: number | null;
  /** Ringback: largest drop back toward the threshold from the highest value reached so far. */
  ringbackV: number | null;
  ringbackPct: number | null;
  ringbackTime: number | null;
  /** Value at the deepest ringback point (V). */
  ringbackLevel: number | null;
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
  /** Why any null field above is null. */
  reasons: Record<string, string>;
}

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

interface RawEdge {
  dir: 1 | -1;
  /** Last sample in the origin zone (≤ 10 % rising, ≥ 90 % falling) before the transition. */
  o: number;
  /** First sample in the target zone, or -1 when the record ends first. */
  g: number;
}

const PPM = 1e-6;

export function bandVolts(band: BandSpec, amplitude: number): number {
  return 'fraction' in band ? Math.abs(band.fraction * amplitude) : Math.abs(band.volts);
}

/**
 * Find and measure every transition. A rising edge is a passage from at or below the 10 % reference level
 * to at or above the 90 % level (falling: the reverse); excursions that cross 50 % but return to the
 * state they left are runts, not edges.
 */
export function analyzeEdges(values: Samples, levels: StateLevels, opts: EdgeOptions): EdgeAnalysis {
  const n = values.length;
  const v = values;
  const dt = opts.dt;
  if (!(dt > 0) || !Number.isFinite(dt)) throw new RangeError('dt must be a positive finite number');
  const t0 = opts.t0 ?? 0;
  const A = levels.amplitude;
  const time = (x: number): number => t0 + x * dt;

  if (levels.flat) {
    const reason =
      A < 0
        ? `no edge: the high state level (${formatSI(levels.high, 'V')}) is below the low state level (${formatSI(levels.low, 'V')})`
        : `no edge: the waveform is flat (amplitude ${A.toExponential(3)} V between its state levels)`;
    return { edges: [], runts: [], initialState: null, initialStateExtreme: null, noEdgeReason: reason };
  }

  const ref = levels.reference;
  const hyst = Math.max((opts.hysteresis ?? 0) * A, 2 * PPM * A);
  const halfH = hyst / 2;
  const bands = opts.settleBands ?? [DEFAULT_SETTLE_BAND];

  // ---- pass 1: zones and transitions (state machine with the 10 % / 90 % levels as hysteresis) ----
  const raw: RawEdge[] = [];
  const runts: Runt[] = [];
  let state: 0 | 1 | -1 = 0; // -1 low, +1 high, 0 unknown
  let lastInState = -1;
  let crossedMid = false;
  let exIdx = -1; // furthest excursion since leaving the state zone
  let firstMid = -1;
  for (let i = 0; i < n; i++) {
    const x = v[i]!;
    const zone = x <= ref.p10 ? -1 : x >= ref.p90 ? 1 : 0;
    if (zone !== 0) {
      if (state !== 0 && zone !== state) {
        raw.push({ dir: zone === 1 ? 1 : -1, o: lastInState, g: i });
      } else if (state !== 0 && crossedMid) {
        runts.push({
          from: state === -1 ? 'low' : 'high',
          time: time(firstMid),
          peak: v[exIdx]!,
          peakTime: time(exIdx),
          unfinished: false,
        });
      }
      state = zone;
      lastInState = i;
      crossedMid = false;
      exIdx = -1;
      firstMid = -1;
    } else if (state !== 0) {
      if (exIdx < 0 || state * (v[exIdx]! - x) > 0) exIdx = i;
      const prev = v[i - 1]!;
      if (!crossedMid && (state === -1 ? prev < ref.p50 && x >= ref.p50 : prev > ref.p50 && x <= ref.p50)) {
        crossedMid = true;
        firstMid = i - 1 + (ref.p50 - prev) / (x - prev);
      }
    }
  }
  // The record may end in the middle zone after crossing 50 %: an incomplete edge if it ends past 50 %,
  // otherwise an unfinished runt.
  if (state !== 0 && crossedMid) {
    const endPast = state === -1 ? v[n - 1]! >= ref.p50 : v[n - 1]! <= ref.p50;
    if (endPast) raw.push({ dir: state === -1 ? 1 : -1, o: lastInState, g: -1 });
    else
      runts.push({
        from: state === -1 ? 'low' : 'high',
        time: time(firstMid),
        peak: v[exIdx]!,
        peakTime: time(exIdx),
        unfinished: true,
      });
  }

  // First sample in a state zone, and the initial state.
  let firstDefinite = -1;
  let initialState: 'low' | 'high' | null = null;
  for (let i = 0; i < n; i++) {
    if (v[i]! <= ref.p10) {
      firstDefinite = i;
      initialState = 'low';
      break;
    }
    if (v[i]! >= ref.p90) {
      firstDefinite = i;
      initialState = 'high';
      break;
    }
  }

  // ---- helpers on fractional sample indices ----
  /** Fractional index where v crosses r between samples i and i+1 (linear interpolation). */
  const frac = (i: number, r: number): number => {
    const a = v[i]!;
    const b = v[i + 1]!;
    return b === a ? i : i + (r - a) / (b - a);
  };
  /** First crossing of r in direction dir in [from, to] (pairs i, i+1 with i+1 ≤ to); -1 if none. */
  const firstCross = (from: number, to: number, r: number, dir: 1 | -1): number => {
    for (let i = Math.max(0, from); i < to && i < n - 1; i++) {
      if (dir * v[i]! < dir * r && dir * v[i + 1]! >= dir * r) return frac(i, r);
    }
    return -1;
  };
  const lastCross = (from: number, to: number, r: number, dir: 1 | -1): number => {
    for (let i = Math.min(to, n - 1) - 1; i >= Math.max(0, from); i--) {
      if (dir * v[i]! < dir * r && dir * v[i + 1]! >= dir * r) return frac(i, r);
    }
    return -1;
  };
  /** Number of crossings of r (either way) over samples [from, to] with a Schmitt band of ±halfH. */
  const countCross = (from: number, to: number, r: number): number => {
    let side = 0;
    let count = 0;
    for (let i = Math.max(0, from); i <= to && i < n; i++) {
      const x = v[i]!;
      const s = x > r + halfH ? 1 : x < r - halfH ? -1 : 0;
      if (s !== 0) {
        if (side !== 0 && s !== side) count++;
        side = s;
      }
    }
    return count;
  };
  /**
   * End of the state that follows an edge: the last sample before the next transition's monotone
   * departure. Walks back from `j` (the sample just before the next edge's 50 % crossing) over samples
   * that are short of the state level and no further from it than their predecessor.
   */
  const stateEnd = (j: number, lo: number, dir: 1 | -1, level: number): number => {
    let s = j;
    while (s > lo && dir * v[s]! < dir * level && dir * v[s]! <= dir * v[s - 1]!) s--;
    return s;
  };

  // ---- pass 2: per-edge metrics ----
  const m = raw.length;
  const i50s: number[] = raw.map((e) => {
    const to = e.g >= 0 ? e.g : n - 1;
    const c = firstCross(e.o, to, ref.p50, e.dir);
    return c; // always found: the edge passes the 50 % level by construction
  });

  const edges: EdgeMeasurement[] = [];
  for (let k = 0; k < m; k++) {
    const e = raw[k]!;
    const dir = e.dir;
    const rising = dir === 1;
    const reasons: Record<string, string> = {};
    const fromLevel = rising ? levels.low : levels.high;
    const toLevel = rising ? levels.high : levels.low;
    const c50 = i50s[k]!;
    const i50 = Math.floor(c50);
    const next = k + 1 < m ? raw[k + 1]! : undefined;
    // Crossings are counted from this edge's start to the next one's (its last sample in the state zone);
    // after the last edge, to the end of the record or, if the record ends outside the new state's zone,
    // to the last sample inside it.
    const endR0 = rising ? ref.p90 : ref.p10;
    let nextO = n - 1;
    if (next) nextO = next.o;
    else if (e.g >= 0 && dir * v[n - 1]! < dir * endR0) {
      nextO = n - 1;
      while (nextO > e.g && dir * v[nextO]! < dir * endR0) nextO--;
    }
    const jEnd = next ? Math.floor(i50s[k + 1]!) : n - 1; // last sample before the next edge's 50 % crossing
    const complete = e.g >= 0;

    // Reference level instants. Lower instant: last crossing of the start level before t50 (IEEE 181);
    // upper instant: first crossing of the end level after t50.
    const startR = rising ? ref.p10 : ref.p90;
    const endR = rising ? ref.p90 : ref.p10;
    const start20 = rising ? ref.p20 : ref.p80;
    const end80 = rising ? ref.p80 : ref.p20;
    const cStart = frac(e.o, startR);
    const cStart20 = lastCross(e.o, i50 + 1, start20, dir);
    const cEnd = complete ? firstCross(i50, e.g, endR, dir) : -1;
    const cEnd80 = firstCross(i50, complete ? e.g : n - 1, end80, dir);
    const tA = time(cStart);
    const tA20 = cStart20 >= 0 ? time(cStart20) : null;
    const tB = cEnd >= 0 ? time(cEnd) : null;
    const tB80 = cEnd80 >= 0 ? time(cEnd80) : null;
    if (!complete) {
      reasons.t90 = `the record ends before the waveform reached the ${rising ? 90 : 10} % reference level`;
    }
    const t10 = rising ? tA : tB;
    const t90 = rising ? tB : tA;
    const t20 = rising ? tA20 : tB80;
    const t80 = rising ? tB80 : tA20;
    const duration1090 = tB !== null ? tB - tA : null;
    const duration2080 = tA20 !== null && tB80 !== null ? tB80 - tA20 : null;
    if (duration1090 === null) reasons.duration1090 = reasons.t90 ?? 'reference level not reached';
    if (duration2080 === null) reasons.duration2080 = `the record ends before the waveform reached the ${rising ? 80 : 20} % reference level`;
    const slewRate = duration1090 !== null && duration1090 > 0 ? (0.8 * A * dir) / duration1090 : null;
    if (slewRate === null) reasons.slewRate = reasons.duration1090 ?? 'zero transition duration';
    const c50Last = lastCross(e.o, nextO, ref.p50, dir);

    // Monotonicity between the 10 % and 90 % instants: largest move against the edge's direction.
    const monoEnd = complete ? e.g : n - 1;
    let runMax = -Infinity;
    let reversal = 0;
    for (let i = e.o; i <= monoEnd; i++) {
      const u = dir * v[i]!;
      if (u > runMax) runMax = u;
      else if (runMax - u > reversal) reversal = runMax - u;
    }
    const monotonic = reversal <= Math.max((opts.hysteresis ?? 0) * A, PPM * A);

    // Crossings of the 50 % level and of the logic threshold, from this edge's start to the next one's.
    const crossings = countCross(e.o, nextO, ref.p50);
    const thr = opts.thresholds ? (rising ? opts.thresholds.vih : opts.thresholds.vil) : ref.p50;
    const thresholdCrossings = opts.thresholds ? countCross(e.o, nextO, thr) : null;

    const edge: EdgeMeasurement = {
      index: k,
      direction: rising ? 'rising' : 'falling',
      complete,
      fromLevel,
      toLevel,
      t10,
      t20,
      t50: time(c50),
      t80,
      t90,
      t50Last: time(c50Last >= 0 ? c50Last : c50),
      duration1090,
      duration2080,
      slewRate,
      crossings,
      thresholdCrossings,
      threshold: thr,
      thresholdFirst: null,
      thresholdLast: null,
      monotonic,
      reversalV: reversal,
      overshootV: null,
      overshootPct: null,
      overshootTime: null,
      undershootV: null,
      undershootPct: null,
      undershootTime: null,
      preshootV: null,
      preshootPct: null,
      ringbackV: null,
      ringbackPct: null,
      ringbackTime: null,
      ringbackLevel: null,
      stateExtreme: null,
      stateExtremeTime: null,
      noiseMargin: null,
      reentersUndefinedBand: null,
      reachesOppositeLevel: null,
      settling: [],
      reasons,
    };

    // Preshoot (pre-transition aberration): in the span of one transition duration before the start
    // reference instant, bounded by the previous edge's 50 % instant.
    {
      const span = complete ? Math.max(1, e.g - e.o) : Math.max(1, i50 - e.o + 1);
      const lo = Math.max(k > 0 ? Math.floor(i50s[k - 1]!) + 1 : 0, e.o - span);
      let minU = Infinity;
      for (let i = lo; i <= e.o; i++) minU = Math.min(minU, dir * v[i]!);
      const pre = Math.max(0, dir * fromLevel - minU);
      edge.preshootV = pre;
      edge.preshootPct = (100 * pre) / A;
    }

    // Threshold crossings used for ringback, noise margins and threshold delays.
    const cx = firstCross(e.o, jEnd + 1 <= n - 1 ? jEnd + 1 : n - 1, thr, dir);
    const alreadyPast = dir * v[e.o]! >= dir * thr;
    const cxEff = alreadyPast ? e.o : cx;
    edge.thresholdFirst = cxEff >= 0 ? time(cxEff) : null;

    if (!complete) {
      const why = 'the record ends during this transition';
      for (const key of ['overshootV', 'overshootPct', 'undershootV', 'undershootPct', 'ringbackV', 'stateExtreme', 'stateExtremeTime', 'noiseMargin']) reasons[key] = why;
      if (edge.thresholdFirst === null) reasons.thresholdFirst = `never crossed ${opts.thresholds ? (rising ? 'vih' : 'vil') : 'the 50 % level'}`;
      edge.settling = bands.map((b) => ({ bandV: bandVolts(b, A), bandPct: (100 * bandVolts(b, A)) / A, time: null, settledAt: null, reason: why }));
      edges.push(edge);
      continue;
    }

    // End of the new state: before the next transition's monotone departure. A record that ends
    // outside the state zone (short of the 90 % level after a rising edge, of 10 % after a falling one)
    // ends during a departure that never reached 50 %; the state ends where that departure began.
    const endsOutside = dir * v[n - 1]! < dir * endR;
    const eEnd = next ? stateEnd(jEnd, Math.min(jEnd, e.g), dir, toLevel) : endsOutside ? stateEnd(n - 1, e.g, dir, toLevel) : n - 1;

    // Overshoot: furthest excursion beyond the final state level after the 50 % instant.
    {
      let best = -Infinity;
      let bi = i50 + 1;
      for (let i = i50 + 1; i <= jEnd; i++) {
        const u = dir * v[i]!;
        if (u > best) {
          best = u;
          bi = i;
        }
      }
      const os = Math.max(0, best - dir * toLevel);
      edge.overshootV = os;
      edge.overshootPct = (100 * os) / A;
      edge.overshootTime = os > 0 ? time(bi) : null;
      if (os === 0) reasons.overshootTime = 'no overshoot';
    }

    // Undershoot (post-transition): after first reaching the final state level, the furthest return
    // back past it, up to the end of the state.
    {
      let reach = -1;
      for (let i = i50 + 1; i <= eEnd; i++) {
        if (dir * v[i]! >= dir * toLevel) {
          reach = i;
          break;
        }
      }
      if (reach < 0) {
        reasons.undershootV = reasons.undershootPct = 'the waveform never reached the final state level';
      } else {
        let minU = Infinity;
        let mi = reach;
        for (let i = reach; i <= eEnd; i++) {
          const u = dir * v[i]!;
          if (u < minU) {
            minU = u;
            mi = i;
          }
        }
        const us = Math.max(0, dir * toLevel - minU);
        edge.undershootV = us;
        edge.undershootPct = (100 * us) / A;
        edge.undershootTime = us > 0 ? time(mi) : null;
        if (us === 0) reasons.undershootTime = 'no undershoot';
      }
    }

    // Ringback and the state extreme, from the first threshold crossing to the end of the state.
    // Ringback = max over i of (highest value since the crossing − v[i]) (directions mirrored for falling).
    // State extreme = the lowest value that came after a higher one (a dip), or the value at the end of
    // the state, whichever is lower: the worst level the new state actually held.
    {
      const startIdx = cxEff >= 0 ? Math.ceil(cxEff) : i50 + 1;
      const lo = Math.min(startIdx, eEnd);
      let runMaxU = -Infinity;
      let rb = 0;
      let rbIdx = -1;
      let worst = dir * v[eEnd]!;
      let worstIdx = eEnd;
      for (let i = lo; i <= eEnd; i++) {
        const u = dir * v[i]!;
        if (u > runMaxU) runMaxU = u;
        else {
          if (runMaxU - u > rb) {
            rb = runMaxU - u;
            rbIdx = i;
          }
          if (u < worst) {
            worst = u;
            worstIdx = i;
          }
        }
      }
      edge.stateExtreme = dir * worst;
      edge.stateExtremeTime = time(worstIdx);
      if (cxEff >= 0) {
        edge.ringbackV = rb;
        edge.ringbackPct = (100 * rb) / A;
        edge.ringbackTime = rbIdx >= 0 ? time(rbIdx) : null;
        edge.ringbackLevel = rbIdx >= 0 ? v[rbIdx]! : null;
        if (rbIdx < 0) reasons.ringbackTime = reasons.ringbackLevel = 'no ringback';
        const cLast = lastCross(e.o, eEnd, thr, dir);
        edge.thresholdLast = time(cLast >= 0 ? cLast : cxEff);
      } else {
        const name = opts.thresholds ? `${rising ? 'vih' : 'vil'} (${formatSI(thr, 'V')})` : 'the 50 % level';
        reasons.ringbackV = reasons.ringbackPct = reasons.ringbackTime = reasons.ringbackLevel = `never crossed ${name}`;
        reasons.thresholdFirst = reasons.thresholdLast = `never crossed ${name}`;
      }
      if (opts.thresholds) {
        const { vih, vil } = opts.thresholds;
        edge.noiseMargin = rising ? edge.stateExtreme - vih : vil - edge.stateExtreme;
        if (cxEff >= 0) {
          edge.reentersUndefinedBand = rising ? edge.stateExtreme < vih : edge.stateExtreme > vil;
          edge.reachesOppositeLevel = rising ? edge.stateExtreme <= vil : edge.stateExtreme >= vih;
        } else {
          reasons.reentersUndefinedBand = reasons.reachesOppositeLevel = reasons.thresholdFirst!;
        }
      } else {
        reasons.noiseMargin = reasons.reentersUndefinedBand = reasons.reachesOppositeLevel = 'no logic thresholds given';
      }
    }

    // Settling: from the 50 % instant to the instant after which the waveform stays within ±band of the
    // final state level, up to the end of the state (the next transition's departure) or of the record.
    edge.settling = bands.map((b): SettlingResult => {
      const bV = bandVolts(b, A);
      const bandPct = (100 * bV) / A;
      const inBand = (i: number): boolean => Math.abs(v[i]! - toLevel) <= bV;
      if (!inBand(eEnd)) {
        return {
          bandV: bV,
          bandPct,
          time: null,
          settledAt: null,
          reason: next
            ? `still outside the ±${fmtPct(bandPct)} band when the next transition began`
            : `still outside the ±${fmtPct(bandPct)} band at the end of the record`,
        };
      }
      let q = -1;
      for (let i = eEnd - 1; i >= e.o; i--) {
        if (!inBand(i)) {
          q = i;
          break;
        }
      }
      if (q < 0) return { bandV: bV, bandPct, time: 0, settledAt: time(c50) };
      const boundary = v[q]! > toLevel ? toLevel + bV : toLevel - bV;
      const at = time(frac(q, boundary));
      return { bandV: bV, bandPct, time: Math.max(0, at - time(c50)), settledAt: at };
    });

    edges.push(edge);
  }

  // Worst level of the initial state (before the first edge), measured like an edge's state extreme.
  let initialStateExtreme: number | null = null;
  if (initialState !== null) {
    const dir: 1 | -1 = initialState === 'high' ? 1 : -1;
    const level = initialState === 'high' ? levels.high : levels.low;
    const jEnd = m > 0 ? Math.floor(i50s[0]!) : n - 1;
    const zoneEdge = initialState === 'high' ? ref.p90 : ref.p10;
    const eEnd = m > 0 || dir * v[n - 1]! < dir * zoneEdge ? stateEnd(jEnd, firstDefinite, dir, level) : n - 1;
    let runMaxU = -Infinity;
    let worst = dir * v[eEnd]!;
    for (let i = firstDefinite; i <= eEnd; i++) {
      const u = dir * v[i]!;
      if (u > runMaxU) runMaxU = u;
      else if (u < worst) worst = u;
    }
    initialStateExtreme = dir * worst;
  }

  let noEdgeReason: string | null = null;
  if (edges.length === 0) {
    if (initialState === null) {
      noEdgeReason = `no edge: the waveform never reached the 10 % (${formatSI(ref.p10, 'V')}) or 90 % (${formatSI(ref.p90, 'V')}) reference level`;
    } else {
      const other = initialState === 'low' ? `90 % reference level (${formatSI(ref.p90, 'V')})` : `10 % reference level (${formatSI(ref.p10, 'V')})`;
      noEdgeReason =
        `no edge: the waveform stays in the ${initialState} state and never reaches the ${other}` +
        (runts.length > 0 ? `; ${runts.length} runt pulse(s) crossed the 50 % level` : '');
    }
  }
  return { edges, runts, initialState, initialStateExtreme, noEdgeReason };
}

function fmtPct(p: number): string {
  return `${Number(p.toPrecision(4))} %`;
}
