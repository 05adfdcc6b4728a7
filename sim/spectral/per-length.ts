// Per-unit-length series impedance Z'(s) and shunt admittance Y'(s) of a line item, evaluated at a
// complex frequency s = σ + jω (the Laplace variable; s = jω on the frequency axis). The spectral
// solver evaluates every line here and nowhere else.
//
// Three descriptions, in order of precedence:
//  1. `wideband` (a FreqLine, sim/lines/freq-model.ts): the exact frequency-dependent model the
//     time-domain realisation is fitted to — so the cross-check measures the fit error too.
//       Z'(s) = s·L∞ + √(R_dc² + K²·s)·K_r(s),   Y'(s) = G_dc + s·[C∞ + c_ε(ε_DS(s) − ε∞)]
//     On the jω axis (σ = 0) this is exactly freq-model's zPerLength / yPerLength. For σ > 0 it is
//     their analytic continuation, evaluated with the same primitives: √(R_dc² + K²(σ + jω)) is the
//     internal impedance of a conductor with R_dc² replaced by R_dc² + K²σ, and the Djordjevic–Sarkar
//     term log10((ω2 + s)/(ω1 + s)) is the model's own term with both corners moved up by σ (same
//     slope). The Hammerstad roughness factor K_r(ω) = 1 + (2/π)·atan(b·ω), b = 1.4·(Δ/δ)²/ω
//     (Hammerstad & Jensen 1980), continues as K_r(s) = 1 + (2/π)·atan(−j·b·s)
//       = 1 − (j/π)·ln((1 + b·s)/(1 − b·s)),
//     analytic except for branch cuts on the real axis beyond |s| = 1/b, one of them in the right
//     half-plane: the Hammerstad factor is not causal. The line built with it is not either — on a
//     0.3 m FR-4 microstrip with 0.5 µm roughness its impulse response starts about 190 ps before
//     ℓ/v∞ — so no damped contour gives exactly its jω-axis (Fourier) response: results depend on σ
//     (up to 2 % of swing between σ = 0.8e9 and 1.3e9 1/s on that trace) and converge as σ → 0, i.e.
//     with a larger `pad`. b is read from conductor.ts's hammerstadRoughness itself, at the frequency
//     where its atan argument is 1.
//  2. Auxiliary terms (`series`, `shunt`, model.ts): the rational model
//       Z'(s) = R' + sL' + Σ R_k·sτ_k/(1 + sτ_k),   Y'(s) = G' + sC' + Σ C_k·s/(1 + sτ_k).
//  3. The constant model: Z'(s) = R' + s·L', Y'(s) = G' + s·C' (the telegrapher equations;
//     Pozar, Microwave Engineering, ch. 2, with jω → s).
// Every model is real for real s, so Z'(s̄) = conj Z'(s); a negative ω is evaluated that way.
import { hammerstadRoughness } from '../lines/conductor.js';
import { internalImpedance, type Roughness } from '../lines/skin-fit.js';
import { dsEpsilon } from '../lines/dielectric.js';
import { yPerLength, zPerLength, type FreqLine } from '../lines/freq-model.js';
import type { AuxTerm, LineRLGC } from '../model.js';

export interface Complex {
  re: number;
  im: number;
}

export interface PerLength {
  /** Series impedance per metre Z'(s) (ohm/m). */
  z: Complex;
  /** Shunt admittance per metre Y'(s) (S/m). */
  y: Complex;
}

/**
 * Z'(s) and Y'(s) of `line` at the complex frequency `s` (rad/s; `{ re: 0, im: ω }` on the jω axis).
 * The spectral solver calls it at s = σ + jω with a small damping σ > 0 (numerical Laplace transform),
 * and at s = 0 for the DC operating point.
 */
