// The termination advisor: for one net, every topology that applies, its values searched against the
// objective (src/terminate/search.ts on the PointPool), rounded to a preferred-number series and
// simulated again at the rounded values (at the scenario's own resolution), optionally a tolerance
// Monte Carlo, then ranked. Library API; the `tame` command prints and writes what this returns.
import type { Net } from '../../sim/model.js';
import { loadScenarioValue } from '../sweep/plan.js';
import { PointPool } from '../sweep/point-pool.js';
import { Xoshiro128ss } from '../sweep/prng.js';
import { allItems, allReceivers } from '../../sim/route-tree.js';
import { checkScenarioValue } from '../scenario/load.js';
import { ScenarioError } from '../scenario/problems.js';
import { bareNet } from './bare.js';
import type { SeriesName } from './eseries.js';
import { evaluateValue, prepare, type Outcome, type Prepared } from './evaluate.js';
import { netFacts, type NetFacts } from './net-facts.js';
import { compareScores, OBJECTIVE_TABLE, rankOrder, score, type Objective, type ObjectiveName, type Score } from './objective.js';
import { terminationPower, type StatePower } from './power.js';
import { cloneValue, type Obj } from './raw.js';
import { roundAndCheck } from './round.js';
import { searchCoordinates } from './search.js';
import { TOPOLOGIES, type AddedPart, type Slot, type Topology, type TopologyId } from './topologies.js';

export interface AdviseRequest {
  file: string;
  objective?: ObjectiveName;
  series?: SeriesName;
  /** Part tolerance for the Monte Carlo (fraction, e.g. 0.05); undefined: no Monte Carlo. */
  tolerance?: number;
  samples?: number;
  seed?: number;
  /** Only these topologies (default: every one that applies). */
  only?: readonly TopologyId[];
  /** Time steps per rise during the search (default 10, never more than the scenario's). */
  searchCells?: number;
  jobs?: number;
  /** Keep the scenario's own terminations in the bare net (default: take them out). */
  keepExisting?: boolean;
}

export interface MonteCarlo {
  tolerance: number;
  samples: number;
  seed: number;
  /** Fraction of samples passing every check. */
  yield: number;
  /** Worst objective value over the samples (Infinity: some not measurable). */
  worstValue: number;
}

export interface OptionResult {
  id: TopologyId | 'as-given';
  title: string;
  slots: Slot[];
  /** Rounded part values (Ω, F), in slot order. */
  values: number[];
  /** The search's values before rounding. */
  continuous: number[];
  rounding: 'nearest' | 'neighbour' | 'best failing' | 'none';
  outcome: Outcome;
  score: Score;
  power: StatePower;
  parts: AddedPart[];
  /** Simulations: search, rounding, Monte Carlo. */
  sims: { search: number; rounding: number; monteCarlo: number };
  /** Values whose best lay at an end of the searched range. */
  atEdge: string[];
  monteCarlo?: MonteCarlo;
  /** Why it ranks above the next option. */
  ahead?: string;
  /** The scenario value of this option (the bare net, the parts, the advisor's probes/checks). */
  value: Obj;
}

export interface Advice {
  file: string;
  title: string;
  objective: Objective;
  series: SeriesName;
  facts: NetFacts;
  receiverProbes: string[];
  removed: string[];
  notes: string[];
  scenarioChecks: boolean;
  skipped: { id: TopologyId; title: string; reason: string }[];
  /** Ranked, best first (the scenario as given is ranked too). */
  options: OptionResult[];
  /** The original scenario value (for writing the winner back). */
  original: Obj;
  /** The prepared bare value's additions (thresholds, checks) the written scenario needs. */
  prepared: Prepared;
  totalSims: number;
}

/** Item and receiver names in use, so added items get fresh ones. */
function freshNames(net: Net): (base: string) => string {
  const used = new Set<string>([...allItems(net.route).map((i) => i.name), ...allReceivers(net).map((r) => r.name), 'driver', 'receiver']);
  return (base) => {
    let name = base;
    for (let k = 2; used.has(name); k++) name = `${base}_${k}`;
    used.add(name);
    return name;
  };
}

