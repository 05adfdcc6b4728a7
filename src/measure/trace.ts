// A sampled waveform and the crossing arithmetic every metric shares. Sample i is at t0 + i·dt; a
// crossing of level r between samples i and i+1 is placed by linear interpolation (exact on
// piecewise-linear waveforms). Indices below are sample indices; a "fractional index" x is the
// instant t0 + x·dt.
import type { Samples } from './levels.js';

/** +1 for a rising edge, −1 for a falling one: `dir·v` turns every definition into the rising case. */
export type Dir = 1 | -1;

export interface Trace {
  v: Samples;
  n: number;
  t0: number;
  dt: number;
}

export function makeTrace(v: Samples, dt: number, t0 = 0): Trace {
  if (!(dt > 0) || !Number.isFinite(dt)) throw new RangeError('dt must be a positive finite number');
  return { v, n: v.length, t0, dt };
}

/** The instant (s) of fractional index x. */
export function timeAt(tr: Trace, x: number): number {
  return tr.t0 + x * tr.dt;
}

/** Fractional index where v crosses r between samples i and i+1. */
export function crossIndex(v: Samples, i: number, r: number): number {
  const a = v[i]!;
  const b = v[i + 1]!;
  return b === a ? i : i + (r - a) / (b - a);
}

/** First crossing of r in direction dir over the pairs (i, i+1) with from ≤ i, i+1 ≤ to; −1 if none. */
export function firstCrossing(tr: Trace, from: number, to: number, r: number, dir: Dir): number {
  const v = tr.v;
  for (let i = Math.max(0, from); i < to && i < tr.n - 1; i++) {
    if (dir * v[i]! < dir * r && dir * v[i + 1]! >= dir * r) return crossIndex(v, i, r);
  }
  return -1;
}

/** Last crossing of r in direction dir over the same pairs; −1 if none. */
export function lastCrossing(tr: Trace, from: number, to: number, r: number, dir: Dir): number {
  const v = tr.v;
  for (let i = Math.min(to, tr.n - 1) - 1; i >= Math.max(0, from); i--) {
    if (dir * v[i]! < dir * r && dir * v[i + 1]! >= dir * r) return crossIndex(v, i, r);
  }
  return -1;
}

/**
 * Crossings of r in either direction over samples [from, to], with a Schmitt band of ±halfH: a
 * crossing counts when the waveform goes from below r − halfH to above r + halfH or back.
 */
export function countCrossings(tr: Trace, from: number, to: number, r: number, halfH: number): number {
  const v = tr.v;
  let side = 0;
  let count = 0;
  for (let i = Math.max(0, from); i <= to && i < tr.n; i++) {
    const x = v[i]!;
    const s = x > r + halfH ? 1 : x < r - halfH ? -1 : 0;
    if (s !== 0) {
      if (side !== 0 && s !== side) count++;
      side = s;
    }
  }
  return count;
}
