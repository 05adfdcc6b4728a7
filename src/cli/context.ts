// What every command gets from the program: where to print, and process-level hooks.
import type { CliIO } from './io.js';
import type { ExitCode } from '../exit-codes.js';
import type { RunLimits } from '../../sim/limits.js';

export interface CliContext {
  io: CliIO;
  /** Set by a command's action; the program returns it. */
  exitCode: ExitCode;
  /**
   * Calls `stop` once on Ctrl-C or SIGTERM; returns a function that stops listening. Long-running
   * commands (`run --watch`) use it to stop cleanly; without it they run until they stop by themselves.
   */
  onInterrupt?: (stop: () => void) => () => void;
  /** Advisory size limits for every run (default sim/limits DEFAULT_LIMITS); for embedding and tests. */
  limits?: Partial<RunLimits>;
}
