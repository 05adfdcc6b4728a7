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
import { readCapped } from '../scenario/file.js';
import { validateSweepFile } from './sweep-file.js';
import { basename, extname, join } from 'node:path';
import { simulateSized } from '../size-limits.js';
import { addMeasurementSections } from '../output/measurement-sections.js';
import { checkOutputTarget, renderResult, runFolderEntries, writeOutputFolder, OUTPUT_FILES, type FolderEntry } from '../output/run.js';
import { buildSummary } from '../output/summary.js';
import { measureNet } from '../output/measure-net.js';
import { crossingLevels, netSettledLevels } from '../output/net-levels.js';
import { toolInfo, type ToolInfo } from '../output/tool.js';
import { ScenarioError } from '../scenario/problems.js';
import { netChecks } from '../scenario/checks.js';
import { decidingCheck } from './columns.js';
import { readScenario } from '../scenario/load.js';
import { locateNetProblems, locateProblems } from '../scenario/locate.js';
import { NetError } from '../../sim/errors.js';
import type { RunLimits } from '../../sim/limits.js';
import { parsePick, selectBest } from './pick.js';
import { describeAssignments, paramColumn, planSweep, pointAssignments, pointNet, pointProblems, type Shard, type SweepPlan, type SweepRequest } from './plan.js';
import type { SweepRow } from './point.js';
import { renderSweepPlot } from './plot.js';
import { runPoints } from './pool.js';
import { parseShard, shardPointCount, shardPoints } from './spec.js';
import { checkSweepSize } from './size.js';
import { parseSweepCsv, sweepCsvChunks, SweepCsvError } from './table.js';
import { keyedRecord } from '../keyed.js';
import type { CheckRow } from '../checks/run.js';

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

/** The deciding check of the worst Monte Carlo sample: a check table row without its kind and message. */
export type WorstCheck = Pick<CheckRow, 'probe' | 'metric' | 'limit' | 'measured' | 'measuredText' | 'pass'>;

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
  /** Advisory size limits of each point's run (default sim/limits DEFAULT_LIMITS). */
  limits?: Partial<RunLimits>;
  onProgress?: (done: number, total: number) => void;
  width?: number;
  height?: number;
  /** Also write explore.html (a whole sweep only): sweep.csv's points, and chosen points' waveforms overlaid. */
  explore?: boolean;
}

/**
 * Default output folder: out/<scenario name>-sweep; a shard's beside it, out/<scenario name>-sweep-shard-K-of-N
 * (not inside: the merged folder replaces the whole of out/<scenario name>-sweep).
 */
export function defaultSweepFolder(file: string, shard: Shard | null): string {
  const b = basename(file);
  const ext = extname(b);
  const name = ext && ext !== b ? b.slice(0, -ext.length) : b;
  return join('out', shard ? `${name}-sweep-shard-${shard.index}-of-${shard.count}` : `${name}-sweep`);
}

