// Animation frames: voltage against distance along the route at evenly spaced instants, one PNG each,
// read from the route map (SimResult.routeMap). The instants cover the interval where the route is
// active — from just before anything moves to where every point has settled to its final value — not a
// settled tail; for a repeating source (a clock, bits), the first edge until the route is still. Every frame shares one y scale, so the frames can be played in order; segment
// boundaries and lumped parts are marked and labelled; the time is in the title.
import type { RouteMapRecord } from '../../sim/result.js';
import { drawLinePlot, encodePng, formatSi, padDomain, Surface, THEME, type Annotation, type Marker } from '../render/index.js';
import { pathMap } from './map.js';

export interface FramesSpec {
  /** The scenario's title; the frame's time goes before it. */
  title: string;
  routeMap: RouteMapRecord;
  /** Number of frames (≥ 1). */
  count: number;
  /** Pixels per frame (default 960 × 540). */
  width?: number;
  height?: number;
}

/** Folder (inside the output folder) and file name of frame i (0-based) of `count`: frames/frame-0001.png … */
export const FRAMES_DIR = 'frames';
export function frameFileName(i: number, count: number): string {
  const digits = Math.max(4, String(count).length);
  return `frame-${String(i + 1).padStart(digits, '0')}.png`;
}

/** Matches a frame file name (for removing frames left over from an earlier run with more frames). */
export const FRAME_FILE_PATTERN = /^frame-(\d{4,})\.png$/;

/** Share of the map's whole voltage range within which a point counts as unchanged (0.5 %). */
export const ACTIVITY_TOLERANCE = 0.005;

/** `tolerance` of the map's whole voltage range: how close two voltages must be to count as the same. */
function stillnessBand(map: RouteMapRecord, tolerance: number): number {
  const d = map.values.data;
  let lo = Infinity, hi = -Infinity;
  for (let i = 0; i < d.length; i++) {
    if (d[i] < lo) lo = d[i];
    if (d[i] > hi) hi = d[i];
  }
  return tolerance * (hi - lo);
}

/** Whether any point of row `r` of the map is more than `eps` from the same point of row `ref`. */
function rowsDiffer(map: RouteMapRecord, r: number, ref: number, eps: number): boolean {
  const cols = map.values.shape[1], d = map.values.data;
  for (let j = 0; j < cols; j++) if (Math.abs(d[r * cols + j] - d[ref * cols + j]) > eps) return true;
  return false;
}

/**
 * The rows where the route is active: from the last row before any point leaves its starting value to
 * the first row after which every point stays at its final value, each within `tolerance` of the map's
 * whole voltage range. A route that never settles (a clock) is active to the end; a map that never
 * changes is "active" over all of it.
 */
export function activeRows(map: RouteMapRecord, tolerance = ACTIVITY_TOLERANCE): [number, number] {
  const rows = map.values.shape[0];
  const eps = stillnessBand(map, tolerance);
  if (!(eps > 0) || rows < 2) return [0, Math.max(0, rows - 1)];
  const differs = (r: number, ref: number) => rowsDiffer(map, r, ref, eps);
  let first = 0;
  while (first < rows - 1 && !differs(first, 0)) first++;
  let last = rows - 1;
  while (last > 0 && !differs(last, rows - 1)) last--;
  return [Math.max(0, first - 1), Math.min(rows - 1, last + 1)];
}

/** Share of the run the whole route must stay still for to count as quiet between two edges (5 %). */
export const QUIET_SHARE = 0.05;

/**
 * The rows of the first burst of activity: from activeRows' start to the first row after which the whole
 * route stays still (every point within `tolerance` of the map's range of that row) for `quietShare` of
 * the run — where the first edge's reflections have died out before a repeating source (a clock, bits)
 * sends the next one, whose frames would show the same again. A route that is never quiet before its end
 * (a single edge that settles, a clock faster than the settling) gives activeRows.
 */
export function firstBurstRows(map: RouteMapRecord, tolerance = ACTIVITY_TOLERANCE, quietShare = QUIET_SHARE): [number, number] {
  const [a, b] = activeRows(map, tolerance);
  const rows = map.values.shape[0];
  const eps = stillnessBand(map, tolerance);
  const quiet = Math.max(3, Math.round(quietShare * rows));
  if (!(eps > 0)) return [a, b];
  const still = (r: number, ref: number) => !rowsDiffer(map, r, ref, eps);
  // from the row after the first movement, the first row that the next `quiet` rows all stay close to
  for (let r = a + 1; r + quiet < b; r++) {
    let k = 1;
    while (k <= quiet && still(r + k, r)) k++;
    if (k > quiet) return [a, r];
  }
  return [a, b];
}

/**
 * Route-map rows shown by `count` frames: evenly spaced (rounded to the nearest row) from `range[0]` to
 * `range[1]` (default: the first row to the last). One frame shows the end of the range.
 */
export function frameRows(rows: number, count: number, range: readonly [number, number] = [0, rows - 1]): number[] {
  if (!(Number.isInteger(rows) && rows >= 1)) throw new RangeError(`frameRows: rows must be a positive whole number, got ${rows}`);
  if (!(Number.isInteger(count) && count >= 1)) throw new RangeError(`frameRows: count must be a positive whole number, got ${count}`);
  const a = Math.max(0, Math.min(rows - 1, range[0])), b = Math.max(a, Math.min(rows - 1, range[1]));
  if (count === 1) return [b];
  return Array.from({ length: count }, (_, i) => a + Math.round((i * (b - a)) / (count - 1)));
}

