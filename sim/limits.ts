// Size limits checked before anything is allocated. The defaults keep one run within about a minute
// and a few GiB on the 2-core, 24 GiB machines the project targets; `force` lifts them.
import { RAIL, type Circuit } from './circuit.js';
import { RunRefused, type Overrun } from './errors.js';
import type { Discretization } from './result.js';

export interface RunLimits {
  /** Time steps × (nodes + the lumped clusters' work per step). */
  maxCellSteps: number;
  /** Bytes of probe records (8 bytes per probe per sample). */
  maxRecordBytes: number;
  /** Nodes in the ladder (about 48 bytes each in the solver). */
  maxNodes: number;
  /** Unknowns of the largest lumped cluster's dense node matrix (8·n² bytes, n² multiply-adds per step). */
  maxLumpedUnknowns: number;
}

export const DEFAULT_LIMITS: RunLimits = {
  maxCellSteps: 3e10,
  maxRecordBytes: 2 * 1024 ** 3,
  maxNodes: 5e7,
  maxLumpedUnknowns: 2000,
};

export interface RunEstimate {
  /** Steps × (nodes + lumped work per step): the run's work in cell-steps. */
  cellSteps: number;
  recordBytes: number;
  samples: number;
  stride: number;
  /** Lumped parts (sources, parts, lossy lines' dielectric end branches). */
  parts: number;
  /** Unknowns of the largest lumped cluster. */
  largestCluster: number;
  /** Work per step beyond the line cells: Σ n² over the clusters plus a few operations per part. */
  lumpedWork: number;
}

/** Sizes of the lumped clusters, from the circuit alone (parts joined by two-node parts and zero-length lines). */
export function lumpedSizes(c: Circuit, plan: Discretization): { parts: number; clusters: number[] } {
  const parent = Int32Array.from(c.nodes, (_, k) => k);
  const find = (k: number): number => {
    while (parent[k] !== k) k = parent[k] = parent[parent[k]];
    return k;
  };
  const touched = new Uint8Array(c.nodes.length);
  const unknowns = new Map<number, number>();
  const join = (a: number, b: number) => {
    parent[find(a)] = find(b);
  };
  c.segments.forEach((s, k) => {
    if (plan.segments[k].cells === 0) join(s.from, s.to);
  });
  let dielectric = 0;
  c.segments.forEach((s, k) => {
    if (plan.segments[k].cells > 0 && s.line.shunt?.length) {
      dielectric += 2 * s.line.shunt.length;
      touched[s.from] = touched[s.to] = 1;
    }
  });
  // a coupled section's ends: coupling capacitors between its conductors' end nodes (ladder.ts)
  for (const sec of c.coupled) {
    const segs = sec.segments.map((k) => c.segments[k]);
    if (!segs.length || plan.segments[sec.segments[0]].cells === 0) continue;
    for (let a = 1; a < segs.length; a++) {
      for (const end of ['from', 'to'] as const) {
        touched[segs[0][end]] = touched[segs[a][end]] = 1;
        join(segs[0][end], segs[a][end]);
      }
    }
    dielectric += segs.length * (segs.length - 1);
  }
  for (const p of c.parts) {
    touched[p.p] = 1;
    if (p.q !== RAIL) {
      touched[p.q] = 1;
      join(p.p, p.q);
    }
  }
  for (const s of c.sources) touched[s.node] = 1;
  for (let n = 0; n < c.nodes.length; n++) if (touched[n]) unknowns.set(find(n), (unknowns.get(find(n)) ?? 0) + 1);
  for (const p of c.parts) if (p.part.r === 0 && p.part.l === 0 && p.part.c === undefined) unknowns.set(find(p.p), (unknowns.get(find(p.p)) ?? 0) + 1);
  for (const s of c.sources) if (s.resistance === 0) unknowns.set(find(s.node), (unknowns.get(find(s.node)) ?? 0) + 1);
  return { parts: c.parts.length + c.sources.length + dielectric, clusters: [...unknowns.values()] };
}

