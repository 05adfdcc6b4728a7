// The leapfrog update of a coupled section of k conductors (C. R. Paul, *Analysis of Multiconductor
// Transmission Lines*, the FDTD chapter): the single-line update with every coefficient a k×k matrix.
// Per cell (node n → n+1) and per interior node, with R and G averaged over the step as in the
// single-line kernel (line-kernel.ts):
//   (L·Δz/Δt + R·Δz/2)·I(n+½) = (L·Δz/Δt − R·Δz/2)·I(n−½) + V_n(n) − V_n+1(n)
//   (C·Δz/Δt + G·Δz/2)·V(n+1) = (C·Δz/Δt − G·Δz/2)·V(n)   + I_in(n+½) − I_out(n+½)
// so I′ = A·I + B·ΔV and V′ = C·V + D·ΔI with A = M_I⁻¹·(L·Δz/Δt − R·Δz/2), B = M_I⁻¹, and the same for
// the nodes. The cells of a section are identical: one set of four matrices per section, built once.
// Stability: Δt ≤ Δz/v_max, v_max the fastest mode's velocity (modes.ts) — not the conductors' self
// velocities 1/√(L_ii·C_ii), which can be slower (the odd mode of a microstrip pair is faster).
//
// Storage is conductor-interleaved: node n, conductor c at v[n·k + c]; cell n, conductor c at i[n·k + c].
// The end nodes (n = 0 and n = cells) belong to whoever joins the section to the rest of the circuit:
// each step copies them in from the caller's array (`nearNodes`, `farNodes`), advances every current
// and interior node, and leaves the end nodes' update to the caller, who sees the end cells' currents
// (`i[c]` leaves near node c into the section, `i[(cells − 1)·k + c]` arrives at far node c) and the
// half-cell load of each end (`endLoad`).
import { NetError } from '../errors.js';
import type { CoupledLine } from './line.js';
import { coupledLineProblems } from './line.js';
import { identity, solveMatrix } from './matrix.js';
import { modalAnalysis } from './modes.js';

export interface CoupledSection {
  k: number;
  cells: number;
  /** Cell length Δz (m) and time step Δt (s). */
  cellLength: number;
  dt: number;
  /** Courant number v_m·Δt/Δz of each mode, fastest first (all ≤ 1). */
  courant: Float64Array;
  /** Node voltages, (cells + 1)·k, interleaved; the end nodes are the copies used by the last step. */
  v: Float64Array;
  /** Cell currents, cells·k, interleaved: cell n flows from node n to node n + 1. */
  i: Float64Array;
  /** A, B (cells), C, D (interior nodes): four row-major k×k blocks. */
  coef: Float64Array;
  /** Where the end nodes live in the caller's voltage array (conductor order). */
  nearNodes: Int32Array;
  farNodes: Int32Array;
  /** Half a cell's C·Δz and G·Δz (k×k, Maxwell): what each end node group carries from this section. */
  endLoad: { c: Float64Array; g: Float64Array };
  /** Scratch for the general-k update (old node voltages, left and right currents). */
  scratch: Float64Array;
}

export interface CoupledCellPlan {
  /** Number of cells and their length (m). */
  cells: number;
  cellLength: number;
  /** One-way delay of the fastest mode over the section (s): the discretizer's "segment delay". */
  fastestDelay: number;
  /** Courant number of each mode, fastest first. */
  courant: number[];
}

/** One-way delay of the section's fastest mode (s): what the discretizer treats as the segment's delay. */
export function coupledFastestDelay(line: CoupledLine, length: number): number {
  return length / modalAnalysis(line).fastestVelocity;
}

/**
 * Cells for a given Δt: as many as the fastest mode's Courant limit allows, N = ⌊TD_fast/Δt⌋ (at least
 * one), so the fastest mode runs at a Courant number as close to 1 as it can be and every slower mode below it.
 */
export function planCoupledCells(line: CoupledLine, length: number, dt: number): CoupledCellPlan {
  if (!(length > 0) || !(dt > 0)) throw new RangeError(`planCoupledCells: need length > 0 and dt > 0 (got ${length}, ${dt})`);
  const modal = modalAnalysis(line);
  const fastestDelay = length / modal.fastestVelocity;
  const cells = Math.max(1, Math.floor(fastestDelay / dt + 1e-9));
  const cellLength = length / cells;
  return { cells, cellLength, fastestDelay, courant: modal.modes.map((m) => (m.velocity * dt) / cellLength) };
}

