// A coupled section in the frequency domain, for the spectral cross-check: Z′(s) = R + s·L and
// Y′(s) = G + s·C (k×k, Maxwell C and G), and the section's 2k-port admittance by modal decomposition
// (C. R. Paul, *Analysis of Multiconductor Transmission Lines*, frequency-domain solution of the MTL
// equations). With d²V/dz² = Z′Y′·V and Z′Y′ = T·diag(γ_m²)·T⁻¹ (T the voltage modes):
//   V(z) = T·(e^{−γz}·a + e^{γz}·b),   I(z) = Z′⁻¹·T·γ·(e^{−γz}·a − e^{γz}·b)
// and eliminating a, b between the two ends, with the currents I1 = I(0) into the near ports and
// I2 = −I(ℓ) into the far ports:
//   [I1; I2] = [[Y_s, Y_m], [Y_m, Y_s]]·[V1; V2],
//   Y_s = Z′⁻¹·T·diag(γ·coth γℓ)·T⁻¹,   Y_m = −Z′⁻¹·T·diag(γ·csch γℓ)·T⁻¹.
// γ·coth γℓ and γ·csch γℓ are even in γ, so the branch of the square root does not matter, and they
// tend to 1/ℓ as γ → 0. A single line (k = 1) gives the familiar y11 = coth(γℓ)/Z0, y12 = −csch(γℓ)/Z0.
// Ports are ordered near 0…k−1, then far 0…k−1. s must not be 0 for a section with R = 0 (a lossless
// section is a short at DC: the nodal solver joins its ends instead).
import type { Complex } from '../lines/complex.js';
import { ceig, cidentity, cmatmul, csolve, czeros, type CMatrix } from './cmatrix.js';
import type { CoupledLine } from './line.js';

export type { CMatrix } from './cmatrix.js';

/** Z′(s) = R + s·L and Y′(s) = G + s·C at the complex frequency s (rad/s). */
export function coupledPerLength(line: CoupledLine, s: Complex): { z: CMatrix; y: CMatrix } {
  const n = line.k * line.k;
  const z = czeros(n);
  const y = czeros(n);
  for (let e = 0; e < n; e++) {
    z.re[e] = (line.r?.[e] ?? 0) + s.re * line.l[e];
    z.im[e] = s.im * line.l[e];
    y.re[e] = (line.g?.[e] ?? 0) + s.re * line.c[e];
    y.im[e] = s.im * line.c[e];
  }
  return { z, y };
}

/** [γ·coth(γℓ), γ·csch(γℓ)] for γ² given, computed without overflow (Re γ ≥ 0: e^{−2γℓ} is bounded). */
function modalFunctions(g2r: number, g2i: number, length: number): [number, number, number, number] {
  const mag = Math.hypot(g2r, g2i);
  if (mag * length * length < 1e-12) {
    // series to second order: γcoth γℓ ≈ (1 + (γℓ)²/3)/ℓ, γcsch γℓ ≈ (1 − (γℓ)²/6)/ℓ
    const u = g2r * length * length;
    const w = g2i * length * length;
    return [(1 + u / 3) / length, w / 3 / length, (1 - u / 6) / length, -w / 6 / length];
  }
  const gr = Math.sqrt(Math.max(0, (mag + g2r) / 2)); // the root with Re γ ≥ 0
  const gi = Math.sqrt(Math.max(0, (mag - g2r) / 2)) * (g2i < 0 ? -1 : 1);
  // e = e^{−γℓ}, e2 = e²; coth = (1 + e2)/(1 − e2), csch = 2e/(1 − e2)
  const ea = Math.exp(-gr * length);
  const er = ea * Math.cos(-gi * length);
  const ei = ea * Math.sin(-gi * length);
  const e2r = er * er - ei * ei;
  const e2i = 2 * er * ei;
  const dr = 1 - e2r;
  const di = -e2i;
  const d2 = dr * dr + di * di;
  const div = (nr: number, ni: number): [number, number] => [(nr * dr + ni * di) / d2, (ni * dr - nr * di) / d2];
  const [cr, ci] = div(1 + e2r, e2i);
  const [sr, si] = div(2 * er, 2 * ei);
  return [gr * cr - gi * ci, gr * ci + gi * cr, gr * sr - gi * si, gr * si + gi * sr];
}

/** The 2k-port admittance (2k×2k, near ports first) of a section of length ℓ with per-unit-length Z′ and Y′ (k×k). */
export function coupledAdmittance(z: CMatrix, y: CMatrix, k: number, length: number): CMatrix {
  const zy = cmatmul(z, y, k);
  const { values, vectors: t } = ceig(zy, k);
  const tInv = csolve(t, cidentity(k), k, k);
  const self = czeros(k * k); // T·diag(γ coth γℓ)
  const mutual = czeros(k * k); // T·diag(γ csch γℓ)
  for (let m = 0; m < k; m++) {
    const [cr, ci, sr, si] = modalFunctions(values.re[m], values.im[m], length);
    for (let i = 0; i < k; i++) {
      const tr = t.re[i * k + m];
      const ti = t.im[i * k + m];
      self.re[i * k + m] = tr * cr - ti * ci;
      self.im[i * k + m] = tr * ci + ti * cr;
      mutual.re[i * k + m] = tr * sr - ti * si;
      mutual.im[i * k + m] = tr * si + ti * sr;
    }
  }
  const ys = csolve(z, cmatmul(self, tInv, k), k, k);
  const ym = csolve(z, cmatmul(mutual, tInv, k), k, k);
  const n = 2 * k;
  const out = czeros(n * n);
  for (let i = 0; i < k; i++)
    for (let j = 0; j < k; j++) {
      const e = i * k + j;
      for (const [r, c, sign, src] of [
        [i, j, 1, ys],
        [i + k, j + k, 1, ys],
        [i, j + k, -1, ym],
        [i + k, j, -1, ym],
      ] as const) {
        out.re[r * n + c] = sign * src.re[e];
        out.im[r * n + c] = sign * src.im[e];
      }
    }
  return out;
}
