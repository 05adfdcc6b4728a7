// The lattice (bounce) diagram of a branched net, drawn along one path from the driver pin to a
// chosen receiver. Lossless lines between resistive networks still have an exact lattice solution on a
// tree: every wave reaching a line's end meets a resistive network with the other lines' Z0 as their
// terminations, and leaves as one reflected wave and one transmitted wave into every other line there.
//
// Per network (a "cluster": nodes joined by parts, with the ends of the lines as ports), the nodal
// method gives the scattering at once: an incident wave a on port i is a Norton source 2a/Z0_i behind
// 1/Z0_i (Bergeron's equivalent of a lossless line end); with every port terminated by its line's Z0,
//   V = G⁻¹·e_i·2a/Z0_i,   outgoing wave on port j: b_j = V_j − δ_ij·a,
// which at k equal lines meeting in a bare junction gives Γ = (Z0/(k−1) − Z0)/(Z0/(k−1) + Z0) and
// 1 + Γ into each other line (Pozar, Microwave Engineering, 4th ed., ch. 2; Johnson & Graham,
// High-Speed Digital Design, ch. 4). The driver's step ΔV is a Norton source ΔV/R_S. The voltage at
// any node of a cluster is the same solve's V, so the plateaus at the driver pin and the receiver
// follow from the waves reaching their clusters. DC levels: the network with the lines as wires.
//
// Every wave on every line is followed; the diagram keeps those on the chosen path and marks the
// waves that enter the path from a branch.
import { compileNet, RAIL, type Circuit, type CircuitPath } from '../../sim/circuit.js';
import { defaultDuration } from '../../sim/discretize.js';
import type { Net } from '../../sim/model.js';
import { allItems } from '../../sim/route-tree.js';
import { rampDuration } from '../../sim/signals.js';
import type { DcLevels, LatticeArrival, LatticeBoundary, LatticeDiagram, LatticeOptions, LatticeResult, LatticeSegment, LatticeWave, SideArrival, SourceEdge } from './lattice.js';
import { toPlateaus, type PlateauStep } from './lattice.js';
import { mergeWires, nodalInverse, type Conductance } from './resistive-nodes.js';
import { WaveHeap } from './wave-heap.js';

export interface TreeLatticeOptions extends LatticeOptions {
  /** The receiver whose path is drawn (default: the main receiver). */
  path?: string;
}

/** Why the exact lattice of this (idealised) tree cannot be computed; empty when it can. */
export function treeLatticeLimitations(net: Net): string[] {
  const reasons: string[] = [];
  if (net.driver.signal.kind !== 'step') reasons.push(`the driver's signal is a ${net.driver.signal.kind}; the lattice is drawn for steps`);
  let lines = 0;
  for (const it of allItems(net.route)) {
    if (it.kind === 'line') {
      if (it.length > 0) lines++;
      const l = it.line;
      if (l.wideband || l.series?.length || l.shunt?.length || l.r > 0 || l.g > 0) reasons.push(`segment '${it.name}' is lossy: waves shrink and spread as they travel`);
    }
  }
  const c = compileNet(net);
  for (const p of c.parts) if (p.part.c !== undefined || p.part.l > 0) reasons.push(`'${p.item}' has a capacitor or an inductor: reflections there change with time`);
  if (lines === 0) reasons.push('the route has no line segment: there is nothing for waves to travel on');
  return reasons;
}

/** One line end: segment k's `from` end (side 0) or `to` end (side 1). */
interface Port {
  segment: number;
  side: 0 | 1;
  node: number;
  z0: number;
}

/** A resistive network between line ends, solved once. */
interface Cluster {
  ports: number[];
  /** scatter[j][i]: outgoing wave on ports[j] per unit wave arriving on ports[i]. */
  scatter: number[][];
  /** Outgoing wave on each port per volt of the driver's step (zero when the driver is elsewhere). */
  launch: number[];
  /** Voltage of each watched node (by node index) per unit wave arriving on ports[i], and per volt of step. */
  watch: Map<number, { perWave: number[]; perStep: number }>;
}

