// Microstrip: a strip of width W and thickness t on a substrate of height h and permittivity εr
// over a ground plane, open above.
//
// Quasi-static Z0 and ε_eff: E. Hammerstad and Ø. Jensen, "Accurate models for microstrip
// computer-aided design", IEEE MTT-S International Microwave Symposium Digest, 1980, pp. 407–409,
// including their conductor-thickness correction (an effective-width correction Δu).
// Dispersion of ε_eff: M. Kirschning and R. H. Jansen, "Accurate model for effective dielectric
// constant of microstrip with validity up to millimetre-wave frequencies", Electronics Letters
// 18(6), 1982, pp. 272–273.

import { C0, ETA0 } from './constants.js';
import { solveDecreasing } from './lsq.js';
import { rangeCheck, validity, type Validity } from './validity.js';

export interface MicrostripGeometry {
  /** Strip width W (m). */
  width: number;
  /** Substrate height h: ground-plane top to strip bottom (m). */
  height: number;
  /** Strip thickness t (m); 0 for an ideal thin strip. */
  thickness?: number;
  /** Substrate relative permittivity εr (at the frequency the geometry is evaluated for). */
  er: number;
}

export interface MicrostripAnalysis {
  /** Quasi-static characteristic impedance (ohm). */
  z0: number;
  /** Quasi-static effective relative permittivity. */
  epsEff: number;
  /** Impedance of the same strip with the substrate replaced by air (ohm): fixes L' = z0Air/c0. */
  z0Air: number;
  /** Filling factor q = (ε_eff − 1)/(εr − 1) (1 when εr = 1). */
  fillingFactor: number;
  /** W/h. */
  u: number;
  /** Thickness-corrected normalised widths: u1 (air), ur (dielectric). */
  u1: number;
  ur: number;
  /**
   * Frequency above which the quasi-TEM picture fails: cutoff of the lowest TE surface wave of the
   * grounded slab, c0 / (4h√(εr − 1)) (from memory, as given in Pozar, *Microwave Engineering*).
   */
  maxFrequency: number;
  validity: Validity;
}

/** Air-filled, zero-thickness impedance Z01(u), Hammerstad–Jensen 1980 (ohm). */
export function hjZ01(u: number): number {
  const f = 6 + (2 * Math.PI - 6) * Math.exp(-Math.pow(30.666 / u, 0.7528));
  return (ETA0 / (2 * Math.PI)) * Math.log(f / u + Math.sqrt(1 + 4 / (u * u)));
}

/** Zero-thickness effective permittivity ε_eff(u, εr), Hammerstad–Jensen 1980. */
export function hjEpsEff(u: number, er: number): number {
  const u2 = u * u;
  const u4 = u2 * u2;
  const a =
    1 +
    Math.log((u4 + u2 / 2704) / (u4 + 0.432)) / 49 + // (u/52)² = u²/2704
    Math.log(1 + Math.pow(u / 18.1, 3)) / 18.7;
  const b = 0.564 * Math.pow((er - 0.9) / (er + 3), 0.053);
  return (er + 1) / 2 + ((er - 1) / 2) * Math.pow(1 + 10 / u, -a * b);
}

/**
 * Hammerstad–Jensen thickness correction of the normalised width (t/h given as tNorm):
 * Δu1 = (t/π)·ln(1 + 4e / (t·coth²√(6.517u)))   (air),
 * Δur = ½·(1 + 1/cosh√(εr − 1))·Δu1           (on the substrate).
 */
export function hjWidthCorrection(u: number, tNorm: number, er: number): { du1: number; dur: number } {
  if (!(tNorm > 0)) return { du1: 0, dur: 0 };
  const th = Math.tanh(Math.sqrt(6.517 * u));
  const du1 = (tNorm / Math.PI) * Math.log(1 + (4 * Math.E * th * th) / tNorm);
  const dur = 0.5 * (1 + 1 / Math.cosh(Math.sqrt(Math.max(er - 1, 0)))) * du1;
  return { du1, dur };
}

function checkGeometry(g: MicrostripGeometry): void {
  const t = g.thickness ?? 0;
  if (!(g.width > 0) || !(g.height > 0) || !(t >= 0) || !(g.er >= 1) || !Number.isFinite(g.er)) {
    throw new RangeError(
      `microstrip: need width > 0, height > 0, thickness ≥ 0, er ≥ 1 (got width=${g.width}, height=${g.height}, thickness=${t}, er=${g.er})`,
    );
  }
}

/** The validity ranges of the quasi-static model for this geometry. */
export function microstripValidity(g: MicrostripGeometry): Validity {
  return validity('microstrip', [
    rangeCheck('W/h', g.width / g.height, 0.01, 100, 'Hammerstad–Jensen 1980: ε_eff within 0.2 % and Z0 within about 0.03 %'),
    rangeCheck('εr', g.er, 1, 128, 'Hammerstad–Jensen 1980: ε_eff within 0.2 %'),
    // No range is checked for the strip thickness: we found no published bound for the effective-width
    // thickness correction that we could confirm, and everyday boards (1 oz copper, t = 35 µm, on 4 to
    // 5 mil of prepreg: t/h ≈ 0.28–0.34) lie beyond the t/h ≤ 0.2 once used here as unsourced guidance.
    // Only t ≥ 0 is required (checkGeometry).
  ]);
}

