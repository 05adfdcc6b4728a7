// The line cells' leapfrog update, built once as flat arrays and per-segment coefficients.
// Telegrapher equations per cell, with R and G averaged over the step (semi-implicit, stable):
//   (L/Δt + R/2)·I(n+½) = (L/Δt − R/2)·I(n−½) + V_k(n) − V_k+1(n)
//   (C/Δt + G/2)·V(n+1) = (C/Δt − G/2)·V(n)   + I_in(n+½) − I_out(n+½)
// (C. R. Paul, Analysis of Multiconductor Transmission Lines, FDTD chapter.)
// Cells of one segment are identical, so each segment's coefficients are four scalars, and its slots
// are contiguous (ladder.ts): the loop reads the voltages of its end slots base and base+N, which are
// the end nodes themselves or ghost copies refreshed at the start of the step. The nodes where
// segments meet, or where a segment ends open, are updated in a short pass of their own from the sum
// of the cell currents in their incidence lists (Kirchhoff's current law).
// A segment with frequency-dependent loss also carries one state per R‖L section in every cell and
// one per R–C dielectric branch on every interior node (see lossy-segment.ts).
import { advanceCoupledSlots, buildCoupledSlots, type CoupledSlots } from './coupled/slots.js';
import type { DcState } from './dc.js';
import type { Ladder } from './ladder.js';
import { advanceLossySegment, buildLossySegments, type LossySegments } from './lossy-segment.js';

export interface LineKernel {
  /** Slot voltages; index `slots` is a zero pad. */
  v: Float64Array;
  /** Cell currents: i[j] is the cell ending at slot j of its segment (see ladder.ts); the rest stay 0. */
  i: Float64Array;
  /** Per segment: first and last slot, current coefficients (a, b) and interior-node coefficients (c, d). */
  segStart: Int32Array;
  segEnd: Int32Array;
  segA: Float64Array;
  segB: Float64Array;
  segC: Float64Array;
  segD: Float64Array;
  /** Ghost slots and the real slots they copy, in pairs. */
  ghosts: Int32Array;
  /** Segment end nodes that no lumped part touches: junctions of segments and open ends. */
  joinNode: Int32Array;
  joinC: Float64Array;
  joinD: Float64Array;
  /** Incidence of each join (CSR): cells joinCell[joinStart[n] … joinStart[n+1]) with signs ±1. */
  joinStart: Int32Array;
  joinCell: Int32Array;
  joinSign: Float64Array;
  /** Segments with auxiliary loss states; they are not in the plain segment arrays above. */
  lossy: LossySegments;
  /** Coupled sections: their conductors' segments are not in the arrays above either (coupled/slots.ts). */
  coupled: CoupledSlots[];
}

function nodeCoefficients(c: number, g: number, dt: number): [number, number] {
  const den = c / dt + g / 2;
  return [(c / dt - g / 2) / den, 1 / den];
}

