// Coaxial line: inner conductor diameter d, shield inner diameter D, homogeneous dielectric εr.
//   Z0 = (η0 / (2π√εr)) · ln(D/d) ≈ (60/√εr) · ln(D/d)
// (exact for the TEM mode; e.g. Pozar, *Microwave Engineering*, and Ulaby, *Fundamentals of
// Applied Electromagnetics*, coaxial line).

import { C0, ETA0 } from './constants.js';
import { rangeCheck, validity, type Validity } from './validity.js';

export interface CoaxGeometry {
  /** Inner conductor diameter d (m). */
  innerDiameter: number;
  /** Shield (outer conductor) inner diameter D (m). */
  shieldDiameter: number;
  /** Dielectric relative permittivity εr. */
  er: number;
}

export interface CoaxAnalysis {
  z0: number;
  epsEff: number;
  z0Air: number;
  /**
   * Cutoff of the TE11 mode, approximately c0 / (π√εr·(a + b)) with radii a, b
   * (k_c ≈ 2/(a + b); Pozar, coaxial line — from memory).
   */
  maxFrequency: number;
  validity: Validity;
}

function check(g: CoaxGeometry): void {
  if (!(g.innerDiameter > 0) || !(g.shieldDiameter > g.innerDiameter) || !(g.er >= 1) || !Number.isFinite(g.er)) {
    throw new RangeError(
      `coax: need 0 < innerDiameter < shieldDiameter and er ≥ 1 (got innerDiameter=${g.innerDiameter}, shieldDiameter=${g.shieldDiameter}, er=${g.er})`,
    );
  }
}

export function coaxZ0(innerDiameter: number, shieldDiameter: number, er: number): number {
  return (ETA0 / (2 * Math.PI * Math.sqrt(er))) * Math.log(shieldDiameter / innerDiameter);
}

export function analyzeCoax(g: CoaxGeometry): CoaxAnalysis {
  check(g);
  const z0Air = coaxZ0(g.innerDiameter, g.shieldDiameter, 1);
  const sum = (g.innerDiameter + g.shieldDiameter) / 2; // a + b
  return {
    z0: z0Air / Math.sqrt(g.er),
    epsEff: g.er,
    z0Air,
    maxFrequency: C0 / (Math.PI * Math.sqrt(g.er) * sum),
    // The formula is exact for any D/d > 1; nothing to bound but the TEM frequency range.
    validity: validity('coax', [rangeCheck('D/d', g.shieldDiameter / g.innerDiameter, 1, Infinity, 'exact TEM solution')]),
  };
}

/** Shield diameter for a target Z0: D = d·exp(2π√εr·Z0/η0). */
export function synthCoaxShield(z0: number, innerDiameter: number, er: number): number {
  if (!(z0 > 0)) throw new RangeError(`coax: target Z0 must be > 0 (got ${z0})`);
  return innerDiameter * Math.exp((2 * Math.PI * Math.sqrt(er) * z0) / ETA0);
}

/** Inner diameter for a target Z0 and a given shield: d = D·exp(−2π√εr·Z0/η0). */
export function synthCoaxInner(z0: number, shieldDiameter: number, er: number): number {
  if (!(z0 > 0)) throw new RangeError(`coax: target Z0 must be > 0 (got ${z0})`);
  return shieldDiameter * Math.exp((-2 * Math.PI * Math.sqrt(er) * z0) / ETA0);
}
