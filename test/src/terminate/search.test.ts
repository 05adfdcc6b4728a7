// The value search against the golden-section method's published properties (W. H. Press et al.,
// Numerical Recipes, 3rd ed., §10.2) on functions whose minimum is known in closed form.
import { describe, expect, it } from 'vitest';
import { GOLDEN_R, geometricPoints, searchCoordinates, searchLine } from '../../../src/terminate/search.js';

const byNumber = (a: number, b: number) => a - b;
const sq = (x: number) => x * x;

describe('geometric scan points', () => {
  it('span the range with a constant ratio and exact ends', () => {
    const p = geometricPoints(2, 200, 5);
    expect(p[0]).toBe(2);
    expect(p[4]).toBe(200);
    for (let k = 1; k < 5; k++) expect(p[k]! / p[k - 1]!).toBeCloseTo(10 ** 0.5, 12);
    expect(() => geometricPoints(0, 1, 3)).toThrow(RangeError);
  });
});

describe('searchLine', () => {
  it('finds the minimum of a smooth function of ln x within the stopping ratio', async () => {
    let calls = 0;
    const f = async (x: number) => {
      calls++;
      return sq(Math.log(x / 37.3));
    };
    const r = await searchLine(f, byNumber, { lo: 1, hi: 1000, scan: 7, ratio: 1.01 });
    expect(Math.abs(Math.log(r.best.x / 37.3))).toBeLessThan(Math.log(1.01));
    expect(r.atEdge).toBeNull();
    expect(r.trials.length).toBe(calls);
    // Press et al. §10.2: after the first step the bracket shrinks by the factor R = 0.618 per
    // evaluation. The scan's bracket spans two scan intervals: ln(1000)/3 in ln x; it must shrink to
    // ln 1.01, so at most ⌈ln(w0/ln 1.01)/ln(1/R)⌉ + 2 evaluations follow the 7 of the scan.
    const w0 = (2 * Math.log(1000)) / 6;
    const bound = Math.ceil(Math.log(w0 / Math.log(1.01)) / Math.log(1 / GOLDEN_R)) + 2;
    expect(calls - 7).toBeLessThanOrEqual(bound);
    expect(calls - 7).toBeGreaterThanOrEqual(bound - 4);
  });

  it('works on comparisons alone: a constrained minimum (feasible first) sits on the constraint', async () => {
    // minimise (ln x)² subject to x ≥ 2.5: the answer is the constraint, x = 2.5.
    type S = { ok: boolean; v: number };
    const cmp = (a: S, b: S) => (a.ok !== b.ok ? (a.ok ? -1 : 1) : a.v - b.v);
    const f = async (x: number): Promise<S> => (x >= 2.5 ? { ok: true, v: sq(Math.log(x)) } : { ok: false, v: 2.5 - x });
    const r = await searchLine(f, cmp, { lo: 0.1, hi: 100, ratio: 1.005 });
    expect(r.best.score.ok).toBe(true);
    expect(r.best.x).toBeGreaterThanOrEqual(2.5);
    expect(r.best.x).toBeLessThan(2.5 * 1.005);
  });

  it('says when the best point lies at an end of the range', async () => {
    const r = await searchLine(async (x) => x, byNumber, { lo: 3, hi: 30 });
    expect(r.atEdge).toBe('lo');
    expect(r.best.x).toBe(3);
  });
});

describe('searchCoordinates', () => {
  it('finds a separable two-value minimum', async () => {
    const f = async ([a, b]: number[]) => sq(Math.log(a! / 2)) + 3 * sq(Math.log(b! / 30));
    const r = await searchCoordinates(f, byNumber, [
      { lo: 0.1, hi: 100, start: 1 },
      { lo: 1, hi: 1000, start: 10 },
    ]);
    expect(Math.abs(Math.log(r.best.xs[0]! / 2))).toBeLessThan(0.01);
    expect(Math.abs(Math.log(r.best.xs[1]! / 30))).toBeLessThan(0.01);
    expect(r.evaluations).toBeLessThan(80);
  });

  it('moves tied values together first, then refines each on its own', async () => {
    // three values whose optima (20, 25, 30) lie close: the tied pass lands near their geometric mean,
    // the narrow pass moves each to its own optimum
    const f = async (xs: number[]) => sq(Math.log(xs[0]! / 20)) + sq(Math.log(xs[1]! / 25)) + sq(Math.log(xs[2]! / 30));
    const params = [0, 1, 2].map(() => ({ lo: 1, hi: 200, start: 50 }));
    const r = await searchCoordinates(f, byNumber, params, { groups: [[0, 1, 2]] });
    [20, 25, 30].forEach((opt, i) => expect(Math.abs(Math.log(r.best.xs[i]! / opt)), `value ${i}`).toBeLessThan(0.01));
  });
});
