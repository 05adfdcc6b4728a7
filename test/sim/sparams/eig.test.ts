// Eigenvalues against matrices with known spectra.
import { describe, expect, it } from 'vitest';
import { eigenvalues } from '../../../sim/sparams/eig.js';

function sorted(ev: Float64Array): Array<[number, number]> {
  const out: Array<[number, number]> = [];
  for (let k = 0; k < ev.length; k += 2) out.push([ev[k], ev[k + 1]]);
  return out.sort((a, b) => Math.round(a[0] * 1e6) - Math.round(b[0] * 1e6) || a[1] - b[1]);
}

describe('eigenvalues', () => {
  it('finds the poles of the companion matrix of a polynomial with known roots', () => {
    // (s + 1)(s + 2)(s² + 2s + 5) = s⁴ + 5s³ + 13s² + 19s + 10: roots −1, −2, −1 ± 2j
    const c = Float64Array.of(-5, -13, -19, -10, 1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 0);
    const ev = sorted(eigenvalues(c, 4));
    const want: Array<[number, number]> = [[-2, 0], [-1, -2], [-1, 0], [-1, 2]];
    ev.forEach((v, k) => {
      expect(Math.abs(v[0] - want[k][0])).toBeLessThan(1e-12);
      expect(Math.abs(v[1] - want[k][1])).toBeLessThan(1e-12);
    });
  });

  it('recovers the spectrum of a similarity transform of a block-diagonal matrix (rotation blocks give a ± jb)', () => {
    // D = diag(3, [[−0.5, 7], [−7, −0.5]], −4, [[0.1, 2], [−2, 0.1]]) → 3, −0.5 ± 7j, −4, 0.1 ± 2j
    const n = 6;
    const d = new Float64Array(n * n);
    d[0] = 3;
    d[1 * n + 1] = -0.5; d[1 * n + 2] = 7; d[2 * n + 1] = -7; d[2 * n + 2] = -0.5;
    d[3 * n + 3] = -4;
    d[4 * n + 4] = 0.1; d[4 * n + 5] = 2; d[5 * n + 4] = -2; d[5 * n + 5] = 0.1;
    // T = I + a fixed dense perturbation, A = T·D·T⁻¹ computed by solving with T (T is unit lower + upper terms)
    const t = new Float64Array(n * n);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) t[i * n + j] = (i === j ? 2 : 0) + Math.sin(1 + 3 * i + 7 * j) * 0.4;
    const inv = invert(t, n);
    const a = mul(mul(t, d, n), inv, n);
    const ev = sorted(eigenvalues(a, n));
    const want: Array<[number, number]> = [[-4, 0], [-0.5, -7], [-0.5, 7], [0.1, -2], [0.1, 2], [3, 0]];
    ev.forEach((v, k) => {
      expect(Math.abs(v[0] - want[k][0])).toBeLessThan(1e-10);
      expect(Math.abs(v[1] - want[k][1])).toBeLessThan(1e-10);
    });
  });

  it('handles a 1×1 and a 2×2 with a double eigenvalue', () => {
    expect(Array.from(eigenvalues(Float64Array.of(-7), 1))).toEqual([-7, 0]);
    const ev = eigenvalues(Float64Array.of(2, 1, 0, 2), 2);
    for (let k = 0; k < 4; k += 2) {
      expect(ev[k]).toBeCloseTo(2, 7);
      expect(Math.abs(ev[k + 1])).toBeLessThan(1e-7);
    }
  });
});

function mul(a: Float64Array, b: Float64Array, n: number): Float64Array {
  const c = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let k = 0; k < n; k++) for (let j = 0; j < n; j++) c[i * n + j] += a[i * n + k] * b[k * n + j];
  return c;
}

function invert(a: Float64Array, n: number): Float64Array {
  const m = Float64Array.from(a);
  const inv = new Float64Array(n * n);
  for (let i = 0; i < n; i++) inv[i * n + i] = 1;
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(m[r * n + c]) > Math.abs(m[p * n + c])) p = r;
    for (let k = 0; k < n; k++) {
      [m[c * n + k], m[p * n + k]] = [m[p * n + k], m[c * n + k]];
      [inv[c * n + k], inv[p * n + k]] = [inv[p * n + k], inv[c * n + k]];
    }
    const d = m[c * n + c];
    for (let k = 0; k < n; k++) {
      m[c * n + k] /= d;
      inv[c * n + k] /= d;
    }
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const f = m[r * n + c];
      for (let k = 0; k < n; k++) {
        m[r * n + k] -= f * m[c * n + k];
        inv[r * n + k] -= f * inv[c * n + k];
      }
    }
  }
  return inv;
}
