// The lattice (bounce) diagram of a net, computed from the scenario alone: every wave launched by a
// step, reflected and transmitted at the ends and junctions of lossless line segments with resistive
// parts, with its time, place and amplitude.
//
// Formulas (any transmission-line text, e.g. Pozar, Microwave Engineering, ch. 2; Johnson & Graham,
// High-Speed Digital Design, ch. 4):
//   launched amplitude   V⁺ = ΔV_th · Z0 / (R_th + Z0)      (R_th, ΔV_th: Thevenin equivalent of the
//                                                            source and any resistors before the line;
//                                                            just R_S and the step ΔV_S when there are none)
//   reflection            Γ = (Z − Z0) / (Z + Z0)           (Z: resistance the wave meets; open Γ = +1)
//   transmission          τ = (1 + Γ) · Π Z_after / (R + Z_after) over the series resistors crossed
//                         (1 + Γ at a plain junction of two segments or a shunt resistor)
// The voltage anywhere is the DC level before the step plus the sum of the waves that have passed.
// Linearity makes rails (termination voltages) only a DC matter: they set the levels before and after
// the step, and are ground for the waves.
import { compileNet } from '../../sim/circuit.js';
import { defaultDuration } from '../../sim/discretize.js';
import type { Net, Part, RouteItem } from '../../sim/model.js';
import { isBranched, isMultiNet } from '../../sim/route-tree.js';
import { rampDuration } from '../../sim/signals.js';
import { WaveHeap } from './wave-heap.js';

export interface LatticeOptions {
  /** Stop following a wave after this many reflections (default 32; passing a junction is not counted). */
  maxBounces?: number;
  /** Drop waves smaller than this fraction of |V⁺| (default 1e-3). */
  floor?: number;
  /** Follow waves launched up to this time (s); default: the net's run duration. */
  horizon?: number;
  /** At most this many waves (default 4000). */
  maxWaves?: number;
  /**
   * The source's edges as ideal steps: the time of each one's 50 % point (s) and its change of level
   * (V), in time order; the first must be the net's step signal. Default: that step alone. By
   * linearity the waves of several edges add up (superposition), each launched like the first.
   */
  edges?: readonly SourceEdge[];
}

/** One edge of the source as an ideal step: its 50 % time and its change of level. */
export interface SourceEdge {
  time: number;
  step: number;
}

export interface LatticeSegment {
  name: string;
  /** Span along the route, metres from the driver pin. */
  from: number;
  to: number;
  z0: number;
  /** One-way delay (s) and velocity (m/s). */
  delay: number;
  velocity: number;
}

/**
 * A place where waves reflect: the driver end (index 0), a junction between segments k−1 and k
 * (index k), the receiver end (index = number of segments).
 */
export interface LatticeBoundary {
  kind: 'source' | 'junction' | 'load';
  position: number;
  /** Names of the series and shunt items at this place, in route order. */
  items: string[];
  /**
   * Resistance a wave meets here, looking away from the line it travels on: from the left (for a
   * right-going wave) and from the right (for a left-going one). The source end has only `fromRight`
   * (the Thevenin resistance of the driver and its resistors), the load end only `fromLeft`.
   */
  zFromLeft?: number;
  zFromRight?: number;
  /** Reflection coefficient for a wave arriving from the left / from the right. */
  gammaFromLeft?: number;
  gammaFromRight?: number;
  /** Transmission coefficient into the next segment, left → right and right → left (junctions). */
  tauLeftToRight?: number;
  tauRightToLeft?: number;
  /** Lines of other paths that meet here (a branched net's junction, drawn along one path). */
  branches?: string[];
}

export interface LatticeWave {
  segment: number;
  /** +1: towards the receiver; −1: towards the driver. */
  direction: 1 | -1;
  /** Launch and arrival times (s) and positions (m). */
  t0: number;
  t1: number;
  x0: number;
  x1: number;
  amplitude: number;
  /** Reflections since the launch (0 for the launched wave; passing a junction does not count). */
  bounces: number;
}

