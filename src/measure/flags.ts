// Flags: the things about a waveform a designer should look at, each with a message, the edge (by
// number) and the instant it is about.
import type { EdgeAnalysis, EdgeMeasurement, Runt } from './edge-types.js';
import type { LogicThresholds } from './thresholds.js';
import { formatSI } from './format.js';

const V = (x: number | null): string => formatSI(x, 'V');
const S = (x: number | null): string => formatSI(x, 's');

export type FlagCode =
  | 'no-edge'
  | 'incomplete-edge'
  | 'runt'
  | 'non-monotonic'
  | 'multiple-crossings'
  | 'ringback-undefined-band'
  | 'glitch-opposite-level'
  | 'threshold-not-reached'
  | 'not-settled'
  | 'unsettled-start'
  | 'undefined-level'
  | 'negative-noise-margin'
  | 'unmatched-source-edge';

export interface Flag {
  code: FlagCode;
  message: string;
  /** Number (from 1) of the edge the flag is about, when it is about one. */
  edge?: number;
  /** Instant (s) the flag is about, when there is one. */
  time?: number;
}

/** "rising edge 2 (50 % at 12.3 ns)". */
export function edgeName(e: EdgeMeasurement): string {
  return `${e.direction} edge ${e.number} (50 % at ${S(e.t50)})`;
}

export function runtFlag(r: Runt): Flag {
  return {
    code: 'runt',
    message: `runt pulse from the ${r.from} state crossed the 50 % level at ${S(r.time)}, peaking at ${V(r.peak)}, and returned${r.unfinished ? ' (record ended first)' : ''}`,
    time: r.time,
  };
}

/** Threshold flags of one edge: never reached, or rang back into the undefined band or past the opposite threshold. */
function thresholdFlags(e: EdgeMeasurement, t: LogicThresholds): Flag[] {
  const at = { edge: e.number, time: e.stateExtremeTime ?? e.t50 };
  const name = e.direction === 'rising' ? 'vih' : 'vil';
  if (e.thresholdFirst === null && e.complete) return [{ code: 'threshold-not-reached', message: `${edgeName(e)}: never crosses ${name} (${V(e.threshold)})`, edge: e.number, time: e.t50 }];
  if (e.reachesOppositeLevel) {
    const message = `${edgeName(e)}: after crossing ${name} it rings back to ${V(e.stateExtreme)}, past ${e.direction === 'rising' ? 'vil' : 'vih'} — a glitch`;
    return [{ code: 'glitch-opposite-level', message, ...at }];
  }
  if (e.reentersUndefinedBand) {
    const message = `${edgeName(e)}: after crossing ${name} it rings back to ${V(e.stateExtreme)}, inside the undefined band between vil (${V(t.vil)}) and vih (${V(t.vih)})`;
    return [{ code: 'ringback-undefined-band', message, ...at }];
  }
  return [];
}

/** Flags of one edge. */
export function edgeFlags(e: EdgeMeasurement, thresholds: LogicThresholds | null): Flag[] {
  const what = edgeName(e);
  const at = { edge: e.number, time: e.t50 };
  const flags: Flag[] = [];
  if (!e.complete) flags.push({ code: 'incomplete-edge', message: `${what}: ${e.reasons.duration1090}`, ...at });
  if (!e.settledBefore) {
    const band = e.settling[0] ? ` within ±${Number(e.settling[0].bandPct.toPrecision(4))} %` : '';
    flags.push({ code: 'unsettled-start', message: `${what}: begins before the previous state settled${band}, so its timing and aberrations depend on what came before`, ...at });
  }
  if (!e.monotonic) flags.push({ code: 'non-monotonic', message: `${what}: reverses by ${V(e.reversalV)} between its 10 % and 90 % instants`, ...at });
  if (e.crossings > 1) flags.push({ code: 'multiple-crossings', message: `${what}: crosses the 50 % level ${e.crossings} times before the next edge`, ...at });
  if (thresholds) flags.push(...thresholdFlags(e, thresholds));
  for (const s of e.settling) if (s.time === null && e.complete) flags.push({ code: 'not-settled', message: `${what}: ${s.reason}`, ...at });
  return flags;
}

/** Flags of the whole edge analysis: no edge, runts, then each edge's. */
export function analysisFlags(a: EdgeAnalysis, thresholds: LogicThresholds | null): Flag[] {
  const flags: Flag[] = [];
  if (a.noEdgeReason) flags.push({ code: 'no-edge', message: a.noEdgeReason });
  flags.push(...a.runts.map(runtFlag));
  for (const e of a.edges) flags.push(...edgeFlags(e, thresholds));
  return flags;
}