function withCells(value: Obj, cells: number | undefined): Obj {
  if (cells === undefined) return value;
  const run = (typeof value.run === 'object' && value.run !== null ? (value.run as Obj) : {}) as Obj;
  const given = typeof run.cellsPerRise === 'number' ? run.cellsPerRise : 20;
  return { ...value, run: { ...run, cellsPerRise: Math.min(given, cells) } };
}

interface Ctx {
  pool: PointPool;
  prep: Prepared;
  facts: NetFacts;
  obj: Objective;
  compare: (a: Score, b: Score) => number;
  mainReceiver: string;
  searchCells: number;
}

/** One candidate: parts into a copy of the prepared value, computed, scored. */
async function candidate(ctx: Ctx, t: Topology, pv: readonly number[], cells: number | undefined, label: string) {
  const value = cloneValue(ctx.prep.value);
  const parts = t.edit(value, pv, ctx.facts, freshNames(ctx.prep.net));
  const outcome = await evaluateValue(ctx.pool, ctx.prep, withCells(value, cells), label);
  const power = ctx.obj.name === 'power' || cells === undefined ? terminationPower(value, parts, ctx.facts, ctx.mainReceiver) : { low: 0, high: 0 };
  return { result: { outcome, power, parts, value }, score: score(outcome, ctx.obj, Math.max(power.low, power.high)) };
}

async function monteCarlo(ctx: Ctx, t: Topology, pv: readonly number[], tolerance: number, samples: number, seed: number): Promise<MonteCarlo> {
  const runs = await Promise.all(
    Array.from({ length: samples }, (_, k) => {
      const rng = Xoshiro128ss.forSample(seed, k);
      const varied = pv.map((v) => v * (1 + tolerance * rng.nextSigned()));
      return candidate(ctx, t, varied, undefined, `${t.id} Monte Carlo sample ${k}`);
    }),
  );
  const pass = runs.filter((r) => r.score.pass).length;
  return { tolerance, samples, seed, yield: pass / samples, worstValue: Math.max(...runs.map((r) => r.score.value)) };
}

async function adviseOption(ctx: Ctx, t: Topology, req: AdviseRequest, series: SeriesName): Promise<OptionResult> {
  const f = ctx.facts;
  const params = t.params(f);
  let continuous: number[] = [];
  let searchSims = 0;
  let atEdge: string[] = [];
  if (params.length > 0) {
    const r = await searchCoordinates(
      async (xs) => (await candidate(ctx, t, t.values(xs, f), ctx.searchCells, `${t.id} ${xs.map((x) => x.toPrecision(4)).join(', ')}`)).score,
      ctx.compare,
      params,
      { groups: t.groups?.(f), scan: 5, ratio: 1.03, narrow: 1.5 },
    );
    continuous = t.values(r.best.xs, f);
    searchSims = r.evaluations;
    atEdge = r.atEdge.map((i) => params[i]!.name);
  }
  const rounded =
    params.length > 0
      ? await roundAndCheck(continuous, series, (pv) => candidate(ctx, t, pv, undefined, `${t.id} rounded`), ctx.compare, (pv) => t.valid?.(pv, f) ?? true)
      : { values: [], sims: 1, how: 'none' as const, ...(await candidate(ctx, t, [], undefined, t.id)) };
  const mc = req.tolerance !== undefined && params.length > 0 ? await monteCarlo(ctx, t, rounded.values, req.tolerance, req.samples ?? 20, req.seed ?? 1) : undefined;
  return {
    id: t.id,
    title: t.title,
    slots: t.slots(f),
    values: rounded.values,
    continuous,
    rounding: rounded.how,
    outcome: rounded.result.outcome,
    score: rounded.score,
    power: rounded.result.power,
    parts: rounded.result.parts,
    sims: { search: searchSims, rounding: rounded.sims, monteCarlo: mc?.samples ?? 0 },
    atEdge,
    monteCarlo: mc,
    value: rounded.result.value,
  };
}

