// Layout of a plot panel: where the title, axis titles, tick labels, the plot
// area and a side column (legend or colour bar) go. Pure arithmetic on sizes
// measured by the caller; no drawing.
import type { Rect } from './surface.js';

/** Spacing constants in pixels. */
export const SPACING = {
  /** Empty border around a panel. */
  pad: 16,
  /** Length of tick marks (outside the plot area). */
  tick: 5,
  /** Between a tick mark and its label. */
  tickLabelGap: 5,
  /** Between tick labels and the axis title. */
  axisTitleGap: 10,
  /** Between the title block and the plot area. */
  titleGap: 14,
  /** Between the plot area and the side column (legend / colour bar). */
  sideGap: 18,
  /** Between the x-axis title and a legend placed below. */
  belowGap: 12,
} as const;

export interface FrameLayoutInput {
  /** The region to lay the panel out in. */
  area: Rect;
  /** Height of the title block (title and subtitle lines); 0 for none. */
  titleHeight: number;
  /** Height of the x-axis title line; 0 for none. */
  xTitleHeight: number;
  /** Height of an x tick label line. */
  xTickLabelHeight: number;
  /** Width taken by the rotated y-axis title (its line height); 0 for none. */
  yTitleWidth: number;
  /** Widest y tick label. */
  yTickLabelWidth: number;
  /** Width of the column right of the plot (legend or colour bar); 0 for none. */
  rightReserve: number;
  /** Height of a band below the x-axis title (legend below); 0 for none. */
  bottomReserve: number;
  /** Height of a band between the title and the plot (labels of vertical markers); 0 for none. */
  topReserve?: number;
  /** How far the last x tick label may stick out right of the plot area (half its width). */
  xOverhang: number;
  /**
   * Fixed left and right pixel edges of the plot area (surface coordinates), for panels stacked over
   * one another that must share their x axis pixel for pixel; the measured margins apply otherwise.
   */
  columns?: { left: number; right: number };
}

export interface FrameLayout {
  /** The data area. */
  plot: Rect;
  /** Title block, left-aligned with the plot area. */
  title: Rect;
  /** Band below the x tick labels for the x-axis title (centre it on the plot). */
  xTitle: Rect;
  /** Column left of the y tick labels for the rotated y-axis title. */
  yTitle: Rect;
  /** Side column right of the plot (legend / colour bar), as tall as the plot. */
  right: Rect;
  /** Band below everything (legend below), as wide as the plot. */
  bottom: Rect;
  /** Band right above the plot for marker labels, as wide as the plot. */
  top: Rect;
}

/** Place the plot area and its surroundings inside `input.area`. */
export function layoutFrame(input: FrameLayoutInput): FrameLayout {
  const { area } = input;
  const p = SPACING.pad;

  const top =
    area.y +
    p +
    (input.titleHeight > 0 ? input.titleHeight + SPACING.titleGap : 0) +
    (input.topReserve && input.topReserve > 0 ? input.topReserve : 0);
  const below =
    SPACING.tick +
    SPACING.tickLabelGap +
    input.xTickLabelHeight +
    (input.xTitleHeight > 0 ? SPACING.axisTitleGap + input.xTitleHeight : 0) +
    (input.bottomReserve > 0 ? SPACING.belowGap + input.bottomReserve : 0) +
    p;
  const left =
    area.x +
    p +
    (input.yTitleWidth > 0 ? input.yTitleWidth + SPACING.axisTitleGap : 0) +
    input.yTickLabelWidth +
    SPACING.tickLabelGap +
    SPACING.tick;
  const rightEdge =
    area.x + area.w - p - (input.rightReserve > 0 ? input.rightReserve + SPACING.sideGap : Math.max(0, input.xOverhang));
  const bottomEdge = area.y + area.h - below;

  const plotLeft = input.columns ? input.columns.left : left;
  const plotRight = input.columns ? input.columns.right : rightEdge;
  const plot: Rect = {
    x: Math.round(plotLeft),
    y: Math.round(top),
    w: Math.max(10, Math.round(plotRight - plotLeft)),
    h: Math.max(10, Math.round(bottomEdge - top)),
  };
  const xTickBottom = plot.y + plot.h + SPACING.tick + SPACING.tickLabelGap + input.xTickLabelHeight;
  const xTitle: Rect = {
    x: plot.x,
    y: xTickBottom + SPACING.axisTitleGap,
    w: plot.w,
    h: input.xTitleHeight,
  };
  const bottomTop = (input.xTitleHeight > 0 ? xTitle.y + xTitle.h : xTickBottom) + SPACING.belowGap;
  return {
    plot,
    title: { x: plot.x, y: area.y + p, w: area.x + area.w - p - plot.x, h: input.titleHeight },
    xTitle,
    yTitle: { x: area.x + p, y: plot.y, w: input.yTitleWidth, h: plot.h },
    right: {
      x: plot.x + plot.w + SPACING.sideGap,
      y: plot.y,
      w: Math.max(0, area.x + area.w - p - (plot.x + plot.w + SPACING.sideGap)),
      h: plot.h,
    },
    bottom: { x: plot.x, y: bottomTop, w: plot.w, h: input.bottomReserve },
    top: { x: plot.x, y: plot.y - (input.topReserve ?? 0), w: plot.w, h: input.topReserve ?? 0 },
  };
}

