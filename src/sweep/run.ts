// `ladderwave sweep` and `ladderwave merge` as library functions.
//
// A whole sweep writes, into its output folder:
//   sweep.csv    one row per point: point, the varied values, every measurement of every probe
//                (and checks_failed, checks_margin when the scenario has checks)
//   sweep.png    the plotted metric against the first varied value (grid), or its distribution
//                over the samples (Monte Carlo)
//   sweep.json   the plan (scenario, what varied, columns), the pick or the yield
//   best/        with --pick: probes.csv, waveforms.png and summary.json of the best point
//   worst/       Monte Carlo: the same for the worst sample
//   explore.html with --explore: the interactive page, overlaying chosen points' waveforms
// A shard (--shard K/N) writes only its rows of sweep.csv and a sweep.json naming the shard;
// merging the N shard folders writes exactly the files the whole sweep writes.
import { mkdir, readFile } from 'node:fs/promises';
import { basename, extname, join } from 'node:path';
import { simulate } from '../../sim/simulate.js';
import { addMeasurementSections } from '../output/measurement-sections.js';
import { AtomicBatch } from '../output/atomic.js';
import { renderResult, writeRunOutputs, OUTPUT_FILES } from '../output/run.js';
import { buildSummary } from '../output/summary.js';
import { measureNet } from '../output/measure-net.js';
import { crossingLevels, netSettledLevels } from '../output/net-levels.js';
import { toolInfo, type ToolInfo } from '../output/tool.js';
import { ScenarioError } from '../scenario/problems.js';
import { netChecks } from '../scenario/checks.js';
import { decidingCheck } from './columns.js';
import { parsePick, selectBest } from './pick.js';
import { describeAssignments, paramColumn, planSweep, pointAssignments, pointNet, pointProblems, type Shard, type SweepPlan, type SweepRequest } from './plan.js';
import type { SweepRow } from './point.js';
import { renderSweepPlot } from './plot.js';
import { runPoints } from './pool.js';
import { parseShard, shardPoints } from './spec.js';
import { formatSweepCsv, parseSweepCsv, SweepCsvError } from './table.js';

export const SWEEP_FILES = { csv: 'sweep.csv', png: 'sweep.png', json: 'sweep.json', best: 'best', worst: 'worst', explore: 'explore.html' } as const;

/** Shard folders that do not fit together, a missing sweep.json, ... (bad input, exit 2). */
export class SweepInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SweepInputError';
  }
}

export interface PickReport {
  text: string;
  direction: 'minimize' | 'maximize';
  objective: string;
  conditions: { text: string; holds: number }[];
  /** Points meeting every condition with a measurable objective. */
  feasible: number;
  best: { point: number; objective: number; values: Record<string, number | null> } | null;
}

export interface YieldReport {
  samples: number;
  passed: number;
  /** passed / samples. */
  fraction: number;
  /** The sample with the largest normalised check excess (see columns.ts checkSummary). */
  worst: {
    point: number;
    failed: number | null;
    margin: number | null;
    values: Record<string, number | null>;
    /** The check that decides it (found when the worst sample is simulated again for worst/), with its limit and value. */
    check?: WorstCheck | null;
  } | null;
}

/** The deciding check of the worst Monte Carlo sample. */
export interface WorstCheck {
  probe: string;
  metric: string;
  /** "max 10 %". */
  limit: string;
  measured: number | null;
  measuredText: string;
  pass: boolean;
}

export interface SweepResultSection {
  pick: PickReport | null;
  yield: YieldReport | null;
}

export interface SweepFile {
  format: number;
  tool: ToolInfo;
  /** null for a whole sweep (or a merge); the shard of a partial run. */
  shard: Shard | null;
  /** Rows in this folder's sweep.csv. */
  rows: number;
  /** null for a shard (the pick and the yield need every point). */
  result: SweepResultSection | null;
  plan: SweepPlan;
}

export interface SweepOutcome {
  plan: SweepPlan;
  shard: Shard | null;
  rows: SweepRow[];
  outDir: string;
  files: string[];
  result: SweepResultSection | null;
}

