// The ladderwave library: `import { loadScenario, simulate, runScenarioFile } from 'ladderwave'`.
// The command line (src/cli) is built on exactly these functions.

// Scenario files → validated nets.
export { checkScenario, loadScenario, parseScenario, readScenario, scenarioFromValue, type CheckResult } from './scenario/load.js';
export { formatProblem, ScenarioError, type Problem } from './scenario/problems.js';

// The engine.
export { planRun, simulate, type SimulateOptions } from '../sim/simulate.js';
export { settledProbeLevels, type SettledLevels } from '../sim/settled.js';
export { compileNet, type Circuit } from '../sim/circuit.js';
export { NetError, RunDiverged, RunRefused, type NetProblem, type Overrun } from '../sim/errors.js';
export { DEFAULT_LIMITS, type RunLimits } from '../sim/limits.js';
export type { Branch, LineRLGC, NamedReceiver, Net, Part, ProbeSpec, RouteItem, RunSettings, Signal } from '../sim/model.js';
export type { Discretization, DtRule, ProbeRecord, RouteMapPath, RouteMapRecord, SegmentPlan, SimResult } from '../sim/result.js';

// Outputs.
export {
  OUTPUT_FILES,
  OutputError,
  readScenarioFile,
  renderResult,
  runScenarioFile,
  writeRunOutputs,
  type LoadedScenario,
  type RunOptions,
  type RunOutputs,
  type RunPhase,
  type RunReport,
} from './output/run.js';
export { csvChunks, csvHeader, probeRecordToCsv, writeCsv } from './output/csv.js';
export { probeTrace, probeTraces } from '../sim/result.js';
export { crossing50, probeStats, type Crossing50, type CrossingLevel, type ProbeStats } from './output/crossing.js';
export { crossingLevels, netSettledLevels, type NetSettledLevels, type SettledPair } from './output/net-levels.js';
export { addSummarySection, buildSummary, sha256Hex, summaryToJson, type Summary, type SummaryInput } from './output/summary.js';
export { writeFileAtomic, type ChunkSink } from './output/atomic.js';
export { checkOutputTarget, writeOutputFolder, type FolderEntry } from './output/folder.js';
export { toolInfo, type ToolInfo } from './output/tool.js';

// Views, the eye and the HTML report (renderers load on first use).
export { VIEW_NAMES, DEFAULT_RUN_VIEWS, VIEW_FILES, parseViewList, planViews, type ViewName, type ViewPlan } from './views/select.js';
export { measureEye, eyeRunDuration, eyeTiming, type EyeInput, type EyeMeasurement } from './views/eye.js';
export { eyeScenarioFile, EyeRequestError, EYE_FILES, type EyeRunOptions, type EyeRunReport } from './output/eye.js';
export { writeRunFiles, selectProbes, type OutputFile } from './output/run.js';
export { buildReport, REPORT_FILE, type ReportImage, type ReportInput } from './report/index.js';

// Coupled sections (crosstalk, differential pairs): matrices, modes and the `line` report. The engine
// parts are standalone and not yet wired into runs (docs/coupled-lines.md).
export {
  coupledFromMicrostrip,
  coupledFromStripline,
  coupledLineProblems,
  maxwellFromMutual,
  modalAnalysis,
  mutualFromMaxwell,
  pairFromModes,
  pairMetrics,
  type CoupledLine,
  type ModalAnalysis,
  type PairMetrics,
} from '../sim/coupled/index.js';
export { coupledFromOption, evaluateCoupled, formatCoupledReport, type CoupledInput, type CoupledReport } from './lines-report/index.js';
// S-parameters and Touchstone files.
export { parseTouchstone, readTouchstoneFile, toNetworkData, formatTouchstone, portsFromFileName, touchstoneFileName, type TouchstoneData, type WriteOptions } from './touchstone/index.js';
export { computeSparams, runSparamsFile, SPARAMS_FILES, type SparamsReport, type SparamsRunOptions, type SparamsSummary } from './output/sparams.js';
export { routeSParameters, selectRoute, type RouteSelection } from '../sim/sparams/route.js';
export { defaultGrid, gridFrequencies, type GridSpec } from '../sim/sparams/grid.js';
export { matrixAt, renormalize, singularValueTrace, toKind, entry, type NetworkData } from '../sim/sparams/network.js';
export { abcdToS, sToAbcd, convertMatrix, type ParamKind } from '../sim/sparams/convert.js';
export { vectorFit, estimateDelays, evaluateFit, type FitOptions, type FitResult, type SampledResponse } from '../sim/sparams/vector-fit.js';
export { fitBlock, type BlockFit, type BlockFitOptions } from '../sim/sparams/block.js';
export { passivityOfData, passivityOfFit, passivityAboveBand, type PassivityReport } from '../sim/sparams/passivity.js';
export { evaluateModel, type RationalModel } from '../sim/sparams/rational.js';
export { createCompanion, companionHistory, companionAdvance, companionCurrent, startAtDc, type Companion } from '../sim/sparams/companion.js';
export { createWaveCompanion, startWaveAtDc, waveHistory, waveAdvance, type WaveCompanion } from '../sim/sparams/wave-companion.js';
// Termination advice (`ladderwave tame`).
export { advise, adviceJson, adviceMarkdown, formatAdviceTable, optionRows, renderAdvicePlot, winner, winnerValue, writeWinner, OBJECTIVES, parseObjective, TOPOLOGIES, neighbours, membersBetween, parseSeriesName, seriesMantissas, SERIES_NAMES, type Advice, type AdviseRequest, type OptionResult, type MonteCarlo, type OptionRow, type ObjectiveName, type TopologyId, type SeriesName } from './terminate/index.js';
export { PointPool, type PointPoolOptions } from './sweep/point-pool.js';
