// A 2-D grid of values as an image on axes, with a colour bar. Diverging
// (Moreland cool–warm, centred on a value, 0 by default) for signed quantities
// such as voltage; sequential (viridis) for densities and magnitudes.
import { buildFrame, drawFrameBackground, drawFrameForeground, TYPE, type AxisSpec, type Frame } from './frame.js';
import type { ImageSize } from './lineplot.js';
import { drawAnnotations, drawMarkerLabels, drawMarkerLines, estimateMarkerBand, type Annotation, type Marker } from './marks.js';
import { coolWarm, hexToRgb, THEME, viridis, type ColorMap } from './palette.js';
import { linearScale } from './scale.js';
import { encodePng, Surface, type Rect } from './surface.js';
import { axisTicks, axisTitle, targetTickCount, type AxisTicks } from './ticks.js';

export interface Grid2D {
  /** Row-major values: values[iy·nx + ix]; row iy = 0 is at yRange[0]. NaN = no data (drawn as background). */
  values: Float64Array;
  nx: number;
  ny: number;
  /** Data coordinates of the grid's outer edges: column ix spans xRange[0] + [ix, ix+1)·Δx. */
  xRange: readonly [number, number];
  yRange: readonly [number, number];
}

export interface ColorScaleSpec {
  /** 'diverging' (cool–warm, symmetric about `center`) or 'sequential' (viridis). */
  kind: 'diverging' | 'sequential';
  /** Colour-bar title, e.g. "Voltage" or "Hits". */
  label: string;
  unit?: string;
  /** Value range mapped onto the colours; default: from the data (diverging: ±max|v − center|). */
  range?: readonly [number, number];
  /** Diverging only: the value shown neutral (default 0). */
  center?: number;
  /** Replace the default map. */
  map?: ColorMap;
  si?: boolean;
  /** The values are counts: label the colour bar at whole numbers only. */
  integer?: boolean;
}

export interface HeatMapSpec {
  title?: string;
  subtitle?: string;
  x: AxisSpec;
  y: AxisSpec;
  grid: Grid2D;
  color: ColorScaleSpec;
  /** Interpolate between cell centres (default false: each cell a flat block). */
  smooth?: boolean;
  markers?: readonly Marker[];
  annotations?: readonly Annotation[];
}

/** Value range and normalisation t(v) ∈ [0, 1] of a colour scale over `values`. */
export function colorNormalization(values: ArrayLike<number>, spec: ColorScaleSpec): { lo: number; hi: number; t: (v: number) => number } {
  let lo: number, hi: number;
  if (spec.range) {
    [lo, hi] = spec.range;
  } else {
    let mn = Infinity, mx = -Infinity;
    for (let i = 0; i < values.length; i++) {
      const v = values[i];
      if (!Number.isFinite(v)) continue;
      if (v < mn) mn = v;
      if (v > mx) mx = v;
    }
    if (mn === Infinity) [mn, mx] = [0, 1];
    [lo, hi] = [mn, mx];
  }
  if (spec.kind === 'diverging') {
    const c = spec.center ?? 0;
    let m = Math.max(Math.abs(hi - c), Math.abs(lo - c));
    if (!(m > 0)) m = 1;
    lo = c - m;
    hi = c + m;
  } else if (!(hi > lo)) {
    const pad = lo === 0 ? 1 : Math.abs(lo) * 0.1;
    lo -= pad;
    hi += pad;
  }
  const k = 1 / (hi - lo);
  return { lo, hi, t: (v) => (v - lo) * k };
}

/** A 256-entry lookup table of a colour map, as packed RGB bytes. */
function lut(map: ColorMap): Uint8Array {
  const out = new Uint8Array(256 * 3);
  for (let i = 0; i < 256; i++) {
    const c = map(i / 255);
    out[i * 3] = Math.round(c[0]);
    out[i * 3 + 1] = Math.round(c[1]);
    out[i * 3 + 2] = Math.round(c[2]);
  }
  return out;
}

const BAR = { width: 16, tick: 4, gap: 5, titleGap: 10 };

function colorBarWidth(s: Surface, labels: string[], title: string): number {
  const tw = Math.max(0, ...labels.map((l) => s.measureText(l, TYPE.tick).width));
  const th = s.measureText('Hg', TYPE.axisTitle);
  return Math.ceil(BAR.width + BAR.tick + BAR.gap + tw + (title ? BAR.titleGap + th.ascent + th.descent : 0));
}

