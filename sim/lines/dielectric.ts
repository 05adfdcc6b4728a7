// Causal wideband dielectric: the Djordjevic–Sarkar model (A. R. Djordjevic, R. M. Biljić,
// V. D. Likar-Smiljanić, T. K. Sarkar, "Wideband frequency-domain characterization of FR-4 and
// time-domain causality", IEEE Trans. EMC 43(4), 2001, pp. 662–667):
//
//   ε_r(ω) = ε∞ + (Δε / (m2 − m1)) · log10((ω2 + jω) / (ω1 + jω)),   ω1 = 10^m1, ω2 = 10^m2.
//
// It is a continuous sum of Debye poles spread evenly in log τ between 1/ω2 and 1/ω1, so it is
// causal (Kramers–Kronig consistent) by construction; between the corners the loss tangent is
// nearly flat, as measured on glass-epoxy laminates. We give the corners as frequencies in Hz
// (ω_i = 2π f_i, m2 − m1 = log10(f2/f1)); defaults 1 kHz and 1 THz, the usual choice (the paper's
// m1 = 3, m2 = 12 read as decades of frequency). It is fitted from εr and tanδ at one frequency.
//
// For the time-domain solver it is realised as a few discrete Debye terms,
//   ε(ω) ≈ ε∞' + Σ Δε_k / (1 + jωτ_k),   Δε_k ≥ 0 (passive),
// fitted by non-negative least squares over the band the run needs (debyeFit).

import { cabs, cx, type Complex } from './complex.js';
import { nnls } from './lsq.js';

export interface DSModel {
  /** High-frequency permittivity ε∞. */
  epsInf: number;
  /** Total relaxation Δε = ε(0) − ε∞. */
  deltaEps: number;
  /** Lower and upper corner frequencies (Hz). */
  f1: number;
  f2: number;
}

/** The complex log10 term L(ω) = log10((ω2 + jω)/(ω1 + jω)); Im L ≤ 0 for ω2 > ω1. */
function logTerm(m: DSModel, omega: number): Complex {
  const w1 = 2 * Math.PI * m.f1;
  const w2 = 2 * Math.PI * m.f2;
  // ln((ω2 + jω)/(ω1 + jω)) = ½ ln((ω2² + ω²)/(ω1² + ω²)) + j(atan(ω/ω2) − atan(ω/ω1))
  const re = 0.5 * Math.log((w2 * w2 + omega * omega) / (w1 * w1 + omega * omega));
  const im = Math.atan(omega / w2) - Math.atan(omega / w1);
  return { re: re / Math.LN10, im: im / Math.LN10 };
}

/** ε_r(ω) of the Djordjevic–Sarkar model (imaginary part ≤ 0: loss, e^{jωt} convention). */
export function dsEpsilon(m: DSModel, omega: number): Complex {
  if (m.deltaEps === 0) return cx(m.epsInf);
  const s = m.deltaEps / Math.log10(m.f2 / m.f1);
  const L = logTerm(m, omega);
  return { re: m.epsInf + s * L.re, im: s * L.im };
}

/** Loss tangent −Im ε / Re ε at frequency f (Hz). */
export function dsLossTangent(m: DSModel, f: number): number {
  const e = dsEpsilon(m, 2 * Math.PI * f);
  return -e.im / e.re;
}

/**
 * Fit the model to a measured (εr, tanδ) at fRef (Hz): the slope Δε/(m2 − m1) from the loss, then
 * ε∞ from the real part. Both values are matched exactly at fRef.
 */
