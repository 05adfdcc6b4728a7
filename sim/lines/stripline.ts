// Symmetric stripline: a strip of width W and thickness t centred between two ground planes
// spaced b apart, in a homogeneous dielectric εr.
//
// Zero-thickness impedance, exact (conformal mapping): S. B. Cohn, "Characteristic impedance of
// the shielded-strip transmission line", IRE Trans. MTT 2(2), 1954, pp. 52–57:
//   Z0 = (η0 / (4√εr)) · K(k)/K(k'),  k = sech(πW/2b),  k' = tanh(πW/2b)
// (η0/4 = 30π Ω with η0 ≈ 120π), K the complete elliptic integral of the first kind (by AGM).
//
// Finite thickness: H. A. Wheeler, "Transmission-line properties of a strip line between parallel
// planes", IEEE Trans. MTT 26(11), 1978, pp. 866–876. We apply Wheeler's formula as a ratio:
//   Z0(W, b, t) = Z0_Cohn(W, b) · Z0_Wheeler(W, b, t) / Z0_Wheeler(W, b, 0),
// so the result is Cohn's exact value at t = 0 and follows Wheeler's thickness dependence
// (Wheeler states about 0.5 % accuracy for W'/(b − t) < 10 — from memory).
// Wheeler's closed form is also exported on its own, for comparison.

import { C0, ETA0 } from './constants.js';
import { ellipticKRatio } from './elliptic.js';
import { solveDecreasing } from './lsq.js';
import { rangeCheck, validity, type Validity } from './validity.js';

export interface StriplineGeometry {
  /** Strip width W (m). */
  width: number;
  /** Ground-plane spacing b (m). */
  planeSpacing: number;
  /** Strip thickness t (m); 0 for an ideal thin strip. */
  thickness?: number;
  /** Dielectric relative permittivity εr. */
  er: number;
}

export interface StriplineAnalysis {
  /** Characteristic impedance (ohm): Cohn, with Wheeler's thickness ratio. */
  z0: number;
  /** ε_eff = εr (homogeneous dielectric). */
  epsEff: number;
  /** Air-filled impedance (ohm): L' = z0Air/c0. */
  z0Air: number;
  /** Cohn's exact zero-thickness impedance (ohm). */
  z0Cohn: number;
  /** Wheeler's 1978 closed form at the given thickness (ohm), for comparison. */
  z0Wheeler: number;
  /**
   * Cutoff of the first higher-order (parallel-plate TE) mode, c0 / (2√εr·(W + πb/4))
   * (from memory, as given in Pozar, *Microwave Engineering*, stripline section).
   */
  maxFrequency: number;
  validity: Validity;
}

/** Cohn's exact zero-thickness stripline impedance (ohm). */
export function striplineZ0Cohn(width: number, planeSpacing: number, er: number): number {
  const x = (Math.PI * width) / (2 * planeSpacing);
  const k = 1 / Math.cosh(x); // sech, underflows to 0 for very wide strips (Z0 → 0)
  const kp = Math.tanh(x);
  return (ETA0 / (4 * Math.sqrt(er))) * ellipticKRatio(k, kp);
}

/**
 * Wheeler's 1978 closed form for a strip of thickness t (ohm):
 *   Z0 = (30/√εr)·ln{1 + A·[2A + √(4A² + 6.27)]},  A = 4(b − t)/(πW'),
 *   W' = W + ΔW,  ΔW = (t/π)·{1 − ½·ln[(t/(2b − t))² + (0.0796·t/(W + 1.1t))^m]},
 *   m = 6(b − t)/(3b − t).
 * (The "30" is η0/(4π) rounded; we use η0/(4π) so that it matches Cohn's form at the same η0.)
 */
export function striplineZ0Wheeler(width: number, planeSpacing: number, thickness: number, er: number): number {
  const b = planeSpacing;
  const t = thickness;
  let dW = 0;
  if (t > 0) {
    const m = (6 * (b - t)) / (3 * b - t);
    dW = (t / Math.PI) * (1 - 0.5 * Math.log((t / (2 * b - t)) ** 2 + Math.pow((0.0796 * t) / (width + 1.1 * t), m)));
  }
  const A = (4 * (b - t)) / (Math.PI * (width + dW));
  return (ETA0 / (4 * Math.PI * Math.sqrt(er))) * Math.log(1 + A * (2 * A + Math.sqrt(4 * A * A + 6.27)));
}

function checkGeometry(g: StriplineGeometry): void {
  const t = g.thickness ?? 0;
  if (!(g.width > 0) || !(g.planeSpacing > 0) || !(t >= 0) || !(t < g.planeSpacing) || !(g.er >= 1) || !Number.isFinite(g.er)) {
    throw new RangeError(
      `stripline: need width > 0, planeSpacing > thickness ≥ 0, er ≥ 1 (got width=${g.width}, planeSpacing=${g.planeSpacing}, thickness=${t}, er=${g.er})`,
    );
  }
}

/** Air-filled impedance with thickness (ohm). */
export function striplineZ0Air(width: number, planeSpacing: number, thickness: number): number {
  const cohn = striplineZ0Cohn(width, planeSpacing, 1);
  if (!(thickness > 0)) return cohn;
  return (cohn * striplineZ0Wheeler(width, planeSpacing, thickness, 1)) / striplineZ0Wheeler(width, planeSpacing, 0, 1);
}

export function striplineValidity(g: StriplineGeometry): Validity {
  const t = g.thickness ?? 0;
  const b = g.planeSpacing;
  const m = t > 0 ? (6 * (b - t)) / (3 * b - t) : 1;
  const dW = t > 0 ? (t / Math.PI) * (1 - 0.5 * Math.log((t / (2 * b - t)) ** 2 + Math.pow((0.0796 * t) / (g.width + 1.1 * t), m))) : 0;
  return validity('stripline', [
    // Wheeler's stated accuracy for this range is recalled, not confirmed (from memory; see the file
    // header); the message a user sees names the paper only.
    rangeCheck("W'/(b − t)", (g.width + dW) / (b - t), 0, 10, 'Wheeler 1978: about 0.5 %'),
    // No range for t/b: the t/b ≤ 0.25 once used here had no source we could confirm.
  ]);
}

export function analyzeStripline(g: StriplineGeometry): StriplineAnalysis {
  checkGeometry(g);
  const t = g.thickness ?? 0;
  const z0Air = striplineZ0Air(g.width, g.planeSpacing, t);
  const sq = Math.sqrt(g.er);
  return {
    z0: z0Air / sq,
    epsEff: g.er,
    z0Air,
    z0Cohn: striplineZ0Cohn(g.width, g.planeSpacing, g.er),
    z0Wheeler: striplineZ0Wheeler(g.width, g.planeSpacing, t, g.er),
    maxFrequency: C0 / (2 * sq * (g.width + (Math.PI * g.planeSpacing) / 4)),
    validity: striplineValidity(g),
  };
}

/** Width for a target Z0, by bisection on ln(W/b) of the analysis (Cohn + Wheeler ratio). */
export function synthStriplineWidth(
  z0: number,
  g: Omit<StriplineGeometry, 'width'>,
): { width: number; analysis: StriplineAnalysis } {
  checkGeometry({ ...g, width: g.planeSpacing });
  const z0At = (lnW: number) => analyzeStripline({ ...g, width: Math.exp(lnW) * g.planeSpacing }).z0;
  const lnW = solveDecreasing(z0, z0At, Math.log(1e-4), Math.log(100), 'stripline');
  const width = Math.exp(lnW) * g.planeSpacing;
  return { width, analysis: analyzeStripline({ ...g, width }) };
}
