// The ladderwave library: what a user's own scripts and tests need, in the order of the pipeline
// (load → simulate → measure → check → render → write) and the other commands as whole functions.
// docs/library.md documents every name here; test/src/index.test.ts keeps the two in step. The CLI
// is built on the same functions. Everything else under src/ and sim/ is internal and may change.

// Load: scenario files and text → validated nets, every problem with file, line:column and key path.
export { checkScenario, loadScenario, scenarioFromValue, type CheckResult } from './scenario/load.js';
export { formatProblem, ScenarioError, type Problem } from './scenario/problems.js';
export { readScenarioFile, type LoadedScenario } from './output/run.js';
export type { Branch, LineRLGC, NamedReceiver, Net, Part, ProbeSpec, RouteItem, RunSettings, Signal } from '../sim/model.js';

// Simulate: the engine, its size limits and its errors.
export { planRun, simulate, type SimulateOptions } from '../sim/simulate.js';
export { NetError, RunDiverged, RunRefused, type NetProblem, type Overrun } from '../sim/errors.js';
export { DEFAULT_LIMITS, type RunLimits } from '../sim/limits.js';
export { probeTrace } from '../sim/result.js';
export type { Discretization, DtRule, ProbeRecord, SimResult } from '../sim/result.js';

// Measure: every probe's IEEE 181 measurements and the scenario's checks, as `run` and `check` do.
export { measureNet, type NetMeasurements } from './output/measure-net.js';
export { measureProbe, type MeasureOptions, type ProbeMeasurements } from './measure/summary.js';
export type { CheckResult as CheckVerdict, CheckSpec, MetricName } from './measure/checks.js';

// Check: scenario files with their checks and golden waveforms, and the reports `check` writes.
export { checkScenarioFile, runChecks, type CheckRunOptions, type CheckRunReport, type ScenarioReport } from './checks/run.js';
export { formatCheckTable, toJsonReport, toJUnitXml, toMarkdown } from './checks/report.js';

// Render: the views as PNG and the self-contained report page.
export { renderResult } from './output/run.js';
export { VIEW_NAMES, type ViewName } from './views/select.js';
export { buildReport, type ReportInput } from './report/index.js';

// Write: a whole run (the `run` command), or its files one by one.
export { OUTPUT_FILES, OutputError, runScenarioFile, writeRunOutputs, type RunOptions, type RunOutputs, type RunReport } from './output/run.js';
export { probeRecordToCsv, writeCsv } from './output/csv.js';
export { addSummarySection, buildSummary, summaryToJson, type Summary, type SummaryInput, type SummarySections } from './output/summary.js';

// The other commands as functions: eye, tdr, sweep and merge, sparams, line, Touchstone files, tame.
export { eyeScenarioFile, type EyeRunOptions, type EyeRunReport } from './output/eye.js';
export { runTdrFile, type TdrReport, type TdrRunOptions } from './output/tdr.js';
export { mergeSweeps, runSweep, type SweepCall, type SweepOutcome, type SweepRunOptions } from './sweep/run.js';
export { runSparamsFile, type SparamsReport, type SparamsRunOptions } from './output/sparams.js';
export { evaluateLine, type LineReport } from './lines-report/evaluate.js';
export { evaluateCoupled, type CoupledReport } from './lines-report/coupled.js';
export { formatTouchstone, parseTouchstone, readTouchstoneFile, type TouchstoneData } from './touchstone/index.js';
export { advise, adviceJson, adviceMarkdown, writeWinner, type Advice, type AdviseRequest, type OptionResult } from './terminate/index.js';

// Exit codes, as the CLI uses them, for scripts that wrap the library.
export { describeFailure, EXIT, type ExitCode } from './exit-codes.js';
