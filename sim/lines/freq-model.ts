// Frequency-domain description of a uniform line, shared by the `line` report, the spectral
// cross-check and (through its realisations) the time-domain solver.
//
//   Z'(jω) = jω·L∞ + √(R_dc² + K²·jω) · K_r(ω)                       (series, per metre)
//   Y'(jω) = G_dc + jω·[C∞ + c_ε·(ε_DS(ω) − ε∞)]                      (shunt, per metre)
//
// L∞: external inductance (= Z0,air/c0 for a TEM cross-section). K: skin coefficient
// (ohm/(m·√(rad/s))), R = K√(ω/2) in the skin-effect limit. K_r: Hammerstad roughness factor.
// C∞: the capacitance per metre at infinite frequency; c_ε = ∂C'/∂εr (= q·C_air, q the filling
// factor; C_air for a homogeneous line); ε_DS the Djordjevic–Sarkar permittivity, with ε∞ its
// high-frequency value, so the bracket tends to C∞ as ω → ∞. Geometric (modal) dispersion of
// microstrip is not part of this model: it is reported by microstrip.ts (Kirschning–Jansen) only.
//
// Plain SI numbers everywhere: ohm/m, H/m, S/m, F/m, Hz, rad/s, s/m, dB/m.

import { cadd, cdiv, cmul, csqrt, cx, type Complex } from './complex.js';
import { C0, COPPER_CONDUCTIVITY, DB_PER_NEPER } from './constants.js';
import {
  coaxLossFactor,
  dcResistanceRound,
  dcResistanceStrip,
  dcResistanceTube,
  microstripLossFactor,
  skinCoefficient,
  skinDepth,
  striplineLossFactor,
  twoWireLossFactor,
} from './conductor.js';
import { analyzeCoax, type CoaxAnalysis, type CoaxGeometry } from './coax.js';
import { debyeFit, djordjevicSarkar, dsEpsilon, dsMaxLossTangent, type DebyeFit, type DSModel } from './dielectric.js';
import { analyzeMicrostrip, type MicrostripAnalysis, type MicrostripGeometry } from './microstrip.js';
import { internalImpedance, skinFit, type Roughness, type SkinFit } from './skin-fit.js';
import { analyzeStripline, type StriplineAnalysis, type StriplineGeometry } from './stripline.js';
import { analyzeTwoWire, type TwoWireAnalysis, type TwoWireGeometry } from './two-wire.js';
import { leastSquares } from './lsq.js';

export interface FreqDielectric {
  /** Djordjevic–Sarkar permittivity of the material. */
  model: DSModel;
  /** c_ε = ∂C'/∂εr (F/m): q·C_air. */
  cPerEps: number;
}

export interface FreqLine {
  /** DC resistance (ohm/m). */
  rdc: number;
  /** External (high-frequency) inductance (H/m). */
  lInf: number;
  /** High-frequency capacitance C∞ (F/m): use it for the Courant limit. */
  cInf: number;
  /** DC conductance (S/m). */
  gdc: number;
  /** Skin coefficient K (ohm/(m·√(rad/s))). */
  skinK: number;
  /** Causal dielectric dispersion and loss, or null for a constant, lossless C'. */
  dielectric: FreqDielectric | null;
  /** Surface roughness (Hammerstad factor on the conductor impedance), or null. */
  roughness: Roughness | null;
  /**
   * The frequency (Hz) the description's εr, loss tangent and Z0 are given at (a geometry's `at`, a
   * datasheet's reference); absent for a line built from constant values.
   */
  at?: number;
}

// ---------------------------------------------------------------------------------------------
// Evaluation

/** Series impedance per metre Z'(jω). */
export function zPerLength(line: FreqLine, omega: number): Complex {
  const zi = internalImpedance(line, omega);
  return { re: zi.re, im: zi.im + omega * line.lInf };
}

