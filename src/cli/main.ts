#!/usr/bin/env node
// The `ladderwave` executable. Thin: runs the CLI, sets the exit code, and makes sure an
// interrupted write leaves no temporary files. An unexpected exception is a bug: its stack is
// printed and the exit code is 1.
import { removePendingTempFilesSync } from '../output/atomic.js';
import { runCli } from './program.js';
import { describeFailure } from '../exit-codes.js';

/** While outputs are being written, Ctrl-C or SIGTERM first removes the temporary files. */
function guardWrites(): () => void {
  const handlers = (['SIGINT', 'SIGTERM', 'SIGHUP'] as const).map((signal) => {
    const handler = () => {
      removePendingTempFilesSync();
      process.stderr.write(`ladderwave: interrupted (${signal}); no output file was left half-written\n`);
      process.exit(128 + ({ SIGHUP: 1, SIGINT: 2, SIGTERM: 15 } as const)[signal]);
    };
    process.on(signal, handler);
    return () => process.off(signal, handler);
  });
  return () => handlers.forEach((off) => off());
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

runCli(process.argv.slice(2), { guardWrites, onInterrupt }).then(
  (code) => {
    process.exitCode = code;
  },
  (e: unknown) => {
    removePendingTempFilesSync();
    process.stderr.write(describeFailure(e).lines.join('\n') + '\n');
    process.exitCode = 1;
  },
);
