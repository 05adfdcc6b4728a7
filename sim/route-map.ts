// Voltage along the whole route over time, decimated in space and time so its memory is bounded:
// at most `columns` node positions × `rows` time rows (default 480 × 900 × 8 bytes ≈ 3.3 MiB).
import ndarray from 'ndarray';
import type { Ladder } from './ladder.js';
import type { RouteMapRecord } from './result.js';

export interface RouteMapOptions {
  columns?: number;
  rows?: number;
}

export interface RouteMapTaps {
  nodes: Int32Array;
  stepStride: number;
  rows: number;
  data: Float64Array;
}

export function planRouteMap(ladder: Ladder, steps: number, options: RouteMapOptions): RouteMapTaps {
  const columns = Math.max(2, options.columns ?? 480);
  const maxRows = Math.max(2, options.rows ?? 900);
  const stride = Math.max(1, Math.ceil(ladder.nodes / columns));
  const picked: number[] = [];
  for (let k = 0; k < ladder.nodes; k += stride) picked.push(k);
  if (picked[picked.length - 1] !== ladder.nodes - 1) picked.push(ladder.nodes - 1);
  const stepStride = Math.max(1, Math.ceil(steps / (maxRows - 1)));
  const rows = Math.floor(steps / stepStride) + 1;
  return { nodes: Int32Array.from(picked), stepStride, rows, data: new Float64Array(rows * picked.length) };
}

export function recordRouteMap(taps: RouteMapTaps, v: Float64Array, row: number): void {
  const { nodes, data } = taps;
  const base = row * nodes.length;
  for (let c = 0; c < nodes.length; c++) data[base + c] = v[nodes[c]];
}

export function finishRouteMap(taps: RouteMapTaps, ladder: Ladder, dt: number): RouteMapRecord {
  const items = [...ladder.items.entries()].map(([name, span]) => ({
    name,
    kind: span.kind,
    from: ladder.position[span.start],
    to: ladder.position[span.end],
  }));
  return {
    positions: Float64Array.from(taps.nodes, (k) => ladder.position[k]),
    dtRow: taps.stepStride * dt,
    values: ndarray(taps.data, [taps.rows, taps.nodes.length]),
    items,
  };
}