export interface SweepRunOptions {
  /** Output folder. */
  out: string;
  jobs?: number;
  force?: boolean;
  onProgress?: (done: number, total: number) => void;
  width?: number;
  height?: number;
  /** Also write explore.html (a whole sweep only): sweep.csv's points, and chosen points' waveforms overlaid. */
  explore?: boolean;
}

/** Default output folder: out/<scenario name>-sweep (a shard: …/shard-K-of-N under it). */
export function defaultSweepFolder(file: string, shard: Shard | null): string {
  const b = basename(file);
  const ext = extname(b);
  const name = ext && ext !== b ? b.slice(0, -ext.length) : b;
  const dir = join('out', `${name}-sweep`);
  return shard ? join(dir, `shard-${shard.index}-of-${shard.count}`) : dir;
}

function rowValues(header: readonly string[], row: SweepRow): Record<string, number | null> {
  const o: Record<string, number | null> = {};
  header.forEach((h, j) => (o[h] = row[j] ?? null));
  return o;
}

/** The pick's verdict over the rows (in point order). */
export function pickReport(plan: SweepPlan, rows: readonly SweepRow[]): PickReport | null {
  if (plan.pick === null) return null;
  const params = plan.axes.map((a) => ({ path: a.path, column: paramColumn(a.path, a.unit), unit: a.unit }));
  const pick = parsePick(plan.pick, { probes: plan.probes, defaultProbe: plan.defaultProbe, columns: plan.columns, params, worst: plan.worst });
  const o = selectBest(pick, plan.header, rows);
  const best = o.row === null ? null : { point: rows[o.row]![0] as number, objective: o.objective!, values: rowValues(plan.header, rows[o.row]!) };
  return {
    text: pick.text,
    direction: pick.direction,
    objective: pick.objective.column,
    conditions: pick.conditions.map((c, k) => ({ text: `${c.ref.column} ${c.op} ${c.valueText}`, holds: o.holds[k]! })),
    feasible: o.feasible,
    best,
  };
}

/** Yield and worst case of a Monte Carlo run. */
export function yieldReport(plan: SweepPlan, rows: readonly SweepRow[]): YieldReport | null {
  if (plan.mode !== 'montecarlo' || !plan.hasChecks) return null;
  const fi = plan.header.indexOf('checks_failed');
  const mi = plan.header.indexOf('checks_margin');
  const passed = rows.filter((r) => r[fi] === 0).length;
  let worst: SweepRow | undefined;
  // Worst: an unmeasurable check (null margin) first, else the largest margin; ties to the lower point.
  const rank = (r: SweepRow) => (r[mi] === null ? Infinity : (r[mi] as number));
  for (const r of rows) if (!worst || rank(r) > rank(worst)) worst = r;
  return {
    samples: rows.length,
    passed,
    fraction: rows.length ? passed / rows.length : 0,
    worst: worst ? { point: worst[0] as number, failed: worst[fi] ?? null, margin: worst[mi] ?? null, values: rowValues(plan.header, worst) } : null,
  };
}

/**
 * Simulates one point again and writes its run outputs (probes.csv, waveforms.png, summary.json); returns
 * the files and the check that decides the point's margin (null without checks).
 */
async function writePointRun(
  plan: SweepPlan,
  point: number,
  dir: string,
  what: string,
  opts: { force?: boolean; width?: number; height?: number },
): Promise<{ files: string[]; deciding: WorstCheck | null }> {
  const net = pointNet(plan, point);
  const result = simulate(net, { force: opts.force });
  const title = `${net.title} — ${what}: point ${point}, ${describeAssignments(pointAssignments(plan, point))}`;
  const settled = netSettledLevels(net, result.discretization);
  const summary = buildSummary({
    scenario: { file: plan.scenario.file, sha256: plan.scenario.sha256, title },
    net,
    discretization: result.discretization,
    record: result.record,
    crossingLevels: crossingLevels(net, settled),
  });
  const measured = measureNet(net, result, [], settled);
  addMeasurementSections(summary, net, result, measured);
  const png = await renderResult(title, result, opts);
  const files = await writeRunOutputs(dir, { title, result, summary }, png);
  const k = decidingCheck(netChecks(net), measured.results);
  const r = k === null ? null : measured.results[k]!;
  return { files, deciding: r && { probe: r.probe, metric: r.metric, limit: r.limit, measured: r.measured, measuredText: r.measuredText, pass: r.pass } };
}

