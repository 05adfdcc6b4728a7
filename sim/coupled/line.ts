// Per-unit-length description of a coupled section: k conductors above one common return, with
// inductance L, capacitance C, and optional resistance R and conductance G, each a symmetric k×k
// matrix (row-major Float64Array, plain SI: H/m, F/m, ohm/m, S/m). The telegrapher equations
//   −∂V/∂z = R·I + L·∂I/∂t,   −∂I/∂z = G·V + C·∂V/∂t
// (C. R. Paul, *Analysis of Multiconductor Transmission Lines*, the MTL equations).
//
// Capacitance convention: C is the **Maxwell matrix** (Paul's "per-unit-length capacitance matrix"):
// the charge per metre on conductor i is q_i = Σ_j C_ij·V_j. Its diagonal is positive and its
// off-diagonal entries are ≤ 0. The other common convention lists the **mutual capacitances** as
// positive numbers: C_gi from conductor i to the return and C_mij ≥ 0 between conductors i and j (the
// capacitors one would draw). The rule between them:
//   Maxwell C_ii = C_gi + Σ_{j≠i} C_mij,   Maxwell C_ij = −C_mij   (i ≠ j)
//   and back: C_mij = −C_ij,  C_gi = Σ_j C_ij (the row sum).
// G follows the same convention as C (it is the dielectric's conductance between the same conductors).
import { asymmetry, cholesky, isPositiveSemiDefinite, maxAbs } from './matrix.js';
import { fastestVelocity } from './modes.js';

export interface CoupledLine {
  /** Number of conductors (≥ 1; a coupled section has ≥ 2). */
  k: number;
  /** Inductance matrix (H/m), symmetric positive definite. */
  l: Float64Array;
  /** Maxwell capacitance matrix (F/m): symmetric positive definite, C_ii > 0, C_ij ≤ 0. */
  c: Float64Array;
  /** Resistance matrix (ohm/m), symmetric positive semi-definite; absent = lossless conductors. */
  r?: Float64Array;
  /** Conductance matrix (S/m), Maxwell convention like C; absent = lossless dielectric. */
  g?: Float64Array;
}

/** A problem with a coupled description: the key (`l[0][1]`, `c`) and what is wrong. */
export interface CoupledProblem {
  path: string;
  message: string;
}

/**
 * Maxwell capacitance matrix from the mutual-capacitance convention: `toReturn[i]` = C_gi ≥ 0 (F/m),
 * `mutual` a k×k matrix with C_mij ≥ 0 off the diagonal (its diagonal is ignored).
 */
export function maxwellFromMutual(toReturn: ArrayLike<number>, mutual: Float64Array): Float64Array {
  const k = toReturn.length;
  const c = new Float64Array(k * k);
  for (let i = 0; i < k; i++) {
    let self = toReturn[i];
    for (let j = 0; j < k; j++) {
      if (j === i) continue;
      self += mutual[i * k + j];
      c[i * k + j] = -mutual[i * k + j];
    }
    c[i * k + i] = self;
  }
  return c;
}

/** The mutual-capacitance convention of a Maxwell matrix: capacitance to the return (row sums) and between conductors (−C_ij). */
export function mutualFromMaxwell(c: Float64Array, k: number): { toReturn: Float64Array; mutual: Float64Array } {
  const toReturn = new Float64Array(k);
  const mutual = new Float64Array(k * k);
  for (let i = 0; i < k; i++)
    for (let j = 0; j < k; j++) {
      toReturn[i] += c[i * k + j];
      if (j !== i) mutual[i * k + j] = -c[i * k + j];
    }
  return { toReturn, mutual };
}

export interface PairModes {
  /** Odd- and even-mode impedances (ohm): what one line sees when the pair is driven (+, −) and (+, +). */
  zOdd: number;
  zEven: number;
  /** Odd- and even-mode delays per length (s/m) = 1/velocity. */
  delayOdd: number;
  delayEven: number;
}

/**
 * L and C of a symmetric pair from its odd and even modes. With V2 = ∓V1 and I2 = ∓I1 each line obeys
 * a single-line telegrapher equation with L11 ∓ L12 and C11 ∓ C12, so Z = √((L11 ∓ L12)/(C11 ∓ C12)) and
 * delay = √((L11 ∓ L12)(C11 ∓ C12)) (Paul; the odd/even analysis of symmetric coupled lines, Pozar,
 * *Microwave Engineering*, coupled lines). Hence L11 ∓ L12 = Z·delay and C11 ∓ C12 = delay/Z:
 *   L11 = (Z_e·τ_e + Z_o·τ_o)/2,  L12 = (Z_e·τ_e − Z_o·τ_o)/2,
 *   C11 = (τ_e/Z_e + τ_o/Z_o)/2,  C12 = (τ_e/Z_e − τ_o/Z_o)/2  (Maxwell; ≤ 0 when τ_o/Z_o ≥ τ_e/Z_e).
 */
export function pairFromModes(m: PairModes): CoupledLine {
  const le = m.zEven * m.delayEven;
  const lo = m.zOdd * m.delayOdd;
  const ce = m.delayEven / m.zEven;
  const co = m.delayOdd / m.zOdd;
  return {
    k: 2,
    l: Float64Array.from([(le + lo) / 2, (le - lo) / 2, (le - lo) / 2, (le + lo) / 2]),
    c: Float64Array.from([(ce + co) / 2, (ce - co) / 2, (ce - co) / 2, (ce + co) / 2]),
  };
}