/** Shunt admittance per metre Y'(jω). */
export function yPerLength(line: FreqLine, omega: number): Complex {
  let c = cx(line.cInf);
  if (line.dielectric) {
    const e = dsEpsilon(line.dielectric.model, omega);
    c = { re: line.cInf + line.dielectric.cPerEps * (e.re - line.dielectric.model.epsInf), im: line.dielectric.cPerEps * e.im };
  }
  // jω·C with complex C = c.re + j c.im: re = −ω c.im (≥ 0: loss), im = ω c.re.
  return { re: line.gdc - omega * c.im, im: omega * c.re };
}

export interface Propagation {
  f: number;
  /** Characteristic impedance √(Z'/Y') (ohm). */
  z0: Complex;
  /** Propagation constant γ = √(Z'Y') = α + jβ (1/m). */
  gamma: Complex;
}

/** Characteristic impedance and propagation constant at frequency f (Hz). */
export function z0AndGamma(line: FreqLine, f: number): Propagation {
  if (f === 0) {
    const z0 = line.gdc > 0 ? Math.sqrt(line.rdc / line.gdc) : Infinity;
    return { f, z0: cx(z0), gamma: cx(Math.sqrt(line.rdc * line.gdc)) };
  }
  const w = 2 * Math.PI * f;
  const z = zPerLength(line, w);
  const y = yPerLength(line, w);
  return { f, z0: csqrt(cdiv(z, y)), gamma: csqrt(cmul(z, y)) };
}

/** Attenuation α in dB per metre at f. */
export function attenuationDbPerM(line: FreqLine, f: number): number {
  return DB_PER_NEPER * z0AndGamma(line, f).gamma.re;
}

/** Phase velocity ω/β (m/s) at f > 0. */
export function phaseVelocity(line: FreqLine, f: number): number {
  return (2 * Math.PI * f) / z0AndGamma(line, f).gamma.im;
}

/**
 * The lossless part of the characteristic impedance at f: √(L∞/C′(f)), C′(f) the real capacitance per
 * metre of the dispersive dielectric at f (conductor loss, its internal inductance and the dielectric's
 * loss left out). At the description's reference frequency `at` this is its quasi-static Z0 (the
 * cross-section formula with εr at `at`; a datasheet's Z0 as given); as f → ∞ it tends to Z0∞.
 */
export function losslessZ0(line: FreqLine, f: number): number {
  let c = line.cInf;
  if (line.dielectric) c += line.dielectric.cPerEps * (dsEpsilon(line.dielectric.model, 2 * Math.PI * f).re - line.dielectric.model.epsInf);
  return Math.sqrt(line.lInf / c);
}

/** R', L', G', C' at frequency f (the DC limits at f = 0). */
export function rlgcAt(line: FreqLine, f: number): { r: number; l: number; g: number; c: number } {
  if (f === 0) {
    const lInt = line.skinK === 0 ? 0 : line.rdc > 0 ? (line.skinK * line.skinK) / (2 * line.rdc) : Infinity;
    const c = line.dielectric ? line.cInf + line.dielectric.cPerEps * line.dielectric.model.deltaEps : line.cInf;
    return { r: line.rdc, l: line.lInf + lInt, g: line.gdc, c };
  }
  const w = 2 * Math.PI * f;
  const z = zPerLength(line, w);
  const y = yPerLength(line, w);
  return { r: z.re, l: z.im / w, g: y.re, c: y.im / w };
}

/** The high-frequency limits: Z0 = √(L∞/C∞), v∞ = 1/√(L∞C∞) — the fastest any edge can travel. */
export function highFrequencyLimit(line: FreqLine): { z0: number; velocity: number; delayPerMeter: number } {
  return {
    z0: Math.sqrt(line.lInf / line.cInf),
    velocity: 1 / Math.sqrt(line.lInf * line.cInf),
    delayPerMeter: Math.sqrt(line.lInf * line.cInf),
  };
}

// ---------------------------------------------------------------------------------------------
// Time-domain realisation (auxiliary states per cell)

