// The `line` report of a coupled section: L and C matrices (Maxwell, and the mutual-capacitance form),
// the modes (velocity, ε_eff, pattern, what each conductor sees), Z_C, and for a pair Z_odd, Z_even,
// Z_diff, Z_comm, K_b and K_f. Plain data in SI units; the text and JSON are made from it. Sections come
// from the command line (`--coupled-microstrip`, `--coupled-stripline`, `--coupled-modes`); coupled
// sections in scenario files arrive with multi-net scenarios (not yet).
import { coupledFromMicrostrip, coupledFromStripline } from '../../sim/coupled/geometry.js';
import { coupledLineProblems, coupledLineWarnings, mutualFromMaxwell, pairFromModes, pairModesProblems, type CoupledLine } from '../../sim/coupled/line.js';
import { toRows } from '../../sim/coupled/matrix.js';
import { modalAnalysis, pairMetrics, type PairMetrics } from '../../sim/coupled/modes.js';
import { C0 } from '../../sim/lines/constants.js';
import { joinKey, Problems, ScenarioError, type Problem } from '../scenario/problems.js';
import { parseQuantity, POSITIVE, type Dimension, type Range } from '../units.js';

export type CoupledForm = 'coupled-microstrip' | 'coupled-stripline' | 'coupled-modes';
export const COUPLED_OPTIONS: readonly CoupledForm[] = ['coupled-microstrip', 'coupled-stripline', 'coupled-modes'];

export interface CoupledInput {
  name: string;
  /** Where it came from: "--coupled-microstrip". */
  origin: string;
  form: CoupledForm | 'matrices';
  line: CoupledLine;
  /** The parsed inputs (m, ohm, s/m, plain numbers). */
  inputs: Record<string, number>;
  /** Out-of-range warnings of the geometry's formulas, and warnings about the matrices. */
  warnings: string[];
  /** Upper frequency of the quasi-TEM model (Hz), when known. */
  maxFrequency?: number;
}

export interface CoupledModeReport {
  /** "odd"/"even" for a symmetric pair, else "mode 1", "mode 2", … (fastest first). */
  label: string;
  velocity: number;
  delayPerMeter: number;
  /** (c0/v)². */
  epsEff: number;
  /** Voltage pattern, largest entry +1. */
  pattern: number[];
  /** What each conductor sees in this mode alone (ohm); null where it carries no current. */
  impedance: (number | null)[];
}

export interface CoupledReport {
  name: string;
  origin: string;
  form: string;
  k: number;
  inputs: Record<string, number>;
  /** Per-unit-length matrices (H/m, Maxwell F/m, ohm/m, S/m); r and g null when absent. */
  l: number[][];
  c: number[][];
  r: number[][] | null;
  g: number[][] | null;
  /** The same C as capacitances to the return and between conductors (F/m, ≥ 0 for real conductors). */
  capacitanceToReturn: number[];
  capacitanceBetween: number[][];
  modes: CoupledModeReport[];
  /** Characteristic impedance matrix (ohm). */
  zc: number[][];
  /** Pair metrics for every pair of conductors (one for k = 2). */
  pairs: PairMetrics[];
  /** The fastest mode: it limits the time step of a run (Courant). */
  fastestVelocity: number;
  maxFrequency: number | null;
  warnings: string[];
}

/** The report of one coupled section. Throws ScenarioError-like problems through `coupledLineProblems` first. */
export function evaluateCoupled(input: CoupledInput): CoupledReport {
  const { line } = input;
  const { k } = line;
  const modal = modalAnalysis(line);
  const pairs: PairMetrics[] = [];
  for (let i = 0; i < k; i++) for (let j = i + 1; j < k; j++) pairs.push(pairMetrics(line, modal, i, j));
  const symmetricPair = k === 2 && pairs[0].symmetric;
  const modes = modal.modes.map((m, n): CoupledModeReport => {
    const pattern = Array.from(m.voltage);
    let label = `mode ${n + 1}`;
    if (symmetricPair) label = pattern[1] < 0 ? 'odd' : 'even';
    return { label, velocity: m.velocity, delayPerMeter: m.delay, epsEff: (C0 / m.velocity) ** 2, pattern, impedance: m.impedance };
  });
  const mutual = mutualFromMaxwell(line.c, k);
  return {
    name: input.name,
    origin: input.origin,
    form: input.form,
    k,
    inputs: { ...input.inputs },
    l: toRows(line.l, k),
    c: toRows(line.c, k),
    r: line.r ? toRows(line.r, k) : null,
    g: line.g ? toRows(line.g, k) : null,
    capacitanceToReturn: Array.from(mutual.toReturn),
    capacitanceBetween: toRows(mutual.mutual, k),
    modes,
    zc: toRows(modal.zc, k),
    pairs,
    fastestVelocity: modal.fastestVelocity,
    maxFrequency: input.maxFrequency !== undefined && Number.isFinite(input.maxFrequency) ? input.maxFrequency : null,
    warnings: [...input.warnings],
  };
}

interface KeySpec {
  dim: Dimension;
  range: Range;
  example: string;
}

const LEN: KeySpec = { dim: 'length', range: POSITIVE, example: '5mil' };
const ER: KeySpec = { dim: 'number', range: { min: 1 }, example: '4.3' };
const OHM: KeySpec = { dim: 'resistance', range: POSITIVE, example: '45ohm' };
const DELAY: KeySpec = { dim: 'delayPerLength', range: POSITIVE, example: '150ps/in' };
const SPEED: KeySpec = { dim: 'velocity', range: POSITIVE, example: '0.55c' };

