// Small dense least-squares solvers for the model fits (a few columns, a few hundred rows).
// Householder QR for ordinary least squares and Lawson–Hanson for non-negative least squares
// (C. L. Lawson and R. J. Hanson, *Solving Least Squares Problems*, 1974, ch. 23).

/** A row-major matrix: rows[i][j]. */
export type Rows = number[][];

/**
 * Minimise ‖A x − b‖₂ over the columns listed in `cols` (others fixed at 0), by Householder QR.
 * Returns the full-length x. Columns that are numerically dependent get 0.
 */
export function leastSquares(A: Rows, b: number[], cols?: number[]): number[] {
  const m = A.length;
  const nAll = m > 0 ? A[0].length : 0;
  const use = cols ?? Array.from({ length: nAll }, (_, j) => j);
  const n = use.length;
  const x = new Array<number>(nAll).fill(0);
  if (n === 0 || m === 0) return x;
  // Column-major copy, each column scaled to unit norm for conditioning.
  const R = new Float64Array(m * n);
  const scale = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const j = use[k];
    let s = 0;
    for (let i = 0; i < m; i++) s += A[i][j] * A[i][j];
    scale[k] = s > 0 ? 1 / Math.sqrt(s) : 0;
    for (let i = 0; i < m; i++) R[k * m + i] = A[i][j] * scale[k];
  }
  const y = Float64Array.from(b);
  const steps = Math.min(m, n);
  const v = new Float64Array(m);
  for (let k = 0; k < steps; k++) {
    const ck = k * m;
    let norm = 0;
    for (let i = k; i < m; i++) norm += R[ck + i] * R[ck + i];
    norm = Math.sqrt(norm);
    if (norm === 0) continue;
    const alpha = R[ck + k] > 0 ? -norm : norm;
    let vv = 0;
    for (let i = k; i < m; i++) {
      v[i] = R[ck + i];
      if (i === k) v[i] -= alpha;
      vv += v[i] * v[i];
    }
    if (vv === 0) continue;
    for (let jj = k; jj < n; jj++) {
      const cj = jj * m;
      let d = 0;
      for (let i = k; i < m; i++) d += v[i] * R[cj + i];
      const f = (2 * d) / vv;
      for (let i = k; i < m; i++) R[cj + i] -= f * v[i];
    }
    let d = 0;
    for (let i = k; i < m; i++) d += v[i] * y[i];
    const f = (2 * d) / vv;
    for (let i = k; i < m; i++) y[i] -= f * v[i];
  }
  // Back substitution, dropping columns with a negligible pivot.
  let maxDiag = 0;
  for (let k = 0; k < steps; k++) maxDiag = Math.max(maxDiag, Math.abs(R[k * m + k]));
  const z = new Float64Array(n);
  for (let k = steps - 1; k >= 0; k--) {
    const rkk = R[k * m + k];
    if (Math.abs(rkk) <= 1e-13 * maxDiag) continue;
    let s = y[k];
    for (let jj = k + 1; jj < steps; jj++) s -= R[jj * m + k] * z[jj];
    z[k] = s / rkk;
  }
  for (let k = 0; k < n; k++) x[use[k]] = z[k] * scale[k];
  return x;
}

/** Residual 2-norm ‖A x − b‖₂. */
export function residualNorm(A: Rows, b: number[], x: number[]): number {
  let s = 0;
  for (let i = 0; i < A.length; i++) {
    let r = -b[i];
    for (let j = 0; j < x.length; j++) r += A[i][j] * x[j];
    s += r * r;
  }
  return Math.sqrt(s);
}

/**
 * Non-negative least squares: minimise ‖A x − b‖₂ subject to x_j ≥ 0 for j in `nonneg`
 * (all columns by default; other columns are free). Lawson–Hanson active-set method.
 */
export function nnls(A: Rows, b: number[], nonneg?: number[]): number[] {
  const n = A.length > 0 ? A[0].length : 0;
  const constrained = new Set(nonneg ?? Array.from({ length: n }, (_, j) => j));
  const free = Array.from({ length: n }, (_, j) => j).filter((j) => !constrained.has(j));
  // Passive set P: columns allowed to be non-zero. Free columns are always passive.
  const passive = new Set<number>(free);
  let x = free.length > 0 ? leastSquares(A, b, [...passive]) : new Array<number>(n).fill(0);
  const m = A.length;
  const gradient = (xv: number[]): number[] => {
    const r = new Array<number>(m);
    for (let i = 0; i < m; i++) {
      let s = b[i];
      for (let j = 0; j < n; j++) s -= A[i][j] * xv[j];
      r[i] = s;
    }
    const w = new Array<number>(n).fill(0);
    for (let j = 0; j < n; j++) {
      let s = 0;
      for (let i = 0; i < m; i++) s += A[i][j] * r[i];
      w[j] = s;
    }
    return w;
  };
  const colNorm = Array.from({ length: n }, (_, j) => {
    let s = 0;
    for (let i = 0; i < m; i++) s += A[i][j] * A[i][j];
    return Math.sqrt(s);
  });
  const bNorm = Math.sqrt(b.reduce((s, v) => s + v * v, 0));
  for (let outer = 0; outer < 3 * n + 10; outer++) {
    const w = gradient(x);
    let best = -1;
    let bestW = 0;
    for (const j of constrained) {
      if (passive.has(j)) continue;
      const tol = 1e-12 * colNorm[j] * (bNorm || 1);
      if (w[j] > tol && w[j] > bestW) {
        bestW = w[j];
        best = j;
      }
    }
    if (best < 0) break;
    passive.add(best);
    for (let inner = 0; inner < 3 * n + 10; inner++) {
      const z = leastSquares(A, b, [...passive]);
      let ok = true;
      for (const j of passive) if (constrained.has(j) && z[j] <= 0) ok = false;
      if (ok) {
        x = z;
        break;
      }
      // Step from x toward z until the first constrained component hits zero.
      let alpha = Infinity;
      for (const j of passive) {
        if (!constrained.has(j) || z[j] > 0) continue;
        const den = x[j] - z[j];
        const a = den > 0 ? x[j] / den : 0;
        if (a < alpha) alpha = a;
      }
      if (!Number.isFinite(alpha)) alpha = 0;
      for (let j = 0; j < n; j++) x[j] = x[j] + alpha * (z[j] - x[j]);
      for (const j of [...passive]) {
        if (constrained.has(j) && x[j] <= 1e-300) {
          x[j] = 0;
          passive.delete(j);
        }
      }
    }
  }
  for (const j of constrained) if (x[j] < 0) x[j] = 0;
  return x;
}

/**
 * Solve f(x) = target for a function decreasing on [lo, hi], by bisection to machine precision.
 * Throws a RangeError naming `what` when the target lies outside [f(hi), f(lo)].
 */
export function solveDecreasing(target: number, f: (x: number) => number, lo: number, hi: number, what: string): number {
  if (!(target > 0)) throw new RangeError(`${what}: target Z0 must be > 0 (got ${target})`);
  const fLo = f(lo);
  const fHi = f(hi);
  if (!(target <= fLo && target >= fHi)) {
    throw new RangeError(`${what}: Z0 = ${target} ohm is out of reach (${fHi.toFixed(2)} to ${fLo.toFixed(2)} ohm for this cross-section)`);
  }
  for (let i = 0; i < 200 && hi - lo > 1e-14 * Math.max(1, Math.abs(lo)); i++) {
    const mid = 0.5 * (lo + hi);
    if (f(mid) > target) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}
