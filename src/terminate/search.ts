// The search for a termination's part values: one positive value at a time, on a log scale (part
// values span decades and the preferred-value series are geometric).
//
// Per value: a coarse geometric scan of the range (its points are independent, so they run in
// parallel on the sweep's worker pool), then a golden-section search inside the bracket the best scan
// point and its two neighbours make (W. H. Press et al., Numerical Recipes, 3rd ed., §10.2 "Golden
// Section Search in One Dimension": each new point goes into the larger part of the bracket at the
// fraction 0.38197 from the middle point, and the bracket shrinks by 0.61803 per evaluation once the
// points sit at golden positions). The scan protects against the objective's steps and plateaus (a
// settling time jumps by a round trip when a ringing peak leaves the band); golden section then needs
// only comparisons, so a score may be a tuple (feasible first, then the objective).
//
// Several values (a split pair, R and C, one resistor per branch) are searched by coordinate descent:
// first each group of tied values together over its whole range, then each value on its own in a
// narrow bracket around the current point.

/** Golden-section constants (Press et al., §10.2): R = (√5 − 1)/2, C = 1 − R. */
export const GOLDEN_R = (Math.sqrt(5) - 1) / 2;
export const GOLDEN_C = 1 - GOLDEN_R;

/** Orders two scores: negative when a is better than b. */
export type Compare<S> = (a: S, b: S) => number;

export interface Trial<S> {
  x: number;
  score: S;
}

export interface LineSearchOptions {
  /** Range of the value (lo < hi, both > 0). */
  lo: number;
  hi: number;
  /** Points of the first scan, both ends included (default 7, at least 3). */
  scan?: number;
  /** Stop when the bracket's ratio hi/lo is at most this (default 1.01: 1 %, inside E96 steps of 2.4 %). */
  ratio?: number;
  /** At most this many golden-section evaluations after the scan (default 40). */
  maxSteps?: number;
}

export interface LineSearchResult<S> {
  best: Trial<S>;
  /** Every evaluation, in the order made. */
  trials: Trial<S>[];
  /** The best point lies at an end of the range (the optimum may lie outside it). */
  atEdge: 'lo' | 'hi' | null;
}

/** n points from lo to hi evenly spaced on a log scale, both ends exact. */
export function geometricPoints(lo: number, hi: number, n: number): number[] {
  if (!(lo > 0 && hi > lo && Number.isFinite(hi))) throw new RangeError(`a log-scale range needs 0 < lo < hi, got ${lo} … ${hi}`);
  if (!(Number.isInteger(n) && n >= 2)) throw new RangeError(`a scan needs at least 2 points, got ${n}`);
  const r = Math.log(hi / lo);
  return Array.from({ length: n }, (_, k) => (k === 0 ? lo : k === n - 1 ? hi : lo * Math.exp((r * k) / (n - 1))));
}

/** Index of the best trial (ties: the first). */
function bestIndex<S>(trials: readonly Trial<S>[], compare: Compare<S>): number {
  let b = 0;
  for (let k = 1; k < trials.length; k++) if (compare(trials[k]!.score, trials[b]!.score) < 0) b = k;
  return b;
}

/**
 * Golden-section search for the best point inside the bracket a < b < c (in u = ln x), given the
 * score at b (no worse than at a and c). Press et al. §10.2, routine `golden`.
 */
async function golden<S>(f: (x: number) => Promise<S>, compare: Compare<S>, a: number, b: Trial<S>, c: number, ratio: number, maxSteps: number, trials: Trial<S>[]): Promise<Trial<S>> {
  const ua = Math.log(a);
  const ub = Math.log(b.x);
  const uc = Math.log(c);
  let u0 = ua;
  let u3 = uc;
  let u1: number, u2: number;
  let t1: Trial<S>, t2: Trial<S>;
  const at = async (u: number): Promise<Trial<S>> => {
    const x = Math.exp(u);
    const t = { x, score: await f(x) };
    trials.push(t);
    return t;
  };
  if (uc - ub > ub - ua) {
    u1 = ub;
    t1 = b;
    u2 = ub + GOLDEN_C * (uc - ub);
    t2 = await at(u2);
  } else {
    u2 = ub;
    t2 = b;
    u1 = ub - GOLDEN_C * (ub - ua);
    t1 = await at(u1);
  }
  const stop = Math.log(ratio);
  for (let step = 1; u3 - u0 > stop && step < maxSteps; step++) {
    if (compare(t2.score, t1.score) < 0) {
      u0 = u1;
      u1 = u2;
      t1 = t2;
      u2 = GOLDEN_R * u2 + GOLDEN_C * u3;
      t2 = await at(u2);
    } else {
      u3 = u2;
      u2 = u1;
      t2 = t1;
      u1 = GOLDEN_R * u1 + GOLDEN_C * u0;
      t1 = await at(u1);
    }
  }
  return compare(t2.score, t1.score) < 0 ? t2 : t1;
}

/** The best value of f over [lo, hi]: a geometric scan, then golden section in the best bracket. */
export async function searchLine<S>(f: (x: number) => Promise<S>, compare: Compare<S>, opts: LineSearchOptions): Promise<LineSearchResult<S>> {
  const n = Math.max(3, opts.scan ?? 7);
  const xs = geometricPoints(opts.lo, opts.hi, n);
  const scores = await Promise.all(xs.map((x) => f(x)));
  const trials: Trial<S>[] = xs.map((x, k) => ({ x, score: scores[k]! }));
  return refine(f, compare, trials, opts.ratio ?? 1.01, opts.maxSteps ?? 40);
}

