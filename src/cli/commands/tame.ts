// `ladderwave tame SCENARIO [--objective O] [--series E24|E96|…] [--tolerance 5%] [--samples N] [--seed S]
//   [--only IDS] [--keep-existing] [--search-cells N] [--top N] [--no-write] [--jobs N] [--out DIR] [--quiet]`
// Thin: the work is in src/terminate (advise and the writers).
import type { Command } from 'commander';
import { basename, extname, join } from 'node:path';
import { writeFileAtomic } from '../../output/atomic.js';
import { prepareFileTarget } from '../../output/folder.js';
import { adviceJson, adviceMarkdown, advise, formatAdviceTable, OBJECTIVES, parseObjective, parseSeriesName, renderAdvicePlot, SERIES_NAMES, TOPOLOGIES, winner, writeWinner, type TopologyId } from '../../terminate/index.js';
import { describeFailure, EXIT, type ExitCode } from '../../exit-codes.js';
import type { CliContext } from '../context.js';

export interface TameCommandOptions {
  objective?: string;
  series?: string;
  tolerance?: string;
  samples?: string;
  seed?: string;
  only?: string;
  keepExisting?: boolean;
  searchCells?: string;
  top?: string;
  write?: boolean;
  jobs?: string;
  out?: string;
  quiet?: boolean;
}

class UsageError extends Error {}

function whole(text: string | undefined, option: string, min: number): number | undefined {
  if (text === undefined) return undefined;
  if (!/^\s*\d+\s*$/.test(text) || Number(text) < min) throw new UsageError(`${option} ${text}: expected a whole number ≥ ${min}`);
  return Number(text);
}

function tolerance(text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  const m = /^\s*±?\s*(\d+(?:\.\d+)?)\s*%\s*$/.exec(text);
  if (!m || !(Number(m[1]) > 0 && Number(m[1]) < 50)) throw new UsageError(`--tolerance ${text}: expected a percentage between 0 and 50, like 1% or 5%`);
  return Number(m[1]) / 100;
}

function only(text: string | undefined): TopologyId[] | undefined {
  if (text === undefined) return undefined;
  const ids = text.split(',').map((s) => s.trim()).filter(Boolean);
  const known = TOPOLOGIES.map((t) => t.id as string);
  const bad = ids.filter((i) => !known.includes(i));
  if (bad.length || ids.length === 0) throw new UsageError(`--only ${text}: expected topology names from ${known.join(', ')}`);
  return ids as TopologyId[];
}

export function defaultTameFolder(file: string): string {
  const b = basename(file);
  const ext = extname(b);
  return join('out', `${ext && ext !== b ? b.slice(0, -ext.length) : b}-tame`);
}

export async function tameCommand(file: string, opts: TameCommandOptions, ctx: CliContext): Promise<ExitCode> {
  const { io } = ctx;
  try {
    const objective = opts.objective === undefined ? undefined : parseObjective(opts.objective);
    if (opts.objective !== undefined && !objective) throw new UsageError(`--objective ${opts.objective}: expected one of ${OBJECTIVES.join(', ')}`);
    const series = opts.series === undefined ? undefined : parseSeriesName(opts.series);
    if (opts.series !== undefined && !series) throw new UsageError(`--series ${opts.series}: expected one of ${SERIES_NAMES.join(', ')}`);
    const req = {
      file,
      objective,
      series,
      tolerance: tolerance(opts.tolerance),
      samples: whole(opts.samples, '--samples', 1),
      seed: whole(opts.seed, '--seed', 0),
      only: only(opts.only),
      keepExisting: opts.keepExisting,
      searchCells: whole(opts.searchCells, '--search-cells', 4),
      jobs: whole(opts.jobs, '--jobs', 1),
    };
    const top = whole(opts.top, '--top', 1) ?? 3;
    const out = opts.out ?? defaultTameFolder(file);
    const advice = await advise(req);
    const best = winner(advice);
    const files: { png?: string; scenario?: string } = { png: 'tame.png' };
    if (best && opts.write !== false) files.scenario = await writeWinner(advice, best);
    // Each file atomically (an interruption removes the temporaries: output/atomic.ts's registry).
    await prepareFileTarget(join(out, 'tame.png'));
    await writeFileAtomic(join(out, 'tame.png'), await renderAdvicePlot(advice, top));
    await writeFileAtomic(join(out, 'tame.md'), adviceMarkdown(advice, files));
    await writeFileAtomic(join(out, 'tame.json'), adviceJson(advice, files));
    if (!opts.quiet) {
      io.out(formatAdviceTable(advice));
      io.out(`wrote ${join(out, 'tame.md')}, tame.json, tame.png${files.scenario ? `; the winner as ${files.scenario}` : ''}\n`);
    }
    return best && best.score.pass ? EXIT.ok : 1;
  } catch (e) {
    if (e instanceof UsageError) {
      io.err(`ladderwave tame: ${e.message}\n`);
      return EXIT.badInput;
    }
    const f = describeFailure(e, file);
    io.err(f.lines.map((l) => `${l}\n`).join(''));
    return f.code;
  }
}

export function registerTameCommand(program: Command, ctx: CliContext): void {
  program
    .command('tame')
    .summary('try the usual terminations on a net, with standard part values, and rank them')
    .description(
      [
        'For each termination that applies (none; series R at the driver; parallel R to',
        'ground or to VTT; split pair; RC; series R per star arm; series + weak parallel),',
        'search its values against the objective, round them to an E series, simulate',
        'again and rank. Writes tame.md, tame.json, tame.png and the winner as a new',
        'scenario beside the original (never overwriting a file).',
        '',
        `Objectives: ${OBJECTIVES.join(', ')} (default settling, within the checks).`,
        `Topologies for --only: ${TOPOLOGIES.map((t) => t.id).join(', ')}.`,
        '',
        'Exit codes: 0 the winner passes the checks, 1 no option does,',
        '2 bad input or usage, 3 refused (size limit).',
      ].join('\n'),
    )
    .argument('<scenario>', 'scenario file (JSON or YAML)')
    .option('--objective <name>', `what to optimise: ${OBJECTIVES.join(', ')} (default settling)`)
    .option('--series <name>', 'preferred-value series for the parts: E24 (default), E96, E12, E192 …')
    .option('--tolerance <pct>', 'part tolerance for a Monte Carlo at the rounded values, e.g. 1% or 5%')
    .option('--samples <n>', 'Monte Carlo samples per option (default 20)')
    .option('--seed <n>', 'Monte Carlo seed (default 1)')
    .option('--only <ids>', 'only these topologies, comma-separated')
    .option('--keep-existing', "keep the scenario's own terminations in the net the options are added to")
    .option('--search-cells <n>', 'time steps per rise during the search (default 10; the rounded values run at the scenario\'s own)')
    .option('--top <n>', 'options drawn in tame.png (default 3)')
    .option('--no-write', 'do not write the winning scenario file')
    .option('-j, --jobs <n>', 'threads computing simulations (default: all cores)')
    .option('-o, --out <dir>', 'output folder (default out/<scenario name>-tame)')
    .option('-q, --quiet', 'print nothing except errors')
    .action(async (file: string, opts: TameCommandOptions) => {
      ctx.exitCode = await tameCommand(file, opts, ctx);
    });
}
