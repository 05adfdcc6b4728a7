// What every command gets from the program: where to print, and process-level hooks.
import type { CliIO } from './io.js';
import type { ExitCode } from '../exit-codes.js';

export interface CliContext {
  io: CliIO;
  /** Set by a command's action; the program returns it. */
  exitCode: ExitCode;
  /**
   * Called when outputs start being written; returns a function to call when they are done.
   * The real CLI uses it to remove temporary files if the user interrupts the write (Ctrl-C).
   */
  guardWrites?: () => () => void;
  /**
   * Calls `stop` once on Ctrl-C or SIGTERM; returns a function that stops listening. Long-running
   * commands (`run --watch`) use it to stop cleanly; without it they run until they stop by themselves.
   */
  onInterrupt?: (stop: () => void) => () => void;
}