/** The sweep's explore.html (src/explore loaded only when asked for), the best or worst point marked. */
async function explorePageOf(plan: SweepPlan, rows: SweepRow[], pick: PickReport | null, yld: YieldReport | null, force?: boolean): Promise<string> {
  const { buildSweepPage } = await import('../explore/sweep-page.js');
  const marked = [
    ...(pick?.best ? [{ point: pick.best.point, label: 'best (--pick)' }] : []),
    ...(yld?.worst ? [{ point: yld.worst.point, label: 'worst case' }] : []),
  ];
  return buildSweepPage({ plan, rows, marked, pick, force });
}

function sweepJson(file: SweepFile): string {
  return JSON.stringify(file, null, 2) + '\n';
}

/**
 * Writes a sweep's outputs from its rows (in point order). A shard writes its partial sweep.csv and
 * sweep.json; a whole sweep also the plot, the pick or yield, and the best or worst point's run.
 */
export async function writeSweepOutputs(outDir: string, plan: SweepPlan, shard: Shard | null, rows: SweepRow[], opts: Omit<SweepRunOptions, 'out' | 'jobs'> = {}): Promise<SweepOutcome> {
  await mkdir(outDir, { recursive: true });
  const files: string[] = [];
  let result: SweepResultSection | null = null;
  const batch = new AtomicBatch();
  try {
    await batch.stage(join(outDir, SWEEP_FILES.csv), formatSweepCsv(plan.header, rows));
    if (!shard) {
      const pick = pickReport(plan, rows);
      const yld = yieldReport(plan, rows);
      result = { pick, yield: yld };
      if (pick?.best) files.push(...(await writePointRun(plan, pick.best.point, join(outDir, SWEEP_FILES.best), 'best', opts)).files);
      if (yld?.worst) {
        const w = await writePointRun(plan, yld.worst.point, join(outDir, SWEEP_FILES.worst), 'worst case', opts);
        files.push(...w.files);
        yld.worst.check = w.deciding;
      }
      const mark = pick?.best ? { point: pick.best.point, label: `best: point ${pick.best.point}` } : null;
      await batch.stage(join(outDir, SWEEP_FILES.png), await renderSweepPlot(plan, rows, { mark, yield: yld, width: opts.width, height: opts.height }));
      if (opts.explore) await batch.stage(join(outDir, SWEEP_FILES.explore), await explorePageOf(plan, rows, pick, yld, opts.force));
    }
    const file: SweepFile = { format: plan.format, tool: toolInfo(), shard, rows: rows.length, result, plan };
    await batch.stage(join(outDir, SWEEP_FILES.json), sweepJson(file));
    files.unshift(...(await batch.commit()));
  } catch (e) {
    await batch.abort();
    throw e;
  }
  return { plan, shard, rows, outDir, files, result };
}

export interface SweepCall extends SweepRequest {
  /** "3/16" or { index: 3, count: 16 }; absent: the whole sweep. */
  shard?: string | Shard | null;
}

/** Plans, runs (in parallel) and writes a sweep or one shard of it. */
export async function runSweep(req: SweepCall, opts: SweepRunOptions): Promise<SweepOutcome> {
  const plan = await planSweep(req);
  const shard = req.shard === undefined || req.shard === null ? null : typeof req.shard === 'string' ? parseShard(req.shard) : req.shard;
  const indices = shardPoints(plan.points, shard);
  const problems = pointProblems(plan, indices);
  if (problems.length > 0) throw new ScenarioError(problems);
  const rows = await runPoints(plan, indices, { jobs: opts.jobs, force: opts.force, onProgress: opts.onProgress });
  return writeSweepOutputs(opts.out, plan, shard, rows, opts);
}

