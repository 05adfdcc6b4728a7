// `ladderwave line [SCENARIO] [--item NAME] [--json] [--freq LIST] [--microstrip k=v,...] ...`
//
// Prints, for each line of a scenario (or described on the command line): Z0, ε_eff, delay per
// length, the high-frequency limit, R′ L′ G′ C′, Z0, attenuation and skin depth at DC and at the
// chosen frequencies — as an aligned table, or JSON with --json.
import type { Command } from 'commander';
import {
  COUPLED_OPTIONS,
  coupledFromOption,
  DEFAULT_REPORT_FREQUENCIES,
  evaluateCoupled,
  evaluateLine,
  formatCoupledReport,
  formatLineReports,
  GEOMETRY_OPTIONS,
  lineFromOption,
  lineReportsToJson,
  linesFromScenario,
  type CoupledForm,
  type CoupledInput,
  type LineInput,
} from '../../lines-report/index.js';
import { formatProblem, type Problem } from '../../scenario/problems.js';
import { examples } from '../help.js';
import { POSITIVE, parseQuantity } from '../../units.js';
import type { CliContext } from '../context.js';
import { describeFailure, EXIT, UsageError, type ExitCode } from '../../exit-codes.js';

export interface LineCommandOptions {
  item?: string[];
  json?: boolean;
  freq?: string;
  quiet?: boolean;
  microstrip?: string[];
  stripline?: string[];
  coax?: string[];
  twoWire?: string[];
  coupledMicrostrip?: string[];
  coupledStripline?: string[];
  coupledModes?: string[];
}

/** `coupled-microstrip` → the commander option key `coupledMicrostrip`. */
const optionKey = (form: CoupledForm) => form.replace(/-(\w)/g, (_m, c: string) => c.toUpperCase()) as 'coupledMicrostrip' | 'coupledStripline' | 'coupledModes';

/** "100MHz,1GHz,10GHz" → Hz; a bad entry is a usage error naming it. */
export function parseFrequencyList(text: string): number[] {
  const out: number[] = [];
  for (const piece of text.split(',')) {
    const s = piece.trim();
    if (s === '') continue;
    const q = parseQuantity(s, 'frequency', POSITIVE, '1GHz');
    if (!q.ok) throw new UsageError(`--freq: "${s}" — expected ${q.expected}, in a comma-separated list like 100MHz,1GHz,10GHz`);
    out.push(q.value);
  }
  if (out.length === 0) throw new UsageError('--freq: expected at least one frequency, like 100MHz,1GHz,10GHz');
  return out;
}

export async function lineCommand(scenario: string | undefined, opts: LineCommandOptions, ctx: CliContext): Promise<ExitCode> {
  const { io } = ctx;
  try {
    const freqs = opts.freq !== undefined ? parseFrequencyList(opts.freq) : [...DEFAULT_REPORT_FREQUENCIES];
    const given = GEOMETRY_OPTIONS.flatMap((kind) => (opts[kind] ?? []).map((pairs, i, all) => ({ kind, pairs, name: all.length > 1 ? `${kind}#${i + 1}` : kind })));
    const coupledGiven = COUPLED_OPTIONS.flatMap((form) => (opts[optionKey(form)] ?? []).map((pairs, i, all) => ({ form, pairs, name: all.length > 1 ? `${form}#${i + 1}` : form })));
    if (scenario === undefined && given.length === 0 && coupledGiven.length === 0) {
      throw new UsageError(
        `give a scenario file, or a line with ${[...GEOMETRY_OPTIONS, ...COUPLED_OPTIONS].map((k) => `--${k}`).join(', ')} (for example --microstrip width=8mil,height=5mil,thickness=1oz,er=4.3,lossTangent=0.02)`,
      );
    }
    if (opts.item && scenario === undefined) throw new UsageError('--item picks lines of a scenario file: give one');

    let lines: LineInput[] = [];
    const coupledFromFile: CoupledInput[] = [];
    const warnings: Problem[] = [];
    if (scenario !== undefined) {
      const s = await linesFromScenario(scenario);
      lines.push(...s.lines);
      warnings.push(...s.warnings);
      coupledFromFile.push(...(s.coupled ?? []));
      if (opts.item) {
        const names = lines.map((l) => l.name);
        const missing = opts.item.filter((n) => !names.includes(n));
        if (missing.length > 0) {
          throw new UsageError(`--item ${missing.map((m) => `"${m}"`).join(', ')}: no such line in ${scenario} (lines: ${names.map((n) => `"${n}"`).join(', ') || 'none'})`);
        }
        lines = lines.filter((l) => opts.item!.includes(l.name));
      }
    }
    for (const g of given) {
      const s = lineFromOption(g.kind, g.pairs, g.name);
      lines.push(...s.lines);
      warnings.push(...s.warnings);
    }
    const coupled: CoupledInput[] = [...coupledFromFile];
    for (const c of coupledGiven) {
      const s = coupledFromOption(c.form, c.pairs, c.name);
      coupled.push(s.input);
      warnings.push(...s.warnings);
    }
    if (!opts.quiet) for (const w of warnings) io.err(`warning: ${formatProblem(w)}\n`);
    const reports = lines.map((l) => evaluateLine(l, freqs));
    const coupledReports = coupled.map(evaluateCoupled);
    if (opts.json) io.out(lineReportsToJson(reports, freqs, coupledReports));
    else if (reports.length === 0 && coupledReports.length === 0) io.out(`${scenario}: no lines (the route has only lumped parts)\n`);
    else io.out([...(reports.length ? [formatLineReports(reports)] : []), ...coupledReports.map(formatCoupledReport)].join('\n'));
    return EXIT.ok;
  } catch (e) {
    const f = describeFailure(e);
    io.err(f.lines.map((l) => `${e instanceof UsageError ? 'ladderwave line: ' : ''}${l}\n`).join(''));
    return f.code;
  }
}