/** The fixed voltage axis of all frames: the whole map's range, padded, with headroom for the labels. */
export function frameVoltageDomain(map: RouteMapRecord): [number, number] {
  const d = map.values.data;
  let lo = Infinity, hi = -Infinity;
  for (let i = 0; i < d.length; i++) {
    if (d[i] < lo) lo = d[i];
    if (d[i] > hi) hi = d[i];
  }
  if (!(lo <= hi)) [lo, hi] = [0, 1];
  const [a, b] = padDomain(lo, hi, 0.06);
  return [a, b + 0.12 * (b - a)];
}

/**
 * Boundary markers (segment ends, labelled lumped parts) and segment-name labels. `fits(name, from, to)`
 * says whether a segment's name fits over its span; a segment too short for its name is left unlabelled.
 */
export function routeMarks(
  map: RouteMapRecord,
  yTop: number,
  fits: (name: string, from: number, to: number) => boolean = () => true,
): { markers: Marker[]; annotations: Annotation[] } {
  const markers: Marker[] = [];
  const annotations: Annotation[] = [];
  const end = map.positions[map.positions.length - 1] ?? 0;
  const seen = new Set<number>();
  const boundary = (at: number) => {
    const key = Math.round(at * 1e9);
    if (seen.has(key) || at <= 0 || at >= end) return;
    seen.add(key);
    markers.push({ axis: 'x', at, color: THEME.gridStrong, dash: [4, 4] });
  };
  for (const it of map.items) {
    if (it.kind === 'line') {
      boundary(it.from);
      boundary(it.to);
      if (fits(it.name, it.from, it.to)) {
        annotations.push({ x: (it.from + it.to) / 2, y: yTop, text: it.name, align: 'center', baseline: 'top', color: THEME.mutedText, size: 12 });
      }
    } else {
      markers.push({ axis: 'x', at: it.from, label: it.name, color: THEME.axis, dash: [2, 3] });
    }
  }
  return { markers, annotations };
}

/** The PNG of one frame: route-map row `row` along the main path; `active` is the interval the frames cover. */
function drawFrame(spec: FramesSpec, row: number, index: number, yDomain: [number, number], active: ActiveSpan): Buffer {
  const map = pathMap(spec.routeMap);
  const cols = map.positions.length;
  const values = map.values.data.subarray(row * cols, (row + 1) * cols);
  const end = map.positions[cols - 1] ?? 0;
  const surface = new Surface(spec.width ?? 960, spec.height ?? 540);
  const px = surface.height / 540;
  const yTop = yDomain[1] - ((yDomain[1] - yDomain[0]) * 8) / (400 * px);
  // the plot spans the surface less its margins (axis labels left, padding right), roughly
  const plotW = surface.width - 120;
  const span = end > 0 ? end : 1;
  const fits = (name: string, from: number, to: number) => surface.measureText(name, 12).width + 16 <= ((to - from) / span) * plotW;
  const { markers, annotations } = routeMarks(map, yTop, fits);
  drawLinePlot(surface, { x: 0, y: 0, w: surface.width, h: surface.height }, {
    // the time leads, so a long scenario title is what gets shortened
    title: `t = ${formatSi(row * map.dtRow, 's')} · ${spec.title}`,
    subtitle: `Voltage along the ${spec.routeMap.paths.length > 1 ? `main path (to ${spec.routeMap.paths[0].receiver})` : 'route'}, driver at 0 m · frame ${index + 1} of ${spec.count}, ${spanText(active)}`,
    x: { label: 'Distance from the driver', unit: 'm', domain: end > 0 ? [0, end] : [0, 1] },
    y: { label: 'Voltage', unit: 'V', domain: yDomain },
    series: [{ name: 'voltage', values, xs: map.positions, style: { width: 2 } }],
    legend: 'none',
    markers,
    annotations,
  });
  return encodePng(surface);
}

/**
 * `count` frames as PNG bytes, in time order, over the interval where the route is active: its first
 * burst (firstBurstRows) when the source repeats, else all of it (activeRows).
 */
export async function renderFrames(spec: FramesSpec): Promise<Buffer[]> {
  const whole = activeRows(spec.routeMap);
  const range = firstBurstRows(spec.routeMap);
  const rows = frameRows(spec.routeMap.values.shape[0], spec.count, range);
  const yDomain = frameVoltageDomain(spec.routeMap);
  const span: ActiveSpan = { from: range[0] * spec.routeMap.dtRow, to: range[1] * spec.routeMap.dtRow, firstBurst: range[1] < whole[1] };
  return rows.map((row, i) => drawFrame(spec, row, i, yDomain, span));
}

/** The interval the frames cover (s), and whether it is the first burst of a repeating source. */
interface ActiveSpan {
  from: number;
  to: number;
  firstBurst: boolean;
}

function spanText(a: ActiveSpan): string {
  const t = `${formatSi(a.from, 's')} … ${formatSi(a.to, 's')}`;
  return a.firstBurst ? `over ${t}: the first edge until the route is still (later edges repeat it)` : `over ${t} where the route is active`;
}
