// Conductor loss: skin depth, surface resistance, the high-frequency resistance per length of
// each cross-section, DC resistance, and the Hammerstad roughness factor.
//
// High-frequency resistance: Wheeler's incremental-inductance rule (H. A. Wheeler, "Formulas for
// the skin effect", Proc. IRE 30(9), 1942, pp. 412–424): in the skin-effect limit
//   R' = (Rs/µ0) · ∂L'/∂n = (Rs/η0) · ∂Z0,air/∂n,
// where every conductor wall recedes by dn (strip: W − 2dn, t − 2dn; planes: spacing + 2dn;
// wires: d − 2dn). We write R' = g·Rs with a geometry factor g (1/m):
//   coax      g = (1/π)(1/d + 1/D)                     (= (1/2π)(1/a + 1/b), closed form)
//   two wires g = (2/(πd)) · (s/d)/√((s/d)² − 1)       (closed form, includes proximity effect)
//   microstrip, stripline: ∂Z0,air/∂n of the very formulas used for Z0 (Hammerstad–Jensen with
//   thickness; Cohn with Wheeler's thickness ratio), by a central difference. This is Wheeler's
//   incremental-inductance rule, the one behind Pozar's stripline loss formula.
// With Rs = √(ωµ/2σ), the resistance is R' = K·√(ω/2), K = g·√(µ/σ): the skin coefficient of the
// conductor impedance K·√(jω) used by freq-model.ts.

import { C0, ETA0, MU0 } from './constants.js';
import { microstripZ0Air } from './microstrip.js';
import { striplineZ0Air } from './stripline.js';

/** Copper thickness per "ounce" of copper weight (oz/ft²): 35 µm, common PCB practice (IPC). */
export const COPPER_THICKNESS_PER_OZ = 35e-6;

/** Skin depth δ = 1/√(π f µ σ) (m). µ = µr·µ0. */
export function skinDepth(f: number, conductivity: number, muR = 1): number {
  return 1 / Math.sqrt(Math.PI * f * muR * MU0 * conductivity);
}

/** Surface resistance Rs = 1/(σδ) = √(π f µ/σ) (ohm per square). */
export function surfaceResistance(f: number, conductivity: number, muR = 1): number {
  return Math.sqrt((Math.PI * f * muR * MU0) / conductivity);
}

/**
 * Hammerstad roughness factor K_r = 1 + (2/π)·atan(1.4·(Δ/δ)²), Δ the rms surface roughness
 * (Hammerstad & Jensen 1980, after Hammerstad & Bekkadal; also used by Groiss et al. 1996 as the
 * baseline). Multiplies the skin-effect resistance; tends to 2 for Δ ≫ δ.
 */
export function hammerstadRoughness(f: number, rms: number, conductivity: number, muR = 1): number {
  if (!(rms > 0) || !(f > 0)) return 1;
  const r = rms / skinDepth(f, conductivity, muR);
  return 1 + (2 / Math.PI) * Math.atan(1.4 * r * r);
}

/** Skin coefficient K = g·√(µ/σ) (ohm/(m·√(rad/s))) from a geometry factor g (1/m). */
export function skinCoefficient(g: number, conductivity: number, muR = 1): number {
  if (conductivity === Infinity) return 0;
  return g * Math.sqrt((muR * MU0) / conductivity);
}

// ---- Geometry factors g (1/m): R'_hf = g·Rs ----

/** Coax: g = (1/π)(1/d + 1/D) with diameters d (inner) and D (shield). */
export function coaxLossFactor(innerDiameter: number, shieldDiameter: number): number {
  return (1 / Math.PI) * (1 / innerDiameter + 1 / shieldDiameter);
}

/** Two round wires, both carrying current: g = (2/(πd))·(s/d)/√((s/d)² − 1). */
export function twoWireLossFactor(diameter: number, spacing: number): number {
  const x = spacing / diameter;
  return (2 / (Math.PI * diameter)) * (x / Math.sqrt(x * x - 1));
}

/** Central-difference ∂Z/∂n with a step small against every dimension. */
function wheelerDerivative(z: (dn: number) => number, smallest: number): number {
  const h = 1e-5 * smallest;
  return (z(h) - z(-h)) / (2 * h);
}

/**
 * Microstrip (strip and ground plane): g = (1/η0)·∂Z0,air/∂n with W − 2dn, t − 2dn, h + 2dn.
 * Needs t > 0 (a zero-thickness strip has a logarithmically infinite edge loss).
 */
export function microstripLossFactor(width: number, height: number, thickness: number): number {
  if (!(thickness > 0)) throw new RangeError('microstrip conductor loss needs thickness > 0 (the incremental-inductance rule diverges for a zero-thickness strip)');
  const z = (dn: number) => microstripZ0Air(width - 2 * dn, height + 2 * dn, thickness - 2 * dn);
  return wheelerDerivative(z, Math.min(width, height, thickness)) / ETA0;
}

/**
 * Microstrip, Hammerstad–Jensen's own loss form, for comparison: α_c = Rs·K_i/(Z0·W), i.e.
 * g = 2·K_i/W with the current-distribution factor K_i = exp(−1.2·(Z0,air/η0)^0.7).
 */
export function microstripLossFactorHJ(width: number, height: number, thickness: number): number {
  const ki = Math.exp(-1.2 * Math.pow(microstripZ0Air(width, height, thickness) / ETA0, 0.7));
  return (2 * ki) / width;
}

/** Stripline (strip and both planes): g = (1/η0)·∂Z0,air/∂n with W − 2dn, t − 2dn, b + 2dn. */
export function striplineLossFactor(width: number, planeSpacing: number, thickness: number): number {
  if (!(thickness > 0)) throw new RangeError('stripline conductor loss needs thickness > 0 (the incremental-inductance rule diverges for a zero-thickness strip)');
  const z = (dn: number) => striplineZ0Air(width - 2 * dn, planeSpacing + 2 * dn, thickness - 2 * dn);
  return wheelerDerivative(z, Math.min(width, planeSpacing - thickness, thickness)) / ETA0;
}

// ---- DC resistance per length (ohm/m) ----

/** Rectangular strip W × t. (Return through a ground plane is taken as negligible at DC.) */
export function dcResistanceStrip(width: number, thickness: number, conductivity: number): number {
  return 1 / (conductivity * width * thickness);
}

/** Solid round wire of diameter d. */
export function dcResistanceRound(diameter: number, conductivity: number): number {
  return 4 / (conductivity * Math.PI * diameter * diameter);
}

/** Tube of inner diameter D and wall thickness w (a coax shield). */
export function dcResistanceTube(innerDiameter: number, wall: number, conductivity: number): number {
  const ro = innerDiameter / 2 + wall;
  const ri = innerDiameter / 2;
  return 1 / (conductivity * Math.PI * (ro * ro - ri * ri));
}

/** Conductor attenuation α_c = R'/(2 Z0) (Np/m), the low-loss approximation. */
export function conductorAttenuation(rPerLength: number, z0: number): number {
  return rPerLength / (2 * z0);
}

/** Dielectric attenuation of a homogeneous line α_d = π f √εr tanδ / c0 (Np/m), low-loss limit. */
export function dielectricAttenuation(f: number, er: number, lossTangent: number): number {
  return (Math.PI * f * Math.sqrt(er) * lossTangent) / C0;
}
