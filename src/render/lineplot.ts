// Several traces on shared axes: title, axis titles with units, grid, legend
// outside the data area, markers and annotations.
import { buildFrame, drawFrameBackground, drawFrameForeground, type AxisSpec, type Frame, type FrameSpec } from './frame.js';
import { SPACING } from './layout.js';
import {
  drawAnnotations,
  drawLegend,
  drawMarkerLabels,
  drawMarkerLines,
  estimateMarkerBand,
  legendBelowHeight,
  legendWidth,
  type Annotation,
  type LegendEntry,
  type Marker,
} from './marks.js';
import { traceStyle, type TraceStyle } from './palette.js';
import { reduceTrace, type SampleX } from './reduce.js';
import { extent, padDomain } from './scale.js';
import { encodePng, Surface, type Rect } from './surface.js';

export interface LineSeries {
  name: string;
  /** y values, one per sample (NaN = gap). */
  values: ArrayLike<number>;
  /** Uniform sample positions x_i = x0 + i·dx (x0 defaults to 0)… */
  x0?: number;
  dx?: number;
  /** …or explicit, non-decreasing positions. */
  xs?: ArrayLike<number>;
  /** Overrides of the default style (the i-th Okabe–Ito colour and dash). */
  style?: Partial<TraceStyle>;
  /** Leave out of the legend. */
  hideInLegend?: boolean;
}

export interface LinePlotSpec {
  title?: string;
  subtitle?: string;
  x: AxisSpec;
  y: AxisSpec;
  series: readonly LineSeries[];
  markers?: readonly Marker[];
  annotations?: readonly Annotation[];
  /** Where the legend goes (default 'right'; 'below' is chosen when names are too long for the side). */
  legend?: 'right' | 'below' | 'none';
  legendTitle?: string;
  /** Grid lines at the ticks (default true). */
  grid?: boolean;
  /**
   * Fixed left and right pixel edges of the plot area: stacked panels given the same columns share
   * their x axis pixel for pixel (see alignedColumns).
   */
  columns?: { left: number; right: number };
}

/**
 * The plot columns that stacked panels share: the rightmost left edge and the leftmost right edge of
 * their natural layouts, so every panel's tick labels and legend still fit. Lays the panels out on a
 * scratch surface of the same size; draws nothing on `surface`.
 */
export function alignedColumns(surface: Surface, panels: readonly { area: Rect; spec: LinePlotSpec }[]): { left: number; right: number } {
  const scratch = new Surface(surface.width, surface.height);
  let left = -Infinity, right = Infinity;
  for (const p of panels) {
    const f = drawLinePlot(scratch, p.area, { ...p.spec, columns: undefined });
    left = Math.max(left, f.plot.x);
    right = Math.min(right, f.plot.x + f.plot.w);
  }
  return { left, right };
}

export interface ImageSize {
  /** Pixels (defaults 1200 × 700). */
  width?: number;
  height?: number;
}

function sampleX(s: LineSeries): SampleX {
  if (s.xs) return { xs: s.xs };
  return { x0: s.x0 ?? 0, dx: s.dx ?? 1 };
}

function seriesXExtent(s: LineSeries): [number, number] | null {
  const n = s.values.length;
  if (n === 0) return null;
  if (s.xs) return extent([s.xs]);
  const x0 = s.x0 ?? 0, dx = s.dx ?? 1;
  return [x0, x0 + (n - 1) * dx];
}

function validate(spec: LinePlotSpec): void {
  spec.series.forEach((s, i) => {
    if (s.xs && s.xs.length !== s.values.length) {
      throw new RangeError(`series ${i} (${s.name}): xs has ${s.xs.length} entries for ${s.values.length} values`);
    }
    if (!s.xs && s.dx !== undefined && !(s.dx > 0 && Number.isFinite(s.dx))) {
      throw new RangeError(`series ${i} (${s.name}): dx must be a positive number, got ${s.dx}`);
    }
  });
}

