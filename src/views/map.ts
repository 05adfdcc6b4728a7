// The space–time map: the voltage along the whole route (distance from the driver pin across) over
// time (running downward, as in a lattice diagram), as a heat map on a diverging cool–warm scale
// centred on 0 V — or on the level the route idles at before the first edge when that is not 0 V.
// A strip above the map shows the route: line segments as bars with their names, lumped parts as
// ticks with theirs; the same places are marked on the map by dashed (segment ends) and solid
// (parts) lines.
//
// When the run is much longer than the time a wave takes to cross the route (a short PCB net
// simulated for several clock periods), the stripes of a whole run are nearly flat. The map is then
// drawn twice, side by side: the whole run, narrow, with the zoomed span outlined; and a zoom on the
// first edge spanning a few round trips, where the stripes show their slope.
import ndarray from 'ndarray';
import type { RouteMapRecord } from '../../sim/result.js';
import { buildFrame, drawFrameBackground, drawFrameForeground, fitText, TYPE, type Frame, type FrameSpec } from '../render/frame.js';
import { colorNormalization, colorScaleWidth, drawColorScale, drawHeatMap, type ColorScaleSpec, type Grid2D } from '../render/heatmap.js';
import { drawMarkerLines, type Marker } from '../render/marks.js';
import { coolWarm, THEME } from '../render/palette.js';
import { encodePng, Surface, type Rect } from '../render/surface.js';
import { engineeringExponent, formatSi, siPrefix } from '../render/ticks.js';
import { drawTitleBlock, LabelPlacer, lineStep } from './panels.js';

export interface RouteMapInput {
  title: string;
  routeMap: RouteMapRecord;
  /** Pixels (default 1200 × 800). */
  width?: number;
  height?: number;
  /**
   * Time span of the detailed panel: 'auto' (default) zooms on the first edge when a wave crosses the
   * route in under 1/25 of the run; 'none' always shows the whole run; or an explicit [t0, t1] in s.
   */
  zoom?: 'auto' | 'none' | readonly [number, number];
}

export interface RouteMapDrawn {
  /** The detailed map's frame (plot rectangle and data → pixel scales). */
  frame: Frame;
  /** The whole-run panel, when the detailed map is a zoom. */
  overview?: Frame;
  /** A branched net: every path's panel, the main path's first (`frame` is that one). */
  panels?: Frame[];
  /** Time span of the detailed map (s). */
  window: [number, number];
  /** The voltage the colour scale is centred on, and the range it spans. */
  center: number;
  range: [number, number];
  grid: Grid2D;
}

/**
 * The map along one path (driver pin → one receiver) as a map of its own: that path's columns in order,
 * its items (branch points among them). A net without branches has one path: its map is returned as is.
 */
export function pathMap(rm: RouteMapRecord, path = 0): RouteMapRecord {
  if (rm.paths.length <= 1) return rm;
  const p = rm.paths[path];
  const rows = rm.values.shape[0];
  const nc = rm.values.shape[1];
  const cols = p.columns.length;
  const data = new Float64Array(rows * cols);
  for (let r = 0; r < rows; r++) for (let c = 0; c < cols; c++) data[r * cols + c] = rm.values.data[r * nc + p.columns[c]];
  return { positions: p.positions, dtRow: rm.dtRow, values: ndarray(data, [rows, cols]), items: p.items, paths: [{ ...p, columns: Int32Array.from(p.columns, (_, k) => k) }] };
}


/**
 * The map resampled to `columns` equal steps of distance (linear interpolation between the recorded
 * nodes, whose spacing differs between segments). Row r is at t = r·dtRow; each cell is centred on its
 * sample (x and y ranges extend half a cell beyond the first and last samples).
 */
