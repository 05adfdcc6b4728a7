// One call that turns a probe's waveform into every measurement, as plain JSON-friendly data:
// no typed arrays, no NaN or Infinity — a quantity that cannot be measured is null, and `reasons`
// (on the probe, on each edge, on each delay) says why.
import { analyzeEdges, DEFAULT_SETTLE_BAND, type BandSpec, type EdgeMeasurement, type Runt } from './edges.js';
import { extremes, stateLevels, type Samples, type StateLevels } from './levels.js';
import { measureDelays, type DelayMeasurement } from './delay.js';
import { resolveThresholds, type LogicThresholds, type ThresholdSpec } from './thresholds.js';
import { formatSI } from './format.js';

const V = (x: number | null): string => formatSI(x, 'V');
const S = (x: number | null): string => formatSI(x, 's');

export interface MeasureOptions {
  /** Time of sample 0 (s); default 0. */
  t0?: number;
  /** Nominal state levels (V) of the probe; each overrides the histogram estimate. */
  nominal?: { low?: number; high?: number };
  /** Histogram bins for the state levels; default 100. */
  bins?: number;
  /** Amplitude below which the waveform counts as flat (V). */
  minAmplitude?: number;
  /** Logic thresholds: a preset name ("lvcmos33"), { preset, vdd }, or { vih, vil } in volts. */
  thresholds?: ThresholdSpec;
  /** The driver's source waveform, same sampling, for delays. */
  source?: Samples;
  /** Nominal state levels of the source waveform (e.g. the signal's from/to). */
  sourceNominal?: { low?: number; high?: number };
  /** Settling bands to measure; default [{ fraction: 0.05 }] (±5 % of the amplitude). */
  settleBands?: BandSpec[];
  /** Hysteresis as a fraction of the amplitude (see EdgeOptions.hysteresis); default 0. */
  hysteresis?: number;
  /** How far (s) a probe edge may precede its source edge and still be matched; default 0. */
  earlyTolerance?: number;
}

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
  | 'undefined-level'
  | 'negative-noise-margin'
  | 'unmatched-source-edge';

export interface Flag {
  code: FlagCode;
  message: string;
  /** Edge index the flag is about, when it is about one. */
  edge?: number;
  /** Instant (s) the flag is about, when there is one. */
  time?: number;
}

/** The state levels as written to summary.json (the `flat` flag is reported as a flag instead). */
export type LevelsSummary = Omit<StateLevels, 'flat'>;

export interface NoiseMargins {
  /** Worst (smallest) high-state margin over the record: lowest high level − vih (V). */
  high: number | null;
  /** Worst low-state margin: vil − highest low level (V). */
  low: number | null;
  /** Edge whose state set the worst margin; null when it was the initial state (or there is none). */
  highEdge: number | null;
  lowEdge: number | null;
}

export interface ProbeMeasurements {
  samples: number;
  dt: number;
  t0: number;
  /** Time span of the record (s): (samples − 1)·dt. */
  duration: number;
  min: number | null;
  minTime: number | null;
  max: number | null;
  maxTime: number | null;
  /** Last sample (V). */
  final: number | null;
  levels: LevelsSummary | null;
  thresholds: LogicThresholds | null;
  /** State before the first edge. */
  initialState: 'low' | 'high' | null;
  edges: EdgeMeasurement[];
  edgeCount: { rising: number; falling: number };
  /** Why there is no edge; null when there is at least one. */
  noEdgeReason: string | null;
  runts: Runt[];
  /** Per source edge; null without a source waveform. */
  delays: DelayMeasurement[] | null;
  sourceLevels: LevelsSummary | null;
  noiseMargins: NoiseMargins | null;
  /** Settling bands that were measured (half-widths as given). */
  settleBands: BandSpec[];
  flags: Flag[];
  /** Why a probe-level field is null (keys: "min", "levels", "delays", "noiseMargins.high", …). */
  reasons: Record<string, string>;
}

function summarizeLevels(l: ReturnType<typeof stateLevels>): LevelsSummary {
  return {
    low: l.low,
    high: l.high,
    amplitude: l.amplitude,
    lowSource: l.lowSource,
    highSource: l.highSource,
    bins: l.bins,
    reference: l.reference,
  };
}

function firstNonFinite(values: Samples): number {
  for (let i = 0; i < values.length; i++) if (!Number.isFinite(values[i]!)) return i;
  return -1;
}

