// Current–voltage tables of device models: piecewise-linear in the table voltage, extended beyond the
// first and last points along the end segments' slopes (common practice; the open I/O buffer model
// standard asks model makers to cover −V_supply … 2·V_supply so that the extension is rarely reached).
// Evaluation writes the value and the slope into a caller-owned object so the time loop allocates nothing.

/** A table of current (A) against voltage (V), voltages strictly increasing. */
export interface IvTable {
  v: Float64Array;
  i: Float64Array;
}

/** A value and its derivative: current (A) and conductance dI/dV (S). */
export interface IvPoint {
  i: number;
  g: number;
}

export function ivPoint(): IvPoint {
  return { i: 0, g: 0 };
}

/** Builds a table, checking that it has at least two points and strictly increasing, finite voltages. */
export function ivTable(points: ReadonlyArray<readonly [number, number]>): IvTable {
  if (points.length < 2) throw new RangeError(`an I/V table needs at least two points, got ${points.length}`);
  const v = Float64Array.from(points, (p) => p[0]);
  const i = Float64Array.from(points, (p) => p[1]);
  for (let k = 0; k < v.length; k++) {
    if (!Number.isFinite(v[k]) || !Number.isFinite(i[k])) throw new RangeError(`I/V table point ${k + 1} is not a finite number`);
    if (k > 0 && !(v[k] > v[k - 1])) throw new RangeError(`I/V table voltages must increase: point ${k + 1} (${v[k]} V) follows ${v[k - 1]} V`);
  }
  return { v, i };
}

/** The straight line I = V/R through the origin over ±span volts (a resistor as a table). */
export function resistorTable(r: number, span: number): IvTable {
  return ivTable([
    [-span, -span / r],
    [span, span / r],
  ]);
}

/** Index k of the segment [v_k, v_k+1] that holds x (0 or n−2 outside the table). */
function segmentOf(t: IvTable, x: number): number {
  const v = t.v;
  let lo = 0;
  let hi = v.length - 1;
  if (x <= v[1]) return 0;
  if (x >= v[hi - 1]) return hi - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (v[mid] <= x) lo = mid;
    else hi = mid;
  }
  return lo;
}

/** Current and slope at table voltage x, by linear interpolation (linear extension outside the table). */
export function evalIv(t: IvTable, x: number, out: IvPoint): IvPoint {
  const k = segmentOf(t, x);
  const g = (t.i[k + 1] - t.i[k]) / (t.v[k + 1] - t.v[k]);
  out.g = g;
  out.i = t.i[k] + g * (x - t.v[k]);
  return out;
}

/** Current only. */
export function ivAt(t: IvTable, x: number): number {
  const k = segmentOf(t, x);
  return t.i[k] + ((t.i[k + 1] - t.i[k]) * (x - t.v[k])) / (t.v[k + 1] - t.v[k]);
}

/** The table scaled in current by `s` (used for the simple forms' tables). */
export function scaleIv(t: IvTable, s: number): IvTable {
  return { v: t.v.slice(), i: t.i.map((x) => x * s) };
}