export interface TimeDomainRealisation {
  series: {
    /** Series resistance (ohm/m) = R_dc. */
    r0: number;
    /** Series inductance (H/m) = L∞ + the skin fit's extra inductance. */
    l: number;
    /** R‖L sections in series (ohm/m, H/m), one state each. */
    sections: { r: number; l: number; tau: number }[];
  };
  shunt: {
    g0: number;
    /** High-frequency capacitance of the realisation (F/m): use it for the Courant limit. */
    c: number;
    /** Series R–C branches in parallel (F/m, ohm·m), one state each: Y_k = jωC_k/(1 + jωτ_k). */
    branches: { c: number; r: number; tau: number }[];
  };
  skin: SkinFit;
  debye: DebyeFit | null;
  /** Max relative error of Z'(jω) and Y'(jω) over [fmin, fmax] against the exact model. */
  maxRelErrorZ: number;
  maxRelErrorY: number;
}

/**
 * Realise a FreqLine over [fmin, fmax] with `skinTerms` R‖L sections and `debyeTerms` Debye
 * branches. The errors are measured on the full Z' and Y' (including L∞ and C∞) on a dense grid.
 */
export function timeDomainRealisation(
  line: FreqLine,
  fmin: number,
  fmax: number,
  opts: { skinTerms?: number; debyeTerms?: number } = {},
): TimeDomainRealisation {
  const skin = skinFit(line, fmin, fmax, opts.skinTerms ?? 4);
  const debye = line.dielectric ? debyeFit(line.dielectric.model, fmin, fmax, opts.debyeTerms ?? 4) : null;
  const ce = line.dielectric?.cPerEps ?? 0;
  const real: TimeDomainRealisation = {
    series: { r0: skin.r0, l: line.lInf + skin.lExtra, sections: skin.sections.map((s) => ({ ...s })) },
    shunt: {
      g0: line.gdc,
      c: debye && line.dielectric ? line.cInf + ce * (debye.epsInf - line.dielectric.model.epsInf) : line.cInf,
      branches: debye
        ? debye.terms.map((t) => {
            const c = ce * t.deltaEps;
            return { c, r: t.tau / c, tau: t.tau };
          })
        : [],
    },
    skin,
    debye,
    maxRelErrorZ: 0,
    maxRelErrorY: 0,
  };
  const grid = logSpace(fmin, fmax, Math.max(2, Math.ceil(Math.log10(fmax / fmin) * 200) + 1));
  for (const f of grid) {
    const w = 2 * Math.PI * f;
    real.maxRelErrorZ = Math.max(real.maxRelErrorZ, relErr(zPerLengthRealised(real, w), zPerLength(line, w)));
    real.maxRelErrorY = Math.max(real.maxRelErrorY, relErr(yPerLengthRealised(real, w), yPerLength(line, w)));
  }
  return real;
}

/** Z'(jω) of a realisation. */
export function zPerLengthRealised(r: TimeDomainRealisation, omega: number): Complex {
  let z: Complex = { re: r.series.r0, im: omega * r.series.l };
  for (const s of r.series.sections) {
    const x = omega * s.tau;
    z = cadd(z, { re: (s.r * x * x) / (1 + x * x), im: (s.r * x) / (1 + x * x) });
  }
  return z;
}

/** Y'(jω) of a realisation. */
export function yPerLengthRealised(r: TimeDomainRealisation, omega: number): Complex {
  let y: Complex = { re: r.shunt.g0, im: omega * r.shunt.c };
  for (const b of r.shunt.branches) {
    // jωC/(1 + jωτ) = (ω²Cτ + jωC)/(1 + ω²τ²)
    const x = omega * b.tau;
    y = cadd(y, { re: (omega * b.c * x) / (1 + x * x), im: (omega * b.c) / (1 + x * x) });
  }
  return y;
}

function relErr(a: Complex, ref: Complex): number {
  return Math.hypot(a.re - ref.re, a.im - ref.im) / Math.hypot(ref.re, ref.im);
}

function logSpace(a: number, b: number, n: number): number[] {
  const la = Math.log(a);
  const step = (Math.log(b) - la) / (n - 1);
  return Array.from({ length: n }, (_, i) => Math.exp(la + i * step));
}

