// Exit codes and how each kind of error is reported. Every command maps its failures through here
// so that all of them agree:
//   0  ok
//   1  internal error: a bug in ladderwave (the stack is printed; please report it)
//   2  bad input or usage: an invalid scenario (every problem listed), a net that cannot be
//      simulated, a bad command line, or outputs that cannot be written
//   3  refused: the run would exceed a size limit; --force overrides
import { NetError, RunRefused } from '../sim/errors.js';
import { refusalLines } from './engine-text.js';
import { OutputError } from './output/run.js';
import { formatProblem, ScenarioError } from './scenario/problems.js';

export const EXIT = { ok: 0, bug: 1, badInput: 2, refused: 3 } as const;
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
    return { code: EXIT.badInput, lines: e.problems.map((p) => `${file ?? '(net)'} ${p.path || '(top level)'}: ${p.message}`) };
  }
  if (e instanceof RunRefused) {
    const lines = refusalLines(e);
    return { code: EXIT.refused, lines: [at + lines[0], ...lines.slice(1)] };
  }
  if (e instanceof OutputError || e instanceof UsageError) return { code: EXIT.badInput, lines: [at + e.message] };
  const stack = e instanceof Error ? (e.stack ?? `${e.name}: ${e.message}`) : String(e);
  return {
    code: EXIT.bug,
    lines: [`${at}internal error (a bug in ladderwave; please report it with the scenario file):`, ...stack.split('\n')],
  };
}

/** When several scenarios fail differently, the process exits with the most serious code: 1, then 3, then 2. */
export function worstExitCode(codes: readonly ExitCode[]): ExitCode {
  const rank: Record<ExitCode, number> = { 0: 0, 2: 1, 3: 2, 1: 3 };
  return codes.reduce<ExitCode>((w, c) => (rank[c] > rank[w] ? c : w), EXIT.ok);
}
