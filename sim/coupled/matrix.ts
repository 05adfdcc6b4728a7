// Small dense real matrices for coupled sections (k conductors, k a handful): row-major
// Float64Arrays of k·k entries. Symmetry and definiteness tests, the symmetric eigenproblem
// (cyclic Jacobi) and a linear solve whose arithmetic on a diagonal matrix is one division per
// entry, so uncoupled conductors get exactly the coefficients of the single-line kernel.

/** Entry (r, c) of a k×k row-major matrix. */
export const at = (m: Float64Array, k: number, r: number, c: number): number => m[r * k + c];

/** Largest |entry|. */
export function maxAbs(m: Float64Array): number {
  let s = 0;
  for (const x of m) s = Math.max(s, Math.abs(x));
  return s;
}

/** The first (r, c), r < c, where |m_rc − m_cr| exceeds tol·max|m|; null when symmetric. */
export function asymmetry(m: Float64Array, k: number, tol = 1e-9): { r: number; c: number } | null {
  const bound = tol * maxAbs(m);
  for (let r = 0; r < k; r++) for (let c = r + 1; c < k; c++) if (Math.abs(m[r * k + c] - m[c * k + r]) > bound) return { r, c };
  return null;
}

/** Cholesky factor (lower, row-major) of a symmetric matrix; null unless it is positive definite. */
export function cholesky(m: Float64Array, k: number): Float64Array | null {
  const l = new Float64Array(k * k);
  for (let j = 0; j < k; j++) {
    let d = m[j * k + j];
    for (let p = 0; p < j; p++) d -= l[j * k + p] ** 2;
    if (!(d > 0)) return null;
    const ljj = Math.sqrt(d);
    l[j * k + j] = ljj;
    for (let i = j + 1; i < k; i++) {
      let s = m[i * k + j];
      for (let p = 0; p < j; p++) s -= l[i * k + p] * l[j * k + p];
      l[i * k + j] = s / ljj;
    }
  }
  return l;
}

/** True when the symmetric matrix is positive semi-definite (all eigenvalues ≥ −tol·max|m|). */
export function isPositiveSemiDefinite(m: Float64Array, k: number, tol = 1e-12): boolean {
  const { values } = symmetricEigen(m, k);
  const bound = tol * maxAbs(m);
  return values.every((x) => x >= -bound);
}

/**
 * Eigen-decomposition of a real symmetric matrix by cyclic Jacobi rotations (Golub & Van Loan,
 * *Matrix Computations*, the symmetric Jacobi method): m = V·diag(values)·Vᵀ, V orthogonal
 * (eigenvector j is column j), values in ascending order.
 */
export function symmetricEigen(m: Float64Array, k: number): { values: Float64Array; vectors: Float64Array } {
  const a = Float64Array.from(m);
  const v = new Float64Array(k * k);
  for (let i = 0; i < k; i++) v[i * k + i] = 1;
  for (let sweep = 0; sweep < 64; sweep++) {
    let off = 0;
    let diag = 0;
    for (let p = 0; p < k; p++) {
      diag += a[p * k + p] ** 2;
      for (let q = p + 1; q < k; q++) off += a[p * k + q] ** 2;
    }
    if (off <= 1e-32 * diag || off === 0) break;
    for (let p = 0; p < k; p++) for (let q = p + 1; q < k; q++) rotate(a, v, k, p, q);
  }
  const order = [...Array(k).keys()].sort((x, y) => a[x * k + x] - a[y * k + y]);
  const values = Float64Array.from(order, (j) => a[j * k + j]);
  const vectors = new Float64Array(k * k);
  order.forEach((j, col) => {
    for (let r = 0; r < k; r++) vectors[r * k + col] = v[r * k + j];
  });
  return { values, vectors };
}

