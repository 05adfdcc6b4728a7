// `ladderwave merge DIR… [--out DIR] [--quiet]`: combine sweep shards into the whole sweep's files.
// Thin: the work is in src/sweep (mergeSweeps).
import type { Command } from 'commander';
import { defaultSweepFolder, mergeSweeps, readSweepFolder } from '../../sweep/index.js';
import { formatSweepReport } from '../../sweep/report.js';
import type { CliContext } from '../context.js';
import { describeFailure, EXIT, type ExitCode } from '../../exit-codes.js';
import { sweepUsageError } from './sweep.js';

export interface MergeCommandOptions {
  out?: string;
  quiet?: boolean;
  force?: boolean;
}

export async function mergeCommand(dirs: string[], opts: MergeCommandOptions, ctx: CliContext): Promise<ExitCode> {
  const { io } = ctx;
  try {
    const out = opts.out ?? defaultSweepFolder((await readSweepFolder(dirs[0]!)).file.plan.scenario.file, null);
    const outcome = await mergeSweeps(dirs, { out, force: opts.force, limits: ctx.limits });
    if (!opts.quiet) io.out(formatSweepReport(outcome));
    return outcome.result?.pick && !outcome.result.pick.best ? EXIT.checkFailed : EXIT.ok;
  } catch (e) {
    const usage = sweepUsageError(e);
    const f = usage ? { code: EXIT.badInput, lines: usage } : describeFailure(e);
    io.err(f.lines.map((l) => `${usage ? 'ladderwave merge: ' : ''}${l}\n`).join(''));
    return f.code;
  }
}

export function registerMergeCommand(program: Command, ctx: CliContext): void {
  program
    .command('merge')
    .summary('combine the shard folders of a sweep into the files a single run writes')
    .description(
      [
        'Combine the output folders of `ladderwave sweep --shard K/N` (all N of them)',
        'into sweep.csv, sweep.png, sweep.json and best/ or worst/, exactly as the',
        'unsharded sweep writes them.',
        '',
        'Exit codes: 0 done, 1 no point meets the --pick conditions,',
        '2 bad input or usage.',
      ].join('\n'),
    )
    .argument('<dirs...>', 'shard output folders')
    .option('-o, --out <dir>', 'output folder (default out/<scenario name>-sweep)')
    .option('-q, --quiet', 'print nothing except errors')
    .option('-f, --force', 'simulate the best or worst point even if it would exceed a size limit')
    .action(async (dirs: string[], opts: MergeCommandOptions) => {
      ctx.exitCode = await mergeCommand(dirs, opts, ctx);
    });
}
