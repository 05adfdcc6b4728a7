// Two-port pieces of the spectral solver at one complex frequency s = σ + jω: a part's impedance, the
// admittance of parts in parallel, and a uniform line's chain (ABCD) matrix
//   [cosh γℓ, Zc sinh γℓ; sinh γℓ / Zc, cosh γℓ],  γ = √(Z′Y′), Zc = √(Z′/Y′)
// (Pozar, Microwave Engineering, ch. 4, ABCD parameters; lines from ch. 2 with jω → s), written as
// [cosh u, Z′ℓ·shc u; Y′ℓ·shc u, cosh u] with u = γℓ and shc u = sinh u / u: both entries are even in
// u, so the branch of the square root does not matter and a line with Z′ = 0 or Y′ = 0 needs no
// special case. For |u| large the common factor e^u is split off into a running logarithmic scale,
// so a long lossy line never overflows.
import type { Part } from '../model.js';
import type { Complex } from './per-length.js';

/** True when the part is a plain wire to its rail (no R, L or C): an ideal short in AC, an ideal source at DC. */
export function isIdealShort(p: Part): boolean {
  return p.r === 0 && p.l === 0 && p.c === undefined;
}

/** Z(s) = R + sL + 1/(sC) of a part (C absent = no capacitor term); s must not be 0. */
export function partImpedance(p: Part, sr: number, si: number): Complex {
  let re = p.r + sr * p.l;
  let im = si * p.l;
  if (p.c !== undefined) {
    const d = (sr * sr + si * si) * p.c; // 1/(sC) = conj(s)/(|s|²C)
    re += sr / d;
    im -= si / d;
  }
  return { re, im };
}

/** Sum of the admittances 1/Z(s) of parts in parallel; `short` when one of them is an ideal short. */
export function admittance(parts: Part[], sr: number, si: number): { re: number; im: number; short: boolean } {
  let re = 0;
  let im = 0;
  for (const p of parts) {
    if (isIdealShort(p)) return { re: 0, im: 0, short: true };
    const z = partImpedance(p, sr, si);
    const d = z.re * z.re + z.im * z.im;
    re += z.re / d;
    im -= z.im / d;
  }
  return { re, im, short: false };
}

/** A state [V; I] = e^lg·[w0; w1] carried through line pieces. */
export interface Sweep {
  w0r: number;
  w0i: number;
  w1r: number;
  w1i: number;
  lg: number;
}

/** cosh u and shc u = sinh u / u of a line piece, both divided by e^lg (lg = Re u when |u| ≥ 0.25, else 0). */
export interface LineFunctions {
  chr: number;
  chi: number;
  scr: number;
  sci: number;
  lg: number;
}

/** cosh u and shc u for u² = zl·yl (zl = Z′ℓ, yl = Y′ℓ), written into `out`. */
export function lineFunctions(zlr: number, zli: number, ylr: number, yli: number, out: LineFunctions): void {
  // u² = Z'Y'ℓ², u its principal square root (Re u ≥ 0)
  const pr = zlr * ylr - zli * yli;
  const pi = zlr * yli + zli * ylr;
  const mag = Math.sqrt(pr * pr + pi * pi);
  if (mag < 0.0625) {
    // |u| < 0.25: Taylor series in p = u², truncation below 1e-15 relative
    const p2r = pr * pr - pi * pi;
    const p2i = 2 * pr * pi;
    const p3r = p2r * pr - p2i * pi;
    const p3i = p2r * pi + p2i * pr;
    const p4r = p2r * p2r - p2i * p2i;
    const p4i = 2 * p2r * p2i;
    out.chr = 1 + pr / 2 + p2r / 24 + p3r / 720 + p4r / 40320;
    out.chi = pi / 2 + p2i / 24 + p3i / 720 + p4i / 40320;
    out.scr = 1 + pr / 6 + p2r / 120 + p3r / 5040 + p4r / 362880;
    out.sci = pi / 6 + p2i / 120 + p3i / 5040 + p4i / 362880;
    out.lg = 0;
    return;
  }
  // principal sqrt without cancellation
  let ur: number;
  let ui: number;
  if (pr >= 0) {
    ur = Math.sqrt(0.5 * (mag + pr));
    ui = pi / (2 * ur);
  } else {
    ui = Math.sqrt(0.5 * (mag - pr));
    if (pi < 0) ui = -ui;
    ur = pi / (2 * ui);
  }
  // cosh u = e^u (1 + e^{−2u})/2, sinh u = e^u (1 − e^{−2u})/2; e^{Re u} goes to the log scale,
  // e^{j Im u} stays in the entries.
  const ea = Math.exp(-2 * ur);
  const er = ea * Math.cos(2 * ui);
  const ei = -ea * Math.sin(2 * ui);
  const phr = Math.cos(ui);
  const phi = Math.sin(ui);
  const ar = (1 + er) / 2;
  const ai = ei / 2;
  const br = (1 - er) / 2;
  const bi = -ei / 2;
  out.chr = ar * phr - ai * phi;
  out.chi = ar * phi + ai * phr;
  const shr = br * phr - bi * phi;
  const shi = br * phi + bi * phr;
  const ud = ur * ur + ui * ui;
  out.scr = (shr * ur + shi * ui) / ud;
  out.sci = (shi * ur - shr * ui) / ud;
  out.lg = ur;
}