export function djordjevicSarkar(er: number, lossTangent: number, fRef: number, f1 = 1e3, f2 = 1e12): DSModel {
  if (!(er >= 1) || !(lossTangent >= 0) || !(fRef > 0) || !(f1 > 0) || !(f2 > f1)) {
    throw new RangeError(`djordjevicSarkar: need er ≥ 1, lossTangent ≥ 0, fRef > 0, 0 < f1 < f2 (got er=${er}, lossTangent=${lossTangent}, fRef=${fRef}, f1=${f1}, f2=${f2})`);
  }
  if (lossTangent === 0) return { epsInf: er, deltaEps: 0, f1, f2 };
  const unit: DSModel = { epsInf: 0, deltaEps: Math.log10(f2 / f1), f1, f2 }; // slope 1
  const L = logTerm(unit, 2 * Math.PI * fRef);
  const slope = (-lossTangent * er) / L.im; // Δε/(m2 − m1)
  const epsInf = er - slope * L.re;
  if (!(epsInf >= 1)) {
    throw new RangeError(`djordjevicSarkar: tanδ = ${lossTangent} is too large for εr = ${er} between ${f1} and ${f2} Hz (ε∞ would be ${epsInf.toFixed(3)} < 1)`);
  }
  return { epsInf, deltaEps: slope * Math.log10(f2 / f1), f1, f2 };
}

/**
 * The largest loss tangent the model can carry at fRef for a given εr with ε∞ ≥ 1 (a larger one
 * would need ε∞ < 1 between the corners).
 */
export function dsMaxLossTangent(er: number, fRef: number, f1 = 1e3, f2 = 1e12): number {
  const L = logTerm({ epsInf: 0, deltaEps: 0, f1, f2 }, 2 * Math.PI * fRef);
  return L.re > 0 ? ((er - 1) * -L.im) / (L.re * er) : Infinity;
}

export interface DebyeTerm {
  /** Relaxation strength Δε_k ≥ 0. */
  deltaEps: number;
  /** Relaxation time τ_k (s). */
  tau: number;
}

export interface DebyeFit {
  /** High-frequency permittivity of the realisation. */
  epsInf: number;
  terms: DebyeTerm[];
  /** Max over [fmin, fmax] of |ε_fit − ε_DS| / |ε_DS| (dense log grid, 200 points per decade). */
  maxRelError: number;
  /** Max over [fmin, fmax] of |Im ε_fit − Im ε_DS| / |Im ε_DS|: the relative error of the loss. */
  maxLossRelError: number;
  fmin: number;
  fmax: number;
}

/** ε(ω) of a Debye realisation. */
export function debyeEpsilon(fit: Pick<DebyeFit, 'epsInf' | 'terms'>, omega: number): Complex {
  let re = fit.epsInf;
  let im = 0;
  for (const t of fit.terms) {
    const x = omega * t.tau;
    const d = 1 + x * x;
    re += t.deltaEps / d;
    im -= (t.deltaEps * x) / d;
  }
  return { re, im };
}

/** Log-spaced grid of n ≥ 2 points from a to b inclusive. */
export function logGrid(a: number, b: number, n: number): number[] {
  if (n < 2 || a === b) return [a];
  const la = Math.log(a);
  const step = (Math.log(b) - la) / (n - 1);
  return Array.from({ length: n }, (_, i) => Math.exp(la + i * step));
}

/** Points on a log grid of [a, b] with `perDecade` points per decade (at least 2). */
export function decadeGrid(a: number, b: number, perDecade: number): number[] {
  return logGrid(a, b, Math.max(2, Math.ceil(Math.log10(b / a) * perDecade) + 1));
}

/**
 * Realise a Djordjevic–Sarkar model over [fmin, fmax] (Hz) as nTerms Debye terms.
 * Relaxation frequencies are log-spaced; the span's two end points are chosen from a small grid
 * (from just inside the band to a decade beyond it) to minimise the worst loss error, and for each
 * candidate ε∞' and Δε_k ≥ 0 come from non-negative least squares on the real and imaginary parts,
 * both weighted by 1/|Im ε_DS| (so the loss is fitted in relative terms).
 */
