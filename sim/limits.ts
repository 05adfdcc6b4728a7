// Size limits checked before anything is allocated. The defaults keep one run within about a minute
// and a few GiB on the 2-core, 24 GiB machines the project targets; `force` lifts them.
import { RunRefused } from './errors.js';
import type { Discretization } from './result.js';

export interface RunLimits {
  /** Time steps × nodes. */
  maxCellSteps: number;
  /** Bytes of probe records (8 bytes per probe per sample). */
  maxRecordBytes: number;
  /** Nodes in the ladder (about 48 bytes each in the solver). */
  maxNodes: number;
}

export const DEFAULT_LIMITS: RunLimits = {
  maxCellSteps: 3e10,
  maxRecordBytes: 2 * 1024 ** 3,
  maxNodes: 5e7,
};

export interface RunEstimate {
  cellSteps: number;
  recordBytes: number;
  samples: number;
  stride: number;
}

export function estimateRun(plan: Discretization, probes: number, sampleInterval: number | undefined): RunEstimate {
  const stride = sampleInterval ? Math.max(1, Math.round(sampleInterval / plan.dt)) : 1;
  const samples = Math.floor(plan.steps / stride) + 1;
  return { cellSteps: plan.steps * plan.nodes, recordBytes: samples * probes * 8, samples, stride };
}

/** Throws RunRefused naming every limit the run would exceed and what would fit. */
export function checkLimits(plan: Discretization, est: RunEstimate, limits: RunLimits): void {
  const over: string[] = [];
  if (plan.nodes > limits.maxNodes) {
    over.push(`the route needs ${plan.nodes} nodes (limit ${limits.maxNodes}); lower cellsPerRise or use a slower edge`);
  }
  if (est.cellSteps > limits.maxCellSteps) {
    const fitDuration = (limits.maxCellSteps / plan.nodes) * plan.dt;
    over.push(
      `${plan.steps} steps × ${plan.nodes} nodes = ${est.cellSteps.toExponential(2)} cell-steps (limit ${limits.maxCellSteps.toExponential(2)}); ` +
        `a duration up to ${fitDuration.toExponential(3)} s would fit, or lower cellsPerRise`,
    );
  }
  if (est.recordBytes > limits.maxRecordBytes) {
    const stride = Math.ceil(est.recordBytes / limits.maxRecordBytes) * est.stride;
    over.push(
      `probe records need ${(est.recordBytes / 1024 ** 2).toFixed(0)} MiB (limit ${(limits.maxRecordBytes / 1024 ** 2).toFixed(0)} MiB); ` +
        `a sample interval of ${(stride * plan.dt).toExponential(3)} s or more would fit`,
    );
  }
  if (over.length) throw new RunRefused(`run refused before starting:\n  ${over.join('\n  ')}\n  (force overrides these limits)`);
}
