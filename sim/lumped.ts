// Lumped clusters: the nodes joined by lumped parts (sources, series, shunt, receiver and dielectric
// end branches), each advanced implicitly by a small nodal solve per time step.
//
// Every part (R, L, C in series) is a trapezoidal companion model, v(n+1) = Z·i(n+1) + h(n) with
// Z = R + 2L/Δt + Δt/(2C), i.e. a conductance 1/Z in parallel with a history current −h/Z (Dommel,
// "Digital computation of electromagnetic transients in single- and multiphase networks", IEEE Trans.
// PAS-88(4), 1969). A part with Z = 0 (a plain wire, an ideal source) keeps its current as an extra
// unknown, as in modified nodal analysis (Ho, Ruehli & Brennan, IEEE Trans. Circuits and Systems
// 22(6), 1975). A node with line capacitance obeys its node equation centred at n+½ like the line's
// own (the branch currents averaged over the step, equation times 2):
//   (2C/Δt + G)·V(n+1) + Σ ±(i(n+1) + i(n)) = (2C/Δt − G)·V(n) + 2·I_line(n+½)
// and a node with none Kirchhoff's current law at n+1: Σ ±i(n+1) = I_line(n+½). The node matrix is
// constant, so it is inverted once; each step forms the right-hand side from the history of every
// branch, solves, and updates each branch's state (i, v_L, v_C) on its own.
//
// The seam for elements other than linear R–L–C branches (nonlinear devices solved by Newton–Raphson,
// S-parameter blocks as a companion admittance with recursive-convolution history) is the
// LumpedCluster interface: such a cluster stamps its elements into the same node equations and
// advances with the same inputs (the line currents at n+½ through the incidence lists, the sources'
// values at n+1).
import { invert } from './dense.js';
import { NetError } from './errors.js';
import type { DcState } from './dc.js';
import { EXTERNAL, type Ladder } from './ladder.js';

export interface LumpedCluster {
  /** Slots of the cluster's nodes. */
  readonly nodes: Int32Array;
  /** Advances from n to n+1: line currents at n+½ in `i`, source values at n+1; writes the nodes' voltages into `v`. */
  advance(v: Float64Array, i: Float64Array, sources: Float64Array): void;
}

export interface LumpedSystem {
  clusters: LumpedCluster[];
  /** Slots the clusters own (the line kernel leaves them alone). */
  isLumpedNode: Uint8Array;
  /** Lumped branches per cluster (indices into Ladder.lumped), for messages and checks. */
  branches: number[][];
}

interface ClusterPlan {
  nodes: number[];
  branches: number[];
}

/** Nodes touched by lumped branches, joined into clusters by the branches between two nodes. */
export function planClusters(ladder: Ladder): ClusterPlan[] {
  const owner = new Map<number, number>();
  const parent: number[] = [];
  const find = (k: number): number => {
    while (parent[k] !== k) k = parent[k] = parent[parent[k]];
    return k;
  };
  const touch = (slot: number) => {
    if (!owner.has(slot)) {
      owner.set(slot, parent.length);
      parent.push(parent.length);
    }
    return owner.get(slot)!;
  };
  for (const b of ladder.lumped) {
    const ends = [b.p, b.q].filter((x) => x !== EXTERNAL).map(touch);
    if (ends.length === 2) parent[find(ends[0])] = find(ends[1]);
  }
  const byRoot = new Map<number, ClusterPlan>();
  const slots = [...owner.keys()].sort((a, b) => a - b);
  for (const s of slots) {
    const r = find(owner.get(s)!);
    if (!byRoot.has(r)) byRoot.set(r, { nodes: [], branches: [] });
    byRoot.get(r)!.nodes.push(s);
  }
  ladder.lumped.forEach((b, k) => byRoot.get(find(owner.get(b.p !== EXTERNAL ? b.p : b.q)!))!.branches.push(k));
  return [...byRoot.values()];
}

function isIdeal(p: { r: number; l: number; c?: number }): boolean {
  return p.r === 0 && p.l === 0 && p.c === undefined;
}

export function buildLumped(ladder: Ladder, dt: number, dc: DcState): LumpedSystem {
  const plans = planClusters(ladder);
  const isLumpedNode = new Uint8Array(ladder.slots);
  for (const p of plans) for (const s of p.nodes) isLumpedNode[s] = 1;
  return { clusters: plans.map((p) => new LinearCluster(ladder, p, dt, dc)), isLumpedNode, branches: plans.map((p) => p.branches) };
}

