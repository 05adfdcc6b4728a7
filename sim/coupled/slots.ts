// A coupled section inside a run: the same leapfrog update as kernel.ts (four k×k coefficient blocks
// per section, Paul's FDTD chapter) working in place on the ladder's own arrays. Each conductor is a
// segment of the ladder (ladder.ts): conductor c's node n is the slot base_c + n (its two end slots are
// the end nodes or ghost copies, refreshed before the step) and its cell n's current is i[base_c + n + 1].
// So probes, the route map, the DC start and the end nodes' updates (joins and lumped clusters, through
// the ordinary incidence lists) see a coupled conductor exactly like a single line; only the cells'
// update differs. The end nodes' half-cell mutual capacitance is a coupling capacitor part (ladder.ts).
import type { Ladder } from '../ladder.js';
import type { CoupledLine } from './line.js';
import { coupledCoefficients } from './kernel.js';

export interface CoupledSlots {
  name: string;
  k: number;
  cells: number;
  /** Base slot of each conductor (matrix order). */
  bases: Int32Array;
  /** A, B, C, D: four row-major k×k blocks (kernel.ts). */
  coef: Float64Array;
  /** Old voltages, two current slots, differences (general k). */
  scratch: Float64Array;
}

/** The section's cells on the ladder: its conductors' segments share one cell count and length (discretize.ts). */
export function buildCoupledSlots(ladder: Ladder, name: string, segments: readonly number[], line: CoupledLine, dt: number): CoupledSlots {
  const spans = segments.map((s) => ladder.segments[s]);
  const cells = spans[0].cells;
  if (spans.some((s) => s.cells !== cells || Math.abs(s.cellLength - spans[0].cellLength) > 1e-12 * spans[0].cellLength)) {
    throw new Error(`internal: the conductors of coupled section '${name}' have different cells`);
  }
  return {
    name,
    k: line.k,
    cells,
    bases: Int32Array.from(spans, (s) => s.base),
    coef: coupledCoefficients(line, spans[0].cellLength, dt),
    scratch: new Float64Array(4 * line.k),
  };
}

/** One leapfrog step of the section's currents and interior nodes (end slots are read, never written). */
export function advanceCoupledSlots(s: CoupledSlots, v: Float64Array, i: Float64Array): void {
  if (s.k === 2) advancePairSlots(s, v, i);
  else advanceAnySlots(s, v, i);
}

/** k = 2 unrolled, in the order of kernel.ts's advancePair (so zero coupling is the single-line update bit for bit). */
function advancePairSlots(s: CoupledSlots, v: Float64Array, i: Float64Array): void {
  const { coef: q, cells } = s;
  const b1 = s.bases[0];
  const b2 = s.bases[1];
  const a11 = q[0], a12 = q[1], a21 = q[2], a22 = q[3];
  const p11 = q[4], p12 = q[5], p21 = q[6], p22 = q[7];
  const c11 = q[8], c12 = q[9], c21 = q[10], c22 = q[11];
  const d11 = q[12], d12 = q[13], d21 = q[14], d22 = q[15];
  let n1 = v[b1 + 1];
  let n2 = v[b2 + 1];
  let dv1 = v[b1] - n1;
  let dv2 = v[b2] - n2;
  let o1 = i[b1 + 1];
  let o2 = i[b2 + 1];
  let l1 = a11 * o1 + a12 * o2 + p11 * dv1 + p12 * dv2;
  let l2 = a21 * o1 + a22 * o2 + p21 * dv1 + p22 * dv2;
  i[b1 + 1] = l1;
  i[b2 + 1] = l2;
  for (let n = 1; n < cells; n++) {
    const x1 = v[b1 + n + 1];
    const x2 = v[b2 + n + 1];
    dv1 = n1 - x1;
    dv2 = n2 - x2;
    o1 = i[b1 + n + 1];
    o2 = i[b2 + n + 1];
    const r1 = a11 * o1 + a12 * o2 + p11 * dv1 + p12 * dv2;
    const r2 = a21 * o1 + a22 * o2 + p21 * dv1 + p22 * dv2;
    i[b1 + n + 1] = r1;
    i[b2 + n + 1] = r2;
    const e1 = l1 - r1;
    const e2 = l2 - r2;
    v[b1 + n] = c11 * n1 + c12 * n2 + d11 * e1 + d12 * e2;
    v[b2 + n] = c21 * n1 + c22 * n2 + d21 * e1 + d22 * e2;
    l1 = r1;
    l2 = r2;
    n1 = x1;
    n2 = x2;
  }
}

/** Any k: kernel.ts's advanceAny with conductor c of node n at v[bases[c] + n] and cell n at i[bases[c] + n + 1]. */
function advanceAnySlots(s: CoupledSlots, v: Float64Array, i: Float64Array): void {
  const { k, coef, cells, bases, scratch: w } = s;
  const kk = k * k;
  const old = 0;
  const diff = 3 * k;
  let left = k;
  let right = 2 * k;
  for (let n = 0; n < cells; n++) {
    for (let c = 0; c < k; c++) {
      w[old + c] = v[bases[c] + n];
      w[diff + c] = v[bases[c] + n] - v[bases[c] + n + 1];
    }
    for (let r = 0; r < k; r++) {
      const row = r * k;
      let acc = coef[row] * i[bases[0] + n + 1];
      for (let c = 1; c < k; c++) acc += coef[row + c] * i[bases[c] + n + 1];
      for (let c = 0; c < k; c++) acc += coef[kk + row + c] * w[diff + c];
      w[right + r] = acc;
    }
    for (let c = 0; c < k; c++) i[bases[c] + n + 1] = w[right + c];
    if (n > 0) {
      for (let c = 0; c < k; c++) w[diff + c] = w[left + c] - w[right + c];
      for (let r = 0; r < k; r++) {
        const row = 2 * kk + r * k;
        let acc = coef[row] * w[old];
        for (let c = 1; c < k; c++) acc += coef[row + c] * w[old + c];
        for (let c = 0; c < k; c++) acc += coef[kk + row + c] * w[diff + c];
        v[bases[r] + n] = acc;
      }
    }
    const t = left;
    left = right;
    right = t;
  }
}
