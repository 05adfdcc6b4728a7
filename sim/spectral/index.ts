// Spectral (frequency-domain) solver: an independent cross-check of the time-domain engine for any
// linear net. Nodal matrices of exact line two-ports per frequency, a nodal DC operating point, time
// response by the numerical Laplace transform (damped FFT, fft.js).
export { perLength, widebandPerLength, type Complex, type PerLength } from './per-length.js';
export { circuitEvaluator, transferFunctions, type CircuitEvaluator } from './nodal.js';
export { partImpedance } from './two-port.js';
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
