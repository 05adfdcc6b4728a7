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
  /** Courant number v·Δt/Δz; ≤ 1 for stability, 1 is dispersion-free on a lossless line. For a coupled conductor: the fastest mode's. */
  courant: number;
  /** The coupled section the segment is a conductor of; `delay` is then the fastest mode's. */
  coupled?: string;
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

/** Why Δt has the value it has: the rule that set it, as data (src/ words it). */
export type DtRule =
  /** The fastest edge of any source over cellsPerRise (`edge` Infinity: every source constant and no line). */
  | { rule: 'edge'; edge: number; cellsPerRise: number }
  /** Every source is constant: the longest path's one-way delay stands in for the rise time. */
  | { rule: 'delay'; delay: number; cellsPerRise: number }
  /** A segment at Courant 1: its delay in `cells` cells (no cell may be longer than one Δt of travel). */
  | { rule: 'segment'; segment: string; delay: number; cells: number }
  /** A constant source and no line at all: the duration in `steps` steps. */
  | { rule: 'duration'; duration: number; steps: number };

export interface Discretization {
  dt: number;
  steps: number;
  duration: number;
  /** Total number of line cells in the net. */
  cells: number;
  /** Nodes of the ladder: every junction, part and receiver node and every segment's interior nodes. */
  nodes: number;
  segments: SegmentPlan[];
  /** Why Δt has the value it has (the limiting rule). */
  dtRule: DtRule;
}

export interface ProbeRecord {
  names: string[];
  /** Time between samples (s); sample i is at t = i·dtSample. */
  dtSample: number;
  /** Shape [probes, samples], volts. One probe's samples: `probeTrace(record, p)`. */
  values: NdArray<Float64Array>;
}

/**
 * One probe's samples (by index or name) as a Float64Array: the record's row `values.pick(p, null)`,
 * a view of the record's data when the row is contiguous (it always is for records the engine makes),
 * else a copy.
 */
export function probeTrace(record: ProbeRecord, probe: number | string): Float64Array {
  const p = typeof probe === 'number' ? probe : record.names.indexOf(probe);
  if (!(p >= 0 && p < record.values.shape[0])) {
    throw new RangeError(`no probe ${typeof probe === 'number' ? `#${probe}` : `named '${probe}'`} in the record (probes: ${record.names.join(', ')})`);
  }
  const row = record.values.pick(p, null);
  const n = row.shape[0]!;
  if (row.stride[0] === 1) return row.data.subarray(row.offset, row.offset + n);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = row.get(i);
  return out;
}

/** Every probe's samples, in record order (see probeTrace). */
export function probeTraces(record: ProbeRecord): Float64Array[] {
  return record.names.map((_, p) => probeTrace(record, p));
}

/** A route item's span along the way from the driver pin (m); lumped parts and branch points have from = to. */
export interface RouteMapItem {
  name: string;
  kind: 'line' | 'series' | 'shunt' | 'branch';
  from: number;
  to: number;
  /** A line that is a conductor of a coupled section: the section's name. */
  coupled?: string;
}

/**
 * One path of the net, from the driver pin to one receiver, as columns of the route map: what a view
 * needs to draw that path's distance axis with its junctions marked.
 */
export interface RouteMapPath {
  receiver: string;
  /** With several nets: the name of the net the path belongs to (its driver's). */
  net?: string;
  /** Columns of RouteMapRecord.values along this path, from the driver pin to the receiver. */
  columns: Int32Array;
  /** Distance of each of those columns from the driver pin along the path (m), non-decreasing. */
  positions: Float64Array;
  /** The items on this path, in order, with their spans along it. */
  items: RouteMapItem[];
  /** Branch points on this path where other paths leave it: distance, branch item, receivers reached that way. */
  junctions: { item: string; at: number; receivers: string[] }[];
}

/** Voltage along the net over time, decimated (see route-map.ts for the bound). */
export interface RouteMapRecord {
  /**
   * Distance of each column from the driver pin along the tree (m). For a net without branches the
   * columns run along the route in order; with branches the main path's columns come first, then the
   * branches' — read a path's columns through `paths`.
   */
  positions: Float64Array;
  /** Time between rows (s); row r is at t = r·dtRow. */
  dtRow: number;
  /** Shape [rows, columns], volts. */
  values: NdArray<Float64Array>;
  /** Every route item with the span it covers along its path from the driver pin (m). */
  items: RouteMapItem[];
  /** One per receiver, the main receiver's path first. */
  paths: RouteMapPath[];
}

export interface SimResult {
  discretization: Discretization;
  record: ProbeRecord;
  /** Present when the run was asked to record the route (SimulateOptions.routeMap). */
  routeMap?: RouteMapRecord;
}
