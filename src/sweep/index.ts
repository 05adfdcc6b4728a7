// Parameter sweeps, the termination search (--pick), Monte Carlo tolerance runs, shards and merge,
// run in parallel on worker threads. See docs/checks-and-sweeps.md.
export { parsePath, formatPath, getAtPath, concretePath, withValues, PathError, type PathStep } from './paths.js';
export {
  parseVary,
  parseSpread,
  parseShard,
  shardPoints,
  parseAnyQuantity,
  scenarioValue,
  nominalValue,
  SweepSpecError,
  type VaryAxis,
  type SpreadSpec,
  type Quantity,
} from './spec.js';
export { Xoshiro128ss, splitMix64 } from './prng.js';
export { metricColumns, columnName, columnCheck, checkSummary, pointValues, bandKey, type MetricColumn, type CheckSummary, type PointValues } from './columns.js';
export {
  parsePick,
  parsePickSyntax,
  resolvePick,
  selectBest,
  pickBands,
  tokenize,
  PickError,
  type Pick,
  type PickContext,
  type PickCondition,
  type PickOutcome,
  type PickSyntax,
  type ResolvedRef,
} from './pick.js';
export {
  planSweep,
  pointAssignments,
  pointNet,
  pointScenarioValue,
  pointProblems,
  describeAssignments,
  paramColumn,
  receiverProbe,
  loadScenarioValue,
  SWEEP_FORMAT,
  type SweepPlan,
  type SweepRequest,
  type Shard,
  type Assignment,
  type PlannedSpread,
} from './plan.js';
export { evaluatePoint, annotatePointError, type SweepRow, type PointOptions } from './point.js';
export { runPoints, startWorker, defaultJobs, type RunPointsOptions } from './pool.js';
export { createProgress, barLine, plainLine, formatDuration, etaSeconds, type Progress, type ProgressOptions, type ProgressStream } from './progress.js';
export { formatSweepCsv, parseSweepCsv, SweepCsvError } from './table.js';
export { renderSweepPlot, type SweepPlotOptions } from './plot.js';
export {
  runSweep,
  mergeSweeps,
  writeSweepOutputs,
  readSweepFolder,
  pickReport,
  yieldReport,
  defaultSweepFolder,
  SweepInputError,
  SWEEP_FILES,
  type SweepCall,
  type SweepOutcome,
  type SweepRunOptions,
  type SweepFile,
  type PickReport,
  type YieldReport,
  type SweepResultSection,
} from './run.js';
