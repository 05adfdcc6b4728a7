// The compile step between a validated net and every solver and view: the route tree becomes a
// node–element graph. Nodes are the places where elements meet; elements are line segments between
// two nodes, lumped parts between two nodes or from a node to a rail, and sources (a Thevenin driver
// at a node). Receivers and probes are resolved to nodes once, here, and every path from a source
// to a receiver is listed for the views that walk one.
//
// Nothing here assumes one source, one connected graph or a tree: a segment is {from, to}, a part
// {p, q | RAIL}, and a path is a list of legs. Today's scenarios compile to a tree rooted at the
// driver pin (a chain when there are no branch items); `from` is then the end nearer the driver.
import { NetError, type NetProblem } from './errors.js';
import type { CoupledLine } from './coupled/line.js';
import type { CoupledSpec, LineRLGC, Net, NamedReceiver, Part, RouteItem, RunSettings, Signal } from './model.js';
import { mainReceiver } from './route-tree.js';

/** The far end of a part tied to its rail (the part's `rail` voltage; AC ground in the spectral solver). */
export const RAIL = -1;

export interface CircuitNode {
  /** What the node is, for messages: "the driver pin", "receiver 'ram2'", "after 'r1'", "junction 'tee1'". */
  label: string;
  /** The net the node belongs to: the index of its source (0 for the first net). */
  net: number;
}

export interface LineSegment {
  /** The route item's name. */
  name: string;
  from: number;
  to: number;
  line: LineRLGC;
  length: number;
  /** Set when the segment is a conductor of a coupled section (Circuit.coupled[section]). */
  coupling?: { section: number; conductor: number };
}

/** A coupled section: its conductors' segments (matrix order), all of one length. */
export interface CoupledPlace {
  name: string;
  line: CoupledLine;
  length: number;
  segments: number[];
}

export type PartRole = 'series' | 'shunt' | 'receiver';

export interface LumpedPart {
  /** The route item or receiver the part belongs to. */
  item: string;
  role: PartRole;
  p: number;
  /** The other node, or RAIL for a part to its rail. */
  q: number;
  part: Part;
}

/** A Thevenin source: `signal` behind `resistance` (0 = ideal) into `node`. */
export interface Source {
  name: string;
  node: number;
  resistance: number;
  signal: Signal;
}

export interface ReceiverPlace {
  name: string;
  node: number;
  /** Indices into Circuit.parts; empty = an open end. */
  parts: number[];
}

export type ItemPlace =
  | { kind: 'line'; segment: number; from: number; to: number }
  | { kind: 'series'; part: number; from: number; to: number }
  | { kind: 'shunt'; node: number; parts: number[] }
  | { kind: 'branch'; node: number; receivers: string[] };

export type ProbePlace = { kind: 'node'; node: number } | { kind: 'line'; segment: number; position: number };

export interface CircuitProbe {
  name: string;
  place: ProbePlace;
}

/** One step of a path: a segment or a series part, traversed from nodes[k] to nodes[k+1]. */
export type PathLeg = { kind: 'segment'; index: number } | { kind: 'part'; index: number };

/** The way from a source's node to a receiver's node. */
export interface CircuitPath {
  source: number;
  receiver: string;
  /** Nodes along the path, from the source's node to the receiver's. */
  nodes: number[];
  /** legs[k] joins nodes[k] to nodes[k + 1]. */
  legs: PathLeg[];
}

export interface Circuit {
  title: string;
  nodes: CircuitNode[];
  segments: LineSegment[];
  parts: LumpedPart[];
  sources: Source[];
  receivers: ReceiverPlace[];
  /** Every route item by name. */
  items: Map<string, ItemPlace>;
  probes: CircuitProbe[];
  /** One per receiver reachable from a source; the main receiver's path first. */
  paths: CircuitPath[];
  /** Coupled sections (multi-net scenarios); empty for a single net. */
  coupled: CoupledPlace[];
  run: RunSettings;
}

interface Walk {
  nodes: number[];
  legs: PathLeg[];
}

class Compiler {
  readonly c: Circuit;
  private readonly problems: NetProblem[] = [];
  private readonly receiverPaths = new Map<string, CircuitPath>();

  constructor(net: Net) {
    this.c = { title: net.title, nodes: [], segments: [], parts: [], sources: [], receivers: [], items: new Map(), probes: [], paths: [], coupled: [], run: net.run };
  }

  /** The net the nodes being made belong to (a source index). */
  net = 0;

  node(label: string): number {
    return this.c.nodes.push({ label, net: this.net }) - 1;
  }

  part(item: string, role: PartRole, p: number, q: number, part: Part): number {
    return this.c.parts.push({ item, role, p, q, part }) - 1;
  }

