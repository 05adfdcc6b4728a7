// Eigenvalues of a small real square matrix (the pole relocation of vector fitting): Householder
// reduction to upper Hessenberg form, then the shifted QR algorithm in complex arithmetic with
// Wilkinson shifts and Givens rotations, deflating from the bottom (Golub & Van Loan, Matrix
// Computations, 4th ed., §7.4–7.5; complex single-shift form, so complex pairs need no special case).

/** Eigenvalues of the real n×n matrix `a` (row-major), re/im interleaved, in no particular order. */
export function eigenvalues(a: Float64Array, n: number): Float64Array {
  const hr = Float64Array.from(a);
  const hi = new Float64Array(n * n);
  toHessenberg(hr, n);
  const out = new Float64Array(2 * n);
  let e = n - 1;
  let its = 0;
  let total = 0;
  while (e >= 0) {
    if (e === 0) {
      out[0] = hr[0];
      out[1] = hi[0];
      break;
    }
    let l = e;
    while (l > 0) {
      const sub = Math.hypot(hr[l * n + l - 1], hi[l * n + l - 1]);
      const diag = Math.hypot(hr[(l - 1) * n + l - 1], hi[(l - 1) * n + l - 1]) + Math.hypot(hr[l * n + l], hi[l * n + l]);
      if (sub <= 1e-15 * (diag || 1)) {
        hr[l * n + l - 1] = 0;
        hi[l * n + l - 1] = 0;
        break;
      }
      l--;
    }
    if (l === e) {
      out[2 * e] = hr[e * n + e];
      out[2 * e + 1] = hi[e * n + e];
      e--;
      its = 0;
      continue;
    }
    if (++total > 100 * n) throw new Error('eigenvalues: the QR iteration did not converge');
    const [mr, mi] = its > 0 && its % 10 === 0 ? exceptionalShift(hr, hi, n, e) : wilkinsonShift(hr, hi, n, e);
    qrStep(hr, hi, n, l, e, mr, mi);
    its++;
  }
  return out;
}

/** In-place Householder reduction of a real matrix to upper Hessenberg form (similar, same eigenvalues). */
function toHessenberg(a: Float64Array, n: number): void {
  const v = new Float64Array(n);
  for (let k = 0; k < n - 2; k++) {
    let norm = 0;
    for (let i = k + 1; i < n; i++) norm += a[i * n + k] * a[i * n + k];
    norm = Math.sqrt(norm);
    if (norm === 0) continue;
    const alpha = a[(k + 1) * n + k] > 0 ? -norm : norm;
    let vv = 0;
    for (let i = k + 1; i < n; i++) {
      v[i] = a[i * n + k] - (i === k + 1 ? alpha : 0);
      vv += v[i] * v[i];
    }
    if (vv === 0) continue;
    // A ← (I − 2vvᵀ/vᵀv)·A·(I − 2vvᵀ/vᵀv)
    for (let j = 0; j < n; j++) {
      let d = 0;
      for (let i = k + 1; i < n; i++) d += v[i] * a[i * n + j];
      const f = (2 * d) / vv;
      for (let i = k + 1; i < n; i++) a[i * n + j] -= f * v[i];
    }
    for (let i = 0; i < n; i++) {
      let d = 0;
      for (let j = k + 1; j < n; j++) d += a[i * n + j] * v[j];
      const f = (2 * d) / vv;
      for (let j = k + 1; j < n; j++) a[i * n + j] -= f * v[j];
    }
    for (let i = k + 2; i < n; i++) a[i * n + k] = 0;
  }
}

/** The eigenvalue of the trailing 2×2 block of rows/columns e−1, e closest to its last diagonal entry. */
function wilkinsonShift(hr: Float64Array, hi: Float64Array, n: number, e: number): [number, number] {
  const ar = hr[(e - 1) * n + e - 1], ai = hi[(e - 1) * n + e - 1];
  const br = hr[(e - 1) * n + e], bi = hi[(e - 1) * n + e];
  const cr = hr[e * n + e - 1], ci = hi[e * n + e - 1];
  const dr = hr[e * n + e], di = hi[e * n + e];
  // μ = (a + d)/2 ± √(((a − d)/2)² + bc)
  const pr = (ar - dr) / 2, pi = (ai - di) / 2;
  const qr = pr * pr - pi * pi + (br * cr - bi * ci);
  const qi = 2 * pr * pi + (br * ci + bi * cr);
  const m = Math.hypot(qr, qi);
  let sr = Math.sqrt((m + qr) / 2);
  let si = qi >= 0 ? Math.sqrt(Math.max(0, (m - qr) / 2)) : -Math.sqrt(Math.max(0, (m - qr) / 2));
  const hr0 = (ar + dr) / 2, hi0 = (ai + di) / 2;
  // pick the root closer to d
  const d1 = Math.hypot(hr0 + sr - dr, hi0 + si - di);
  const d2 = Math.hypot(hr0 - sr - dr, hi0 - si - di);
  if (d2 < d1) {
    sr = -sr;
    si = -si;
  }
  return [hr0 + sr, hi0 + si];
}

