// The lumped parts of the route (driver, series parts, shunt parts, receiver parts) and the nodes they
// touch, advanced implicitly. Each part (R, L, C in series) is a trapezoidal companion model,
// v(n+1) = Z·i(n+1) + h(n) with Z = R + 2L/Δt + Δt/(2C) (Dommel, "Digital computation of electromagnetic
// transients", IEEE Trans. PAS-88, 1969). The node equation of a node with line capacitance is
// centred at n+½ like the line's own; a node with none obeys Kirchhoff's current law at n+1.
// Nodes joined by lumped series parts form a cluster; every cluster's update is linear and constant,
// y(n+1) = A·y(n) + B·u(n+1), with A and B formed once here. u holds the neighbouring line-cell
// currents at n+½, the source voltage at n+1 and a constant 1 for rails.
import { invert, multiply } from './dense.js';
import { NetError } from './errors.js';
import { EXTERNAL, type Ladder } from './ladder.js';
import type { DcState } from './dc.js';

/** Input slot codes beyond line-current indices. */
const U_SOURCE = -1;
const U_ONE = -2;

export interface LumpedSystem {
  clusters: number;
  /** Per cluster: offsets into the flat arrays below, and sizes. */
  stateOffset: Int32Array;
  stateSize: Int32Array;
  inputOffset: Int32Array;
  inputSize: Int32Array;
  matrixOffset: Int32Array;
  inputMatrixOffset: Int32Array;
  nodeOffset: Int32Array;
  nodeCount: Int32Array;
  a: Float64Array;
  b: Float64Array;
  /** Input slots: a line-current index into the current array, U_SOURCE or U_ONE. */
  inputSlot: Int32Array;
  /** Global node index of each cluster node (the first nodeCount entries of each cluster's state). */
  nodeIndex: Int32Array;
  /** State of all clusters, [V nodes, i branches, vL branches, vC branches] per cluster. */
  y: Float64Array;
  /** Per lumped branch: cluster-state index of its current (for probes and energy checks). */
  branchCurrentAt: Int32Array;
  scratchY: Float64Array;
  scratchU: Float64Array;
  /** Which global nodes are handled here (the line loop leaves them alone). */
  isLumpedNode: Uint8Array;
}

interface ClusterPlan {
  nodes: number[];
  branches: number[];
}

function planClusters(ladder: Ladder): ClusterPlan[] {
  const owner = new Int32Array(ladder.nodes).fill(-1);
  const clusters: ClusterPlan[] = [];
  const touch = (node: number): number => {
    if (owner[node] < 0) {
      owner[node] = clusters.length;
      clusters.push({ nodes: [node], branches: [] });
    }
    return owner[node];
  };
  // Series parts join the clusters of their two nodes; walking the chain in order keeps it one pass.
  const order = ladder.lumped.map((_, i) => i).sort((x, y) => nodeOf(ladder, x) - nodeOf(ladder, y));
  for (const i of order) {
    const br = ladder.lumped[i];
    if (br.p !== EXTERNAL && br.q !== EXTERNAL) {
      const c = touch(br.p);
      if (owner[br.q] < 0) {
        owner[br.q] = c;
        clusters[c].nodes.push(br.q);
      }
      clusters[c].branches.push(i);
    } else {
      clusters[touch(br.p !== EXTERNAL ? br.p : br.q)].branches.push(i);
    }
  }
  return clusters;
}

function nodeOf(ladder: Ladder, i: number): number {
  const b = ladder.lumped[i];
  return b.p !== EXTERNAL ? b.p : b.q;
}

function itemsOf(ladder: Ladder, plan: ClusterPlan): string {
  return [...new Set(plan.branches.map((i) => ladder.lumped[i].item))].join(', ');
}

