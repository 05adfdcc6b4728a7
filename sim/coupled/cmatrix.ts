// Small dense complex matrices (k×k, row-major, real and imaginary parts in two Float64Arrays) for
// the frequency-domain description of coupled sections: products, a linear solve, and the
// eigen-decomposition of a general complex matrix through its Schur form (Hessenberg reduction by
// Householder reflections, then the shifted QR algorithm with Givens rotations; Golub & Van Loan,
// *Matrix Computations*, the unsymmetric eigenvalue problem). Not used in any time-domain loop.

export interface CMatrix {
  re: Float64Array;
  im: Float64Array;
}

export function czeros(n: number): CMatrix {
  return { re: new Float64Array(n), im: new Float64Array(n) };
}

export function cidentity(k: number): CMatrix {
  const m = czeros(k * k);
  for (let i = 0; i < k; i++) m.re[i * k + i] = 1;
  return m;
}

/** A·B for k×k matrices. */
export function cmatmul(a: CMatrix, b: CMatrix, k: number): CMatrix {
  const c = czeros(k * k);
  for (let i = 0; i < k; i++)
    for (let t = 0; t < k; t++) {
      const ar = a.re[i * k + t];
      const ai = a.im[i * k + t];
      if (ar === 0 && ai === 0) continue;
      for (let j = 0; j < k; j++) {
        const br = b.re[t * k + j];
        const bi = b.im[t * k + j];
        c.re[i * k + j] += ar * br - ai * bi;
        c.im[i * k + j] += ar * bi + ai * br;
      }
    }
  return c;
}

/** X = A⁻¹·B for a k×k A and a k×p B (Gaussian elimination with partial pivoting); throws if A is singular. */
export function csolve(a: CMatrix, b: CMatrix, k: number, p: number): CMatrix {
  const ar = Float64Array.from(a.re);
  const ai = Float64Array.from(a.im);
  const xr = Float64Array.from(b.re);
  const xi = Float64Array.from(b.im);
  let scale = 0;
  for (let e = 0; e < k * k; e++) scale = Math.max(scale, Math.hypot(ar[e], ai[e]));
  for (let col = 0; col < k; col++) {
    let piv = col;
    for (let r = col + 1; r < k; r++) if (Math.hypot(ar[r * k + col], ai[r * k + col]) > Math.hypot(ar[piv * k + col], ai[piv * k + col])) piv = r;
    const pr = ar[piv * k + col];
    const pi = ai[piv * k + col];
    const mag2 = pr * pr + pi * pi;
    if (!(Math.sqrt(mag2) > scale * k * 1e-15)) throw new RangeError('csolve: singular matrix');
    if (piv !== col) {
      for (const [m, w] of [[ar, k], [ai, k], [xr, p], [xi, p]] as const) {
        for (let c = 0; c < w; c++) {
          const t = m[col * w + c];
          m[col * w + c] = m[piv * w + c];
          m[piv * w + c] = t;
        }
      }
    }
    // row /= pivot, i.e. times conj(pivot)/|pivot|²
    const ir = pr / mag2;
    const ii = -pi / mag2;
    const scaleRow = (mr: Float64Array, mi: Float64Array, w: number) => {
      for (let c = 0; c < w; c++) {
        const x = mr[col * w + c];
        const y = mi[col * w + c];
        mr[col * w + c] = x * ir - y * ii;
        mi[col * w + c] = x * ii + y * ir;
      }
    };
    scaleRow(ar, ai, k);
    scaleRow(xr, xi, p);
    for (let r = 0; r < k; r++) {
      if (r === col) continue;
      const fr = ar[r * k + col];
      const fi = ai[r * k + col];
      if (fr === 0 && fi === 0) continue;
      const eliminate = (mr: Float64Array, mi: Float64Array, w: number) => {
        for (let c = 0; c < w; c++) {
          const x = mr[col * w + c];
          const y = mi[col * w + c];
          mr[r * w + c] -= fr * x - fi * y;
          mi[r * w + c] -= fr * y + fi * x;
        }
      };
      eliminate(ar, ai, k);
      eliminate(xr, xi, p);
    }
  }
  return { re: xr, im: xi };
}

