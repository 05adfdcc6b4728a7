// Things drawn over the data: marker lines with labels (segment boundaries,
// thresholds), text annotations, and the legend.
import { fitText, TYPE, type Frame } from './frame.js';
export { fitText };
import { LEGEND_GEOMETRY, layoutLegend, overlaps } from './layout.js';
import { THEME, type TraceStyle } from './palette.js';
import type { Rect, Surface, TextAlign, TextBaseline } from './surface.js';

export interface Marker {
  /** 'x': a vertical line at x = at; 'y': a horizontal line at y = at. */
  axis: 'x' | 'y';
  /** Position in data units of that axis. */
  at: number;
  label?: string;
  /** Hex colour (default: neutral grey). */
  color?: string;
  /** Dash pattern (default [5, 4]); [] for solid. */
  dash?: readonly number[];
  width?: number;
}

export interface Annotation {
  /** Anchor in data coordinates. */
  x: number;
  y: number;
  text: string;
  color?: string;
  align?: TextAlign;
  baseline?: TextBaseline;
  /** Draw a dot at the anchor and offset the text from it. */
  dot?: boolean;
  size?: number;
}

/** Marker lines, drawn under the data. */
export function drawMarkerLines(s: Surface, f: Frame, markers: readonly Marker[]): void {
  const { plot } = f;
  for (const m of markers) {
    const color = m.color ?? THEME.marker;
    const dash = m.dash ?? [5, 4];
    if (m.axis === 'x') {
      const px = Math.floor(f.x.map(m.at));
      if (px < plot.x || px >= plot.x + plot.w) continue;
      s.vline(px, plot.y, plot.y + plot.h, color, m.width ?? 1, dash);
    } else {
      const py = Math.floor(f.y.map(m.at));
      if (py < plot.y || py >= plot.y + plot.h) continue;
      s.hline(plot.x, plot.x + plot.w, py, color, m.width ?? 1, dash);
    }
  }
}

/** A text label on a translucent panel-coloured box, so it stays readable over lines. */
function boxedText(s: Surface, text: string, x: number, y: number, size: number, color: string, align: TextAlign, baseline: TextBaseline): Rect {
  const m = s.measureText(text, size);
  const w = m.width, h = m.ascent + m.descent;
  const left = x - w * ({ left: 0, center: 0.5, right: 1 } as const)[align];
  const top = y - ({ top: 0, middle: h / 2, alphabetic: m.ascent, bottom: h } as const)[baseline];
  const box = { x: left - 3, y: top - 1, w: w + 6, h: h + 2 };
  s.fillRect(box.x, box.y, box.w, box.h, THEME.panel, 0.85);
  s.text(text, x, y, { size, color, align, baseline });
  return box;
}

/** Row spacing of marker labels above the plot. */
const MARKER_ROW = TYPE.marker + 6;
/** At most this many rows of marker labels; further collisions overlap. */
const MAX_MARKER_ROWS = 3;

export interface MarkerLabelPlacement {
  marker: Marker;
  /** Centre x of the label in pixels. */
  x: number;
  /** 0 = the row nearest the plot. */
  row: number;
  w: number;
}

/**
 * Rows for the labels of vertical markers, centred on their lines above the plot
 * (`map`: data x → pixel; labels kept within [left, right]). A label goes in the
 * first row where it collides with no other; after MAX_MARKER_ROWS rows it
 * overlaps in the last one.
 */
export function placeXMarkerLabels(
  s: Surface,
  markers: readonly Marker[],
  map: (v: number) => number,
  left: number,
  right: number,
): { placements: MarkerLabelPlacement[]; rows: number } {
  const placed: MarkerLabelPlacement[] = [];
  const rows: Rect[][] = [];
  const sorted = markers.filter((m) => m.axis === 'x' && m.label).sort((a, b) => a.at - b.at);
  for (const m of sorted) {
    const px = Math.floor(map(m.at));
    if (px < left || px > right) continue;
    const w = s.measureText(m.label!, TYPE.marker).width + 6;
    const x = Math.min(Math.max(px + 0.5, left + w / 2), right - w / 2);
    const span: Rect = { x: x - w / 2 - 2, y: 0, w: w + 4, h: 1 };
    let row = 0;
    while (row < rows.length && rows[row].some((r) => overlaps(r, span))) row++;
    if (row >= MAX_MARKER_ROWS) row = MAX_MARKER_ROWS - 1;
    (rows[row] ??= []).push(span);
    placed.push({ marker: m, x, row, w });
  }
  return { placements: placed, rows: rows.length };
}

/** Height to reserve above the plot for the labels of vertical markers (0 if none). */
export function markerBandHeight(rows: number): number {
  return rows > 0 ? rows * MARKER_ROW + 4 : 0;
}

/**
 * Marker labels: vertical markers are labelled above the plot, outside the data
 * (stacked into rows where they would collide, joined to their line by a short
 * stem); horizontal ones at the right end inside the plot, just above the line.
 */
