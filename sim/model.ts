// The validated net the engine works on: every quantity is a plain number in SI base units
// (seconds, volts, ohms, henries, farads, metres, siemens). The application layer (src/scenario)
// turns a scenario file into this shape; the engine never sees strings with units.
import type { CoupledLine } from './coupled/line.js';
import type { FreqLine } from './lines/freq-model.js';

/** A first-order auxiliary term of a line's per-unit-length model, one state per cell. */
export interface AuxTerm {
  /** Series section: resistance R_k (ohm/m) of an R‖L section with L_k = R_k·τ. Shunt branch: C_k (F/m) of a series R–C with R_k·C_k = τ. */
  value: number;
  /** Time constant τ (s). */
  tau: number;
}

/**
 * Per-unit-length model of a uniform line: R' (ohm/m), L' (H/m), G' (S/m), C' (F/m). With
 * frequency-dependent loss, r/l/g/c are the DC resistance, the high-frequency inductance and
 * capacitance and the DC conductance, and `series`/`shunt` hold the auxiliary terms:
 * Z'(jω) = r + jωl + Σ R_k·jωτ_k/(1 + jωτ_k),  Y'(jω) = g + jωc + Σ jωC_k/(1 + jωτ_k).
 * `wideband` is the exact frequency-domain description those terms are fitted to; the engine fits
 * them for the band the run needs (see realize.ts) when they are absent.
 */
export interface LineRLGC {
  r: number;
  l: number;
  g: number;
  c: number;
  series?: AuxTerm[];
  shunt?: AuxTerm[];
  wideband?: FreqLine;
}

/**
 * A lumped part: the given elements in series. `r` ohms (0 when absent), `l` henries (0 when absent),
 * `c` farads (undefined when absent: no capacitor, i.e. a DC path). For a shunt part, `rail` is the
 * voltage the far end of the part is tied to (0 V by default).
 */
export interface Part {
  r: number;
  l: number;
  c?: number;
  rail: number;
}

export type Signal =
  | { kind: 'step'; from: number; to: number; start: number; rise: number }
  | { kind: 'pulse'; from: number; to: number; start: number; rise: number; width: number; fall: number }
  | { kind: 'clock'; low: number; high: number; period: number; rise: number; fall: number; duty: number; start: number }
  | { kind: 'bits'; low: number; high: number; bitTime: number; rise: number; fall: number; start: number; bits: Uint8Array; patternName: string }
  | { kind: 'table'; points: ReadonlyArray<readonly [number, number]> };

export type RouteItem =
  | { kind: 'line'; name: string; line: LineRLGC; length: number }
  | { kind: 'series'; name: string; part: Part }
  | { kind: 'shunt'; name: string; parts: Part[] }
  | { kind: 'branch'; name: string; branches: Branch[] };

/** A side route leaving the route at a branch item's node, ending at a receiver of its own. */
export interface Branch {
  route: RouteItem[];
  receiver: NamedReceiver;
}

/** A receiver: parts from its node to rails, in parallel; no parts = an open end (an open stub). */
export interface NamedReceiver {
  name: string;
  parts: Part[];
}

/** The main receiver's name when the net does not give one. */
export const MAIN_RECEIVER = 'receiver';

export type ProbeSpec =
  /** At a driver pin: `net` names a further net's (absent = the first net's). */
  | { name: string; at: 'driver'; net?: string }
  /** At a receiver's node: `receiver` names it (absent = the main receiver at the end of `route`). */
  | { name: string; at: 'receiver'; receiver?: string }
  | { name: string; at: 'line'; item: string; position: number }
  | { name: string; at: 'series'; item: string; side: 'in' | 'out' }
  | { name: string; at: 'shunt'; item: string }
  /** At a branch item's branch point. */
  | { name: string; at: 'branch'; item: string };

export interface RunSettings {
  /** Simulated time span (s); undefined = choose from the signal and the route's delay. */
  duration?: number;
  /** Minimum number of time steps per 10–90 % rise time of the fastest edge. */
  cellsPerRise: number;
  /** Interval between recorded samples (s); undefined = every time step. */
  sample?: number;
}

export interface Net {
  title: string;
  description?: string;
  driver: { signal: Signal; resistance: number };
  /** From the driver pin to the main receiver; branch items attach side routes (a tree, to any depth). */
  route: RouteItem[];
  /** Parts from the main receiver's node to rails, in parallel; empty = open end. */
  receiver: Part[];
  /** The main receiver's name (default MAIN_RECEIVER); every receiver's name is unique in the net. */
  receiverName?: string;
  probes: ProbeSpec[];
  run: RunSettings;
  /** Multi-net scenarios: the first net's name (the fields above are that net). */
  netName?: string;
  /** Further nets, each with its own driver, route and receivers; item and receiver names are unique across all nets. */
  nets?: SideNet[];
  /** Coupled sections joining line items of one or several nets. */
  coupled?: CoupledSpec[];
}

/** A further net of a multi-net scenario (a victim with a quiet driver, another aggressor). */
export interface SideNet {
  name: string;
  driver: { signal: Signal; resistance: number };
  route: RouteItem[];
  receiver: Part[];
  receiverName?: string;
}

/**
 * A coupled section: the line items running alongside (one per conductor, in the matrices' order; all
 * the same length) and their per-unit-length matrices. Each item's own `line` holds the conductor's self
 * terms (L_ii, C_ii, R_ii, G_ii), which views and delays use; the run uses the matrices.
 */
export interface CoupledSpec {
  name: string;
  conductors: string[];
  line: CoupledLine;
}
