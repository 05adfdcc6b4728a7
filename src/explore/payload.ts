// What the explore page carries: the data the server side (src/explore) builds and the page's script
// (src/explore/client) reads. Types only, shared by both sides; plain JSON, no typed arrays — sample
// arrays travel packed in base64 (see Packed).

/** Numbers as little-endian IEEE 754 in base64: 'f64' exactly, 'f32' to about 7 significant digits. */
export interface Packed {
  type: 'f64' | 'f32';
  length: number;
  base64: string;
}

/** The probe waveforms of one run. */
export interface TraceSet {
  /**
   * 'full': every recorded sample, sample i at t = i·dt. 'reduced': the samples kept by the same
   * first/min/max/last-per-column reduction the PNG views use (src/render/reduce.ts), over `columns`
   * columns of the whole run, the union over all probes so that every probe has a value at every kept
   * instant; each kept value is a recorded sample, unchanged.
   */
  form: 'full' | 'reduced';
  /** Time between recorded samples (s). */
  dt: number;
  /** Recorded samples per probe (before any reduction). */
  samples: number;
  /** Reduced form: columns of the reduction. */
  columns?: number;
  /** Reduced form: the indices (integers, ascending) of the kept samples. */
  index?: Packed;
  names: string[];
  /** Per probe, in `names` order: volts at every sample (full) or at every kept index (reduced). */
  values: Packed[];
}

/** A route item along one path: lumped parts and branch points have from = to (m). */
export interface MapItem {
  name: string;
  kind: 'line' | 'series' | 'shunt' | 'branch';
  from: number;
  to: number;
}

/** One path of the net from the driver pin to one receiver, as columns of the map. */
export interface MapPath {
  /** The receiver this path ends at. */
  receiver: string;
  /** Columns of MapData.values along this path, from the driver pin to the receiver. */
  columns: number[];
  /** Distance of each of those columns from the driver pin (m), non-decreasing. */
  positions: number[];
  items: MapItem[];
  /** Branch points on this path where other paths leave it: distance (m), branch item, receivers reached that way. */
  junctions: { item: string; at: number; receivers: string[] }[];
}

/** The voltage along the net over time, as the engine recorded it (rows of equal time steps). */
export interface MapData {
  /** Time between rows (s); row r is at t = r·dtRow. */
  dtRow: number;
  rows: number;
  columns: number;
  /** Volts, row-major [rows × columns], single precision. */
  values: Packed;
  paths: MapPath[];
  /** The time span the map opens on (the PNG's detailed panel: the first edge and a few round trips, or the whole run). */
  window: [number, number];
  /** The instant shown first: the first edge halfway along the route (or the start of `window`). */
  start: number;
  /** The PNG map's colour scale: diverging palette centred on `center`, spanning lo … hi. */
  colors: { center: number; lo: number; hi: number; palette: string[] };
}

/** Where a number in a table was measured: cursor A at `a`, cursor B at `b` for a span (Δt reads it). */
export interface Instants {
  a: number;
  b?: number;
  /** The probe the number belongs to (its trace is emphasised). */
  probe?: string;
  /** What the cursors show, e.g. "overshoot of rising edge 2". */
  label: string;
}

export interface Cell {
  text: string;
  /** The exact number shown (SI base units), when the cell shows one. */
  value?: number | null;
  className?: string;
  /** A clickable number: where it was measured. */
  at?: Instants;
  /** Longer explanation shown on hover. */
  title?: string;
}

export interface Table {
  id: string;
  title: string;
  caption: string;
  head: string[];
  rows: Cell[][];
}

export interface RunData {
  traces: TraceSet;
  map: MapData | null;
  /** The checks (when the scenario has any), then the measurements: one table per probe. */
  tables: Table[];
  checks: { passed: number; failed: number } | null;
}

/** One sweep point whose waveforms the page holds. */
export interface SweepPoint {
  point: number;
  /** The varied values, as text: "route.rs.series.r = 33 Ω". */
  label: string;
  traces: TraceSet;
}

export interface SweepData {
  /** sweep.csv's columns and rows (null: an empty cell). */
  header: string[];
  rows: (number | null)[][];
  /** How many leading columns after `point` are varied values. */
  varied: number;
  probes: string[];
  /** The probe overlaid when the page opens (the pick's, or the plotted metric's). */
  probe: string;
  /** The columns of `header` the page's table shows besides the point: varied values, the pick's and plotted metric's columns, the check tally. */
  shown: string[];
  /** Points with waveforms in the page (all points, or a stated selection of them). */
  points: SweepPoint[];
  /** Points overlaid when the page opens. */
  initial: number[];
  /** The best point of a pick, the worst sample of a Monte Carlo run, when there is one. */
  marked: { point: number; label: string }[];
}

/** What a watch server adds to the page it serves. */
export interface LiveData {
  /** Path of the server's event stream (same origin). */
  events: string;
  /** Increases with every run the server has finished (good or not). */
  revision: number;
  /** The saved scenario's problems when the latest run failed; the page shows them over the last good result. */
  problems: LiveProblem[] | null;
  /** When the problems were found (ms since the epoch), for the banner. */
  failedAt: number | null;
}

export interface LiveProblem {
  /** "file:line:column" or the file alone. */
  where: string;
  /** Key path in the scenario, e.g. "route[2].length"; empty for the whole file. */
  path: string;
  message: string;
}

export interface PageData {
  format: 1;
  kind: 'run' | 'sweep';
  title: string;
  scenarioFile: string;
  tool: { name: string; version: string };
  /** Statements about the data (reduction, precision) shown under the charts. */
  notes: string[];
  /** Trace colours in order (those of the PNG views). */
  traceColors: string[];
  run?: RunData;
  sweep?: SweepData;
  live?: LiveData;
}
