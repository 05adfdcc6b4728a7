// Evaluating one candidate: the bare scenario value prepared once (a probe at every receiver, logic
// thresholds and checks when the scenario has none), the candidate's parts added to a copy, and the
// copy computed as a one-point sweep plan on the PointPool, so every candidate runs exactly as a
// sweep point (same validation, simulation and measurement code, in a worker thread).
import type { Net } from '../../sim/model.js';
import { netChecks, netThresholds } from '../scenario/checks.js';
import { checkScenarioValue } from '../scenario/load.js';
import { ScenarioError } from '../scenario/problems.js';
import { checkBands, columnName, metricColumns } from '../sweep/columns.js';
import { receiverProbe, SWEEP_FORMAT, worstOf, type SweepPlan } from '../sweep/plan.js';
import type { PointPool } from '../sweep/point-pool.js';
import type { SweepRow } from '../sweep/point.js';
import type { NetFacts } from './net-facts.js';
import { cloneValue, isObj, quantity, type Obj } from './raw.js';

/** Default logic thresholds when the scenario has none: 70 % / 30 % of the driver's swing (common practice for CMOS inputs). */
export const DEFAULT_VIH_FRACTION = 0.7;
export const DEFAULT_VIL_FRACTION = 0.3;
/** Default overshoot limit when the scenario has no checks (common practice). */
export const DEFAULT_OVERSHOOT_PCT = 10;

/** What the advisor added to the scenario so every candidate can be judged. */
export interface Prepared {
  /** The bare value with the additions. */
  value: Obj;
  net: Net;
  /** The probe at each receiver, in the facts' receiver order. */
  receiverProbes: string[];
  /** Notes for the report ("thresholds 70 %/30 % of the swing added"). */
  notes: string[];
  /** The checks that decide feasibility came from the scenario (false: the advisor's defaults). */
  scenarioChecks: boolean;
  /** The plan every candidate copies (its scenarioValue is replaced). */
  plan: SweepPlan;
}

function probeAt(p: Obj, rx: string, main: boolean): boolean {
  return p.position === undefined && p.side === undefined && (p.at === rx || (main && p.at === 'receiver'));
}

/** Makes sure every receiver has a probe; returns their names (facts order). */
function ensureReceiverProbes(value: Obj, f: NetFacts, notes: string[]): string[] {
  if (!Array.isArray(value.probes)) return f.receivers.map((r) => r.name); // default probes: one per receiver, named after it
  const probes = value.probes as Obj[];
  const taken = new Set(probes.map((p) => String(p.name ?? p.at)));
  return f.receivers.map((rx, i) => {
    const found = probes.find((p) => isObj(p) && probeAt(p, rx.name, i === 0));
    if (found) return String(found.name ?? found.at);
    let name = rx.name;
    for (let k = 2; taken.has(name); k++) name = `${rx.name}_${k}`;
    taken.add(name);
    probes.push({ name, at: i === 0 ? 'receiver' : rx.name });
    notes.push(`probe "${name}" added at receiver ${rx.name}`);
    return name;
  });
}

/** The scenario value the advisor judges candidates on, and the plan they share. */
export function prepare(bare: Obj, original: Net, f: NetFacts): Prepared {
  const value = cloneValue(bare);
  const notes: string[] = [];
  const receiverProbes = ensureReceiverProbes(value, f, notes);
  const swing = f.high - f.low;
  const hasThresholds = value.thresholds !== undefined || receiverProbes.every((p) => netThresholds(original, p) !== undefined);
  if (!hasThresholds) {
    value.thresholds = { vih: quantity(f.low + DEFAULT_VIH_FRACTION * swing, 'V'), vil: quantity(f.low + DEFAULT_VIL_FRACTION * swing, 'V') };
    notes.push(`logic thresholds VIH/VIL at 70 %/30 % of the driver's swing (common practice; the scenario has none)`);
  }
  const scenarioChecks = netChecks(original).length > 0;
  if (!scenarioChecks) {
    value.checks = receiverProbes.flatMap((probe) => [
      { probe, metric: 'overshoot', max: `${DEFAULT_OVERSHOOT_PCT}%` },
      { probe, metric: 'ringbackMargin', min: '0V' },
      { probe, metric: 'noiseMarginHigh', min: '0V' },
      { probe, metric: 'noiseMarginLow', min: '0V' },
    ]);
    notes.push(`checks at every receiver: overshoot ≤ ${DEFAULT_OVERSHOOT_PCT} %, ringback margin ≥ 0 V, noise margins ≥ 0 V (common practice; the scenario has none)`);
  }
  const r = checkScenarioValue(value, 'the bare net');
  if (!r.net) throw new ScenarioError(r.problems, r.warnings);
  return { value, net: r.net, receiverProbes, notes, scenarioChecks, plan: onePointPlan(value, r.net, receiverProbes) };
}

