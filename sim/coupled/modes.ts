// Modal analysis of a lossless coupled section (C. R. Paul, *Analysis of Multiconductor Transmission
// Lines*, the modal decoupling of lossless lines): with C = U·θ²·Uᵀ (U orthogonal) and the symmetric
// M = θ·Uᵀ·L·U·θ = S·Λ²·Sᵀ (S orthogonal),
//   T_V = U·θ⁻¹·S diagonalises L·C:  L·C·T_V = T_V·Λ²,   T_I = U·θ·S diagonalises C·L,   T_Iᵀ·T_V = 1,
// each mode m travels at v_m = 1/λ_m, and the characteristic impedance matrix (V = Z_C·I for waves
// travelling towards +z) is Z_C = U·θ⁻¹·S·Λ·Sᵀ·θ⁻¹·Uᵀ. Uses R and G not at all (loss is small at the
// edge rates these numbers describe; the spectral solver treats it exactly).
//
// For a pair: Z_diff is the impedance a differential current (+I, −I) sees, V1 − V2 = Z_diff·I, and
// Z_comm the impedance a common current (I/2, I/2) sees, (V1 + V2)/2 = Z_comm·I:
//   Z_diff = Z_C11 + Z_C22 − 2·Z_C12,   Z_comm = (Z_C11 + Z_C22 + 2·Z_C12)/4,
// which for a symmetric pair are exactly 2·Z_odd and Z_even/2 (Z_C11 = (Z_e + Z_o)/2, Z_C12 = (Z_e − Z_o)/2).
// Coupling coefficients of a weakly coupled, matched pair (S. H. Hall and H. L. Heck, *Advanced Signal
// Integrity for High-Speed Digital Designs*, crosstalk; H. Johnson and M. Graham, *High-Speed Digital
// Design*, crosstalk), with L_m/L = L12/√(L11·L22) and C_m/C = −C12/√(C11·C22) (Maxwell C12 ≤ 0):
//   K_b = ¼·(L_m/L + C_m/C)      near-end plateau ≈ K_b·ΔV
//   K_f = ½·(C_m/C − L_m/L)      far-end pulse ≈ K_f·TD·dV/dt, its area ≈ K_f·TD·ΔV, TD = ℓ·√(L11·C11)
// (K_f = 0 in a homogeneous medium, negative on microstrip).
import type { CoupledLine } from './line.js';
import { cholesky, matmul, symmetricEigen, transpose } from './matrix.js';

export interface Mode {
  /** Velocity (m/s) and its reciprocal, the delay per metre (s/m). */
  velocity: number;
  delay: number;
  /** Voltage pattern of the mode (a column of T_V), scaled so its largest entry is +1. */
  voltage: Float64Array;
  /** The matching current pattern of a wave travelling towards +z: Z_C⁻¹·voltage (A per V of the pattern). */
  current: Float64Array;
  /** What each conductor sees in this mode alone, V_j/I_j (ohm); null where the conductor carries no current. */
  impedance: (number | null)[];
}

export interface ModalAnalysis {
  k: number;
  /** Fastest first. */
  modes: Mode[];
  /** Characteristic impedance matrix Z_C (ohm) and its inverse Y_C (S). */
  zc: Float64Array;
  yc: Float64Array;
  /** T_V and T_I (columns in the order of `modes`), T_Iᵀ·T_V = 1. */
  tv: Float64Array;
  ti: Float64Array;
  /** The fastest mode's velocity (m/s): it sets the Courant limit of the section. */
  fastestVelocity: number;
}

/** The pieces of Paul's decomposition: U, θ (as the diagonal), S and λ (ascending: fastest first). */
function decompose(line: CoupledLine): { u: Float64Array; theta: Float64Array; s: Float64Array; lambda: Float64Array } {
  const { k } = line;
  const ce = symmetricEigen(line.c, k);
  const u = ce.vectors;
  const theta = Float64Array.from(ce.values, (x) => Math.sqrt(x));
  // M = θ·Uᵀ·L·U·θ
  const ulu = matmul(matmul(transpose(u, k), line.l, k), u, k);
  const m = new Float64Array(k * k);
  for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) m[i * k + j] = theta[i] * ulu[i * k + j] * theta[j];
  const me = symmetricEigen(m, k);
  return { u, theta, s: me.vectors, lambda: Float64Array.from(me.values, (x) => Math.sqrt(x)) };
}

/** The fastest mode's velocity (m/s). L and C must be symmetric positive definite. */
export function fastestVelocity(line: CoupledLine): number {
  return 1 / decompose(line).lambda[0];
}

/** Delay per metre of the fastest mode (s/m): the discretizer's Courant limit is Δz ≥ Δt/this. */
export function fastestDelayPerLength(line: CoupledLine): number {
  return decompose(line).lambda[0];
}

