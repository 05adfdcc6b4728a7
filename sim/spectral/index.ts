// Spectral (frequency-domain) solver: an independent cross-check of the time-domain engine for any
// linear net. Chain (ABCD) matrices per frequency, DC operating point by Thevenin sweeps, time
// response by the numerical Laplace transform (damped FFT, fft.js).
export { perLength, widebandPerLength, type Complex, type PerLength } from './per-length.js';
export {
  chainEvaluator,
  compileChain,
  partImpedance,
  transferFunctions,
  type Chain,
  type ChainEvaluator,
  type ChainItem,
  type ProbeAnchor,
} from './chain.js';
export { dcOperatingPoint, dcProbeVoltages } from './dc.js';
export {
  DEFAULT_MAX_POINTS,
  DEFAULT_PAD,
  DEFAULT_STEPS_PER_EDGE,
  DEFAULT_WRAP_BOUND,
  planSpectral,
  spectralResponse,
  spectralRun,
  type SpectralOptions,
  type SpectralPlan,
  type SpectralRun,
} from './response.js';
export { compareRecords, type ProbeDifference } from './compare.js';