/** Golden section from a scan already made (trials in ascending x). */
async function refine<S>(f: (x: number) => Promise<S>, compare: Compare<S>, scan: Trial<S>[], ratio: number, maxSteps: number): Promise<LineSearchResult<S>> {
  const trials = [...scan];
  const k = bestIndex(scan, compare);
  const last = scan.length - 1;
  const atEdge = k === 0 ? 'lo' : k === last ? 'hi' : null;
  // At an end the bracket is the end interval, with its midpoint (in ln x) as the middle point.
  let a: number, c: number, b: Trial<S>;
  if (atEdge === null) {
    a = scan[k - 1]!.x;
    b = scan[k]!;
    c = scan[k + 1]!.x;
  } else {
    const [p, q] = atEdge === 'lo' ? [scan[0]!, scan[1]!] : [scan[last - 1]!, scan[last]!];
    const mid = Math.sqrt(p.x * q.x);
    const m = { x: mid, score: await f(mid) };
    trials.push(m);
    const edge = atEdge === 'lo' ? p : q;
    // The end point stays a candidate: golden section runs between the end and the far scan point.
    if (compare(edge.score, m.score) < 0) return { best: edge, trials, atEdge };
    a = p.x;
    b = m;
    c = q.x;
  }
  const best = await golden(f, compare, a, b, c, ratio, maxSteps, trials);
  const overall = trials[bestIndex(trials, compare)]!;
  return { best: compare(overall.score, best.score) < 0 ? overall : best, trials, atEdge };
}

/** One searched value of a multi-value search. */
export interface SearchParam {
  lo: number;
  hi: number;
  /** Where the value starts (inside [lo, hi]); its value until its turn comes. */
  start: number;
}

export interface CoordinateOptions {
  /** Values moved together (tied to one value) in the first pass, e.g. one resistor per branch. Default: each on its own. */
  groups?: number[][];
  /** Points of the first pass's scans (default 7). */
  scan?: number;
  /** Bracket of the second pass: ×/÷ this around the first pass's value (default 1.6; ≤ 1 skips the pass). */
  narrow?: number;
  ratio?: number;
}

export interface CoordinateResult<S> {
  best: { xs: number[]; score: S };
  /** Evaluations made (each a simulation). */
  evaluations: number;
  /** Values whose best lay at an end of their range. */
  atEdge: number[];
}

/**
 * Coordinate descent over several positive values: each group over its whole range (scan + golden
 * section), then each value alone in a narrow bracket. `f` gets the full vector.
 */
export async function searchCoordinates<S>(f: (xs: number[]) => Promise<S>, compare: Compare<S>, params: readonly SearchParam[], opts: CoordinateOptions = {}): Promise<CoordinateResult<S>> {
  const xs = params.map((p) => p.start);
  let evaluations = 0;
  let bestScore: S | undefined;
  const atEdge = new Set<number>();
  const groups = opts.groups ?? params.map((_, i) => [i]);
  const evalWith = (group: readonly number[]) => async (x: number) => {
    const v = [...xs];
    for (const i of group) v[i] = clamp(x, params[i]!);
    evaluations++;
    return f(v);
  };
  for (const group of groups) {
    const p = params[group[0]!]!;
    const r = await searchLine(evalWith(group), compare, { lo: p.lo, hi: p.hi, scan: opts.scan, ratio: opts.ratio });
    for (const i of group) xs[i] = clamp(r.best.x, params[i]!);
    bestScore = r.best.score;
    if (r.atEdge) for (const i of group) atEdge.add(i);
  }
  const narrow = opts.narrow ?? 1.6;
  const tied = groups.some((g) => g.length > 1);
  if (narrow > 1 && (params.length > 1 || tied)) {
    for (let i = 0; i < params.length; i++) {
      const p = params[i]!;
      const lo = Math.max(p.lo, xs[i]! / narrow);
      const hi = Math.min(p.hi, xs[i]! * narrow);
      if (!(hi > lo * 1.0001)) continue;
      const g = evalWith([i]);
      // The current point is known: a three-point scan lo, x, hi needs two new evaluations.
      const here = { x: xs[i]!, score: bestScore as S };
      const scan: Trial<S>[] = [];
      if (lo < here.x) scan.push({ x: lo, score: await g(lo) });
      scan.push(here);
      if (hi > here.x) scan.push({ x: hi, score: await g(hi) });
      const r = scan.length === 3 ? await refine(g, compare, scan, opts.ratio ?? 1.01, 40) : { best: scan[bestIndex(scan, compare)]!, trials: scan, atEdge: null };
      if (compare(r.best.score, bestScore as S) < 0 || r.best.x === here.x) {
        xs[i] = r.best.x;
        bestScore = r.best.score;
      }
    }
  }
  return { best: { xs, score: bestScore as S }, evaluations, atEdge: [...atEdge].sort((a, b) => a - b) };
}

function clamp(x: number, p: SearchParam): number {
  return Math.min(p.hi, Math.max(p.lo, x));
}
