// The compiled circuit as a nodal admittance matrix at one complex frequency s = σ + jω: the spectral
// solver's frequency-domain core. Each line segment stamps its exact two-port admittance
// (y11 = y22 = D/B, y12 = −1/B from its chain matrix, two-port.ts), each part its admittance 1/Z(s),
// the driver its Norton equivalent (Pozar, Microwave Engineering, ch. 4; nodal analysis as in any
// circuit text). That covers chains, trees and, later, several conductors alike.
//
// Rails are AC grounds here (superposition: their constant voltages belong to the DC operating point,
// see dc.ts). A part that is an ideal short (no R, L or C) and a line of zero length join their nodes;
// an ideal short to a rail grounds its node; a 0 Ω driver fixes its pin to the source voltage.
//
// The matrix is complex symmetric. Its structure does not change with frequency, so the elimination
// order (minimum degree: leaves first on a tree, no fill) and every fill position are worked out once;
// each frequency then stamps values into flat arrays and eliminates without pivoting. For Re s > 0 (the
// numerical Laplace transform's damped contour) a passive network's admittance matrix has a positive
// definite real part, so no pivot vanishes; on the jω axis an exactly resonant lossless sub-network
// can give a zero pivot (its node voltage is then not finite: evaluate off the axis).
import type { Circuit } from '../circuit.js';
import { RAIL } from '../circuit.js';
import { NetError } from '../errors.js';
import type { Net } from '../model.js';
import { compileNet } from '../circuit.js';
import { perLength, type Complex } from './per-length.js';
import { applyLine, isIdealShort, lineAdmittance, lineWork, partImpedance, type Sweep } from './two-port.js';

/** Reusable work arrays for evaluating one circuit at many frequencies. */
export interface CircuitEvaluator {
  circuit: Circuit;
  names: string[];
  /**
   * Transfer functions V_probe(s)/Vs(s) of the driven source with rails grounded, written to
   * out[2p] (re), out[2p+1] (im).
   */
  transfer(sr: number, si: number, out: Float64Array): void;
}

interface Structure {
  /** Group of each circuit node, and the unknown of each group (−1: a fixed group). */
  group: Int32Array;
  unknown: Int32Array;
  /** Fixed value of each group (0 for AC ground, 1 for the driven ideal source's pin); NaN if free. */
  fixed: Float64Array;
  n: number;
  /** Slots: 0 … n−1 the diagonal, then one per unordered off-diagonal pair (fill included). */
  slots: number;
  slotOf: (i: number, j: number) => number;
  /** Elimination steps in order. */
  order: Int32Array;
  /** Per step: neighbours (unknowns) and the slots of (k, j). */
  nbStart: Int32Array;
  nbIdx: Int32Array;
  nbSlot: Int32Array;
  /** Per step: updates A[i][j] −= A[k][i]·A[k][j]/A[k][k] for i ≤ j among the neighbours. */
  upStart: Int32Array;
  upTarget: Int32Array;
  upA: Int32Array;
  upB: Int32Array;
}

function unionFind(n: number) {
  const parent = Int32Array.from({ length: n }, (_, k) => k);
  const find = (k: number): number => {
    while (parent[k] !== k) k = parent[k] = parent[parent[k]];
    return k;
  };
  return { find, join: (a: number, b: number) => void (parent[find(a)] = find(b)) };
}

/** Groups, fixed values and unknowns: ideal shorts and zero-length lines join nodes. */
function groupNodes(c: Circuit, source: number): Pick<Structure, 'group' | 'unknown' | 'fixed' | 'n'> {
  const uf = unionFind(c.nodes.length);
  for (const p of c.parts) if (p.q !== RAIL && isIdealShort(p.part)) uf.join(p.p, p.q);
  for (const s of c.segments) if (s.length === 0) uf.join(s.from, s.to);
  const group = Int32Array.from(c.nodes, (_, k) => uf.find(k));
  const fixed = new Float64Array(c.nodes.length).fill(NaN);
  for (const p of c.parts) if (p.q === RAIL && isIdealShort(p.part)) fixed[group[p.p]] = 0;
  c.sources.forEach((s, k) => {
    if (s.resistance !== 0) return;
    const g = group[s.node];
    if (k === source && fixed[g] === 0) throw new NetError([{ path: 'driver', message: 'the driver is an ideal source (0 ohm) into a short circuit' }]);
    if (!(fixed[g] === 0)) fixed[g] = k === source ? 1 : 0;
  });
  const unknown = new Int32Array(c.nodes.length).fill(-1);
  let n = 0;
  for (let k = 0; k < c.nodes.length; k++) if (group[k] === k && Number.isNaN(fixed[k])) unknown[k] = n++;
  return { group, unknown, fixed, n };
}

