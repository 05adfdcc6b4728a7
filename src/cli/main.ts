#!/usr/bin/env node
// The `ladderwave` executable. Thin: runs the CLI and sets the exit code. While this process has
// temporary files or folders on disk (outputs being written), SIGINT, SIGTERM and SIGHUP first remove
// them, so an interruption never leaves a half-written output; at other moments (a long simulation)
// the signals keep their default action and end the process at once. An unexpected exception is a
// bug: one line, exit code 4.
import { removePendingTempFilesSync, setInterruptGuard } from '../output/atomic.js';
import { runCli } from './program.js';
import { describeFailure } from '../exit-codes.js';

const SIGNALS = { SIGHUP: 1, SIGINT: 2, SIGTERM: 15 } as const;

function onSignal(signal: keyof typeof SIGNALS): void {
  removePendingTempFilesSync();
  process.stderr.write(`ladderwave: interrupted (${signal}); no output file was left half-written\n`);
  process.exit(128 + SIGNALS[signal]);
}

/** Ctrl-C or SIGTERM calls `stop` (once) instead of ending the process. */
function onInterrupt(stop: () => void): () => void {
  const signals = ['SIGINT', 'SIGTERM'] as const;
  const off = () => signals.forEach((s) => process.off(s, handler));
  const handler = () => {
    off();
    stop();
  };
  signals.forEach((s) => process.on(s, handler));
  return off;
}

setInterruptGuard({
  install: () => (Object.keys(SIGNALS) as (keyof typeof SIGNALS)[]).forEach((s) => process.on(s, onSignal)),
  remove: () => (Object.keys(SIGNALS) as (keyof typeof SIGNALS)[]).forEach((s) => process.off(s, onSignal)),
});

runCli(process.argv.slice(2), { onInterrupt }).then(
  (code) => {
    process.exitCode = code;
  },
  (e: unknown) => {
    removePendingTempFilesSync();
    const f = describeFailure(e);
    process.stderr.write(f.lines.join('\n') + '\n');
    process.exitCode = f.code;
  },
);
