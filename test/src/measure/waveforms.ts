// Waveforms with known answers for the measurement tests: each is a closed-form function of time,
// sampled at t = i·dt.

export function sample(f: (t: number) => number, dt: number, n: number): Float64Array {
  const v = new Float64Array(n);
  for (let i = 0; i < n; i++) v[i] = f(i * dt);
  return v;
}

/** Linear ramp from `from` to `to`, starting at t0 and lasting `duration`. */
export function ramp(t0: number, duration: number, from = 0, to = 1): (t: number) => number {
  return (t) => (t <= t0 ? from : t >= t0 + duration ? to : from + ((to - from) * (t - t0)) / duration);
}

/** First-order (RC) step response from `from` to `to`, starting at t0 with time constant tau. */
export function rcStep(t0: number, tau: number, from = 0, to = 1): (t: number) => number {
  return (t) => (t <= t0 ? from : to + (from - to) * Math.exp(-(t - t0) / tau));
}

/**
 * Unit step response of the second-order system wn²/(s² + 2ζwn s + wn²), 0 < ζ < 1, starting at t0:
 * y = 1 − e^(−ζ wn t)·(cos wd t + ζ/√(1−ζ²)·sin wd t), wd = wn√(1−ζ²)   (Ogata, Modern Control Engineering).
 */
export function secondOrderStep(t0: number, zeta: number, wn: number, from = 0, to = 1): (t: number) => number {
  const s = Math.sqrt(1 - zeta * zeta);
  const wd = wn * s;
  return (t) => {
    if (t <= t0) return from;
    const x = t - t0;
    const y = 1 - Math.exp(-zeta * wn * x) * (Math.cos(wd * x) + (zeta / s) * Math.sin(wd * x));
    return from + (to - from) * y;
  };
}

/** Damped cosine settling onto 1: y = 1 − e^(−t/τ)·cos(ωt) for t > t0 (0 before). */
export function dampedCosine(t0: number, tau: number, omega: number): (t: number) => number {
  return (t) => (t <= t0 ? 0 : 1 - Math.exp(-(t - t0) / tau) * Math.cos(omega * (t - t0)));
}

/** Piecewise-linear waveform through [t, v] points, constant outside. */
export function pwl(points: ReadonlyArray<readonly [number, number]>): (t: number) => number {
  return (t) => {
    if (t <= points[0]![0]) return points[0]![1];
    for (let k = 1; k < points.length; k++) {
      const [ta, va] = points[k - 1]!;
      const [tb, vb] = points[k]!;
      if (t <= tb) return tb === ta ? vb : va + ((vb - va) * (t - ta)) / (tb - ta);
    }
    return points[points.length - 1]![1];
  };
}

/** Trapezoidal clock: low/high, period, 0–100 % ramps of `edge` seconds, first rising ramp at t0. */
export function trapezoidClock(t0: number, period: number, edge: number, low = 0, high = 1): (t: number) => number {
  const half = period / 2;
  return (t) => {
    if (t <= t0) return low;
    const x = (t - t0) % period;
    if (x < edge) return low + ((high - low) * x) / edge;
    if (x < half) return high;
    if (x < half + edge) return high - ((high - low) * (x - half)) / edge;
    return low;
  };
}

/** Deterministic pseudo-random numbers (mulberry32) and Gaussian noise (Box–Muller). */
export function rng(seed: number): { uniform: () => number; gauss: () => number } {
  let a = seed >>> 0;
  const uniform = (): number => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const gauss = (): number => {
    const u = Math.max(uniform(), 1e-300);
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * uniform());
  };
  return { uniform, gauss };
}

/** Bisection for a root of f on [a, b] (f(a), f(b) of opposite signs). */
export function bisect(f: (t: number) => number, a: number, b: number, tol = 1e-18): number {
  let fa = f(a);
  for (let k = 0; k < 200 && b - a > tol; k++) {
    const m = 0.5 * (a + b);
    const fm = f(m);
    if (fa * fm <= 0) b = m;
    else {
      a = m;
      fa = fm;
    }
  }
  return 0.5 * (a + b);
}

/** Assert that a value contains only JSON-safe data: no typed arrays, NaN, Infinity or undefined in arrays. */
export function jsonProblems(x: unknown, path = '$'): string[] {
  if (x === null) return [];
  if (typeof x === 'number') return Number.isFinite(x) ? [] : [`${path} is ${x}`];
  if (typeof x === 'string' || typeof x === 'boolean') return [];
  if (ArrayBuffer.isView(x)) return [`${path} is a typed array`];
  if (Array.isArray(x)) return x.flatMap((y, i) => (y === undefined ? [`${path}[${i}] is undefined`] : jsonProblems(y, `${path}[${i}]`)));
  if (typeof x === 'object') {
    return Object.entries(x as Record<string, unknown>).flatMap(([k, y]) => (y === undefined ? [] : jsonProblems(y, `${path}.${k}`)));
  }
  return [`${path} has type ${typeof x}`];
}