/** Problems of a pair-modes description (each value positive and finite, Z_odd ≤ Z_even). */
export function pairModesProblems(m: PairModes): CoupledProblem[] {
  const out: CoupledProblem[] = [];
  for (const key of ['zOdd', 'zEven', 'delayOdd', 'delayEven'] as const) {
    if (!(m[key] > 0) || !Number.isFinite(m[key])) out.push({ path: key, message: `${m[key]} — expected a positive finite number` });
  }
  if (out.length === 0 && m.zOdd > m.zEven) {
    out.push({ path: 'zOdd', message: `Z_odd ${fmt(m.zOdd)} ohm exceeds Z_even ${fmt(m.zEven)} ohm: coupled lines have Z_odd ≤ Z_even (did you swap them?)` });
  }
  return out;
}

const C0 = 299_792_458;

function fmt(x: number): string {
  return Number.isFinite(x) ? String(Number(x.toPrecision(5))) : String(x);
}

function entryPath(name: string, r: number, c: number): string {
  return `${name}[${r}][${c}]`;
}

function checkMatrixShape(name: string, m: Float64Array | undefined, k: number, out: CoupledProblem[]): boolean {
  if (!m) return false;
  if (m.length !== k * k) {
    out.push({ path: name, message: `has ${m.length} entries — expected ${k}×${k} = ${k * k}` });
    return false;
  }
  for (let i = 0; i < m.length; i++) {
    if (!Number.isFinite(m[i])) {
      out.push({ path: entryPath(name, Math.floor(i / k), i % k), message: `${m[i]} — expected a finite number` });
      return false;
    }
  }
  const asym = asymmetry(m, k);
  if (asym) {
    const { r, c } = asym;
    out.push({ path: entryPath(name, r, c), message: `${m[r * k + c]} differs from ${entryPath(name, c, r)} = ${m[c * k + r]} — the matrix must be symmetric` });
    return false;
  }
  return true;
}

/** Maxwell sign pattern of C or G: positive (C) or non-negative (G) diagonal, non-positive off-diagonal. */
function checkMaxwellSigns(name: string, m: Float64Array, k: number, strictDiagonal: boolean, out: CoupledProblem[]): void {
  for (let i = 0; i < k; i++) {
    const d = m[i * k + i];
    if (strictDiagonal ? !(d > 0) : !(d >= 0)) out.push({ path: entryPath(name, i, i), message: `${d} — the diagonal must be ${strictDiagonal ? 'positive' : '≥ 0'}` });
    for (let j = i + 1; j < k; j++) {
      if (m[i * k + j] > 0) {
        out.push({
          path: entryPath(name, i, j),
          message:
            `${m[i * k + j]} is positive — ${name} is the Maxwell matrix, whose off-diagonal entries are ≤ 0. ` +
            `From mutual capacitances C_m ≥ 0 write −C_m off the diagonal and C_ground + ΣC_m on it (docs/coupled-lines.md)`,
        });
      }
    }
  }
}

/**
 * Every problem with a coupled description: matrix sizes, finite entries, symmetry, L and C positive
 * definite, the Maxwell sign pattern of C and G, R and G positive semi-definite, and no mode faster
 * than light (c0 = 299 792 458 m/s; a mode faster than that means the coupling entered is impossible).
 */
export function coupledLineProblems(line: CoupledLine): CoupledProblem[] {
  const out: CoupledProblem[] = [];
  const { k } = line;
  if (!Number.isInteger(k) || k < 1) return [{ path: 'k', message: `${k} — expected a whole number of conductors ≥ 1` }];
  const lOk = checkMatrixShape('l', line.l, k, out);
  const cOk = checkMatrixShape('c', line.c, k, out);
  if (lOk && !cholesky(line.l, k)) out.push({ path: 'l', message: 'is not positive definite — an inductance matrix must be (every L_ii > 0 and |L_ij| small enough that LᵢᵢLⱼⱼ > L_ij²)' });
  if (cOk) {
    checkMaxwellSigns('c', line.c, k, true, out);
    if (!cholesky(line.c, k)) out.push({ path: 'c', message: 'is not positive definite — a Maxwell capacitance matrix must be' });
  }
  if (line.r && checkMatrixShape('r', line.r, k, out) && !isPositiveSemiDefinite(line.r, k)) {
    out.push({ path: 'r', message: 'is not positive semi-definite — a resistance matrix that is not would create energy' });
  }
  if (line.g && checkMatrixShape('g', line.g, k, out)) {
    checkMaxwellSigns('g', line.g, k, false, out);
    if (!isPositiveSemiDefinite(line.g, k)) out.push({ path: 'g', message: 'is not positive semi-definite — a conductance matrix that is not would create energy' });
  }
  if (out.length === 0) {
    const vMax = fastestVelocity(line);
    if (vMax > C0 * (1 + 1e-6)) {
      out.push({
        path: 'l',
        message: `with this C the fastest mode travels at ${fmt(vMax / C0)}c — faster than light, so the coupling entered is not physical (check the units and the sign convention of C)`,
      });
    }
  }
  return out;
}

/** Warnings (not errors): a Maxwell C whose row sum is negative means a negative capacitance to the return. */
export function coupledLineWarnings(line: CoupledLine): string[] {
  const out: string[] = [];
  const { k, c } = line;
  const scale = maxAbs(c);
  for (let i = 0; i < k; i++) {
    let sum = 0;
    for (let j = 0; j < k; j++) sum += c[i * k + j];
    if (sum < -1e-9 * scale) out.push(`c: row ${i} sums to ${fmt(sum)} F/m — a negative capacitance to the return; the Maxwell matrix of real conductors is diagonally dominant`);
  }
  return out;
}
