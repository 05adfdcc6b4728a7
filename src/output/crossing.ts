// Per-probe statistics for summary.json: min, max, initial and final value, and the first 50 %
// crossing time.
//
// The 50 % level lies halfway between the probe's initial and final value (the net transition of
// the record). The crossing is the first sample that is no longer strictly on the initial side of
// that level; its time is interpolated linearly between that sample and the one before it (exactly
// the sample's time when the sample sits on the level). When the initial and final values differ,
// the final sample is on the far side of the level, so a crossing always exists; when they are
// equal (a flat record, or a pulse that returns to its start) there is no transition to measure
// and the time is null with a reason.

export interface Crossing50 {
  /** The 50 % level (V): (initial + final) / 2. */
  level: number;
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

/** First 50 % crossing of `v` (sample i at t = i·dt), between its initial and final value. */
export function crossing50(v: ArrayLike<number>, dt: number): Crossing50 {
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

export function probeStats(v: ArrayLike<number>, dt: number): ProbeStats {
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
    crossing50: crossing50(v, dt),
  };
}
