// What a simulation hands back: the discretization it chose and the probe records.
// Renderers, writers and measurements read only this, never solver state.
import type { NdArray } from 'ndarray';

export interface SegmentPlan {
  name: string;
  length: number;
  cells: number;
  cellLength: number;
  /** One-way delay of the segment (s), length·√(L'C'). */
  delay: number;
  /** Characteristic impedance √(L'/C') at high frequency (ohm). */
  z0: number;
  /** Courant number v·Δt/Δz; ≤ 1 for stability, 1 is dispersion-free on a lossless line. */
  courant: number;
  /** For a line with frequency-dependent loss: how its Z′(jω), Y′(jω) were realised in the time domain. */
  loss?: LossRealisation;
}

export interface LossRealisation {
  /** Band of the fit (Hz). */
  fmin: number;
  fmax: number;
  /** R‖L sections (skin effect) and R–C branches (dielectric): one state each per cell. */
  seriesTerms: number;
  shuntTerms: number;
  /** Largest relative error of the realised Z′ and Y′ against the exact model over the band. */
  maxRelErrorZ: number;
  maxRelErrorY: number;
  /** Largest relative error of the loss alone: the conductor's resistance and the dielectric's loss term. */
  maxResistanceRelError: number;
  maxDielectricLossRelError: number;
}

export interface Discretization {
  dt: number;
  steps: number;
  duration: number;
  /** Total number of line cells in the route. */
  cells: number;
  nodes: number;
  segments: SegmentPlan[];
  /** Why Δt has the value it has (the limiting rule). */
  dtReason: string;
}

export interface ProbeRecord {
  names: string[];
  /** Time between samples (s); sample i is at t = i·dtSample. */
  dtSample: number;
  /** Shape [probes, samples], volts. Read `.data` directly in loops. */
  values: NdArray<Float64Array>;
}

/** Voltage along the route over time, decimated (see route-map.ts for the bound). */
export interface RouteMapRecord {
  /** Distance of each column from the driver pin (m). */
  positions: Float64Array;
  /** Time between rows (s); row r is at t = r·dtRow. */
  dtRow: number;
  /** Shape [rows, columns], volts. */
  values: NdArray<Float64Array>;
  /** Every route item with the span it covers along the route (m); lumped parts have from = to. */
  items: { name: string; kind: 'line' | 'series' | 'shunt'; from: number; to: number }[];
}

export interface SimResult {
  discretization: Discretization;
  record: ProbeRecord;
  /** Present when the run was asked to record the route (SimulateOptions.routeMap). */
  routeMap?: RouteMapRecord;
}