export function routeMapGrid(rm: RouteMapRecord, columns: number): Grid2D {
  const rows = rm.values.shape[0];
  const nc = rm.values.shape[1];
  const pos = rm.positions;
  const data = rm.values.data;
  const L = pos[nc - 1] - pos[0];
  const yRange: [number, number] = [-rm.dtRow / 2, (rows - 0.5) * rm.dtRow];
  if (!(L > 0)) {
    // no length (lumped parts only): one column, the driver pin's voltage
    const values = new Float64Array(rows);
    for (let r = 0; r < rows; r++) values[r] = data[r * nc];
    return { values, nx: 1, ny: rows, xRange: [pos[0] - 5e-4, pos[0] + 5e-4], yRange };
  }
  const nx = Math.max(2, Math.round(columns));
  const dx = L / nx;
  // for each output column, the recorded pair to interpolate between
  const lo = new Int32Array(nx), hi = new Int32Array(nx), w = new Float64Array(nx);
  let k = 0;
  for (let i = 0; i < nx; i++) {
    const x = pos[0] + (i + 0.5) * dx;
    while (k < nc - 2 && pos[k + 1] <= x) k++;
    let k1 = k + 1;
    while (k1 < nc - 1 && pos[k1] <= pos[k]) k1++;
    lo[i] = k;
    hi[i] = k1;
    const span = pos[k1] - pos[k];
    w[i] = span > 0 ? Math.min(1, Math.max(0, (x - pos[k]) / span)) : 0;
  }
  const values = new Float64Array(nx * rows);
  for (let r = 0; r < rows; r++) {
    const base = r * nc;
    for (let i = 0; i < nx; i++) values[r * nx + i] = data[base + lo[i]] * (1 - w[i]) + data[base + hi[i]] * w[i];
  }
  return { values, nx, ny: rows, xRange: [pos[0], pos[nc - 1]], yRange };
}

/**
 * The level the colour scale is centred on: 0 V, unless the route idles elsewhere before the first
 * edge — then the mean voltage along the route in the first row (4 significant digits).
 */
export function idleLevel(rm: RouteMapRecord): number {
  const nc = rm.values.shape[1];
  const data = rm.values.data;
  let sum = 0, maxAbs = 0;
  for (let c = 0; c < nc; c++) sum += data[c];
  for (let i = 0; i < data.length; i++) maxAbs = Math.max(maxAbs, Math.abs(data[i]));
  const mean = sum / nc;
  if (!(maxAbs > 0) || Math.abs(mean) <= 1e-3 * maxAbs) return 0;
  return Number(mean.toPrecision(4));
}

/**
 * When the first edge reaches the driver end and the receiver end (the first row where the voltage
 * has moved by a fifth of the largest change seen anywhere): an estimate of the route's transit
 * time from the map alone. Null when nothing moves or the route has no length.
 */
export function firstEdgeTransit(rm: RouteMapRecord): { start: number; end: number } | null {
  const rows = rm.values.shape[0], nc = rm.values.shape[1];
  const data = rm.values.data;
  if (nc < 2 || !(rm.positions[nc - 1] > rm.positions[0])) return null;
  let maxDev = 0;
  for (let r = 0; r < rows; r++) for (let c = 0; c < nc; c++) maxDev = Math.max(maxDev, Math.abs(data[r * nc + c] - data[c]));
  if (!(maxDev > 0)) return null;
  const first = (c: number): number => {
    for (let r = 0; r < rows; r++) if (Math.abs(data[r * nc + c] - data[c]) > 0.2 * maxDev) return r * rm.dtRow;
    return NaN;
  };
  const start = first(0), end = first(nc - 1);
  return Number.isFinite(start) && Number.isFinite(end) && end > start ? { start, end } : null;
}

/** The time span of the detailed panel, and whether it is a zoom. */
export function mapWindow(rm: RouteMapRecord, zoom: RouteMapInput['zoom'] = 'auto'): { window: [number, number]; zoomed: boolean } {
  const tEnd = (rm.values.shape[0] - 1) * rm.dtRow;
  if (Array.isArray(zoom)) {
    const t0 = Math.max(0, Math.min(zoom[0], zoom[1])), t1 = Math.min(tEnd, Math.max(zoom[0], zoom[1]));
    if (t1 > t0) return { window: [t0, t1], zoomed: t0 > 0 || t1 < tEnd };
  }
  if (zoom === 'auto') {
    const tr = firstEdgeTransit(rm);
    if (tr) {
      const td = tr.end - tr.start;
      if (td * 25 < tEnd) {
        const t0 = Math.max(0, tr.start - 1.5 * td);
        const t1 = Math.min(tEnd, tr.start + 10 * td);
        // at least 40 rows, so the stripes are resolved
        if ((t1 - t0) / rm.dtRow >= 40) return { window: [t0, t1], zoomed: true };
        const t1b = Math.min(tEnd, t0 + 40 * rm.dtRow);
        if (t1b < tEnd) return { window: [t0, t1b], zoomed: true };
      }
    }
  }
  return { window: [0, tEnd], zoomed: false };
}

