// Min/max-per-pixel-column reduction of long traces.
//
// A trace of N samples drawn into C pixel columns needs at most four points per
// column — the first and last sample (so neighbouring columns join with a real
// data segment) and the minimum and maximum (so every spike stays visible) — in
// sample order. The drawn envelope of every column is then exactly that of the
// full trace, and drawing costs O(C) whatever N is. Reduction itself is one O(N)
// pass without allocation per sample.

/** Sample positions: uniform (x_i = x0 + i·dx) or explicit, non-decreasing `xs`. */
export type SampleX = { x0: number; dx: number } | { xs: ArrayLike<number> };

export interface Polyline {
  xs: Float64Array;
  /** NaN entries mark gaps: the line is broken there. */
  ys: Float64Array;
}

export interface ColumnEnvelope {
  columns: number;
  /** Per column; NaN where the column holds no finite sample. */
  min: Float64Array;
  max: Float64Array;
  count: Uint32Array;
}

function xAccessor(at: SampleX, n: number): (i: number) => number {
  if ('xs' in at) {
    if (at.xs.length < n) throw new RangeError(`xs has ${at.xs.length} entries for ${n} samples`);
    const xs = at.xs;
    return (i) => xs[i];
  }
  const { x0, dx } = at;
  if (!(dx > 0) || !Number.isFinite(dx)) throw new RangeError(`sample spacing dx must be > 0, got ${dx}`);
  if (!Number.isFinite(x0)) throw new RangeError(`x0 must be finite, got ${x0}`);
  return (i) => x0 + i * dx;
}

/** Column of data coordinate x for `columns` columns over [d0, d1): floor, with x = d1 in the last column. */
export function columnOf(x: number, d0: number, d1: number, columns: number): number {
  const c = Math.floor(((x - d0) / (d1 - d0)) * columns);
  return c === columns && x === d1 ? columns - 1 : c;
}

/** Index range [first, last] of samples with x in [d0, d1]; first > last when none. */
function visibleRange(x: (i: number) => number, n: number, d0: number, d1: number): [number, number] {
  // binary search works for both uniform and explicit (non-decreasing) positions
  let lo = 0;
  let hi = n;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (x(mid) < d0) lo = mid + 1;
    else hi = mid;
  }
  const first = lo;
  lo = first;
  hi = n;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (x(mid) <= d1) lo = mid + 1;
    else hi = mid;
  }
  return [first, lo - 1];
}

/**
 * Brute-force-equivalent envelope: min and max of the finite samples falling in
 * each of `columns` columns over `domain`. Used by tests and by density views.
 */
export function columnEnvelope(
  values: ArrayLike<number>,
  at: SampleX,
  domain: readonly [number, number],
  columns: number,
): ColumnEnvelope {
  const [d0, d1] = domain;
  if (!(d1 > d0)) throw new RangeError(`domain must be increasing, got [${d0}, ${d1}]`);
  const n = values.length;
  const x = xAccessor(at, n);
  const min = new Float64Array(columns).fill(NaN);
  const max = new Float64Array(columns).fill(NaN);
  const count = new Uint32Array(columns);
  const [i0, i1] = visibleRange(x, n, d0, d1);
  for (let i = i0; i <= i1; i++) {
    const v = values[i];
    if (!Number.isFinite(v)) continue;
    const c = columnOf(x(i), d0, d1, columns);
    if (c < 0 || c >= columns) continue;
    if (count[c] === 0 || v < min[c]) min[c] = v;
    if (count[c] === 0 || v > max[c]) max[c] = v;
    count[c]++;
  }
  return { columns, min, max, count };
}

/**
 * The points to draw for a trace over `domain` in `columns` pixel columns: the raw
 * samples when there are few (≤ 4 per column), else first/min/max/last per column
 * in sample order. One sample either side of the domain is kept so the line runs
 * to the plot edge (clip when drawing). Non-finite samples become NaN gaps.
 */
export function reduceTrace(
  values: ArrayLike<number>,
  at: SampleX,
  domain: readonly [number, number],
  columns: number,
): Polyline {
  const [d0, d1] = domain;
  if (!(d1 > d0)) throw new RangeError(`domain must be increasing, got [${d0}, ${d1}]`);
  if (!(columns >= 1)) throw new RangeError(`columns must be ≥ 1, got ${columns}`);
  const n = values.length;
  const x = xAccessor(at, n);
  if (n === 0) return { xs: new Float64Array(0), ys: new Float64Array(0) };
  let [i0, i1] = visibleRange(x, n, d0, d1);
  // keep one neighbour on each side (also covers a domain between two samples)
  i0 = Math.max(0, i0 - 1);
  i1 = Math.min(n - 1, i1 + 1);
  const visible = i1 - i0 + 1;

  if (visible <= 4 * columns) {
    const xs = new Float64Array(visible);
    const ys = new Float64Array(visible);
    for (let k = 0; k < visible; k++) {
      const v = values[i0 + k];
      xs[k] = x(i0 + k);
      ys[k] = Number.isFinite(v) ? v : NaN;
    }
    return { xs, ys };
  }

  // ≤ 4 points per column (+ 2 neighbours); gaps add NaN markers (grown on demand)
  let xs = new Float64Array(5 * (columns + 2));
  let ys = new Float64Array(xs.length);
  let m = 0;
  const room = (k: number): void => {
    if (m + k <= xs.length) return;
    const nx = new Float64Array(xs.length * 2);
    const ny = new Float64Array(xs.length * 2);
    nx.set(xs);
    ny.set(ys);
    xs = nx;
    ys = ny;
  };
  let iFirst = -1, iLast = -1, iMin = -1, iMax = -1;
  let vMin = 0, vMax = 0;

  // emit the current run: first, min/max in sample order, last (duplicates dropped)
  const flush = (): void => {
    if (iFirst < 0) return;
    room(4);
    const lo = Math.min(iMin, iMax), hi = Math.max(iMin, iMax);
    let prev = -1;
    for (const i of [iFirst, lo, hi, iLast]) {
      if (i === prev) continue;
      prev = i;
      xs[m] = x(i);
      ys[m] = values[i];
      m++;
    }
    iFirst = -1;
  };

  // hot loop: no allocation, no call per sample except for explicit positions
  const xsArr = 'xs' in at ? at.xs : null;
  const ux0 = 'xs' in at ? 0 : at.x0;
  const udx = 'xs' in at ? 0 : at.dx;
  const kcol = columns / (d1 - d0);
  let col = Number.NaN;
  for (let i = i0; i <= i1; i++) {
    const xi = xsArr ? xsArr[i] : ux0 + i * udx;
    let c = Math.floor((xi - d0) * kcol);
    if (c < 0) c = -1; // the left neighbour gets its own column
    else if (c >= columns) c = xi === d1 ? columns - 1 : columns; // so does the right one
    if (c !== col) {
      flush();
      col = c;
    }
    const v = values[i];
    if (!(v - v === 0)) {
      // NaN or ±Infinity: close the run so far and break the line once
      flush();
      if (m > 0 && !Number.isNaN(ys[m - 1])) {
        room(1);
        xs[m] = Number.NaN;
        ys[m] = Number.NaN;
        m++;
      }
      continue;
    }
    if (iFirst < 0) {
      iFirst = iMin = iMax = i;
      vMin = vMax = v;
    } else if (v < vMin) {
      iMin = i;
      vMin = v;
    } else if (v > vMax) {
      iMax = i;
      vMax = v;
    }
    iLast = i;
  }
  flush();
  return { xs: xs.subarray(0, m), ys: ys.subarray(0, m) };
}
