// Coupled sections: k conductors coupled along a segment (crosstalk, differential pairs). Standalone
// parts for the node–element graph: per-unit-length matrices and their validation, modal analysis,
// the leapfrog cell update with its end-node groups, and the modal 2k-port admittance for the spectral
// solver (docs/coupled-lines.md).
export {
  coupledLineProblems,
  coupledLineWarnings,
  maxwellFromMutual,
  mutualFromMaxwell,
  pairFromModes,
  pairModesProblems,
  type CoupledLine,
  type CoupledProblem,
  type PairModes,
} from './line.js';
export { fastestDelayPerLength, fastestVelocity, modalAnalysis, pairMetrics, type ModalAnalysis, type Mode, type PairMetrics } from './modes.js';
export {
  advanceCoupledSection,
  buildCoupledSection,
  coupledCoefficients,
  coupledFastestDelay,
  planCoupledCells,
  setCoupledDcState,
  type CoupledCellPlan,
  type CoupledSection,
  type CoupledSectionOptions,
} from './kernel.js';
export { advanceEndGroup, buildEndGroup, type EndGroup } from './ends.js';
export { coupledAdmittance, coupledPerLength, type CMatrix } from './spectral.js';
export { coupledFromMicrostrip, coupledFromStripline } from './geometry.js';
export { fromRows, toRows } from './matrix.js';
