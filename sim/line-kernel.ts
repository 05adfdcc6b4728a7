// The line cells' leapfrog update, built once as flat coefficient arrays.
// Telegrapher equations per cell, with R and G averaged over the step (semi-implicit, stable):
//   (L/Δt + R/2)·I(n+½) = (L/Δt − R/2)·I(n−½) + V_k(n) − V_k+1(n)
//   (C/Δt + G/2)·V(n+1) = (C/Δt − G/2)·V(n)   + I_in(n+½) − I_out(n+½)
// (C. R. Paul, Analysis of Multiconductor Transmission Lines, FDTD chapter.)
import type { Ladder } from './ladder.js';
import type { DcState } from './dc.js';

export interface LineKernel {
  nodes: number;
  /** Node voltages; index `nodes` is a zero pad so the last cell needs no special case. */
  v: Float64Array;
  /** Branch currents, shifted by one: i[j+1] is branch j (node j → j+1); i[0] and i[nodes] stay 0. */
  i: Float64Array;
  ai: Float64Array;
  bi: Float64Array;
  cv: Float64Array;
  dv: Float64Array;
}

export function buildLineKernel(ladder: Ladder, dt: number, dc: DcState, isLumpedNode: Uint8Array): LineKernel {
  const m = ladder.nodes;
  const k: LineKernel = {
    nodes: m,
    v: new Float64Array(m + 1),
    i: new Float64Array(m + 1),
    ai: new Float64Array(m + 1),
    bi: new Float64Array(m + 1),
    cv: new Float64Array(m),
    dv: new Float64Array(m),
  };
  for (let j = 0; j < m - 1; j++) {
    if (!ladder.isCell[j]) continue; // a lumped series branch: its slot stays 0, the lumped system owns it
    const den = ladder.cellL[j] / dt + ladder.cellR[j] / 2;
    k.ai[j + 1] = (ladder.cellL[j] / dt - ladder.cellR[j] / 2) / den;
    k.bi[j + 1] = 1 / den;
    k.i[j + 1] = dc.branch[j];
  }
  for (let n = 0; n < m; n++) {
    k.v[n] = dc.v[n];
    if (isLumpedNode[n]) {
      k.cv[n] = 1; // left as is by the line loop; the lumped system writes it
      continue;
    }
    const den = ladder.nodeC[n] / dt + ladder.nodeG[n] / 2;
    k.cv[n] = (ladder.nodeC[n] / dt - ladder.nodeG[n] / 2) / den;
    k.dv[n] = 1 / den;
  }
  return k;
}

/**
 * One leapfrog step of every line cell, both half steps fused in one pass: the current right of node k
 * is advanced from the old voltages at k and k+1, then node k from the new currents on both sides.
 */
export function advanceLineCells(k: LineKernel): void {
  const { v, i, ai, bi, cv, dv } = k;
  const m = k.nodes;
  let left = i[0];
  for (let n = 0; n < m; n++) {
    const right = ai[n + 1] * i[n + 1] + bi[n + 1] * (v[n] - v[n + 1]);
    i[n + 1] = right;
    v[n] = cv[n] * v[n] + dv[n] * (left - right);
    left = right;
  }
}
