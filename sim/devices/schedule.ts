// When a driver's edges start. A driver's logic pattern comes from the scenario's signal kinds: each
// transition of the signal starts an edge of the model at the time the signal's ramp starts; the
// signal's levels and ramp times are not used (the rails and the edge shapes are the model's own).
import type { Signal } from '../model.js';
import { nominalLevels, rampDuration, signalFunction } from '../signals.js';
import { evalSwitching, type Coefficients, type Switching } from './switching.js';

export interface EdgeSchedule {
  /** Logic state before the first edge. */
  initialHigh: boolean;
  /** Edge start times (s), increasing, and whether each edge rises. */
  times: Float64Array;
  rising: Uint8Array;
}

function fromList(initialHigh: boolean, edges: Array<[number, boolean]>): EdgeSchedule {
  return { initialHigh, times: Float64Array.from(edges, (e) => e[0]), rising: Uint8Array.from(edges, (e) => (e[1] ? 1 : 0)) };
}

/** Edges of `signal` that start before `until` (s). */
export function edgeSchedule(signal: Signal, until: number): EdgeSchedule {
  const edges: Array<[number, boolean]> = [];
  switch (signal.kind) {
    case 'step':
      if (signal.to !== signal.from && signal.start < until) edges.push([signal.start, signal.to > signal.from]);
      return fromList(signal.from > signal.to, edges);
    case 'pulse': {
      const up = signal.to > signal.from;
      const fallStart = signal.start + rampDuration(signal.rise) / 2 + signal.width - rampDuration(signal.fall) / 2;
      if (signal.start < until) edges.push([signal.start, up]);
      if (fallStart < until) edges.push([fallStart, !up]);
      return fromList(!up, edges);
    }
    case 'clock': {
      const fallOffset = rampDuration(signal.rise) / 2 + signal.duty * signal.period - rampDuration(signal.fall) / 2;
      for (let k = 0; signal.start + k * signal.period < until; k++) {
        const t0 = signal.start + k * signal.period;
        edges.push([t0, true]);
        if (t0 + fallOffset < until) edges.push([t0 + fallOffset, false]);
      }
      return fromList(false, edges);
    }
    case 'bits': {
      let prev = false;
      for (let k = 0; signal.start + k * signal.bitTime < until; k++) {
        const bit = signal.bits[k % signal.bits.length] !== 0;
        if (bit !== prev) edges.push([signal.start + k * signal.bitTime, bit]);
        prev = bit;
      }
      return fromList(false, edges);
    }
    case 'table':
      return tableEdges(signal, until);
  }
}

/** A tabulated signal: an edge wherever it crosses the middle of its levels, starting at the segment's start. */
function tableEdges(signal: Extract<Signal, { kind: 'table' }>, until: number): EdgeSchedule {
  const { low, high } = nominalLevels(signal);
  const mid = (low + high) / 2;
  const f = signalFunction(signal);
  const pts = signal.points;
  const initialHigh = f(pts[0][0]) > mid;
  let state = initialHigh;
  const edges: Array<[number, boolean]> = [];
  for (let k = 1; k < pts.length && pts[k - 1][0] < until; k++) {
    const now = pts[k][1] > mid;
    if (now !== state) edges.push([pts[k - 1][0], now]);
    state = now;
  }
  return fromList(initialHigh, edges);
}

/** Index of the last edge starting at or before t (−1 if none). */
function lastEdge(s: EdgeSchedule, t: number): number {
  let lo = -1;
  let hi = s.times.length;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (s.times[mid] <= t) lo = mid;
    else hi = mid;
  }
  return lo;
}

/**
 * Switching coefficients at time t. An edge that starts before the previous one has finished starts
 * from its own first sample (the model's tables are defined from a settled state).
 */
export function coefficientsAt(sw: Switching, s: EdgeSchedule, t: number, out: Coefficients): Coefficients {
  const k = lastEdge(s, t);
  // Before the first edge: the settled state, i.e. the end of the edge that led into it.
  if (k < 0) return evalSwitching(s.initialHigh ? sw.rising : sw.falling, Infinity, out);
  return evalSwitching(s.rising[k] ? sw.rising : sw.falling, t - s.times[k], out);
}