function routeMarkers(rm: RouteMapRecord): Marker[] {
  const L = rm.positions[rm.positions.length - 1];
  const markers: Marker[] = [];
  const seen = new Set<number>();
  for (const it of rm.items) {
    if (it.kind === 'line') {
      for (const x of [it.from, it.to]) {
        if (x <= rm.positions[0] || x >= L || seen.has(x)) continue;
        seen.add(x);
        markers.push({ axis: 'x', at: x, color: '#2b2f38', dash: [5, 4] });
      }
    } else {
      markers.push({ axis: 'x', at: it.from, color: '#2b2f38', dash: [] });
    }
  }
  return markers;
}

/** Draw the map into `area` of `s`. */
export function drawRouteMap(s: Surface, area: Rect, input: RouteMapInput): RouteMapDrawn {
  if (input.routeMap.paths.length > 1) return drawPathPanels(s, area, input);
  const rm = input.routeMap;
  const pad = 16;
  const center = idleLevel(rm);
  const { window, zoomed } = mapWindow(rm, input.zoom);
  const tEnd = (rm.values.shape[0] - 1) * rm.dtRow;
  const centerText = center === 0 ? '0 V' : `the idle level ${formatSi(center, 'V', 3)} (mean along the route before the first edge)`;
  const titleH = pad + drawTitleBlock(
    s,
    { x: area.x + pad, y: area.y + pad, w: area.w - 2 * pad, h: area.h },
    input.title,
    `Voltage along the route over time: distance from the driver pin across, time running downward. ` +
      `Colour centred on ${centerText}: warm above it, cool below. Dashed lines: ends of line segments; solid: lumped parts.`,
  );
  const panelTitleH = zoomed ? lineStep(s, 14, 6, true) : 0;
  const stripH = 2 * lineStep(s, TYPE.marker, 3) + 24;
  const top = area.y + titleH + panelTitleH + stripH;

  const grid = routeMapGrid(rm, Math.min(1600, Math.round(area.w * 1.5)));
  const markers = routeMarkers(rm);
  const color: ColorScaleSpec = { kind: 'diverging', label: 'Voltage', unit: 'V', center };
  const norm = colorNormalization(grid.values, color);
  const xAxis = { label: 'Distance from the driver pin', unit: 'm', domain: grid.xRange } as const;

  let overview: Frame | undefined;
  let mainArea: Rect = { x: area.x, y: top, w: area.w, h: area.y + area.h - top };
  if (zoomed) {
    const ow = Math.round(area.w * 0.34);
    const ovArea: Rect = { x: area.x, y: top, w: ow, h: mainArea.h };
    mainArea = { x: area.x + ow, y: top, w: area.w - ow, h: mainArea.h };
    overview = drawOverview(s, ovArea, grid, norm, xAxis, [tEnd, 0], markers, window);
  }
  const frame = drawHeatMap(s, mainArea, {
    x: xAxis,
    y: { label: 'Time', unit: 's', domain: [window[1], window[0]] },
    grid,
    color: { ...color, range: [norm.lo, norm.hi] },
    smooth: true,
    markers,
  });
  const stripTop = area.y + titleH + panelTitleH;
  drawRouteStrip(s, frame, rm, { x: frame.plot.x, y: stripTop, w: frame.plot.w, h: stripH - 6 });
  if (overview) {
    drawRouteStrip(s, overview, rm, { x: overview.plot.x, y: stripTop, w: overview.plot.w, h: stripH - 6 });
    const t = (f: Frame, text: string) => s.text(fitText(s, text, 14, f.plot.w + 40, true), f.plot.x, area.y + titleH, { size: 14, bold: true, baseline: 'top' });
    t(overview, `Whole run, ${timeSpan(0, tEnd)}`);
    t(frame, `First edge, ${timeSpan(window[0], window[1])} (outlined on the left)`);
  }
  return { frame, overview, window, center, range: [norm.lo, norm.hi], grid };
}