export function estimateRun(plan: Discretization, probes: number, sampleInterval: number | undefined, lumped = { parts: 0, clusters: [] as number[] }): RunEstimate {
  const stride = sampleInterval ? Math.max(1, Math.round(sampleInterval / plan.dt)) : 1;
  const samples = Math.floor(plan.steps / stride) + 1;
  const lumpedWork = lumped.clusters.reduce((s, n) => s + n * n, 0) + 8 * lumped.parts;
  return {
    cellSteps: plan.steps * (plan.nodes + lumpedWork),
    recordBytes: samples * probes * 8,
    samples,
    stride,
    parts: lumped.parts,
    largestCluster: Math.max(0, ...lumped.clusters),
    lumpedWork,
  };
}

/** The smallest sample stride whose record fits, or undefined when two samples already do not. */
function fittingStride(steps: number, probes: number, maxBytes: number): number | undefined {
  const maxSamples = Math.floor(maxBytes / (8 * probes));
  if (maxSamples < 2) return undefined;
  let s = Math.max(1, Math.floor(steps / (maxSamples - 1)));
  while (Math.floor(steps / s) + 1 > maxSamples) s++;
  return s;
}

/**
 * Throws RunRefused listing every limit the run would exceed, each with values that would run.
 * `replan(cellsPerRise)` gives the discretization and estimate with another cellsPerRise, so the
 * suggested value is one that has been checked.
 */
export function checkLimits(plan: Discretization, est: RunEstimate, limits: RunLimits, probes: number, cellsPerRise?: number, replan?: (cpr: number) => { plan: Discretization; est: RunEstimate }): void {
  const over: Overrun[] = [];
  const fits = (p: Discretization, e: RunEstimate) => p.nodes <= limits.maxNodes && e.cellSteps <= limits.maxCellSteps;
  // The largest cellsPerRise below the current one that fits (the work grows with it), checked.
  const fitCpr = (): number | undefined => {
    if (!replan || cellsPerRise === undefined || cellsPerRise <= 1) return undefined;
    const ok = (cpr: number) => {
      const r = replan(cpr);
      return fits(r.plan, r.est);
    };
    if (!ok(1)) return undefined;
    let lo = 1;
    let hi = cellsPerRise - 1;
    while (lo < hi) {
      const mid = Math.ceil((lo + hi) / 2);
      if (ok(mid)) lo = mid;
      else hi = mid - 1;
    }
    return lo;
  };
  if (plan.nodes > limits.maxNodes) {
    over.push({ limit: 'nodes', needed: plan.nodes, allowed: limits.maxNodes, fit: { cellsPerRise: fitCpr() } });
  } else if (est.cellSteps > limits.maxCellSteps) {
    const perStep = est.cellSteps / plan.steps;
    const steps = Math.floor(limits.maxCellSteps / perStep);
    over.push({
      limit: 'cellSteps',
      needed: est.cellSteps,
      allowed: limits.maxCellSteps,
      steps: plan.steps,
      nodes: plan.nodes,
      fit: { duration: steps >= 1 ? steps * plan.dt : undefined, cellsPerRise: fitCpr() },
    });
  }
  if (est.recordBytes > limits.maxRecordBytes) {
    const stride = fittingStride(plan.steps, probes, limits.maxRecordBytes);
    over.push({
      limit: 'recordBytes',
      needed: est.recordBytes,
      allowed: limits.maxRecordBytes,
      probes,
      samples: est.samples,
      fit: { sample: stride !== undefined ? stride * plan.dt : undefined, probes: Math.floor(limits.maxRecordBytes / (8 * est.samples)) || undefined },
    });
  }
  if (est.largestCluster > limits.maxLumpedUnknowns) {
    over.push({ limit: 'lumpedSize', needed: est.largestCluster, allowed: limits.maxLumpedUnknowns, fit: {} });
  }
  if (over.length) throw new RunRefused(over);
}