/** Hessenberg form H = Qᴴ·A·Q by Householder reflections; A is overwritten by H, Q returned. */
function hessenberg(h: CMatrix, k: number): CMatrix {
  const q = cidentity(k);
  const vr = new Float64Array(k);
  const vi = new Float64Array(k);
  for (let col = 0; col < k - 2; col++) {
    let norm = 0;
    for (let r = col + 1; r < k; r++) norm += h.re[r * k + col] ** 2 + h.im[r * k + col] ** 2;
    norm = Math.sqrt(norm);
    if (norm === 0) continue;
    const x0r = h.re[(col + 1) * k + col];
    const x0i = h.im[(col + 1) * k + col];
    const x0 = Math.hypot(x0r, x0i);
    // α = −e^{i·arg x0}·‖x‖, v = x − α·e1, normalised
    const pr = x0 > 0 ? x0r / x0 : 1;
    const pi = x0 > 0 ? x0i / x0 : 0;
    vr.fill(0);
    vi.fill(0);
    for (let r = col + 1; r < k; r++) {
      vr[r] = h.re[r * k + col];
      vi[r] = h.im[r * k + col];
    }
    vr[col + 1] += pr * norm;
    vi[col + 1] += pi * norm;
    let vn = 0;
    for (let r = col + 1; r < k; r++) vn += vr[r] ** 2 + vi[r] ** 2;
    vn = Math.sqrt(vn);
    for (let r = col + 1; r < k; r++) {
      vr[r] /= vn;
      vi[r] /= vn;
    }
    reflectLeft(h, k, vr, vi, col + 1);
    reflectRight(h, k, vr, vi, col + 1);
    reflectRight(q, k, vr, vi, col + 1);
  }
  return q;
}

/** m ← (1 − 2vvᴴ)·m on rows from..k−1. */
function reflectLeft(m: CMatrix, k: number, vr: Float64Array, vi: Float64Array, from: number): void {
  for (let c = 0; c < k; c++) {
    let sr = 0;
    let si = 0; // s = vᴴ·m[:, c]
    for (let r = from; r < k; r++) {
      sr += vr[r] * m.re[r * k + c] + vi[r] * m.im[r * k + c];
      si += vr[r] * m.im[r * k + c] - vi[r] * m.re[r * k + c];
    }
    for (let r = from; r < k; r++) {
      m.re[r * k + c] -= 2 * (vr[r] * sr - vi[r] * si);
      m.im[r * k + c] -= 2 * (vr[r] * si + vi[r] * sr);
    }
  }
}

/** m ← m·(1 − 2vvᴴ) on columns from..k−1. */
function reflectRight(m: CMatrix, k: number, vr: Float64Array, vi: Float64Array, from: number): void {
  for (let r = 0; r < k; r++) {
    let sr = 0;
    let si = 0; // s = m[r, :]·v
    for (let c = from; c < k; c++) {
      sr += m.re[r * k + c] * vr[c] - m.im[r * k + c] * vi[c];
      si += m.re[r * k + c] * vi[c] + m.im[r * k + c] * vr[c];
    }
    for (let c = from; c < k; c++) {
      // subtract 2·s·conj(v_c)
      m.re[r * k + c] -= 2 * (sr * vr[c] + si * vi[c]);
      m.im[r * k + c] -= 2 * (si * vr[c] - sr * vi[c]);
    }
  }
}