export interface LatticeArrival {
  time: number;
  boundary: number;
  position: number;
  /** +1: the wave came from the left; −1: from the right. */
  from: 1 | -1;
  incident: number;
  reflected: number;
  /** 0 at the ends. */
  transmitted: number;
}

/** A wave reaching the drawn path from a line off it (a branched net): what it sends into the path. */
export interface SideArrival {
  time: number;
  boundary: number;
  position: number;
  /** The line it came along. */
  from: string;
  incident: number;
  /** The waves it launches into the path's lines there: towards the driver, towards the receiver (0 at an end). */
  towardsDriver: number;
  towardsReceiver: number;
}

/** A constant level from `from` to `to` (s); `to` is the next change or the horizon. */
export interface Plateau {
  from: number;
  to: number;
  value: number;
}

export interface LatticeDiagram {
  supported: true;
  segments: LatticeSegment[];
  boundaries: LatticeBoundary[];
  /** The step and the launched wave. */
  launch: {
    /** Time of the step's 50 % point (s): waves start here. */
    time: number;
    /** Step of the source ΔV_S (V) and its resistance R_S (Ω). */
    stepVoltage: number;
    sourceResistance: number;
    /** Thevenin equivalent the first segment sees (equal to ΔV_S, R_S with no resistors before it). */
    theveninVoltage: number;
    theveninResistance: number;
    z0: number;
    /** V⁺ = ΔV_th·Z0/(R_th + Z0). */
    amplitude: number;
  };
  waves: LatticeWave[];
  arrivals: LatticeArrival[];
  /** The source's edges followed (one for a step signal). */
  edges: readonly SourceEdge[];
  /** DC levels with the source before the first edge and after the last one: driver pin, each segment, receiver. */
  dc: { before: DcLevels; after: DcLevels };
  /** Voltage at the driver pin and at the receiver, as steps at the arrival times (ideal step). */
  plateaus: { driver: Plateau[]; receiver: Plateau[] };
  /** Waves are complete up to this time (s). */
  horizon: number;
  /** True when the wave count or bounce limit cut the list before the horizon. */
  truncated: boolean;
  /** A branched net: the receiver whose path is drawn, and every receiver (main first). */
  path?: { receiver: string; receivers: string[] };
  /** A branched net: waves entering the drawn path from the lines off it. */
  sideArrivals?: SideArrival[];
}

export interface DcLevels {
  pin: number;
  segments: number[];
  receiver: number;
}

export type LatticeResult = LatticeDiagram | { supported: false; reasons: string[] };

// ------------------------------------------------------------------------------------------ support

