// The numbers the `line` command prints for one line: Z0, ε_eff and delay at the description's
// reference frequency, the high-frequency limit, and R′, L′, G′, C′, Z0, ε_eff, attenuation and
// skin depth at DC and at chosen frequencies. Plain data in SI units (the table and the JSON are
// both made from it).
import { skinDepth } from '../../sim/lines/conductor.js';
import { C0, DB_PER_NEPER, INCH } from '../../sim/lines/constants.js';
import { highFrequencyLimit, rlgcAt, z0AndGamma, type DatasheetFit, type FreqLine } from '../../sim/lines/freq-model.js';
import type { LineRLGC } from '../../sim/model.js';
import type { LineDescription } from '../scenario/line-geometry.js';

/** The frequencies reported when none are asked for (Hz). */
export const DEFAULT_REPORT_FREQUENCIES: readonly number[] = [100e6, 1e9, 10e9];

/** One line to report: a route item, a named line, or a description from the command line. */
export interface LineInput {
  name: string;
  /** Where it came from: "route item", "line in \"lines\"", "--microstrip". */
  origin: string;
  /** Length (m) of the route item, when it is one. */
  length?: number;
  /** The named line ("lines" entry) a route item uses. */
  lineName?: string;
  /** The per-unit-length model the engine gets. */
  rlgc: LineRLGC;
  /** The full description of a geometry or datasheet line. */
  description?: LineDescription;
}

export interface ComplexValue {
  re: number;
  im: number;
}

/** Values at one frequency (f = 0: the DC limits). */
export interface FrequencyRow {
  /** Hz; 0 for DC. */
  f: number;
  /** R′ (ohm/m), L′ (H/m), G′ (S/m), C′ (F/m). */
  r: number;
  l: number;
  g: number;
  c: number;
  /** Characteristic impedance √(Z′/Y′) (ohm); null at DC without shunt conductance (infinite). */
  z0: ComplexValue | null;
  /** Effective permittivity from the phase constant, (c0·β/ω)²; null at DC. */
  epsEff: number | null;
  /** Attenuation α = Re √(Z′Y′) in dB per metre and per inch. */
  attenuationDbPerM: number;
  attenuationDbPerIn: number;
  /** α × the route item's length (dB), when the line is a route item. */
  lossDb: number | null;
  /** Skin depth of the conductor (m); null at DC, for a perfect conductor, or when the conductor is not known (datasheet, constant R′). */
  skinDepth: number | null;
}

export interface LineReport {
  name: string;
  origin: string;
  /** "microstrip", "stripline", "coax", "twoWire", "datasheet", or "constant" (R′, L′, G′, C′ as given). */
  form: string;
  length: number | null;
  lineName: string | null;
  /** The parsed description (m, S/m, Hz, plain numbers), for geometry and datasheet lines. */
  inputs: Record<string, number | string> | null;
  /** Z0 (ohm), ε_eff and delay (s/m, s/in) at `at` — quasi-static for a geometry, as given for a datasheet, √(L′/C′) for a constant line. */
  z0: number;
  epsEff: number;
  delayPerMeter: number;
  delayPerInch: number;
  /** Reference frequency (Hz) of z0/epsEff/delay; null for a constant line (they hold at every frequency there, apart from loss). */
  at: number | null;
  /** The high-frequency limit: Z0∞ = √(L∞/C∞), v∞ = 1/√(L∞C∞). No part of an edge travels faster than v∞. */
  highFrequency: { z0: number; velocity: number; delayPerMeter: number };
  /** Upper frequency of the quasi-TEM model (Hz); null when none applies or is known. */
  maxFrequency: number | null;
  /** Conductor conductivity (S/m); null when not known; Infinity (null in JSON) is never used: see `conductor`. */
  conductivity: number | null;
  conductor: string | null;
  /** The datasheet fit: R_dc, skin coefficient, loss tangent, each point's error. */
  fit: DatasheetFit | null;
  rows: FrequencyRow[];
  warnings: string[];
}

/** A constant line as a FreqLine (no skin effect, no dielectric dispersion). */
export function constantFreqLine(l: LineRLGC): FreqLine {
  return { rdc: l.r, lInf: l.l, cInf: l.c, gdc: l.g, skinK: 0, dielectric: null, roughness: null };
}

/** The report of one line at DC and at `freqs` (Hz, > 0). */
export function evaluateLine(input: LineInput, freqs: readonly number[] = DEFAULT_REPORT_FREQUENCIES): LineReport {
  const d = input.description;
  const line = d?.line ?? constantFreqLine(input.rlgc);
  const sigma = d?.conductivity;
  const knownConductor = sigma !== undefined && sigma !== Infinity;
  const rows = [0, ...freqs].map((f): FrequencyRow => {
    const rlgc = rlgcAt(line, f);
    const p = z0AndGamma(line, f);
    const alpha = DB_PER_NEPER * p.gamma.re;
    const z0 = Number.isFinite(p.z0.re) && Number.isFinite(p.z0.im) ? { re: p.z0.re, im: p.z0.im } : null;
    return {
      f,
      ...rlgc,
      z0,
      epsEff: f > 0 ? ((C0 * p.gamma.im) / (2 * Math.PI * f)) ** 2 : null,
      attenuationDbPerM: alpha,
      attenuationDbPerIn: alpha * INCH,
      lossDb: input.length !== undefined ? alpha * input.length : null,
      skinDepth: f > 0 && knownConductor ? skinDepth(f, sigma) : null,
    };
  });
  const hf = highFrequencyLimit(line);
  const z0 = d?.z0 ?? Math.sqrt(input.rlgc.l / input.rlgc.c);
  const delayPerMeter = d?.delayPerMeter ?? Math.sqrt(input.rlgc.l * input.rlgc.c);
  const conductor = d?.inputs.conductor;
  return {
    name: input.name,
    origin: input.origin,
    form: d?.form ?? 'constant',
    length: input.length ?? null,
    lineName: input.lineName ?? null,
    inputs: d ? { ...d.inputs } : null,
    z0,
    epsEff: d?.epsEff ?? (C0 * delayPerMeter) ** 2,
    delayPerMeter,
    delayPerInch: delayPerMeter * INCH,
    at: d?.at ?? null,
    highFrequency: hf,
    maxFrequency: d?.maxFrequency !== undefined && Number.isFinite(d.maxFrequency) ? d.maxFrequency : null,
    conductivity: knownConductor ? sigma : null,
    conductor: typeof conductor === 'string' ? conductor : null,
    fit: d?.fit ?? null,
    rows,
    warnings: d ? [...d.warnings] : [],
  };
}