  /** Compiles `route` from `start`, then its receiver; returns the receiver's node. */
  route(route: readonly RouteItem[], start: number, walk: Walk, receiver: NamedReceiver, where: string): void {
    let node = start;
    route.forEach((item, k) => {
      const path = `${where}[${k}]`;
      if (this.c.items.has(item.name) || this.receiverPaths.has(item.name)) {
        this.problems.push({ path, message: `the name '${item.name}' is used twice (item and receiver names must be unique)` });
      }
      if (item.kind === 'line') {
        const to = this.node(`end of '${item.name}'`);
        const index = this.c.segments.push({ name: item.name, from: node, to, line: item.line, length: item.length }) - 1;
        this.c.items.set(item.name, { kind: 'line', segment: index, from: node, to });
        walk.legs.push({ kind: 'segment', index });
        walk.nodes.push(to);
        node = to;
      } else if (item.kind === 'series') {
        const to = this.node(`after '${item.name}'`);
        const index = this.part(item.name, 'series', node, to, item.part);
        this.c.items.set(item.name, { kind: 'series', part: index, from: node, to });
        walk.legs.push({ kind: 'part', index });
        walk.nodes.push(to);
        node = to;
      } else if (item.kind === 'shunt') {
        const parts = item.parts.map((p) => this.part(item.name, 'shunt', node, RAIL, p));
        this.c.items.set(item.name, { kind: 'shunt', node, parts });
      } else {
        const at = node;
        this.c.nodes[at].label = `junction '${item.name}'`;
        const place: ItemPlace = { kind: 'branch', node: at, receivers: [] };
        this.c.items.set(item.name, place);
        item.branches.forEach((b, j) => {
          const before = this.receiverPaths.size;
          this.route(b.route, at, { nodes: [...walk.nodes], legs: [...walk.legs] }, b.receiver, `${path}.branch[${j}].route`);
          place.receivers.push(...[...this.receiverPaths.keys()].slice(before));
        });
      }
    });
    if (this.receiverPaths.has(receiver.name) || this.c.items.has(receiver.name)) {
      this.problems.push({ path: where === 'route' ? 'receiver' : where.replace(/\.route$/, '.receiver'), message: `the receiver name '${receiver.name}' is used twice (item and receiver names must be unique)` });
    }
    if (!/junction/.test(this.c.nodes[node].label)) this.c.nodes[node].label = `receiver '${receiver.name}'`;
    const parts = receiver.parts.map((p) => this.part(receiver.name, 'receiver', node, RAIL, p));
    this.c.receivers.push({ name: receiver.name, node, parts });
    this.receiverPaths.set(receiver.name, { source: this.net, receiver: receiver.name, nodes: walk.nodes, legs: walk.legs });
  }

  probes(net: Net): void {
    const receiverNode = new Map(this.c.receivers.map((r) => [r.name, r.node]));
    net.probes.forEach((p, n) => {
      const path = `probes[${n}]`;
      const place = this.probePlace(p, receiverNode, path);
      if (place) this.c.probes.push({ name: p.name, place });
    });
  }

  private probePlace(p: Net['probes'][number], receiverNode: Map<string, number>, path: string): ProbePlace | undefined {
    if (p.at === 'driver') {
      const source = p.net === undefined ? this.c.sources[0] : this.c.sources.find((s) => s.name === p.net);
      if (!source) this.problems.push({ path, message: `no net named '${p.net}' (nets: ${this.c.sources.map((s) => s.name).join(', ')})` });
      return source ? { kind: 'node', node: source.node } : undefined;
    }
    if (p.at === 'receiver') {
      const name = p.receiver ?? this.c.paths[0].receiver;
      const node = receiverNode.get(name);
      if (node === undefined) this.problems.push({ path, message: `no receiver named '${name}' (receivers: ${[...receiverNode.keys()].join(', ')})` });
      return node === undefined ? undefined : { kind: 'node', node };
    }
    const place = this.c.items.get(p.item);
    if (!place) {
      this.problems.push({ path, message: `no route item named '${p.item}'` });
      return undefined;
    }
    if (p.at === 'line') {
      if (place.kind !== 'line') {
        this.problems.push({ path, message: `'${p.item}' is not a line` });
        return undefined;
      }
      const seg = this.c.segments[place.segment];
      if (!(p.position >= 0) || p.position > seg.length * (1 + 1e-12)) {
        this.problems.push({ path, message: `position ${p.position} m lies outside '${p.item}'` });
        return undefined;
      }
      return { kind: 'line', segment: place.segment, position: Math.min(p.position, seg.length) };
    }
    if (p.at === 'series') {
      if (place.kind !== 'series') {
        this.problems.push({ path, message: `'${p.item}' is not a series part` });
        return undefined;
      }
      return { kind: 'node', node: p.side === 'in' ? place.from : place.to };
    }
    if ((p.at === 'shunt' && place.kind === 'shunt') || (p.at === 'branch' && place.kind === 'branch')) return { kind: 'node', node: place.node };
    this.problems.push({ path, message: `'${p.item}' is a ${place.kind} item, not a ${p.at} item` });
    return undefined;
  }

