// Exit codes and how each kind of error is reported. Every command maps its failures through here
// so that all of them agree:
//   0  ok
//   1  a check failed (`check`, `sweep --pick` with no passing point): a verdict, not an error
//   2  bad input or usage: an invalid scenario (every problem listed), a net that cannot be
//      simulated, a bad command line, or outputs that cannot be written
//   3  refused: the run would exceed a size limit (--force overrides the advisory limits, never
//      what the machine can hold)
//   4  internal error: a bug in ladderwave (one line; LADDERWAVE_DEBUG=1 adds the stack)
import { NetError, RunRefused } from '../sim/errors.js';
import { refusalLines } from './engine-text.js';
import { OutputError, RequestError } from './output/errors.js';
import { formatProblem, ScenarioError } from './scenario/problems.js';
import { SizeRefused } from './size-limits.js';
import type { LocatedNetProblem } from './scenario/locate.js';

export const EXIT = { ok: 0, checkFailed: 1, badInput: 2, refused: 3, bug: 4 } as const;
export type ExitCode = (typeof EXIT)[keyof typeof EXIT];

/** A command-line mistake found by a command itself (after commander's own parsing). */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}

export interface Failure {
  code: ExitCode;
  /** Lines for stderr, without trailing newlines. */
  lines: string[];
}

/** The exit code and stderr lines for an error met while working on `file` (if any). */
export function describeFailure(e: unknown, file?: string): Failure {
  const at = file ? `${file}: ` : '';
  if (e instanceof ScenarioError) return { code: EXIT.badInput, lines: e.problems.map(formatProblem) };
  if (e instanceof NetError) {
    // Same shape as scenario problems: file, key path, what is wrong.
    return {
      code: EXIT.badInput,
      lines: e.problems.map((p: LocatedNetProblem) => `${file ?? '(net)'}${p.line !== undefined ? `:${p.line}:${p.col ?? 1}` : ''} ${p.path || '(top level)'}: ${p.message}`),
    };
  }
  if (e instanceof RunRefused) {
    const lines = refusalLines(e);
    return { code: EXIT.refused, lines: [at + lines[0], ...lines.slice(1)] };
  }
  if (e instanceof SizeRefused) {
    const text = e.hard ? e.message : `${e.message}\n  (--force overrides this limit)`;
    return { code: EXIT.refused, lines: (at + text).split('\n') };
  }
  if (e instanceof OutputError || e instanceof UsageError || e instanceof RequestError) return { code: EXIT.badInput, lines: [at + e.message] };
  return { code: EXIT.bug, lines: internalErrorLines(e, at) };
}

/**
 * An unexpected exception is a bug in ladderwave: one line saying so, with the error's message but
 * no JavaScript stack (set LADDERWAVE_DEBUG=1 to have it printed too).
 */
function internalErrorLines(e: unknown, at: string): string[] {
  const message = e instanceof Error ? e.message.split('\n')[0] : String(e);
  const lines = [`${at}internal error (a bug in ladderwave; please report it with the command line and the scenario file): ${message}`];
  if (process.env.LADDERWAVE_DEBUG && e instanceof Error && e.stack) lines.push(...e.stack.split('\n'));
  return lines;
}

/**
 * When several scenarios end differently, the process exits with the most serious code, which is the
 * largest: an internal error (4), then refused (3), bad input (2), a failed check (1).
 */
export function worstExitCode(codes: readonly ExitCode[]): ExitCode {
  return codes.reduce<ExitCode>((w, c) => (c > w ? c : w), EXIT.ok);
}
