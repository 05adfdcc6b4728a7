// `ladderwave sweep SCENARIO --vary PATH=A..B:N [--vary …] [--pick EXPR] [--spread PATH=±X --samples N --seed S]
//   [--metric M] [--jobs N] [--shard K/N] [--out DIR] [--quiet] [--force] [--explore]`
// Thin: the work is in src/sweep (runSweep).
import type { Command } from 'commander';
import { createProgress, defaultJobs, defaultSweepFolder, parseShard, PickError, runSweep, SweepInputError, SweepSpecError } from '../../sweep/index.js';
import { formatSweepReport } from '../../sweep/report.js';
import type { CliContext } from '../context.js';
import { describeFailure, EXIT, type ExitCode } from '../../exit-codes.js';

export interface SweepCommandOptions {
  vary?: string[];
  spread?: string[];
  samples?: string;
  seed?: string;
  pick?: string;
  metric?: string;
  jobs?: string;
  shard?: string;
  out?: string;
  quiet?: boolean;
  force?: boolean;
  explore?: boolean;
}

/** Usage-type errors of sweeps and merges: printed as they are, exit 2. */
export function sweepUsageError(e: unknown): string[] | undefined {
  if (e instanceof PickError) return [`--pick: ${e.message}`];
  if (e instanceof SweepSpecError || e instanceof SweepInputError) return [e.message];
  return undefined;
}

function whole(text: string | undefined, option: string, min: number): number | undefined {
  if (text === undefined) return undefined;
  if (!/^\s*\d+\s*$/.test(text) || Number(text) < min) throw new SweepSpecError(`${option} ${text}: expected a whole number ≥ ${min}`);
  return Number(text);
}

export async function sweepCommand(file: string, opts: SweepCommandOptions, ctx: CliContext, stderr: { isTTY?: boolean; columns?: number } = process.stderr): Promise<ExitCode> {
  const { io } = ctx;
  const t0 = performance.now();
  try {
    const jobs = whole(opts.jobs, '--jobs', 1) ?? defaultJobs();
    const samples = whole(opts.samples, '--samples', 1);
    const seed = whole(opts.seed, '--seed', 0);
    const shard = opts.shard !== undefined ? parseShard(opts.shard) : null;
    if (shard && opts.explore) throw new SweepSpecError('--explore needs the whole sweep: run it without --shard (a shard holds only some points)');
    const out = opts.out ?? defaultSweepFolder(file, shard);
    let progress: ReturnType<typeof createProgress> | undefined;
    const outcome = await runSweep(
      { file, vary: opts.vary, spread: opts.spread, samples, seed, pick: opts.pick, metric: opts.metric, shard },
      {
        out,
        jobs,
        force: opts.force,
        explore: opts.explore,
        limits: ctx.limits,
        onProgress: (done, total) => {
          progress ??= createProgress({ total, label: 'sweep', quiet: opts.quiet, stream: { write: (s) => io.err(s), isTTY: stderr.isTTY, columns: stderr.columns } });
          progress.update(done);
        },
      },
    );
    progress?.finish();
    if (!opts.quiet) io.out(formatSweepReport(outcome, { jobs: Math.min(jobs, outcome.rows.length), seconds: (performance.now() - t0) / 1000 }));
    // A pick that no point satisfies is a verdict, like a failed check.
    return outcome.result?.pick && !outcome.result.pick.best ? EXIT.checkFailed : EXIT.ok;
  } catch (e) {
    const usage = sweepUsageError(e);
    const f = usage ? { code: EXIT.badInput, lines: usage } : describeFailure(e, file);
    io.err(f.lines.map((l) => `${usage ? 'ladderwave sweep: ' : ''}${l}\n`).join(''));
    return f.code;
  }
}

const collect = (v: string, prev: string[] | undefined) => [...(prev ?? []), v];

export function registerSweepCommand(program: Command, ctx: CliContext): void {
  program
    .command('sweep')
    .summary('vary scenario values over a grid or a Monte Carlo spread; pick the best point')
    .description(
      [
        'Run a scenario many times with values changed, in parallel; write sweep.csv',
        '(a row per point: varied values, every measurement), sweep.png, sweep.json.',
        '',
        '  --vary PATH=A..B:N   or PATH=A..B:N:log or PATH=a,b,c (several: a grid)',
        '  --pick "minimize settling where overshoot<10%"   best point to best/',
        '  --spread PATH=±10%   or PATH=~N(5%), with --samples and --seed:',
        '                       Monte Carlo yield, worst case to worst/',
        '',
        'Paths use item names: route.<item>.series.r, lines.<name>.z0,',
        'driver.resistance, receiver.parts[0].c (docs/checks-and-sweeps.md).',
        '',
        'Exit codes: 0 done, 1 no point meets the --pick conditions,',
        '2 bad input or usage, 3 refused (size limit).',
      ].join('\n'),
    )
    .argument('<scenario>', 'scenario file (JSON or YAML)')
    .option('--vary <spec>', 'a value to vary: PATH=A..B:N, PATH=A..B:N:log or PATH=a,b,c (repeat for a grid)', collect)
    .option('--spread <spec>', 'Monte Carlo: PATH=±X (uniform) or PATH=~N(X) (normal); X in % is relative (repeatable)', collect)
    .option('--samples <n>', 'Monte Carlo samples (default 100)')
    .option('--seed <n>', 'Monte Carlo seed (default 1)')
    .option('--pick <expr>', 'choose the best grid point, e.g. "minimize settling where overshoot<10%"')
    .option('--metric <name>', 'metric plotted in sweep.png (a metric like settling, or a column like overshoot_V)')
    .option('-j, --jobs <n>', 'threads computing points (default: all cores, os.availableParallelism())')
    .option('--shard <k/n>', 'run only every N-th point starting at the K-th (1-based); combine with ladderwave merge')
    .option('-o, --out <dir>', 'output folder (default out/<scenario name>-sweep; a shard: out/<scenario name>-sweep-shard-K-of-N)')
    .option('-q, --quiet', 'print nothing except errors (no progress)')
    .option('-f, --force', 'run even if a point would exceed a size limit')
    .option('--explore', 'also write explore.html: the points in a table, chosen points\' waveforms overlaid (zoom, cursors); opens offline in any browser')
    .action(async (file: string, opts: SweepCommandOptions) => {
      ctx.exitCode = await sweepCommand(file, opts, ctx);
    });
}
