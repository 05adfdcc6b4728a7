// `ladderwave run SCENARIO... [--out DIR] [--quiet] [--force] [--views LIST] [--path RECEIVER] [--frames N] [--report] [--explore] [--watch [--port N]]`
import type { Command } from 'commander';
import { basename, extname, join, resolve } from 'node:path';
import { runScenarioFile } from '../../index.js';
import { formatProblem } from '../../scenario/problems.js';
import type { CliContext } from '../context.js';
import { describeFailure, EXIT, UsageError, worstExitCode, type ExitCode } from '../../exit-codes.js';
import { formatRunReport } from '../format.js';
import { CHECK_FAILED } from '../../checks/index.js';
import { CROSSCHECK_FILE, crossCheckRun, formatCrossCheck } from '../../crosscheck/index.js';
import { eyeCoverageNote } from '../../views/eye.js';
import { DEFAULT_RUN_VIEWS, parseFrameCount, parseViewList, VIEW_DESCRIPTIONS, VIEW_FILES, VIEW_NAMES, ViewListError, type ViewName } from '../../views/select.js';

export interface RunCommandOptions {
  out?: string;
  quiet?: boolean;
  force?: boolean;
  /** Also solve with the spectral solver and compare (crosscheck.png, summary.json "crossCheck"). */
  crossCheck?: boolean;
  /** Comma-separated view names (default: waveforms,map). */
  views?: string;
  /** Number of animation frames, as typed. */
  frames?: string;
  report?: boolean;
  /** Print the check verdicts but exit 0 when a check fails. */
  ignoreChecks?: boolean;
  /** Also write explore.html, the interactive page. */
  explore?: boolean;
  /** Serve explore.html on 127.0.0.1 and run again whenever the scenario is saved. */
  watch?: boolean;
  /** Port for --watch, as typed (default 0: any free port). */
  port?: string;
  /** The receiver whose path the bounce view follows on a branched net. */
  path?: string;
}

/** The views and frame count asked for on the command line; throws UsageError on a bad value. */
export function viewOptions(opts: RunCommandOptions): { views: ViewName[]; frames: number } {
  try {
    return {
      views: opts.views === undefined ? [...DEFAULT_RUN_VIEWS] : parseViewList(opts.views),
      frames: opts.frames === undefined ? 0 : parseFrameCount(opts.frames),
    };
  } catch (e) {
    if (e instanceof ViewListError) throw new UsageError(e.message);
    throw e;
  }
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
  let chosen: { views: ViewName[]; frames: number };
  try {
    chosen = viewOptions(opts);
    dirs = outputFolders(files, opts.out);
    if (opts.watch && files.length !== 1) throw new UsageError(`--watch takes one scenario (got ${files.length})`);
    if (opts.port !== undefined && !opts.watch) throw new UsageError('--port goes with --watch');
    if (opts.watch) {
      const { parsePort } = await import('./run-watch.js');
      parsePort(opts.port);
    }
  } catch (e) {
    const f = describeFailure(e);
    io.err(f.lines.map((l) => `ladderwave run: ${l}\n`).join(''));
    return f.code;
  }
  if (opts.watch) {
    const { watchRun } = await import('./run-watch.js');
    return watchRun(files[0], dirs[0], opts, chosen, ctx);
  }
  const codes: ExitCode[] = [];
  for (let i = 0; i < files.length; i++) {
    try {
      const cc = opts.crossCheck ? crossCheckRun({ force: opts.force }) : undefined;
      const report = await runScenarioFile(files[i], dirs[i], {
        force: opts.force,
        limits: ctx.limits,
        extendSummary: cc?.extendSummary,
        extraFiles: cc?.files,
        views: chosen.views,
        frames: chosen.frames,
        report: opts.report,
        explore: opts.explore,
        path: opts.path,
      });
      const ccFile = cc ? join(dirs[i], CROSSCHECK_FILE) : undefined;
      if (!opts.quiet) {
        for (const w of report.scenario.warnings) io.err(`warning: ${formatProblem(w)}\n`);
        for (const s of report.skippedViews) io.err(`warning: ${files[i]}: no ${s.view} view: ${s.reason}\n`);
        for (const s of report.partialViews) io.err(`warning: ${files[i]}: ${s.view} view: ${s.reason}\n`);
        if (report.framesSkipped) io.err(`warning: ${files[i]}: no frames: ${report.framesSkipped}\n`);
        const eye = report.summary.eye;
        const drawn = report.files.some((f) => basename(f) === VIEW_FILES.eye);
        const thin = eye && drawn ? eyeCoverageNote(eye) : null;
        if (thin) io.err(`warning: ${files[i]}: ${thin}\n`);
        for (const w of eye?.warnings ?? []) io.err(`warning: ${files[i]}: eye: ${w}\n`);
        io.out((i > 0 ? '\n' : '') + formatRunReport(report));
        if (cc?.result) io.out(formatCrossCheck(cc.result, ccFile));
        if (report.frameFiles.length) {
          io.out(`  ${'frames'.padEnd(9)}  ${report.frameFiles.length} PNG frames in ${join(dirs[i], 'frames')}\n`);
        }
      }
      const failed = report.checks.filter((c) => !c.pass).length;
      codes.push(failed > 0 && !opts.ignoreChecks ? CHECK_FAILED : EXIT.ok);
    } catch (e) {
      const f = describeFailure(e, files[i]);
      io.err(f.lines.map((l) => l + '\n').join(''));
      codes.push(f.code);
    }
  }
  return worstExitCode(codes);
}

