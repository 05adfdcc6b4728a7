// Realisation of the conductor's internal impedance for the time-domain solver.
//
// Model (freq-model.ts): Z_int(jω) = √(R_dc² + K²·jω) · K_r(ω)
//   — the skin-effect impedance K·√(jω) "blended" to R_dc at low frequency. It tends to R_dc at
//   DC (with internal inductance K²/(2R_dc), which for a round wire is exactly µ/8π) and to
//   K·√(jω) (R = ωL_int = K√(ω/2)) well above the crossover ω_c = (R_dc/K)². K_r is the optional
//   Hammerstad roughness factor.
//
// Realisation: R_dc in series with nTerms R‖L sections and an extra series inductance,
//   Z_fit(jω) = R_dc + jω·L_x + Σ_k R_k·jωτ_k / (1 + jωτ_k),   τ_k = L_k/R_k,  R_k, L_x ≥ 0,
// every term passive, so the realisation is causal and passive whatever the fit error. Each
// section is one auxiliary state per cell (a current in L_k, or equivalently a recursive
// convolution with e^{−t/τ_k}). The τ_k are log-spaced over the band (end points chosen from a
// small grid) and R_k, L_x come from non-negative least squares on real and imaginary parts
// weighted by 1/|Z_int| (relative error). Above fmax the sections saturate (R → R_dc + ΣR_k), so
// fmax must cover the spectrum of the fastest edge.

import { cabs, csqrt, type Complex } from './complex.js';
import { hammerstadRoughness } from './conductor.js';
import { decadeGrid, logGrid } from './dielectric.js';
import { nnls } from './lsq.js';

export interface Roughness {
  /** rms surface roughness Δ (m). */
  rms: number;
  /** Conductivity used for the skin depth in K_r (S/m). */
  conductivity: number;
  /** Relative permeability of the conductor (1 for copper). */
  muR?: number;
}

export interface ConductorImpedance {
  /** DC resistance per length (ohm/m). */
  rdc: number;
  /** Skin coefficient K (ohm/(m·√(rad/s))). */
  skinK: number;
  roughness?: Roughness | null;
}

export interface SkinSection {
  /** Resistance of the section (ohm/m). */
  r: number;
  /** Inductance of the section (H/m). */
  l: number;
  /** τ = l/r (s). */
  tau: number;
}

export interface SkinFit {
  /** Series resistance = R_dc (ohm/m). */
  r0: number;
  /** Extra series inductance L_x ≥ 0 (H/m), to be added to L∞. */
  lExtra: number;
  sections: SkinSection[];
  /** Max over [fmin, fmax] of |Z_fit − Z_int| / |Z_int| (200 log points per decade). */
  maxRelError: number;
  /** Max relative error of the resistance Re Z over the band. */
  maxResistanceRelError: number;
  fmin: number;
  fmax: number;
}

/** The internal (conductor) impedance per length Z_int(jω) of the model. */
export function internalImpedance(c: ConductorImpedance, omega: number): Complex {
  const z = csqrt({ re: c.rdc * c.rdc, im: c.skinK * c.skinK * omega });
  if (!c.roughness || !(c.roughness.rms > 0) || !(omega > 0)) return z;
  const kr = hammerstadRoughness(omega / (2 * Math.PI), c.roughness.rms, c.roughness.conductivity, c.roughness.muR ?? 1);
  return { re: z.re * kr, im: z.im * kr };
}

/** Impedance per length of a skin realisation (without L∞). */
export function skinFitImpedance(fit: Pick<SkinFit, 'r0' | 'lExtra' | 'sections'>, omega: number): Complex {
  let re = fit.r0;
  let im = omega * fit.lExtra;
  for (const s of fit.sections) {
    const x = omega * s.tau;
    const d = 1 + x * x;
    re += (s.r * x * x) / d;
    im += (s.r * x) / d;
  }
  return { re, im };
}

export function skinFit(c: ConductorImpedance, fmin: number, fmax: number, nTerms = 4): SkinFit {
  if (!(fmin > 0) || !(fmax > fmin) || !(nTerms >= 1) || !Number.isInteger(nTerms)) {
    throw new RangeError(`skinFit: need 0 < fmin < fmax and an integer nTerms ≥ 1 (got ${fmin}, ${fmax}, ${nTerms})`);
  }
  if (!(c.skinK > 0)) {
    return { r0: c.rdc, lExtra: 0, sections: [], maxRelError: 0, maxResistanceRelError: 0, fmin, fmax };
  }
  const fitW = decadeGrid(fmin, fmax, 25).map((f) => 2 * Math.PI * f);
  const fitZ = fitW.map((w) => internalImpedance(c, w));
  const coarseW = decadeGrid(fmin, fmax, 50).map((f) => 2 * Math.PI * f);
  const coarseZ = coarseW.map((w) => internalImpedance(c, w));
  const denseW = decadeGrid(fmin, fmax, 200).map((f) => 2 * Math.PI * f);
  const denseZ = denseW.map((w) => internalImpedance(c, w));

  const solve = (taus: number[], chkW: number[], chkZ: Complex[]): SkinFit => {
    const A: number[][] = [];
    const b: number[] = [];
    fitW.forEach((w, i) => {
      const z = fitZ[i];
      const wt = 1 / cabs(z);
      const rowRe = [0];
      const rowIm = [wt * w]; // L_x column
      for (const tau of taus) {
        const x = w * tau;
        const d = 1 + x * x;
        rowRe.push((wt * x * x) / d);
        rowIm.push((wt * x) / d);
      }
      A.push(rowRe, rowIm);
      b.push(wt * (z.re - c.rdc), wt * z.im);
    });
    const x = nnls(A, b);
    const fit = {
      r0: c.rdc,
      lExtra: x[0],
      sections: taus.map((tau, k) => ({ r: x[k + 1], l: x[k + 1] * tau, tau })).filter((s) => s.r > 0),
    };
    let maxRel = 0;
    let maxR = 0;
    chkW.forEach((w, i) => {
      const z = chkZ[i];
      const g = skinFitImpedance(fit, w);
      maxRel = Math.max(maxRel, Math.hypot(g.re - z.re, g.im - z.im) / cabs(z));
      maxR = Math.max(maxR, Math.abs(g.re - z.re) / z.re);
    });
    return { ...fit, maxRelError: maxRel, maxResistanceRelError: maxR, fmin, fmax };
  };

  const wLo = 2 * Math.PI * fmin;
  const wHi = 2 * Math.PI * fmax;
  const factors = [0.7, 1, 1.5, 2, 3, 4, 6, 8, 12];
  let best: SkinFit | null = null;
  for (const a of factors) {
    for (const d of factors) {
      const lo = wLo / a;
      const hi = wHi * d;
      const poles = nTerms === 1 ? [Math.sqrt(lo * hi)] : logGrid(lo, hi, nTerms);
      const fit = solve(poles.map((p) => 1 / p), coarseW, coarseZ);
      if (!best || fit.maxRelError < best.maxRelError) best = fit;
    }
  }
  // Report the error of the chosen realisation on the dense grid.
  return solve(best!.sections.map((s) => s.tau), denseW, denseZ);
}

/** The smallest realisation (1 to maxTerms sections) within `maxRelError` over the band. */
export function skinFitAuto(c: ConductorImpedance, fmin: number, fmax: number, maxRelError = 0.02, maxTerms = 16): SkinFit {
  let fit = skinFit(c, fmin, fmax, 1);
  for (let n = 2; n <= maxTerms && fit.maxRelError > maxRelError; n++) fit = skinFit(c, fmin, fmax, n);
  return fit;
}
