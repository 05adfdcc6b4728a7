// Driver source waveforms. Edges are linear ramps; a 10–90 % time t_r (IEEE 181) corresponds to a
// ramp of duration t_r / 0.8, since a linear ramp spends 80 % of its length between 10 % and 90 %.
import type { Signal } from './model.js';

/** Duration of the linear ramp whose 10–90 % time is `t1090`. */
export function rampDuration(t1090: number): number {
  return t1090 / 0.8;
}

/** Value of a ramp from `a` to `b` that starts at `t0` and lasts `d`, evaluated at `t`. */
function ramp(t: number, t0: number, d: number, a: number, b: number): number {
  if (t <= t0) return a;
  if (t >= t0 + d) return b;
  return a + ((b - a) * (t - t0)) / d;
}

/** Returns v(t) for the signal. The returned function allocates nothing. */
export function signalFunction(s: Signal): (t: number) => number {
  switch (s.kind) {
    case 'step': {
      const d = rampDuration(s.rise);
      return (t) => ramp(t, s.start, d, s.from, s.to);
    }
    case 'pulse': {
      const dr = rampDuration(s.rise);
      const df = rampDuration(s.fall);
      // width is 50 %-to-50 %: the falling ramp's midpoint is `width` after the rising ramp's midpoint.
      const fallStart = s.start + dr / 2 + s.width - df / 2;
      return (t) => (t < fallStart ? ramp(t, s.start, dr, s.from, s.to) : ramp(t, fallStart, df, s.to, s.from));
    }
    case 'clock': {
      const dr = rampDuration(s.rise);
      const df = rampDuration(s.fall);
      const fallOffset = dr / 2 + s.duty * s.period - df / 2;
      return (t) => {
        if (t <= s.start) return s.low;
        const k = Math.floor((t - s.start) / s.period);
        const tau = t - s.start - k * s.period;
        return tau < fallOffset ? ramp(tau, 0, dr, s.low, s.high) : ramp(tau, fallOffset, df, s.high, s.low);
      };
    }
    case 'bits': {
      const dr = rampDuration(s.rise);
      const df = rampDuration(s.fall);
      const n = s.bits.length;
      const level = (i: number) => (s.bits[((i % n) + n) % n] ? s.high : s.low);
      return (t) => {
        if (t <= s.start) return s.low;
        const k = Math.floor((t - s.start) / s.bitTime);
        const tau = t - s.start - k * s.bitTime;
        const prev = k === 0 ? s.low : level(k - 1);
        const next = level(k);
        return ramp(tau, 0, next >= prev ? dr : df, prev, next);
      };
    }
    case 'table': {
      const ts = Float64Array.from(s.points, (p) => p[0]);
      const vs = Float64Array.from(s.points, (p) => p[1]);
      return (t) => {
        if (t <= ts[0]) return vs[0];
        const last = ts.length - 1;
        if (t >= ts[last]) return vs[last];
        let lo = 0;
        let hi = last;
        while (hi - lo > 1) {
          const mid = (lo + hi) >> 1;
          if (ts[mid] <= t) lo = mid;
          else hi = mid;
        }
        return vs[lo] + ((vs[hi] - vs[lo]) * (t - ts[lo])) / (ts[hi] - ts[lo]);
      };
    }
  }
}

/** The shortest 10–90 % transition time in the signal (s); Infinity for a constant signal. */
export function fastestEdge(s: Signal): number {
  switch (s.kind) {
    case 'step':
      return s.to === s.from ? Infinity : s.rise;
    case 'pulse':
    case 'clock':
    case 'bits':
      return Math.min(s.rise, s.fall);
    case 'table': {
      let best = Infinity;
      for (let i = 1; i < s.points.length; i++) {
        if (s.points[i][1] !== s.points[i - 1][1]) best = Math.min(best, 0.8 * (s.points[i][0] - s.points[i - 1][0]));
      }
      return best;
    }
  }
}

/** Time at which the signal has done everything it will do (the last ramp ends), used to choose a default duration. */
export function activityEnd(s: Signal): number {
  switch (s.kind) {
    case 'step':
      return s.start + rampDuration(s.rise);
    case 'pulse':
      return s.start + rampDuration(s.rise) / 2 + s.width + rampDuration(s.fall) / 2;
    case 'clock':
      return s.start + 4 * s.period;
    case 'bits':
      return s.start + s.bits.length * s.bitTime;
    case 'table':
      return s.points[s.points.length - 1][0];
  }
}

/** The low and high nominal levels of the signal. */
export function nominalLevels(s: Signal): { low: number; high: number } {
  switch (s.kind) {
    case 'step':
    case 'pulse':
      return { low: Math.min(s.from, s.to), high: Math.max(s.from, s.to) };
    case 'clock':
    case 'bits':
      return { low: s.low, high: s.high };
    case 'table': {
      let low = Infinity;
      let high = -Infinity;
      for (const [, v] of s.points) {
        low = Math.min(low, v);
        high = Math.max(high, v);
      }
      return { low, high };
    }
  }
}
