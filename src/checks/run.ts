// `ladderwave check` as a library: run every scenario, measure its probes, evaluate its checks and
// optionally compare with (or update) golden waveforms. One report per scenario, in argument order.
import { join } from 'node:path';
import { prepareFileTarget } from '../output/folder.js';
import { simulateSized } from '../size-limits.js';
import type { RunLimits } from '../../sim/limits.js';
import { EXIT, describeFailure, worstExitCode, type ExitCode } from '../exit-codes.js';
import { writeFileAtomic } from '../output/atomic.js';
import { formatSI } from '../units.js';
import { writeCsv } from '../output/csv.js';
import { probeTraces } from '../../sim/result.js';
import { readScenarioFile, withPositions } from '../output/run.js';
import { netChecks } from '../scenario/checks.js';
import { compareWithGolden, describeGoldenLimit, GoldenFormatError, goldenPath, readGolden, scenarioBaseName, type CompareOptions, type GoldenCheck, type GoldenRecord } from './golden.js';
import type { GoldenFailure } from './golden-plot.js';
import { measureNet } from '../output/measure-net.js';

export type Verdict = 'pass' | 'fail' | 'error';

/** Exit code of `ladderwave check` when every scenario ran and at least one check failed. */
export const CHECK_FAILED: ExitCode = 1;

/** One line of the results table: a check or a golden comparison of one probe. */
export interface CheckRow {
  kind: 'check' | 'golden';
  probe: string;
  /** The metric name; "golden" for a golden comparison. */
  metric: string;
  limit: string;
  measured: number | null;
  measuredText: string;
  pass: boolean;
  message: string;
}

export interface ScenarioReport {
  file: string;
  /** null when the file could not be loaded. */
  title: string | null;
  sha256: string | null;
  verdict: Verdict;
  rows: CheckRow[];
  /** Why the scenario could not be run (bad input, over a size limit, a bug), one message per line. */
  error: { code: ExitCode; lines: string[] } | null;
  /** Remarks: "no checks in this scenario", "golden file written: …". */
  notes: string[];
  /** Wall-clock seconds spent on this scenario. */
  seconds: number;
}

export interface GoldenOptions extends CompareOptions {
  dir: string;
  /** Rewrite the golden files from this run instead of comparing. */
  update: boolean;
  /**
   * Folder for the picture of a failed comparison, `<plots>/<scenario name>.png` (golden against this
   * run, the difference and its largest point); none is written when absent.
   */
  plots?: string;
}

export interface CheckRunOptions {
  golden?: GoldenOptions;
  /** Run even when a size limit would be exceeded. */
  force?: boolean;
  /** Advisory size limits (default sim/limits DEFAULT_LIMITS). */
  limits?: Partial<RunLimits>;
  /** Called after each scenario (for progress output). */
  onScenario?: (report: ScenarioReport, index: number, total: number) => void;
}

export interface CheckTotals {
  scenarios: number;
  checks: number;
  passed: number;
  failed: number;
  /** Scenarios that could not be run. */
  errors: number;
  failedScenarios: number;
}

export interface CheckRunReport {
  scenarios: ScenarioReport[];
  totals: CheckTotals;
  /** 0 every check passed; 1 a check failed; 2 (or 3) a scenario could not be run. */
  exitCode: ExitCode;
}

/** Golden files are named after the scenario: two scenarios with one name would share one. */
export function goldenNameClashes(files: readonly string[]): string[] {
  const seen = new Map<string, string>();
  const out: string[] = [];
  for (const f of files) {
    const n = scenarioBaseName(f);
    const prev = seen.get(n);
    if (prev !== undefined) out.push(`${prev} and ${f} would share the golden file ${n}.csv; rename one, or check them in separate runs`);
    else seen.set(n, f);
  }
  return out;
}

/**
 * Below these, a measured value is shown as 0 in the results tables: 0.01 % of the swing, 1 µV, 1 fs —
 * far under what a simulation's numbers mean (floating-point dust like "1.332e-14 %" or "0.0002 fV").
 */
const SHOWN_AS_ZERO: Readonly<Record<string, number>> = { '%': 0.005, V: 1e-6, s: 1e-15 };

/** A measured value as the tables print it: sensible precision, never an exponent. */
export function tableValue(value: number | null, unit: string | null, fallback: string): string {
  if (value === null || unit === null || !Number.isFinite(value)) return fallback;
  const floor = SHOWN_AS_ZERO[unit];
  const v = floor !== undefined && Math.abs(value) < floor ? 0 : value;
  if (unit === '%') return `${Number(v.toFixed(2))} %`;
  if (unit === 'V' || unit === 's') return formatSI(v, unit, 4);
  return String(Number(v.toPrecision(6)));
}

