// The frame shared by every plot: title, plot area, grid, axes with SI-prefixed
// tick labels and unit-bearing axis titles. Line plots and heat maps draw their
// data between `drawFrameBackground` and `drawFrameForeground`.
import { layoutFrame, SPACING, type FrameLayout } from './layout.js';
import { THEME } from './palette.js';
import { linearScale, type LinearScale } from './scale.js';
import type { Rect, Surface } from './surface.js';
import { axisTicks, axisTitle, targetTickCount, type AxisTicks } from './ticks.js';

/** Type sizes in pixels — one place for the whole look. */
export const TYPE = {
  title: 18,
  subtitle: 13,
  axisTitle: 14,
  tick: 12,
  legend: 13,
  legendTitle: 12,
  marker: 11,
  annotation: 12,
} as const;

export interface AxisSpec {
  /** Quantity name, e.g. "Time". The prefixed unit is appended: "Time (ns)". */
  label: string;
  /** Base SI unit, e.g. "s", "V", "m", "Ω"; omit for dimensionless. */
  unit?: string;
  /** Data interval shown; the plot chooses one from the data when absent. */
  domain?: readonly [number, number];
  /** SI prefixes on the tick labels (default: on when a unit is given). */
  si?: boolean;
}

export interface FrameSpec {
  title?: string;
  subtitle?: string;
  x: AxisSpec & { domain: readonly [number, number] };
  y: AxisSpec & { domain: readonly [number, number] };
  /** Width of a column right of the plot (legend, colour bar); 0 for none. */
  rightReserve?: number;
  /** Height of a band below the x-axis title (legend below); 0 for none. */
  bottomReserve?: number;
  /** Height of a band above the plot (labels of vertical markers); 0 for none. */
  topReserve?: number;
  /** Fixed left and right pixel edges of the plot area (see FrameLayoutInput.columns). */
  columns?: { left: number; right: number };
}

export interface Frame {
  /** The data area in surface pixels. */
  plot: Rect;
  /** Data → pixel: x over [plot.x, plot.x + plot.w − 1], y over [bottom row, top row]. */
  x: LinearScale;
  y: LinearScale;
  xTicks: AxisTicks;
  yTicks: AxisTicks;
  layout: FrameLayout;
  /** Where the legend was drawn, if any (always outside `plot`). */
  legend?: Rect;
}

/** `text` shortened with an ellipsis to fit `maxWidth` pixels. */
export function fitText(s: Surface, text: string, size: number, maxWidth: number, bold = false): string {
  if (s.measureText(text, size, bold).width <= maxWidth) return text;
  let lo = 0, hi = text.length;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (s.measureText(text.slice(0, mid) + '…', size, bold).width <= maxWidth) lo = mid;
    else hi = mid - 1;
  }
  return text.slice(0, lo) + '…';
}

/** Height of one line of text at `size` (ascender + descender, rounded up). */
export function lineHeight(s: Surface, size: number, bold = false): number {
  const m = s.measureText('Hg', size, bold);
  return Math.ceil(m.ascent + m.descent);
}

/** Measure, lay out and choose ticks for a panel in `area`. Draws nothing. */
export function buildFrame(s: Surface, area: Rect, spec: FrameSpec): Frame {
  let titleHeight = 0;
  if (spec.title) titleHeight += lineHeight(s, TYPE.title, true);
  if (spec.subtitle) titleHeight += (titleHeight ? 4 : 0) + lineHeight(s, TYPE.subtitle);
  const tickH = lineHeight(s, TYPE.tick);
  const axisH = lineHeight(s, TYPE.axisTitle);

  let yTickLabelWidth = 36;
  let xOverhang = 16;
  let frame: Frame | null = null;
  // the tick labels' sizes depend on the plot size and vice versa: settle in a few passes
  for (let pass = 0; pass < 3; pass++) {
    const layout = layoutFrame({
      area,
      titleHeight,
      xTitleHeight: spec.x.label ? axisH : 0,
      xTickLabelHeight: tickH,
      yTitleWidth: spec.y.label ? axisH : 0,
      yTickLabelWidth,
      rightReserve: spec.rightReserve ?? 0,
      bottomReserve: spec.bottomReserve ?? 0,
      topReserve: spec.topReserve ?? 0,
      xOverhang,
      columns: spec.columns,
    });
    const plot = layout.plot;
    const xTicks = axisTicks(spec.x.domain[0], spec.x.domain[1], {
      unit: spec.x.unit,
      si: spec.x.si,
      target: targetTickCount(plot.w, 90),
    });
    const yTicks = axisTicks(spec.y.domain[0], spec.y.domain[1], {
      unit: spec.y.unit,
      si: spec.y.si,
      target: targetTickCount(plot.h, 60),
    });
    const x = linearScale(spec.x.domain, [plot.x, plot.x + plot.w - 1]);
    const y = linearScale(spec.y.domain, [plot.y + plot.h - 1, plot.y]);
    frame = { plot, x, y, xTicks, yTicks, layout };
    const widths = yTicks.labels.map((l) => s.measureText(l, TYPE.tick).width);
    const newYW = Math.ceil(Math.max(0, ...widths));
    // overhang of the x tick label nearest the right edge
    let newOver = 8;
    xTicks.values.forEach((v, i) => {
      const px = x.map(v);
      const half = s.measureText(xTicks.labels[i], TYPE.tick).width / 2;
      newOver = Math.max(newOver, Math.ceil(px + half - (plot.x + plot.w)) + 4);
    });
    if (newYW === yTickLabelWidth && newOver === xOverhang) break;
    yTickLabelWidth = newYW;
    xOverhang = newOver;
  }
  return frame!;
}