// ---------------------------------------------------------------------------------------------
// Builders from geometry

/** Material and conductor data common to the geometric forms. */
export interface LossSpec {
  /** Dielectric loss tangent at `at` (default 0: lossless dielectric, constant εr). */
  lossTangent?: number;
  /** Frequency (Hz) at which er and lossTangent are given (default 1 GHz). */
  at?: number;
  /** Conductor conductivity (S/m); default copper 5.8e7; Infinity for a perfect conductor. */
  conductivity?: number;
  /** rms surface roughness (m) for the Hammerstad factor; default 0. */
  roughness?: number;
  /** Djordjevic–Sarkar corner frequencies (Hz); defaults 1 kHz and 1 THz. */
  f1?: number;
  f2?: number;
}

export interface BuiltLine<A> {
  line: FreqLine;
  /** The cross-section analysis (Z0, ε_eff, validity...). */
  analysis: A;
  /** Z0 and ε_eff at `at` (quasi-static, lossless part). */
  z0: number;
  epsEff: number;
  /** Delay per metre √ε_eff/c0 at `at` (s/m). */
  delayPerMeter: number;
  /** Upper frequency of the quasi-TEM model (Hz); Infinity when none applies. */
  maxFrequency: number;
  /** Conductivity used (S/m), for skin-depth reports. */
  conductivity: number;
  /** One line per problem: out-of-range inputs, naming the range. */
  warnings: string[];
}

interface TemParts {
  z0Air: number;
  /** Filling factor q (1 for a homogeneous dielectric). */
  q: number;
  er: number;
  /** Geometry factor g (1/m): R'_hf = g·Rs. */
  lossFactor: number;
  rdc: number;
}

function temLine(p: TemParts, s: LossSpec): FreqLine {
  const conductivity = s.conductivity ?? COPPER_CONDUCTIVITY;
  if (!(conductivity > 0)) throw new RangeError(`conductivity must be > 0 (got ${conductivity})`);
  const lossTangent = s.lossTangent ?? 0;
  const at = s.at ?? 1e9;
  const cAir = 1 / (C0 * p.z0Air);
  const lInf = p.z0Air / C0;
  let cInf = cAir * (1 + p.q * (p.er - 1));
  let dielectric: FreqDielectric | null = null;
  if (lossTangent > 0) {
    const model = djordjevicSarkar(p.er, lossTangent, at, s.f1, s.f2);
    dielectric = { model, cPerEps: p.q * cAir };
    cInf = cAir * (1 + p.q * (model.epsInf - 1));
  }
  const perfect = conductivity === Infinity;
  return {
    rdc: perfect ? 0 : p.rdc,
    lInf,
    cInf,
    gdc: 0,
    skinK: perfect ? 0 : skinCoefficient(p.lossFactor, conductivity),
    dielectric,
    roughness: !perfect && (s.roughness ?? 0) > 0 ? { rms: s.roughness!, conductivity } : null,
    at,
  };
}

function built<A extends { z0: number; epsEff: number; validity: { warnings: string[] } }>(
  line: FreqLine,
  analysis: A,
  maxFrequency: number,
  s: LossSpec,
): BuiltLine<A> {
  return {
    line,
    analysis,
    z0: analysis.z0,
    epsEff: analysis.epsEff,
    delayPerMeter: Math.sqrt(analysis.epsEff) / C0,
    maxFrequency,
    conductivity: s.conductivity ?? COPPER_CONDUCTIVITY,
    warnings: [...analysis.validity.warnings],
  };
}

export type MicrostripSpec = MicrostripGeometry & LossSpec;

