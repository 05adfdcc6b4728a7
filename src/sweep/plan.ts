// A sweep plan: the scenario's raw value, what varies and how, the measurement columns. It is plain
// data: the same plan goes to every worker and into sweep.json (where `ladderwave merge` reads it
// back), so every shard and every worker computes a point from the same description.
//
// Point numbering: points are numbered from 0. In a grid the first --vary is the outermost loop
// (it changes slowest) and the last the innermost. In a Monte Carlo run point k is sample k.
import type { Net } from '../../sim/model.js';
import type { CheckLimit } from '../measure/index.js';
import { sha256Hex } from '../output/summary.js';
import { checkBands, columnName, crosstalkColumns, metricColumns, WORSE, type MetricColumn, type WorstOf } from './columns.js';
import { checkScenarioValue, readScenario } from '../scenario/load.js';
import { parseText, toPlain } from '../scenario/parse.js';
import { Problems, ScenarioError, type Problem } from '../scenario/problems.js';
import { concretePath, nearestPaths, parsePath, PathError, withValues } from './paths.js';
import { parsePickSyntax, pickBands, resolvePick } from './pick.js';
import { netChecks, netThresholds } from '../scenario/checks.js';
import { Xoshiro128ss } from './prng.js';
import { nominalValue, parseShard, parseSpread, parseVary, scenarioValue, SweepSpecError, type SpreadSpec, type VaryAxis } from './spec.js';

export const SWEEP_FORMAT = 1;

export interface PlannedSpread extends SpreadSpec {
  /** The scenario's value at the path (SI). */
  nominal: number;
  /** Base unit of the value ('' for plain numbers). */
  valueUnit: string;
}

export interface SweepPlan {
  format: number;
  scenario: { file: string; sha256: string; title: string };
  /** The scenario as plain data (parsed JSON/YAML), before any change. */
  scenarioValue: unknown;
  mode: 'grid' | 'montecarlo';
  axes: VaryAxis[];
  spreads: PlannedSpread[];
  samples: number;
  seed: number;
  /** Number of points of the whole sweep (all shards). */
  points: number;
  probes: string[];
  /** The probe a pick or metric without a probe name refers to. */
  defaultProbe: string;
  /** Settling bands measured besides ±5 %. */
  bands: CheckLimit[];
  columns: MetricColumn[];
  /** With several receivers: the worst over their probes, as columns "worst.<key>" (null: one receiver). */
  worst: WorstOf | null;
  /** sweep.csv header. */
  header: string[];
  hasChecks: boolean;
  pick: string | null;
  /** Column key plotted in sweep.png (e.g. "overshoot_pct"). */
  metric: string;
  /**
   * Probes whose residual area (src/measure/residual.ts) ends each row, after the checks' columns
   * (the termination advisor's plans; sweeps from the command line have none).
   */
  residual?: string[];
}

export interface SweepRequest {
  /** Scenario file. */
  file: string;
  vary?: readonly string[];
  spread?: readonly string[];
  samples?: number;
  seed?: number;
  pick?: string;
  /** Plotted metric: a metric name ("settling") or a column key ("overshoot_V"). */
  metric?: string;
}

export interface Shard {
  index: number;
  count: number;
}

/** The header of a varied value's column: "route.rs.series.r_ohm". */
export function paramColumn(path: string, unit: string): string {
  return unit ? `${path}_${unit}` : path;
}

/** The probe at the main receiver: the first probe "at" it, else the last probe. */
export function receiverProbe(net: Net): string {
  return (net.probes.find((p) => p.at === 'receiver' && p.receiver === undefined) ?? net.probes[net.probes.length - 1]!).name;
}

/**
 * The worst-receiver aggregate when probes sit at two or more receivers: named "worst" (or
 * "worst-receiver" when a probe already has that name), over the first probe at each receiver.
 */
export function worstOf(net: Net, columns: readonly MetricColumn[]): WorstOf | null {
  const byReceiver = new Map<string, string>();
  for (const p of net.probes) if (p.at === 'receiver' && !byReceiver.has(p.receiver ?? '')) byReceiver.set(p.receiver ?? '', p.name);
  if (byReceiver.size < 2) return null;
  const taken = new Set(net.probes.map((p) => p.name));
  const name = taken.has('worst') ? 'worst-receiver' : 'worst';
  return { name, probes: [...byReceiver.values()], columns: columns.filter((c) => WORSE[c.metric] !== undefined) };
}

/** Reads and checks the scenario; the raw value and hash come from the same bytes. */
export async function loadScenarioValue(file: string): Promise<{ value: unknown; net: Net; sha256: string; warnings: Problem[] }> {
  const { net, text, bytes, warnings } = await readScenario(file);
  const root = parseText(text, new Problems(file));
  return { value: toPlain(root), net, sha256: sha256Hex(bytes), warnings };
}