export function buildLineKernel(ladder: Ladder, dt: number, dc: DcState, isLumpedNode: Uint8Array): LineKernel {
  const m = ladder.slots;
  const lines = ladder.segments.filter((s) => s.cells > 0 && !s.coupling);
  const hasAux = (s: (typeof lines)[number]) => (s.line.series?.length ?? 0) + (s.line.shunt?.length ?? 0) > 0;
  const spans = lines.filter((s) => !hasAux(s));
  const joinList = [...ladder.ends.keys()].filter((node) => !isLumpedNode[node]).sort((a, b) => a - b);
  const incidence = joinList.map((node) => ladder.ends.get(node)!);
  const k: LineKernel = {
    v: new Float64Array(m + 1),
    i: new Float64Array(m + 1),
    segStart: Int32Array.from(spans, (s) => s.base),
    segEnd: Int32Array.from(spans, (s) => s.base + s.cells),
    segA: new Float64Array(spans.length),
    segB: new Float64Array(spans.length),
    segC: new Float64Array(spans.length),
    segD: new Float64Array(spans.length),
    ghosts: ladder.ghosts,
    joinNode: Int32Array.from(joinList),
    joinC: new Float64Array(joinList.length),
    joinD: new Float64Array(joinList.length),
    joinStart: Int32Array.from([0, ...incidence.map((_, n) => incidence.slice(0, n + 1).reduce((t, l) => t + l.length, 0))]),
    joinCell: Int32Array.from(incidence.flat(), (e) => e.cell),
    joinSign: Float64Array.from(incidence.flat(), (e) => e.sign),
    lossy: buildLossySegments(lines.filter(hasAux), dt, dc),
    coupled: ladder.circuit.coupled.filter((c) => ladder.segments[c.segments[0]].cells > 0).map((c) => buildCoupledSlots(ladder, c.name, c.segments, c.line, dt)),
  };
  spans.forEach((s, n) => {
    // every cell of the segment has the same L′ΔZ and R′ΔZ
    const cellL = s.line.l * s.cellLength;
    const cellR = s.line.r * s.cellLength;
    const den = cellL / dt + cellR / 2;
    k.segA[n] = (cellL / dt - cellR / 2) / den;
    k.segB[n] = 1 / den;
    // interior nodes carry a whole cell's C and G
    const cellC = s.cells > 1 ? ladder.nodeC[s.base + 1] : 0;
    const cellG = s.cells > 1 ? ladder.nodeG[s.base + 1] : 0;
    [k.segC[n], k.segD[n]] = cellC > 0 ? nodeCoefficients(cellC, cellG, dt) : [1, 0];
  });
  joinList.forEach((node, n) => ([k.joinC[n], k.joinD[n]] = nodeCoefficients(ladder.nodeC[node], ladder.nodeG[node], dt)));
  k.v.set(dc.v);
  k.i.set(dc.i);
  return k;
}

/**
 * One leapfrog step of a segment's cells, both half steps fused in one pass: the current right of node n
 * is advanced from the old voltages at n and n+1, then interior node n from the new currents on both sides.
 */
function advanceSegment(v: Float64Array, i: Float64Array, start: number, end: number, a: number, b: number, c: number, d: number): void {
  let vn = v[start + 1]; // old voltages are carried in registers: each is read once
  let left = a * i[start + 1] + b * (v[start] - vn);
  i[start + 1] = left;
  for (let n = start + 1; n < end; n++) {
    const vNext = v[n + 1];
    const right = a * i[n + 1] + b * (vn - vNext);
    i[n + 1] = right;
    v[n] = c * vn + d * (left - right);
    left = right;
    vn = vNext;
  }
}

/** The voltage half step at segment ends that are not lumped nodes, from the sum of the new currents meeting there. */
function advanceJoins(k: LineKernel): void {
  const { v, i, joinNode, joinC, joinD, joinStart, joinCell, joinSign } = k;
  for (let n = 0; n < joinNode.length; n++) {
    const node = joinNode[n];
    let sum = 0;
    for (let e = joinStart[n]; e < joinStart[n + 1]; e++) sum += joinSign[e] * i[joinCell[e]];
    v[node] = joinC[n] * v[node] + joinD[n] * sum;
  }
}

/** Ghost slots take their real node's voltage at step n, before the cells read them. */
function refreshGhosts(v: Float64Array, ghosts: Int32Array): void {
  for (let g = 0; g < ghosts.length; g += 2) v[ghosts[g]] = v[ghosts[g + 1]];
}

export function advanceLineCells(k: LineKernel): void {
  refreshGhosts(k.v, k.ghosts);
  for (let s = 0; s < k.segStart.length; s++) {
    advanceSegment(k.v, k.i, k.segStart[s], k.segEnd[s], k.segA[s], k.segB[s], k.segC[s], k.segD[s]);
  }
  for (let s = 0; s < k.lossy.count; s++) advanceLossySegment(k.lossy, s, k.v, k.i);
  for (let s = 0; s < k.coupled.length; s++) advanceCoupledSlots(k.coupled[s], k.v, k.i);
  advanceJoins(k);
}