/** Pairs of unknowns that share an element (segment or series part). */
function couplings(c: Circuit, g: Pick<Structure, 'group' | 'unknown'>): [number, number][] {
  const out: [number, number][] = [];
  const pair = (a: number, b: number) => {
    const ua = g.unknown[g.group[a]];
    const ub = g.unknown[g.group[b]];
    if (ua >= 0 && ub >= 0 && ua !== ub) out.push([ua, ub]);
  };
  for (const s of c.segments) if (s.length > 0) pair(s.from, s.to);
  for (const p of c.parts) if (p.q !== RAIL && !isIdealShort(p.part)) pair(p.p, p.q);
  return out;
}

/** Minimum-degree elimination order and fill, worked out once on the structure. */
function symbolic(n: number, pairs: [number, number][]): Omit<Structure, 'group' | 'unknown' | 'fixed' | 'n'> {
  const adj = Array.from({ length: n }, () => new Set<number>());
  for (const [a, b] of pairs) {
    adj[a].add(b);
    adj[b].add(a);
  }
  const slotMap = new Map<number, number>();
  let slots = n;
  const slotOf = (i: number, j: number): number => {
    if (i === j) return i;
    const key = i < j ? i * n + j : j * n + i;
    let s = slotMap.get(key);
    if (s === undefined) slotMap.set(key, (s = slots++));
    return s;
  };
  for (const [a, b] of pairs) slotOf(a, b);
  const done = new Uint8Array(n);
  const order: number[] = [];
  const nbStart = [0];
  const nbIdx: number[] = [];
  const nbSlot: number[] = [];
  const upStart = [0];
  const upTarget: number[] = [];
  const upA: number[] = [];
  const upB: number[] = [];
  for (let step = 0; step < n; step++) {
    let k = -1;
    for (let i = 0; i < n; i++) if (!done[i] && (k < 0 || adj[i].size < adj[k].size)) k = i;
    done[k] = 1;
    order.push(k);
    const nb = [...adj[k]];
    for (const i of nb) {
      nbIdx.push(i);
      nbSlot.push(slotOf(k, i));
      adj[i].delete(k);
    }
    for (let x = 0; x < nb.length; x++) {
      for (let y = x; y < nb.length; y++) {
        const i = nb[x];
        const j = nb[y];
        if (i !== j) {
          adj[i].add(j);
          adj[j].add(i);
        }
        upTarget.push(slotOf(i, j));
        upA.push(slotOf(k, i));
        upB.push(slotOf(k, j));
      }
    }
    nbStart.push(nbIdx.length);
    upStart.push(upTarget.length);
  }
  return {
    slots,
    slotOf,
    order: Int32Array.from(order),
    nbStart: Int32Array.from(nbStart),
    nbIdx: Int32Array.from(nbIdx),
    nbSlot: Int32Array.from(nbSlot),
    upStart: Int32Array.from(upStart),
    upTarget: Int32Array.from(upTarget),
    upA: Int32Array.from(upA),
    upB: Int32Array.from(upB),
  };
}