/** The x and y domains a line plot shows: given ones, else the data's (y padded by 5 %). */
export function lineDomains(spec: LinePlotSpec): { x: [number, number]; y: [number, number] } {
  let x: [number, number];
  if (spec.x.domain) x = [spec.x.domain[0], spec.x.domain[1]];
  else {
    const ex = spec.series.map(seriesXExtent).filter((e): e is [number, number] => e !== null);
    x = ex.length ? [Math.min(...ex.map((e) => e[0])), Math.max(...ex.map((e) => e[1]))] : [0, 1];
    if (x[0] === x[1]) x = padDomain(x[0], x[1]);
  }
  let y: [number, number];
  if (spec.y.domain) y = [spec.y.domain[0], spec.y.domain[1]];
  else {
    const ey = extent(spec.series.map((s) => s.values));
    y = ey ? padDomain(ey[0], ey[1], 0.06) : [-1, 1];
  }
  return { x, y };
}

/**
 * Draw a line plot into `area` of `surface`. Returns the frame (plot rectangle
 * and data→pixel scales) so callers can add their own marks.
 */
export function drawLinePlot(surface: Surface, area: Rect, spec: LinePlotSpec): Frame {
  validate(spec);
  const domains = lineDomains(spec);
  const entries: LegendEntry[] = [];
  const styles = spec.series.map((s, i) => ({ ...traceStyle(i), ...s.style }) as TraceStyle);
  spec.series.forEach((s, i) => {
    if (!s.hideInLegend) entries.push({ name: s.name, style: styles[i] });
  });

  let placement = spec.legend ?? 'right';
  if (entries.length === 0) placement = 'none';
  let rightReserve = 0, bottomReserve = 0;
  if (placement === 'right') {
    const natural = legendWidth(surface, entries, Infinity, spec.legendTitle);
    if (natural > area.w * 0.28) placement = 'below';
    else rightReserve = natural;
  }
  if (placement === 'below') {
    bottomReserve = legendBelowHeight(surface, entries, area.w - 2 * SPACING.pad - 80, spec.legendTitle);
  }

  const frameSpec: FrameSpec = {
    title: spec.title,
    subtitle: spec.subtitle,
    x: { ...spec.x, domain: domains.x },
    y: { ...spec.y, domain: domains.y },
    rightReserve,
    bottomReserve,
    topReserve: estimateMarkerBand(surface, spec.markers, domains.x, area, rightReserve),
    columns: spec.columns,
  };
  const frame = buildFrame(surface, area, frameSpec);
  const { plot } = frame;
  drawFrameBackground(surface, frame, { grid: spec.grid });
  drawMarkerLines(surface, frame, spec.markers ?? []);

  // traces: reduce to ≤ 4 points per pixel column, map to pixels, clip inside the border
  const clip: Rect = { x: plot.x + 1, y: plot.y + 1, w: plot.w - 2, h: plot.h - 2 };
  const [d0, d1] = frame.x.domain;
  const lo = Math.min(d0, d1), hi = Math.max(d0, d1);
  spec.series.forEach((s, i) => {
    if (s.values.length === 0) return;
    const line = reduceTrace(s.values, sampleX(s), [lo, hi], plot.w);
    const px = new Float64Array(line.xs.length);
    const py = new Float64Array(line.ys.length);
    for (let k = 0; k < px.length; k++) {
      px[k] = frame.x.map(line.xs[k]);
      py[k] = frame.y.map(line.ys[k]);
    }
    surface.polyline(px, py, styles[i], clip);
  });

  drawMarkerLabels(surface, frame, spec.markers ?? []);
  drawAnnotations(surface, frame, spec.annotations ?? []);
  drawFrameForeground(surface, frame, frameSpec);
  let legend: Rect | undefined;
  if (placement === 'right') legend = drawLegend(surface, frame.layout.right, entries, 'right', spec.legendTitle);
  if (placement === 'below') legend = drawLegend(surface, frame.layout.bottom, entries, 'below', spec.legendTitle);
  return { ...frame, legend };
}

/** A line plot as PNG bytes. */
export async function linePlot(spec: LinePlotSpec & ImageSize): Promise<Buffer> {
  const surface = new Surface(spec.width ?? 1200, spec.height ?? 700);
  drawLinePlot(surface, { x: 0, y: 0, w: surface.width, h: surface.height }, spec);
  return encodePng(surface);
}
