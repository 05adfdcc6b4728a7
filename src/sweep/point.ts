// One sweep point: apply its values to the scenario, validate, simulate, measure. The same function
// runs in the main thread (--jobs 1) and in every worker, so a point's row does not depend on where
// it ran.
import { NetError, RunRefused, type NetProblem, type Overrun } from '../../sim/errors.js';
import { probeTrace } from '../../sim/result.js';
import { settledProbeLevels } from '../../sim/settled.js';
import { nominalLevels } from '../../sim/signals.js';
import { residualArea } from '../measure/residual.js';
import type { Net } from '../../sim/model.js';
import type { SimResult } from '../../sim/result.js';
import type { RunLimits } from '../../sim/limits.js';
import { SizeRefused, simulateSized } from '../size-limits.js';
import { ScenarioError, type Problem } from '../scenario/problems.js';
import { pointValues, worstValues } from './columns.js';
import { pointAssignments, pointNet, type SweepPlan } from './plan.js';

/** A sweep.csv row as numbers, aligned with `plan.header` (null: an empty cell). */
export type SweepRow = (number | null)[];

export interface PointOptions {
  force?: boolean;
  /** Advisory size limits (default sim/limits DEFAULT_LIMITS). */
  limits?: Partial<RunLimits>;
}

export function evaluatePoint(plan: SweepPlan, i: number, opts: PointOptions = {}): SweepRow {
  const net = pointNet(plan, i);
  const result = simulateSized(net, { force: opts.force, limits: opts.limits });
  const pv = pointValues(net, result, plan.probes, plan.columns);
  const worst = plan.worst ? worstValues(plan.worst, plan.probes, plan.columns, pv.values) : [];
  const row: SweepRow = [i, ...pointAssignments(plan, i).map((a) => a.value), ...pv.values, ...worst];
  if (plan.hasChecks) row.push(pv.checks?.failed ?? null, pv.checks?.margin ?? null);
  if (plan.residual) row.push(...residuals(net, result, plan.residual));
  return row;
}

/** The residual area (src/measure/residual.ts) of each named probe, against its settled levels. */
function residuals(net: Net, result: SimResult, probes: readonly string[]): (number | null)[] {
  const src = nominalLevels(net.driver.signal);
  const settled = settledProbeLevels(net, [src.low, src.high], result.discretization);
  return probes.map((name) => {
    const p = settled.probes.indexOf(name);
    if (p < 0) return null;
    return residualArea(probeTrace(result.record, name), result.record.dtSample, net.driver.signal, settled.volts[p]![0]!, settled.volts[p]![1]!);
  });
}

/** An error as plain data, to cross from a worker to the main thread. */
export type WireError =
  | { kind: 'scenario'; problems: Problem[]; warnings: Problem[] }
  | { kind: 'net'; problems: NetProblem[] }
  | { kind: 'refused'; over: Overrun[]; context?: string }
  | { kind: 'size'; message: string; hard: boolean }
  | { kind: 'other'; name: string; message: string; stack?: string };

export function toWire(e: unknown): WireError {
  if (e instanceof ScenarioError) return { kind: 'scenario', problems: e.problems, warnings: e.warnings };
  if (e instanceof NetError) return { kind: 'net', problems: e.problems };
  if (e instanceof RunRefused) return { kind: 'refused', over: e.over, context: e.context };
  if (e instanceof SizeRefused) return { kind: 'size', message: e.message, hard: e.hard };
  const err = e instanceof Error ? e : new Error(String(e));
  return { kind: 'other', name: err.name, message: err.message, stack: err.stack };
}

export function fromWire(w: WireError): Error {
  switch (w.kind) {
    case 'scenario':
      return new ScenarioError(w.problems, w.warnings);
    case 'net':
      return new NetError(w.problems);
    case 'refused':
      return new RunRefused(w.over, w.context);
    case 'size':
      return new SizeRefused(w.message, w.hard);
    default: {
      const e = new Error(w.message);
      e.name = w.name;
      if (w.stack) e.stack = w.stack;
      return e;
    }
  }
}

/** The same error, its message naming the point (the error classes are kept, for the exit codes). */
export function annotatePointError(e: unknown, label: string): Error {
  if (e instanceof ScenarioError) return e; // its problems already name the point
  if (e instanceof NetError) return new NetError(e.problems.map((p) => ({ path: p.path, message: `${p.message} (${label})` })));
  if (e instanceof RunRefused) return new RunRefused(e.over, e.context ? `${label}, ${e.context}` : label);
  if (e instanceof SizeRefused) return new SizeRefused(`${label}: ${e.message}`, e.hard);
  const err = e instanceof Error ? e : new Error(String(e));
  const out = new Error(`${label}: ${err.message}`);
  out.name = err.name;
  out.stack = err.stack;
  return out;
}
