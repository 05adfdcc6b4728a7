// Aberrations of IEEE Std 181-2011 around an edge — preshoot (pre-transition region), overshoot and
// undershoot (post-transition region), all measured against the edge's state levels — and the rail
// excursions of the whole record (how far it goes below the driver's low rail or above its high rail,
// what signal-integrity engineers usually call undershoot below ground and overshoot above supply).
import type { EdgeMeasurement, EdgeReasons } from './edge-types.js';
import type { EdgeSpan } from './spans.js';
import { timeAt, type Trace } from './trace.js';

/**
 * An aberration no larger than 1 ppm of the amplitude is rounding on a settled level (the waveform
 * and the settled level are computed separately), reported as 0.
 */
export function aberration(x: number, amplitude: number): number {
  return x > 1e-6 * Math.abs(amplitude) ? x : 0;
}

/**
 * Preshoot: max(0, initial level − lowest value) (rising; mirrored for falling) over one transition
 * duration before the edge's start, not reaching back past the previous edge's 50 % instant.
 */
export function preshoot(tr: Trace, s: EdgeSpan, amplitude: number): Pick<EdgeMeasurement, 'preshootV' | 'preshootPct'> {
  const span = s.complete ? Math.max(1, s.g - s.o) : Math.max(1, Math.floor(s.c50) - s.o + 1);
  const lo = Math.max(s.prevC50 !== null ? Math.floor(s.prevC50) + 1 : 0, s.o - span);
  let minU = Infinity;
  for (let i = lo; i <= s.o; i++) minU = Math.min(minU, s.dir * tr.v[i]!);
  const pre = aberration(s.dir * s.fromLevel - minU, amplitude);
  return { preshootV: pre, preshootPct: (100 * pre) / amplitude };
}

/** Overshoot: the furthest excursion beyond the final state level from the 50 % instant to the next edge's. */
export function overshoot(tr: Trace, s: EdgeSpan, amplitude: number): Pick<EdgeMeasurement, 'overshootV' | 'overshootPct' | 'overshootTime'> & { reasons: EdgeReasons } {
  const start = Math.floor(s.c50) + 1;
  let best = -Infinity;
  let at = start;
  for (let i = start; i <= s.jEnd; i++) {
    const u = s.dir * tr.v[i]!;
    if (u > best) {
      best = u;
      at = i;
    }
  }
  const os = aberration(best - s.dir * s.toLevel, amplitude);
  return {
    overshootV: os,
    overshootPct: (100 * os) / amplitude,
    overshootTime: os > 0 ? timeAt(tr, at) : null,
    reasons: os > 0 ? {} : { overshootTime: 'no overshoot' },
  };
}

/**
 * Undershoot: after first reaching the final state level (to within 1 ppm of the amplitude), the
 * furthest return back past it, to the end of the state.
 */
export function undershoot(tr: Trace, s: EdgeSpan, amplitude: number): Pick<EdgeMeasurement, 'undershootV' | 'undershootPct' | 'undershootTime'> & { reasons: EdgeReasons } {
  const reached = s.dir * s.toLevel - 1e-6 * Math.abs(amplitude);
  let reach = -1;
  for (let i = Math.floor(s.c50) + 1; i <= s.stateEnd && reach < 0; i++) if (s.dir * tr.v[i]! >= reached) reach = i;
  if (reach < 0) {
    const why = 'the waveform never reached the final state level';
    return { undershootV: null, undershootPct: null, undershootTime: null, reasons: { undershootV: why, undershootPct: why, undershootTime: why } };
  }
  let minU = Infinity;
  let at = reach;
  for (let i = reach; i <= s.stateEnd; i++) {
    const u = s.dir * tr.v[i]!;
    if (u < minU) {
      minU = u;
      at = i;
    }
  }
  const us = aberration(s.dir * s.toLevel - minU, amplitude);
  return {
    undershootV: us,
    undershootPct: (100 * us) / amplitude,
    undershootTime: us > 0 ? timeAt(tr, at) : null,
    reasons: us > 0 ? {} : { undershootTime: 'no undershoot' },
  };
}

/** The driver's output levels the rail excursions are measured from (V). */
export interface Rails {
  low: number;
  high: number;
}

export interface RailExcursions {
  lowRail: number;
  highRail: number;
  /** max(0, low rail − lowest sample) (V): the excursion below ground for a driver whose low level is 0 V. */
  belowLowRailV: number;
  /** Instant of the lowest sample when it is below the low rail, else null. */
  belowLowRailTime: number | null;
  /** max(0, highest sample − high rail) (V): the excursion above the driver's supply. */
  aboveHighRailV: number;
  aboveHighRailTime: number | null;
}

/** Rail excursions of the whole record, from its extremes. */
export function railExcursions(rails: Rails, ex: { min: number; max: number; minTime: number; maxTime: number }): RailExcursions {
  const below = Math.max(0, rails.low - ex.min);
  const above = Math.max(0, ex.max - rails.high);
  return {
    lowRail: rails.low,
    highRail: rails.high,
    belowLowRailV: below,
    belowLowRailTime: below > 0 ? ex.minTime : null,
    aboveHighRailV: above,
    aboveHighRailTime: above > 0 ? ex.maxTime : null,
  };
}