/** Measure one probe. Throws RangeError only for invalid arguments (dt, empty waveform, bad thresholds). */
export function measureProbe(values: Samples, dt: number, opts: MeasureOptions = {}): ProbeMeasurements {
  if (!(dt > 0) || !Number.isFinite(dt)) throw new RangeError(`dt must be a positive finite number, got ${dt}`);
  const n = values.length;
  if (n === 0) throw new RangeError('empty waveform');
  const t0 = opts.t0 ?? 0;
  const thresholds = opts.thresholds === undefined ? null : resolveThresholds(opts.thresholds);
  const settleBands = opts.settleBands ?? [DEFAULT_SETTLE_BAND];
  const reasons: Record<string, string> = {};
  const flags: Flag[] = [];
  const out: ProbeMeasurements = {
    samples: n,
    dt,
    t0,
    duration: (n - 1) * dt,
    min: null,
    minTime: null,
    max: null,
    maxTime: null,
    final: null,
    levels: null,
    thresholds,
    initialState: null,
    edges: [],
    edgeCount: { rising: 0, falling: 0 },
    noEdgeReason: null,
    runts: [],
    delays: null,
    sourceLevels: null,
    noiseMargins: null,
    settleBands,
    flags,
    reasons,
  };

  const bad = firstNonFinite(values);
  if (bad >= 0) {
    const why = `the waveform has a non-finite sample at index ${bad} (t = ${S(t0 + bad * dt)})`;
    for (const k of ['min', 'minTime', 'max', 'maxTime', 'final', 'levels', 'noiseMargins', 'delays']) reasons[k] = why;
    out.noEdgeReason = `no edge: ${why}`;
    flags.push({ code: 'no-edge', message: out.noEdgeReason });
    return out;
  }

  const ex = extremes(values);
  out.min = ex.min;
  out.minTime = t0 + ex.iMin * dt;
  out.max = ex.max;
  out.maxTime = t0 + ex.iMax * dt;
  out.final = values[n - 1]!;

  const levels = stateLevels(values, {
    low: opts.nominal?.low,
    high: opts.nominal?.high,
    bins: opts.bins,
    minAmplitude: opts.minAmplitude,
  });
  out.levels = summarizeLevels(levels);
  const analysis = analyzeEdges(values, levels, {
    dt,
    t0,
    thresholds: thresholds ?? undefined,
    settleBands,
    hysteresis: opts.hysteresis,
  });
  out.edges = analysis.edges;
  out.runts = analysis.runts;
  out.initialState = analysis.initialState;
  out.noEdgeReason = analysis.noEdgeReason;
  out.edgeCount = {
    rising: analysis.edges.filter((e) => e.direction === 'rising').length,
    falling: analysis.edges.filter((e) => e.direction === 'falling').length,
  };

  // ---- flags ----
  if (analysis.noEdgeReason) flags.push({ code: 'no-edge', message: analysis.noEdgeReason });
  for (const r of analysis.runts) {
    flags.push({
      code: 'runt',
      message: `runt pulse from the ${r.from} state crossed the 50 % level at ${S(r.time)}, peaking at ${V(r.peak)}, and returned${r.unfinished ? ' (record ended first)' : ''}`,
      time: r.time,
    });
  }
  for (const e of analysis.edges) {
    const what = `${e.direction} edge ${e.index} (50 % at ${S(e.t50)})`;
    if (!e.complete) flags.push({ code: 'incomplete-edge', message: `${what}: ${e.reasons.t90}`, edge: e.index, time: e.t50 });
    if (!e.monotonic) flags.push({ code: 'non-monotonic', message: `${what}: reverses by ${V(e.reversalV)} between its 10 % and 90 % instants`, edge: e.index, time: e.t50 });
    if (e.crossings > 1)
      flags.push({ code: 'multiple-crossings', message: `${what}: crosses the 50 % level ${e.crossings} times before the next edge`, edge: e.index, time: e.t50 });
    if (thresholds) {
      const name = e.direction === 'rising' ? 'vih' : 'vil';
      if (e.thresholdFirst === null && e.complete)
        flags.push({ code: 'threshold-not-reached', message: `${what}: never crosses ${name} (${V(e.threshold)})`, edge: e.index, time: e.t50 });
      if (e.reachesOppositeLevel)
        flags.push({
          code: 'glitch-opposite-level',
          message: `${what}: after crossing ${name} it rings back to ${V(e.stateExtreme)}, past ${e.direction === 'rising' ? 'vil' : 'vih'} — a glitch`,
          edge: e.index,
          time: e.stateExtremeTime ?? e.t50,
        });
      else if (e.reentersUndefinedBand)
        flags.push({
          code: 'ringback-undefined-band',
          message: `${what}: after crossing ${name} it rings back to ${V(e.stateExtreme)}, inside the undefined band between vil (${V(thresholds.vil)}) and vih (${V(thresholds.vih)})`,
          edge: e.index,
          time: e.stateExtremeTime ?? e.t50,
        });
    }
    for (const s of e.settling) {
      if (s.time === null && e.complete) flags.push({ code: 'not-settled', message: `${what}: ${s.reason}`, edge: e.index, time: e.t50 });
    }
  }

  // ---- noise margins ----
  if (!thresholds) {
    reasons.noiseMargins = 'no logic thresholds given';
  } else {
    const { vih, vil } = thresholds;
    let high: number | null = null;
    let low: number | null = null;
    let highEdge: number | null = null;
    let lowEdge: number | null = null;
    const takeHigh = (m: number, edge: number | null): void => {
      if (high === null || m < high) {
        high = m;
        highEdge = edge;
      }
    };
    const takeLow = (m: number, edge: number | null): void => {
      if (low === null || m < low) {
        low = m;
        lowEdge = edge;
      }
    };
    if (analysis.initialState !== null && analysis.initialStateExtreme !== null) {
      const x = analysis.initialStateExtreme;
      if (analysis.initialState === 'high') takeHigh(x - vih, null);
      else takeLow(vil - x, null);
    } else if (analysis.edges.length === 0) {
      // Flat, or never in either state zone: classify the whole record against the thresholds.
      if (ex.min >= vih) takeHigh(ex.min - vih, null);
      else if (ex.max <= vil) takeLow(vil - ex.max, null);
      else {
        const msg = `the waveform (${V(ex.min)} … ${V(ex.max)}) has no edge and is not entirely above vih (${V(vih)}) or below vil (${V(vil)})`;
        flags.push({ code: 'undefined-level', message: msg });
        reasons['noiseMargins.high'] = reasons['noiseMargins.low'] = msg;
      }
    }
    for (const e of analysis.edges) {
      if (e.noiseMargin === null) continue;
      if (e.direction === 'rising') takeHigh(e.noiseMargin, e.index);
      else takeLow(e.noiseMargin, e.index);
    }
    if (high === null) reasons['noiseMargins.high'] ??= 'the waveform is never in the high state';
    if (low === null) reasons['noiseMargins.low'] ??= 'the waveform is never in the low state';
    if (high !== null && high < 0)
      flags.push({ code: 'negative-noise-margin', message: `high-state noise margin is negative (${V(high)}): the level drops below vih while high`, ...(highEdge !== null ? { edge: highEdge } : {}) });
    if (low !== null && low < 0)
      flags.push({ code: 'negative-noise-margin', message: `low-state noise margin is negative (${V(low)}): the level rises above vil while low`, ...(lowEdge !== null ? { edge: lowEdge } : {}) });
    out.noiseMargins = { high, low, highEdge, lowEdge };
  }

  // ---- delays against the source waveform ----
  if (!opts.source) {
    reasons.delays = 'no source waveform given';
  } else if (opts.source.length !== n) {
    throw new RangeError(`the source waveform has ${opts.source.length} samples, the probe ${n}: they must share the sampling`);
  } else {
    const sb = firstNonFinite(opts.source);
    if (sb >= 0) {
      reasons.delays = `the source waveform has a non-finite sample at index ${sb}`;
    } else {
      const sl = stateLevels(opts.source, { low: opts.sourceNominal?.low, high: opts.sourceNominal?.high, bins: opts.bins });
      out.sourceLevels = summarizeLevels(sl);
      const sa = analyzeEdges(opts.source, sl, { dt, t0, settleBands: [] });
      if (sa.edges.length === 0) {
        reasons.delays = `the source waveform has no edge (${sa.noEdgeReason})`;
        out.delays = [];
      } else {
        out.delays = measureDelays(sa.edges, analysis.edges, { thresholds: thresholds !== null, earlyTolerance: opts.earlyTolerance, dt });
        for (const d of out.delays) {
          if (d.probeEdge === null)
            flags.push({ code: 'unmatched-source-edge', message: d.reasons.delay50!, time: d.sourceT50 });
        }
      }
    }
  }
  return out;
}
