// `--cross-check`: the time-domain result against the independent spectral solver.
export { crossCheck, crossCheckSummary, signalSwing, type CrossCheckProbe, type CrossCheckResult } from './crosscheck.js';
export { CROSSCHECK_FILE, drawCrossCheck, renderCrossCheck, type CrossCheckPlotSpec } from './plot.js';
export { crossCheckRun, formatCrossCheck, type CrossCheckRun } from './run-option.js';