/** An ad-hoc shift that breaks cycles of the plain shift (every tenth iteration without deflation). */
function exceptionalShift(hr: Float64Array, hi: Float64Array, n: number, e: number): [number, number] {
  const s = Math.hypot(hr[e * n + e - 1], hi[e * n + e - 1]) + (e > 1 ? Math.hypot(hr[(e - 1) * n + e - 2], hi[(e - 1) * n + e - 2]) : 0);
  return [hr[e * n + e] + 0.75 * s, hi[e * n + e] + 0.4375 * s];
}

/** One shifted QR step on rows/columns l…e: H − μI = QR, H ← RQ + μI, by Givens rotations. */
function qrStep(hr: Float64Array, hi: Float64Array, n: number, l: number, e: number, mr: number, mi: number): void {
  for (let k = l; k <= e; k++) {
    hr[k * n + k] -= mr;
    hi[k * n + k] -= mi;
  }
  const m = e - l;
  const cs = new Float64Array(m);
  const snr = new Float64Array(m);
  const sni = new Float64Array(m);
  for (let t = 0; t < m; t++) {
    const k = l + t;
    const xr = hr[k * n + k], xi = hi[k * n + k];
    const yr = hr[(k + 1) * n + k], yi = hi[(k + 1) * n + k];
    const ax = Math.hypot(xr, xi);
    const r = Math.hypot(ax, Math.hypot(yr, yi));
    let c: number, sr: number, si: number;
    if (r === 0) {
      c = 1;
      sr = 0;
      si = 0;
    } else if (ax === 0) {
      c = 0;
      sr = 1;
      si = 0;
    } else {
      // G = [[c, s], [−s̄, c]] with c = |x|/r, s = (x/|x|)·ȳ/r, so that G·[x; y] = [·; 0]
      c = ax / r;
      const ur = xr / ax, ui = xi / ax;
      sr = (ur * yr + ui * yi) / r;
      si = (ui * yr - ur * yi) / r;
    }
    cs[t] = c;
    snr[t] = sr;
    sni[t] = si;
    for (let j = k; j <= e; j++) {
      const pr = hr[k * n + j], pi = hi[k * n + j];
      const qr = hr[(k + 1) * n + j], qi = hi[(k + 1) * n + j];
      // row k: c·p + s·q;  row k+1: −s̄·p + c·q
      hr[k * n + j] = c * pr + (sr * qr - si * qi);
      hi[k * n + j] = c * pi + (sr * qi + si * qr);
      hr[(k + 1) * n + j] = -(sr * pr + si * pi) + c * qr;
      hi[(k + 1) * n + j] = -(sr * pi - si * pr) + c * qi;
    }
  }
  for (let t = 0; t < m; t++) {
    const k = l + t;
    const c = cs[t], sr = snr[t], si = sni[t];
    const top = Math.min(e, k + 1);
    for (let i = l; i <= top; i++) {
      const pr = hr[i * n + k], pi = hi[i * n + k];
      const qr = hr[i * n + k + 1], qi = hi[i * n + k + 1];
      // column k: p·c + q·s̄;  column k+1: −p·s + q·c
      hr[i * n + k] = pr * c + (qr * sr + qi * si);
      hi[i * n + k] = pi * c + (qi * sr - qr * si);
      hr[i * n + k + 1] = -(pr * sr - pi * si) + qr * c;
      hi[i * n + k + 1] = -(pr * si + pi * sr) + qi * c;
    }
  }
  for (let k = l; k <= e; k++) {
    hr[k * n + k] += mr;
    hi[k * n + k] += mi;
  }
}