export function debyeFit(model: DSModel, fmin: number, fmax: number, nTerms = 4): DebyeFit {
  if (!(fmin > 0) || !(fmax > fmin) || !(nTerms >= 1) || !Number.isInteger(nTerms)) {
    throw new RangeError(`debyeFit: need 0 < fmin < fmax and an integer nTerms ≥ 1 (got ${fmin}, ${fmax}, ${nTerms})`);
  }
  if (model.deltaEps === 0) {
    return { epsInf: model.epsInf, terms: [], maxRelError: 0, maxLossRelError: 0, fmin, fmax };
  }
  const fitGrid = decadeGrid(fmin, fmax, 25).map((f) => 2 * Math.PI * f);
  const target = fitGrid.map((w) => dsEpsilon(model, w));
  const coarseGrid = decadeGrid(fmin, fmax, 50).map((f) => 2 * Math.PI * f);
  const coarseTarget = coarseGrid.map((w) => dsEpsilon(model, w));
  const denseGrid = decadeGrid(fmin, fmax, 200).map((f) => 2 * Math.PI * f);
  const denseTarget = denseGrid.map((w) => dsEpsilon(model, w));

  const solve = (taus: number[], checkGrid: number[], checkTarget: Complex[]): DebyeFit => {
    const A: number[][] = [];
    const b: number[] = [];
    target.forEach((e, i) => {
      const w = fitGrid[i];
      const wt = 1 / Math.abs(e.im);
      const rowRe = [wt];
      const rowIm = [0];
      for (const tau of taus) {
        const x = w * tau;
        rowRe.push(wt / (1 + x * x));
        rowIm.push((-wt * x) / (1 + x * x));
      }
      A.push(rowRe, rowIm);
      b.push(wt * e.re, wt * e.im);
    });
    const x = nnls(A, b);
    const fit = {
      epsInf: x[0],
      terms: taus.map((tau, k) => ({ deltaEps: x[k + 1], tau })).filter((t) => t.deltaEps > 0),
    };
    let maxRel = 0;
    let maxLoss = 0;
    checkGrid.forEach((w, i) => {
      const e = checkTarget[i];
      const g = debyeEpsilon(fit, w);
      maxRel = Math.max(maxRel, Math.hypot(g.re - e.re, g.im - e.im) / cabs(e));
      maxLoss = Math.max(maxLoss, Math.abs(g.im - e.im) / Math.abs(e.im));
    });
    return { ...fit, maxRelError: maxRel, maxLossRelError: maxLoss, fmin, fmax };
  };

  const wLo = 2 * Math.PI * fmin;
  const wHi = 2 * Math.PI * fmax;
  const factors = [0.7, 1, 1.5, 2, 3, 4, 6, 8, 12];
  let best: DebyeFit | null = null;
  for (const a of factors) {
    for (const c of factors) {
      const lo = wLo / a;
      const hi = wHi * c;
      const poles = nTerms === 1 ? [Math.sqrt(lo * hi)] : logGrid(lo, hi, nTerms);
      const fit = solve(poles.map((p) => 1 / p), coarseGrid, coarseTarget);
      if (!best || fit.maxLossRelError < best.maxLossRelError) best = fit;
    }
  }
  // Report the error of the chosen realisation on the dense grid.
  return solve(best!.terms.map((t) => t.tau), denseGrid, denseTarget);
}

/** Relative error of a complex value against a reference (helper for reports and tests). */
export function relError(a: Complex, ref: Complex): number {
  return cabs({ re: a.re - ref.re, im: a.im - ref.im }) / cabs(ref);
}


/**
 * The smallest Debye realisation (1 to maxTerms terms) whose loss error over [fmin, fmax] is at
 * most `maxLossRelError`; if none reaches it, the one with maxTerms terms.
 */
export function debyeFitAuto(model: DSModel, fmin: number, fmax: number, maxLossRelError = 0.02, maxTerms = 16): DebyeFit {
  let fit = debyeFit(model, fmin, fmax, 1);
  for (let n = 2; n <= maxTerms && fit.maxLossRelError > maxLossRelError; n++) fit = debyeFit(model, fmin, fmax, n);
  return fit;
}