/**
 * A branched net: one panel per path from the driver pin to a receiver, side by side on one time axis
 * and one colour scale (the bar at the right), each with its own distance axis, its items in a strip
 * above it and its branch points marked (solid lines named after the branch item). The time span is
 * the main path's (zoomed on the first edge when the run is long, as for one route).
 */
function drawPathPanels(s: Surface, area: Rect, input: RouteMapInput): RouteMapDrawn {
  const rm = input.routeMap;
  const pad = 16;
  const maps = rm.paths.map((_, k) => pathMap(rm, k));
  const center = idleLevel(rm);
  const { window, zoomed } = mapWindow(maps[0], input.zoom);
  const centerText = center === 0 ? '0 V' : `the idle level ${formatSi(center, 'V', 3)} (mean along the net before the first edge)`;
  const titleH =
    pad +
    drawTitleBlock(
      s,
      { x: area.x + pad, y: area.y + pad, w: area.w - 2 * pad, h: area.h },
      input.title,
      `Voltage along every path from the driver pin to a receiver (one panel each, the main receiver's first), time running downward` +
        `${zoomed ? `, zoomed on the first edge (${timeSpan(window[0], window[1])})` : ''}. ` +
        (rm.paths.some((p) => p.net !== undefined)
          ? `Each net on its own colour scale, centred on its resting level (a quiet net shows its crosstalk). Hatched: coupled sections. `
          : `One colour scale centred on ${centerText}. `) +
        `Dashed lines: ends of line segments; solid: parts and branch points, where the other paths leave.`,
    );
  const panelTitleH = lineStep(s, 14, 6, true);
  const stripH = 2 * lineStep(s, TYPE.marker, 3) + 24;
  const top = area.y + titleH + panelTitleH + stripH;
  const h = area.y + area.h - top;
  const perPanel = Math.max(120, Math.round((area.w * 1.5) / maps.length));
  const grids = maps.map((m) => routeMapGrid(m, Math.min(1600, perPanel)));
  // Several nets: each panel on its own colour scale centred on its own resting level, so a quiet
  // net's crosstalk (a few % of the aggressor's swing) shows instead of vanishing in the aggressor's scale.
  const perNet = rm.paths.some((p) => p.net !== undefined);
  const colorOf = (g: Grid2D): ColorScaleSpec => ({ kind: 'diverging', label: 'Voltage', unit: 'V', center: perNet ? g.values[0] : center });
  const all = new Float64Array(grids.reduce((n, g) => n + g.values.length, 0));
  grids.reduce((o, g) => (all.set(g.values, o), o + g.values.length), 0);
  const norms = grids.map((g) => colorNormalization(perNet ? g.values : all, colorOf(g)));
  const barWs = norms.map((n, k) => colorScaleWidth(s, n.lo, n.hi, colorOf(grids[k]), h));
  const w = perNet ? area.w / maps.length : (area.w - barWs[0] - 8) / maps.length;
  const panels: Frame[] = [];
  maps.forEach((m, k) => {
    const g = grids[k];
    const x = { label: 'Distance from the driver pin', unit: 'm', domain: g.xRange } as const;
    const box: Rect = { x: Math.round(area.x + k * w), y: top, w: Math.round(perNet ? w - barWs[k] - 8 : w), h };
    const f = drawPlainMap(s, box, g, norms[k], x, [window[1], window[0]], routeMarkers(m));
    drawRouteStrip(s, f, m, { x: f.plot.x, y: top - stripH, w: f.plot.w, h: stripH - 6 });
    const path = rm.paths[k];
    const heading = path.net !== undefined ? `Net ${path.net} → ${path.receiver}` : `${k === 0 ? 'Main path' : 'Branch'} → ${path.receiver}`;
    s.text(fitText(s, heading, 14, f.plot.w + 40, true), f.plot.x, area.y + titleH, { size: 14, bold: true, baseline: 'top' });
    if (perNet) drawColorScale(s, { x: box.x + box.w + 4, y: f.plot.y, w: barWs[k], h: f.plot.h }, norms[k].lo, norms[k].hi, colorOf(g));
    panels.push(f);
  });
  const frame = panels[0];
  if (!perNet) drawColorScale(s, { x: area.x + area.w - barWs[0], y: frame.plot.y, w: barWs[0], h: frame.plot.h }, norms[0].lo, norms[0].hi, colorOf(grids[0]));
  return { frame, panels, window, center, range: [norms[0].lo, norms[0].hi], grid: grids[0] };
}

