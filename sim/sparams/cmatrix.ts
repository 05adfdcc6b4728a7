// Small dense complex matrices for network conversions: n×n, row-major, real and imaginary parts
// interleaved in one Float64Array (entry (i, j) at 2(i·n + j), 2(i·n + j) + 1). A handful of ports,
// evaluated once per frequency: clarity over speed.

/** An n×n complex matrix. */
export interface CMatrix {
  n: number;
  /** re, im interleaved, row-major. */
  d: Float64Array;
}

export function czeros(n: number): CMatrix {
  return { n, d: new Float64Array(2 * n * n) };
}

export function cidentity(n: number, scale = 1): CMatrix {
  const m = czeros(n);
  for (let i = 0; i < n; i++) m.d[2 * (i * n + i)] = scale;
  return m;
}

export function cget(m: CMatrix, i: number, j: number): { re: number; im: number } {
  const k = 2 * (i * m.n + j);
  return { re: m.d[k], im: m.d[k + 1] };
}

export function cset(m: CMatrix, i: number, j: number, re: number, im: number): void {
  const k = 2 * (i * m.n + j);
  m.d[k] = re;
  m.d[k + 1] = im;
}

/** a + s·b. */
export function caddScaled(a: CMatrix, b: CMatrix, s: number): CMatrix {
  const out = czeros(a.n);
  for (let k = 0; k < a.d.length; k++) out.d[k] = a.d[k] + s * b.d[k];
  return out;
}

/** a·b. */
export function cmatmul(a: CMatrix, b: CMatrix): CMatrix {
  const n = a.n;
  const out = czeros(n);
  for (let i = 0; i < n; i++)
    for (let t = 0; t < n; t++) {
      const ar = a.d[2 * (i * n + t)];
      const ai = a.d[2 * (i * n + t) + 1];
      if (ar === 0 && ai === 0) continue;
      for (let j = 0; j < n; j++) {
        const br = b.d[2 * (t * n + j)];
        const bi = b.d[2 * (t * n + j) + 1];
        out.d[2 * (i * n + j)] += ar * br - ai * bi;
        out.d[2 * (i * n + j) + 1] += ar * bi + ai * br;
      }
    }
  return out;
}

/** diag(l)·m·diag(r) for real diagonals l and r. */
export function cscaleRowsCols(m: CMatrix, l: ArrayLike<number>, r: ArrayLike<number>): CMatrix {
  const n = m.n;
  const out = czeros(n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      const k = 2 * (i * n + j);
      out.d[k] = l[i] * m.d[k] * r[j];
      out.d[k + 1] = l[i] * m.d[k + 1] * r[j];
    }
  return out;
}

/** Inverse by Gauss–Jordan elimination with partial pivoting; null when singular to working precision. */
export function cinvert(a: CMatrix): CMatrix | null {
  const n = a.n;
  const m = Float64Array.from(a.d);
  const inv = cidentity(n).d;
  let scale = 0;
  for (let k = 0; k < m.length; k += 2) scale = Math.max(scale, Math.hypot(m[k], m[k + 1]));
  const tiny = scale * n * 1e-14;
  const at = (r: number, c: number) => 2 * (r * n + c);
  for (let col = 0; col < n; col++) {
    let pivot = col;
    let best = Math.hypot(m[at(col, col)], m[at(col, col) + 1]);
    for (let r = col + 1; r < n; r++) {
      const v = Math.hypot(m[at(r, col)], m[at(r, col) + 1]);
      if (v > best) {
        best = v;
        pivot = r;
      }
    }
    if (!(best > tiny)) return null;
    if (pivot !== col) {
      for (let c = 0; c < 2 * n; c++) {
        const p = 2 * pivot * n + c;
        const q = 2 * col * n + c;
        [m[p], m[q]] = [m[q], m[p]];
        [inv[p], inv[q]] = [inv[q], inv[p]];
      }
    }
    // row col /= pivot value
    const pr = m[at(col, col)];
    const pi = m[at(col, col) + 1];
    const pd = pr * pr + pi * pi;
    const qr = pr / pd;
    const qi = -pi / pd;
    for (const arr of [m, inv]) {
      for (let c = 0; c < n; c++) {
        const k = at(col, c);
        const xr = arr[k];
        const xi = arr[k + 1];
        arr[k] = xr * qr - xi * qi;
        arr[k + 1] = xr * qi + xi * qr;
      }
    }
    for (let r = 0; r < n; r++) {
      if (r === col) continue;
      const fr = m[at(r, col)];
      const fi = m[at(r, col) + 1];
      if (fr === 0 && fi === 0) continue;
      for (const arr of [m, inv]) {
        for (let c = 0; c < n; c++) {
          const k = at(col, c);
          const t = at(r, c);
          arr[t] -= fr * arr[k] - fi * arr[k + 1];
          arr[t + 1] -= fr * arr[k + 1] + fi * arr[k];
        }
      }
    }
  }
  return { n, d: inv };
}