/** The circuit's nodal system at any frequency, for source `source` driven by 1 V. */
export function circuitEvaluator(c: Circuit, source = 0): CircuitEvaluator {
  if (c.coupled.length) {
    throw new NetError([{ path: `coupled.${c.coupled[0].name}`, message: 'the spectral solver (cross-check, S-parameters) does not handle coupled sections yet; the time-domain run does' }]);
  }
  const g = groupNodes(c, source);
  const st: Structure = { ...g, ...symbolic(g.n, couplings(c, g)) };
  const n = st.n;
  const ar = new Float64Array(st.slots);
  const ai = new Float64Array(st.slots);
  const br = new Float64Array(n);
  const bi = new Float64Array(n);
  const xr = new Float64Array(n);
  const xi = new Float64Array(n);
  const y = new Float64Array(4);
  const work = lineWork();
  const segY = new Float64Array(4 * c.segments.length);
  const perLen: { z: Complex; y: Complex }[] = c.segments.map(() => ({ z: { re: 0, im: 0 }, y: { re: 0, im: 0 } }));
  const probe: Sweep = { w0r: 0, w0i: 0, w1r: 0, w1i: 0, lg: 0 };
  const value = (node: number): [number, number] => {
    const grp = st.group[node];
    const u = st.unknown[grp];
    return u >= 0 ? [xr[u], xi[u]] : [st.fixed[grp], 0];
  };

  /** Adds admittance (yr, yi) between nodes a and b (b = −1: to ground), with fixed ends on the right-hand side. */
  const stampBetween = (a: number, b: number, yr: number, yi: number): void => {
    const ga = st.group[a];
    const gb = b < 0 ? -1 : st.group[b];
    if (ga === gb) return;
    const ua = st.unknown[ga];
    const ub = gb < 0 ? -1 : st.unknown[gb];
    const va = ua < 0 ? st.fixed[ga] : 0;
    const vb = gb < 0 || ub >= 0 ? 0 : st.fixed[gb];
    if (ua >= 0) {
      ar[ua] += yr;
      ai[ua] += yi;
      br[ua] += yr * vb;
      bi[ua] += yi * vb;
    }
    if (ub >= 0) {
      ar[ub] += yr;
      ai[ub] += yi;
      br[ub] += yr * va;
      bi[ub] += yi * va;
    }
    if (ua >= 0 && ub >= 0) {
      const s = st.slotOf(ua, ub);
      ar[s] -= yr;
      ai[s] -= yi;
    }
  };

  /** A segment's two-port: y11 at both ends, y12 between them (fixed ends on the right-hand side). */
  const stampSegment = (k: number, sr: number, si: number): void => {
    const seg = c.segments[k];
    const pl = perLength(seg.line, { re: sr, im: si });
    perLen[k] = pl;
    const len = seg.length;
    lineAdmittance(pl.z.re * len, pl.z.im * len, pl.y.re * len, pl.y.im * len, y, work);
    segY.set(y, 4 * k);
    // as a π: −y12 in series, y11 + y12 from each end to ground
    stampBetween(seg.from, seg.to, -y[2], -y[3]);
    stampBetween(seg.from, -1, y[0] + y[2], y[1] + y[3]);
    stampBetween(seg.to, -1, y[0] + y[2], y[1] + y[3]);
  };

  const stampAll = (sr: number, si: number): void => {
    ar.fill(0);
    ai.fill(0);
    br.fill(0);
    bi.fill(0);
    c.segments.forEach((seg, k) => {
      if (seg.length > 0) stampSegment(k, sr, si);
    });
    for (const p of c.parts) {
      if (isIdealShort(p.part)) continue;
      const z = partImpedance(p.part, sr, si);
      const d = z.re * z.re + z.im * z.im;
      stampBetween(p.p, p.q === RAIL ? -1 : p.q, z.re / d, -z.im / d);
    }
    c.sources.forEach((s, k) => {
      if (s.resistance === 0) return;
      const gs = 1 / s.resistance;
      stampBetween(s.node, -1, gs, 0);
      const u = st.unknown[st.group[s.node]];
      if (k === source && u >= 0) br[u] += gs; // Norton current of the 1 V source
    });
  };

  const solve = (): void => {
    const { order, nbStart, nbIdx, nbSlot, upStart, upTarget, upA, upB } = st;
    for (let s = 0; s < n; s++) {
      const k = order[s];
      const pr = ar[k];
      const pi = ai[k];
      const pd = pr * pr + pi * pi;
      // 1/pivot
      const qr = pr / pd;
      const qi = -pi / pd;
      for (let e = nbStart[s]; e < nbStart[s + 1]; e++) {
        const i = nbIdx[e];
        const sl = nbSlot[e];
        // f = A[k][i]/A[k][k]; b_i −= f·b_k
        const fr = ar[sl] * qr - ai[sl] * qi;
        const fi = ar[sl] * qi + ai[sl] * qr;
        br[i] -= fr * br[k] - fi * bi[k];
        bi[i] -= fr * bi[k] + fi * br[k];
      }
      for (let e = upStart[s]; e < upStart[s + 1]; e++) {
        const a = upA[e];
        const b = upB[e];
        const fr = ar[a] * qr - ai[a] * qi;
        const fi = ar[a] * qi + ai[a] * qr;
        ar[upTarget[e]] -= fr * ar[b] - fi * ai[b];
        ai[upTarget[e]] -= fr * ai[b] + fi * ar[b];
      }
    }
    for (let s = n - 1; s >= 0; s--) {
      const k = order[s];
      let rr = br[k];
      let ri = bi[k];
      for (let e = nbStart[s]; e < nbStart[s + 1]; e++) {
        const j = nbIdx[e];
        const sl = nbSlot[e];
        rr -= ar[sl] * xr[j] - ai[sl] * xi[j];
        ri -= ar[sl] * xi[j] + ai[sl] * xr[j];
      }
      const pr = ar[k];
      const pi = ai[k];
      const pd = pr * pr + pi * pi;
      xr[k] = (rr * pr + ri * pi) / pd;
      xi[k] = (ri * pr - rr * pi) / pd;
    }
  };

  /** The voltage `rest` metres before the far end of segment k, from its end voltages (chain matrix from the far end). */
  const inLine = (k: number, rest: number): [number, number] => {
    const seg = c.segments[k];
    const [v1r, v1i] = value(seg.from);
    const [v2r, v2i] = value(seg.to);
    if (rest <= 0) return [v2r, v2i];
    // current flowing out of the line at its far end: −(y21·V1 + y22·V2)
    const o = 4 * k;
    const i2r = -(segY[o + 2] * v1r - segY[o + 3] * v1i + segY[o] * v2r - segY[o + 1] * v2i);
    const i2i = -(segY[o + 2] * v1i + segY[o + 3] * v1r + segY[o] * v2i + segY[o + 1] * v2r);
    Object.assign(probe, { w0r: v2r, w0i: v2i, w1r: i2r, w1i: i2i, lg: 0 });
    const pl = perLen[k];
    applyLine(pl.z.re * rest, pl.z.im * rest, pl.y.re * rest, pl.y.im * rest, probe, work);
    const m = Math.hypot(probe.w0r, probe.w0i);
    if (!(m > 0)) return [0, 0];
    const scale = Math.exp(probe.lg + Math.log(m)) / m;
    return [probe.w0r * scale, probe.w0i * scale];
  };

  function transfer(sr: number, si: number, out: Float64Array): void {
    stampAll(sr, si);
    solve();
    c.probes.forEach(({ place }, p) => {
      const [vr, vi] = place.kind === 'node' ? value(place.node) : inLine(place.segment, c.segments[place.segment].length - place.position);
      out[2 * p] = vr;
      out[2 * p + 1] = vi;
    });
  }

  return { circuit: c, names: c.probes.map((p) => p.name), transfer };
}

/** Transfer functions from the source voltage to every probe at each complex frequency in `s`. */
export function transferFunctions(net: Net, s: Complex[]): Complex[][] {
  const ev = circuitEvaluator(compileNet(net));
  const out = new Float64Array(2 * net.probes.length);
  const h: Complex[][] = net.probes.map(() => []);
  for (const sk of s) {
    ev.transfer(sk.re, sk.im, out);
    h.forEach((row, p) => row.push({ re: out[2 * p], im: out[2 * p + 1] }));
  }
  return h;
}