/** Work space for lineFunctions, owned by each evaluator (no shared state). */
export function lineWork(): LineFunctions {
  return { chr: 0, chi: 0, scr: 0, sci: 0, lg: 0 };
}

/**
 * Applies the chain matrix of a line piece with total series impedance zl = Z'ℓ and total shunt
 * admittance yl = Y'ℓ to the state (from the output side back to the input side).
 */
export function applyLine(zlr: number, zli: number, ylr: number, yli: number, st: Sweep, f: LineFunctions = lineWork()): void {
  lineFunctions(zlr, zli, ylr, yli, f);
  const { chr, chi, scr, sci } = f;
  st.lg += f.lg;
  const br = zlr * scr - zli * sci; // B = Z'ℓ·shc u
  const bi = zlr * sci + zli * scr;
  const cr = ylr * scr - yli * sci; // C = Y'ℓ·shc u
  const ci = ylr * sci + yli * scr;
  const { w0r, w0i, w1r, w1i } = st;
  st.w0r = chr * w0r - chi * w0i + (br * w1r - bi * w1i);
  st.w0i = chr * w0i + chi * w0r + (br * w1i + bi * w1r);
  st.w1r = cr * w0r - ci * w0i + (chr * w1r - chi * w1i);
  st.w1i = cr * w0i + ci * w0r + (chr * w1i + chi * w1r);
}

/**
 * The admittance (Y) parameters of a line piece, y11 = y22 = D/B and y12 = y21 = −1/B from its chain
 * matrix (AD − BC = 1; Pozar, Microwave Engineering, Table 4.2), written into out[0…3] as
 * (y11 re, y11 im, y12 re, y12 im). The scale e^lg cancels in D/B; in 1/B it leaves e^−lg, which
 * underflows harmlessly to 0 for a very long lossy line.
 */
export function lineAdmittance(zlr: number, zli: number, ylr: number, yli: number, out: Float64Array, f: LineFunctions = lineWork()): void {
  lineFunctions(zlr, zli, ylr, yli, f);
  const br = zlr * f.scr - zli * f.sci;
  const bi = zlr * f.sci + zli * f.scr;
  const d = br * br + bi * bi;
  // 1/B̃ = conj(B̃)/|B̃|²
  const ir = br / d;
  const ii = -bi / d;
  out[0] = f.chr * ir - f.chi * ii;
  out[1] = f.chr * ii + f.chi * ir;
  const k = -Math.exp(-f.lg);
  out[2] = k * ir;
  out[3] = k * ii;
}

export function normalize(st: Sweep): void {
  const m = Math.abs(st.w0r) + Math.abs(st.w0i) + Math.abs(st.w1r) + Math.abs(st.w1i);
  if (m > 0 && m < Infinity && (m > 1e50 || m < 1e-50)) {
    st.w0r /= m;
    st.w0i /= m;
    st.w1r /= m;
    st.w1i /= m;
    st.lg += Math.log(m);
  }
}