export function drawMarkerLabels(s: Surface, f: Frame, markers: readonly Marker[]): void {
  const { plot } = f;
  const band = f.layout.top;
  const { placements } = placeXMarkerLabels(s, markers, (v) => f.x.map(v), plot.x, plot.x + plot.w - 1);
  const rowsAvail = Math.max(1, Math.floor((band.h - 4) / MARKER_ROW));
  const baseY = (p: MarkerLabelPlacement): number => plot.y - 5 - Math.min(p.row, rowsAvail - 1) * MARKER_ROW;
  // stems first, then labels on page-coloured boxes, so a stem passing a lower row hides behind its label
  for (const p of placements) {
    s.vline(Math.floor(f.x.map(p.marker.at)), baseY(p), plot.y - 1, p.marker.color ?? THEME.marker);
  }
  for (const p of placements) {
    const m = s.measureText(p.marker.label!, TYPE.marker);
    const y = baseY(p);
    s.fillRect(p.x - m.width / 2 - 2, y - m.ascent - m.descent - 1, m.width + 4, m.ascent + m.descent + 1, THEME.page);
    s.text(p.marker.label!, p.x, y, {
      size: TYPE.marker,
      color: p.marker.color ?? THEME.mutedText,
      align: 'center',
      baseline: 'bottom',
    });
  }
  for (const m of markers) {
    if (m.axis !== 'y' || !m.label) continue;
    const py = Math.floor(f.y.map(m.at));
    if (py < plot.y || py >= plot.y + plot.h) continue;
    boxedText(s, m.label, plot.x + plot.w - 6, py - 3, TYPE.marker, m.color ?? THEME.mutedText, 'right', 'bottom');
  }
}

/** Text annotations at data coordinates. */
export function drawAnnotations(s: Surface, f: Frame, notes: readonly Annotation[]): void {
  for (const a of notes) {
    const px = f.x.map(a.x), py = f.y.map(a.y);
    const color = a.color ?? THEME.text;
    let x = px, y = py;
    if (a.dot) {
      s.fillCircle(px + 0.5, py + 0.5, 3, color);
      x += a.align === 'right' ? -6 : a.align === 'center' ? 0 : 6;
      y += a.baseline === 'top' ? 5 : a.baseline === 'bottom' || a.baseline === 'alphabetic' ? -5 : 0;
    }
    boxedText(s, a.text, x, y, a.size ?? TYPE.annotation, color, a.align ?? 'left', a.baseline ?? 'middle');
  }
}

export interface LegendEntry {
  name: string;
  style: TraceStyle;
}

/** Width of the legend column for these entries (placement 'right'), capped at `maxWidth`. */
export function legendWidth(s: Surface, entries: readonly LegendEntry[], maxWidth: number, title?: string): number {
  const g = LEGEND_GEOMETRY;
  const textW = Math.max(
    0,
    ...entries.map((e) => s.measureText(e.name, TYPE.legend).width),
    title ? s.measureText(title, TYPE.legendTitle, true).width - g.swatch - g.gap : 0,
  );
  return Math.min(maxWidth, Math.ceil(g.swatch + g.gap + textW + 2 * g.padding));
}

/** Height of a legend placed below the plot, wrapped to `width`. */
export function legendBelowHeight(s: Surface, entries: readonly LegendEntry[], width: number, title?: string): number {
  const widths = entries.map((e) => s.measureText(e.name, TYPE.legend).width);
  return layoutLegend(widths, 'below', { x: 0, y: 0, w: width, h: 0 }, LEGEND_GEOMETRY, title ? TYPE.legendTitle + 8 : 0).h;
}

/** Draw the legend into `box` (the side column or the band below the plot). */
export function drawLegend(
  s: Surface,
  box: Rect,
  entries: readonly LegendEntry[],
  placement: 'right' | 'below',
  title?: string,
): Rect {
  const g = LEGEND_GEOMETRY;
  const maxText = placement === 'right' ? box.w - 2 * g.padding - g.swatch - g.gap : box.w * 0.6;
  const names = entries.map((e) => fitText(s, e.name, TYPE.legend, Math.max(20, maxText)));
  const widths = names.map((n) => s.measureText(n, TYPE.legend).width);
  const header = title ? TYPE.legendTitle + 8 : 0;
  const lay = layoutLegend(widths, placement, box, g, header);
  const frame: Rect =
    placement === 'right'
      ? { x: box.x, y: box.y, w: Math.min(box.w, lay.w), h: lay.h }
      : { x: box.x + (box.w - lay.w) / 2, y: box.y, w: lay.w, h: lay.h };
  s.fillRect(frame.x, frame.y, frame.w, frame.h, THEME.panel);
  s.strokeRect(frame.x, frame.y, frame.w, frame.h, THEME.grid);
  if (title) {
    s.text(title, frame.x + g.padding, frame.y + g.padding, {
      size: TYPE.legendTitle,
      bold: true,
      color: THEME.mutedText,
      baseline: 'top',
    });
  }
  lay.items.forEach((it, i) => {
    const st = entries[i].style;
    const yc = Math.floor(it.y + g.rowHeight / 2);
    s.polyline([it.x, it.x + g.swatch], [yc, yc], { color: st.color, width: st.width, dash: st.dash });
    s.text(names[i], it.x + g.swatch + g.gap, yc + 0.5, { size: TYPE.legend, baseline: 'middle' });
  });
  return frame;
}

/**
 * Height to reserve above a plot in `area` for its vertical markers' labels,
 * estimated before the exact layout is known (the plot spans roughly the area
 * less the usual margins and `rightReserve`).
 */
export function estimateMarkerBand(
  s: Surface,
  markers: readonly Marker[] | undefined,
  xDomain: readonly [number, number],
  area: Rect,
  rightReserve: number,
): number {
  if (!markers || !markers.some((m) => m.axis === 'x' && m.label)) return 0;
  const left = area.x + 90;
  const right = area.x + area.w - 30 - (rightReserve > 0 ? rightReserve + 18 : 0);
  const k = (right - left) / (xDomain[1] - xDomain[0]);
  const { rows } = placeXMarkerLabels(s, markers, (v) => left + (v - xDomain[0]) * k, left, right);
  return markerBandHeight(rows);
}
