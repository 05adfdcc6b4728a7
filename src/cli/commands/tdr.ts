// `ladderwave tdr SCENARIO [--rise 35ps] [--z0 50ohm] [--path RECEIVER] [--out DIR] [--quiet] [--force]`
import type { Command } from 'commander';
import { join } from 'node:path';
import { formatProblem } from '../../scenario/problems.js';
import { parseQuantity, POSITIVE, formatSI } from '../../units.js';
import { DEFAULT_TDR_Z0, segmentReadings, tdrLossNote, tdrPathNote } from '../../views/tdr.js';
import { DEFAULT_TDR_RISE, runTdrFile, type TdrReport } from '../../output/tdr.js';
import type { CliContext } from '../context.js';
import { describeFailure, EXIT, UsageError, type ExitCode } from '../../exit-codes.js';
import { table } from '../format.js';
import { scenarioName } from './run.js';

export interface TdrCommandOptions {
  rise?: string;
  z0?: string;
  path?: string;
  out?: string;
  quiet?: boolean;
  force?: boolean;
}

function option(value: string | undefined, dim: 'time' | 'resistance', flag: string): number | undefined {
  if (value === undefined) return undefined;
  const r = parseQuantity(value, dim, POSITIVE);
  if (!r.ok) throw new UsageError(`${flag} ${JSON.stringify(value)}: expected ${r.expected}`);
  return r.value;
}

/** Default output folder: out/<scenario name>-tdr (apart from the run's folder, as `eye` and `sweep` do). */
export function tdrOutputFolder(file: string, out: string | undefined): string {
  return out ?? join('out', `${scenarioName(file)}-tdr`);
}

/** The text printed after a TDR run. */
export function formatTdrReport(r: TdrReport): string {
  const si = (v: number, u: string) => formatSI(v, u, 4);
  const p = r.profile;
  const rows = segmentReadings(p).map((s) => [s.name, si(s.z0, 'Ω'), Number.isNaN(s.reading) ? '—' : si(s.reading, 'Ω')]);
  const lines = [
    r.net.title,
    `  scenario    ${r.scenario.file}`,
    `  step        ${si(p.rise, 's')} (10–90 %) from ${si(p.zRef, 'Ω')} (the reference impedance)`,
    `  resolution  ${p.segments.length ? `${si(p.resolution, 'm')} in '${p.segments[0].name}' (v·t_r/4)` : '—'}`,
    ...table([['', 'Z0', 'reads'], ...rows], ['l', 'r', 'r']).map((l, i) => (i === 0 ? '  segments    ' : '              ') + l),
    ...(p.path ? [`  path        ${tdrPathNote(p)}`] : []),
    ...(tdrLossNote(p) ? [`  note        ${tdrLossNote(p)}`] : []),
    `  wrote       ${r.files.join(', ')}`,
  ];
  return lines.join('\n') + '\n';
}

export async function tdrCommand(file: string, opts: TdrCommandOptions, ctx: CliContext): Promise<ExitCode> {
  const { io } = ctx;
  let rise: number | undefined, z0: number | undefined;
  try {
    rise = option(opts.rise, 'time', '--rise');
    z0 = option(opts.z0, 'resistance', '--z0');
  } catch (e) {
    const f = describeFailure(e);
    io.err(f.lines.map((l) => `ladderwave tdr: ${l}\n`).join(''));
    return f.code;
  }
  try {
    const report = await runTdrFile(file, tdrOutputFolder(file, opts.out), { rise, z0, path: opts.path, force: opts.force, limits: ctx.limits });
    if (!opts.quiet) {
      for (const w of report.scenario.warnings) io.err(`warning: ${formatProblem(w)}\n`);
      io.out(formatTdrReport(report));
    }
    return EXIT.ok;
  } catch (e) {
    const f = describeFailure(e, file);
    io.err(f.lines.map((l) => l + '\n').join(''));
    return f.code;
  }
}

export function registerTdrCommand(program: Command, ctx: CliContext): void {
  program
    .command('tdr')
    .summary('impedance profile of a route from a simulated step TDR; write tdr.png and tdr.csv')
    .description(
      'Drive the route from a matched step source (its resistance is the reference impedance), keep the receiver, and read ' +
        'the wave reflected back to the driver pin as impedance against distance and round-trip time. Writes tdr.png and ' +
        'tdr.csv (time_s, distance_m, impedance_ohm) into the output folder.\n' +
        'Exit codes: 0 ok, 2 bad input or usage, 3 refused (over a size limit; --force overrides), 4 internal error (a bug).',
    )
    .argument('<scenario>', 'scenario file (JSON or YAML)')
    .option('-r, --rise <time>', `10–90 % rise time of the step (default ${DEFAULT_TDR_RISE * 1e12} ps, or the route's one-way delay / 400 when that is longer)`)
    .option('-z, --z0 <resistance>', `reference impedance and source resistance (default ${DEFAULT_TDR_Z0} Ω, as TDR instruments use)`)
    .option('--path <receiver>', 'on a branched net, the receiver whose path from the driver pin the distance follows (default: the main receiver)')
    .option('-o, --out <dir>', 'output folder (default out/<scenario name>-tdr)')
    .option('-q, --quiet', 'print nothing except errors')
    .option('-f, --force', 'run even if the run would exceed a size limit')
    .action(async (file: string, opts: TdrCommandOptions) => {
      ctx.exitCode = await tdrCommand(file, opts, ctx);
    });
}
