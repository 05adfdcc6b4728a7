// DC operating point of the ladder, the starting state of every run: inductors are shorts,
// capacitors open, every source at its initial value and every rail on. At DC a cell is its
// resistance R′ΔZ and a node its conductance G′ΔZ, so this is the resistive network of the discrete
// ladder itself and the state it gives is stationary under the time loop.
//
// One nodal solve of the whole graph (dc-network.ts) on its terminal nodes (every node that is not
// inside a segment): each segment's interior is first reduced to its exact two-port between its end
// nodes (a short, a resistor, or a π of conductances), then filled back in from the end voltages.
// Zero-resistance lines and parts are shorts and ideal sources fix their node, so a lossless route,
// a 0 Ω driver and a 0 Ω part all work; a node with no DC path anywhere starts at 0 V.
import { DcNetwork } from './dc-network.js';
import { EXTERNAL, externalVoltage, type Ladder, type SegmentSpan } from './ladder.js';

export interface DcState {
  /** Voltage of every slot (ghost slots hold their real node's voltage). */
  v: Float64Array;
  /** Cell currents, aligned with the line kernel's current array: i[base + 1 + j] is cell j of a segment. */
  i: Float64Array;
  /** Current in each lumped branch, from its `p` end to its `q` end. */
  lumped: Float64Array;
}

type Reduction = { kind: 'short'; index: number; leak: number } | { kind: 'resistive'; g: number } | { kind: 'pi'; series: number; shunt: number };

/**
 * The nodal network's index of every slot that is a terminal node (not inside a segment, not a ghost),
 * −1 for the rest: only terminals enter the sparse solve, so a long line costs arrays, not unknowns.
 */
function terminals(ladder: Ladder): { index: Int32Array; count: number } {
  const inner = new Uint8Array(ladder.slots);
  for (const s of ladder.segments) for (let k = 1; k < s.cells; k++) inner[s.base + k] = 1;
  for (let g = 0; g < ladder.ghosts.length; g += 2) inner[ladder.ghosts[g]] = 1;
  const index = new Int32Array(ladder.slots);
  let count = 0;
  for (let k = 0; k < ladder.slots; k++) index[k] = inner[k] ? -1 : count++;
  return { index, count };
}

/** The interior of a segment as a two-port at DC (cells ≥ 1), between terminals a and b. */
function reduceSegment(ladder: Ladder, s: SegmentSpan, net: DcNetwork, a: number, b: number): Reduction {
  const rc = s.line.r * s.cellLength;
  const gi = s.cells > 1 ? ladder.nodeG[s.base + 1] : 0;
  if (rc === 0) {
    // a short from end to end; the interior's leakage (all at the end voltage) is put on the first end
    const leak = (s.cells - 1) * gi;
    net.toRail(a, leak, 0);
    return { kind: 'short', index: net.short(a, b), leak };
  }
  if (gi === 0) {
    const g = 1 / (s.cells * rc);
    net.conductance(a, b, g);
    return { kind: 'resistive', g };
  }
  // π equivalent of the symmetric ladder: −y21 in series, y11 + y21 from each end to ground. Both from
  // Thevenin sweeps (continued fractions of positive terms, well conditioned however long the line):
  // y11 = 1/(rc + r of everything right of node 1 with the far end shorted), −y21 = the current a 1 V
  // first end drives into the shorted far end.
  const left = sweep(s.cells, rc, gi, 1);
  const right = sweep(s.cells, rc, gi, 0);
  const y11 = 1 / (rc + right.r[s.cells - 1]);
  const series = left.e[s.cells - 1] / (left.r[s.cells - 1] + rc);
  const shunt = y11 - series;
  net.conductance(a, b, series);
  net.toRail(a, shunt, 0);
  net.toRail(b, shunt, 0);
  return { kind: 'pi', series, shunt };
}

/**
 * Thevenin equivalents along a uniform ladder (series rc per cell, shunt gi on each interior node)
 * from an ideal source v0 at one end: e[k], r[k] seen at node k (k = 0 … cells − 1 counted from that
 * end), including node k's own shunt; node 0 is the source itself. The same sweep from the other end
 * gives the other side; a node's voltage joins the two (the chain's classic DC solution by Thevenin
 * sweeps, exact for ideal ends and stable: every step combines positive resistances).
 */
function sweep(cells: number, rc: number, gi: number, v0: number): { e: Float64Array; r: Float64Array } {
  const e = new Float64Array(cells);
  const r = new Float64Array(cells);
  e[0] = v0;
  for (let k = 1; k < cells; k++) {
    const rs = r[k - 1] + rc;
    const d = 1 + rs * gi;
    e[k] = e[k - 1] / d;
    r[k] = rs / d;
  }
  return { e, r };
}