/** The scenario as given, judged by the same checks (its own terminations' power included). */
async function asGiven(ctx: Ctx, original: Obj, net: Net, parts: AddedPart[]): Promise<OptionResult> {
  const prep = prepare(original, net, ctx.facts);
  const outcome = await evaluateValue(ctx.pool, prep, prep.value, 'the scenario as given');
  const power = terminationPower(prep.value, parts, ctx.facts, ctx.mainReceiver);
  return {
    id: 'as-given',
    title: 'the scenario as given',
    slots: parts.flatMap((p): Slot[] => [{ kind: 'R', where: p.where }, ...(p.c === undefined ? [] : [{ kind: 'C' as const, where: p.where }])]),
    values: parts.flatMap((p) => [p.r, ...(p.c === undefined ? [] : [p.c])]),
    continuous: [],
    rounding: 'none',
    outcome,
    score: score(outcome, ctx.obj, Math.max(power.low, power.high)),
    power,
    parts,
    sims: { search: 0, rounding: 1, monteCarlo: 0 },
    atEdge: [],
    value: prep.value,
  };
}

/** Parts to place: an R and C in series count as one part each. */
function partCount(o: OptionResult): number {
  return o.slots.length;
}

export async function advise(req: AdviseRequest): Promise<Advice> {
  const loaded = await loadScenarioValue(req.file);
  const original = loaded.value as Obj;
  const factsGiven = netFacts(loaded.net);
  const bare = req.keepExisting ? { value: cloneValue(original), removed: [], parts: [] } : bareNet(original, loaded.net, factsGiven);
  const bareCheck = checkScenarioValue(bare.value, req.file);
  if (!bareCheck.net) throw new ScenarioError(bareCheck.problems, bareCheck.warnings);
  const facts = netFacts(bareCheck.net);
  const prep = prepare(bare.value, loaded.net, facts);
  const obj = OBJECTIVE_TABLE[req.objective ?? 'settling'];
  const series = req.series ?? 'E24';
  const pool = new PointPool({ jobs: req.jobs });
  const ctx: Ctx = { pool, prep, facts, obj, compare: compareScores(obj), mainReceiver: facts.receivers[0]!.name, searchCells: req.searchCells ?? 10 };
  const skipped: Advice['skipped'] = [];
  const chosen = TOPOLOGIES.filter((t) => {
    if (req.only && !req.only.includes(t.id)) return false;
    const why = t.skip(facts);
    if (why) skipped.push({ id: t.id, title: t.title, reason: why });
    return !why;
  });
  try {
    // One option that cannot be completed (a run refused, no rounded set keeping its rule) is listed
    // as not tried with the reason; the others still count. When every option fails, the first error stands.
    const errors: unknown[] = [];
    const tried = await Promise.all(
      chosen.map((t) =>
        adviseOption(ctx, t, req, series).catch((e: unknown) => {
          errors.push(e);
          skipped.push({ id: t.id, title: t.title, reason: `could not be completed: ${e instanceof Error ? e.message.split('\n')[0] : String(e)}` });
          return null;
        }),
      ),
    );
    if (chosen.length > 0 && errors.length === chosen.length) throw errors[0];
    const options = [await asGiven(ctx, original, loaded.net, bare.parts), ...tried.filter((o): o is OptionResult => o !== null)];
    const rank = rankOrder(obj);
    const ranked = (o: OptionResult) => ({ score: o.score, parts: partCount(o), power: Math.max(o.power.low, o.power.high) });
    options.sort((a, b) => rank(ranked(a), ranked(b)).order);
    options.forEach((o, k) => {
      const next = options[k + 1];
      if (next) o.ahead = rank(ranked(o), ranked(next)).why;
    });
    return {
      file: req.file,
      title: loaded.net.title,
      objective: obj,
      series,
      facts,
      receiverProbes: prep.receiverProbes,
      removed: bare.removed,
      notes: prep.notes,
      scenarioChecks: prep.scenarioChecks,
      skipped,
      options,
      original,
      prepared: prep,
      totalSims: pool.evaluated,
    };
  } finally {
    await pool.close();
  }
}
