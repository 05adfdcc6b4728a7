// `ladderwave eye SCENARIO [--probe NAME] [--out DIR] [--vih V --vil V | --thresholds PRESET] [--sample-at P]`
import type { Command } from 'commander';
import { join } from 'node:path';
import { resolveThresholds } from '../../measure/index.js';
import { eyeScenarioFile } from '../../output/eye.js';
import { formatProblem } from '../../scenario/problems.js';
import { examples } from '../help.js';
import { formatSI, parseQuantity } from '../../units.js';
import type { CliContext } from '../context.js';
import { describeFailure, EXIT, UsageError, type ExitCode } from '../../exit-codes.js';
import { scenarioName } from './run.js';

export interface EyeCommandOptions {
  probe?: string;
  out?: string;
  vih?: string;
  vil?: string;
  thresholds?: string;
  sampleAt?: string;
  sampleWindow?: string;
  quiet?: boolean;
  force?: boolean;
}

/** Default output folder: out/<scenario name>-eye (apart from the run's folder, whose run is shorter). */
export function eyeOutputFolder(file: string, out: string | undefined): string {
  return out ?? join('out', `${scenarioName(file)}-eye`);
}

function volts(text: string, option: string): number {
  const q = parseQuantity(text, 'voltage');
  if (!q.ok) throw new UsageError(`${option} '${text}': expected ${q.expected}`);
  return q.value;
}

/** "50%" → 0.5: a share of the unit interval from 0 % to 100 %; throws UsageError. */
function uiShare(text: string, option: string, example: string): number {
  const m = /^\s*([0-9]*\.?[0-9]+)\s*%\s*$/.exec(text);
  const p = m ? Number(m[1]) / 100 : NaN;
  if (!(p >= 0 && p <= 1)) throw new UsageError(`${option} '${text}': expected a share of the unit interval from 0% to 100%, e.g. ${example}`);
  return p;
}

export interface EyeSettings {
  thresholds?: { vih: number; vil: number };
  samplingPhase?: number;
  samplingWindow?: number;
}

/** Thresholds, sampling phase and sampling window from the options; throws UsageError. */
export function eyeSettings(opts: EyeCommandOptions): EyeSettings {
  const out: EyeSettings = {};
  const explicit = opts.vih !== undefined || opts.vil !== undefined;
  if (explicit && opts.thresholds !== undefined) throw new UsageError('give either --thresholds or --vih and --vil, not both');
  if (explicit) {
    if (opts.vih === undefined || opts.vil === undefined) throw new UsageError('--vih and --vil go together');
    const vih = volts(opts.vih, '--vih');
    const vil = volts(opts.vil, '--vil');
    if (!(vil <= vih)) throw new UsageError(`--vil (${opts.vil}) must not be above --vih (${opts.vih})`);
    out.thresholds = { vih, vil };
  } else if (opts.thresholds !== undefined) {
    try {
      const t = resolveThresholds(opts.thresholds.trim().toLowerCase());
      out.thresholds = { vih: t.vih, vil: t.vil };
    } catch (e) {
      throw new UsageError(`--thresholds: ${(e as Error).message}`);
    }
  }
  if (opts.sampleAt !== undefined) out.samplingPhase = uiShare(opts.sampleAt, '--sample-at', '50%');
  if (opts.sampleWindow !== undefined) out.samplingWindow = uiShare(opts.sampleWindow, '--sample-window', '20%');
  return out;
}

export async function eyeCommand(file: string, opts: EyeCommandOptions, ctx: CliContext): Promise<ExitCode> {
  const { io } = ctx;
  try {
    const settings = eyeSettings(opts);
    const outDir = eyeOutputFolder(file, opts.out);
    const r = await eyeScenarioFile(file, outDir, { probe: opts.probe, force: opts.force, limits: ctx.limits, ...settings });
    if (!opts.quiet) {
      for (const w of r.scenario.warnings) io.err(`warning: ${formatProblem(w)}\n`);
      for (const w of r.eye.warnings) io.err(`warning: ${file}: eye: ${w}\n`);
      const e = r.eye;
      const si = (v: number | null, unit: string) => (v === null ? '—' : formatSI(v, unit, 4));
      const lines = [
        r.net.title || '(untitled)',
        `  probe      ${r.probe}  (${e.signal === 'clock' ? 'clock' : e.pattern}, UI ${si(e.ui, 's')}, ${e.windows} windows over ${si(r.result.discretization.duration, 's')})`,
        `  threshold  ${si(e.threshold.level, 'V')}${e.threshold.source === 'vih/vil' ? ` (vil ${si(e.threshold.vil, 'V')}, vih ${si(e.threshold.vih, 'V')})` : ' (50 % of the probe’s levels)'}`,
        `  sampling   ${si(e.samplingTime, 's')} after each bit starts at the driver (probe delay ${si(e.delay, 's')})`,
        `  window     ${si(e.samplingWindow.to - e.samplingWindow.from, 's')} around the sampling instant (${Number((e.samplingWindow.share * 100).toPrecision(3))} % of the UI): the eye height is taken over it`,
        e.open
          ? `  eye        height ${si(e.eyeHeight, 'V')}, width ${si(e.eyeWidth, 's')}`
          : `  eye        closed at the thresholds${e.warnings.length ? ' (see the warning)' : ''}`,
        `  wrote      ${r.files.join('\n             ')}`,
      ];
      io.out(lines.join('\n') + '\n');
    }
    return EXIT.ok;
  } catch (e) {
    const f = describeFailure(e, file);
    io.err(f.lines.map((l) => `${e instanceof UsageError ? 'ladderwave eye: ' : ''}${l}\n`).join(''));
    return f.code;
  }
}

export function registerEyeCommand(program: Command, ctx: CliContext): void {
  program
    .command('eye')
    .summary('eye diagram of a bits or clock signal: eye.png and summary.json with eye height and width')
    .description(
      'Simulate the scenario long enough for its whole bit pattern (PRBS-7 at least once; 64 unit intervals of a clock) ' +
        'plus the route’s settle time, fold the probe’s waveform into windows of two unit intervals, and write eye.png ' +
        'and summary.json (section "eye": eye height over the sampling window, eye width, sampling instant, threshold).\n' +
        'Exit codes: 0 ok, 2 bad input or usage, 3 refused (over a size limit; --force overrides), 4 internal error (a bug).',
    )
    .addHelpText('after', examples(['ladderwave eye scenarios/solar-tracker-prbs-link.json --thresholds lvcmos25 --sample-window 30%']))
    .argument('<scenario>', 'scenario file (JSON or YAML) whose driver sends bits or a clock')
    .option('-p, --probe <name>', 'probe to fold (default: the probe at the receiver)')
    .option('-o, --out <dir>', 'output folder (default out/<scenario name>-eye)')
    .option('--vih <volts>', 'logic high threshold, e.g. 2V (with --vil; default: the 50 % level)')
    .option('--vil <volts>', 'logic low threshold, e.g. 0.8V (with --vih)')
    .option('--thresholds <preset>', 'logic thresholds from a preset, e.g. lvcmos33')
    .option('--sample-at <share>', 'sampling instant as a share of the unit interval after the crossing (default 50%)')
    .option('--sample-window <share>', 'width of the sampling window around the sampling instant, as a share of the unit interval; the eye height is taken over it (default 20%)')
    .option('-q, --quiet', 'print nothing except errors')
    .option('-f, --force', 'run even if the run would exceed a size limit')
    .action(async (file: string, opts: EyeCommandOptions) => {
      ctx.exitCode = await eyeCommand(file, opts, ctx);
    });
}