/** Draw a heat map into `area` of `surface`; returns the frame for further marks. */
export function drawHeatMap(surface: Surface, area: Rect, spec: HeatMapSpec): Frame {
  const g = spec.grid;
  if (!(Number.isInteger(g.nx) && g.nx > 0 && Number.isInteger(g.ny) && g.ny > 0)) {
    throw new RangeError(`heatMap: grid size must be positive integers, got ${g.nx}×${g.ny}`);
  }
  if (g.values.length !== g.nx * g.ny) {
    throw new RangeError(`heatMap: ${g.values.length} values for a ${g.nx}×${g.ny} grid`);
  }
  const norm = colorNormalization(g.values, spec.color);
  const map = spec.color.map ?? (spec.color.kind === 'diverging' ? coolWarm : viridis);
  const table = lut(map);

  // the colour bar's ticks do not depend on the plot size much; estimate for its width
  const barTicksEstimate = colorBarTicks(norm.lo, norm.hi, spec.color, targetTickCount(area.h - 150, 60));
  const barTitle = axisTitle(spec.color.label, barTicksEstimate.unit);
  const rightReserve = colorBarWidth(surface, barTicksEstimate.labels, barTitle);

  const xDomain = spec.x.domain ?? g.xRange;
  const yDomain = spec.y.domain ?? g.yRange;
  const frameSpec = {
    title: spec.title,
    subtitle: spec.subtitle,
    x: { ...spec.x, domain: xDomain },
    y: { ...spec.y, domain: yDomain },
    rightReserve,
    topReserve: estimateMarkerBand(surface, spec.markers, xDomain, area, rightReserve),
  };
  const frame = buildFrame(surface, area, frameSpec);
  const { plot } = frame;
  drawFrameBackground(surface, frame, { grid: false, zeroLine: false });

  // the image: sample the grid at every pixel centre
  const data = surface.bitmap.data;
  const W = surface.width;
  const missing = hexToRgb(THEME.missing);
  const [gx0, gx1] = g.xRange, [gy0, gy1] = g.yRange;
  const fx = g.nx / (gx1 - gx0), fy = g.ny / (gy1 - gy0);
  const smooth = spec.smooth ?? false;
  const value = (gx: number, gy: number): number => {
    // gx, gy in cell units (0 at the grid's left/bottom edge)
    if (!smooth) {
      const ix = Math.floor(gx), iy = Math.floor(gy);
      if (ix < 0 || iy < 0 || ix >= g.nx || iy >= g.ny) return NaN;
      return g.values[iy * g.nx + ix];
    }
    if (gx < 0 || gy < 0 || gx > g.nx || gy > g.ny) return NaN;
    const cx = Math.min(g.nx - 1, Math.max(0, gx - 0.5)), cy = Math.min(g.ny - 1, Math.max(0, gy - 0.5));
    const ix = Math.min(g.nx - 2, Math.floor(cx)), iy = Math.min(g.ny - 2, Math.floor(cy));
    if (ix < 0 || iy < 0) {
      // a single row or column: fall back to the nearest cell along that direction
      const jx = Math.max(0, Math.min(g.nx - 1, Math.round(cx))), jy = Math.max(0, Math.min(g.ny - 1, Math.round(cy)));
      return g.values[jy * g.nx + jx];
    }
    const ax = cx - ix, ay = cy - iy;
    const v00 = g.values[iy * g.nx + ix], v10 = g.values[iy * g.nx + ix + 1];
    const v01 = g.values[(iy + 1) * g.nx + ix], v11 = g.values[(iy + 1) * g.nx + ix + 1];
    return (v00 * (1 - ax) + v10 * ax) * (1 - ay) + (v01 * (1 - ax) + v11 * ax) * ay;
  };
  for (let j = plot.y; j < plot.y + plot.h; j++) {
    const gy = (frame.y.invert(j) - gy0) * fy;
    for (let i = plot.x; i < plot.x + plot.w; i++) {
      const gx = (frame.x.invert(i) - gx0) * fx;
      const v = value(gx, gy);
      const k = (j * W + i) * 4;
      if (!Number.isFinite(v)) {
        data[k] = missing[0];
        data[k + 1] = missing[1];
        data[k + 2] = missing[2];
      } else {
        const t = norm.t(v);
        const c = (t <= 0 ? 0 : t >= 1 ? 255 : Math.round(t * 255)) * 3;
        data[k] = table[c];
        data[k + 1] = table[c + 1];
        data[k + 2] = table[c + 2];
      }
      data[k + 3] = 255;
    }
  }

  drawMarkerLines(surface, frame, spec.markers ?? []);
  drawMarkerLabels(surface, frame, spec.markers ?? []);
  drawAnnotations(surface, frame, spec.annotations ?? []);
  drawFrameForeground(surface, frame, frameSpec);
  drawColorBar(surface, frame.layout.right, norm.lo, norm.hi, table, spec.color);
  return frame;
}