/** A cluster of linear R–L–C branches. */
export class LinearCluster implements LumpedCluster {
  readonly nodes: Int32Array;
  private readonly n: number;
  private readonly nn: number;
  private readonly minv: Float64Array;
  private readonly rhs: Float64Array;
  private readonly x: Float64Array;
  /** Per node: (2C/Δt − G) for a centred node, else 0; line-current weight 2 or 1; history weight 1 or 0. */
  private readonly hist: Float64Array;
  private readonly lam: Float64Array;
  private readonly kap: Float64Array;
  /** Per node, the incident line-cell currents (CSR). */
  private readonly incStart: Int32Array;
  private readonly incCell: Int32Array;
  private readonly incSign: Float64Array;
  /** Companion branches (Z > 0) then ideal ones: local node of each end (−1 external), source index of an external p, rail of an external q. */
  private readonly nc: number;
  private readonly bp: Int32Array;
  private readonly bq: Int32Array;
  private readonly bSource: Int32Array;
  private readonly bRail: Float64Array;
  private readonly geq: Float64Array;
  private readonly kL: Float64Array;
  private readonly kC: Float64Array;
  private readonly jh: Float64Array;
  /** Branch state: current p → q, inductor voltage, capacitor voltage. */
  readonly current: Float64Array;
  private readonly vL: Float64Array;
  private readonly vC: Float64Array;
  /** Index into Ladder.lumped of each branch, in this cluster's order. */
  readonly branchIndex: Int32Array;

  constructor(ladder: Ladder, plan: ClusterPlan, dt: number, dc: DcState) {
    const local = new Map(plan.nodes.map((s, a) => [s, a]));
    const companion = plan.branches.filter((k) => !isIdeal(ladder.lumped[k].part));
    const ideal = plan.branches.filter((k) => isIdeal(ladder.lumped[k].part));
    const order = [...companion, ...ideal];
    const nn = plan.nodes.length;
    const nb = order.length;
    this.nn = nn;
    this.n = nn + ideal.length;
    this.nc = companion.length;
    this.nodes = Int32Array.from(plan.nodes);
    this.branchIndex = Int32Array.from(order);
    this.rhs = new Float64Array(this.n);
    this.x = new Float64Array(this.n);
    this.hist = new Float64Array(nn);
    this.lam = new Float64Array(nn);
    this.kap = new Float64Array(nn);
    const incidence = plan.nodes.map((s) => ladder.ends.get(s) ?? []);
    this.incStart = new Int32Array(nn + 1);
    incidence.forEach((list, a) => (this.incStart[a + 1] = this.incStart[a] + list.length));
    this.incCell = Int32Array.from(incidence.flat(), (e) => e.cell);
    this.incSign = Float64Array.from(incidence.flat(), (e) => e.sign);
    const lumped = order.map((k) => ladder.lumped[k]);
    this.bp = Int32Array.from(lumped, (b) => (b.p === EXTERNAL ? -1 : local.get(b.p)!));
    this.bq = Int32Array.from(lumped, (b) => (b.q === EXTERNAL ? -1 : local.get(b.q)!));
    this.bSource = Int32Array.from(lumped, (b) => b.source);
    this.bRail = Float64Array.from(lumped, (b) => b.part.rail);
    this.kL = Float64Array.from(lumped, (b) => (2 * b.part.l) / dt);
    this.kC = Float64Array.from(lumped, (b) => (b.part.c !== undefined ? dt / (2 * b.part.c) : 0));
    this.geq = Float64Array.from(lumped, (b, k) => (k < this.nc ? 1 / (b.part.r + this.kL[k] + this.kC[k]) : 0));
    this.jh = new Float64Array(nb);
    this.current = Float64Array.from(order, (k) => dc.lumped[k]);
    this.vL = new Float64Array(nb);
    this.vC = Float64Array.from(lumped, (b, k) => {
      if (b.part.c === undefined) return 0;
      const vp = b.p !== EXTERNAL ? dc.v[b.p] : NaN;
      const vq = b.q !== EXTERNAL ? dc.v[b.q] : b.part.rail;
      return vp - vq - b.part.r * this.current[k];
    });
    const m = this.nodeMatrix(ladder, dt);
    const inv = invert(m, this.n);
    if (!inv) {
      throw new NetError([
        {
          path: [...new Set(lumped.map((b) => b.item))].join(', '),
          message: 'these parts leave a node without a unique voltage (a loop of ideal sources and zero-ohm parts, or two ideal sources on one node)',
        },
      ]);
    }
    this.minv = inv;
  }

