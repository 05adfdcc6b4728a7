// The node equation of a group of end nodes that a coupled section joins to the rest of a circuit.
// A section end carries half a cell's Maxwell C·Δz and G·Δz, which couple the end nodes of the
// different conductors, so the group is updated together, centred at n+½ like the section's own nodes:
//   (C/Δt + G/2)·V(n+1) = (C/Δt − G/2)·V(n) + J(n+½),  J = the net current into each node
// (C and G: the section's end load plus whatever else the caller puts on these nodes — other
// segments' half cells, resistive terminations as conductances). The coefficients P = M⁻¹·(C/Δt − G/2)
// and Q = M⁻¹ are formed once; with k = 1 this is exactly the single-line kernel's join update.
import { identity, solveMatrix } from './matrix.js';

export interface EndGroup {
  k: number;
  /** Where the group's nodes live in the caller's voltage array. */
  nodes: Int32Array;
  p: Float64Array;
  q: Float64Array;
  /** Old voltages (scratch). */
  old: Float64Array;
}

/** The group's update for total node capacitance `c` and conductance `g` (k×k, Maxwell convention). */
export function buildEndGroup(nodes: ArrayLike<number>, c: Float64Array, g: Float64Array, dt: number): EndGroup {
  const k = nodes.length;
  const m = new Float64Array(k * k);
  const n = new Float64Array(k * k);
  for (let e = 0; e < k * k; e++) {
    m[e] = c[e] / dt + g[e] / 2;
    n[e] = c[e] / dt - g[e] / 2;
  }
  return { k, nodes: Int32Array.from(nodes), p: solveMatrix(m, n, k, k), q: solveMatrix(m, identity(k), k, k), old: new Float64Array(k) };
}

/** V ← P·V + Q·J for the group's nodes; `inflow[c]` is the net current into node c at n+½. */
export function advanceEndGroup(e: EndGroup, v: Float64Array, inflow: ArrayLike<number>): void {
  const { k, nodes, p, q, old } = e;
  for (let c = 0; c < k; c++) old[c] = v[nodes[c]];
  for (let r = 0; r < k; r++) {
    let acc = p[r * k] * old[0];
    for (let c = 1; c < k; c++) acc += p[r * k + c] * old[c];
    for (let c = 0; c < k; c++) acc += q[r * k + c] * inflow[c];
    v[nodes[r]] = acc;
  }
}