interface TreeWave {
  segment: number;
  direction: 1 | -1;
  t0: number;
  amplitude: number;
  bounces: number;
}

class TreeScatter {
  readonly ports: Port[] = [];
  /** Port index by segment*2+side. */
  readonly portOf = new Map<number, number>();
  readonly clusterOfPort: number[] = [];
  readonly clusters: Cluster[] = [];
  readonly clusterOfNode = new Map<number, number>();
  readonly delays: number[];

  constructor(readonly c: Circuit, watched: readonly number[]) {
    const live = (k: number) => c.segments[k].length > 0;
    const { sets, held, conductances } = mergeWires(c, (k) => !live(k));
    this.delays = c.segments.map((s) => s.length * Math.sqrt(s.line.l * s.line.c));
    c.segments.forEach((s, k) => {
      if (!live(k)) return;
      const z0 = Math.sqrt(s.line.l / s.line.c);
      for (const side of [0, 1] as const) {
        this.portOf.set(2 * k + side, this.ports.length);
        this.ports.push({ segment: k, side, node: sets.find(side === 0 ? s.from : s.to), z0 });
      }
    });
    // clusters: merged nodes joined by conductances between nodes
    const groups = new Map<number, number>();
    const rootOf = new Map<number, number>();
    const find = (n: number): number => {
      while (rootOf.has(n) && rootOf.get(n) !== n) n = rootOf.get(n)!;
      return n;
    };
    const nodesUsed = new Set<number>([...this.ports.map((p) => p.node), sets.find(c.sources[0].node), ...watched.map((w) => sets.find(w))]);
    for (const k of conductances) {
      nodesUsed.add(k.p);
      if (k.q !== RAIL) nodesUsed.add(k.q);
    }
    for (const n of nodesUsed) rootOf.set(n, n);
    for (const k of conductances) if (k.q !== RAIL && !held.has(k.p) && !held.has(k.q)) rootOf.set(find(k.p), find(k.q));
    for (const n of nodesUsed) {
      const r = find(n);
      if (!groups.has(r)) groups.set(r, groups.size);
    }
    const members: number[][] = [...groups.keys()].map(() => []);
    for (const n of nodesUsed) members[groups.get(find(n))!].push(n);
    c.nodes.forEach((_, n) => {
      const m = sets.find(n);
      if (nodesUsed.has(m)) this.clusterOfNode.set(n, groups.get(find(m))!);
    });
    const source = c.sources[0];
    members.forEach((nodes, g) => this.clusters.push(this.solveCluster(nodes, g, conductances, held, sets.find(source.node), source.resistance, watched.map((w) => [w, sets.find(w)]))));
  }

  private solveCluster(
    nodes: number[],
    g: number,
    conductances: readonly Conductance[],
    held: ReadonlyMap<number, number>,
    sourceNode: number,
    rs: number,
    watched: [number, number][],
  ): Cluster {
    const inCluster = new Set(nodes);
    const ports = this.ports.map((_, i) => i).filter((i) => inCluster.has(this.ports[i].node));
    ports.forEach((i) => (this.clusterOfPort[i] = g));
    const unknowns = nodes.filter((n) => !held.has(n));
    const extra = new Map<number, number>();
    const add = (n: number, y: number) => extra.set(n, (extra.get(n) ?? 0) + y);
    for (const i of ports) add(this.ports[i].node, 1 / this.ports[i].z0);
    const hasSource = inCluster.has(sourceNode);
    if (hasSource) add(sourceNode, 1 / rs);
    const solved = nodalInverse(unknowns, conductances, held, extra);
    // a floating cluster cannot occur: every unknown has a port or the source (1/Z0, 1/R_S) to ground
    const v = (row: number, col: number): number => {
      if (!solved) return 0;
      const i = solved.index.get(row), j = solved.index.get(col);
      return i === undefined || j === undefined ? 0 : solved.inv[i * unknowns.length + j];
    };
    const scatter = ports.map((j) => ports.map((i) => v(this.ports[j].node, this.ports[i].node) * (2 / this.ports[i].z0) - (i === j ? 1 : 0)));
    const launch = ports.map((j) => (hasSource ? v(this.ports[j].node, sourceNode) / rs : 0));
    const watch = new Map<number, { perWave: number[]; perStep: number }>();
    for (const [node, m] of watched) {
      if (!inCluster.has(m)) continue;
      watch.set(node, { perWave: ports.map((i) => v(m, this.ports[i].node) * (2 / this.ports[i].z0)), perStep: hasSource ? v(m, sourceNode) / rs : 0 });
    }
    return { ports, scatter, launch, watch };
  }

