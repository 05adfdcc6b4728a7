// Transitions ("edges") of a two-level waveform and their metrics, following the terms of IEEE Std
// 181-2011. Every edge in the record is found and measured; each metric is a small function in its
// own module (transitions, crossings, aberrations, ringback, settling), and analyzeEdges assembles
// them. Definitions: docs/measurements.md.
import type { Samples, StateLevels } from './levels.js';
import { formatSI } from './format.js';
import { preshoot, overshoot, undershoot } from './aberrations.js';
import { crossingCounts, monotonicity, referenceInstants, thresholdCrossingIndex, thresholdInstants } from './crossings.js';
import { DEFAULT_SETTLE_BAND, type BandSpec, type EdgeAnalysis, type EdgeMeasurement, type EdgeOptions, type EdgeReasons, type Runt } from './edge-types.js';
import { heldExtreme, ringbackDepth, ringbackMargin, thresholdName } from './ringback.js';
import { settledFromStart, settlingCutOff, settlingTime } from './settling.js';
import { edgeSpans, stateEndBefore, type EdgeSpan } from './spans.js';
import { findTransitions, initialState } from './transitions.js';
import { makeTrace, type Trace } from './trace.js';

export * from './edge-types.js';

const PPM = 1e-6;

interface EdgeContext {
  tr: Trace;
  levels: StateLevels;
  opts: EdgeOptions;
  bands: BandSpec[];
  /** Half-width of the Schmitt band for crossing counts (V). */
  halfH: number;
}

/** The metrics that need the end of the transition, for an edge the record cut off. */
function cutOffMetrics(ctx: EdgeContext, threshold: string, crossed: boolean): Partial<EdgeMeasurement> & { reasons: EdgeReasons } {
  const why = 'the record ends during this transition';
  const reasons: EdgeReasons = {};
  const keys = [
    ...(['overshootV', 'overshootPct', 'overshootTime', 'undershootV', 'undershootPct', 'undershootTime'] as const),
    ...(['ringbackV', 'ringbackPct', 'ringbackTime', 'ringbackLevel', 'ringbackMarginV', 'stateExtreme', 'stateExtremeTime'] as const),
    ...(['noiseMargin', 'reentersUndefinedBand', 'reachesOppositeLevel', 'thresholdLast', 'settledAfter'] as const),
  ];
  for (const key of keys) reasons[key] = why;
  if (!crossed) reasons.thresholdFirst = `never crossed ${threshold}`;
  return { settling: ctx.bands.map((b) => settlingCutOff(b, ctx.levels.amplitude)), reasons };
}

/** Every metric of one edge. */
function measureEdge(ctx: EdgeContext, s: EdgeSpan, previous: EdgeMeasurement | undefined): EdgeMeasurement {
  const { tr, levels, opts } = ctx;
  const A = levels.amplitude;
  const ref = levels.reference;
  const thresholds = opts.thresholds;
  const threshold = thresholds ? (s.dir === 1 ? thresholds.vih : thresholds.vil) : ref.p50;
  const instants = referenceInstants(tr, s, ref, A);
  const first = thresholdCrossingIndex(tr, s, threshold);
  const edge: EdgeMeasurement = {
    number: s.k + 1,
    direction: s.dir === 1 ? 'rising' : 'falling',
    complete: s.complete,
    fromLevel: s.fromLevel,
    toLevel: s.toLevel,
    settledBefore: previous ? previous.settledAfter === true : settledFromStart(tr, s, ctx.bands[0] ?? DEFAULT_SETTLE_BAND, A),
    settledAfter: null,
    ...instants,
    ...crossingCounts(tr, s, ref, thresholds ? threshold : null, ctx.halfH),
    threshold,
    ...thresholdInstants(tr, s, threshold, first),
    ...monotonicity(tr, s, A, opts.hysteresis ?? 0),
    overshootV: null,
    overshootPct: null,
    overshootTime: null,
    undershootV: null,
    undershootPct: null,
    undershootTime: null,
    ...preshoot(tr, s, A),
    ringbackV: null,
    ringbackPct: null,
    ringbackTime: null,
    ringbackLevel: null,
    ringbackMarginV: null,
    stateExtreme: null,
    stateExtremeTime: null,
    noiseMargin: null,
    reentersUndefinedBand: null,
    reachesOppositeLevel: null,
    settling: [],
    reasons: { ...instants.reasons },
  };
  const parts: (Partial<EdgeMeasurement> & { reasons?: EdgeReasons })[] = s.complete
    ? [overshoot(tr, s, A), undershoot(tr, s, A), ringbackDepth(tr, s, A), ringbackMargin(tr, s, thresholds, first), { settling: ctx.bands.map((b) => settlingTime(tr, s, b, A)) }]
    : [cutOffMetrics(ctx, thresholdName(s.dir, threshold, thresholds), first >= 0)];
  for (const { reasons, ...fields } of parts) {
    Object.assign(edge, fields);
    Object.assign(edge.reasons, reasons);
  }
  if (s.complete) edge.settledAfter = edge.settling[0] ? edge.settling[0].time !== null : null;
  if (first < 0) edge.reasons.thresholdFirst = edge.reasons.thresholdLast = `never crossed ${thresholdName(s.dir, threshold, thresholds)}`;
  return edge;
}

