import { describe, expect, it } from 'vitest';
import { columnEnvelope, columnOf, reduceTrace } from '../../../src/render/reduce.js';

/** Deterministic pseudo-random numbers in [0, 1). */
function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s * 1664525 + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

/** Per-column min/max of points, the brute-force way. */
function bruteEnvelope(xs: ArrayLike<number>, ys: ArrayLike<number>, d0: number, d1: number, columns: number) {
  const min = new Array<number>(columns).fill(Infinity);
  const max = new Array<number>(columns).fill(-Infinity);
  for (let i = 0; i < xs.length; i++) {
    const x = xs[i], y = ys[i];
    if (!Number.isFinite(x) || !Number.isFinite(y) || x < d0 || x > d1) continue;
    const c = columnOf(x, d0, d1, columns);
    if (y < min[c]) min[c] = y;
    if (y > max[c]) max[c] = y;
  }
  return { min, max };
}

describe('reduceTrace', () => {
  it('keeps each pixel column’s min and max exactly (random trace, uneven column count)', () => {
    const r = rng(7);
    const n = 100_003, columns = 317, dx = 1e-12, x0 = 0;
    const v = new Float64Array(n);
    let walk = 0;
    for (let i = 0; i < n; i++) v[i] = walk += r() - 0.5 + (r() < 1e-4 ? 40 * (r() - 0.5) : 0);
    const xs = Float64Array.from({ length: n }, (_, i) => x0 + i * dx);
    const d: [number, number] = [x0, x0 + (n - 1) * dx];

    const line = reduceTrace(v, { x0, dx }, d, columns);
    expect(line.xs.length).toBeLessThanOrEqual(4 * columns + 2);
    const want = bruteEnvelope(xs, v, d[0], d[1], columns);
    const got = bruteEnvelope(line.xs, line.ys, d[0], d[1], columns);
    expect(got.min).toEqual(want.min);
    expect(got.max).toEqual(want.max);
    // the same envelope from columnEnvelope
    const env = columnEnvelope(v, { x0, dx }, d, columns);
    expect(Array.from(env.min)).toEqual(want.min);
    expect(Array.from(env.max)).toEqual(want.max);
    // points stay in sample order, start and end on the trace's ends
    for (let k = 1; k < line.xs.length; k++) expect(line.xs[k]).toBeGreaterThanOrEqual(line.xs[k - 1]);
    expect(line.ys[0]).toBe(v[0]);
    expect(line.ys[line.ys.length - 1]).toBe(v[n - 1]);
    // every emitted point is a real sample
    for (let k = 0; k < line.xs.length; k++) {
      const i = Math.round((line.xs[k] - x0) / dx);
      expect(line.ys[k]).toBe(v[i]);
    }
  });

  it('zoomed in: the envelope inside the domain is exact and one neighbour is kept each side', () => {
    const r = rng(99);
    const n = 50_000, dx = 0.5;
    const v = Float64Array.from({ length: n }, () => r() * 2 - 1);
    const d: [number, number] = [1000.25, 9000.75];
    const columns = 200;
    const line = reduceTrace(v, { x0: 0, dx }, d, columns);
    const xs = Float64Array.from({ length: n }, (_, i) => i * dx);
    expect(bruteEnvelope(line.xs, line.ys, d[0], d[1], columns)).toEqual(bruteEnvelope(xs, v, d[0], d[1], columns));
    expect(line.xs[0]).toBeLessThan(d[0]);
    expect(line.xs[line.xs.length - 1]).toBeGreaterThan(d[1]);
  });

  it('explicit, unevenly spaced positions work the same way', () => {
    const r = rng(3);
    const n = 20_000;
    const xs = new Float64Array(n);
    for (let i = 1; i < n; i++) xs[i] = xs[i - 1] + r() * 2;
    const v = Float64Array.from({ length: n }, () => r());
    const d: [number, number] = [xs[0], xs[n - 1]];
    const line = reduceTrace(v, { xs }, d, 123);
    expect(bruteEnvelope(line.xs, line.ys, d[0], d[1], 123)).toEqual(bruteEnvelope(xs, v, d[0], d[1], 123));
  });

  it('returns the raw samples when there are few per column', () => {
    const v = new Float64Array([0, 1, 0, -1, 0]);
    const line = reduceTrace(v, { x0: 0, dx: 1 }, [0, 4], 800);
    expect(Array.from(line.xs)).toEqual([0, 1, 2, 3, 4]);
    expect(Array.from(line.ys)).toEqual([0, 1, 0, -1, 0]);
  });

  it('turns NaN samples into gaps (a NaN point) in both modes', () => {
    const few = reduceTrace(new Float64Array([1, NaN, 3]), { x0: 0, dx: 1 }, [0, 2], 100);
    expect(Number.isNaN(few.ys[1])).toBe(true);
    const n = 10_000;
    const v = Float64Array.from({ length: n }, (_, i) => (i >= 5000 && i < 5100 ? NaN : Math.sin(i / 50)));
    const line = reduceTrace(v, { x0: 0, dx: 1 }, [0, n - 1], 100);
    expect(Array.from(line.ys).some(Number.isNaN)).toBe(true);
    const finite = Array.from(line.ys).filter(Number.isFinite);
    expect(Math.max(...finite)).toBe(Math.max(...Array.from(v).filter(Number.isFinite)));
  });

  it('handles an empty trace and rejects bad spacing or domains', () => {
    expect(reduceTrace(new Float64Array(0), { x0: 0, dx: 1 }, [0, 1], 10).xs.length).toBe(0);
    expect(() => reduceTrace(new Float64Array(3), { x0: 0, dx: 0 }, [0, 1], 10)).toThrow(RangeError);
    expect(() => reduceTrace(new Float64Array(3), { x0: 0, dx: 1 }, [1, 1], 10)).toThrow(RangeError);
  });

  it('reduces 10⁶ samples to at most four points per column', () => {
    const n = 1_000_000;
    const v = Float64Array.from({ length: n }, (_, i) => Math.sin(i * 1e-3) + 0.1 * Math.sin(i * 0.7));
    const line = reduceTrace(v, { x0: 0, dx: 1e-12 }, [0, (n - 1) * 1e-12], 1000);
    expect(line.xs.length).toBeLessThanOrEqual(4002);
  });
});

describe('columnOf', () => {
  it('puts the domain end in the last column', () => {
    expect(columnOf(0, 0, 10, 5)).toBe(0);
    expect(columnOf(1.99, 0, 10, 5)).toBe(0);
    expect(columnOf(2, 0, 10, 5)).toBe(1);
    expect(columnOf(10, 0, 10, 5)).toBe(4);
  });
});