  /** The constant matrix: node capacitance and conductance, the companion conductances, the ideal branches' rows. */
  private nodeMatrix(ladder: Ladder, dt: number): Float64Array {
    const { n, nn } = this;
    const m = new Float64Array(n * n);
    this.nodes.forEach((s, a) => {
      const c = ladder.nodeC[s];
      const g = ladder.nodeG[s];
      const centred = c > 0 || g > 0;
      this.hist[a] = centred ? (2 * c) / dt - g : 0;
      this.lam[a] = centred ? 2 : 1;
      this.kap[a] = centred ? 1 : 0;
      if (centred) m[a * n + a] += (2 * c) / dt + g;
    });
    for (let k = 0; k < this.nc; k++) {
      const p = this.bp[k];
      const q = this.bq[k];
      const g = this.geq[k];
      if (p >= 0) m[p * n + p] += g;
      if (q >= 0) m[q * n + q] += g;
      if (p >= 0 && q >= 0) {
        m[p * n + q] -= g;
        m[q * n + p] -= g;
      }
    }
    for (let k = this.nc; k < this.bp.length; k++) {
      const r = nn + k - this.nc;
      const p = this.bp[k];
      const q = this.bq[k];
      if (p >= 0) m[p * n + r] = m[r * n + p] = 1;
      if (q >= 0) m[q * n + r] = m[r * n + q] = -1;
    }
    return m;
  }

  advance(v: Float64Array, i: Float64Array, sources: Float64Array): void {
    const { n, nn, nc, rhs, x, nodes, hist, lam, kap, incStart, incCell, incSign, current, bp, bq, bSource, bRail, geq, kL, kC, jh, vL, vC, minv } = this;
    const nb = bp.length;
    for (let a = 0; a < nn; a++) {
      let sum = 0;
      for (let e = incStart[a]; e < incStart[a + 1]; e++) sum += incSign[e] * i[incCell[e]];
      rhs[a] = hist[a] * v[nodes[a]] + lam[a] * sum;
    }
    // companion branches: i(n+1) = geq·(vp − vq) + J, J = −h/Z, h = vC − vL + (Δt/2C − 2L/Δt)·i(n)
    for (let k = 0; k < nc; k++) {
      const ik = current[k];
      const j = -geq[k] * (vC[k] - vL[k] + (kC[k] - kL[k]) * ik);
      jh[k] = j;
      const p = bp[k];
      const q = bq[k];
      if (p >= 0) {
        rhs[p] -= j + kap[p] * ik;
        if (q < 0) rhs[p] += geq[k] * bRail[k];
      }
      if (q >= 0) {
        rhs[q] += j + kap[q] * ik;
        if (p < 0) rhs[q] += geq[k] * sources[bSource[k]];
      }
    }
    // ideal branches: their current is an unknown; their row says vp − vq = 0
    for (let k = nc; k < nb; k++) {
      const ik = current[k];
      const p = bp[k];
      const q = bq[k];
      let known = 0;
      if (p >= 0) rhs[p] -= kap[p] * ik;
      else known -= sources[bSource[k]];
      if (q >= 0) rhs[q] += kap[q] * ik;
      else known += bRail[k];
      rhs[nn + k - nc] = known;
    }
    for (let r = 0; r < n; r++) {
      let acc = 0;
      const o = r * n;
      for (let c = 0; c < n; c++) acc += minv[o + c] * rhs[c];
      x[r] = acc;
    }
    for (let a = 0; a < nn; a++) v[nodes[a]] = x[a];
    // each branch's new current and its inductor and capacitor voltages (trapezoidal rule):
    // vL(n+1) = 2L/Δt·(i(n+1) − i(n)) − vL(n);  vC(n+1) = vC(n) + Δt/(2C)·(i(n+1) + i(n))
    for (let k = 0; k < nb; k++) {
      let inew: number;
      if (k < nc) {
        const vp = bp[k] >= 0 ? x[bp[k]] : sources[bSource[k]];
        const vq = bq[k] >= 0 ? x[bq[k]] : bRail[k];
        inew = geq[k] * (vp - vq) + jh[k];
      } else inew = x[nn + k - nc];
      const iold = current[k];
      vL[k] = kL[k] * (inew - iold) - vL[k];
      vC[k] += kC[k] * (inew + iold);
      current[k] = inew;
    }
  }
}