/** Why the lattice method does not apply to this net; empty when it does. */
export function latticeLimitations(net: Net): string[] {
  const reasons: string[] = [];
  const sig = net.driver.signal;
  if (sig.kind !== 'step') {
    reasons.push(`the driver's signal is a ${sig.kind}; the lattice is drawn for a single step`);
  } else if (sig.to === sig.from) {
    reasons.push('the driver’s step has no swing (from = to)');
  }
  const partReason = (where: string, p: Part): string | null => {
    const what: string[] = [];
    if (p.l > 0) what.push(`an inductor (${formatSci(p.l, 'H')})`);
    if (p.c !== undefined) what.push(`a capacitor (${formatSci(p.c, 'F')})`);
    return what.length ? `${where} has ${what.join(' and ')}: reactive parts make reflections change with time` : null;
  };
  let lines = 0;
  for (const item of net.route) {
    if (item.kind === 'line') {
      if (item.length > 0) lines++;
      const l = item.line;
      if (l.series?.length || l.shunt?.length || l.wideband) {
        reasons.push(`segment '${item.name}' has frequency-dependent loss: waves change shape as they travel`);
      } else if (l.r > 0 || l.g > 0) {
        const parts = [l.r > 0 ? `R′ = ${formatSci(l.r, 'Ω/m')}` : '', l.g > 0 ? `G′ = ${formatSci(l.g, 'S/m')}` : ''].filter(Boolean);
        reasons.push(`segment '${item.name}' is lossy (${parts.join(', ')}): waves shrink and spread as they travel`);
      }
    } else if (item.kind === 'series') {
      const r = partReason(`series part '${item.name}'`, item.part);
      if (r) reasons.push(r);
    } else if (item.kind === 'shunt') {
      item.parts.forEach((p, i) => {
        const r = partReason(`shunt '${item.name}'${item.parts.length > 1 ? ` (part ${i + 1})` : ''}`, p);
        if (r) reasons.push(r);
      });
    }
  }
  net.receiver.forEach((p, i) => {
    const r = partReason(`the receiver${net.receiver.length > 1 ? ` (part ${i + 1})` : ''}`, p);
    if (r) reasons.push(r);
  });
  if (lines === 0) reasons.push('the route has no line segment: there is nothing for waves to travel on');
  if (isMultiNet(net)) reasons.push('the scenario has several nets: this view draws one net without coupled sections');
  if (isBranched(net)) reasons.push('the route branches: this function follows one unbranched route (treeLatticeDiagram follows one path of a tree)');
  return reasons;
}

function formatSci(v: number, unit: string): string {
  const prefixes: [number, string][] = [[1e-15, 'f'], [1e-12, 'p'], [1e-9, 'n'], [1e-6, 'µ'], [1e-3, 'm'], [1, ''], [1e3, 'k'], [1e6, 'M']];
  let best = prefixes[5];
  for (const p of prefixes) if (Math.abs(v) >= p[0] * 0.9995) best = p;
  return `${Number((v / best[0]).toPrecision(3))} ${best[1]}${unit}`;
}

// ------------------------------------------------------------------------------ resistive networks

/** Parallel combination that behaves at 0 and Infinity. */
export function parallel(a: number, b: number): number {
  if (a === 0 || b === 0) return 0;
  if (a === Infinity) return b;
  if (b === Infinity) return a;
  return (a * b) / (a + b);
}

/** Resistance of parts in parallel (a part with no elements is a short); Infinity for none. */
function partsResistance(parts: readonly Part[]): number {
  return parts.reduce((z, p) => parallel(z, p.r), Infinity);
}

/** Γ = (Z − Z0)/(Z + Z0), with an open (Infinity) giving +1. */
export function reflectionCoefficient(z: number, z0: number): number {
  return z === Infinity ? 1 : (z - z0) / (z + z0);
}

/** A resistive element of an end or junction network, in route order. */
type Element = { kind: 'series'; r: number } | { kind: 'shunt'; r: number };

function elementsOf(items: readonly RouteItem[]): Element[] {
  const out: Element[] = [];
  for (const it of items) {
    if (it.kind === 'series') out.push({ kind: 'series', r: it.part.r });
    else if (it.kind === 'shunt') out.push({ kind: 'shunt', r: partsResistance(it.parts) });
  }
  return out;
}

/**
 * Looking into `elements` (in order) from their left side with `zEnd` behind the last one: the
 * input resistance and the voltage transfer from the left node to the far side.
 */
export function lookRight(elements: readonly Element[], zEnd: number): { z: number; transfer: number } {
  // impedance behind each element, from the far end back
  let z = zEnd;
  const behind: number[] = new Array(elements.length);
  for (let k = elements.length - 1; k >= 0; k--) {
    behind[k] = z;
    const e = elements[k];
    z = e.kind === 'series' ? e.r + z : parallel(z, e.r);
  }
  let transfer = 1;
  elements.forEach((e, k) => {
    if (e.kind === 'shunt') {
      if (e.r === 0) transfer = 0;
      return;
    }
    const zb = behind[k];
    if (zb === Infinity || e.r === 0) return;
    transfer *= zb + e.r === 0 ? 0 : zb / (zb + e.r);
  });
  return { z, transfer };
}