export async function checkScenarioFile(file: string, opts: CheckRunOptions = {}): Promise<ScenarioReport> {
  const t0 = performance.now();
  const report: ScenarioReport = { file, title: null, sha256: null, verdict: 'pass', rows: [], error: null, notes: [], seconds: 0 };
  try {
    const scenario = await readScenarioFile(file);
    const { net } = scenario;
    report.title = net.title;
    report.sha256 = scenario.sha256;
    const result = await withPositions(scenario, async () => simulateSized(net, { force: opts.force, limits: opts.limits }));
    const { results } = measureNet(net, result);
    for (const r of results) {
      report.rows.push({ kind: 'check', probe: r.probe, metric: r.metric, limit: r.limit, measured: r.measured, measuredText: tableValue(r.measured, r.unit, r.measuredText), pass: r.pass, message: r.message });
    }
    if (netChecks(net).length === 0) report.notes.push('no checks in this scenario');
    if (opts.golden) {
      const g = opts.golden;
      const path = goldenPath(g.dir, file);
      if (g.update) {
        await prepareFileTarget(path);
        await writeFileAtomic(path, (sink) => writeCsv(result.record, sink));
        report.notes.push(`golden file written: ${path}`);
      } else {
        const hint = `to create or update it on purpose run: ladderwave check ${file} --golden ${g.dir} --update-golden`;
        let golden;
        try {
          golden = await readGolden(path);
        } catch (e) {
          // A golden file that is not a probes.csv is bad input (exit 2), not a failed comparison.
          if (!(e instanceof GoldenFormatError)) throw e;
          report.error = { code: EXIT.badInput, lines: [e.message, `  ${hint}`] };
          report.verdict = 'error';
          report.seconds = (performance.now() - t0) / 1000;
          return report;
        }
        if (golden === undefined) {
          report.rows.push({
            kind: 'golden',
            probe: '*',
            metric: 'golden',
            limit: describeGoldenLimit(g),
            measured: null,
            measuredText: 'n/a',
            pass: false,
            message: `no golden file ${path}; ${hint}`,
          });
        } else if (golden) {
          const rows = probeTraces(result.record);
          const cmp = compareWithGolden({ names: result.record.names, dt: result.record.dtSample, rows }, golden, g, hint);
          const plot = g.plots ? await writeGoldenPlot(g.plots, file, net.title, result.record.dtSample, rows, result.record.names, golden, cmp, g.tolerance) : null;
          for (const c of cmp) {
            const where = plot && !c.pass && c.measured !== null ? `; picture: ${plot}` : '';
            report.rows.push({ kind: 'golden', probe: c.probe, metric: 'golden', limit: c.limit, measured: c.measured, measuredText: tableValue(c.measured, 'V', c.measuredText), pass: c.pass, message: c.message + where });
          }
          if (plot) report.notes.push(`golden comparison failed: golden against this run in ${plot}`);
        }
      }
    }
    report.verdict = report.rows.every((r) => r.pass) ? 'pass' : 'fail';
  } catch (e) {
    const f = describeFailure(e, file);
    report.error = { code: f.code, lines: f.lines };
    report.verdict = 'error';
  }
  report.seconds = (performance.now() - t0) / 1000;
  return report;
}

/**
 * Writes `<dir>/<scenario name>.png` for the probes that failed their golden comparison (those that were
 * compared); returns its path, or null when no compared probe failed.
 */
async function writeGoldenPlot(
  dir: string,
  file: string,
  title: string,
  dt: number,
  rows: readonly ArrayLike<number>[],
  names: readonly string[],
  golden: GoldenRecord,
  cmp: readonly GoldenCheck[],
  tolerance: number,
): Promise<string | null> {
  const failures: GoldenFailure[] = [];
  for (const c of cmp) {
    if (c.pass || c.measured === null || c.shift === null || c.time === null) continue;
    const p = names.indexOf(c.probe);
    const gi = golden.names.indexOf(c.probe);
    failures.push({ probe: c.probe, values: rows[p]!, golden: golden.columns[gi]!, shift: c.shift, maxDiff: c.measured, time: c.time });
  }
  if (failures.length === 0) return null;
  const { renderGoldenOverlay } = await import('./golden-plot.js');
  const png = renderGoldenOverlay({ title, dt, goldenTimes: golden.times, failures, tolerance });
  const path = join(dir, `${scenarioBaseName(file)}.png`);
  await prepareFileTarget(path);
  await writeFileAtomic(path, png);
  return path;
}

export function totalsOf(scenarios: readonly ScenarioReport[]): CheckTotals {
  const rows = scenarios.flatMap((s) => s.rows);
  const passed = rows.filter((r) => r.pass).length;
  return {
    scenarios: scenarios.length,
    checks: rows.length,
    passed,
    failed: rows.length - passed,
    errors: scenarios.filter((s) => s.verdict === 'error').length,
    failedScenarios: scenarios.filter((s) => s.verdict === 'fail').length,
  };
}

/** Exit code of a check run: a scenario that could not be run outweighs a failed check. */
export function checkExitCode(scenarios: readonly ScenarioReport[]): ExitCode {
  const errors = scenarios.filter((s) => s.error).map((s) => s.error!.code);
  if (errors.length > 0) return worstExitCode(errors);
  return scenarios.some((s) => s.verdict === 'fail') ? CHECK_FAILED : EXIT.ok;
}

/** Checks every scenario in turn (one at a time: each run is short and output order is stable). */
export async function runChecks(files: readonly string[], opts: CheckRunOptions = {}): Promise<CheckRunReport> {
  const scenarios: ScenarioReport[] = [];
  for (let i = 0; i < files.length; i++) {
    const r = await checkScenarioFile(files[i]!, opts);
    scenarios.push(r);
    opts.onScenario?.(r, i, files.length);
  }
  return { scenarios, totals: totalsOf(scenarios), exitCode: checkExitCode(scenarios) };
}