export interface LegendItemBox {
  /** Top-left of the entry's row; the swatch starts here, the text after it. */
  x: number;
  y: number;
  w: number;
}

export interface LegendGeometry {
  /** Row height, swatch length and gaps in pixels. */
  rowHeight: number;
  swatch: number;
  gap: number;
  /** Space between entries on one row (legend below). */
  itemGap: number;
  /** Inner padding of the legend box. */
  padding: number;
}

export const LEGEND_GEOMETRY: LegendGeometry = { rowHeight: 22, swatch: 30, gap: 8, itemGap: 22, padding: 8 };

/**
 * Positions of legend entries, given the width of each entry's text.
 * 'right': one column, top-aligned in `box`. 'below': rows filled left to right,
 * wrapped at `box.w`, each row centred. Returns entries and the size used.
 */
export function layoutLegend(
  textWidths: readonly number[],
  placement: 'right' | 'below',
  box: Rect,
  g: LegendGeometry = LEGEND_GEOMETRY,
  headerHeight = 0,
): { items: LegendItemBox[]; w: number; h: number } {
  const itemW = textWidths.map((t) => g.swatch + g.gap + t);
  const items: LegendItemBox[] = [];
  if (placement === 'right') {
    const w = Math.max(0, ...itemW) + 2 * g.padding;
    let y = box.y + g.padding + headerHeight;
    for (const iw of itemW) {
      items.push({ x: box.x + g.padding, y, w: iw });
      y += g.rowHeight;
    }
    return { items, w, h: y - box.y + g.padding };
  }
  // rows, wrapped
  const rows: number[][] = [];
  let row: number[] = [];
  let rowW = 0;
  itemW.forEach((iw, i) => {
    const need = row.length === 0 ? iw : rowW + g.itemGap + iw;
    if (row.length > 0 && need > box.w - 2 * g.padding) {
      rows.push(row);
      row = [i];
      rowW = iw;
    } else {
      row.push(i);
      rowW = need;
    }
  });
  if (row.length) rows.push(row);
  let maxW = 0;
  rows.forEach((r, k) => {
    const width = r.reduce((s, i) => s + itemW[i], 0) + g.itemGap * (r.length - 1);
    maxW = Math.max(maxW, width);
    let x = box.x + (box.w - width) / 2;
    for (const i of r) {
      items[i] = { x, y: box.y + g.padding + headerHeight + k * g.rowHeight, w: itemW[i] };
      x += itemW[i] + g.itemGap;
    }
  });
  return { items, w: maxW + 2 * g.padding, h: rows.length * g.rowHeight + 2 * g.padding + headerHeight };
}

/** Height a legend needs: the number of wrapped rows (below) or entries (right), plus padding. */
export function legendHeight(
  textWidths: readonly number[],
  placement: 'right' | 'below',
  width: number,
  g: LegendGeometry = LEGEND_GEOMETRY,
  headerHeight = 0,
): number {
  return layoutLegend(textWidths, placement, { x: 0, y: 0, w: width, h: 0 }, g, headerHeight).h;
}

/** True when two rectangles overlap (touching edges do not count). */
export function overlaps(a: Rect, b: Rect): boolean {
  return a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h;
}
