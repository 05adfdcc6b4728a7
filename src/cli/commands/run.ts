// `ladderwave run SCENARIO... [--out DIR] [--quiet] [--force]`
import type { Command } from 'commander';
import { basename, extname, join, resolve } from 'node:path';
import { runScenarioFile } from '../../index.js';
import { formatProblem } from '../../scenario/problems.js';
import type { CliContext } from '../context.js';
import { describeFailure, EXIT, UsageError, worstExitCode, type ExitCode } from '../exit.js';
import { formatRunReport } from '../format.js';
import { crossCheckRun, formatCrossCheck } from '../../crosscheck/index.js';

export interface RunCommandOptions {
  out?: string;
  quiet?: boolean;
  force?: boolean;
  /** Also solve with the spectral solver and compare (crosscheck.png, summary.json "crossCheck"). */
  crossCheck?: boolean;
}

/** The scenario's file name without its extension: `nets/clock.json` → `clock`. */
export function scenarioName(file: string): string {
  const base = basename(file);
  const ext = extname(base);
  return ext && ext !== base ? base.slice(0, -ext.length) : base;
}

/**
 * Output folder per scenario: `--out DIR` for a single scenario; `DIR/<name>` for each of several;
 * `out/<name>` without `--out`. Two scenarios that would share a folder are a usage error.
 */
export function outputFolders(files: readonly string[], out: string | undefined): string[] {
  const dirs = files.map((f) => (out === undefined ? join('out', scenarioName(f)) : files.length === 1 ? out : join(out, scenarioName(f))));
  const seen = new Map<string, string>();
  dirs.forEach((dir, i) => {
    const key = resolve(dir);
    const prev = seen.get(key);
    if (prev !== undefined) {
      throw new UsageError(`${prev} and ${files[i]} would both write to ${dir}; rename one, or run them separately with --out`);
    }
    seen.set(key, files[i]);
  });
  return dirs;
}

export async function runCommand(files: string[], opts: RunCommandOptions, ctx: CliContext): Promise<ExitCode> {
  const { io } = ctx;
  let dirs: string[];
  try {
    dirs = outputFolders(files, opts.out);
  } catch (e) {
    const f = describeFailure(e);
    io.err(f.lines.map((l) => `ladderwave run: ${l}\n`).join(''));
    return f.code;
  }
  const codes: ExitCode[] = [];
  for (let i = 0; i < files.length; i++) {
    let release: (() => void) | undefined;
    try {
      const cc = opts.crossCheck ? crossCheckRun({ force: opts.force }) : undefined;
      const report = await runScenarioFile(files[i], dirs[i], {
        force: opts.force,
        extendSummary: cc?.extendSummary,
        onPhase: (phase) => {
          if (phase === 'write' && ctx.guardWrites) release = ctx.guardWrites();
        },
      });
      const ccFile = cc ? await cc.write(dirs[i]) : undefined;
      if (!opts.quiet) {
        for (const w of report.scenario.warnings) io.err(`warning: ${formatProblem(w)}\n`);
        io.out((i > 0 ? '\n' : '') + formatRunReport(report));
        if (cc?.result) io.out(formatCrossCheck(cc.result, ccFile));
      }
      codes.push(EXIT.ok);
    } catch (e) {
      const f = describeFailure(e, files[i]);
      io.err(f.lines.map((l) => l + '\n').join(''));
      codes.push(f.code);
    } finally {
      release?.();
    }
  }
  return worstExitCode(codes);
}

export function registerRunCommand(program: Command, ctx: CliContext): void {
  program
    .command('run')
    .summary('simulate scenarios; write probes.csv, waveforms.png and summary.json')
    .description(
      'Simulate each scenario and write probes.csv, waveforms.png and summary.json into its output folder.\n' +
        'Exit codes: 0 ok, 2 bad input or usage, 3 refused (over a size limit; --force overrides), 1 internal error.',
    )
    .argument('<scenario...>', 'scenario files (JSON or YAML)')
    .option('-o, --out <dir>', 'output folder (default out/<scenario name>); with several scenarios, one subfolder per scenario under it')
    .option('-q, --quiet', 'print nothing except errors')
    .option('-f, --force', 'run even if the run would exceed a size limit')
    .option('--cross-check', 'also solve the net with the independent spectral solver: print the largest difference per probe (% of swing), write crosscheck.png and a crossCheck section in summary.json')
    .action(async (files: string[], opts: RunCommandOptions) => {
      ctx.exitCode = await runCommand(files, opts, ctx);
    });
}
