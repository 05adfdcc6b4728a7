// Scenario-level checks: measure a run, evaluate the scenario's checks, compare with golden
// waveforms, and report (terminal table, JUnit XML, JSON, Markdown). See docs/checks-and-sweeps.md.
export { measureNet, sourceWaveform, type NetMeasurements } from '../output/measure-net.js';
export { addMeasurementSections, type ChecksSection } from '../output/measurement-sections.js';
export { expandScenarioArgs, globFiles, isGlob, SCENARIO_EXTENSIONS, type ExpandedFiles } from './files.js';
export {
  compareWaveform,
  compareWithGolden,
  describeGoldenLimit,
  goldenPath,
  parseGoldenCsv,
  readGolden,
  scenarioBaseName,
  shiftGrid,
  GoldenFormatError,
  type CompareOptions,
  type GoldenCheck,
  type GoldenRecord,
  type WaveformDifference,
} from './golden.js';
export {
  checkExitCode,
  checkScenarioFile,
  goldenNameClashes,
  runChecks,
  totalsOf,
  CHECK_FAILED,
  type CheckRow,
  type CheckRunOptions,
  type CheckRunReport,
  type CheckTotals,
  type GoldenOptions,
  type ScenarioReport,
  type Verdict,
} from './run.js';
export { formatCheckTable, toJUnitXml, toJsonReport, toMarkdown, xmlEscape, CHECK_REPORT_FORMAT, TABLE_HEADER } from './report.js';
export { netChecks, netThresholds, type CheckedNet } from '../scenario/checks.js';
