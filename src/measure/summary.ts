// One call that turns a probe's waveform into every measurement, as plain JSON-friendly data:
// no typed arrays, no NaN or Infinity — a quantity that cannot be measured is null, and `reasons`
// (on the probe, on each edge, on each delay) says why.
import { analyzeEdges } from './edges.js';
import { DEFAULT_SETTLE_BAND, type BandSpec, type EdgeAnalysis, type EdgeMeasurement, type Runt } from './edge-types.js';
import { extremes, stateLevels, type Samples, type StateLevels } from './levels.js';
import { measureDelays, type DelayMeasurement } from './delay.js';
import { resolveThresholds, type LogicThresholds, type ThresholdSpec } from './thresholds.js';
import { analysisFlags, type Flag } from './flags.js';
import { noiseMargins, type NoiseMargins } from './noise-margins.js';
import { railExcursions, type Rails, type RailExcursions } from './aberrations.js';
import { formatSI } from './format.js';
import type { CrosstalkMeasurement } from './crosstalk.js';

export type { Flag, FlagCode } from './flags.js';
export type { NoiseMargins } from './noise-margins.js';

export interface MeasureOptions {
  /** Time of sample 0 (s); default 0. */
  t0?: number;
  /** Nominal state levels (V) of the probe; each overrides the histogram estimate. */
  nominal?: { low?: number; high?: number };
  /**
   * The levels the net settles to at this probe for the source's low and high level (V), from the
   * engine's DC operating point (sim/settled.ts); override the histogram and nominal levels. When they
   * are (nearly) equal — no DC path from the driver — the histogram levels are used and `levels.note` says so.
   */
  settled?: { low: number; high: number };
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
  /** The driver's output levels, for the rail excursions (below the low rail, above the high rail). */
  rails?: Rails;
  /** Settling bands to measure; default [{ fraction: 0.05 }] (±5 % of the amplitude). */
  settleBands?: BandSpec[];
  /** Hysteresis as a fraction of the amplitude (see EdgeOptions.hysteresis); default 0. */
  hysteresis?: number;
  /** How far (s) a probe edge may precede its source edge and still be matched; default 0. */
  earlyTolerance?: number;
}

/** The state levels as written to summary.json (the `flat` flag is reported as a flag instead). */
export type LevelsSummary = Omit<StateLevels, 'flat'> & {
  /** How the levels were found: 'settled' (the net's DC levels), 'histogram', 'nominal', or 'mixed'. */
  method: 'settled' | 'histogram' | 'nominal' | 'mixed';
  /** Why the method differs from the one asked for (settled levels that do not follow the source). */
  note?: string;
};

/** The probe-level fields that can be null, and the two noise margins, by name. */
export type ProbeReasonKey = 'min' | 'minTime' | 'max' | 'maxTime' | 'final' | 'levels' | 'noiseMargins' | 'noiseMargins.high' | 'noiseMargins.low' | 'delays' | 'rails';

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
  /** Excursions below the driver's low rail and above its high rail; null without rails. */
  rails: RailExcursions | null;
  /** Settling bands that were measured (half-widths as given). */
  settleBands: BandSpec[];
  /** On a quiet net's probe (multi-net scenarios): its departure from its resting level. */
  crosstalk?: CrosstalkMeasurement;
  flags: Flag[];
  /** Why a probe-level field is null, keyed by the field's name ("noiseMargins.high" for a margin). */
  reasons: Partial<Record<ProbeReasonKey, string>>;
}

function firstNonFinite(values: Samples): number {
  for (let i = 0; i < values.length; i++) if (!Number.isFinite(values[i]!)) return i;
  return -1;
}

function summarizeLevels(l: StateLevels, note?: string): LevelsSummary {
  const method = l.lowSource === l.highSource ? l.lowSource : 'mixed';
  const { flat: _flat, ...rest } = l;
  return { ...rest, method, ...(note ? { note } : {}) };
}

/** The probe's state levels: settled when given and apart, else nominal overrides of the histogram. */
function probeLevels(values: Samples, opts: MeasureOptions): { levels: StateLevels; summary: LevelsSummary } {
  const base = { bins: opts.bins, minAmplitude: opts.minAmplitude };
  const nominal = { ...base, low: opts.nominal?.low, high: opts.nominal?.high };
  if (!opts.settled) {
    const levels = stateLevels(values, nominal);
    return { levels, summary: summarizeLevels(levels) };
  }
  const settled = stateLevels(values, { ...base, settled: opts.settled });
  if (!settled.flat) return { levels: settled, summary: summarizeLevels(settled) };
  const levels = stateLevels(values, nominal);
  const s = opts.settled;
  const note = `the settled levels (${formatSI(s.low, 'V')} and ${formatSI(s.high, 'V')}) do not follow the source — no DC path from the driver, e.g. a series capacitor — so the histogram levels are used`;
  return { levels, summary: summarizeLevels(levels, note) };
}

