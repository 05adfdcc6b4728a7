// `ladderwave sparams SCENARIO [--out DIR] [--z0 50ohm] [--format 1.1|2.0] [--numbers RI|MA|DB]
//   [--fmax 10GHz] [--fmin 1MHz] [--points N] [--log] [--from ITEM] [--to ITEM] [--quiet]`
import type { Command } from 'commander';
import { join } from 'node:path';
import { formatProblem } from '../../scenario/problems.js';
import { parseQuantity, POSITIVE, formatSI, type Dimension } from '../../units.js';
import { runSparamsFile, type SparamsReport, type SparamsRunOptions } from '../../output/sparams.js';
import type { GridSpec } from '../../../sim/sparams/grid.js';
import type { NumberFormat } from '../../touchstone/options.js';
import type { CliContext } from '../context.js';
import { describeFailure, EXIT, UsageError, type ExitCode } from '../../exit-codes.js';
import { scenarioName } from './run.js';

export interface SparamsCommandOptions {
  out?: string;
  z0?: string;
  format?: string;
  numbers?: string;
  fmax?: string;
  fmin?: string;
  points?: string;
  log?: boolean;
  from?: string;
  to?: string;
  quiet?: boolean;
}

function quantity(value: string | undefined, dim: Dimension, flag: string): number | undefined {
  if (value === undefined) return undefined;
  const r = parseQuantity(value, dim, POSITIVE);
  if (!r.ok) throw new UsageError(`${flag} ${JSON.stringify(value)}: expected ${r.expected}`);
  return r.value;
}

/** The command line's options as library options; UsageError for a bad one. */
export function sparamsOptions(opts: SparamsCommandOptions): SparamsRunOptions {
  const version = opts.format ?? '1.1';
  if (version !== '1.1' && version !== '2.0') throw new UsageError(`--format ${JSON.stringify(version)}: expected 1.1 or 2.0 (the Touchstone version)`);
  const numbers = (opts.numbers ?? 'RI').toUpperCase();
  if (numbers !== 'RI' && numbers !== 'MA' && numbers !== 'DB') throw new UsageError(`--numbers ${JSON.stringify(opts.numbers)}: expected RI, MA or DB`);
  const grid: Partial<GridSpec> = {};
  const fmax = quantity(opts.fmax, 'frequency', '--fmax');
  const fmin = quantity(opts.fmin, 'frequency', '--fmin');
  if (fmax !== undefined) grid.fmax = fmax;
  if (fmin !== undefined) grid.fmin = fmin;
  if (fmin !== undefined && !opts.log) throw new UsageError('--fmin sets the start of a log grid: add --log (a linear grid starts at its step, fmax/points)');
  if (opts.log) grid.spacing = 'log';
  if (opts.points !== undefined) {
    const n = Number(opts.points);
    if (!(Number.isInteger(n) && n >= 2)) throw new UsageError(`--points ${JSON.stringify(opts.points)}: expected a whole number ≥ 2`);
    grid.points = n;
  }
  return {
    z0: quantity(opts.z0, 'resistance', '--z0'),
    version,
    format: numbers as NumberFormat,
    grid,
    selection: { from: opts.from, to: opts.to },
  };
}

