// Linear scales: map a data interval onto a pixel interval and back.
// Pure functions on plain numbers; no drawing here.

export interface LinearScale {
  /** Data interval [d0, d1]; d0 may exceed d1 (reversed axis). */
  readonly domain: readonly [number, number];
  /** Pixel interval [r0, r1]; for a y axis usually [bottom, top]. */
  readonly range: readonly [number, number];
  /** Data value → pixel coordinate (not clamped). */
  map(value: number): number;
  /** Pixel coordinate → data value. */
  invert(pixel: number): number;
}

/**
 * A linear scale from `domain` to `range`. A zero-width domain is widened
 * symmetrically (by 1 for 0, else by 1 % of |value|) so the scale stays finite.
 */
export function linearScale(
  domain: readonly [number, number],
  range: readonly [number, number],
): LinearScale {
  let [d0, d1] = domain;
  if (!Number.isFinite(d0) || !Number.isFinite(d1)) {
    throw new RangeError(`linearScale: domain must be finite, got [${d0}, ${d1}]`);
  }
  if (!Number.isFinite(range[0]) || !Number.isFinite(range[1])) {
    throw new RangeError(`linearScale: range must be finite, got [${range[0]}, ${range[1]}]`);
  }
  if (d0 === d1) {
    const pad = d0 === 0 ? 1 : Math.abs(d0) * 0.01;
    d0 -= pad;
    d1 += pad;
  }
  const [r0, r1] = range;
  const k = (r1 - r0) / (d1 - d0);
  return {
    domain: [d0, d1],
    range: [r0, r1],
    map: (v) => r0 + (v - d0) * k,
    invert: (p) => d0 + (p - r0) / k,
  };
}

/** Finite min and max over several arrays, ignoring NaN and ±Infinity; null if none. */
export function extent(arrays: readonly ArrayLike<number>[]): [number, number] | null {
  let lo = Infinity;
  let hi = -Infinity;
  for (const a of arrays) {
    for (let i = 0; i < a.length; i++) {
      const v = a[i];
      if (v < lo) lo = v; // NaN compares false and is skipped
      if (v > hi) hi = v;
    }
  }
  if (lo === Infinity && hi === -Infinity) return null;
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) {
    // an infinity got in: redo ignoring non-finite values
    lo = Infinity;
    hi = -Infinity;
    for (const a of arrays) {
      for (let i = 0; i < a.length; i++) {
        const v = a[i];
        if (!Number.isFinite(v)) continue;
        if (v < lo) lo = v;
        if (v > hi) hi = v;
      }
    }
    if (lo === Infinity) return null;
  }
  return [lo, hi];
}

/**
 * Widen [lo, hi] by `fraction` of its span on each side. A zero span (or one
 * below 1e-9 of the magnitude) is opened to ±10 % of |value| (±1 around zero)
 * so a flat trace sits mid-plot.
 */
export function padDomain(lo: number, hi: number, fraction = 0.05): [number, number] {
  if (lo > hi) [lo, hi] = [hi, lo];
  const span = hi - lo;
  // spans at the level of floating-point noise count as flat (a settled trace
  // must not be blown up to fill the plot with rounding error)
  if (span === 0 || span < Math.max(Math.abs(lo), Math.abs(hi)) * 1e-9) {
    const mid = (lo + hi) / 2;
    lo = hi = mid;
    const pad = lo === 0 ? 1 : Math.abs(lo) * 0.1;
    return [lo - pad, hi + pad];
  }
  return [lo - span * fraction, hi + span * fraction];
}