  /** The port a wave on `segment` travelling in `direction` arrives at. */
  arrivalPort(segment: number, direction: 1 | -1): number {
    return this.portOf.get(2 * segment + (direction > 0 ? 1 : 0))!;
  }
}

/** DC node voltages with the driver's source at `vs`, every line a wire. */
function dcVoltages(c: Circuit, vs: number): (node: number) => number {
  const { sets, held, conductances } = mergeWires(c, () => true);
  const source = c.sources[0];
  const unknowns = [...new Set(c.nodes.map((_, n) => sets.find(n)))].filter((n) => !held.has(n));
  const extra = new Map<number, number>([[sets.find(source.node), 1 / source.resistance]]);
  const solved = nodalInverse(unknowns, conductances, held, extra);
  const rhs = new Float64Array(unknowns.length);
  const idx = (n: number) => (solved ? solved.index.get(n) : undefined);
  for (const k of conductances) {
    const a = idx(k.p), b = k.q === RAIL ? undefined : idx(k.q);
    const other = (n: number) => (n === RAIL ? k.rail : held.get(n));
    if (a !== undefined && b === undefined) rhs[a] += k.g * (other(k.q) ?? 0);
    if (b !== undefined && a === undefined) rhs[b] += k.g * (held.get(k.p) ?? 0);
  }
  const s = idx(sets.find(source.node));
  if (s !== undefined) rhs[s] += vs / source.resistance;
  const v = new Map<number, number>(held);
  if (solved) {
    const n = unknowns.length;
    unknowns.forEach((u, i) => {
      let acc = 0;
      for (let j = 0; j < n; j++) acc += solved.inv[i * n + j] * rhs[j];
      v.set(u, acc);
    });
  }
  // a node with no DC path anywhere (behind a series capacitor that became an open) idles at 0 V
  return (node) => v.get(sets.find(node)) ?? 0;
}

/** Where the path runs: its live segments with their span from the driver pin. */
function pathSegments(c: Circuit, path: CircuitPath, delays: readonly number[]): { segments: LatticeSegment[]; index: Map<number, number> } {
  const segments: LatticeSegment[] = [];
  const index = new Map<number, number>();
  let x = 0;
  for (const leg of path.legs) {
    if (leg.kind !== 'segment') continue;
    const s = c.segments[leg.index];
    if (!(s.length > 0)) continue;
    index.set(leg.index, segments.length);
    segments.push({ name: s.name, from: x, to: x + s.length, z0: Math.sqrt(s.line.l / s.line.c), delay: delays[leg.index], velocity: s.length / delays[leg.index] });
    x += s.length;
  }
  return { segments, index };
}

const zSeen = (gamma: number, z0: number): number => (gamma >= 1 - 1e-12 ? Infinity : (z0 * (1 + gamma)) / (1 - gamma));

/**
 * The exact lattice of a lossless tree with resistive parts and a step source, along the path to
 * `options.path` (default the main receiver), or the reasons it cannot be computed.
 */