/** The worst level of the state before the first edge, measured like an edge's held extreme; null when that state is unknown. */
function initialExtreme(tr: Trace, levels: StateLevels, spans: readonly EdgeSpan[], start: { state: 'low' | 'high' | null; first: number }): number | null {
  if (start.state === null) return null;
  const dir = start.state === 'high' ? 1 : -1;
  const level = start.state === 'high' ? levels.high : levels.low;
  const zoneEdge = start.state === 'high' ? levels.reference.p90 : levels.reference.p10;
  const jEnd = spans.length > 0 ? Math.floor(spans[0]!.c50) : tr.n - 1;
  const end = spans.length > 0 || dir * tr.v[tr.n - 1]! < dir * zoneEdge ? stateEndBefore(tr, jEnd, start.first, dir, level, spans.length > 0 ? zoneEdge : null) : tr.n - 1;
  return heldExtreme(tr, start.first, end, dir).value;
}

function flatReason(levels: StateLevels): string {
  return levels.amplitude < 0
    ? `no edge: the high state level (${formatSI(levels.high, 'V')}) is below the low state level (${formatSI(levels.low, 'V')})`
    : `no edge: the waveform is flat (amplitude ${levels.amplitude.toExponential(3)} V between its state levels)`;
}

function noEdgeReason(levels: StateLevels, state: 'low' | 'high' | null, runts: readonly Runt[]): string {
  const ref = levels.reference;
  if (state === null) return `no edge: the waveform never reached the 10 % (${formatSI(ref.p10, 'V')}) or 90 % (${formatSI(ref.p90, 'V')}) reference level`;
  const other = state === 'low' ? `90 % reference level (${formatSI(ref.p90, 'V')})` : `10 % reference level (${formatSI(ref.p10, 'V')})`;
  return `no edge: the waveform stays in the ${state} state and never reaches the ${other}` + (runts.length > 0 ? `; ${runts.length} runt pulse(s) crossed the 50 % level` : '');
}

/**
 * Find and measure every transition. A rising edge is a passage from at or below the 10 % reference level
 * to at or above the 90 % level (falling: the reverse); excursions that cross 50 % but return to the
 * state they left are runts, not edges.
 */
export function analyzeEdges(values: Samples, levels: StateLevels, opts: EdgeOptions): EdgeAnalysis {
  const tr = makeTrace(values, opts.dt, opts.t0);
  if (levels.flat) return { edges: [], runts: [], initialState: null, initialStateExtreme: null, noEdgeReason: flatReason(levels) };
  const A = levels.amplitude;
  const ctx: EdgeContext = { tr, levels, opts, bands: opts.settleBands ?? [DEFAULT_SETTLE_BAND], halfH: Math.max((opts.hysteresis ?? 0) * A, 2 * PPM * A) / 2 };
  const { transitions, runts } = findTransitions(tr, levels.reference);
  const spans = edgeSpans(tr, transitions, levels);
  const edges: EdgeMeasurement[] = [];
  for (const s of spans) edges.push(measureEdge(ctx, s, edges[edges.length - 1]));
  const start = initialState(tr, levels.reference);
  return {
    edges,
    runts,
    initialState: start.state,
    initialStateExtreme: initialExtreme(tr, levels, spans, start),
    noEdgeReason: edges.length === 0 ? noEdgeReason(levels, start.state, runts) : null,
  };
}
