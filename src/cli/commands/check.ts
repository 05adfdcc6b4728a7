// `ladderwave check FILES_OR_GLOBS… [--junit F] [--json F] [--markdown F] [--golden DIR] [--update-golden]`
// Thin: the work is in src/checks (runChecks and the report writers).
import type { Command } from 'commander';
import { expandScenarioArgs, formatCheckTable, goldenNameClashes, runChecks, toJUnitXml, toJsonReport, toMarkdown } from '../../checks/index.js';
import { writeFileAtomic } from '../../output/atomic.js';
import { OutputError } from '../../output/errors.js';
import { checkFileTarget, prepareFileTarget } from '../../output/folder.js';
import { join } from 'node:path';
import { parseQuantity } from '../../units.js';
import type { CliContext } from '../context.js';
import { EXIT, type ExitCode } from '../../exit-codes.js';

export interface CheckCommandOptions {
  junit?: string;
  json?: string;
  markdown?: string;
  golden?: string;
  updateGolden?: boolean;
  goldenTolerance: string;
  goldenShift: string;
  goldenPlots: string;
  quiet?: boolean;
  force?: boolean;
}

export async function checkCommand(args: string[], opts: CheckCommandOptions, ctx: CliContext): Promise<ExitCode> {
  const { io } = ctx;
  const usage: string[] = [];
  const { files, problems } = expandScenarioArgs(args);
  usage.push(...problems);
  if (opts.updateGolden && !opts.golden) usage.push('--update-golden needs --golden DIR (the folder of golden files)');
  const tol = parseQuantity(opts.goldenTolerance, 'voltage', { min: 0, minExclusive: true }, '10mV');
  if (!tol.ok) usage.push(`--golden-tolerance ${opts.goldenTolerance}: expected ${tol.expected}`);
  const shift = parseQuantity(opts.goldenShift, 'time', { min: 0 }, '20ps');
  if (!shift.ok) usage.push(`--golden-shift ${opts.goldenShift}: expected ${shift.expected}`);
  if (opts.golden) usage.push(...goldenNameClashes(files));
  // Report files and the golden folder that cannot be written fail now, before any scenario runs.
  for (const f of [opts.junit, opts.json, opts.markdown]) {
    if (f === undefined) continue;
    await checkFileTarget(f).catch((e: unknown) => usage.push(e instanceof OutputError ? e.message : String(e)));
  }
  if (opts.golden && opts.updateGolden) await checkFileTarget(join(opts.golden, 'x.csv')).catch((e: unknown) => usage.push(e instanceof OutputError ? e.message : String(e)));
  if (opts.golden && !opts.updateGolden) await checkFileTarget(join(opts.goldenPlots, 'x.png')).catch((e: unknown) => usage.push(e instanceof OutputError ? e.message : String(e)));
  if (usage.length > 0) {
    io.err(usage.map((l) => `ladderwave check: ${l}\n`).join(''));
    return EXIT.badInput;
  }
  const report = await runChecks(files, {
    force: opts.force,
    limits: ctx.limits,
    golden: opts.golden && tol.ok && shift.ok ? { dir: opts.golden, update: !!opts.updateGolden, tolerance: tol.value, shift: shift.value, plots: opts.goldenPlots } : undefined,
  });
  if (!opts.quiet) io.out(formatCheckTable(report));
  else for (const s of report.scenarios) if (s.error) io.err(s.error.lines.map((l) => l + '\n').join(''));

  let code = report.exitCode;
  const outputs: [string | undefined, () => string][] = [
    [opts.junit, () => toJUnitXml(report)],
    [opts.json, () => toJsonReport(report)],
    [opts.markdown, () => toMarkdown(report)],
  ];
  for (const [file, make] of outputs) {
    if (!file) continue;
    try {
      await prepareFileTarget(file);
      await writeFileAtomic(file, make());
    } catch (e) {
      io.err(`ladderwave check: ${e instanceof OutputError ? e.message : `cannot write ${file}: ${(e as Error).message}`}\n`);
      code = EXIT.badInput;
    }
  }
  return code;
}

export function registerCheckCommand(program: Command, ctx: CliContext): void {
  program
    .command('check')
    .summary("run scenarios and their checks; exit 1 if a check fails")
    .description(
      [
        'Run each scenario, measure its probes and evaluate its "checks"; print a',
        'table: scenario, probe, metric, limit, measured, PASS/FAIL. Arguments are',
        'files, folders or glob patterns ("scenarios/**/*.json").',
        '',
        'Golden waveforms: --golden DIR compares every probe with',
        'DIR/<scenario name>.csv within --golden-tolerance volts, allowing a time',
        'shift up to --golden-shift; --update-golden rewrites them on purpose.',
        'A failed comparison draws golden against new, the largest difference',
        'marked, in --golden-plots DIR (default out/golden-diff).',
        '',
        'Exit codes: 0 every check passed, 1 a check failed, 2 bad input or usage,',
        '3 refused (over a size limit).',
      ].join('\n'),
    )
    .argument('<scenarios...>', 'scenario files, folders or glob patterns')
    .option('--junit <file>', 'write JUnit XML (one test suite per scenario, one test case per check)')
    .option('--json <file>', 'write the results as JSON')
    .option('--markdown <file>', 'write a Markdown summary (for a pull-request comment)')
    .option('--golden <dir>', 'compare each probe with the golden waveforms in DIR/<scenario name>.csv')
    .option('--update-golden', 'rewrite the golden files from this run (on purpose: review the diff)')
    .option('--golden-tolerance <volts>', 'tolerance band of the golden comparison', '10mV')
    .option('--golden-shift <time>', 'largest time shift allowed in the golden comparison', '20ps')
    .option('--golden-plots <dir>', 'where a failed golden comparison draws golden against new, with the largest difference marked: DIR/<scenario name>.png', join('out', 'golden-diff'))
    .option('-q, --quiet', 'print nothing except errors (the exit code tells the verdict)')
    .option('-f, --force', 'run even if a run would exceed a size limit')
    .action(async (args: string[], opts: CheckCommandOptions) => {
      ctx.exitCode = await checkCommand(args, opts, ctx);
    });
}