/** The text printed after an export. */
export function formatSparamsReport(r: SparamsReport): string {
  const s = r.summary;
  const si = (v: number, u: string) => formatSI(v, u, 4);
  const db = (v: number) => `${v.toFixed(2)} dB`;
  const passive = s.largestSingularValue.value <= 1 + 1e-9 ? 'passive' : 'NOT passive';
  return [
    r.scenario.net.title,
    `  scenario    ${r.scenario.file}`,
    `  two-port    '${s.stretch.from}' … '${s.stretch.to}' (${s.stretch.items} ${s.stretch.items === 1 ? 'item' : 'items'}), TD ${si(s.stretch.delay, 's')}, reference ${s.reference.map((x) => si(x, 'Ω')).join(' / ')}`,
    `  grid        ${s.grid.points} points, ${s.grid.spacing}, ${si(s.grid.fmin, 'Hz')} to ${si(s.grid.fmax, 'Hz')}`,
    `  |S11| max   ${db(s.worstReturn.db)} at ${si(s.worstReturn.frequency, 'Hz')}`,
    `  |S21|       ${db(s.insertionAtTop.db)} at ${si(s.insertionAtTop.frequency, 'Hz')}`,
    `  σmax(S)     ${s.largestSingularValue.value.toFixed(6)} at ${si(s.largestSingularValue.frequency, 'Hz')} (${passive})`,
    `  wrote       ${r.files.join(', ')}`,
  ].join('\n') + '\n';
}

export async function sparamsCommand(file: string, opts: SparamsCommandOptions, ctx: CliContext): Promise<ExitCode> {
  const { io } = ctx;
  let options: SparamsRunOptions;
  try {
    options = sparamsOptions(opts);
  } catch (e) {
    const f = describeFailure(e);
    io.err(f.lines.map((l) => `ladderwave sparams: ${l}\n`).join(''));
    return f.code;
  }
  try {
    // Its own folder beside the run's: an output folder is replaced as a whole.
    const report = await runSparamsFile(file, opts.out ?? join('out', `${scenarioName(file)}-sparams`), options);
    if (!opts.quiet) {
      for (const w of report.scenario.warnings) io.err(`warning: ${formatProblem(w)}\n`);
      io.out(formatSparamsReport(report));
    }
    return EXIT.ok;
  } catch (e) {
    const f = describeFailure(e, file);
    io.err(f.lines.map((l) => l + '\n').join(''));
    return f.code;
  }
}

export function registerSparamsCommand(program: Command, ctx: CliContext): void {
  program
    .command('sparams')
    .summary('S-parameters of the route (driver pin → receiver pin) as a Touchstone file and a plot')
    .description(
      'Compute the two-port S-parameters of the route, or of a stretch of it (--from/--to), from the exact line models of the ' +
        'spectral solver. Port 1 is the driver pin, port 2 the receiver pin; the driver resistance and the receiver parts are not ' +
        'part of the two-port. Writes sparams.s2p (Touchstone 1.1 or 2.0), sparams.png (|S21|, |S11| in dB, phase and group ' +
        'delay, quarter-wave points marked) and sparams.json into the output folder. Default grid: linear up to 3.5/t_r of the ' +
        "scenario's fastest edge, at least 20 points per reflection ripple.\n" +
        'Exit codes: 0 ok, 2 bad input or usage, 3 refused (too many points), 4 internal error (a bug).',
    )
    .argument('<scenario>', 'scenario file (JSON or YAML)')
    .option('-o, --out <dir>', 'output folder (default out/<scenario name>-sparams)')
    .option('-z, --z0 <resistance>', 'reference resistance of both ports (default 50ohm)')
    .option('--format <version>', 'Touchstone version: 1.1 or 2.0 (default 1.1)')
    .option('--numbers <format>', 'number format in the file: RI, MA or DB (default RI)')
    .option('--fmax <frequency>', "top frequency (default 3.5/t_r of the scenario's fastest edge)")
    .option('--points <n>', 'number of frequencies (default: 20 per reflection ripple, 201 to 20001)')
    .option('--log', 'log-spaced grid from --fmin (default fmax/10000) instead of linear')
    .option('--fmin <frequency>', 'lowest frequency of a --log grid')
    .option('--from <item>', 'first route item of the stretch (default the first)')
    .option('--to <item>', 'last route item of the stretch (default the last)')
    .option('-q, --quiet', 'print nothing except errors')
    .action(async (file: string, opts: SparamsCommandOptions) => {
      ctx.exitCode = await sparamsCommand(file, opts, ctx);
    });
}