/** A heat map of `g` in `area` without a colour bar (several panels share one), with marker lines. */
function drawPlainMap(s: Surface, area: Rect, g: Grid2D, norm: { t: (v: number) => number }, x: FrameSpec['x'], yDomain: readonly [number, number], markers: readonly Marker[]): Frame {
  const spec: FrameSpec = { x, y: { label: 'Time', unit: 's', domain: yDomain } };
  const f = buildFrame(s, area, spec);
  drawFrameBackground(s, f, { grid: false, zeroLine: false });
  paintGrid(s, f, g, norm);
  drawMarkerLines(s, f, markers);
  drawFrameForeground(s, f, spec);
  return f;
}

/** Paints the grid's cells into the frame's plot, nearest cell per pixel, on the diverging palette. */
function paintGrid(s: Surface, f: Frame, g: Grid2D, norm: { t: (v: number) => number }): void {
  const { plot } = f;
  const lut = new Uint8Array(256 * 3);
  for (let i = 0; i < 256; i++) {
    const c = coolWarm(i / 255);
    lut[i * 3] = Math.round(c[0]);
    lut[i * 3 + 1] = Math.round(c[1]);
    lut[i * 3 + 2] = Math.round(c[2]);
  }
  const [gx0, gx1] = g.xRange, [gy0, gy1] = g.yRange;
  const fx = g.nx / (gx1 - gx0), fy = g.ny / (gy1 - gy0);
  const data = s.bitmap.data;
  for (let j = plot.y; j < plot.y + plot.h; j++) {
    const iy = Math.min(g.ny - 1, Math.max(0, Math.floor((f.y.invert(j) - gy0) * fy)));
    for (let i = plot.x; i < plot.x + plot.w; i++) {
      const ix = Math.min(g.nx - 1, Math.max(0, Math.floor((f.x.invert(i) - gx0) * fx)));
      const t = norm.t(g.values[iy * g.nx + ix]);
      const c = (t <= 0 ? 0 : t >= 1 ? 255 : Math.round(t * 255)) * 3;
      const k = (j * s.width + i) * 4;
      data[k] = lut[c];
      data[k + 1] = lut[c + 1];
      data[k + 2] = lut[c + 2];
      data[k + 3] = 255;
    }
  }
}

/** "0–59.9 ns", "1.2–10.1 ns": both ends in the unit of the later one. */
export function timeSpan(t0: number, t1: number): string {
  const e = engineeringExponent(t1);
  const k = Math.pow(10, e);
  const num = (v: number) => String(Number((v / k).toPrecision(3)));
  return `${num(t0)}–${num(t1)} ${siPrefix(e)}s`;
}

