// The line cells' leapfrog update, built once as flat arrays and per-segment coefficients.
// Telegrapher equations per cell, with R and G averaged over the step (semi-implicit, stable):
//   (L/Δt + R/2)·I(n+½) = (L/Δt − R/2)·I(n−½) + V_k(n) − V_k+1(n)
//   (C/Δt + G/2)·V(n+1) = (C/Δt − G/2)·V(n)   + I_in(n+½) − I_out(n+½)
// (C. R. Paul, Analysis of Multiconductor Transmission Lines, FDTD chapter.)
// Cells of one segment are identical, so each segment's coefficients are four scalars; the nodes
// where two segments meet, or where a segment ends open, are updated in a short pass of their own.
// A segment with frequency-dependent loss also carries one state per R‖L section in every cell and
// one per R–C dielectric branch on every interior node (see lossy-segment.ts).
import type { DcState } from './dc.js';
import type { Ladder } from './ladder.js';
import { advanceLossySegment, buildLossySegments, type LossySegments } from './lossy-segment.js';

export interface LineKernel {
  /** Node voltages; index `nodes` is a zero pad so the last node needs no special case. */
  v: Float64Array;
  /** Branch currents, shifted by one: i[j+1] is branch j (node j → j+1); i[0] and i[nodes] stay 0. */
  i: Float64Array;
  /** Per segment: first and last node, current coefficients (a, b) and interior-node coefficients (c, d). */
  segStart: Int32Array;
  segEnd: Int32Array;
  segA: Float64Array;
  segB: Float64Array;
  segC: Float64Array;
  segD: Float64Array;
  /** Segment end nodes that no lumped part touches: junctions of two segments and open ends. */
  joinNode: Int32Array;
  joinC: Float64Array;
  joinD: Float64Array;
  /** Segments with auxiliary loss states; they are not in the plain segment arrays above. */
  lossy: LossySegments;
}

function nodeCoefficients(c: number, g: number, dt: number): [number, number] {
  const den = c / dt + g / 2;
  return [(c / dt - g / 2) / den, 1 / den];
}

export function buildLineKernel(ladder: Ladder, dt: number, dc: DcState, isLumpedNode: Uint8Array): LineKernel {
  const m = ladder.nodes;
  const lines = [...ladder.items.values()].filter((s) => s.kind === 'line' && s.end > s.start);
  const hasAux = (s: (typeof lines)[number]) => (s.line?.series?.length ?? 0) + (s.line?.shunt?.length ?? 0) > 0;
  const spans = lines.filter((s) => !hasAux(s));
  const k: LineKernel = {
    v: new Float64Array(m + 1),
    i: new Float64Array(m + 1),
    segStart: Int32Array.from(spans, (s) => s.start),
    segEnd: Int32Array.from(spans, (s) => s.end),
    segA: new Float64Array(spans.length),
    segB: new Float64Array(spans.length),
    segC: new Float64Array(spans.length),
    segD: new Float64Array(spans.length),
    joinNode: new Int32Array(0),
    joinC: new Float64Array(0),
    joinD: new Float64Array(0),
    lossy: buildLossySegments(lines.filter(hasAux), dt, dc),
  };
  const joins = new Set<number>();
  spans.forEach((s, n) => {
    const j = s.start; // every cell of the segment has the first cell's values
    const den = ladder.cellL[j] / dt + ladder.cellR[j] / 2;
    k.segA[n] = (ladder.cellL[j] / dt - ladder.cellR[j] / 2) / den;
    k.segB[n] = 1 / den;
    // interior nodes carry a whole cell's C and G: twice the half cell at the segment's first node side
    const cellC = ladder.nodeC[s.start + 1] * (s.end - s.start > 1 ? 1 : 0);
    const cellG = ladder.nodeG[s.start + 1] * (s.end - s.start > 1 ? 1 : 0);
    [k.segC[n], k.segD[n]] = cellC > 0 ? nodeCoefficients(cellC, cellG, dt) : [1, 0];
  });
  for (const s of lines) for (const end of [s.start, s.end]) if (!isLumpedNode[end]) joins.add(end);
  const joinList = [...joins].sort((a, b) => a - b);
  k.joinNode = Int32Array.from(joinList);
  k.joinC = new Float64Array(joinList.length);
  k.joinD = new Float64Array(joinList.length);
  joinList.forEach((node, n) => ([k.joinC[n], k.joinD[n]] = nodeCoefficients(ladder.nodeC[node], ladder.nodeG[node], dt)));
  k.v.set(dc.v);
  for (let j = 0; j < m - 1; j++) if (ladder.isCell[j]) k.i[j + 1] = dc.branch[j];
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

/** The voltage half step at segment ends that are not lumped nodes, from the new currents either side. */
function advanceJoins(k: LineKernel): void {
  const { v, i, joinNode, joinC, joinD } = k;
  for (let n = 0; n < joinNode.length; n++) {
    const node = joinNode[n];
    v[node] = joinC[n] * v[node] + joinD[n] * (i[node] - i[node + 1]);
  }
}

export function advanceLineCells(k: LineKernel): void {
  for (let s = 0; s < k.segStart.length; s++) {
    advanceSegment(k.v, k.i, k.segStart[s], k.segEnd[s], k.segA[s], k.segB[s], k.segC[s], k.segD[s]);
  }
  for (let s = 0; s < k.lossy.count; s++) advanceLossySegment(k.lossy, s, k.v, k.i);
  advanceJoins(k);
}