/** Ticks of the colour bar: the axis ticks, or for counts the whole numbers among them (step ≥ 1). */
export function colorBarTicks(lo: number, hi: number, spec: ColorScaleSpec, target: number): AxisTicks {
  const t = axisTicks(lo, hi, { unit: spec.unit, si: spec.si, target });
  if (!spec.integer) return t;
  const step = Math.max(1, Math.round(t.step));
  const values: number[] = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi + 1e-9; v += step) values.push(v);
  return { values, labels: values.map((v) => String(v)), step, exponent: 0, unit: spec.unit ?? '' };
}

/**
 * A colour bar on its own, for several heat maps that share one scale (drawn without their own bars):
 * the bar and its labels fill `box` from the left; returns the width it needs at height `h`.
 */
export function drawColorScale(s: Surface, box: Rect, lo: number, hi: number, spec: ColorScaleSpec): void {
  drawColorBar(s, box, lo, hi, lut(spec.map ?? (spec.kind === 'diverging' ? coolWarm : viridis)), spec);
}

/** The width a colour bar of this range and height needs, labels and title included. */
export function colorScaleWidth(s: Surface, lo: number, hi: number, spec: ColorScaleSpec, h: number): number {
  const ticks = colorBarTicks(lo, hi, spec, targetTickCount(h, 60));
  return colorBarWidth(s, ticks.labels, axisTitle(spec.label, ticks.unit));
}

function drawColorBar(s: Surface, box: Rect, lo: number, hi: number, table: Uint8Array, spec: ColorScaleSpec): void {
  const x0 = box.x, top = box.y, h = box.h;
  const bar = linearScale([lo, hi], [top + h - 1, top]);
  for (let j = top; j < top + h; j++) {
    const t = (bar.invert(j) - lo) / (hi - lo);
    const c = Math.max(0, Math.min(255, Math.round(t * 255))) * 3;
    s.fillRect(x0, j, BAR.width, 1, [table[c], table[c + 1], table[c + 2]]);
  }
  s.strokeRect(x0 - 1, top - 1, BAR.width + 2, h + 2, THEME.axis);
  const ticks = colorBarTicks(lo, hi, spec, targetTickCount(h, 60));
  let maxW = 0;
  ticks.values.forEach((v, i) => {
    const py = Math.floor(bar.map(v));
    s.hline(x0 + BAR.width + 1, x0 + BAR.width + 1 + BAR.tick, py, THEME.axis);
    const r = s.text(ticks.labels[i], x0 + BAR.width + 1 + BAR.tick + BAR.gap, py + 0.5, {
      size: TYPE.tick,
      color: THEME.mutedText,
      baseline: 'middle',
    });
    maxW = Math.max(maxW, r.w);
  });
  const title = axisTitle(spec.label, ticks.unit);
  if (title) {
    const th = s.measureText('Hg', TYPE.axisTitle);
    s.text(title, x0 + BAR.width + 1 + BAR.tick + BAR.gap + maxW + BAR.titleGap + (th.ascent + th.descent) / 2, top + h / 2, {
      size: TYPE.axisTitle,
      align: 'center',
      baseline: 'middle',
      rotate: -90,
    });
  }
}

/** A heat map as PNG bytes (default 1200 × 700). */
export async function heatMap(spec: HeatMapSpec & ImageSize): Promise<Buffer> {
  const surface = new Surface(spec.width ?? 1200, spec.height ?? 700);
  drawHeatMap(surface, { x: 0, y: 0, w: surface.width, h: surface.height }, spec);
  return encodePng(surface);
}