function resolvePlotMetric(metric: string | undefined, objectiveKey: string | undefined, columns: readonly MetricColumn[], fallback: string): string {
  if (metric !== undefined) {
    const k = columns.find((c) => c.key === metric)?.key ?? columns.find((c) => c.metric === metric && !c.band && (c.metric !== 'overshoot' && c.metric !== 'undershoot' ? true : c.unit === '%'))?.key;
    if (!k) throw new SweepSpecError(`--metric "${metric}": expected a metric (${[...new Set(columns.map((c) => c.metric))].join(', ')}) or a column (${columns.map((c) => c.key).join(', ')})`);
    return k;
  }
  return objectiveKey ?? fallback;
}

/**
 * Builds the plan. Throws ScenarioError (bad scenario), SweepSpecError (bad --vary, --spread,
 * --metric), PickError (bad --pick).
 */
export async function planSweep(req: SweepRequest): Promise<SweepPlan> {
  const vary = req.vary ?? [];
  const spread = req.spread ?? [];
  if (vary.length === 0 && spread.length === 0) throw new SweepSpecError('nothing to sweep: give --vary PATH=A..B:N (a grid) or --spread PATH=±X (Monte Carlo)');
  if (vary.length > 0 && spread.length > 0) throw new SweepSpecError('--vary and --spread cannot be combined: a sweep is a grid or a Monte Carlo run');
  const mode = vary.length > 0 ? 'grid' : 'montecarlo';
  const pickSyntax = req.pick !== undefined ? parsePickSyntax(req.pick) : undefined;
  if (pickSyntax && mode === 'montecarlo') throw new SweepSpecError('--pick chooses among grid points (--vary); a Monte Carlo run reports the yield and the worst case');
  const axes = vary.map(parseVary);
  const spreads = spread.map(parseSpread);
  const samples = req.samples ?? 100;
  const seed = req.seed ?? 1;
  if (mode === 'montecarlo' && !(Number.isInteger(samples) && samples >= 1)) throw new SweepSpecError(`--samples ${samples}: expected a whole number ≥ 1`);
  if (!(Number.isSafeInteger(seed) && seed >= 0)) throw new SweepSpecError(`--seed ${seed}: expected a whole number ≥ 0`);
  const paths = [...axes.map((a) => a.path), ...spreads.map((s) => s.path)];
  const dup = paths.find((p, i) => paths.indexOf(p) !== i);
  if (dup) throw new SweepSpecError(`${dup} is varied twice`);

  const loaded = await loadScenarioValue(req.file);
  const { net, value } = loaded;
  for (const p of paths) {
    try {
      concretePath(value, p);
    } catch (e) {
      if (e instanceof PathError) throw new SweepSpecError(e.message);
      throw e;
    }
  }
  const planned: PlannedSpread[] = spreads.map((s) => {
    const n = nominalValue(value, s);
    return { ...s, nominal: n.value, valueUnit: n.unit };
  });
  const checks = netChecks(net);
  const hasChecks = checks.length > 0;
  if (mode === 'montecarlo' && !hasChecks) throw new SweepSpecError(`a Monte Carlo run reports the fraction of samples passing the scenario's checks, and ${req.file} has no "checks"`);

  const bands = [...checkBands(net), ...(pickSyntax ? pickBands(pickSyntax) : [])];
  const probes = net.probes.map((p) => p.name);
  // Columns measured against logic thresholds only when some probe has them.
  const anyThresholds = probes.some((p) => netThresholds(net, p) !== undefined);
  const columns = [...metricColumns(bands).filter((c) => anyThresholds || !c.needsThresholds), ...(net.nets?.length ? crosstalkColumns() : [])];
  const defaultProbe = receiverProbe(net);
  const worst = worstOf(net, columns);
  const params = mode === 'grid' ? axes.map((a) => ({ path: a.path, column: paramColumn(a.path, a.unit), unit: a.unit })) : planned.map((s) => ({ path: s.path, column: paramColumn(s.path, s.valueUnit), unit: s.valueUnit }));
  const pick = pickSyntax ? resolvePick(pickSyntax, { probes, defaultProbe, columns, params, worst }) : undefined;
  const header = [
    'point',
    ...params.map((p) => p.column),
    ...probes.flatMap((p) => columns.map((c) => columnName(p, c))),
    ...(worst ? worst.columns.map((c) => columnName(worst.name, c)) : []),
    ...(hasChecks ? ['checks_failed', 'checks_margin'] : []),
  ];
  const points = mode === 'grid' ? axes.reduce((n, a) => n * a.values.length, 1) : samples;
  const firstCheck = checks[0];
  const fallback = firstCheck && mode === 'montecarlo' ? (columns.find((c) => c.metric === firstCheck.metric && c.unit === (firstCheck.max ?? firstCheck.min)?.unit && !c.band)?.key ?? 'overshoot_pct') : 'overshoot_pct';
  // several nets: plot the quiet nets' crosstalk unless asked otherwise (a quiet net's "overshoot" is meaningless)
  const metric = resolvePlotMetric(req.metric, pick?.objective.key, columns, net.nets?.length && mode === 'grid' ? 'crosstalk_pct' : fallback);
  return {
    format: SWEEP_FORMAT,
    scenario: { file: req.file, sha256: loaded.sha256, title: net.title },
    scenarioValue: value,
    mode,
    axes,
    spreads: planned,
    samples: mode === 'montecarlo' ? samples : 0,
    seed: mode === 'montecarlo' ? seed : 0,
    points,
    probes,
    defaultProbe,
    bands,
    columns,
    worst,
    header,
    hasChecks,
    pick: req.pick ?? null,
    metric,
  };
}

