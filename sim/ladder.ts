// The route as a chain of nodes: node 0 is the driver pin, the last node is the receiver.
// Branch j joins node j to node j+1 and is either one line cell (R'ΔZ in series with L'ΔZ) or a
// lumped series part. Each cell puts half its C'ΔZ and G'ΔZ on each of its two end nodes, the
// standard staggered placement (C. R. Paul, Analysis of Multiconductor Transmission Lines, FDTD chapter).
import type { LineRLGC, Net, Part } from './model.js';
import type { Discretization } from './result.js';

/** Marks an external end of a lumped branch: the driver's source or a fixed rail. */
export const EXTERNAL = -1;

/** A lumped branch from node `p` to node `q` (either may be EXTERNAL), elements R, L, C in series. */
export interface LumpedBranch {
  item: string;
  role: 'driver' | 'series' | 'shunt' | 'receiver' | 'dielectric';
  p: number;
  q: number;
  part: Part;
}

export interface ItemSpan {
  kind: 'line' | 'series' | 'shunt';
  /** First node of the item (for a shunt: the node it hangs on). */
  start: number;
  /** Last node of the item. */
  end: number;
  cellLength: number;
  /** For a line: its per-unit-length model. */
  line?: LineRLGC;
}

export interface Ladder {
  nodes: number;
  nodeC: Float64Array;
  nodeG: Float64Array;
  /** Per branch j (nodes j → j+1): cell inductance and resistance; 0 for lumped branches. */
  cellL: Float64Array;
  cellR: Float64Array;
  isCell: Uint8Array;
  /** Distance of each node from the driver pin along the route (m); lumped parts have no length. */
  position: Float64Array;
  /** The driver branch first, then every series, shunt and receiver part. */
  lumped: LumpedBranch[];
  items: Map<string, ItemSpan>;
}

export function buildLadder(net: Net, plan: Discretization): Ladder {
  const nodes = plan.nodes;
  const ladder: Ladder = {
    nodes,
    nodeC: new Float64Array(nodes),
    nodeG: new Float64Array(nodes),
    cellL: new Float64Array(Math.max(nodes - 1, 0)),
    cellR: new Float64Array(Math.max(nodes - 1, 0)),
    isCell: new Uint8Array(Math.max(nodes - 1, 0)),
    position: new Float64Array(nodes),
    lumped: [{ item: 'driver', role: 'driver', p: EXTERNAL, q: 0, part: { r: net.driver.resistance, l: 0, rail: 0 } }],
    items: new Map(),
  };
  const cellsOf = new Map(plan.segments.map((s) => [s.name, s]));
  let node = 0;
  let distance = 0;
  for (const item of net.route) {
    if (item.kind === 'line') {
      const seg = cellsOf.get(item.name)!;
      const dz = seg.cellLength;
      for (let k = 0; k < seg.cells; k++) {
        const j = node + k;
        ladder.isCell[j] = 1;
        ladder.position[j + 1] = distance + (k + 1) * dz;
        ladder.cellL[j] = item.line.l * dz;
        ladder.cellR[j] = item.line.r * dz;
        const halfC = (item.line.c * dz) / 2;
        const halfG = (item.line.g * dz) / 2;
        ladder.nodeC[j] += halfC;
        ladder.nodeC[j + 1] += halfC;
        ladder.nodeG[j] += halfG;
        ladder.nodeG[j + 1] += halfG;
      }
      ladder.items.set(item.name, { kind: 'line', start: node, end: node + seg.cells, cellLength: dz, line: item.line });
      // The half cells at the segment's two ends carry their share of the dielectric branches as
      // lumped R–C parts, solved with the end nodes; interior nodes keep theirs in the line kernel.
      if (seg.cells > 0) {
        for (const t of item.line.shunt ?? []) {
          const c = (t.value * dz) / 2;
          for (const end of [node, node + seg.cells]) {
            ladder.lumped.push({ item: item.name, role: 'dielectric', p: end, q: EXTERNAL, part: { r: t.tau / c, l: 0, c, rail: 0 } });
          }
        }
      }
      node += seg.cells;
      distance += item.length;
      ladder.position[node] = distance;
    } else if (item.kind === 'series') {
      ladder.lumped.push({ item: item.name, role: 'series', p: node, q: node + 1, part: item.part });
      ladder.position[node + 1] = distance;
      ladder.items.set(item.name, { kind: 'series', start: node, end: node + 1, cellLength: 0 });
      node += 1;
    } else {
      for (const part of item.parts) ladder.lumped.push({ item: item.name, role: 'shunt', p: node, q: EXTERNAL, part });
      ladder.items.set(item.name, { kind: 'shunt', start: node, end: node, cellLength: 0 });
    }
  }
  for (const part of net.receiver) ladder.lumped.push({ item: 'receiver', role: 'receiver', p: node, q: EXTERNAL, part });
  if (node !== nodes - 1) throw new Error(`internal: ladder has ${node + 1} nodes, plan expected ${nodes}`);
  return ladder;
}

/** Voltage of the external end of a lumped branch: the source value for the driver, else the part's rail. */
export function externalVoltage(b: LumpedBranch, source: number): number {
  return b.role === 'driver' ? source : b.part.rail;
}