export function treeLatticeDiagram(net: Net, options: TreeLatticeOptions = {}): LatticeResult {
  const reasons = treeLatticeLimitations(net);
  const c = compileNet(net);
  const path = options.path === undefined ? c.paths[0] : c.paths.find((p) => p.receiver === options.path);
  if (!path) reasons.push(`no receiver named '${options.path}' (receivers: ${c.paths.map((p) => p.receiver).join(', ')})`);
  if (reasons.length || !path) return { supported: false, reasons };
  const sig = net.driver.signal;
  if (sig.kind !== 'step') throw new Error('unreachable');
  const pin = c.sources[0].node;
  const rxNode = path.nodes[path.nodes.length - 1];
  const tree = new TreeScatter(c, [pin, rxNode]);
  const { segments, index: onPath } = pathSegments(c, path, tree.delays);
  if (segments.length === 0) return { supported: false, reasons: [`the path to '${path.receiver}' has no line segment: there is nothing for waves to travel on`] };

  const dv = sig.to - sig.from;
  const t50 = sig.start + rampDuration(sig.rise) / 2;
  const edges: readonly SourceEdge[] = options.edges ?? [{ time: t50, step: dv }];
  const horizon = options.horizon ?? net.run.duration ?? defaultDuration(c);
  const firstPort = tree.portOf.get(2 * [...onPath.keys()][0])!;
  const srcCluster = tree.clusters[tree.clusterOfPort[firstPort]];
  const launchPerVolt = srcCluster.launch[srcCluster.ports.indexOf(firstPort)];
  const amplitude = dv * launchPerVolt;
  const floor = Math.max(1e-300, Math.min(...edges.map((e) => Math.abs(e.step * launchPerVolt))) * (options.floor ?? 1e-3));
  const maxBounces = options.maxBounces ?? 32;
  const maxWaves = options.maxWaves ?? 4000;

  // boundaries along the path: the driver end, each path cluster between two path segments, the receiver end
  const pathSegs = [...onPath.keys()];
  const boundaryOfCluster = new Map<number, number>();
  const boundaries: LatticeBoundary[] = pathBoundaries(c, tree, pathSegs, segments, boundaryOfCluster);

  const followed = followWaves(tree, c, { onPath, segments, boundaries, boundaryOfCluster }, { edges, horizon, floor, maxBounces, maxWaves }, [pin, rxNode]);
  const { waves, arrivals, sideArrivals, watchSteps, truncated, complete } = followed;

  const finalLevel = sig.from + edges.filter((e) => e.time <= horizon).reduce((a, e) => a + e.step, 0);
  const levels = (vs: number): DcLevels => {
    const v = dcVoltages(c, vs);
    return { pin: v(pin), segments: pathSegs.map((k) => v(c.segments[k].from)), receiver: v(rxNode) };
  };
  const dc = { before: levels(sig.from), after: levels(finalLevel) };
  const plateau = (node: number, initial: number) => toPlateaus(watchSteps.get(node)!, complete, (line) => initial + line, initial);
  const z0 = segments[0].z0;
  const gS = boundaries[0].gammaFromRight!;
  const rTh = zSeen(gS, z0);
  return {
    supported: true,
    segments,
    boundaries,
    launch: {
      time: t50,
      stepVoltage: dv,
      sourceResistance: c.sources[0].resistance,
      theveninVoltage: rTh === Infinity ? 0 : (amplitude * (rTh + z0)) / z0,
      theveninResistance: rTh,
      z0,
      amplitude,
    },
    waves,
    arrivals,
    edges: edges.filter((e) => e.time <= horizon),
    dc,
    plateaus: { driver: plateau(pin, dc.before.pin), receiver: plateau(rxNode, dc.before.receiver) },
    horizon: complete,
    truncated,
    path: { receiver: path.receiver, receivers: c.paths.map((p) => p.receiver) },
    sideArrivals,
  };
}

/** The drawn path: its lines (circuit index → path index), their spans, its boundaries by cluster. */
interface PathView {
  onPath: Map<number, number>;
  segments: LatticeSegment[];
  boundaries: LatticeBoundary[];
  boundaryOfCluster: Map<number, number>;
}