export function perLength(line: LineRLGC, s: Complex): PerLength {
  if (s.im < 0) {
    const p = perLength(line, { re: s.re, im: -s.im });
    return { z: { re: p.z.re, im: -p.z.im }, y: { re: p.y.re, im: -p.y.im } };
  }
  if (line.wideband) return widebandPerLength(line.wideband, s);
  const z = { re: line.r + s.re * line.l, im: s.im * line.l };
  const y = { re: line.g + s.re * line.c, im: s.im * line.c };
  if (line.series) for (const t of line.series) addPole(z, t.value * t.tau, t, s); // R_k·sτ/(1 + sτ)
  if (line.shunt) for (const t of line.shunt) addPole(y, t.value, t, s); // C_k·s/(1 + sτ)
  return { z, y };
}

/** acc += a·s/(1 + sτ). */
function addPole(acc: Complex, a: number, t: AuxTerm, s: Complex): void {
  const dr = 1 + s.re * t.tau;
  const di = s.im * t.tau;
  const d = dr * dr + di * di;
  // s/(1 + sτ) = s·conj(1 + sτ)/|1 + sτ|²
  acc.re += (a * (s.re * dr + s.im * di)) / d;
  acc.im += (a * (s.im * dr - s.re * di)) / d;
}

/** Z'(s), Y'(s) of the exact frequency-dependent model (see the header). */
export function widebandPerLength(w: FreqLine, s: Complex): PerLength {
  const sigma = s.re;
  const omega = s.im;
  if (sigma === 0) return { z: zPerLength(w, omega), y: yPerLength(w, omega) };
  const rdc = Math.sqrt(w.rdc * w.rdc + w.skinK * w.skinK * sigma);
  let zi = internalImpedance({ rdc, skinK: w.skinK, roughness: null }, omega);
  if (w.roughness && w.roughness.rms > 0) zi = cmul(zi, roughnessFactor(w.roughness, s));
  const z = { re: zi.re + sigma * w.lInf, im: zi.im + omega * w.lInf };
  let cr = w.cInf;
  let ci = 0;
  if (w.dielectric) {
    const m = w.dielectric.model;
    const slope = m.deltaEps / Math.log10(m.f2 / m.f1);
    const shift = sigma / (2 * Math.PI);
    const f1 = m.f1 + shift;
    const f2 = m.f2 + shift;
    const e = dsEpsilon({ epsInf: m.epsInf, deltaEps: slope * Math.log10(f2 / f1), f1, f2 }, omega);
    cr += w.dielectric.cPerEps * (e.re - m.epsInf);
    ci = w.dielectric.cPerEps * e.im;
  }
  // Y' = G + s·C with complex C = cr + j·ci
  const y = { re: w.gdc + sigma * cr - omega * ci, im: omega * cr + sigma * ci };
  return { z, y };
}

function cmul(a: Complex, b: Complex): Complex {
  return { re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re };
}

/** b in K_r(ω) = 1 + (2/π)·atan(b·ω), read off hammerstadRoughness (cached per roughness object). */
const roughnessB = new WeakMap<Roughness, number>();

function hammerstadB(r: Roughness): number {
  let b = roughnessB.get(r);
  if (b !== undefined) return b;
  const at = (omega: number) => Math.tan((Math.PI / 2) * (hammerstadRoughness(omega / (2 * Math.PI), r.rms, r.conductivity, r.muR ?? 1) - 1)) / omega;
  b = at(2 * Math.PI * 1e9);
  b = at(1 / b); // re-read where b·ω = 1, the best-conditioned point of the atan
  roughnessB.set(r, b);
  return b;
}

/** Analytic continuation K_r(s) = 1 − (j/π)·ln((1 + b·s)/(1 − b·s)) of the Hammerstad factor. */
export function roughnessFactor(r: Roughness, s: Complex): Complex {
  const b = hammerstadB(r);
  const nr = 1 + b * s.re;
  const ni = b * s.im;
  const dr = 1 - b * s.re;
  const di = -b * s.im;
  // ln(n/d) = ln|n|/|d| + j(arg n − arg d)
  const lr = 0.5 * Math.log((nr * nr + ni * ni) / (dr * dr + di * di));
  const li = Math.atan2(ni, nr) - Math.atan2(di, dr);
  return { re: 1 + li / Math.PI, im: -lr / Math.PI };
}