export function registerRunCommand(program: Command, ctx: CliContext): void {
  program
    .command('run')
    .summary('simulate scenarios; write probes.csv, summary.json and the views as PNG')
    .description(
      'Simulate each scenario and write probes.csv, summary.json and one PNG per view into its output folder.\n' +
        'Views: ' +
        VIEW_NAMES.map((v) => `${v} (${VIEW_DESCRIPTIONS[v]})`).join('; ') +
        '.\n' +
        'The verdicts of the scenario\'s "checks" are printed and written to summary.json.\n' +
        'Exit codes: 0 ok, 1 a check failed (--ignore-checks: 0), 2 bad input or usage, 3 refused (over a size limit; --force overrides), 4 internal error (a bug).',
    )
    .argument('<scenario...>', 'scenario files (JSON or YAML)')
    .option('-o, --out <dir>', 'output folder (default out/<scenario name>); with several scenarios, one subfolder per scenario under it')
    .option('-q, --quiet', 'print nothing except errors')
    .option('-f, --force', 'run even if the run would exceed a size limit')
    .option('--cross-check', 'also solve the net with the independent spectral solver: print the largest difference per probe (% of swing), write crosscheck.png and a crossCheck section in summary.json')
    .option('--views <list>', `views to draw, comma-separated from ${VIEW_NAMES.join(', ')}, or all, or none for probes.csv and summary.json only (default ${DEFAULT_RUN_VIEWS.join(',')})`)
    .option('--path <receiver>', 'on a branched net, the receiver whose path from the driver pin the bounce view follows (default: the main receiver)')
    .option('--frames <n>', 'also write N PNG frames of the voltage along the route to frames/')
    .option('--report', 'also write report.html: the scenario, route, views, measurements and checks in one page')
    .option('--ignore-checks', 'print the check verdicts but exit 0 even when a check fails')
    .option('--explore', 'also write explore.html: an interactive page (zoom, cursors, the voltage along the route at any instant, clickable measurements); opens offline in any browser')
    .option('--watch', 'serve explore.html on 127.0.0.1 and run again whenever the scenario file is saved; the open page reloads, or lists the saved file\'s problems (one scenario; Ctrl-C stops)')
    .option('--port <n>', 'port for --watch on 127.0.0.1 (default 0: any free port)')
    .action(async (files: string[], opts: RunCommandOptions) => {
      ctx.exitCode = await runCommand(files, opts, ctx);
    });
}