export function buildLumped(ladder: Ladder, dt: number, dc: DcState, initialSource: number): LumpedSystem {
  const plans = planClusters(ladder);
  const sizes = plans.map((p) => p.nodes.length + 3 * p.branches.length);
  const inputs: number[][] = [];
  const aParts: Float64Array[] = [];
  const bParts: Float64Array[] = [];
  const isLumpedNode = new Uint8Array(ladder.nodes);
  const branchCurrentAt = new Int32Array(ladder.lumped.length);
  let stateBase = 0;
  plans.forEach((plan, ci) => {
    const nc = plan.nodes.length;
    const nb = plan.branches.length;
    const nx = nc + nb;
    const ns = sizes[ci];
    const local = new Map(plan.nodes.map((g, a) => [g, a]));
    const slots: number[] = [];
    const slotOf = (s: number) => {
      let k = slots.indexOf(s);
      if (k < 0) k = slots.push(s) - 1;
      return k;
    };
    // First pass to fix the input list, so the matrices can be sized.
    plan.nodes.forEach((g) => {
      if (g > 0 && ladder.isCell[g - 1]) slotOf(g);
      if (g < ladder.nodes - 1 && ladder.isCell[g]) slotOf(g + 1);
    });
    const uSource = slotOf(U_SOURCE);
    const uOne = slotOf(U_ONE);
    const nu = slots.length;
    const m = new Float64Array(nx * nx);
    const p = new Float64Array(nx * ns);
    const q = new Float64Array(nx * nu);
    const kL = new Float64Array(nb);
    const kC = new Float64Array(nb);
    plan.nodes.forEach((g, a) => {
      isLumpedNode[g] = 1;
      const c = ladder.nodeC[g];
      const gl = ladder.nodeG[g];
      const centred = c > 0 || gl > 0;
      const w = centred ? 0.5 : 1;
      if (centred) {
        m[a * nx + a] = c / dt + gl / 2;
        p[a * ns + a] = c / dt - gl / 2;
      }
      plan.branches.forEach((bi, k) => {
        const br = ladder.lumped[bi];
        const s = br.p === g ? 1 : br.q === g ? -1 : 0;
        m[a * nx + nc + k] += w * s;
        if (centred) p[a * ns + nc + k] -= w * s;
      });
      if (g > 0 && ladder.isCell[g - 1]) q[a * nu + slotOf(g)] = 1;
      if (g < ladder.nodes - 1 && ladder.isCell[g]) q[a * nu + slotOf(g + 1)] = -1;
    });
    plan.branches.forEach((bi, k) => {
      const br = ladder.lumped[bi];
      const row = nc + k;
      kL[k] = (2 * br.part.l) / dt;
      kC[k] = br.part.c !== undefined ? dt / (2 * br.part.c) : 0;
      if (br.p !== EXTERNAL) m[row * nx + local.get(br.p)!] += 1;
      else q[row * nu + uSource] = -1;
      if (br.q !== EXTERNAL) m[row * nx + local.get(br.q)!] -= 1;
      else q[row * nu + uOne] = br.part.rail;
      m[row * nx + row] = -(br.part.r + kL[k] + kC[k]);
      p[row * ns + nc + k] = kC[k] - kL[k];
      p[row * ns + nc + nb + k] = -1;
      p[row * ns + nc + 2 * nb + k] = 1;
      branchCurrentAt[bi] = stateBase + nc + k;
    });
    const minv = invert(m, nx);
    if (!minv) {
      throw new NetError([
        {
          path: itemsOf(ladder, plan),
          message:
            'these parts leave a node without a unique voltage (a loop of ideal sources and zero-ohm parts, or a node with nothing defining it)',
        },
      ]);
    }
    const x = multiply(minv, p, nx, nx, ns);
    const wq = multiply(minv, q, nx, nx, nu);
    const a = new Float64Array(ns * ns);
    const b = new Float64Array(ns * nu);
    a.set(x);
    b.set(wq);
    for (let k = 0; k < nb; k++) {
      const iRow = nc + k;
      const vlRow = nc + nb + k;
      const vcRow = nc + 2 * nb + k;
      for (let j = 0; j < ns; j++) {
        a[vlRow * ns + j] = kL[k] * x[iRow * ns + j];
        a[vcRow * ns + j] = kC[k] * x[iRow * ns + j];
      }
      for (let j = 0; j < nu; j++) {
        b[vlRow * nu + j] = kL[k] * wq[iRow * nu + j];
        b[vcRow * nu + j] = kC[k] * wq[iRow * nu + j];
      }
      // vL(n+1) = 2L/Δt·(i(n+1) − i(n)) − vL(n);  vC(n+1) = vC(n) + Δt/(2C)·(i(n+1) + i(n))
      a[vlRow * ns + iRow] -= kL[k];
      a[vlRow * ns + vlRow] -= 1;
      a[vcRow * ns + iRow] += kC[k];
      a[vcRow * ns + vcRow] += 1;
    }
    aParts.push(a);
    bParts.push(b);
    inputs.push(slots);
    stateBase += ns;
  });

  const n = plans.length;
  const sys: LumpedSystem = {
    clusters: n,
    stateOffset: new Int32Array(n),
    stateSize: Int32Array.from(sizes),
    inputOffset: new Int32Array(n),
    inputSize: Int32Array.from(inputs, (s) => s.length),
    matrixOffset: new Int32Array(n),
    inputMatrixOffset: new Int32Array(n),
    nodeOffset: new Int32Array(n),
    nodeCount: Int32Array.from(plans, (p) => p.nodes.length),
    a: new Float64Array(aParts.reduce((s, x) => s + x.length, 0)),
    b: new Float64Array(bParts.reduce((s, x) => s + x.length, 0)),
    inputSlot: Int32Array.from(inputs.flat()),
    nodeIndex: Int32Array.from(plans.flatMap((p) => p.nodes)),
    y: new Float64Array(stateBase),
    branchCurrentAt,
    scratchY: new Float64Array(Math.max(0, ...sizes)),
    scratchU: new Float64Array(Math.max(0, ...inputs.map((s) => s.length))),
    isLumpedNode,
  };
  let so = 0, io = 0, mo = 0, bo = 0, no = 0;
  for (let c = 0; c < n; c++) {
    sys.stateOffset[c] = so;
    sys.inputOffset[c] = io;
    sys.matrixOffset[c] = mo;
    sys.inputMatrixOffset[c] = bo;
    sys.nodeOffset[c] = no;
    sys.a.set(aParts[c], mo);
    sys.b.set(bParts[c], bo);
    so += sizes[c];
    io += inputs[c].length;
    mo += aParts[c].length;
    bo += bParts[c].length;
    no += plans[c].nodes.length;
  }
  setInitialState(sys, plans, ladder, dc, initialSource);
  return sys;
}

