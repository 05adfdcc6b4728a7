// Line models from geometry and datasheets, and their frequency-domain description.
export * from './constants.js';
export * from './complex.js';
export * from './elliptic.js';
export * from './validity.js';
export * from './microstrip.js';
export * from './stripline.js';
export * from './coax.js';
export * from './two-wire.js';
export * from './conductor.js';
export * from './dielectric.js';
export * from './skin-fit.js';
export * from './freq-model.js';
export { leastSquares, nnls, solveDecreasing } from './lsq.js';
export * from './impedance.js';
export * from './coupled-microstrip.js';
export * from './coupled-stripline.js';
