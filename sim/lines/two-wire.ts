// Two parallel round wires of diameter d, centre spacing s, in a homogeneous dielectric εr:
//   Z0 = (η0 / (π√εr)) · acosh(s/d) ≈ (120/√εr) · acosh(s/d)
// (exact TEM solution including proximity, e.g. Ramo, Whinnery & Van Duzer, *Fields and Waves in
// Communication Electronics*; for s ≫ d it tends to (120/√εr)·ln(2s/d)).
// A real twin-lead or twisted pair has its field partly in air: pass an effective εr for that.

import { ETA0 } from './constants.js';
import { rangeCheck, validity, type Validity } from './validity.js';

export interface TwoWireGeometry {
  /** Wire diameter d (m). */
  diameter: number;
  /** Centre-to-centre spacing s (m), s > d. */
  spacing: number;
  /** Relative permittivity of the (assumed homogeneous) surrounding medium. */
  er: number;
}

export interface TwoWireAnalysis {
  z0: number;
  epsEff: number;
  z0Air: number;
  validity: Validity;
}

function check(g: TwoWireGeometry): void {
  if (!(g.diameter > 0) || !(g.spacing > g.diameter) || !(g.er >= 1) || !Number.isFinite(g.er)) {
    throw new RangeError(
      `twoWire: need 0 < diameter < spacing and er ≥ 1 (got diameter=${g.diameter}, spacing=${g.spacing}, er=${g.er})`,
    );
  }
}

export function twoWireZ0(diameter: number, spacing: number, er: number): number {
  return (ETA0 / (Math.PI * Math.sqrt(er))) * Math.acosh(spacing / diameter);
}

export function analyzeTwoWire(g: TwoWireGeometry): TwoWireAnalysis {
  check(g);
  const z0Air = twoWireZ0(g.diameter, g.spacing, 1);
  return {
    z0: z0Air / Math.sqrt(g.er),
    epsEff: g.er,
    z0Air,
    validity: validity('twoWire', [rangeCheck('s/d', g.spacing / g.diameter, 1, Infinity, 'exact TEM solution (wires must not touch)')]),
  };
}

/** Centre spacing for a target Z0: s = d·cosh(π√εr·Z0/η0). */
export function synthTwoWireSpacing(z0: number, diameter: number, er: number): number {
  if (!(z0 > 0)) throw new RangeError(`twoWire: target Z0 must be > 0 (got ${z0})`);
  return diameter * Math.cosh((Math.PI * Math.sqrt(er) * z0) / ETA0);
}