/**
 * Largest singular value of a complex matrix: the square root of the largest eigenvalue of the
 * Hermitian AᴴA, found by cyclic Jacobi rotations on its real symmetric 2n×2n embedding
 * [[Re, −Im], [Im, Re]] (every eigenvalue appears twice there). Golub & Van Loan, *Matrix
 * Computations*, 4th ed., §8.5 (Jacobi methods).
 */
export function largestSingularValue(a: CMatrix): number {
  const n = a.n;
  // H = AᴴA
  const h = czeros(n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      let re = 0;
      let im = 0;
      for (let k = 0; k < n; k++) {
        const xr = a.d[2 * (k * n + i)];
        const xi = -a.d[2 * (k * n + i) + 1];
        const yr = a.d[2 * (k * n + j)];
        const yi = a.d[2 * (k * n + j) + 1];
        re += xr * yr - xi * yi;
        im += xr * yi + xi * yr;
      }
      h.d[2 * (i * n + j)] = re;
      h.d[2 * (i * n + j) + 1] = im;
    }
  if (n === 1) return Math.sqrt(Math.max(0, h.d[0]));
  if (n === 2) {
    // closed form for a 2×2 Hermitian matrix [[p, q], [q̄, r]]
    const p = h.d[0];
    const r = h.d[6];
    const q = Math.hypot(h.d[2], h.d[3]);
    const top = (p + r) / 2 + Math.hypot((p - r) / 2, q);
    return Math.sqrt(Math.max(0, top));
  }
  const m = 2 * n;
  const s = new Float64Array(m * m);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      const re = h.d[2 * (i * n + j)];
      const im = h.d[2 * (i * n + j) + 1];
      s[i * m + j] = re;
      s[(i + n) * m + j + n] = re;
      s[i * m + j + n] = -im;
      s[(i + n) * m + j] = im;
    }
  return Math.sqrt(Math.max(0, largestSymmetricEigenvalue(s, m)));
}

/** Largest eigenvalue of a real symmetric m×m matrix (overwritten) by cyclic Jacobi sweeps. */
function largestSymmetricEigenvalue(s: Float64Array, m: number): number {
  for (let sweep = 0; sweep < 60; sweep++) {
    let off = 0;
    let diag = 0;
    for (let i = 0; i < m; i++) {
      diag += s[i * m + i] * s[i * m + i];
      for (let j = i + 1; j < m; j++) off += s[i * m + j] * s[i * m + j];
    }
    if (off <= 1e-30 * diag || off === 0) break;
    for (let p = 0; p < m; p++)
      for (let q = p + 1; q < m; q++) {
        const apq = s[p * m + q];
        if (apq === 0) continue;
        const theta = (s[q * m + q] - s[p * m + p]) / (2 * apq);
        const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const sn = t * c;
        for (let k = 0; k < m; k++) {
          const akp = s[k * m + p];
          const akq = s[k * m + q];
          s[k * m + p] = c * akp - sn * akq;
          s[k * m + q] = sn * akp + c * akq;
        }
        for (let k = 0; k < m; k++) {
          const apk = s[p * m + k];
          const aqk = s[q * m + k];
          s[p * m + k] = c * apk - sn * aqk;
          s[q * m + k] = sn * apk + c * aqk;
        }
      }
  }
  let best = -Infinity;
  for (let i = 0; i < m; i++) best = Math.max(best, s[i * m + i]);
  return best;
}