/** Keys of each command-line form (all required, except that a mode takes a delay or a velocity). */
export const COUPLED_KEYS: Readonly<Record<CoupledForm, Readonly<Record<string, KeySpec>>>> = {
  'coupled-microstrip': { width: LEN, spacing: LEN, height: LEN, er: ER },
  'coupled-stripline': { width: LEN, spacing: LEN, planeSpacing: LEN, er: ER },
  'coupled-modes': { zOdd: OHM, zEven: OHM, delayOdd: DELAY, delayEven: DELAY, velocityOdd: SPEED, velocityEven: SPEED },
};

const EXAMPLES: Readonly<Record<CoupledForm, string>> = {
  'coupled-microstrip': 'width=5mil,spacing=6mil,height=4mil,er=4.2',
  'coupled-stripline': 'width=4mil,spacing=5mil,planeSpacing=12mil,er=4.3',
  'coupled-modes': 'zOdd=45ohm,zEven=56ohm,delayOdd=150ps/in,delayEven=160ps/in',
};

function readPairs(form: CoupledForm, text: string, problems: Problems): Record<string, number> {
  const where = `--${form}`;
  const keys = COUPLED_KEYS[form];
  const out: Record<string, number> = Object.create(null);
  for (const piece of text.split(',')) {
    const t = piece.trim();
    if (t === '') continue;
    const eq = t.indexOf('=');
    const key = eq > 0 ? t.slice(0, eq).trim() : '';
    const value = eq > 0 ? t.slice(eq + 1).trim() : t;
    if (!Object.hasOwn(keys, key)) {
      problems.add(eq > 0 ? joinKey(where, key) : where, t, `key=value pairs separated by commas, like ${EXAMPLES[form]} (keys: ${Object.keys(keys).join(', ')})`);
      continue;
    }
    if (Object.hasOwn(out, key)) {
      problems.add(joinKey(where, key), value, `each key once ("${key}" is given twice)`);
      continue;
    }
    const spec = keys[key];
    const q = parseQuantity(value, spec.dim, spec.range, spec.example);
    if (q.ok) out[key] = q.value;
    else problems.add(joinKey(where, key), value, q.expected);
  }
  return out;
}

function require(form: CoupledForm, got: Record<string, number>, names: string[], problems: Problems): boolean {
  let ok = true;
  for (const n of names) {
    if (Object.hasOwn(got, n)) continue;
    const spec = COUPLED_KEYS[form][n];
    problems.add(joinKey(`--${form}`, n), undefined, `${n}, like ${n}=${spec.example}`);
    ok = false;
  }
  return ok;
}

/** One mode's delay per metre from delayX or velocityX (exactly one of them). */
function modeDelay(got: Record<string, number>, mode: 'Odd' | 'Even', problems: Problems): number | undefined {
  const d = got[`delay${mode}`];
  const v = got[`velocity${mode}`];
  const where = '--coupled-modes';
  if (d !== undefined && v !== undefined) problems.add(joinKey(where, `velocity${mode}`), v, `either delay${mode} or velocity${mode}, not both`);
  else if (d === undefined && v === undefined) problems.add(joinKey(where, `delay${mode}`), undefined, `delay${mode} (like delay${mode}=150ps/in) or velocity${mode} (like velocity${mode}=0.55c)`);
  return d ?? (v !== undefined ? 1 / v : undefined);
}

/** A coupled section from `key=value,…` on the command line; ScenarioError naming the option, the key and what was expected. */
export function coupledFromOption(form: CoupledForm, text: string, name: string = form): { input: CoupledInput; warnings: Problem[] } {
  const problems = new Problems('(command line)');
  const got = readPairs(form, text, problems);
  const origin = `--${form}`;
  let input: CoupledInput | undefined;
  if (form === 'coupled-modes') {
    const zOk = require(form, got, ['zOdd', 'zEven'], problems);
    const delayOdd = modeDelay(got, 'Odd', problems);
    const delayEven = modeDelay(got, 'Even', problems);
    if (zOk && delayOdd !== undefined && delayEven !== undefined && problems.count === 0) {
      const modes = { zOdd: got.zOdd, zEven: got.zEven, delayOdd, delayEven };
      for (const p of pairModesProblems(modes)) problems.add(joinKey(origin, p.path), got[p.path], p.message);
      if (problems.count === 0) input = { name, origin, form, line: pairFromModes(modes), inputs: { ...modes }, warnings: [] };
    }
  } else if (require(form, got, Object.keys(COUPLED_KEYS[form]), problems) && problems.count === 0) {
    if (form === 'coupled-microstrip') {
      const g = { width: got.width, spacing: got.spacing, height: got.height, er: got.er };
      const { line, analysis } = coupledFromMicrostrip(g);
      input = { name, origin, form, line, inputs: { ...g }, warnings: analysis.validity.warnings, maxFrequency: analysis.maxFrequency };
    } else {
      const g = { width: got.width, spacing: got.spacing, planeSpacing: got.planeSpacing, er: got.er };
      const { line, analysis } = coupledFromStripline(g);
      input = { name, origin, form, line, inputs: { ...g }, warnings: analysis.validity.warnings };
    }
  }
  if (input) for (const p of coupledLineProblems(input.line)) problems.add(joinKey(origin, p.path), '(derived)', p.message);
  if (input) input.warnings.push(...coupledLineWarnings(input.line));
  if (!input || problems.count > 0) throw new ScenarioError(problems.sorted(), problems.warnings);
  return { input, warnings: input.warnings.map((w) => ({ file: '(command line)', path: origin, value: text, expected: `a description inside the model's range of validity — ${w}` })) };
}
