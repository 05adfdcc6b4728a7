// Voltage along the whole net over time, decimated in space and time so its memory is bounded:
// about `columns` node positions × `rows` time rows (default 480 × 900 × 8 bytes ≈ 3.3 MiB). Nodes
// are picked every `stride` nodes along each path from the driver pin, so the paths share the trunk's
// columns and a net without branches records exactly every stride-th node of its chain.
import ndarray from 'ndarray';
import type { Circuit, CircuitPath, ItemPlace } from './circuit.js';
import type { Ladder } from './ladder.js';
import { segmentNodeSlot } from './probes.js';
import type { RouteMapItem, RouteMapPath, RouteMapRecord } from './result.js';

export interface RouteMapOptions {
  columns?: number;
  rows?: number;
}

export interface RouteMapTaps {
  /** Slot of each recorded column. */
  nodes: Int32Array;
  /** Per path: its columns in order. */
  pathColumns: Int32Array[];
  stepStride: number;
  rows: number;
  data: Float64Array;
}

/** Slots along a path from the source's node to the receiver's, each once. */
export function pathSlots(ladder: Ladder, path: CircuitPath): number[] {
  const out: number[] = [ladder.nodeSlot[path.nodes[0]]];
  const push = (s: number) => {
    if (out[out.length - 1] !== s) out.push(s);
  };
  path.legs.forEach((leg, k) => {
    if (leg.kind === 'segment') {
      const span = ladder.segments[leg.index];
      for (let j = 1; j <= span.cells; j++) push(segmentNodeSlot(ladder, leg.index, j));
    }
    push(ladder.nodeSlot[path.nodes[k + 1]]);
  });
  return out;
}

export function planRouteMap(ladder: Ladder, steps: number, options: RouteMapOptions): RouteMapTaps {
  const columns = Math.max(2, options.columns ?? 480);
  const maxRows = Math.max(2, options.rows ?? 900);
  const stride = Math.max(1, Math.ceil(ladder.nodes / columns));
  const column = new Map<number, number>();
  const pathColumns = ladder.circuit.paths.map((path) => {
    const slots = pathSlots(ladder, path);
    const picked: number[] = [];
    for (let k = 0; k < slots.length; k += stride) picked.push(slots[k]);
    if (picked[picked.length - 1] !== slots[slots.length - 1]) picked.push(slots[slots.length - 1]);
    return Int32Array.from(picked, (s) => {
      if (!column.has(s)) column.set(s, column.size);
      return column.get(s)!;
    });
  });
  const stepStride = Math.max(1, Math.ceil(steps / (maxRows - 1)));
  const rows = Math.floor(steps / stepStride) + 1;
  return { nodes: Int32Array.from(column.keys()), pathColumns, stepStride, rows, data: new Float64Array(rows * column.size) };
}

export function recordRouteMap(taps: RouteMapTaps, v: Float64Array, row: number): void {
  const { nodes, data } = taps;
  const base = row * nodes.length;
  for (let c = 0; c < nodes.length; c++) data[base + c] = v[nodes[c]];
}

/** Every route item with the span it covers from the driver pin (m). */
function itemSpan(ladder: Ladder, name: string, place: ItemPlace): RouteMapItem {
  const at = (node: number) => ladder.position[ladder.nodeSlot[node]];
  switch (place.kind) {
    case 'line': {
      const coupling = ladder.circuit.segments[place.segment].coupling;
      const span: RouteMapItem = { name, kind: place.kind, from: at(place.from), to: at(place.to) };
      return coupling ? { ...span, coupled: ladder.circuit.coupled[coupling.section].name } : span;
    }
    case 'series':
      return { name, kind: place.kind, from: at(place.from), to: at(place.to) };
    case 'shunt':
    case 'branch':
      return { name, kind: place.kind, from: at(place.node), to: at(place.node) };
  }
}

/** The items met along a path, and the branch points where other paths leave it. */
function pathLayout(ladder: Ladder, c: Circuit, path: CircuitPath): Pick<RouteMapPath, 'items' | 'junctions'> {
  const onPath = new Set(path.nodes);
  const nodeOf = (p: ItemPlace) => (p.kind === 'shunt' || p.kind === 'branch' ? p.node : p.from);
  const legItem = new Set(path.legs.map((l) => (l.kind === 'segment' ? c.segments[l.index].name : c.parts[l.index].item)));
  const items: RouteMapItem[] = [];
  const junctions: RouteMapPath['junctions'] = [];
  for (const [name, place] of c.items) {
    const taps = place.kind === 'shunt' || place.kind === 'branch';
    if (!(legItem.has(name) || (taps && onPath.has(nodeOf(place))))) continue;
    const span = itemSpan(ladder, name, place);
    items.push(span);
    if (place.kind === 'branch') {
      const k = path.nodes.indexOf(place.node);
      const next = path.nodes[k + 1];
      const leaving = c.paths.filter((p) => {
        const j = p.nodes.indexOf(place.node);
        return p !== path && j >= 0 && p.nodes[j + 1] !== next;
      });
      junctions.push({ item: name, at: span.from, receivers: leaving.map((p) => p.receiver) });
    }
  }
  items.sort((a, b) => a.from - b.from || a.to - b.to);
  return { items, junctions };
}

export function finishRouteMap(taps: RouteMapTaps, ladder: Ladder, dt: number): RouteMapRecord {
  const c = ladder.circuit;
  const positions = Float64Array.from(taps.nodes, (k) => ladder.position[k]);
  const paths: RouteMapPath[] = c.paths.map((path, n) => ({
    receiver: path.receiver,
    ...(c.sources.length > 1 ? { net: c.sources[path.source].name } : {}),
    columns: taps.pathColumns[n],
    positions: Float64Array.from(taps.pathColumns[n], (col) => positions[col]),
    ...pathLayout(ladder, c, path),
  }));
  return {
    positions,
    dtRow: taps.stepStride * dt,
    values: ndarray(taps.data, [taps.rows, taps.nodes.length]),
    items: [...c.items].map(([name, place]) => itemSpan(ladder, name, place)),
    paths,
  };
}