/** Microstrip: Hammerstad–Jensen Z0/ε_eff; loss by Wheeler's rule on the same formulas. */
export function fromMicrostrip(s: MicrostripSpec): BuiltLine<MicrostripAnalysis> {
  const a = analyzeMicrostrip(s);
  const t = s.thickness ?? 0;
  const sigma = s.conductivity ?? COPPER_CONDUCTIVITY;
  const lossy = sigma !== Infinity;
  if (lossy && !(t > 0)) throw new RangeError('microstrip: thickness must be > 0 for a lossy conductor (DC resistance and edge loss diverge at t = 0)');
  const line = temLine(
    {
      z0Air: a.z0Air,
      q: a.fillingFactor,
      er: s.er,
      lossFactor: lossy ? microstripLossFactor(s.width, s.height, t) : 0,
      rdc: lossy ? dcResistanceStrip(s.width, t, sigma) : 0,
    },
    s,
  );
  return built(line, a, a.maxFrequency, s);
}

export type StriplineSpec = StriplineGeometry & LossSpec;

/** Symmetric stripline: Cohn (with Wheeler's thickness ratio); loss by Wheeler's rule. */
export function fromStripline(s: StriplineSpec): BuiltLine<StriplineAnalysis> {
  const a = analyzeStripline(s);
  const t = s.thickness ?? 0;
  const sigma = s.conductivity ?? COPPER_CONDUCTIVITY;
  const lossy = sigma !== Infinity;
  if (lossy && !(t > 0)) throw new RangeError('stripline: thickness must be > 0 for a lossy conductor (DC resistance and edge loss diverge at t = 0)');
  const line = temLine(
    {
      z0Air: a.z0Air,
      q: 1,
      er: s.er,
      lossFactor: lossy ? striplineLossFactor(s.width, s.planeSpacing, t) : 0,
      rdc: lossy ? dcResistanceStrip(s.width, t, sigma) : 0,
    },
    s,
  );
  return built(line, a, a.maxFrequency, s);
}

export type CoaxSpec = CoaxGeometry & LossSpec & {
  /** Shield wall thickness (m) for its DC resistance; omitted: the shield's DC resistance is neglected. */
  shieldThickness?: number;
};

/** Coax: exact Z0; conductor loss Rs/(2π)(1/a + 1/b); DC resistance of the inner (and shield). */
export function fromCoax(s: CoaxSpec): BuiltLine<CoaxAnalysis> {
  const a = analyzeCoax(s);
  const sigma = s.conductivity ?? COPPER_CONDUCTIVITY;
  const lossy = sigma !== Infinity;
  const rdc = lossy
    ? dcResistanceRound(s.innerDiameter, sigma) + (s.shieldThickness && s.shieldThickness > 0 ? dcResistanceTube(s.shieldDiameter, s.shieldThickness, sigma) : 0)
    : 0;
  const line = temLine({ z0Air: a.z0Air, q: 1, er: s.er, lossFactor: lossy ? coaxLossFactor(s.innerDiameter, s.shieldDiameter) : 0, rdc }, s);
  return built(line, a, a.maxFrequency, s);
}

export type TwoWireSpec = TwoWireGeometry & LossSpec;

/** Two wires: exact Z0 (acosh); conductor loss with the proximity factor; DC resistance of both. */
export function fromTwoWire(s: TwoWireSpec): BuiltLine<TwoWireAnalysis> {
  const a = analyzeTwoWire(s);
  const sigma = s.conductivity ?? COPPER_CONDUCTIVITY;
  const lossy = sigma !== Infinity;
  const line = temLine(
    {
      z0Air: a.z0Air,
      q: 1,
      er: s.er,
      lossFactor: lossy ? twoWireLossFactor(s.diameter, s.spacing) : 0,
      rdc: lossy ? 2 * dcResistanceRound(s.diameter, sigma) : 0,
    },
    s,
  );
  return built(line, a, Infinity, s);
}

// ---------------------------------------------------------------------------------------------
// Builder from a datasheet

