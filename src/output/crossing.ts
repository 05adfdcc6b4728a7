// Per-probe statistics for summary.json: min, max, initial and final value, and the first 50 %
// crossing time.
//
// For a simulated net the 50 % level is the source's 50 % level carried through the probe's DC
// divider (halfway between the levels the probe settles to for the source's low and high level, see
// net-levels.ts), crossed in the direction of the source's first transition: the first arrival of the
// first edge at the probe. Without that information it lies halfway between the probe's initial and
// final value (the net transition of the record), which says nothing for a pulse or a pattern.
// The crossing is the first sample that is no longer strictly on the starting side of the level,
// after one that was; its time is interpolated linearly between that sample and the one before it
// (exactly the sample's time when the sample sits on the level). No crossing: null with a reason.

import { formatSI } from '../units.js';

/** The level and direction a probe's first 50 % crossing is looked for at, or why there is none. */
export type CrossingLevel = { level: number; direction: 'rising' | 'falling' } | { reason: string };

export interface Crossing50 {
  /** The 50 % level (V); null when there is none. */
  level: number | null;
  /** First crossing time (s), or null when there is none. */
  time: number | null;
  direction: 'rising' | 'falling' | null;
  /** Why `time` is null. */
  reason?: string;
}

export interface ProbeStats {
  min: number;
  max: number;
  initial: number;
  final: number;
  crossing50: Crossing50;
}

/** First crossing of `level` in `direction` after a sample strictly on the other side; null with a reason if none. */
function firstCrossingOf(v: ArrayLike<number>, dt: number, level: number, direction: 'rising' | 'falling'): Crossing50 {
  const s = direction === 'rising' ? 1 : -1;
  let before = false;
  for (let i = 0; i < v.length; i++) {
    const x = v[i];
    if (!Number.isFinite(x)) return { level, time: null, direction, reason: `non-finite value at sample ${i} before the crossing` };
    if (s * x < s * level) before = true;
    else if (before) {
      if (x === level) return { level, time: i * dt, direction };
      const prev = v[i - 1];
      return { level, time: (i - 1 + (level - prev) / (x - prev)) * dt, direction };
    }
  }
  return { level, time: null, direction, reason: `the record never crosses ${formatSI(level, 'V')} ${direction === 'rising' ? 'upward' : 'downward'}` };
}

/**
 * First 50 % crossing of `v` (sample i at t = i·dt): of `at` when given (a simulated net's settled
 * 50 % level), else of the level between its initial and final value.
 */
export function crossing50(v: ArrayLike<number>, dt: number, at?: CrossingLevel): Crossing50 {
  if (at) return 'reason' in at ? { level: null, time: null, direction: null, reason: at.reason } : firstCrossingOf(v, dt, at.level, at.direction);
  const n = v.length;
  if (n === 0) return { level: NaN, time: null, direction: null, reason: 'the record has no samples' };
  const v0 = v[0];
  const vf = v[n - 1];
  const level = v0 + (vf - v0) / 2;
  if (!Number.isFinite(v0) || !Number.isFinite(vf)) {
    return { level, time: null, direction: null, reason: 'the initial or final value is not finite' };
  }
  if (v0 === vf) {
    return { level, time: null, direction: null, reason: 'the final value equals the initial value: no net transition' };
  }
  const rising = vf > v0;
  const direction = rising ? 'rising' : 'falling';
  for (let i = 1; i < n; i++) {
    const x = v[i];
    if (!Number.isFinite(x)) {
      return { level, time: null, direction, reason: `non-finite value at sample ${i} before the crossing` };
    }
    const reached = rising ? x >= level : x <= level;
    if (!reached) continue;
    if (x === level) return { level, time: i * dt, direction };
    const prev = v[i - 1];
    // prev is strictly on the initial side, x strictly beyond the level: 0 < fraction < 1.
    const fraction = (level - prev) / (x - prev);
    return { level, time: (i - 1) * dt + fraction * dt, direction };
  }
  // Unreachable: the final sample is finite and beyond the level.
  return { level, time: null, direction, reason: 'the record never crosses the 50 % level' };
}

export function probeStats(v: ArrayLike<number>, dt: number, at?: CrossingLevel): ProbeStats {
  const n = v.length;
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < n; i++) {
    const x = v[i];
    if (x < min) min = x;
    if (x > max) max = x;
  }
  return {
    min: n ? min : NaN,
    max: n ? max : NaN,
    initial: n ? v[0] : NaN,
    final: n ? v[n - 1] : NaN,
    crossing50: crossing50(v, dt, at),
  };
}