function setInitialState(sys: LumpedSystem, plans: ClusterPlan[], ladder: Ladder, dc: DcState, source: number): void {
  plans.forEach((plan, c) => {
    const base = sys.stateOffset[c];
    const nc = plan.nodes.length;
    const nb = plan.branches.length;
    plan.nodes.forEach((g, a) => (sys.y[base + a] = dc.v[g]));
    plan.branches.forEach((bi, k) => {
      const br = ladder.lumped[bi];
      const i = dc.lumped[bi];
      sys.y[base + nc + k] = i;
      if (br.part.c !== undefined) {
        const vp = br.p !== EXTERNAL ? dc.v[br.p] : source;
        const vq = br.q !== EXTERNAL ? dc.v[br.q] : br.part.rail;
        sys.y[base + nc + 2 * nb + k] = vp - vq - br.part.r * i;
      }
    });
  });
}

/** Advances every cluster from n to n+1, given line currents at n+½ in `current` and the source at n+1. */
export function advanceLumped(sys: LumpedSystem, current: Float64Array, voltage: Float64Array, source: number): void {
  const { y, a, b, scratchY: yn, scratchU: u, inputSlot, nodeIndex } = sys;
  for (let c = 0; c < sys.clusters; c++) {
    const so = sys.stateOffset[c];
    const ns = sys.stateSize[c];
    const io = sys.inputOffset[c];
    const nu = sys.inputSize[c];
    for (let j = 0; j < nu; j++) {
      const slot = inputSlot[io + j];
      u[j] = slot >= 0 ? current[slot] : slot === U_SOURCE ? source : 1;
    }
    let ao = sys.matrixOffset[c];
    let bo = sys.inputMatrixOffset[c];
    for (let r = 0; r < ns; r++) {
      let acc = 0;
      for (let j = 0; j < ns; j++) acc += a[ao + j] * y[so + j];
      for (let j = 0; j < nu; j++) acc += b[bo + j] * u[j];
      yn[r] = acc;
      ao += ns;
      bo += nu;
    }
    for (let r = 0; r < ns; r++) y[so + r] = yn[r];
    const no = sys.nodeOffset[c];
    for (let k = 0; k < sys.nodeCount[c]; k++) voltage[nodeIndex[no + k]] = y[so + k];
  }
}