interface FollowLimits {
  edges: readonly SourceEdge[];
  horizon: number;
  floor: number;
  maxBounces: number;
  maxWaves: number;
}

/**
 * Every wave on every line, in order of launch time, from the driver's edges on: at each line end the
 * cluster's scattering sends it on into every line there. Waves on the path are kept, with their
 * arrivals at its boundaries; waves entering the path from elsewhere are kept as side arrivals; the
 * voltage steps at the watched nodes are collected for their plateaus.
 */
function followWaves(tree: TreeScatter, c: Circuit, view: PathView, limits: FollowLimits, watched: readonly number[]) {
  const { onPath, segments, boundaries, boundaryOfCluster } = view;
  const { edges, horizon, floor, maxBounces, maxWaves } = limits;
  // every line's waves are followed; the path keeps up to maxWaves of them
  const maxFollowed = 20 * maxWaves;
  const heap = new WaveHeap<TreeWave>();
  const pending = new Map<string, TreeWave>();
  const key = (seg: number, dir: number, t: number) => `${seg}:${dir}:${t.toPrecision(12)}`;
  const launchWave = (segment: number, direction: 1 | -1, t0: number, a: number, bounces: number) => {
    const k = key(segment, direction, t0);
    const prev = pending.get(k);
    if (prev) {
      prev.amplitude += a;
      prev.bounces = Math.min(prev.bounces, bounces);
      return;
    }
    const w = { segment, direction, t0, amplitude: a, bounces };
    pending.set(k, w);
    heap.push(w);
  };
  // the driver's edges launch waves into every line of the driver's cluster
  const sourceCluster = tree.clusters.find((cl) => cl.launch.some((x) => x !== 0));
  for (const e of edges) {
    if (e.time > horizon || !sourceCluster) continue;
    sourceCluster.ports.forEach((p, j) => {
      const a = e.step * sourceCluster.launch[j];
      if (a !== 0) launchWave(tree.ports[p].segment, tree.ports[p].side === 0 ? 1 : -1, e.time, a, 0);
    });
  }

  const waves: LatticeWave[] = [];
  const arrivals: LatticeArrival[] = [];
  const sideArrivals: SideArrival[] = [];
  const watchSteps = new Map<number, PlateauStep[]>(watched.map((n) => [n, []]));
  for (const e of edges) {
    if (e.time > horizon) continue;
    for (const [node, steps] of watchSteps) {
      const w = tree.clusters[tree.clusterOfNode.get(node)!]?.watch.get(node);
      if (w && w.perStep !== 0) steps.push([e.time, e.step * w.perStep, 0]);
    }
  }
  let truncated = false;
  let complete = horizon;
  let followed = 0;
  for (let w = heap.pop(); w; w = heap.pop()) {
    pending.delete(key(w.segment, w.direction, w.t0));
    if (w.t0 > horizon) break;
    if (Math.abs(w.amplitude) < floor) continue;
    if (waves.length >= maxWaves || followed >= maxFollowed || w.bounces > maxBounces) {
      truncated = true;
      complete = Math.min(complete, w.t0);
      if (waves.length >= maxWaves || followed >= maxFollowed) break;
      continue;
    }
    followed++;
    const t1 = w.t0 + tree.delays[w.segment];
    const k = onPath.get(w.segment);
    if (k !== undefined) {
      const s = segments[k];
      waves.push({ segment: k, direction: w.direction, t0: w.t0, t1, x0: w.direction > 0 ? s.from : s.to, x1: w.direction > 0 ? s.to : s.from, amplitude: w.amplitude, bounces: w.bounces });
    }
    const port = tree.arrivalPort(w.segment, w.direction);
    const g = tree.clusterOfPort[port];
    const cl = tree.clusters[g];
    const i = cl.ports.indexOf(port);
    const into = { towardsDriver: 0, towardsReceiver: 0 };
    cl.ports.forEach((p, j) => {
      const out = cl.scatter[j][i] * w.amplitude;
      if (out === 0) return;
      const seg = tree.ports[p].segment;
      if (onPath.has(seg) && k === undefined) into[tree.ports[p].side === 0 ? 'towardsReceiver' : 'towardsDriver'] += out;
      launchWave(seg, tree.ports[p].side === 0 ? 1 : -1, t1, out, w.bounces + (p === port ? 1 : 0));
    });
    for (const [node, steps] of watchSteps) {
      const watch = cl.watch.get(node);
      if (watch) steps.push([t1, watch.perWave[i] * w.amplitude, 0]);
    }
    const b = boundaryOfCluster.get(g);
    if (b === undefined) continue;
    if (k !== undefined) {
      const reflected = cl.scatter[i][i] * w.amplitude;
      const onward = cl.ports.filter((p) => p !== port && onPath.has(tree.ports[p].segment));
      const transmitted = onward.reduce((a, p) => a + cl.scatter[cl.ports.indexOf(p)][i] * w.amplitude, 0);
      arrivals.push({ time: t1, boundary: b, position: boundaries[b].position, from: w.direction, incident: w.amplitude, reflected, transmitted });
    } else if (into.towardsDriver !== 0 || into.towardsReceiver !== 0) {
      sideArrivals.push({ time: t1, boundary: b, position: boundaries[b].position, from: c.segments[w.segment].name, incident: w.amplitude, ...into });
    }
  }
  arrivals.sort((p, q) => p.time - q.time || p.boundary - q.boundary);
  return { waves, arrivals, sideArrivals, watchSteps, truncated, complete };
}

