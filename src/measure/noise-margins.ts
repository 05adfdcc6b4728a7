// Noise margins of a probe: the worst, over the record, of each state's held level against the logic
// thresholds — lowest high level − vih, and vil − highest low level.
import type { EdgeAnalysis } from './edge-types.js';
import type { Flag } from './flags.js';
import type { LogicThresholds } from './thresholds.js';
import { formatSI } from './format.js';

const V = (x: number | null): string => formatSI(x, 'V');

export interface NoiseMargins {
  /** Worst (smallest) high-state margin over the record: lowest high level − vih (V). */
  high: number | null;
  /** Worst low-state margin: vil − highest low level (V). */
  low: number | null;
  /** Number of the edge whose state set the worst margin; null when it was the initial state (or there is none). */
  highEdge: number | null;
  lowEdge: number | null;
}

export interface NoiseMarginResult {
  margins: NoiseMargins;
  flags: Flag[];
  reasons: { 'noiseMargins.high'?: string; 'noiseMargins.low'?: string };
}

/** The worst margin of each state over the initial state and every edge's state. */
export function noiseMargins(a: EdgeAnalysis, t: LogicThresholds, range: { min: number; max: number }): NoiseMarginResult {
  const m: NoiseMargins = { high: null, low: null, highEdge: null, lowEdge: null };
  const flags: Flag[] = [];
  const reasons: NoiseMarginResult['reasons'] = {};
  const take = (state: 'high' | 'low', margin: number, edge: number | null): void => {
    const current = m[state];
    if (current !== null && margin >= current) return;
    m[state] = margin;
    if (state === 'high') m.highEdge = edge;
    else m.lowEdge = edge;
  };
  if (a.initialState !== null && a.initialStateExtreme !== null) {
    take(a.initialState, a.initialState === 'high' ? a.initialStateExtreme - t.vih : t.vil - a.initialStateExtreme, null);
  } else if (a.edges.length === 0) {
    // Flat, or never in either state zone: classify the whole record against the thresholds.
    if (range.min >= t.vih) take('high', range.min - t.vih, null);
    else if (range.max <= t.vil) take('low', t.vil - range.max, null);
    else {
      const msg = `the waveform (${V(range.min)} … ${V(range.max)}) has no edge and is not entirely above vih (${V(t.vih)}) or below vil (${V(t.vil)})`;
      flags.push({ code: 'undefined-level', message: msg });
      reasons['noiseMargins.high'] = reasons['noiseMargins.low'] = msg;
    }
  }
  for (const e of a.edges) if (e.noiseMargin !== null) take(e.direction === 'rising' ? 'high' : 'low', e.noiseMargin, e.number);
  if (m.high === null) reasons['noiseMargins.high'] ??= 'the waveform is never in the high state';
  if (m.low === null) reasons['noiseMargins.low'] ??= 'the waveform is never in the low state';
  const edgeOf = (e: number | null) => (e !== null ? { edge: e } : {});
  if (m.high !== null && m.high < 0) flags.push({ code: 'negative-noise-margin', message: `high-state noise margin is negative (${V(m.high)}): the level drops below vih while high`, ...edgeOf(m.highEdge) });
  if (m.low !== null && m.low < 0) flags.push({ code: 'negative-noise-margin', message: `low-state noise margin is negative (${V(m.low)}): the level rises above vil while low`, ...edgeOf(m.lowEdge) });
  return { margins: m, flags, reasons };
}
