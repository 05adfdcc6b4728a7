// The compiled circuit as a ladder of numbered nodes ("slots") for the time loop.
//
// Each line segment of N cells occupies the slots base … base+N: its N − 1 interior nodes are
// base+1 … base+N−1 and its cells' currents sit at i[base+1 … base+N] (the cell from slot j−1 to j
// at i[j]), so the cell loop walks contiguous memory exactly as on a chain. The two end slots base
// and base+N are the segment's end nodes when the numbering allows it (every segment of a chain) and
// otherwise ghost slots: copies of the real end node's voltage, refreshed before each step. Each cell
// puts half its C′ΔZ and G′ΔZ on each of its two end nodes, the standard staggered placement
// (C. R. Paul, Analysis of Multiconductor Transmission Lines, FDTD chapter), so a junction where k
// segments meet carries the sum of their half cells; its Kirchhoff current sum runs over an explicit
// incidence list (`ends`) instead of neighbour arithmetic.
import { RAIL, type Circuit } from './circuit.js';
import { NetError } from './errors.js';
import type { LineRLGC, Part } from './model.js';
import type { Discretization } from './result.js';

/** Marks an external end of a lumped branch: a source's voltage or a part's rail. */
export const EXTERNAL = -1;

/** A lumped branch from slot `p` to slot `q` (either may be EXTERNAL), elements R, L, C in series. */
export interface LumpedBranch {
  item: string;
  role: 'driver' | 'series' | 'shunt' | 'receiver' | 'dielectric' | 'coupling';
  p: number;
  q: number;
  part: Part;
  /** Index of the source whose voltage an EXTERNAL `p` end has; −1 when `p` is a node. An EXTERNAL `q` end is `part.rail`. */
  source: number;
}

export interface SegmentSpan {
  name: string;
  /** Index into Circuit.segments and Discretization.segments. */
  index: number;
  /** Slots base … base + cells (see the header); cells = 0 for a zero-length line (a plain wire). */
  base: number;
  cells: number;
  /** Real slots of the start and far end nodes. */
  first: number;
  last: number;
  cellLength: number;
  line: LineRLGC;
  /** Set for a conductor of a coupled section (Circuit.coupled[section]): the coupled kernel advances its cells. */
  coupling?: { section: number; conductor: number };
}

/** One cell current meeting an end node: +1 flows into the node (a segment's last cell), −1 out of it. */
export interface Incidence {
  cell: number;
  sign: number;
}

export interface Ladder {
  circuit: Circuit;
  /** Real nodes (equals Discretization.nodes). */
  nodes: number;
  /** Length of the voltage array: real nodes and ghost slots. */
  slots: number;
  nodeC: Float64Array;
  nodeG: Float64Array;
  /** Distance of each slot from the driver pin along the tree (m); lumped parts have no length. */
  position: Float64Array;
  /** Slot of each circuit node. */
  nodeSlot: Int32Array;
  segments: SegmentSpan[];
  /** Ghost slots and the real slots they copy: [ghost, real, ghost, real, …]. */
  ghosts: Int32Array;
  /** Every lumped branch: the sources' first, then dielectric end branches, series, shunt and receiver parts. */
  lumped: LumpedBranch[];
  /** Per real slot that ends a segment with cells: the cell currents meeting it, in segment order. */
  ends: Map<number, Incidence[]>;
}

interface Numbering {
  slot: Int32Array;
  ghosts: number[];
  bases: Int32Array;
  count: number;
}