/** Complex Schur form A = Q·T·Qᴴ (T upper triangular, eigenvalues on its diagonal). */
export function schur(a: CMatrix, k: number): { t: CMatrix; q: CMatrix } {
  const t: CMatrix = { re: Float64Array.from(a.re), im: Float64Array.from(a.im) };
  const q = hessenberg(t, k);
  let norm = 0;
  for (let e = 0; e < k * k; e++) norm = Math.max(norm, Math.hypot(t.re[e], t.im[e]));
  let hi = k - 1;
  let iterations = 0;
  while (hi > 0) {
    let lo = hi;
    while (lo > 0) {
      const sub = Math.hypot(t.re[lo * k + lo - 1], t.im[lo * k + lo - 1]);
      const diag = Math.hypot(t.re[lo * k + lo], t.im[lo * k + lo]) + Math.hypot(t.re[(lo - 1) * k + lo - 1], t.im[(lo - 1) * k + lo - 1]);
      if (sub <= 1e-16 * (diag || norm)) {
        t.re[lo * k + lo - 1] = 0;
        t.im[lo * k + lo - 1] = 0;
        break;
      }
      lo--;
    }
    if (lo === hi) {
      hi--;
      iterations = 0;
      continue;
    }
    if (++iterations > 200) throw new RangeError('schur: the QR algorithm did not converge');
    const [mr, mi] = iterations % 11 === 10 ? exceptionalShift(t, k, hi) : wilkinsonShift(t, k, hi);
    qrStep(t, q, k, lo, hi, mr, mi);
  }
  return { t, q };
}

/** The eigenvalue of the trailing 2×2 block closest to its last diagonal entry. */
function wilkinsonShift(t: CMatrix, k: number, hi: number): [number, number] {
  const a = [t.re[(hi - 1) * k + hi - 1], t.im[(hi - 1) * k + hi - 1]];
  const b = [t.re[(hi - 1) * k + hi], t.im[(hi - 1) * k + hi]];
  const c = [t.re[hi * k + hi - 1], t.im[hi * k + hi - 1]];
  const d = [t.re[hi * k + hi], t.im[hi * k + hi]];
  // λ = m ± √(h² + bc), m = (a + d)/2, h = (a − d)/2
  const mr = (a[0] + d[0]) / 2;
  const mi = (a[1] + d[1]) / 2;
  const hr = (a[0] - d[0]) / 2;
  const hi2 = (a[1] - d[1]) / 2;
  const dr = hr * hr - hi2 * hi2 + b[0] * c[0] - b[1] * c[1];
  const di = 2 * hr * hi2 + b[0] * c[1] + b[1] * c[0];
  const mag = Math.hypot(dr, di);
  let sr = Math.sqrt(Math.max(0, (mag + dr) / 2));
  let si = Math.sqrt(Math.max(0, (mag - dr) / 2)) * (di < 0 ? -1 : 1);
  const l1 = [mr + sr, mi + si];
  const l2 = [mr - sr, mi - si];
  const dist = (l: number[]) => Math.hypot(l[0] - d[0], l[1] - d[1]);
  [sr, si] = dist(l1) <= dist(l2) ? l1 : l2;
  return [sr, si];
}

function exceptionalShift(t: CMatrix, k: number, hi: number): [number, number] {
  const s = Math.hypot(t.re[hi * k + hi - 1], t.im[hi * k + hi - 1]);
  return [t.re[hi * k + hi] + 0.75 * s, t.im[hi * k + hi] + 0.4375 * s];
}