/** The four coefficient blocks (A, B, C, D) of a cell and an interior node. */
export function coupledCoefficients(line: CoupledLine, cellLength: number, dt: number): Float64Array {
  const { k } = line;
  const kk = k * k;
  const dz = cellLength;
  const mI = new Float64Array(kk);
  const nI = new Float64Array(kk);
  const mV = new Float64Array(kk);
  const nV = new Float64Array(kk);
  for (let e = 0; e < kk; e++) {
    // the same expressions, in the same order, as the single-line kernel's a, b, c, d
    const l = line.l[e] * dz;
    const r = (line.r?.[e] ?? 0) * dz;
    const c = line.c[e] * dz;
    const g = (line.g?.[e] ?? 0) * dz;
    mI[e] = l / dt + r / 2;
    nI[e] = l / dt - r / 2;
    mV[e] = c / dt + g / 2;
    nV[e] = c / dt - g / 2;
  }
  const coef = new Float64Array(4 * kk);
  coef.set(solveMatrix(mI, nI, k, k), 0);
  coef.set(solveMatrix(mI, identity(k), k, k), kk);
  coef.set(solveMatrix(mV, nV, k, k), 2 * kk);
  coef.set(solveMatrix(mV, identity(k), k, k), 3 * kk);
  return coef;
}

export interface CoupledSectionOptions {
  /** Where the end nodes live in the caller's voltage array; default near = 0…k−1, far = k…2k−1. */
  nearNodes?: ArrayLike<number>;
  farNodes?: ArrayLike<number>;
}

/**
 * A coupled section ready to step: validates the description (NetError listing every problem, keys
 * under `path`) and refuses a Δt above the fastest mode's Courant limit.
 */
export function buildCoupledSection(line: CoupledLine, length: number, cells: number, dt: number, opts: CoupledSectionOptions = {}, path = 'coupled'): CoupledSection {
  const problems = coupledLineProblems(line).map((p) => ({ path: `${path}.${p.path}`, message: p.message }));
  if (!(length > 0) || !Number.isFinite(length)) problems.push({ path: `${path}.length`, message: `${length} — expected a length > 0` });
  if (!Number.isInteger(cells) || cells < 1) problems.push({ path: `${path}.cells`, message: `${cells} — expected a whole number ≥ 1` });
  if (problems.length) throw new NetError(problems);
  const { k } = line;
  const cellLength = length / cells;
  const modal = modalAnalysis(line);
  const courant = Float64Array.from(modal.modes, (m) => (m.velocity * dt) / cellLength);
  if (courant[0] > 1 + 1e-9) {
    throw new NetError([
      {
        path,
        message: `Δt ${dt.toPrecision(4)} s is too long for ${cells} cells: the fastest mode (${modal.fastestVelocity.toPrecision(5)} m/s) would run at Courant ${courant[0].toFixed(4)} > 1 and the update would diverge; use at most ${Math.floor((length / modal.fastestVelocity / dt) * (1 + 1e-12))} cells or Δt ≤ ${(cellLength / modal.fastestVelocity).toPrecision(4)} s`,
      },
    ]);
  }
  const half = (m: Float64Array | undefined) => Float64Array.from(m ?? new Float64Array(k * k), (x) => (x * cellLength) / 2);
  return {
    k,
    cells,
    cellLength,
    dt,
    courant,
    v: new Float64Array((cells + 1) * k),
    i: new Float64Array(cells * k),
    coef: coupledCoefficients(line, cellLength, dt),
    nearNodes: Int32Array.from(opts.nearNodes ?? Array.from({ length: k }, (_, c) => c)),
    farNodes: Int32Array.from(opts.farNodes ?? Array.from({ length: k }, (_, c) => k + c)),
    endLoad: { c: half(line.c), g: half(line.g) },
    scratch: new Float64Array(4 * k),
  };
}

/**
 * The DC state of the discrete section from its near end: node voltages V_0 = `vNear` and near-cell
 * currents `iNear`, marched with the update's fixed point (R·Δz·I_n = V_n − V_n+1, G·Δz·V_n = I_n−1 − I_n).
 * The caller's DC solve of the whole circuit supplies both (for a lossless section I is uniform and V equal at both ends).
 */