/** Thevenin equivalent (v, r) of a source (v, r) seen through `elements` (in order, away from it). */
function theveninThrough(v: number, r: number, elements: readonly Element[]): { v: number; r: number } {
  for (const e of elements) {
    if (e.kind === 'series') r += e.r;
    else {
      v = e.r === Infinity ? v : r + e.r === 0 ? 0 : (v * e.r) / (r + e.r);
      r = parallel(r, e.r);
    }
  }
  return { v, r };
}

/**
 * The pin voltage of a source (vs, rs) feeding `elements` whose far side is held at `vFar`:
 * linear in both, returned as coefficients a, b with v_pin = a·vs + b·vFar.
 */
function pinCoefficients(rs: number, elements: readonly Element[]): { a: number; b: number } {
  // Thevenin of the far side (an ideal source of 1 V) seen from the pin.
  const back = theveninThrough(1, 0, [...elements].reverse());
  if (rs === 0) return { a: 1, b: 0 };
  const denom = rs + back.r;
  return { a: back.r / denom, b: (back.v * rs) / denom };
}

// ------------------------------------------------------------------------------------------- DC

/** Smallest resistance used for a short in the DC sweep (keeps conductances finite). */
const R_MIN = 1e-12;

/**
 * DC node voltages of the net with the source at `vs`, lines taken as wires (lossless): the pin,
 * each segment (in order of `segmentItems`) and the receiver. Norton sweep from the receiver back,
 * then node voltages forward.
 */
function dcLevels(net: Net, vs: number, route: readonly RouteItem[]): DcLevels {
  // Chain of nodes: a new node after every series part. Shunts and receiver parts hang on nodes.
  type Node = { g: number; j: number; seriesAfter?: number };
  const nodes: Node[] = [{ g: 0, j: 0 }];
  const segmentNode: number[] = [];
  const shuntOn = (node: Node, p: Part) => {
    const r = Math.max(p.r, R_MIN);
    node.g += 1 / r;
    node.j += p.rail / r;
  };
  for (const it of route) {
    const cur = nodes[nodes.length - 1];
    if (it.kind === 'line') {
      if (it.length > 0) segmentNode.push(nodes.length - 1);
    } else if (it.kind === 'series') {
      cur.seriesAfter = Math.max(it.part.r, R_MIN);
      nodes.push({ g: 0, j: 0 });
    } else if (it.kind === 'shunt') {
      for (const p of it.parts) if (p.c === undefined) shuntOn(cur, p);
    }
  }
  for (const p of net.receiver) if (p.c === undefined) shuntOn(nodes[nodes.length - 1], p);
  // Norton equivalent looking right from each node (including its own shunts): I = G·V − J.
  const G = new Float64Array(nodes.length);
  const J = new Float64Array(nodes.length);
  for (let k = nodes.length - 1; k >= 0; k--) {
    let g = nodes[k].g, j = nodes[k].j;
    if (k < nodes.length - 1) {
      const r = nodes[k].seriesAfter!;
      g += G[k + 1] / (1 + r * G[k + 1]);
      j += J[k + 1] / (1 + r * G[k + 1]);
    }
    G[k] = g;
    J[k] = j;
  }
  const rs = net.driver.resistance;
  const v = new Float64Array(nodes.length);
  v[0] = rs === 0 ? vs : (vs / rs + J[0]) / (1 / rs + G[0]);
  for (let k = 0; k + 1 < nodes.length; k++) {
    const r = nodes[k].seriesAfter!;
    // current into the series resistor and everything right of it
    const g = G[k + 1] / (1 + r * G[k + 1]);
    const j = J[k + 1] / (1 + r * G[k + 1]);
    const i = g * v[k] - j;
    v[k + 1] = v[k] - r * i;
  }
  return { pin: v[0], segments: segmentNode.map((n) => v[n]), receiver: v[nodes.length - 1] };
}

