// The resistive part of a compiled net as the lattice of a tree sees it: nodes joined by wires (a
// line of zero length, a series part of 0 Ω) merged into one, nodes tied to a rail by a 0 Ω shunt held
// at that rail, and each series resistor, shunt resistor and the driver's resistance a conductance.
// Used twice: for the waves (every line of non-zero length an open, each of its ends a port) and for
// the DC levels (every line a wire). The parts must be resistive (the lattice's idealisation has
// already replaced each capacitor and inductor by an open or a short).
import { RAIL, type Circuit } from '../../sim/circuit.js';
import { invert } from '../../sim/dense.js';

/** Union–find over node indices. */
export class NodeSets {
  private readonly up: Int32Array;
  constructor(n: number) {
    this.up = Int32Array.from({ length: n }, (_, i) => i);
  }
  find(i: number): number {
    while (this.up[i] !== i) i = this.up[i] = this.up[this.up[i]];
    return i;
  }
  join(a: number, b: number): void {
    this.up[this.find(a)] = this.find(b);
  }
}

/** A resistive part between two merged nodes, or from one to a rail. */
export interface Conductance {
  p: number;
  /** The other merged node, or RAIL. */
  q: number;
  g: number;
  rail: number;
}

/** Merged nodes of a circuit: `wires` says which lines count as wires (all of them for DC, the empty ones for waves). */
export function mergeWires(c: Circuit, lineIsWire: (segment: number) => boolean): { sets: NodeSets; held: Map<number, number>; conductances: Conductance[] } {
  const sets = new NodeSets(c.nodes.length);
  c.segments.forEach((s, k) => {
    if (lineIsWire(k)) sets.join(s.from, s.to);
  });
  for (const p of c.parts) if (p.q !== RAIL && p.part.r === 0 && p.part.c === undefined) sets.join(p.p, p.q);
  // a 0 Ω shunt holds its node at the rail
  const held = new Map<number, number>();
  for (const p of c.parts) if (p.q === RAIL && p.part.r === 0 && p.part.c === undefined) held.set(sets.find(p.p), p.part.rail);
  const conductances: Conductance[] = [];
  for (const p of c.parts) {
    if (p.part.c !== undefined || !(p.part.r > 0)) continue;
    const a = sets.find(p.p);
    const b = p.q === RAIL ? RAIL : sets.find(p.q);
    if (a !== b) conductances.push({ p: a, q: b, g: 1 / p.part.r, rail: p.part.rail });
  }
  return { sets, held, conductances };
}

/**
 * A small nodal system over the merged nodes `unknowns` (each a representative of NodeSets): the
 * conductances among them, to rails and to held nodes, plus `extra` conductances to ground at some
 * nodes (a line's Z0 seen from a port, the driver's resistance). Returns the inverse of the nodal
 * matrix and the index of each node, or null when the matrix is singular (a node with no path to
 * ground).
 */
export function nodalInverse(
  unknowns: readonly number[],
  conductances: readonly Conductance[],
  held: ReadonlyMap<number, number>,
  extra: ReadonlyMap<number, number>,
): { inv: Float64Array; index: Map<number, number> } | null {
  const index = new Map(unknowns.map((u, k) => [u, k]));
  const n = unknowns.length;
  const g = new Float64Array(n * n);
  const stamp = (a: number, b: number, y: number) => {
    const i = index.get(a);
    const j = b === RAIL || held.has(b) ? undefined : index.get(b);
    if (i !== undefined) g[i * n + i] += y;
    if (j !== undefined) g[j * n + j] += y;
    if (i !== undefined && j !== undefined) {
      g[i * n + j] -= y;
      g[j * n + i] -= y;
    }
  };
  for (const k of conductances) {
    if (!index.has(k.p) && !(k.q !== RAIL && index.has(k.q))) continue;
    if (held.has(k.p)) stamp(k.q, k.p, k.g);
    else stamp(k.p, k.q, k.g);
  }
  for (const [node, y] of extra) {
    const i = index.get(node);
    if (i !== undefined) g[i * n + i] += y;
  }
  const inv = invert(g, n);
  return inv ? { inv, index } : null;
}