/** One Jacobi rotation zeroing a[p][q] (a ← Jᵀ·a·J, v ← v·J). */
function rotate(a: Float64Array, v: Float64Array, k: number, p: number, q: number): void {
  const apq = a[p * k + q];
  if (apq === 0) return;
  const theta = (a[q * k + q] - a[p * k + p]) / (2 * apq);
  const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
  const c = 1 / Math.sqrt(t * t + 1);
  const s = t * c;
  for (let r = 0; r < k; r++) {
    const arp = a[r * k + p];
    const arq = a[r * k + q];
    a[r * k + p] = c * arp - s * arq;
    a[r * k + q] = s * arp + c * arq;
  }
  for (let r = 0; r < k; r++) {
    const apr = a[p * k + r];
    const aqr = a[q * k + r];
    a[p * k + r] = c * apr - s * aqr;
    a[q * k + r] = s * apr + c * aqr;
  }
  for (let r = 0; r < k; r++) {
    const vrp = v[r * k + p];
    const vrq = v[r * k + q];
    v[r * k + p] = c * vrp - s * vrq;
    v[r * k + q] = s * vrp + c * vrq;
  }
}

/**
 * X = M⁻¹·N for a k×k M and a k×p N, by Gauss–Jordan elimination with partial pivoting. Rows are
 * divided by their pivot (not multiplied by its reciprocal) and zero multipliers are skipped, so a
 * diagonal M gives X_ij = N_ij / M_ii exactly. Throws if M is singular.
 */
export function solveMatrix(m: Float64Array, n: Float64Array, k: number, p: number): Float64Array {
  const a = Float64Array.from(m);
  const x = Float64Array.from(n);
  const tiny = maxAbs(m) * k * 1e-14;
  for (let col = 0; col < k; col++) {
    let piv = col;
    for (let r = col + 1; r < k; r++) if (Math.abs(a[r * k + col]) > Math.abs(a[piv * k + col])) piv = r;
    if (!(Math.abs(a[piv * k + col]) > tiny)) throw new RangeError('solveMatrix: singular matrix');
    if (piv !== col) {
      swapRows(a, k, col, piv);
      swapRows(x, p, col, piv);
    }
    const d = a[col * k + col];
    for (let c = 0; c < k; c++) a[col * k + c] /= d;
    for (let c = 0; c < p; c++) x[col * p + c] /= d;
    for (let r = 0; r < k; r++) {
      const f = a[r * k + col];
      if (r === col || f === 0) continue;
      for (let c = 0; c < k; c++) a[r * k + c] -= f * a[col * k + c];
      for (let c = 0; c < p; c++) x[r * p + c] -= f * x[col * p + c];
    }
  }
  return x;
}

function swapRows(m: Float64Array, width: number, r1: number, r2: number): void {
  for (let c = 0; c < width; c++) {
    const t = m[r1 * width + c];
    m[r1 * width + c] = m[r2 * width + c];
    m[r2 * width + c] = t;
  }
}

/** The k×k identity. */
export function identity(k: number): Float64Array {
  const m = new Float64Array(k * k);
  for (let i = 0; i < k; i++) m[i * k + i] = 1;
  return m;
}

/** A·B for k×k matrices. */
export function matmul(a: Float64Array, b: Float64Array, k: number): Float64Array {
  const c = new Float64Array(k * k);
  for (let i = 0; i < k; i++)
    for (let t = 0; t < k; t++) {
      const f = a[i * k + t];
      for (let j = 0; j < k; j++) c[i * k + j] += f * b[t * k + j];
    }
  return c;
}

/** Aᵀ. */
export function transpose(a: Float64Array, k: number): Float64Array {
  const t = new Float64Array(k * k);
  for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) t[j * k + i] = a[i * k + j];
  return t;
}

/** s·A + t·B, entry by entry. */
export function combine(s: number, a: Float64Array, t: number, b: Float64Array): Float64Array {
  return Float64Array.from(a, (x, i) => s * x + t * b[i]);
}

/** A k×k matrix from nested rows (for tests, reports and hand-written inputs). */
export function fromRows(rows: ReadonlyArray<ReadonlyArray<number>>): Float64Array {
  const k = rows.length;
  const m = new Float64Array(k * k);
  rows.forEach((row, r) => {
    if (row.length !== k) throw new RangeError(`fromRows: row ${r} has ${row.length} entries, expected ${k}`);
    row.forEach((x, c) => (m[r * k + c] = x));
  });
  return m;
}

/** Nested rows of a k×k matrix. */
export function toRows(m: Float64Array, k: number): number[][] {
  return Array.from({ length: k }, (_, r) => Array.from(m.subarray(r * k, (r + 1) * k)));
}
