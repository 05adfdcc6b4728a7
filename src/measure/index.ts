// Waveform measurements, logic thresholds and pass/fail checks: a pure library on plain arrays of volts.
// Definitions and references: docs/measurements.md.
export { stateLevels, histogramLevels, referenceLevels, extremes, DEFAULT_BINS } from './levels.js';
export type { Samples, LevelOptions, StateLevels, ReferenceLevels } from './levels.js';
export { analyzeEdges, bandVolts, DEFAULT_SETTLE_BAND } from './edges.js';
export type { EdgeDirection, EdgeMeasurement, EdgeAnalysis, EdgeOptions, Runt, SettlingResult, BandSpec, LogicLevels } from './edges.js';
export { measureDelays } from './delay.js';
export type { DelayMeasurement, DelayOptions } from './delay.js';
export { THRESHOLD_PRESETS, findPreset, presetNames, presetThresholds, resolveThresholds, thresholdProblems } from './thresholds.js';
export type { LogicThresholds, ThresholdPreset, ThresholdSpec } from './thresholds.js';
export { measureProbe } from './summary.js';
export type { MeasureOptions, ProbeMeasurements, Flag, FlagCode, LevelsSummary, NoiseMargins } from './summary.js';
export {
  METRIC_NAMES,
  METRICS,
  isMetricName,
  validateCheck,
  describeLimit,
  checkBand,
  requiredSettleBands,
  evaluateChecks,
  checkWaveforms,
} from './checks.js';
export type { MetricName, CheckSpec, CheckResult, EdgeSelection, ProbeWaveform } from './checks.js';
export { parseCheckLimit, CheckLimitError } from './limits.js';
export type { CheckLimit, LimitUnit } from './limits.js';
export { formatSI, formatPercent } from './format.js';