/** The whole run as a narrow heat map without a colour bar (it shares the detailed map's), zoom outlined. */
function drawOverview(
  s: Surface,
  area: Rect,
  g: Grid2D,
  norm: { t: (v: number) => number },
  x: FrameSpec['x'],
  yDomain: readonly [number, number],
  markers: readonly Marker[],
  window: readonly [number, number],
): Frame {
  const spec: FrameSpec = { x, y: { label: 'Time', unit: 's', domain: yDomain } };
  const f = buildFrame(s, area, spec);
  drawFrameBackground(s, f, { grid: false, zeroLine: false });
  const { plot } = f;
  paintGrid(s, f, g, norm);
  drawMarkerLines(s, f, markers);
  // the zoomed span
  const y0 = Math.round(f.y.map(window[0])), y1 = Math.round(f.y.map(window[1]));
  s.strokeRect(plot.x, Math.min(y0, y1) - 1, plot.w, Math.abs(y1 - y0) + 3, '#111111', 2);
  drawFrameForeground(s, f, spec);
  return f;
}

/** The route above a map: segments as bars with names, parts as ticks with names. */
function drawRouteStrip(s: Surface, f: Frame, rm: RouteMapRecord, box: Rect): void {
  const barH = 14;
  const barY = box.y + box.h - barH - 2;
  const row = lineStep(s, TYPE.marker, 3);
  const placer = new LabelPlacer();
  const right = f.plot.x + f.plot.w - 1;
  s.hline(f.plot.x, right, barY + barH / 2, THEME.axis);
  for (const it of rm.items) {
    if (it.kind !== 'line' || it.to <= it.from) continue;
    const x0 = Math.round(f.x.map(it.from)), x1 = Math.round(Math.min(right, f.x.map(it.to)));
    s.fillRect(x0, barY, x1 - x0, barH, '#e3e7ee');
    // a coupled section's conductor: hatched, and named with its section
    if (it.coupled) for (let x = x0 + 2; x < x1; x += 6) s.vline(x, barY + 1, barY + barH - 1, '#b9a3d6');
    s.strokeRect(x0, barY, x1 - x0 + 1, barH, '#8a93a3');
    const text = fitText(s, it.coupled ? `${it.name} ⇄ ${it.coupled}` : it.name, TYPE.marker, x1 - x0 - 6);
    if (text !== '…' && text.length > 0) {
      s.text(text, (x0 + x1) / 2, barY + barH / 2 + 0.5, { size: TYPE.marker, color: THEME.text, align: 'center', baseline: 'middle' });
    }
  }
  const labelAt = (text: string, px: number, opts: { bold: boolean; color: string; align: 'center' | 'left' | 'right'; stem: boolean }) => {
    const m = s.measureText(text, TYPE.marker, opts.bold);
    let left = opts.align === 'left' ? px : opts.align === 'right' ? px - m.width : px - m.width / 2;
    left = Math.max(box.x - 40, Math.min(left, right + 40 - m.width));
    for (let k = 0; k < 2; k++) {
      const yb = barY - 4 - k * row;
      const r = { x: left - 3, y: yb - m.ascent - m.descent, w: m.width + 6, h: m.ascent + m.descent };
      if (!placer.tryPlace(r, 0)) continue;
      if (opts.stem && k > 0) s.vline(px, yb, barY - 4, '#2b2f38');
      s.text(text, left, yb, { size: TYPE.marker, bold: opts.bold, color: opts.color, baseline: 'bottom' });
      return;
    }
  };
  const parts = rm.items.filter((it) => it.kind !== 'line');
  for (const it of parts) {
    const px = Math.round(f.x.map(it.from));
    s.fillRect(px - 1, barY - 3, 3, barH + 6, '#2b2f38');
    labelAt(it.name, px, { bold: true, color: THEME.text, align: 'center', stem: true });
  }
  labelAt('driver pin', f.plot.x, { bold: false, color: THEME.mutedText, align: 'left', stem: false });
  labelAt(rm.paths.length === 1 && rm.paths[0].receiver !== 'receiver' ? `receiver ${rm.paths[0].receiver}` : 'receiver', right, { bold: false, color: THEME.mutedText, align: 'right', stem: false });
}

/** The space–time map as PNG bytes (default 1200 × 800). */
export async function renderRouteMap(input: RouteMapInput): Promise<Buffer> {
  const s = new Surface(input.width ?? 1200, input.height ?? 800);
  drawRouteMap(s, { x: 0, y: 0, w: s.width, h: s.height }, input);
  return encodePng(s);
}