/** Slots for every circuit node and segment, in element order (the chain's numbering for a chain). */
function numberSlots(c: Circuit, plan: Discretization): Numbering {
  const slot = new Int32Array(c.nodes.length).fill(-1);
  const bases = new Int32Array(c.segments.length).fill(-1);
  const ghosts: number[] = [];
  let count = 0;
  const ensure = (node: number) => {
    if (slot[node] < 0) slot[node] = count++;
    return slot[node];
  };
  // Elements in the order they were compiled: by the node each one leads to.
  const elements: { to: number; segment: number; from: number }[] = [
    ...c.segments.map((s, k) => ({ to: s.to, segment: k, from: s.from })),
    ...c.parts.filter((p) => p.q !== RAIL).map((p) => ({ to: p.q, segment: -1, from: p.p })),
  ].sort((a, b) => a.to - b.to);
  ensure(0);
  for (const e of elements) {
    const f = ensure(e.from);
    const cells = e.segment >= 0 ? plan.segments[e.segment].cells : -1;
    if (cells < 0) {
      ensure(e.to);
      continue;
    }
    if (cells === 0) {
      if (slot[e.to] >= 0 && slot[e.to] !== f) throw new NetError([{ path: c.segments[e.segment].name, message: 'a zero-length line between two nodes that are already joined (a loop) is not supported' }]);
      slot[e.to] = f;
      continue;
    }
    let base = f;
    if (f !== count - 1) {
      base = count++;
      ghosts.push(base, f);
    }
    bases[e.segment] = base;
    count = base + cells; // interior slots base+1 … base+cells−1
    if (slot[e.to] < 0) slot[e.to] = count++;
    else ghosts.push(count++, slot[e.to]);
  }
  for (let n = 0; n < c.nodes.length; n++) ensure(n);
  return { slot, ghosts, bases, count };
}

export function buildLadder(c: Circuit, plan: Discretization): Ladder {
  const num = numberSlots(c, plan);
  const slots = num.count;
  const ladder: Ladder = {
    circuit: c,
    nodes: slots - num.ghosts.length / 2,
    slots,
    nodeC: new Float64Array(slots),
    nodeG: new Float64Array(slots),
    position: new Float64Array(slots),
    nodeSlot: num.slot,
    segments: [],
    ghosts: Int32Array.from(num.ghosts),
    lumped: c.sources.map((s, k) => ({ item: s.name, role: 'driver' as const, p: EXTERNAL, q: num.slot[s.node], part: { r: s.resistance, l: 0, rail: 0 }, source: k })),
    ends: new Map(),
  };
  if (ladder.nodes !== plan.nodes) throw new Error(`internal: ladder has ${ladder.nodes} nodes, plan expected ${plan.nodes}`);
  placeSegments(ladder, c, plan, num.bases);
  placeCouplings(ladder, c);
  setPositions(ladder, c);
  for (const p of c.parts) {
    const role = p.role;
    ladder.lumped.push({ item: p.item, role, p: num.slot[p.p], q: p.q === RAIL ? EXTERNAL : num.slot[p.q], part: p.part, source: -1 });
  }
  return ladder;
}

/** Cells' half C and G on their end nodes, the incidence at segment ends, dielectric end branches. */
function placeSegments(ladder: Ladder, c: Circuit, plan: Discretization, bases: Int32Array): void {
  c.segments.forEach((seg, index) => {
    const cells = plan.segments[index].cells;
    const dz = plan.segments[index].cellLength;
    const first = ladder.nodeSlot[seg.from];
    const last = ladder.nodeSlot[seg.to];
    const base = cells > 0 ? bases[index] : first;
    ladder.segments.push({ name: seg.name, index, base, cells, first, last, cellLength: dz, line: seg.line, ...(seg.coupling ? { coupling: seg.coupling } : {}) });
    if (cells === 0) return;
    const halfC = (seg.line.c * dz) / 2;
    const halfG = (seg.line.g * dz) / 2;
    // A coupled conductor's end nodes carry its capacitance to the return (the Maxwell row sum); the
    // mutual part sits in coupling capacitors between the section's end nodes (placeCouplings).
    const endC = seg.coupling ? (rowSum(c.coupled[seg.coupling.section].line, seg.coupling.conductor) * dz) / 2 : halfC;
    for (let k = 0; k < cells; k++) {
      const left = k === 0 ? first : base + k;
      const right = k === cells - 1 ? last : base + k + 1;
      ladder.nodeC[left] += left === first ? endC : halfC;
      ladder.nodeC[right] += right === last ? endC : halfC;
      ladder.nodeG[left] += halfG;
      ladder.nodeG[right] += halfG;
    }
    addEnd(ladder, first, { cell: base + 1, sign: -1 });
    addEnd(ladder, last, { cell: base + cells, sign: 1 });
    // The half cells at the segment's two ends carry their share of the dielectric branches as
    // lumped R–C parts, solved with the end nodes; interior nodes keep theirs in the line kernel.
    for (const t of seg.line.shunt ?? []) {
      const cap = (t.value * dz) / 2;
      for (const end of [first, last]) {
        ladder.lumped.push({ item: seg.name, role: 'dielectric', p: end, q: EXTERNAL, part: { r: t.tau / cap, l: 0, c: cap, rail: 0 }, source: -1 });
      }
    }
  });
}