/** Reads a sweep folder's sweep.json and sweep.csv. */
export async function readSweepFolder(dir: string): Promise<{ file: SweepFile; header: string[]; rows: SweepRow[] }> {
  let json: string;
  let csv: string;
  try {
    json = await readFile(join(dir, SWEEP_FILES.json), 'utf8');
    csv = await readFile(join(dir, SWEEP_FILES.csv), 'utf8');
  } catch (e) {
    throw new SweepInputError(`${dir}: not a sweep folder (${(e as NodeJS.ErrnoException).code === 'ENOENT' ? 'no sweep.json or sweep.csv' : (e as Error).message})`);
  }
  let file: SweepFile;
  try {
    file = JSON.parse(json) as SweepFile;
  } catch (e) {
    throw new SweepInputError(`${join(dir, SWEEP_FILES.json)}: not valid JSON (${(e as Error).message})`);
  }
  if (file.format !== 1 || !file.plan || !Array.isArray(file.plan.header)) throw new SweepInputError(`${join(dir, SWEEP_FILES.json)}: not a ladderwave sweep file of format 1`);
  try {
    const t = parseSweepCsv(csv, join(dir, SWEEP_FILES.csv));
    return { file, ...t };
  } catch (e) {
    if (e instanceof SweepCsvError) throw new SweepInputError(e.message);
    throw e;
  }
}

/**
 * Combines shard folders into the outputs of the whole sweep. The shards must come from the same
 * plan (scenario bytes, varied values, pick, tool version) and together hold every point once.
 */
export async function mergeSweeps(dirs: readonly string[], opts: Omit<SweepRunOptions, 'jobs' | 'onProgress'>): Promise<SweepOutcome> {
  if (dirs.length === 0) throw new SweepInputError('nothing to merge: give the shard folders');
  const parts = [];
  for (const d of dirs) parts.push({ dir: d, ...(await readSweepFolder(d)) });
  const first = parts[0]!;
  const planText = JSON.stringify(first.file.plan);
  for (const p of parts.slice(1)) {
    if (p.file.tool.version !== first.file.tool.version) throw new SweepInputError(`${p.dir} was written by ladderwave ${p.file.tool.version}, ${first.dir} by ${first.file.tool.version}: run every shard with one version`);
    if (JSON.stringify(p.file.plan) !== planText) throw new SweepInputError(`${p.dir} and ${first.dir} are not shards of one sweep (different scenario, varied values, pick or metric)`);
  }
  const plan = first.file.plan;
  const counts = new Set(parts.map((p) => p.file.shard?.count ?? 1));
  if (counts.size > 1) throw new SweepInputError(`the folders come from different shard counts (${[...counts].join(', ')})`);
  const byPoint = new Map<number, { row: SweepRow; dir: string }>();
  for (const p of parts) {
    if (JSON.stringify(p.header) !== JSON.stringify(plan.header)) throw new SweepInputError(`${join(p.dir, SWEEP_FILES.csv)}: its columns differ from its sweep.json`);
    for (const row of p.rows) {
      const i = row[0];
      if (typeof i !== 'number' || !Number.isInteger(i) || i < 0 || i >= plan.points) throw new SweepInputError(`${join(p.dir, SWEEP_FILES.csv)}: point ${i} is outside 0 … ${plan.points - 1}`);
      const prev = byPoint.get(i);
      if (prev) throw new SweepInputError(`point ${i} is in both ${prev.dir} and ${p.dir}: give each shard once`);
      byPoint.set(i, { row, dir: p.dir });
    }
  }
  if (byPoint.size !== plan.points) {
    const n = [...counts][0]!;
    const have = new Set(parts.map((p) => p.file.shard?.index ?? 1));
    const missing = [];
    for (let k = 1; k <= n; k++) if (!have.has(k)) missing.push(`${k}/${n}`);
    throw new SweepInputError(`${plan.points - byPoint.size} of ${plan.points} points are missing${missing.length ? `: shard(s) ${missing.join(', ')} not given` : ''}`);
  }
  const rows = [...byPoint.keys()].sort((a, b) => a - b).map((i) => byPoint.get(i)!.row);
  return writeSweepOutputs(opts.out, plan, null, rows, opts);
}

export { OUTPUT_FILES };