/** One explicitly shifted QR step on the active block lo..hi, applied to the whole matrix and to Q. */
function qrStep(t: CMatrix, q: CMatrix, k: number, lo: number, hi: number, mr: number, mi: number): void {
  for (let i = lo; i <= hi; i++) {
    t.re[i * k + i] -= mr;
    t.im[i * k + i] -= mi;
  }
  const rot: number[][] = [];
  for (let i = lo; i < hi; i++) {
    const ar = t.re[i * k + i];
    const ai = t.im[i * k + i];
    const br = t.re[(i + 1) * k + i];
    const bi = t.im[(i + 1) * k + i];
    const na = Math.hypot(ar, ai);
    const r = Math.hypot(na, Math.hypot(br, bi));
    let c: number;
    let sr: number;
    let si: number;
    if (r === 0) {
      c = 1;
      sr = 0;
      si = 0;
    } else if (na === 0) {
      c = 0;
      sr = br / r;
      si = -bi / r;
    } else {
      // c = |a|/r, s = (a/|a|)·conj(b)/r
      c = na / r;
      const ur = ar / na;
      const ui = ai / na;
      sr = (ur * br + ui * bi) / r;
      si = (ui * br - ur * bi) / r;
    }
    rot.push([c, sr, si]);
    // rows i, i+1 ← [c, s; −conj(s), c]·rows, columns i..k−1
    for (let col = i; col < k; col++) {
      const xr = t.re[i * k + col];
      const xi = t.im[i * k + col];
      const yr = t.re[(i + 1) * k + col];
      const yi = t.im[(i + 1) * k + col];
      t.re[i * k + col] = c * xr + sr * yr - si * yi;
      t.im[i * k + col] = c * xi + sr * yi + si * yr;
      t.re[(i + 1) * k + col] = -(sr * xr + si * xi) + c * yr;
      t.im[(i + 1) * k + col] = -(sr * xi - si * xr) + c * yi;
    }
  }
  rot.forEach(([c, sr, si], n) => {
    const i = lo + n;
    // columns i, i+1 ← columns·[c, −s; conj(s), c]
    const right = (m: CMatrix, rows: number) => {
      for (let r = 0; r < rows; r++) {
        const xr = m.re[r * k + i];
        const xi = m.im[r * k + i];
        const yr = m.re[r * k + i + 1];
        const yi = m.im[r * k + i + 1];
        m.re[r * k + i] = c * xr + sr * yr + si * yi;
        m.im[r * k + i] = c * xi + sr * yi - si * yr;
        m.re[r * k + i + 1] = -(sr * xr - si * xi) + c * yr;
        m.im[r * k + i + 1] = -(sr * xi + si * xr) + c * yi;
      }
    };
    right(t, Math.min(i + 2, hi) + 1);
    right(q, k);
  });
  for (let i = lo; i <= hi; i++) {
    t.re[i * k + i] += mr;
    t.im[i * k + i] += mi;
  }
}

/**
 * Eigenvalues and eigenvectors (columns, unit length) of a diagonalisable complex matrix, from its
 * Schur form by back-substitution. Equal eigenvalues whose Schur coupling vanishes (a degenerate
 * eigenspace, as in a homogeneous medium where all modes travel alike) get independent vectors.
 */
export function ceig(a: CMatrix, k: number): { values: CMatrix; vectors: CMatrix } {
  const { t, q } = schur(a, k);
  let norm = 0;
  for (let e = 0; e < k * k; e++) norm = Math.max(norm, Math.hypot(t.re[e], t.im[e]));
  const small = 1e-10 * norm;
  const x = czeros(k * k); // eigenvectors of T, columns
  for (let j = 0; j < k; j++) {
    const lr = t.re[j * k + j];
    const li = t.im[j * k + j];
    x.re[j * k + j] = 1;
    for (let i = j - 1; i >= 0; i--) {
      let sr = 0;
      let si = 0;
      for (let p = i + 1; p <= j; p++) {
        sr += t.re[i * k + p] * x.re[p * k + j] - t.im[i * k + p] * x.im[p * k + j];
        si += t.re[i * k + p] * x.im[p * k + j] + t.im[i * k + p] * x.re[p * k + j];
      }
      let dr = t.re[i * k + i] - lr;
      let di = t.im[i * k + i] - li;
      if (Math.hypot(dr, di) <= small) {
        if (Math.hypot(sr, si) <= small) continue; // degenerate eigenspace: this component stays 0
        dr = small; // nearly defective: perturb (LAPACK's xTREVC does the same)
        di = 0;
      }
      const m2 = dr * dr + di * di;
      x.re[i * k + j] = -(sr * dr + si * di) / m2;
      x.im[i * k + j] = -(si * dr - sr * di) / m2;
    }
  }
  const vectors = cmatmul(q, x, k);
  for (let j = 0; j < k; j++) {
    let n = 0;
    for (let i = 0; i < k; i++) n += vectors.re[i * k + j] ** 2 + vectors.im[i * k + j] ** 2;
    n = Math.sqrt(n);
    for (let i = 0; i < k; i++) {
      vectors.re[i * k + j] /= n;
      vectors.im[i * k + j] /= n;
    }
  }
  const values = czeros(k);
  for (let j = 0; j < k; j++) {
    values.re[j] = t.re[j * k + j];
    values.im[j] = t.im[j * k + j];
  }
  return { values, vectors };
}