function rowValues(header: readonly string[], row: SweepRow): Record<string, number | null> {
  const o = keyedRecord<number | null>();
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
 * Simulates one point again; its run outputs (probes.csv, waveforms.png, summary.json) as entries
 * under `folder`, and the check that decides the point's margin (null without checks).
 */
async function pointRunEntries(
  plan: SweepPlan,
  point: number,
  folder: string,
  what: string,
  opts: { force?: boolean; limits?: Partial<RunLimits>; width?: number; height?: number },
): Promise<{ entries: FolderEntry[]; deciding: WorstCheck | null }> {
  const net = pointNet(plan, point);
  const result = simulateSized(net, { force: opts.force, limits: opts.limits });
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
  const entries = runFolderEntries({ title, result, summary }, [{ path: OUTPUT_FILES.png, data: png }]).map((e) => ({ ...e, path: join(folder, e.path) }));
  const k = decidingCheck(netChecks(net), measured.results);
  const r = k === null ? null : measured.results[k]!;
  return { entries, deciding: r && { probe: r.probe, metric: r.metric, limit: r.limit, measured: r.measured, measuredText: r.measuredText, pass: r.pass } };
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
 * Writes a sweep's outputs from its rows (in point order), as one folder replacing the previous one
 * (writeOutputFolder). A shard writes its partial sweep.csv and sweep.json; a whole sweep also the
 * plot, the pick or yield, and the best or worst point's run in best/ or worst/.
 */
export async function writeSweepOutputs(outDir: string, plan: SweepPlan, shard: Shard | null, rows: SweepRow[], opts: Omit<SweepRunOptions, 'out' | 'jobs'> = {}): Promise<SweepOutcome> {
  let result: SweepResultSection | null = null;
  const entries: FolderEntry[] = [{ path: SWEEP_FILES.csv, data: async (sink) => {
    for (const chunk of sweepCsvChunks(plan.header, rows)) await sink.write(chunk);
  } }];
  const pointEntries: FolderEntry[] = [];
  if (!shard) {
    const pick = pickReport(plan, rows);
    const yld = yieldReport(plan, rows);
    result = { pick, yield: yld };
    if (pick?.best) pointEntries.push(...(await pointRunEntries(plan, pick.best.point, SWEEP_FILES.best, 'best', opts)).entries);
    if (yld?.worst) {
      const w = await pointRunEntries(plan, yld.worst.point, SWEEP_FILES.worst, 'worst case', opts);
      pointEntries.push(...w.entries);
      yld.worst.check = w.deciding;
    }
    const mark = pick?.best ? { point: pick.best.point, label: `best: point ${pick.best.point}` } : null;
    entries.push({ path: SWEEP_FILES.png, data: await renderSweepPlot(plan, rows, { mark, yield: yld, width: opts.width, height: opts.height }) });
    if (opts.explore) entries.push({ path: SWEEP_FILES.explore, data: await explorePageOf(plan, rows, pick, yld, opts.force) });
  }
  const file: SweepFile = { format: plan.format, tool: toolInfo(), shard, rows: rows.length, result, plan };
  entries.push({ path: SWEEP_FILES.json, data: sweepJson(file) });
  const files = await writeOutputFolder(outDir, [...entries, ...pointEntries]);
  return { plan, shard, rows, outDir, files, result };
}

export interface SweepCall extends SweepRequest {
  /** "3/16" or { index: 3, count: 16 }; absent: the whole sweep. */
  shard?: string | Shard | null;
}

/** Plans, runs (in parallel) and writes a sweep or one shard of it. */
export async function runSweep(req: SweepCall, opts: SweepRunOptions): Promise<SweepOutcome> {
  const plan = await planSweep(req);
  await checkOutputTarget(opts.out);
  const shard = req.shard === undefined || req.shard === null ? null : typeof req.shard === 'string' ? parseShard(req.shard) : req.shard;
  checkSweepSize(shardPointCount(plan.points, shard), plan.header.length, opts.force);
  const indices = shardPoints(plan.points, shard);
  try {
    const problems = pointProblems(plan, indices);
    if (problems.length > 0) throw new ScenarioError(problems);
    const rows = await runPoints(plan, indices, { jobs: opts.jobs, force: opts.force, limits: opts.limits, onProgress: opts.onProgress });
    return await writeSweepOutputs(opts.out, plan, shard, rows, opts);
  } catch (e) {
    throw await withFilePositions(e, plan.scenario.file);
  }
}

/**
 * A point's problems (validated from plain data, so without positions) and engine errors with the
 * line:column of their key paths in the scenario file, read again for the purpose.
 */
async function withFilePositions(e: unknown, file: string): Promise<unknown> {
  if (!(e instanceof ScenarioError) && !(e instanceof NetError)) return e;
  let root;
  try {
    root = (await readScenario(file)).root;
  } catch {
    return e; // the file changed meanwhile: the problems stay as they are
  }
  if (e instanceof ScenarioError) return new ScenarioError(locateProblems(e.problems, root), e.warnings);
  return new NetError(locateNetProblems(e, root));
}

/** Largest sweep.json or sweep.csv read back: 256 MiB (JavaScript strings end near 512 MiB). */
export const MAX_SWEEP_FILE_BYTES = 256 * 1024 ** 2;

async function readSweepText(dir: string, name: string): Promise<string> {
  const path = join(dir, name);
  const read = await readCapped(path, MAX_SWEEP_FILE_BYTES);
  if (!read.ok) {
    if (read.why === 'no such file') throw new SweepInputError(`${dir}: not a sweep folder (no ${name})`);
    throw new SweepInputError(`${path}: cannot read it (${read.why})`);
  }
  const text = read.bytes.toString('utf8');
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

/** Reads a sweep folder's sweep.json and sweep.csv; every field the merge uses is checked first. */
export async function readSweepFolder(dir: string): Promise<{ file: SweepFile; header: string[]; rows: SweepRow[] }> {
  const json = await readSweepText(dir, SWEEP_FILES.json);
  const csv = await readSweepText(dir, SWEEP_FILES.csv);
  const where = join(dir, SWEEP_FILES.json);
  let value: unknown;
  try {
    value = JSON.parse(json);
  } catch (e) {
    throw new SweepInputError(`${where}: not valid JSON (${(e as Error).message})`);
  }
  const v = validateSweepFile(value);
  if (!v.ok) throw new SweepInputError(`${where}: not a ladderwave sweep file of format 1 (${v.message})`);
  try {
    const t = parseSweepCsv(csv, join(dir, SWEEP_FILES.csv));
    return { file: v.file, ...t };
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
  await checkOutputTarget(opts.out);
  return writeSweepOutputs(opts.out, plan, null, rows, opts);
}

export { OUTPUT_FILES };