/** Delays of the probe's edges against the source waveform's; null with a reason when there are none. */
function sourceDelays(opts: MeasureOptions, analysis: EdgeAnalysis, thresholds: LogicThresholds | null, dt: number, t0: number, n: number) {
  const out: { delays: DelayMeasurement[] | null; sourceLevels: LevelsSummary | null; flags: Flag[]; reason?: string } = { delays: null, sourceLevels: null, flags: [] };
  if (!opts.source) return { ...out, reason: 'no source waveform given' };
  if (opts.source.length !== n) throw new RangeError(`the source waveform has ${opts.source.length} samples, the probe ${n}: they must share the sampling`);
  const bad = firstNonFinite(opts.source);
  if (bad >= 0) return { ...out, reason: `the source waveform has a non-finite sample at index ${bad}` };
  const sl = stateLevels(opts.source, { low: opts.sourceNominal?.low, high: opts.sourceNominal?.high, bins: opts.bins });
  out.sourceLevels = summarizeLevels(sl);
  const sa = analyzeEdges(opts.source, sl, { dt, t0, settleBands: [] });
  if (sa.edges.length === 0) return { ...out, delays: [], reason: `the source waveform has no edge (${sa.noEdgeReason})` };
  out.delays = measureDelays(sa.edges, analysis.edges, { thresholds: thresholds !== null, earlyTolerance: opts.earlyTolerance, dt });
  for (const d of out.delays) if (d.probeEdge === null) out.flags.push({ code: 'unmatched-source-edge', message: d.reasons.delay50!, time: d.sourceT50 });
  return out;
}

/** The result for a waveform that cannot be measured (a non-finite sample): every value null, with the reason. */
function unmeasurable(out: ProbeMeasurements, bad: number): ProbeMeasurements {
  const why = `the waveform has a non-finite sample at index ${bad} (t = ${formatSI(out.t0 + bad * out.dt, 's')})`;
  for (const k of ['min', 'minTime', 'max', 'maxTime', 'final', 'levels', 'noiseMargins', 'delays', 'rails'] as const) out.reasons[k] = why;
  out.noEdgeReason = `no edge: ${why}`;
  out.flags.push({ code: 'no-edge', message: out.noEdgeReason });
  return out;
}

/** Measure one probe. Throws RangeError only for invalid arguments (dt, empty waveform, bad thresholds). */
export function measureProbe(values: Samples, dt: number, opts: MeasureOptions = {}): ProbeMeasurements {
  if (!(dt > 0) || !Number.isFinite(dt)) throw new RangeError(`dt must be a positive finite number, got ${dt}`);
  const n = values.length;
  if (n === 0) throw new RangeError('empty waveform');
  const t0 = opts.t0 ?? 0;
  const thresholds = opts.thresholds === undefined ? null : resolveThresholds(opts.thresholds);
  const settleBands = opts.settleBands ?? [DEFAULT_SETTLE_BAND];
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
    rails: null,
    settleBands,
    flags: [],
    reasons: {},
  };
  const bad = firstNonFinite(values);
  if (bad >= 0) return unmeasurable(out, bad);

  const ex = extremes(values);
  const range = { min: ex.min, max: ex.max, minTime: t0 + ex.iMin * dt, maxTime: t0 + ex.iMax * dt };
  Object.assign(out, { min: range.min, minTime: range.minTime, max: range.max, maxTime: range.maxTime, final: values[n - 1]! });
  const { levels, summary } = probeLevels(values, opts);
  out.levels = summary;
  const analysis = analyzeEdges(values, levels, { dt, t0, thresholds: thresholds ?? undefined, settleBands, hysteresis: opts.hysteresis });
  Object.assign(out, { edges: analysis.edges, runts: analysis.runts, initialState: analysis.initialState, noEdgeReason: analysis.noEdgeReason });
  out.edgeCount = { rising: analysis.edges.filter((e) => e.direction === 'rising').length, falling: analysis.edges.filter((e) => e.direction === 'falling').length };
  out.flags.push(...analysisFlags(analysis, thresholds));

  if (thresholds) {
    const nm = noiseMargins(analysis, thresholds, range);
    out.noiseMargins = nm.margins;
    out.flags.push(...nm.flags);
    Object.assign(out.reasons, nm.reasons);
  } else out.reasons.noiseMargins = 'no logic thresholds given';

  if (opts.rails) out.rails = railExcursions(opts.rails, range);
  else out.reasons.rails = 'no driver rails given';

  const d = sourceDelays(opts, analysis, thresholds, dt, t0, n);
  Object.assign(out, { delays: d.delays, sourceLevels: d.sourceLevels });
  out.flags.push(...d.flags);
  if (d.reason) out.reasons.delays = d.reason;
  return out;
}