// ------------------------------------------------------------------------------------- the lattice

/**
 * The lattice diagram of `net`, or the reasons it cannot be drawn (reactive or lossy parts, a signal
 * other than a step, no line segment).
 */
export function latticeDiagram(net: Net, options: LatticeOptions = {}): LatticeResult {
  const reasons = latticeLimitations(net);
  if (reasons.length) return { supported: false, reasons };
  const sig = net.driver.signal;
  if (sig.kind !== 'step') throw new Error('unreachable');

  // Segments (non-empty lines) and the resistive items between them.
  const segments: LatticeSegment[] = [];
  const between: RouteItem[][] = [[]];
  let x = 0;
  for (const it of net.route) {
    if (it.kind === 'line' && it.length > 0) {
      const tpd = Math.sqrt(it.line.l * it.line.c);
      segments.push({
        name: it.name,
        from: x,
        to: x + it.length,
        z0: Math.sqrt(it.line.l / it.line.c),
        delay: it.length * tpd,
        velocity: 1 / tpd,
      });
      x += it.length;
      between.push([]);
    } else if (it.kind !== 'line') {
      between[between.length - 1].push(it);
    }
  }
  const n = segments.length;

  // Boundaries: source end, junctions, load end.
  const rs = net.driver.resistance;
  const dv = sig.to - sig.from;
  const srcElems = elementsOf(between[0]);
  const th = theveninThrough(dv, rs, srcElems);
  const boundaries: LatticeBoundary[] = [];
  boundaries.push({
    kind: 'source',
    position: 0,
    items: between[0].map((i) => i.name),
    zFromRight: th.r,
    gammaFromRight: reflectionCoefficient(th.r, segments[0].z0),
  });
  for (let k = 1; k < n; k++) {
    const elems = elementsOf(between[k]);
    const zl = segments[k - 1].z0, zr = segments[k].z0;
    const right = lookRight(elems, zr);
    const left = lookRight([...elems].reverse(), zl);
    const gL = reflectionCoefficient(right.z, zl);
    const gR = reflectionCoefficient(left.z, zr);
    boundaries.push({
      kind: 'junction',
      position: segments[k].from,
      items: between[k].map((i) => i.name),
      zFromLeft: right.z,
      zFromRight: left.z,
      gammaFromLeft: gL,
      gammaFromRight: gR,
      tauLeftToRight: (1 + gL) * right.transfer,
      tauRightToLeft: (1 + gR) * left.transfer,
    });
  }
  const loadElems = elementsOf(between[n]);
  const load = lookRight(loadElems, partsResistance(net.receiver));
  boundaries.push({
    kind: 'load',
    position: segments[n - 1].to,
    items: between[n].map((i) => i.name),
    zFromLeft: load.z,
    gammaFromLeft: reflectionCoefficient(load.z, segments[n - 1].z0),
  });

  const t50 = sig.start + rampDuration(sig.rise) / 2;
  const amplitude = (th.v * segments[0].z0) / (th.r + segments[0].z0);
  // every edge launches V⁺ in proportion to its step (the Thevenin divider is linear in the source)
  const edges: readonly SourceEdge[] = options.edges ?? [{ time: t50, step: dv }];
  const launchPerVolt = dv === 0 ? 0 : amplitude / dv;
  const horizon = options.horizon ?? net.run.duration ?? defaultDuration(compileNet(net));
  const floor = Math.min(...edges.map((e) => Math.abs(e.step * launchPerVolt))) * (options.floor ?? 1e-3);
  const maxBounces = options.maxBounces ?? 32;
  const maxWaves = options.maxWaves ?? 4000;

  // Follow the waves in order of launch time. Waves launched on the same segment, in the same
  // direction, at the same time (several paths of equal delay) are merged into one.
  const heap = new WaveHeap<LatticeWave>();
  const pending = new Map<string, LatticeWave>();
  const key = (seg: number, dir: number, t: number) => `${seg}:${dir}:${t.toPrecision(12)}`;
  const launchWave = (seg: number, dir: 1 | -1, t0: number, a: number, bounces: number) => {
    const s = segments[seg];
    const k = key(seg, dir, t0);
    const prev = pending.get(k);
    if (prev) {
      prev.amplitude += a;
      prev.bounces = Math.min(prev.bounces, bounces);
      return;
    }
    const w: LatticeWave = {
      segment: seg,
      direction: dir,
      t0,
      t1: t0 + s.delay,
      x0: dir > 0 ? s.from : s.to,
      x1: dir > 0 ? s.to : s.from,
      amplitude: a,
      bounces,
    };
    pending.set(k, w);
    heap.push(w);
  };
  for (const e of edges) if (e.time <= horizon) launchWave(0, 1, e.time, e.step * launchPerVolt, 0);

  const waves: LatticeWave[] = [];
  const arrivals: LatticeArrival[] = [];
  let truncated = false;
  let complete = horizon;
  for (let w = heap.pop(); w; w = heap.pop()) {
    pending.delete(key(w.segment, w.direction, w.t0));
    if (w.t0 > horizon) {
      complete = horizon;
      break;
    }
    if (Math.abs(w.amplitude) < floor) continue;
    if (waves.length >= maxWaves || w.bounces > maxBounces) {
      truncated = true;
      complete = Math.min(complete, w.t0);
      if (waves.length >= maxWaves) break;
      continue;
    }
    waves.push(w);
    const b = w.direction > 0 ? w.segment + 1 : w.segment;
    const bd = boundaries[b];
    const a = w.amplitude;
    if (w.direction > 0) {
      const refl = a * bd.gammaFromLeft!;
      const trans = bd.kind === 'junction' ? a * bd.tauLeftToRight! : 0;
      arrivals.push({ time: w.t1, boundary: b, position: bd.position, from: 1, incident: a, reflected: refl, transmitted: trans });
      if (refl !== 0) launchWave(w.segment, -1, w.t1, refl, w.bounces + 1);
      if (trans !== 0) launchWave(w.segment + 1, 1, w.t1, trans, w.bounces);
    } else {
      const refl = a * bd.gammaFromRight!;
      const trans = bd.kind === 'junction' ? a * bd.tauRightToLeft! : 0;
      arrivals.push({ time: w.t1, boundary: b, position: bd.position, from: -1, incident: a, reflected: refl, transmitted: trans });
      if (refl !== 0) launchWave(w.segment, 1, w.t1, refl, w.bounces + 1);
      if (trans !== 0) launchWave(w.segment - 1, -1, w.t1, trans, w.bounces);
    }
  }
  arrivals.sort((p, q) => p.time - q.time || p.boundary - q.boundary);

  const finalLevel = sig.from + edges.filter((e) => e.time <= horizon).reduce((a, e) => a + e.step, 0);
  const dc = { before: dcLevels(net, sig.from, net.route), after: dcLevels(net, finalLevel, net.route) };

  // End voltages: line-side voltage from the waves, mapped through the end networks.
  const pin = pinCoefficients(rs, srcElems);
  const rxTransfer = lookRight(loadElems, partsResistance(net.receiver)).transfer;
  const gS = boundaries[0].gammaFromRight!;
  const gL = boundaries[n].gammaFromLeft!;
  // Steps of (line-side voltage, source voltage) at each end; the source's own steps move the pin.
  const driverSteps: Step[] = edges.filter((e) => e.time <= complete).map((e) => [e.time, e.step * launchPerVolt, e.step]);
  const receiverSteps: Step[] = [];
  for (const ar of arrivals) {
    if (ar.boundary === 0) driverSteps.push([ar.time, ar.incident * (1 + gS), 0]);
    if (ar.boundary === n) receiverSteps.push([ar.time, ar.incident * (1 + gL), 0]);
  }
  const plateaus = snapResidue({
    driver: toPlateaus(driverSteps, complete, (line, src) => dc.before.pin + pin.a * src + pin.b * line, dc.before.pin),
    receiver: toPlateaus(receiverSteps, complete, (line) => dc.before.receiver + rxTransfer * line, dc.before.receiver),
  });

  return {
    supported: true,
    segments,
    boundaries,
    launch: {
      time: t50,
      stepVoltage: dv,
      sourceResistance: rs,
      theveninVoltage: th.v,
      theveninResistance: th.r,
      z0: segments[0].z0,
      amplitude,
    },
    waves,
    arrivals,
    edges: edges.filter((e) => e.time <= horizon),
    dc,
    plateaus,
    horizon: complete,
    truncated,
  };
}