export function setCoupledDcState(s: CoupledSection, line: CoupledLine, vNear: ArrayLike<number>, iNear: ArrayLike<number>): void {
  const { k, cells, cellLength: dz, v, i } = s;
  for (let c = 0; c < k; c++) {
    v[c] = vNear[c];
    i[c] = iNear[c];
  }
  for (let n = 0; n < cells; n++) {
    for (let r = 0; r < k; r++) {
      let drop = 0;
      for (let c = 0; c < k; c++) drop += (line.r?.[r * k + c] ?? 0) * dz * i[n * k + c];
      v[(n + 1) * k + r] = v[n * k + r] - drop;
    }
    if (n + 1 < cells) {
      for (let r = 0; r < k; r++) {
        let leak = 0;
        for (let c = 0; c < k; c++) leak += (line.g?.[r * k + c] ?? 0) * dz * v[(n + 1) * k + c];
        i[(n + 1) * k + r] = i[n * k + r] - leak;
      }
    }
  }
}

/** One leapfrog step: copy the end nodes in from `ends`, advance every cell current and interior node. */
export function advanceCoupledSection(s: CoupledSection, ends: Float64Array): void {
  const { k, v, cells } = s;
  const last = cells * k;
  for (let c = 0; c < k; c++) {
    v[c] = ends[s.nearNodes[c]];
    v[last + c] = ends[s.farNodes[c]];
  }
  if (k === 2) advancePair(s);
  else advanceAny(s);
}

/** k = 2, unrolled: both half steps fused in one pass, old voltages carried in registers. */
function advancePair(s: CoupledSection): void {
  const { v, i, coef: q, cells } = s;
  const a11 = q[0], a12 = q[1], a21 = q[2], a22 = q[3];
  const b11 = q[4], b12 = q[5], b21 = q[6], b22 = q[7];
  const c11 = q[8], c12 = q[9], c21 = q[10], c22 = q[11];
  const d11 = q[12], d12 = q[13], d21 = q[14], d22 = q[15];
  let n1 = v[2];
  let n2 = v[3];
  let dv1 = v[0] - n1;
  let dv2 = v[1] - n2;
  let o1 = i[0];
  let o2 = i[1];
  let l1 = a11 * o1 + a12 * o2 + b11 * dv1 + b12 * dv2;
  let l2 = a21 * o1 + a22 * o2 + b21 * dv1 + b22 * dv2;
  i[0] = l1;
  i[1] = l2;
  for (let n = 1; n < cells; n++) {
    const p = 2 * n;
    const x1 = v[p + 2];
    const x2 = v[p + 3];
    dv1 = n1 - x1;
    dv2 = n2 - x2;
    o1 = i[p];
    o2 = i[p + 1];
    const r1 = a11 * o1 + a12 * o2 + b11 * dv1 + b12 * dv2;
    const r2 = a21 * o1 + a22 * o2 + b21 * dv1 + b22 * dv2;
    i[p] = r1;
    i[p + 1] = r2;
    const e1 = l1 - r1;
    const e2 = l2 - r2;
    v[p] = c11 * n1 + c12 * n2 + d11 * e1 + d12 * e2;
    v[p + 1] = c21 * n1 + c22 * n2 + d21 * e1 + d22 * e2;
    l1 = r1;
    l2 = r2;
    n1 = x1;
    n2 = x2;
  }
}

/**
 * Any k: the same update with the k×k products as loops (summed in the same order as advancePair).
 * Scratch holds the old voltages of node n, then two current slots that swap roles each cell (the
 * new currents of cell n − 1 and of cell n), then V_n − V_n+1 / I_in − I_out: offsets, no copies.
 */
function advanceAny(s: CoupledSection): void {
  const { k, v, i, coef, cells, scratch: w } = s;
  const kk = k * k;
  const old = 0;
  const diff = 3 * k;
  let left = k;
  let right = 2 * k;
  for (let n = 0; n < cells; n++) {
    const p = n * k;
    for (let c = 0; c < k; c++) {
      w[old + c] = v[p + c];
      w[diff + c] = v[p + c] - v[p + k + c];
    }
    for (let r = 0; r < k; r++) {
      const row = r * k;
      let acc = coef[row] * i[p];
      for (let c = 1; c < k; c++) acc += coef[row + c] * i[p + c];
      for (let c = 0; c < k; c++) acc += coef[kk + row + c] * w[diff + c];
      w[right + r] = acc;
    }
    for (let c = 0; c < k; c++) i[p + c] = w[right + c];
    if (n > 0) {
      for (let c = 0; c < k; c++) w[diff + c] = w[left + c] - w[right + c];
      for (let r = 0; r < k; r++) {
        const row = 2 * kk + r * k;
        let acc = coef[row] * w[old];
        for (let c = 1; c < k; c++) acc += coef[row + c] * w[old + c];
        for (let c = 0; c < k; c++) acc += coef[kk + row + c] * w[diff + c];
        v[p + r] = acc;
      }
    }
    const t = left;
    left = right;
    right = t;
  }
}
