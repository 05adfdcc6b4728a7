// Rounding part values to a preferred-number series (IEC 60063) and re-simulating: the nearest member
// of each value first (log scale, src/terminate/eseries.ts); when that set breaks the checks or the
// topology's rule (an AC termination's time constant), every combination of each value's lower and
// upper neighbour is tried and the best one that keeps them is taken (for more than four values, each
// value's other neighbour on its own, to bound the work).
import { neighbours, type SeriesName } from './eseries.js';
import type { Score } from './objective.js';

export interface Rounded<T> {
  values: number[];
  result: T;
  score: Score;
  /** Simulations the rounding took. */
  sims: number;
  /** How the values were chosen: "nearest", "neighbour" (the nearest broke a check), "none kept the checks". */
  how: 'nearest' | 'neighbour' | 'best failing';
}

/** Candidate sets after the nearest: every below/above combination (≤ 4 values), else single flips. */
export function neighbourSets(values: readonly number[], series: SeriesName): number[][] {
  const nb = values.map((v) => neighbours(series, v));
  const nearest = nb.map((n) => n.nearest);
  const out: number[][] = [];
  const key = (xs: readonly number[]) => xs.join(',');
  const seen = new Set([key(nearest)]);
  const push = (xs: number[]) => {
    if (!seen.has(key(xs))) {
      seen.add(key(xs));
      out.push(xs);
    }
  };
  if (values.length <= 4) {
    for (let mask = 0; mask < 1 << values.length; mask++) push(nb.map((n, i) => ((mask >> i) & 1 ? n.above : n.below)));
  } else {
    nb.forEach((n, i) => push(nearest.map((x, j) => (j === i ? (x === n.below ? n.above : n.below) : x))));
    // every value rounded up, and every value rounded down: a rule on a product (R·C ≥ a floor) that
    // the continuous values keep is kept by the first
    push(nb.map((n) => n.above));
    push(nb.map((n) => n.below));
  }
  return out;
}

export async function roundAndCheck<T>(
  values: readonly number[],
  series: SeriesName,
  run: (pv: number[]) => Promise<{ result: T; score: Score }>,
  compare: (a: Score, b: Score) => number,
  valid: (pv: readonly number[]) => boolean = () => true,
): Promise<Rounded<T>> {
  const nearest = values.map((v) => neighbours(series, v).nearest);
  let sims = 0;
  const tried: { values: number[]; result: T; score: Score }[] = [];
  if (valid(nearest)) {
    const r = await run(nearest);
    sims++;
    if (r.score.pass) return { values: nearest, ...r, sims, how: 'nearest' };
    tried.push({ values: nearest, ...r });
  }
  const others = neighbourSets(values, series).filter((xs) => valid(xs));
  const results = await Promise.all(others.map((xs) => run(xs)));
  sims += results.length;
  results.forEach((r, k) => tried.push({ values: others[k]!, ...r }));
  if (tried.length === 0) throw new Error('no rounded value set obeys the topology rule');
  let best = tried[0]!;
  for (const t of tried) if (compare(t.score, best.score) < 0) best = t;
  return { ...best, sims, how: best.score.pass ? 'neighbour' : 'best failing' };
}