/** Modal velocities, patterns, impedances and Z_C of a coupled section (L, C symmetric positive definite). */
export function modalAnalysis(line: CoupledLine): ModalAnalysis {
  const { k } = line;
  if (!cholesky(line.l, k) || !cholesky(line.c, k)) throw new RangeError('modalAnalysis: L and C must be symmetric positive definite');
  const { u, theta, s, lambda } = decompose(line);
  const tv = new Float64Array(k * k);
  const ti = new Float64Array(k * k);
  for (let i = 0; i < k; i++)
    for (let j = 0; j < k; j++) {
      let a = 0;
      let b = 0;
      for (let p = 0; p < k; p++) {
        a += (u[i * k + p] / theta[p]) * s[p * k + j];
        b += u[i * k + p] * theta[p] * s[p * k + j];
      }
      tv[i * k + j] = a; // T_V = U·θ⁻¹·S
      ti[i * k + j] = b; // T_I = U·θ·S
    }
  // Z_C = T_V·Λ·T_Vᵀ and Y_C = T_I·Λ⁻¹·T_Iᵀ (T_V⁻¹ = T_Iᵀ)
  const zc = new Float64Array(k * k);
  const yc = new Float64Array(k * k);
  for (let i = 0; i < k; i++)
    for (let j = 0; j < k; j++) {
      let z = 0;
      let y = 0;
      for (let m = 0; m < k; m++) {
        z += tv[i * k + m] * lambda[m] * tv[j * k + m];
        y += (ti[i * k + m] / lambda[m]) * ti[j * k + m];
      }
      zc[i * k + j] = z;
      yc[i * k + j] = y;
    }
  const modes = [...lambda].map((lam, m): Mode => {
    const voltage = Float64Array.from({ length: k }, (_, i) => tv[i * k + m]);
    let big = 0;
    for (const x of voltage) if (Math.abs(x) > Math.abs(big) * (1 + 1e-12)) big = x;
    for (let i = 0; i < k; i++) voltage[i] /= big;
    const current = new Float64Array(k);
    for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) current[i] += yc[i * k + j] * voltage[j];
    const impedance = [...voltage].map((v, i) => (Math.abs(current[i]) > 1e-12 * maxEntry(current) ? v / current[i] : null));
    return { velocity: 1 / lam, delay: lam, voltage, current, impedance };
  });
  return { k, modes, zc, yc, tv, ti, fastestVelocity: 1 / lambda[0] };
}

function maxEntry(x: Float64Array): number {
  let m = 0;
  for (const v of x) m = Math.max(m, Math.abs(v));
  return m;
}

export interface PairMetrics {
  /** Conductors of the pair. */
  i: number;
  j: number;
  /** True when L and C are symmetric in the pair's two conductors (L11 = L22, C11 = C22) and k = 2: odd and even are then its modes. */
  symmetric: boolean;
  /** Z_diff/2 and 2·Z_comm: the odd- and even-mode impedances of a symmetric pair (ohm). */
  zOdd: number;
  zEven: number;
  /** Differential and common-mode impedances (ohm). */
  zDiff: number;
  zComm: number;
  /** Odd- and even-mode velocities (m/s) of a symmetric pair; null otherwise. */
  velocityOdd: number | null;
  velocityEven: number | null;
  /** L_m/L and C_m/C (Maxwell C12 ≤ 0, so C_m = −C12). */
  inductiveRatio: number;
  capacitiveRatio: number;
  /** Backward (near-end) and forward (far-end) coupling coefficients, see the header. */
  kb: number;
  kf: number;
}

/** Pair metrics of conductors i and j, from Z_C and the matrices (see the header for definitions). */
export function pairMetrics(line: CoupledLine, modal: ModalAnalysis = modalAnalysis(line), i = 0, j = 1): PairMetrics {
  const { k, l, c } = line;
  const z = modal.zc;
  const zDiff = z[i * k + i] + z[j * k + j] - 2 * z[i * k + j];
  const zComm = (z[i * k + i] + z[j * k + j] + 2 * z[i * k + j]) / 4;
  const near = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(a), Math.abs(b));
  const symmetric = k === 2 && near(l[0], l[3]) && near(c[0], c[3]);
  const inductiveRatio = l[i * k + j] / Math.sqrt(l[i * k + i] * l[j * k + j]);
  const capacitiveRatio = -c[i * k + j] / Math.sqrt(c[i * k + i] * c[j * k + j]);
  let velocityOdd: number | null = null;
  let velocityEven: number | null = null;
  if (symmetric) {
    velocityOdd = 1 / Math.sqrt((l[0] - l[1]) * (c[0] - c[1]));
    velocityEven = 1 / Math.sqrt((l[0] + l[1]) * (c[0] + c[1]));
  }
  return {
    i,
    j,
    symmetric,
    zOdd: zDiff / 2,
    zEven: 2 * zComm,
    zDiff,
    zComm,
    velocityOdd,
    velocityEven,
    inductiveRatio,
    capacitiveRatio,
    kb: (inductiveRatio + capacitiveRatio) / 4,
    kf: (capacitiveRatio - inductiveRatio) / 2,
  };
}
