// How many points a sweep (or one shard of it) may have. Each point is a whole simulation and a row
// of sweep.csv held in memory until the end, so a mistyped count (`--samples 100000000000`) is
// refused before anything runs, with the number that would fit.
import { totalmem } from 'node:os';
import { SizeRefused } from '../size-limits.js';

/** Points one sweep run computes unless --force: 100 000 (hours of work at typical point times). */
export const MAX_SWEEP_POINTS = 100_000;

/** Values one --vary axis may list: more cannot be a grid anyone wants, and they are built at once. */
export const MAX_AXIS_VALUES = 10_000_000;

/** Bytes a row of `columns` numbers takes while the sweep runs (JS array of doubles, with overhead). */
const bytesPerRow = (columns: number) => 16 * columns + 64;

/** Points whose rows fit in 40 % of the machine's memory, whatever --force says. */
export function machineSweepPoints(columns: number, memoryBytes: number = totalmem()): number {
  return Math.floor((0.4 * memoryBytes) / bytesPerRow(columns));
}

const count = (n: number) => (n < 1e15 ? Math.round(n).toLocaleString('en-US') : n.toExponential(2));

/**
 * Throws SizeRefused when `points` (of one run or one shard) is over the advisory limit (unless
 * `force`) or over what the machine can hold (always).
 */
export function checkSweepSize(points: number, columns: number, force: boolean | undefined, memoryBytes?: number): void {
  const hard = machineSweepPoints(columns, memoryBytes);
  const shards = (limit: number) => Math.ceil(points / limit);
  if (points > hard) {
    throw new SizeRefused(
      `sweep refused before starting: ${count(points)} points of ${columns} columns are more than this machine can hold, even with --force (${count(hard)} fit in 40 % of its memory); ` +
        `use fewer values or samples, or split it with --shard K/${shards(Math.min(hard, MAX_SWEEP_POINTS))} over several runs and ladderwave merge`,
      true,
    );
  }
  if (!force && points > MAX_SWEEP_POINTS) {
    throw new SizeRefused(
      `sweep refused before starting: ${count(points)} points, over the limit of ${count(MAX_SWEEP_POINTS)} (each point is a whole simulation); ` +
        `up to ${count(MAX_SWEEP_POINTS)} would fit: use fewer values or samples, or split it with --shard K/${shards(MAX_SWEEP_POINTS)} and ladderwave merge`,
      false,
    );
  }
}