export interface DatasheetSpec {
  /** Characteristic impedance (ohm) at `at`. */
  z0: number;
  /** Phase velocity (m/s); give this or `delay`. */
  velocity?: number;
  /** Delay per length (s/m); give this or `velocity`. */
  delay?: number;
  /** Measured attenuation points: frequency (Hz) and loss (dB/m). */
  attenuation?: { at: number; loss: number }[];
  /**
   * Reference frequency (Hz) of z0, velocity and the fitted loss tangent. Default: the geometric
   * mean of the attenuation frequencies (1 GHz when there are none).
   */
  at?: number;
  /** Known DC resistance (ohm/m): fixes R_dc instead of fitting it. */
  rdc?: number;
  /** Djordjevic–Sarkar corner frequencies (Hz); defaults 1 kHz and 1 THz. */
  f1?: number;
  f2?: number;
}

export interface DatasheetFit {
  rdc: number;
  skinK: number;
  lossTangent: number;
  /** Which parameters were fitted (the others were fixed by the user or held at 0). */
  fitted: ('rdc' | 'skinK' | 'lossTangent')[];
  points: { at: number; given: number; model: number; relError: number }[];
  /** Largest and rms relative error of the attenuation at the given points. */
  maxRelError: number;
  rmsRelError: number;
}

export interface DatasheetLine {
  line: FreqLine;
  fit: DatasheetFit;
  z0: number;
  epsEff: number;
  delayPerMeter: number;
  warnings: string[];
}

type Param = 'rdc' | 'skinK' | 'lossTangent';

/**
 * A line from datasheet values: L∞ = Z0/v, C' = 1/(Z0·v) at `at`, ε' = (c0/v)² taken as the
 * dielectric's permittivity (homogeneous line), and R_dc, K, tanδ fitted by least squares to the
 * attenuation points (relative residuals), all constrained ≥ 0. The fit first solves the linear
 * low-loss model α ≈ R_dc/(2Z0) + K√(πf)/(2Z0) + π f √ε' tanδ / c0 over every subset of the free
 * parameters (keeping the best non-negative one; among equally good ones, the fewest parameters,
 * preferring skin effect, then dielectric loss, over DC resistance — R_dc is only weakly determined
 * by high-frequency points), then refines it on the exact α = Re √(Z'Y') by Gauss–Newton.
 */