/** Row sum of a Maxwell C: conductor j's capacitance to the return (F/m). */
function rowSum(line: { k: number; c: Float64Array }, j: number): number {
  let sum = 0;
  for (let e = 0; e < line.k; e++) sum += line.c[j * line.k + e];
  return sum;
}

/**
 * The half cell at each end of a coupled section as the capacitors one would draw: C_gi·Δz/2 to the
 * return on each end node (placed with the segment) and C_mij·Δz/2 = −C_ij·Δz/2 between the end nodes
 * of conductors i and j. Charge q_i = Σ_j C_ij·V_j is the same either way (Paul, the Maxwell matrix and
 * its mutual-capacitance form); a capacitor part's trapezoidal companion is the centred node equation.
 */
function placeCouplings(ladder: Ladder, c: Circuit): void {
  c.coupled.forEach((sec) => {
    const spans = sec.segments.map((s) => ladder.segments[s]);
    if (spans.length !== sec.line.k || spans[0].cells === 0) return;
    const k = sec.line.k;
    for (let i = 0; i < k; i++) {
      for (let j = i + 1; j < k; j++) {
        const cm = (-sec.line.c[i * k + j] * spans[i].cellLength) / 2;
        if (!(cm > 0)) continue;
        for (const end of ['first', 'last'] as const) {
          ladder.lumped.push({ item: sec.name, role: 'coupling', p: spans[i][end], q: spans[j][end], part: { r: 0, l: 0, c: cm, rail: 0 }, source: -1 });
        }
      }
    }
  });
}

function addEnd(ladder: Ladder, node: number, inc: Incidence): void {
  const list = ladder.ends.get(node);
  if (list) list.push(inc);
  else ladder.ends.set(node, [inc]);
}

/** Distances from the driver pin: along each element from its `from` node (elements come in tree order). */
function setPositions(ladder: Ladder, c: Circuit): void {
  const at = new Float64Array(c.nodes.length);
  const elements = [
    ...c.segments.map((s, k) => ({ to: s.to, from: s.from, length: s.length, span: ladder.segments[k] })),
    ...c.parts.filter((p) => p.q !== RAIL).map((p) => ({ to: p.q, from: p.p, length: 0, span: undefined })),
  ].sort((a, b) => a.to - b.to);
  for (const e of elements) {
    at[e.to] = at[e.from] + e.length;
    const span = e.span;
    if (span && span.cells > 0) for (let k = 1; k < span.cells; k++) ladder.position[span.base + k] = at[e.from] + k * span.cellLength;
  }
  for (let n = 0; n < c.nodes.length; n++) ladder.position[ladder.nodeSlot[n]] = at[n];
  for (let g = 0; g < ladder.ghosts.length; g += 2) ladder.position[ladder.ghosts[g]] = ladder.position[ladder.ghosts[g + 1]];
}

/** Voltage of the external end of a lumped branch: the source value for a driver, else the part's rail. */
export function externalVoltage(b: LumpedBranch, sources: Float64Array): number {
  return b.source >= 0 ? sources[b.source] : b.part.rail;
}
