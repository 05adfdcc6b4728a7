// Scores and their order. A candidate that passes every check beats one that does not; two failing
// candidates are ordered by their worst normalised excess (the sweep's checks_margin); two passing
// ones by the objective's value at the worst receiver, where values closer than the objective's
// tolerance count as equal (a settling time jumps in steps of a round trip, and a few picoseconds
// either way are not a reason to choose), and then by the residual area summed over the receivers
// (src/measure/residual.ts), which keeps shrinking as a leftover reflection does.
import type { Outcome, ReceiverNumbers } from './evaluate.js';

export type ObjectiveName = 'settling' | 'overshoot' | 'ringback' | 'delay' | 'power';

export const OBJECTIVES: readonly ObjectiveName[] = ['settling', 'overshoot', 'ringback', 'delay', 'power'];

export interface Objective {
  name: ObjectiveName;
  text: string;
  /** The value to minimise at one receiver (null: not measurable, the worst possible). */
  atReceiver?(r: ReceiverNumbers): number | null;
  /** Values within this of each other tie: |a − b| ≤ rel·max(|a|, |b|) + abs. */
  rel: number;
  abs: number;
}

export const OBJECTIVE_TABLE: Record<ObjectiveName, Objective> = {
  settling: { name: 'settling', text: 'smallest settling time (±5 % band) at the worst receiver', atReceiver: (r) => r.settlingS, rel: 0.03, abs: 0 },
  overshoot: { name: 'overshoot', text: 'smallest overshoot or undershoot (% of the swing) at the worst receiver', atReceiver: (r) => (r.overshootPct === null || r.undershootPct === null ? null : Math.max(r.overshootPct, r.undershootPct)), rel: 0, abs: 0.5 },
  ringback: { name: 'ringback', text: 'largest ringback margin to VIH/VIL at the worst receiver', atReceiver: (r) => (r.ringbackMarginV === null ? null : -r.ringbackMarginV), rel: 0, abs: 0.01 },
  delay: { name: 'delay', text: 'smallest delay to threshold at the worst receiver', atReceiver: (r) => r.delayS, rel: 0.01, abs: 0 },
  power: { name: 'power', text: 'smallest DC power in the termination (worse logic state)', rel: 0.02, abs: 1e-6 },
};

export function parseObjective(text: string): ObjectiveName | undefined {
  const t = text.trim().toLowerCase();
  return (OBJECTIVES as readonly string[]).includes(t) ? (t as ObjectiveName) : undefined;
}

export interface Score {
  pass: boolean;
  /** Checks' worst normalised excess (Infinity when not measurable). */
  margin: number;
  /** Objective value at the worst receiver (Infinity when not measurable). */
  value: number;
  /** Index of the worst receiver for the objective. */
  worst: number;
  residual: number;
}

/** The score of an outcome; `power` (W, worse state) is needed by the power objective only. */
export function score(o: Outcome, obj: Objective, power?: number): Score {
  let value = -Infinity;
  let worst = 0;
  o.receivers.forEach((r, i) => {
    const v = obj.atReceiver ? (obj.atReceiver(r) ?? Infinity) : 0;
    if (v > value) {
      value = v;
      worst = i;
    }
  });
  if (!obj.atReceiver) value = power ?? Infinity;
  const residual = o.receivers.reduce((s, r) => s + (r.residualS ?? Infinity), 0);
  return { pass: o.failed === 0 && o.margin !== null, margin: o.margin ?? Infinity, value, worst, residual };
}

/** Negative when a is better. */
export function compareScores(obj: Objective): (a: Score, b: Score) => number {
  return (a, b) => {
    if (a.pass !== b.pass) return a.pass ? -1 : 1;
    if (!a.pass) {
      if (a.margin !== b.margin) return a.margin < b.margin ? -1 : 1;
    } else if (a.value !== b.value) {
      // a value that could not be measured (Infinity) never ties with one that could
      if (!Number.isFinite(a.value) || !Number.isFinite(b.value)) return a.value < b.value ? -1 : 1;
      const tol = obj.rel * Math.max(Math.abs(a.value), Math.abs(b.value)) + obj.abs;
      if (!(Math.abs(a.value - b.value) <= tol)) return a.value < b.value ? -1 : 1;
    }
    return a.residual === b.residual ? 0 : a.residual < b.residual ? -1 : 1;
  };
}

/** Objective values within this fraction of each other tie in the ranking (then fewer parts, less power win). */
export const RANK_TIE = 0.1;

export interface Ranked {
  score: Score;
  parts: number;
  /** Worse logic state's DC power (W). */
  power: number;
}

/**
 * The ranking's order and the reason one option is ahead of the next: checks first, then the
 * objective (values within 10 % tie), then fewer parts, then less DC power (within 1 mW ties), then
 * the smaller residual area.
 */
export function rankOrder(obj: Objective): (a: Ranked, b: Ranked) => { order: number; why: string } {
  return (a, b) => {
    const s = a.score;
    const t = b.score;
    if (s.pass !== t.pass) return { order: s.pass ? -1 : 1, why: 'passes the checks' };
    if (!s.pass && s.margin !== t.margin) return { order: s.margin < t.margin ? -1 : 1, why: 'misses the checks by less' };
    if (s.value !== t.value) {
      if (!Number.isFinite(s.value) || !Number.isFinite(t.value)) return { order: s.value < t.value ? -1 : 1, why: `better ${obj.name}` };
      const tol = Math.max(RANK_TIE * Math.max(Math.abs(s.value), Math.abs(t.value)), obj.abs);
      if (!(Math.abs(s.value - t.value) <= tol)) return { order: s.value < t.value ? -1 : 1, why: `better ${obj.name}` };
    }
    if (a.parts !== b.parts) return { order: a.parts - b.parts, why: `${obj.name} within 10 %, fewer parts` };
    if (Math.abs(a.power - b.power) > 1e-3) return { order: a.power < b.power ? -1 : 1, why: `${obj.name} within 10 %, less DC power` };
    if (s.residual !== t.residual) return { order: s.residual < t.residual ? -1 : 1, why: `${obj.name} within 10 %, smaller residual area` };
    return { order: 0, why: 'tie' };
  };
}
