// A resistive network at DC, solved by nodal analysis: conductances between nodes and to fixed
// voltages, zero-resistance branches (shorts between nodes, ideal sources from a node to a fixed
// voltage). Shorts merge their nodes (union–find) and ideal sources fix the merged node's voltage,
// so the matrix that is left is the conductance (Laplacian) matrix of the remaining groups:
// symmetric and positive definite on every group with a path to a fixed voltage. It is solved by
// sparse Gaussian elimination in minimum-degree order (Tinney & Walker, "Direct solutions of sparse
// network equations by optimally ordered triangular factorization", Proc. IEEE 55(11), 1967), which
// on a tree eliminates leaves first and creates no fill. A group with no DC path to any fixed
// voltage has no defined voltage; it is put at 0 V (any value is an equilibrium: only capacitors
// see it). Currents in the zero-resistance branches follow from Kirchhoff's current law on a
// spanning tree of each merged group (a loop of shorts carries no circulating current).
import { NetError } from './errors.js';

interface Edge {
  a: number;
  b: number;
}

export class DcNetwork {
  private readonly parent: Int32Array;
  private readonly conductances: { a: number; b: number; g: number }[] = [];
  private readonly rails: { a: number; g: number; e: number }[] = [];
  private readonly shorts: Edge[] = [];
  /** True for the shorts that joined two groups (the spanning forest). */
  private treeShort: boolean[] = [];
  private readonly ideals: { a: number; e: number; where: string }[] = [];
  private group = new Int32Array(0);

  constructor(readonly size: number) {
    this.parent = Int32Array.from({ length: size }, (_, k) => k);
  }

  conductance(a: number, b: number, g: number): void {
    if (g > 0 && a !== b) this.conductances.push({ a, b, g });
  }

  /** A conductance from node `a` to a fixed voltage `e`. */
  toRail(a: number, g: number, e: number): void {
    if (g > 0) this.rails.push({ a, g, e });
  }

  /** A zero-resistance branch from `a` to `b`; returns its index for shortCurrent(). */
  short(a: number, b: number): number {
    return this.shorts.push({ a, b }) - 1;
  }

  /** A zero-resistance branch from node `a` to a fixed voltage `e` (an ideal source); returns its index. */
  ideal(a: number, e: number, where: string): number {
    return this.ideals.push({ a, e, where }) - 1;
  }

  private find(k: number): number {
    const p = this.parent;
    while (p[k] !== k) {
      p[k] = p[p[k]];
      k = p[k];
    }
    return k;
  }

  /** Node voltages. Throws NetError when two different fixed voltages are tied by zero-resistance paths. */
  solve(): Float64Array {
    this.treeShort = this.shorts.map(({ a, b }) => {
      const ra = this.find(a);
      const rb = this.find(b);
      if (ra === rb) return false;
      this.parent[ra] = rb;
      return true;
    });
    this.group = Int32Array.from({ length: this.size }, (_, k) => this.find(k));
    const fixed = this.fixedGroups();
    const unknown = new Int32Array(this.size).fill(-1); // group root → unknown index
    let n = 0;
    for (let k = 0; k < this.size; k++) if (this.group[k] === k && !fixed.has(k)) unknown[k] = n++;
    const system = new SparseSystem(n);
    for (const { a, b, g } of this.conductances) this.stampBetween(system, unknown, fixed, this.group[a], this.group[b], g);
    for (const { a, g, e } of this.rails) {
      const u = unknown[this.group[a]];
      if (u >= 0) system.addToFixed(u, g, e);
    }
    const x = system.solve();
    const v = new Float64Array(this.size);
    for (let k = 0; k < this.size; k++) {
      const r = this.group[k];
      v[k] = fixed.has(r) ? fixed.get(r)! : x[unknown[r]];
    }
    return v;
  }

  private stampBetween(s: SparseSystem, unknown: Int32Array, fixed: Map<number, number>, ga: number, gb: number, g: number): void {
    if (ga === gb) return;
    const ua = unknown[ga];
    const ub = unknown[gb];
    if (ua >= 0 && ub >= 0) {
      s.add(ua, ua, g, 0);
      s.add(ub, ub, g, 0);
      s.add(ua, ub, -g, 0);
    } else if (ua >= 0) s.addToFixed(ua, g, fixed.get(gb)!);
    else if (ub >= 0) s.addToFixed(ub, g, fixed.get(ga)!);
  }