/** Share of the largest level below which a level is rounding left by waves that cancel (a clock's low: 8e-17 V). */
export const RESIDUE_SHARE = 1e-9;

/**
 * Superposed waves that cancel exactly (a clock's falling edge undoing its rising edge) add up to a
 * rounding residue, not 0; a level within RESIDUE_SHARE of the largest level at either end is 0.
 */
function snapResidue(p: { driver: Plateau[]; receiver: Plateau[] }): { driver: Plateau[]; receiver: Plateau[] } {
  let scale = 0;
  for (const q of [...p.driver, ...p.receiver]) scale = Math.max(scale, Math.abs(q.value));
  const snap = (list: Plateau[]) => list.map((q) => (Math.abs(q.value) <= RESIDUE_SHARE * scale ? { ...q, value: 0 } : q));
  return { driver: snap(p.driver), receiver: snap(p.receiver) };
}

/** A step at an end: time, increment of the line-side voltage, increment of the source voltage. */
export type PlateauStep = [number, number, number];
type Step = PlateauStep;

/**
 * Steps → plateaus of `level(line voltage, source voltage change)`, starting with the level before
 * the first step (`initial`) from t = 0. Steps at the same time are merged.
 */
export function toPlateaus(steps: readonly Step[], horizon: number, level: (line: number, src: number) => number, initial: number): Plateau[] {
  const out: Plateau[] = [];
  let t = 0;
  let line = 0;
  let src = 0;
  let value = initial;
  const sorted = [...steps].filter((s) => s[0] <= horizon).sort((p, q) => p[0] - q[0]);
  for (let i = 0; i < sorted.length; ) {
    const ti = sorted[i][0];
    let inc = 0;
    let srcInc = 0;
    while (i < sorted.length && Math.abs(sorted[i][0] - ti) <= 1e-12 * Math.max(1e-9, Math.abs(ti))) {
      inc += sorted[i][1];
      srcInc += sorted[i++][2];
    }
    if (ti > t) out.push({ from: t, to: ti, value });
    line += inc;
    src += srcInc;
    value = level(line, src);
    t = ti;
  }
  if (horizon > t) out.push({ from: t, to: horizon, value });
  return out;
}

/**
 * Voltage at position `x` (m) on the line at time `t` from the waves: the DC level of the segment
 * before the step plus every wave that has passed x by t. At a junction, `side` picks the segment
 * (default: the one to the left, except at x = 0).
 */
export function latticeVoltageAt(d: LatticeDiagram, x: number, t: number, side: 'left' | 'right' = 'left'): number {
  let seg = d.segments.findIndex((s) => (side === 'left' ? x > s.from && x <= s.to : x >= s.from && x < s.to));
  if (seg < 0) seg = x <= d.segments[0].from ? 0 : d.segments.length - 1;
  let v = d.dc.before.segments[seg];
  for (const w of d.waves) {
    if (w.segment !== seg) continue;
    const s = d.segments[seg];
    const tx = w.t0 + Math.abs(x - w.x0) / s.velocity;
    if (tx <= t) v += w.amplitude;
  }
  return v;
}
