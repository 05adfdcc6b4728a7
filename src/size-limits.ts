// Size limits seen from the application: the engine's advisory limits (sim/limits.ts), which
// `--force` lifts, and the limits of the machine itself, which nothing lifts. A forced run is still
// checked, before anything is allocated, against what this machine's memory and arrays can hold, so
// that `--force` on an impossible size ends with exit 3 and the size instead of a crash.
import { totalmem } from 'node:os';
import { NetError, RunRefused } from '../sim/errors.js';
import type { RunLimits } from '../sim/limits.js';
import type { Net } from '../sim/model.js';
import type { SimResult } from '../sim/result.js';
import { refusalLines } from './engine-text.js';
import { formatSI } from './units.js';
import { simulate, type SimulateOptions } from '../sim/simulate.js';

/** A run or sweep refused by the application's own size checks (exit 3, like RunRefused). */
export class SizeRefused extends Error {
  constructor(
    message: string,
    /** true: beyond what the machine can hold, so --force does not help. */
    readonly hard: boolean,
  ) {
    super(message);
    this.name = 'SizeRefused';
  }
}

/** Elements a typed array may have in Node (2^32 − 1). */
const MAX_ARRAY_ELEMENTS = 2 ** 32 - 1;

/**
 * What this machine can hold, whatever --force says: probe records within 40 % of the memory (and
 * one typed array), the solver's nodes (about 64 bytes each) and a lumped cluster's matrix within
 * 20 % each, and a step count that t = n·Δt still counts exactly (2^53).
 */
export function machineLimits(memoryBytes: number = totalmem()): RunLimits {
  return {
    maxRecordBytes: Math.min(0.4 * memoryBytes, MAX_ARRAY_ELEMENTS * 8),
    maxNodes: Math.min((0.2 * memoryBytes) / 64, MAX_ARRAY_ELEMENTS),
    maxCellSteps: 2 ** 53,
    // A lumped cluster's dense matrix (8·n² bytes) within 20 % too.
    maxLumpedUnknowns: Math.floor(Math.sqrt((0.2 * memoryBytes) / 8)),
  };
}

export interface SizedSimulateOptions extends SimulateOptions {
  /** Memory to plan for (bytes); default os.totalmem(). For tests. */
  machineMemory?: number;
}

/**
 * The engine's simulate, with `force` meaning "past the advisory limits, up to the machine's": a
 * forced run that the machine cannot hold throws SizeRefused (hard) naming the size.
 */
export function simulateSized(net: Net, options: SizedSimulateOptions = {}): SimResult {
  const { force, machineMemory, ...rest } = options;
  if (!force) return finiteOrThrow(simulate(net, rest));
  try {
    return finiteOrThrow(simulate(net, { ...rest, limits: machineLimits(machineMemory) }));
  } catch (e) {
    if (!(e instanceof RunRefused)) throw e;
    // The sizes and the limits in the engine's words, without the closing remark about --force.
    const lines = refusalLines(e).slice(1, -1);
    throw new SizeRefused(`run refused even with --force: it is more than this machine can hold:\n${lines.join('\n')}`, true);
  }
}

/**
 * The result, after checking that every recorded voltage is a finite number; otherwise a NetError
 * naming the probe and the first such instant. (The engine is meant to stop at the first non-finite
 * value itself; this keeps a NaN out of every file whatever happens there.)
 */
export function finiteOrThrow(result: SimResult): SimResult {
  const { names, values, dtSample } = result.record;
  const data = values.data;
  const samples = values.shape[1]!;
  for (let i = 0; i < data.length; i++) {
    if (Number.isFinite(data[i])) continue;
    const p = Math.floor(i / samples);
    const t = (i - p * samples) * dtSample;
    throw new NetError([
      {
        path: 'probes',
        message: `the voltage at probe "${names[p]}" stops being a finite number at t = ${formatSI(t, 's')}: the net's values make the solution grow without bound (look for extreme part or line values)`,
      },
    ]);
  }
  return result;
}
