// Nonlinear drivers and receivers: behavioural buffer models, their switching coefficients, and the
// Newton–Raphson solution of device nodes.
export * from './iv-table.js';
export * from './diode.js';
export * from './buffer.js';
export * from './switching.js';
export * from './schedule.js';
export * from './newton.js';
export * from './newton-multi.js';
export * from './stepper.js';
export * from './dc.js';
export * from './fixture.js';
export * from './waveform-fit.js';
export * from './ramp.js';
export * from './simple.js';
