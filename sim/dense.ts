// Small dense linear algebra for the lumped part of the network (a handful of unknowns per cluster).
// Row-major Float64Arrays; n×n matrices.

/** Inverse of an n×n matrix by Gauss–Jordan elimination with partial pivoting; null if singular. */
export function invert(a: Float64Array, n: number): Float64Array | null {
  const m = Float64Array.from(a);
  const inv = new Float64Array(n * n);
  for (let i = 0; i < n; i++) inv[i * n + i] = 1;
  let scale = 0;
  for (const x of a) scale = Math.max(scale, Math.abs(x));
  const tiny = scale * n * 1e-14;
  for (let col = 0; col < n; col++) {
    let pivot = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(m[r * n + col]) > Math.abs(m[pivot * n + col])) pivot = r;
    if (!(Math.abs(m[pivot * n + col]) > tiny)) return null;
    if (pivot !== col) {
      for (let c = 0; c < n; c++) {
        [m[col * n + c], m[pivot * n + c]] = [m[pivot * n + c], m[col * n + c]];
        [inv[col * n + c], inv[pivot * n + c]] = [inv[pivot * n + c], inv[col * n + c]];
      }
    }
    const d = m[col * n + col];
    for (let c = 0; c < n; c++) {
      m[col * n + c] /= d;
      inv[col * n + c] /= d;
    }
    for (let r = 0; r < n; r++) {
      if (r === col) continue;
      const f = m[r * n + col];
      if (f === 0) continue;
      for (let c = 0; c < n; c++) {
        m[r * n + c] -= f * m[col * n + c];
        inv[r * n + c] -= f * inv[col * n + c];
      }
    }
  }
  return inv;
}

/** C = A·B for A (n×k) and B (k×p). */
export function multiply(a: Float64Array, b: Float64Array, n: number, k: number, p: number): Float64Array {
  const c = new Float64Array(n * p);
  for (let i = 0; i < n; i++)
    for (let t = 0; t < k; t++) {
      const f = a[i * k + t];
      if (f === 0) continue;
      for (let j = 0; j < p; j++) c[i * p + j] += f * b[t * p + j];
    }
  return c;
}
