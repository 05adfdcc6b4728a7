// The `line` report: per-unit-length values, impedance, attenuation and skin depth of every line
// of a scenario or of a geometry given on the command line.
export { constantFreqLine, DEFAULT_REPORT_FREQUENCIES, evaluateLine, type FrequencyRow, type LineInput, type LineReport } from './evaluate.js';
export { GEOMETRY_OPTIONS, lineFromOption, linesFromScenario, linesOfTree, type LineSources } from './sources.js';
export { alignRows, formatLineReport, formatLineReports, lineReportsToJson } from './table.js';
export { COUPLED_KEYS, COUPLED_OPTIONS, coupledFromOption, evaluateCoupled, type CoupledForm, type CoupledInput, type CoupledModeReport, type CoupledReport } from './coupled.js';
export { formatCoupledReport } from './coupled-table.js';