export interface Assignment {
  path: string;
  /** SI value. */
  value: number;
  unit: string;
}

/** The values point `i` gives the varied paths. */
export function pointAssignments(plan: SweepPlan, i: number): Assignment[] {
  if (!(Number.isInteger(i) && i >= 0 && i < plan.points)) throw new RangeError(`point ${i} is outside 0 … ${plan.points - 1}`);
  if (plan.mode === 'grid') {
    const out: Assignment[] = [];
    let rest = i;
    for (let k = plan.axes.length - 1; k >= 0; k--) {
      const a = plan.axes[k]!;
      const j = rest % a.values.length;
      rest = Math.floor(rest / a.values.length);
      out.unshift({ path: a.path, value: a.values[j]!, unit: a.unit });
    }
    return out;
  }
  const rng = Xoshiro128ss.forSample(plan.seed, i);
  return plan.spreads.map((s) => {
    const u = s.distribution === 'uniform' ? rng.nextSigned() : rng.nextNormal();
    const value = s.relative ? s.nominal * (1 + u * s.amount) : s.nominal + u * s.amount;
    return { path: s.path, value, unit: s.valueUnit };
  });
}

/** "route.rs.series.r = 38 ohm, lines.trace.z0 = 52.1 ohm" */
export function describeAssignments(as: readonly Assignment[]): string {
  return as.map((a) => `${a.path} = ${a.value}${a.unit ? ` ${a.unit}` : ''}`).join(', ');
}

/** The scenario value of point `i`. */
export function pointScenarioValue(plan: SweepPlan, i: number): unknown {
  return withValues(
    plan.scenarioValue,
    pointAssignments(plan, i).map((a) => ({ path: a.path, value: scenarioValue(a.value, a.unit) })),
  );
}

/** Point `i` as a validated net. Throws ScenarioError whose problems name the point and its values. */
export function pointNet(plan: SweepPlan, i: number): Net {
  const r = checkScenarioValue(pointScenarioValue(plan, i), plan.scenario.file);
  if (r.net) return r.net;
  const at = ` (at point ${i}: ${describeAssignments(pointAssignments(plan, i))})`;
  throw new ScenarioError(
    r.problems.map((p) => ({ ...p, expected: p.expected + at })),
    r.warnings,
  );
}

/**
 * Validates the given points before anything runs. Returns the problems of the first few points that
 * fail (each problem names its point), or [] when every point is a valid scenario.
 */
export function pointProblems(plan: SweepPlan, indices: readonly number[], maxPoints = 3): Problem[] {
  unknownVariedKeys(plan);
  const out: Problem[] = [];
  let bad = 0;
  for (const i of indices) {
    try {
      pointNet(plan, i);
    } catch (e) {
      if (!(e instanceof ScenarioError)) throw e;
      out.push(...e.problems);
      if (++bad >= maxPoints) break;
    }
  }
  return out;
}

/**
 * A varied path whose last key the scenario format does not know (`route.rs.series.rr`) fails at every
 * point alike: say so once, as a usage error, with the nearest valid paths, instead of once per point.
 */
function unknownVariedKeys(plan: SweepPlan): void {
  let problems: Problem[];
  try {
    pointNet(plan, 0);
    return;
  } catch (e) {
    if (!(e instanceof ScenarioError)) return;
    problems = e.problems;
  }
  const paths = [...plan.axes.map((a) => ({ path: a.path, flag: '--vary' })), ...plan.spreads.map((s) => ({ path: s.path, flag: '--spread' }))];
  const messages: string[] = [];
  for (const { path, flag } of paths) {
    const concrete = concretePath(plan.scenarioValue, path);
    const p = problems.find((q) => q.path === concrete && q.expected.startsWith('a known key'));
    if (!p) continue;
    const keys = /keys here: ([^)]*)\)/.exec(p.expected)?.[1]?.split(',').map((k) => k.trim()).filter(Boolean) ?? [];
    const steps = parsePath(path);
    const nearest = nearestPaths(steps, steps.length - 1, keys);
    const last = steps[steps.length - 1]!;
    const name = last.kind === 'key' ? last.key : `[${last.index}]`;
    messages.push(
      `${flag} ${path}: the scenario format has no key "${name}" at ${concrete.slice(0, concrete.length - name.length - 1) || 'the top'}` +
        `${keys.length ? ` (keys there: ${keys.join(', ')})` : ''}${nearest.length ? ` — nearest valid path${nearest.length > 1 ? 's' : ''}: ${nearest.join(', ')}` : ''}`,
    );
  }
  if (messages.length) throw new SweepSpecError(messages.join('\n'));
}

export { parseShard };
