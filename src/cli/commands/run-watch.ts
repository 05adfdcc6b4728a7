// `ladderwave run SCENARIO --watch [--port N]`: run, serve the explore page on 127.0.0.1, run again on
// every save, until Ctrl-C. The work is in src/explore/watch.ts (loaded only here).
import { EXIT, UsageError, describeFailure, type ExitCode } from '../../exit-codes.js';
import { formatProblem } from '../../scenario/problems.js';
import type { WatchEvent } from '../../explore/watch.js';
import type { CliContext } from '../context.js';
import type { RunCommandOptions } from './run.js';
import type { ViewName } from '../../views/select.js';

/** `--port` as typed: a whole number 0 … 65535 (0: any free port). */
export function parsePort(text: string | undefined): number {
  if (text === undefined) return 0;
  if (!/^\s*\d+\s*$/.test(text) || Number(text) > 65535) throw new UsageError(`--port ${text}: expected a whole number from 0 to 65535 (0: any free port)`);
  return Number(text);
}

const clock = () => new Date().toTimeString().slice(0, 8);

function printEvent(e: WatchEvent, file: string, ctx: CliContext, quiet: boolean): void {
  const { io } = ctx;
  switch (e.kind) {
    case 'listening':
      io.out(`watching ${file}: open ${e.url} (saving the file runs it again; Ctrl-C stops)\n`);
      break;
    case 'ran': {
      if (quiet) break;
      for (const w of e.report.scenario.warnings) io.err(`warning: ${formatProblem(w)}\n`);
      const checks = e.report.summary.checks as { passed: number; failed: number } | undefined;
      const verdict = checks ? `; checks: ${checks.passed} passed, ${checks.failed} failed` : '';
      io.out(`${clock()} ran ${file} (run ${e.revision}) into ${e.report.outDir}${verdict}; an open page reloads\n`);
      break;
    }
    case 'failed':
      io.err(`${clock()} ${file} (run ${e.revision}) did not run; the page shows why:\n`);
      io.err(describeFailure(e.error, file).lines.map((l) => `  ${l}\n`).join(''));
      break;
    case 'stopped':
      if (!quiet) io.out(`stopped watching ${file}\n`);
      break;
  }
}

export async function watchRun(file: string, outDir: string, opts: RunCommandOptions, chosen: { views: ViewName[]; frames: number }, ctx: CliContext): Promise<ExitCode> {
  const port = parsePort(opts.port);
  const { startWatch } = await import('../../explore/watch.js');
  let session: Awaited<ReturnType<typeof startWatch>>;
  try {
    session = await startWatch({
      file,
      outDir,
      port,
      run: {
        force: opts.force,
        views: chosen.views,
        frames: chosen.frames,
        report: opts.report,
        path: opts.path,
        limits: ctx.limits,
      },
      // Temporaries of an interrupted write are removed by the output registry's own signal handlers.
      onEvent: (e) => printEvent(e, file, ctx, opts.quiet === true),
    });
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code !== 'EADDRINUSE' && code !== 'EACCES') throw e;
    ctx.io.err(`ladderwave run: cannot listen on 127.0.0.1:${port} (${code === 'EADDRINUSE' ? 'in use' : 'not allowed'}); choose another --port, or 0 for any free one\n`);
    return EXIT.badInput;
  }
  const interrupt = ctx.onInterrupt?.(() => void session.close());
  try {
    await session.stopped;
  } finally {
    interrupt?.();
  }
  return EXIT.ok;
}