const collect = (value: string, previous: string[] | undefined) => [...(previous ?? []), value];

export function registerLineCommand(program: Command, ctx: CliContext): void {
  const cmd = program
    .command('line')
    .summary('print Z0, delay, R′ L′ G′ C′, attenuation and skin depth of lines')
    .description(
      'Print, for each line of a scenario (or described with --microstrip, --stripline, --coax, --twoWire): ' +
        'Z0, ε_eff, delay per length, the high-frequency limit, and R′, L′, G′, C′, Z0, attenuation (dB/m, dB/in) ' +
        'and skin depth at DC and at the chosen frequencies. ' +
        'Geometry options take the keys of the scenario form as key=value pairs (examples below).\n' +
        'A coupled pair (--coupled-microstrip, --coupled-stripline, --coupled-modes) prints its L and C matrices, ' +
        'modal velocities and impedances, Z_odd, Z_even, Z_diff, Z_comm and the coupling coefficients K_b, K_f.\n' +
        'Exit codes: 0 ok, 2 bad input or usage, 4 internal error (a bug).',
    )
    .addHelpText(
      'after',
      examples([
        'ladderwave line --microstrip width=8mil,height=5mil,thickness=1oz,er=4.3,lossTangent=0.02',
        'ladderwave line --coupled-microstrip width=5mil,spacing=6mil,height=4mil,er=4.2',
        'ladderwave line --coupled-modes zOdd=45ohm,zEven=56ohm,delayOdd=150ps/in,delayEven=160ps/in',
        'ladderwave line scenarios/backplane-fr4-lossy.json --freq 500MHz,2GHz',
      ]),
    )
    .argument('[scenario]', 'scenario file (JSON or YAML)')
    .option('-i, --item <name>', 'only this route item or named line (repeatable)', collect)
    .option('--json', 'print JSON (SI units) instead of a table')
    .option('--freq <list>', 'frequencies, comma-separated (default 100MHz,1GHz,10GHz)')
    .option('-q, --quiet', 'do not print warnings');
  for (const kind of GEOMETRY_OPTIONS) cmd.option(`--${kind} <pairs>`, `a ${kind} as key=value pairs (repeatable)`, collect);
  cmd.option('--coupled-microstrip <pairs>', 'an edge-coupled microstrip pair: width, spacing, height, er (repeatable)', collect);
  cmd.option('--coupled-stripline <pairs>', 'an edge-coupled centred stripline pair: width, spacing, planeSpacing, er (repeatable)', collect);
  cmd.option('--coupled-modes <pairs>', 'a symmetric pair from zOdd, zEven and delayOdd/delayEven or velocityOdd/velocityEven (repeatable)', collect);
  cmd.action(async (scenario: string | undefined, opts: LineCommandOptions) => {
    ctx.exitCode = await lineCommand(scenario, opts, ctx);
  });
}
