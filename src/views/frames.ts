// Animation frames: voltage against distance along the route at evenly spaced instants, one PNG each,
// read from the route map (SimResult.routeMap). Every frame shares one y scale, so the frames can be
// played in order; segment boundaries and lumped parts are marked and labelled; the time is in the title.
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

/**
 * Route-map rows shown by `count` frames: evenly spaced from the first row to the last (rounded to the
 * nearest row), so the first frame is t = 0 and the last the end of the run.
 */
export function frameRows(rows: number, count: number): number[] {
  if (!(Number.isInteger(rows) && rows >= 1)) throw new RangeError(`frameRows: rows must be a positive whole number, got ${rows}`);
  if (!(Number.isInteger(count) && count >= 1)) throw new RangeError(`frameRows: count must be a positive whole number, got ${count}`);
  if (count === 1) return [rows - 1];
  return Array.from({ length: count }, (_, i) => Math.round((i * (rows - 1)) / (count - 1)));
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

/** The PNG of one frame: route-map row `row`. */
function drawFrame(spec: FramesSpec, row: number, index: number, yDomain: [number, number]): Buffer {
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
    subtitle: `Voltage along the ${spec.routeMap.paths.length > 1 ? `main path (to ${spec.routeMap.paths[0].receiver})` : 'route'}, driver at 0 m · frame ${index + 1} of ${spec.count}`,
    x: { label: 'Distance from the driver', unit: 'm', domain: end > 0 ? [0, end] : [0, 1] },
    y: { label: 'Voltage', unit: 'V', domain: yDomain },
    series: [{ name: 'voltage', values, xs: map.positions, style: { width: 2 } }],
    legend: 'none',
    markers,
    annotations,
  });
  return encodePng(surface);
}

/** `count` frames as PNG bytes, in time order. */
export async function renderFrames(spec: FramesSpec): Promise<Buffer[]> {
  const rows = frameRows(spec.routeMap.values.shape[0], spec.count);
  const yDomain = frameVoltageDomain(spec.routeMap);
  return rows.map((row, i) => drawFrame(spec, row, i, yDomain));
}