  finish(): Circuit {
    if (this.problems.length) throw new NetError(this.problems);
    return this.c;
  }

  paths(mainName: string): void {
    const main = this.receiverPaths.get(mainName)!;
    this.c.paths = [main, ...[...this.receiverPaths.values()].filter((p) => p !== main)];
  }

  /** A net's driver pin, source and route (the first net has source 0). */
  net_(name: string, driver: Net['driver'], route: readonly RouteItem[], receiver: NamedReceiver, where: string): void {
    this.net = this.c.sources.length;
    const pin = this.node(this.net === 0 ? 'the driver pin' : `the driver pin of '${name}'`);
    this.c.sources.push({ name, node: pin, resistance: driver.resistance, signal: driver.signal });
    this.route(route, pin, { nodes: [pin], legs: [] }, receiver, where);
  }

  /**
   * Coupled sections: each conductor a line item (of any net) of the section's length, no segment in
   * two sections. The segment keeps its self terms as its `line`; the kernel uses the matrices.
   */
  coupled(specs: readonly CoupledSpec[]): void {
    specs.forEach((spec, n) => {
      const path = `coupled.${spec.name}`;
      const segments: number[] = [];
      spec.conductors.forEach((item, j) => {
        const place = this.c.items.get(item);
        if (!place || place.kind !== 'line') {
          this.problems.push({ path: `${path}.conductors[${j}]`, message: place ? `'${item}' is a ${place.kind} item, not a line` : `no line item named '${item}'` });
          return;
        }
        const seg = this.c.segments[place.segment];
        if (seg.coupling) {
          this.problems.push({ path: `${path}.conductors[${j}]`, message: `'${item}' is already a conductor of coupled section '${this.c.coupled[seg.coupling.section]?.name ?? specs[seg.coupling.section].name}' (a segment is coupled once)` });
          return;
        }
        seg.coupling = { section: n, conductor: j };
        if (j < spec.line.k) seg.line = selfLine(spec.line, j);
        segments.push(place.segment);
      });
      for (const key of ['r', 'g'] as const) {
        const m = spec.line[key];
        const k = spec.line.k;
        if (m && m.some((x, e) => x !== 0 && e % (k + 1) !== 0)) {
          this.problems.push({ path: `${path}.${key}`, message: `off-diagonal ${key.toUpperCase()} terms (a shared return's ${key === 'r' ? 'resistance' : 'leakage between conductors'}) are not supported in runs yet; give ${key.toUpperCase()} per conductor on the diagonal` });
        }
      }
      if (spec.conductors.length !== spec.line.k) this.problems.push({ path: `${path}.conductors`, message: `${spec.conductors.length} conductors for ${spec.line.k}×${spec.line.k} matrices` });
      const lengths = segments.map((s) => this.c.segments[s].length);
      if (lengths.some((x) => Math.abs(x - lengths[0]) > 1e-9 * Math.max(lengths[0], 1e-12))) {
        this.problems.push({ path, message: `the conductors must have the same length: ${segments.map((s) => `'${this.c.segments[s].name}' ${this.c.segments[s].length} m`).join(', ')}` });
      }
      this.c.coupled.push({ name: spec.name, line: spec.line, length: lengths[0] ?? 0, segments });
    });
  }
}

/**
 * The net as a node–element graph: node 0 is the driver pin, elements follow the route tree in file
 * order (a branch item's branches before the items after it), receivers and probes resolved.
 * Throws NetError listing every probe that does not resolve and every name used twice.
 */
export function compileNet(net: Net): Circuit {
  const k = new Compiler(net);
  const main = mainReceiver(net);
  k.net_(net.netName ?? 'driver', net.driver, net.route, main, 'route');
  for (const side of net.nets ?? []) {
    k.net_(side.name, side.driver, side.route, { name: side.receiverName ?? side.name, parts: side.receiver }, `nets.${side.name}.route`);
  }
  k.paths(main.name);
  k.coupled(net.coupled ?? []);
  k.probes(net);
  return k.finish();
}

/** A conductor's self terms (L_ii, C_ii, R_ii, G_ii): what it would be with its neighbours' coupling ignored. */
export function selfLine(line: CoupledLine, j: number): LineRLGC {
  const d = j * (line.k + 1);
  return { r: line.r?.[d] ?? 0, l: line.l[d], g: line.g?.[d] ?? 0, c: line.c[d] };
}

/** Total one-way delay along a path (s). */
export function pathDelay(c: Circuit, path: CircuitPath): number {
  let td = 0;
  for (const leg of path.legs) {
    if (leg.kind === 'segment') {
      const s = c.segments[leg.index];
      td += s.length * Math.sqrt(s.line.l * s.line.c);
    }
  }
  return td;
}

/** The longest one-way delay from a source to a receiver (s); 0 without lines. */
export function longestPathDelay(c: Circuit): number {
  return c.paths.reduce((m, p) => Math.max(m, pathDelay(c, p)), 0);
}