/** Quasi-static analysis: Z0, ε_eff and the air-filled impedance, with the thickness correction. */
export function analyzeMicrostrip(g: MicrostripGeometry): MicrostripAnalysis {
  checkGeometry(g);
  const u = g.width / g.height;
  const tNorm = (g.thickness ?? 0) / g.height;
  const { du1, dur } = hjWidthCorrection(u, tNorm, g.er);
  const u1 = u + du1;
  const ur = u + dur;
  const z01u1 = hjZ01(u1);
  const z01ur = hjZ01(ur);
  const epsR = hjEpsEff(ur, g.er);
  const epsEff = epsR * (z01u1 / z01ur) ** 2;
  const z0 = z01ur / Math.sqrt(epsR);
  const fillingFactor = g.er > 1 ? (epsEff - 1) / (g.er - 1) : 1;
  const maxFrequency = g.er > 1 ? C0 / (4 * g.height * Math.sqrt(g.er - 1)) : Infinity;
  return { z0, epsEff, z0Air: z01u1, fillingFactor, u, u1, ur, maxFrequency, validity: microstripValidity(g) };
}

/** Impedance of the air-filled strip with thickness (ohm): the one geometry function L' depends on. */
export function microstripZ0Air(width: number, height: number, thickness: number): number {
  const u = width / height;
  const { du1 } = hjWidthCorrection(u, thickness / height, 1);
  return hjZ01(u + du1);
}

/**
 * Kirschning–Jansen 1982 dispersion: ε_eff(f) = εr − (εr − ε_eff(0)) / (1 + P(fn)),
 * fn = f·h in GHz·mm. `epsEff0` is the quasi-static value (with the thickness correction).
 */
export function kirschningJansenEpsEff(u: number, er: number, epsEff0: number, fnGHzMm: number): number {
  const fn = fnGHzMm;
  const p1 = 0.27488 + (0.6315 + 0.525 / Math.pow(1 + 0.0157 * fn, 20)) * u - 0.065683 * Math.exp(-8.7513 * u);
  const p2 = 0.33622 * (1 - Math.exp(-0.03442 * er));
  const p3 = 0.0363 * Math.exp(-4.6 * u) * (1 - Math.exp(-Math.pow(fn / 38.7, 4.97)));
  const p4 = 1 + 2.751 * (1 - Math.exp(-Math.pow(er / 15.916, 8)));
  const p = p1 * p2 * Math.pow((0.1844 + p3 * p4) * fn, 1.5763);
  return er - (er - epsEff0) / (1 + p);
}

export interface MicrostripDispersion {
  /** ε_eff at f (Kirschning–Jansen). */
  epsEff: number;
  /** Phase velocity c0/√ε_eff(f) (m/s). */
  velocity: number;
  validity: Validity;
}

/** ε_eff(f) of a microstrip by Kirschning–Jansen, with its stated range of validity. */
export function microstripDispersion(g: MicrostripGeometry, f: number): MicrostripDispersion {
  const a = analyzeMicrostrip(g);
  const fn = (f * g.height) / 1e6; // Hz·m → GHz·mm
  const epsEff = f > 0 ? kirschningJansenEpsEff(a.u, g.er, a.epsEff, fn) : a.epsEff;
  const v = validity('microstrip dispersion', [
    rangeCheck('W/h', a.u, 0.1, 100, 'Kirschning–Jansen 1982: within 0.6 %'),
    rangeCheck('εr', g.er, 1, 20, 'Kirschning–Jansen 1982: within 0.6 %'),
    rangeCheck('h/λ0', (g.height * f) / C0, 0, 0.13, 'Kirschning–Jansen 1982: within 0.6 %'),
  ]);
  return { epsEff, velocity: C0 / Math.sqrt(epsEff), validity: v };
}

/**
 * Width for a target Z0 (quasi-static, with the thickness correction), by bisection on ln(W/h)
 * of the analysis formula (Z0 falls monotonically with W). Throws if the target is out of reach
 * for W/h in [1e-4, 1e4].
 */
export function synthMicrostripWidth(
  z0: number,
  g: Omit<MicrostripGeometry, 'width'>,
): { width: number; analysis: MicrostripAnalysis } {
  const z0At = (lnU: number) => analyzeMicrostrip({ ...g, width: Math.exp(lnU) * g.height }).z0;
  const lnU = solveDecreasing(z0, z0At, Math.log(1e-4), Math.log(1e4), 'microstrip');
  const width = Math.exp(lnU) * g.height;
  return { width, analysis: analyzeMicrostrip({ ...g, width }) };
}