function onePointPlan(value: Obj, net: Net, receiverProbes: string[]): SweepPlan {
  const bands = checkBands(net);
  const probes = net.probes.map((p) => p.name);
  const anyT = probes.some((p) => netThresholds(net, p) !== undefined);
  const columns = metricColumns(bands).filter((c) => anyT || !c.needsThresholds);
  const worst = worstOf(net, columns);
  const header = ['point', ...probes.flatMap((p) => columns.map((c) => columnName(p, c))), ...(worst ? worst.columns.map((c) => columnName(worst.name, c)) : []), 'checks_failed', 'checks_margin'];
  return {
    format: SWEEP_FORMAT,
    scenario: { file: '(termination candidate)', sha256: '', title: net.title },
    scenarioValue: value,
    mode: 'grid',
    axes: [],
    spreads: [],
    samples: 0,
    seed: 0,
    points: 1,
    probes,
    defaultProbe: receiverProbe(net),
    bands,
    columns,
    worst,
    header,
    hasChecks: true,
    pick: null,
    metric: 'settling_s',
    residual: receiverProbes,
  };
}

/** The numbers the advisor reads at one receiver (null: not measurable). */
export interface ReceiverNumbers {
  overshootPct: number | null;
  undershootPct: number | null;
  ringbackMarginV: number | null;
  settlingS: number | null;
  delayS: number | null;
  riseS: number | null;
  fallS: number | null;
  belowLowRailV: number | null;
  residualS: number | null;
}

export interface Outcome {
  receivers: ReceiverNumbers[];
  failed: number;
  /** Worst normalised excess over the checks (positive: failing); null when one was not measurable. */
  margin: number | null;
}

const KEYS: Record<Exclude<keyof ReceiverNumbers, 'residualS'>, string> = {
  overshootPct: 'overshoot_pct',
  undershootPct: 'undershoot_pct',
  ringbackMarginV: 'ringbackMargin_V',
  settlingS: 'settling_s',
  delayS: 'delayThreshold_s',
  riseS: 'rise_s',
  fallS: 'fall_s',
  belowLowRailV: 'belowLowRail_V',
};

/** Reads a row of the prepared plan. */
export function readRow(plan: SweepPlan, receiverProbes: readonly string[], row: SweepRow): Outcome {
  const at = (name: string) => {
    const k = plan.header.indexOf(name);
    return k < 0 ? null : (row[k] ?? null);
  };
  const res = row.slice(plan.header.length);
  const receivers = receiverProbes.map((p, i) => {
    const out = { residualS: res[i] ?? null } as ReceiverNumbers;
    for (const [k, col] of Object.entries(KEYS)) (out as unknown as Record<string, number | null>)[k] = at(`${p}.${col}`);
    return out;
  });
  return { receivers, failed: at('checks_failed') ?? 0, margin: at('checks_margin') };
}

/** Computes one scenario value (a prepared value with a candidate's parts) on the pool. */
export async function evaluateValue(pool: PointPool, prep: Prepared, value: Obj, label: string): Promise<Outcome> {
  const row = await pool.evaluate({ ...prep.plan, scenarioValue: value }, 0, label);
  return readRow(prep.plan, prep.receiverProbes, row);
}