export function solveDc(ladder: Ladder, sources: Float64Array): DcState {
  const { index: t, count } = terminals(ladder);
  const net = new DcNetwork(count);
  const where = (b: Ladder['lumped'][number]) => `${b.role === 'driver' ? 'driver' : b.item}`;
  for (let k = 0; k < ladder.slots; k++) if (t[k] >= 0) net.toRail(t[k], ladder.nodeG[k], 0);
  const reductions = ladder.segments.map((s) => (s.cells > 0 ? reduceSegment(ladder, s, net, t[s.first], t[s.last]) : undefined));
  // Lumped branches: a capacitor is open; R > 0 a conductance; R = 0 (with or without L) a short or an ideal source.
  const zero = ladder.lumped.map((b, k) => {
    if (b.part.c !== undefined) return -1;
    if (b.part.r > 0) {
      if (b.p !== EXTERNAL && b.q !== EXTERNAL) net.conductance(t[b.p], t[b.q], 1 / b.part.r);
      else net.toRail(t[b.p !== EXTERNAL ? b.p : b.q], 1 / b.part.r, externalVoltage(b, sources));
      return -1;
    }
    if (b.p !== EXTERNAL && b.q !== EXTERNAL) return net.short(t[b.p], t[b.q]);
    return net.ideal(t[b.p !== EXTERNAL ? b.p : b.q], externalVoltage(b, sources), where(ladder.lumped[k]));
  });
  const vt = net.solve();
  const v = new Float64Array(ladder.slots);
  for (let k = 0; k < ladder.slots; k++) if (t[k] >= 0) v[k] = vt[t[k]];
  const state: DcState = { v, i: new Float64Array(ladder.slots + 1), lumped: new Float64Array(ladder.lumped.length) };
  fillSegments(ladder, state, reductions);
  const out = outflows(ladder, state, reductions, sources);
  const leaving = new Float64Array(count);
  for (let k = 0; k < ladder.slots; k++) if (t[k] >= 0) leaving[t[k]] = out[k];
  const { shorts, ideals } = net.zeroResistanceCurrents(leaving);
  ladder.lumped.forEach((b, k) => {
    if (zero[k] < 0) return;
    if (b.p !== EXTERNAL && b.q !== EXTERNAL) state.lumped[k] = shorts[zero[k]];
    else state.lumped[k] = b.p !== EXTERNAL ? ideals[zero[k]] : -ideals[zero[k]];
  });
  ladder.segments.forEach((s, n) => {
    const red = reductions[n];
    if (red?.kind === 'short') fillShortCurrents(s, state, shorts[red.index], ladder.nodeG[s.base + 1]);
  });
  for (let g = 0; g < ladder.ghosts.length; g += 2) v[ladder.ghosts[g]] = v[ladder.ghosts[g + 1]];
  return state;
}

/** Interior voltages and cell currents of every segment that is not a short, from its end voltages. */
function fillSegments(ladder: Ladder, state: DcState, reductions: (Reduction | undefined)[]): void {
  ladder.segments.forEach((s, n) => {
    const red = reductions[n];
    if (!red) return;
    const va = state.v[s.first];
    const vb = state.v[s.last];
    if (red.kind === 'short') {
      for (let k = 1; k < s.cells; k++) state.v[s.base + k] = va;
      return;
    }
    const rc = s.line.r * s.cellLength;
    if (red.kind === 'resistive') {
      const current = (va - vb) * red.g;
      for (let k = 1; k < s.cells; k++) state.v[s.base + k] = va - k * rc * current;
      for (let j = 0; j < s.cells; j++) state.i[s.base + 1 + j] = current;
      return;
    }
    // sweeps from both ends (ideal sources at the end voltages); node k joins left[k] (with its shunt)
    // and everything right of it through cell k; cell j carries left[j] − right[cells−1−j] over the
    // resistances in between
    const cells = s.cells;
    const gi = ladder.nodeG[s.base + 1];
    const left = sweep(cells, rc, gi, va);
    const right = sweep(cells, rc, gi, vb);
    for (let k = 1; k < cells; k++) {
      const re = right.e[cells - 1 - k];
      const rr = right.r[cells - 1 - k] + rc; // right of node k, through cell k, without node k's shunt
      // parallel of (left.e[k], left.r[k]) and (re, rr)
      state.v[s.base + k] = (left.e[k] * rr + re * left.r[k]) / (left.r[k] + rr);
    }
    for (let j = 0; j < cells; j++) {
      const k = cells - 1 - j;
      state.i[s.base + 1 + j] = (left.e[j] - right.e[k]) / (left.r[j] + rc + right.r[k]);
    }
  });
}

/** Cell currents of a zero-resistance segment: `atLast` arrives at the far end, each interior node's leakage adds going back. */
function fillShortCurrents(s: SegmentSpan, state: DcState, atLast: number, gi: number): void {
  const leak = s.cells > 1 ? gi * state.v[s.first] : 0;
  let current = atLast;
  for (let j = s.cells - 1; j >= 0; j--) {
    state.i[s.base + 1 + j] = current;
    current += leak;
  }
}

/** Current each node sends out through everything but the zero-resistance branches. */
function outflows(ladder: Ladder, state: DcState, reductions: (Reduction | undefined)[], sources: Float64Array): Float64Array {
  const { v } = state;
  const out = new Float64Array(ladder.slots);
  for (let k = 0; k < ladder.slots; k++) out[k] = ladder.nodeG[k] * v[k];
  ladder.segments.forEach((s, n) => {
    const red = reductions[n];
    if (!red) return;
    if (red.kind === 'short') out[s.first] += red.leak * v[s.first];
    else {
      out[s.first] += state.i[s.base + 1];
      out[s.last] -= state.i[s.base + s.cells];
    }
  });
  ladder.lumped.forEach((b, k) => {
    if (b.part.c !== undefined || !(b.part.r > 0)) return;
    const vp = b.p !== EXTERNAL ? v[b.p] : externalVoltage(b, sources);
    const vq = b.q !== EXTERNAL ? v[b.q] : externalVoltage(b, sources);
    const i = (vp - vq) / b.part.r;
    state.lumped[k] = i;
    if (b.p !== EXTERNAL) out[b.p] += i;
    if (b.q !== EXTERNAL) out[b.q] -= i;
  });
  return out;
}