  /** Voltage of every group an ideal source fixes; two different voltages in one group are an error. */
  private fixedGroups(): Map<number, number> {
    const fixed = new Map<number, { e: number; where: string }>();
    for (const { a, e, where } of this.ideals) {
      const g = this.group[a];
      const prev = fixed.get(g);
      if (prev && Math.abs(prev.e - e) > 1e-12 * (1 + Math.abs(prev.e) + Math.abs(e))) {
        throw new NetError([{ path: where, message: `two ideal sources or rails (${prev.e} V and ${e} V) are tied together by zero-ohm paths (with ${prev.where})` }]);
      }
      if (!prev) fixed.set(g, { e, where });
    }
    return new Map([...fixed].map(([g, f]) => [g, f.e]));
  }

  /**
   * Currents in the zero-resistance branches (shorts a → b, ideal sources from their node to the fixed
   * voltage), given `leaving[k]`: the current node k sends out through everything else. The ideal
   * sources of a group share its imbalance equally; the shorts carry what Kirchhoff's current law
   * then leaves on a spanning tree. Call after solve().
   */
  zeroResistanceCurrents(leaving: Float64Array): { shorts: Float64Array; ideals: Float64Array } {
    const out = Float64Array.from(leaving);
    const ideals = new Float64Array(this.ideals.length);
    const total = new Map<number, number>();
    const count = new Map<number, number>();
    for (let k = 0; k < this.size; k++) total.set(this.group[k], (total.get(this.group[k]) ?? 0) + out[k]);
    for (const { a } of this.ideals) count.set(this.group[a], (count.get(this.group[a]) ?? 0) + 1);
    this.ideals.forEach(({ a }, m) => {
      const g = this.group[a];
      ideals[m] = -total.get(g)! / count.get(g)!;
      out[a] += ideals[m];
    });
    return { shorts: this.treeCurrents(out), ideals };
  }

  /** Currents on the spanning-forest shorts from the nodes' net outflows (each group's sum is zero). */
  private treeCurrents(out: Float64Array): Float64Array {
    const currents = new Float64Array(this.shorts.length);
    const adj: { edge: number; other: number }[][] = Array.from({ length: this.size }, () => []);
    this.shorts.forEach(({ a, b }, e) => {
      if (!this.treeShort[e]) return;
      adj[a].push({ edge: e, other: b });
      adj[b].push({ edge: e, other: a });
    });
    const seen = new Uint8Array(this.size);
    const order: number[] = [];
    const via = new Int32Array(this.size).fill(-1);
    for (let root = 0; root < this.size; root++) {
      if (seen[root] || adj[root].length === 0) continue;
      seen[root] = 1;
      const stack = [root];
      while (stack.length) {
        const u = stack.pop()!;
        order.push(u);
        for (const { edge, other } of adj[u]) {
          if (seen[other]) continue;
          seen[other] = 1;
          via[other] = edge;
          stack.push(other);
        }
      }
    }
    // Leaves first: the edge into a node from its parent carries its whole subtree's outflow.
    for (let k = order.length - 1; k >= 0; k--) {
      const u = order[k];
      const e = via[u];
      if (e < 0) continue;
      const { a, b } = this.shorts[e];
      const parent = a === u ? b : a;
      currents[e] = b === u ? out[u] : -out[u];
      out[parent] += out[u];
    }
    return currents;
  }
}

/**
 * A sparse symmetric system A·x = r, solved by elimination in minimum-degree order. Rows without a
 * diagonal term (a group with no path to a fixed voltage) and everything coupled to them are left
 * at 0.
 */
class SparseSystem {
  private readonly rows: Map<number, number>[];
  private readonly diag: Float64Array;
  private readonly rhs: Float64Array;
  /** Rows with a conductance to a fixed voltage. */
  private readonly grounded: Uint8Array;

  constructor(readonly n: number) {
    this.rows = Array.from({ length: n }, () => new Map());
    this.diag = new Float64Array(n);
    this.rhs = new Float64Array(n);
    this.grounded = new Uint8Array(n);
  }