/** Panel background, grid at every tick and a stronger line at y = 0 when it is in view. */
export function drawFrameBackground(s: Surface, f: Frame, opts: { grid?: boolean; zeroLine?: boolean } = {}): void {
  const { plot } = f;
  s.fillRect(plot.x, plot.y, plot.w, plot.h, THEME.panel);
  if (opts.grid ?? true) {
    for (const v of f.xTicks.values) {
      const px = Math.floor(f.x.map(v));
      if (px > plot.x && px < plot.x + plot.w - 1) s.vline(px, plot.y, plot.y + plot.h, THEME.grid);
    }
    for (const v of f.yTicks.values) {
      const py = Math.floor(f.y.map(v));
      if (py > plot.y && py < plot.y + plot.h - 1) s.hline(plot.x, plot.x + plot.w, py, THEME.grid);
    }
  }
  if (opts.zeroLine ?? true) {
    const [d0, d1] = f.y.domain;
    if (Math.min(d0, d1) < 0 && Math.max(d0, d1) > 0) {
      s.hline(plot.x, plot.x + plot.w, Math.floor(f.y.map(0)), THEME.gridStrong);
    }
  }
}

/** Plot border, ticks, tick labels, axis titles and the title block. */
export function drawFrameForeground(s: Surface, f: Frame, spec: FrameSpec): void {
  const { plot, layout } = f;
  // border just outside the data area
  s.strokeRect(plot.x - 1, plot.y - 1, plot.w + 2, plot.h + 2, THEME.axis);

  const bottom = plot.y + plot.h;
  f.xTicks.values.forEach((v, i) => {
    const px = Math.floor(f.x.map(v));
    s.vline(px, bottom, bottom + SPACING.tick, THEME.axis);
    s.text(f.xTicks.labels[i], px + 0.5, bottom + SPACING.tick + SPACING.tickLabelGap, {
      size: TYPE.tick,
      color: THEME.mutedText,
      align: 'center',
      baseline: 'top',
    });
  });
  f.yTicks.values.forEach((v, i) => {
    const py = Math.floor(f.y.map(v));
    s.hline(plot.x - 1 - SPACING.tick, plot.x - 1, py, THEME.axis);
    s.text(f.yTicks.labels[i], plot.x - 1 - SPACING.tick - SPACING.tickLabelGap, py + 0.5, {
      size: TYPE.tick,
      color: THEME.mutedText,
      align: 'right',
      baseline: 'middle',
    });
  });

  if (spec.x.label) {
    s.text(axisTitle(spec.x.label, f.xTicks.unit), plot.x + plot.w / 2, layout.xTitle.y, {
      size: TYPE.axisTitle,
      align: 'center',
      baseline: 'top',
    });
  }
  if (spec.y.label) {
    s.text(axisTitle(spec.y.label, f.yTicks.unit), layout.yTitle.x + layout.yTitle.w / 2, plot.y + plot.h / 2, {
      size: TYPE.axisTitle,
      align: 'center',
      baseline: 'middle',
      rotate: -90,
    });
  }
  let ty = layout.title.y;
  const tw = layout.title.w;
  if (spec.title) {
    s.text(fitText(s, spec.title, TYPE.title, tw, true), layout.title.x - 1, ty, { size: TYPE.title, bold: true, baseline: 'top' });
    ty += lineHeight(s, TYPE.title, true) + 4;
  }
  if (spec.subtitle) {
    s.text(fitText(s, spec.subtitle, TYPE.subtitle, tw), layout.title.x - 1, ty, {
      size: TYPE.subtitle,
      color: THEME.mutedText,
      baseline: 'top',
    });
  }
}