export function fromDatasheet(d: DatasheetSpec): DatasheetLine {
  const warnings: string[] = [];
  if (!(d.z0 > 0)) throw new RangeError(`datasheet line: z0 must be > 0 (got ${d.z0})`);
  const hasV = d.velocity !== undefined;
  const hasD = d.delay !== undefined;
  if (hasV === hasD) throw new RangeError('datasheet line: give exactly one of velocity and delay');
  const v = hasV ? d.velocity! : 1 / d.delay!;
  if (!(v > 0) || !Number.isFinite(v)) throw new RangeError(`datasheet line: velocity must be > 0 (got ${v} m/s)`);
  const er = (C0 / v) ** 2;
  if (er < 1) throw new RangeError(`datasheet line: velocity ${v} m/s exceeds c0`);
  const points = (d.attenuation ?? []).slice().sort((p, q) => p.at - q.at);
  for (const p of points) {
    if (!(p.at > 0) || !(p.loss > 0)) throw new RangeError(`datasheet line: attenuation points need at > 0 Hz and loss > 0 dB/m (got at=${p.at}, loss=${p.loss})`);
  }
  if (d.rdc !== undefined && !(d.rdc >= 0)) throw new RangeError(`datasheet line: rdc must be ≥ 0 (got ${d.rdc})`);
  const at = d.at ?? (points.length > 0 ? Math.exp(points.reduce((s, p) => s + Math.log(p.at), 0) / points.length) : 1e9);
  const cRef = 1 / (d.z0 * v);
  const lInf = d.z0 / v;
  const cAir = cRef / er;

  const make = (rdc: number, skinK: number, lossTangent: number): FreqLine => {
    let dielectric: FreqDielectric | null = null;
    let cInf = cRef;
    if (lossTangent > 0) {
      const model = djordjevicSarkar(er, lossTangent, at, d.f1, d.f2);
      dielectric = { model, cPerEps: cAir };
      cInf = cAir * model.epsInf;
    }
    return { rdc, lInf, cInf, gdc: 0, skinK, dielectric, roughness: null, at };
  };

  const free: Param[] = (['rdc', 'skinK', 'lossTangent'] as Param[]).filter((p) => !(p === 'rdc' && d.rdc !== undefined));
  const fixedRdc = d.rdc ?? 0;
  if (points.length === 0) {
    const line = make(fixedRdc, 0, 0);
    return {
      line,
      fit: { rdc: fixedRdc, skinK: 0, lossTangent: 0, fitted: [], points: [], maxRelError: 0, rmsRelError: 0 },
      z0: d.z0,
      epsEff: er,
      delayPerMeter: 1 / v,
      warnings,
    };
  }
  if (points.length < free.length) {
    warnings.push(
      `datasheet line: ${points.length} attenuation point(s) for ${free.length} unknowns (${free.join(', ')}): the fit is underdetermined; the simplest exact fit was kept`,
    );
  }
  const alphaNp = points.map((p) => p.loss / DB_PER_NEPER);

  // Step 1: linear low-loss model, every subset of the free parameters, non-negative solutions only.
  const column = (p: Param, f: number): number =>
    p === 'rdc' ? 1 / (2 * d.z0) : p === 'skinK' ? Math.sqrt(Math.PI * f) / (2 * d.z0) : (Math.PI * f * Math.sqrt(er)) / C0;
  const rhs = points.map((p, i) => (alphaNp[i] - fixedRdc / (2 * d.z0)) / alphaNp[i]);
  const A = points.map((p, i) => free.map((q) => column(q, p.at) / alphaNp[i]));
  const preference = (subset: Param[]) =>
    subset.length * 10 + (subset.includes('rdc') ? 4 : 0) + (subset.includes('lossTangent') ? 1 : 0);
  let best: { x: number[]; subset: Param[]; res: number } | null = null;
  for (let mask = 1; mask < 1 << free.length; mask++) {
    const cols = free.map((_, j) => j).filter((j) => mask & (1 << j));
    const x = leastSquares(A, rhs, cols);
    if (cols.some((j) => !(x[j] > 0))) continue;
    let res = 0;
    A.forEach((row, i) => {
      const r = row.reduce((s, a, j) => s + a * x[j], 0) - rhs[i];
      res += r * r;
    });
    res = Math.sqrt(res / points.length);
    const subset = cols.map((j) => free[j]);
    const tie = best && Math.abs(res - best.res) <= 1e-9 + 1e-6 * best.res;
    if (!best || (!tie && res < best.res) || (tie && preference(subset) < preference(best.subset))) best = { x, subset, res };
  }
  const start: Record<Param, number> = { rdc: fixedRdc, skinK: 0, lossTangent: 0 };
  if (best) free.forEach((p, j) => (start[p] = best!.x[j] > 0 ? best!.x[j] : p === 'rdc' ? fixedRdc : 0));
  // Causality caps the loss tangent: the DS model needs ε∞ ≥ 1 (matters for air-like foam cables).
  const tanCap = dsMaxLossTangent(er, at, d.f1, d.f2) * (1 - 1e-6);
  const capped = (p: Record<Param, number>) => ({ ...p, lossTangent: Math.min(p.lossTangent, tanCap) });
  Object.assign(start, capped(start));
  // With enough points every free parameter is refined (the linear model's additive R_dc differs
  // from the exact blended form, so a parameter it drops may come back); otherwise only the subset.
  const fitted: Param[] = points.length >= free.length ? free : best ? best.subset : [];

  // Typical magnitudes: each parameter alone explaining the mean attenuation.
  const fMean = at;
  const aMean = alphaNp.reduce((s, a) => s + a, 0) / alphaNp.length;
  const typical: Record<Param, number> = {
    rdc: 2 * d.z0 * aMean,
    skinK: (2 * d.z0 * aMean) / Math.sqrt(Math.PI * fMean),
    lossTangent: (aMean * C0) / (Math.PI * fMean * Math.sqrt(er)),
  };
  // Step 2: Gauss–Newton (Levenberg-damped, projected onto ≥ 0) on the exact attenuation.
  const alphaOf = (p: Record<Param, number>) => points.map((pt) => z0AndGamma(make(p.rdc, p.skinK, p.lossTangent), pt.at).gamma.re);
  const resid = (p: Record<Param, number>) => alphaOf(p).map((a, i) => (a - alphaNp[i]) / alphaNp[i]);
  const cost = (r: number[]) => r.reduce((s, x) => s + x * x, 0);
  let p = { ...start };
  let r = resid(p);
  let lambda = 1e-3;
  for (let iter = 0; iter < 60 && fitted.length > 0; iter++) {
    const scale = fitted.map((q) => Math.max(p[q], 1e-3 * typical[q]));
    const J = r.map(() => new Array<number>(fitted.length).fill(0));
    fitted.forEach((q, j) => {
      let h = 1e-6 * scale[j];
      if (q === 'lossTangent' && p[q] + h > tanCap) h = -h;
      const rp = resid({ ...p, [q]: p[q] + h });
      rp.forEach((v, i) => (J[i][j] = ((v - r[i]) / h) * scale[j]));
    });
    // Solve (JᵀJ + λ diag(JᵀJ)) δ = −Jᵀr via augmented least squares.
    const rows: number[][] = J.map((row) => row.slice());
    const rhsGN = r.map((x) => -x);
    fitted.forEach((_, j) => {
      let n = 0;
      for (const row of J) n += row[j] * row[j];
      const row = new Array<number>(fitted.length).fill(0);
      row[j] = Math.sqrt(lambda * Math.max(n, 1e-30));
      rows.push(row);
      rhsGN.push(0);
    });
    const step = leastSquares(rows, rhsGN);
    const trial = { ...p };
    fitted.forEach((q, j) => (trial[q] = Math.max(0, p[q] + step[j] * scale[j])));
    trial.lossTangent = Math.min(trial.lossTangent, tanCap);
    const rt = resid(trial);
    if (cost(rt) < cost(r)) {
      const gain = cost(r) - cost(rt);
      p = trial;
      r = rt;
      lambda = Math.max(lambda / 3, 1e-9);
      if (gain < 1e-16) break;
    } else {
      lambda *= 4;
      if (lambda > 1e8) break;
    }
  }
  const line = make(p.rdc, p.skinK, p.lossTangent);
  const model = alphaOf(p);
  const pts = points.map((pt, i) => ({
    at: pt.at,
    given: pt.loss,
    model: model[i] * DB_PER_NEPER,
    relError: (model[i] - alphaNp[i]) / alphaNp[i],
  }));
  const maxRelError = Math.max(...pts.map((q) => Math.abs(q.relError)));
  const rmsRelError = Math.sqrt(pts.reduce((s, q) => s + q.relError * q.relError, 0) / pts.length);
  if (p.lossTangent >= tanCap * (1 - 1e-6)) {
    warnings.push(
      `datasheet line: the fitted loss tangent hit its causal limit ${tanCap.toExponential(2)} for ε′ = ${er.toFixed(3)} (a larger one would need ε∞ < 1)`,
    );
  }
  if (maxRelError > 0.05) {
    warnings.push(`datasheet line: the attenuation fit misses a given point by ${(maxRelError * 100).toFixed(1)} % (rms ${(rmsRelError * 100).toFixed(1)} %)`);
  }
  return {
    line,
    fit: { rdc: p.rdc, skinK: p.skinK, lossTangent: p.lossTangent, fitted, points: pts, maxRelError, rmsRelError },
    z0: d.z0,
    epsEff: er,
    delayPerMeter: 1 / v,
    warnings,
  };
}

/** Skin depth at f for a built line's conductor (m); 0 for a perfect conductor. */
export function builtSkinDepth(b: { conductivity: number }, f: number): number {
  return b.conductivity === Infinity ? 0 : skinDepth(f, b.conductivity);
}