  /** Adds `value` at (i, j) and (j, i) (once on the diagonal), and `r` to the right-hand side of row i. */
  add(i: number, j: number, value: number, r: number): void {
    this.rhs[i] += r;
    if (i === j) {
      this.diag[i] += value;
      return;
    }
    this.rows[i].set(j, (this.rows[i].get(j) ?? 0) + value);
    this.rows[j].set(i, (this.rows[j].get(i) ?? 0) + value);
  }

  /** A conductance `g` from row i's node to the fixed voltage `e`. */
  addToFixed(i: number, g: number, e: number): void {
    this.diag[i] += g;
    this.rhs[i] += g * e;
    this.grounded[i] = 1;
  }

  solve(): Float64Array {
    const x = new Float64Array(this.n);
    const anchored = this.anchoredRows();
    const steps: { k: number; pivot: number; r: number; row: [number, number][] }[] = [];
    const heap = new MinHeap();
    for (let k = 0; k < this.n; k++) if (anchored[k]) heap.push(this.rows[k].size, k);
    const done = new Uint8Array(this.n);
    while (heap.size > 0) {
      const [deg, k] = heap.pop();
      if (done[k] || deg !== this.rows[k].size) continue;
      done[k] = 1;
      const pivot = this.diag[k];
      const row = [...this.rows[k]];
      const r = this.rhs[k];
      for (const [i, aik] of row) {
        const f = aik / pivot;
        const ri = this.rows[i];
        ri.delete(k);
        this.diag[i] -= f * aik;
        this.rhs[i] -= f * r;
        for (const [j, akj] of row) if (j !== i) ri.set(j, (ri.get(j) ?? 0) - f * akj);
      }
      for (const [i] of row) heap.push(this.rows[i].size, i);
      steps.push({ k, pivot, r, row });
    }
    for (let s = steps.length - 1; s >= 0; s--) {
      const { k, pivot, r, row } = steps[s];
      let acc = r;
      for (const [j, a] of row) acc -= a * x[j];
      x[k] = acc / pivot;
    }
    return x;
  }

  /** Rows connected (through off-diagonal terms) to a row with a path to a fixed voltage. */
  private anchoredRows(): Uint8Array {
    const seen = new Uint8Array(this.n);
    const stack: number[] = [];
    for (let k = 0; k < this.n; k++) {
      if (this.grounded[k]) {
        seen[k] = 1;
        stack.push(k);
      }
    }
    while (stack.length) {
      const k = stack.pop()!;
      for (const j of this.rows[k].keys()) {
        if (!seen[j]) {
          seen[j] = 1;
          stack.push(j);
        }
      }
    }
    return seen;
  }
}

/** A binary heap of (key, value) pairs ordered by key, then value. */
class MinHeap {
  private keys: number[] = [];
  private values: number[] = [];

  get size(): number {
    return this.keys.length;
  }

  push(key: number, value: number): void {
    this.keys.push(key);
    this.values.push(value);
    let i = this.keys.length - 1;
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (!this.less(i, p)) break;
      this.swap(i, p);
      i = p;
    }
  }

  pop(): [number, number] {
    const top: [number, number] = [this.keys[0], this.values[0]];
    const lastKey = this.keys.pop()!;
    const lastValue = this.values.pop()!;
    if (this.keys.length > 0) {
      this.keys[0] = lastKey;
      this.values[0] = lastValue;
      let i = 0;
      for (;;) {
        const l = 2 * i + 1;
        const r = l + 1;
        let m = i;
        if (l < this.keys.length && this.less(l, m)) m = l;
        if (r < this.keys.length && this.less(r, m)) m = r;
        if (m === i) break;
        this.swap(i, m);
        i = m;
      }
    }
    return top;
  }

  private less(i: number, j: number): boolean {
    return this.keys[i] < this.keys[j] || (this.keys[i] === this.keys[j] && this.values[i] < this.values[j]);
  }

  private swap(i: number, j: number): void {
    [this.keys[i], this.keys[j]] = [this.keys[j], this.keys[i]];
    [this.values[i], this.values[j]] = [this.values[j], this.values[i]];
  }
}