/** The driver end, the junctions between consecutive path segments and the receiver end, with the path's Γ and τ. */
function pathBoundaries(c: Circuit, tree: TreeScatter, pathSegs: readonly number[], segments: readonly LatticeSegment[], boundaryOfCluster: Map<number, number>): LatticeBoundary[] {
  const out: LatticeBoundary[] = [];
  const entry = (portIndex: number) => {
    const g = tree.clusterOfPort[portIndex];
    const cl = tree.clusters[g];
    return { g, cl, at: cl.ports.indexOf(portIndex) };
  };
  const side = (g: number, except: readonly string[]) => {
    const cl = tree.clusters[g];
    const items = new Set<string>();
    for (const p of c.parts) if (tree.clusterOfNode.get(p.p) === g && (p.q === RAIL || tree.clusterOfNode.get(p.q) === g)) items.add(p.item);
    for (const [name, place] of c.items) if (place.kind === 'branch' && tree.clusterOfNode.get(place.node) === g) items.add(name);
    const branches = cl.ports.map((p) => c.segments[tree.ports[p].segment].name).filter((n) => !except.includes(n));
    return { items: [...items], branches };
  };
  const n = segments.length;
  for (let k = 0; k <= n; k++) {
    const left = k > 0 ? entry(tree.portOf.get(2 * pathSegs[k - 1] + 1)!) : undefined;
    const right = k < n ? entry(tree.portOf.get(2 * pathSegs[k])!) : undefined;
    const g = (left ?? right)!.g;
    boundaryOfCluster.set(g, k);
    const names = [k > 0 ? segments[k - 1].name : '', k < n ? segments[k].name : ''];
    const { items, branches } = side(g, names);
    const b: LatticeBoundary = { kind: k === 0 ? 'source' : k === n ? 'load' : 'junction', position: k < n ? segments[k].from : segments[n - 1].to, items, branches };
    if (left) {
      b.gammaFromLeft = left.cl.scatter[left.at][left.at];
      b.zFromLeft = zSeen(b.gammaFromLeft, segments[k - 1].z0);
    }
    if (right) {
      b.gammaFromRight = right.cl.scatter[right.at][right.at];
      b.zFromRight = zSeen(b.gammaFromRight, segments[k].z0);
    }
    if (left && right) {
      b.tauLeftToRight = left.cl.scatter[right.at][left.at];
      b.tauRightToLeft = left.cl.scatter[left.at][right.at];
    }
    out.push(b);
  }
  return out;
}
