import { describe, expect, it } from 'vitest';
import { layoutFrame, layoutLegend, overlaps, SPACING, type FrameLayoutInput } from '../../../src/render/layout.js';
import type { Rect } from '../../../src/render/surface.js';

const inside = (r: Rect, outer: Rect): boolean =>
  r.x >= outer.x && r.y >= outer.y && r.x + r.w <= outer.x + outer.w && r.y + r.h <= outer.y + outer.h;

const base: FrameLayoutInput = {
  area: { x: 0, y: 0, w: 1200, h: 700 },
  titleHeight: 22,
  xTitleHeight: 17,
  xTickLabelHeight: 14,
  yTitleWidth: 17,
  yTickLabelWidth: 30,
  rightReserve: 150,
  bottomReserve: 0,
  xOverhang: 10,
};

describe('layoutFrame', () => {
  it('keeps every part inside the area and apart from the others', () => {
    const l = layoutFrame(base);
    const parts = { plot: l.plot, title: l.title, xTitle: l.xTitle, yTitle: l.yTitle, right: l.right };
    for (const r of Object.values(parts)) expect(inside(r, base.area)).toBe(true);
    expect(overlaps(l.plot, l.title)).toBe(false);
    expect(overlaps(l.plot, l.xTitle)).toBe(false);
    expect(overlaps(l.plot, l.yTitle)).toBe(false);
    expect(overlaps(l.plot, l.right)).toBe(false);
    expect(l.right.w).toBeGreaterThanOrEqual(base.rightReserve);
    expect(l.right.x).toBeGreaterThanOrEqual(l.plot.x + l.plot.w + SPACING.sideGap);
  });

  it('leaves room left of the plot for the y tick labels, ticks and rotated title', () => {
    const l = layoutFrame(base);
    const need = SPACING.pad + base.yTitleWidth + SPACING.axisTitleGap + base.yTickLabelWidth + SPACING.tickLabelGap + SPACING.tick;
    expect(l.plot.x).toBeGreaterThanOrEqual(need);
    const wider = layoutFrame({ ...base, yTickLabelWidth: 80 });
    expect(wider.plot.x - l.plot.x).toBe(50);
  });

  it('puts the x title below the tick labels and the title above the plot', () => {
    const l = layoutFrame(base);
    expect(l.xTitle.y).toBeGreaterThanOrEqual(l.plot.y + l.plot.h + SPACING.tick + base.xTickLabelHeight);
    expect(l.title.y + l.title.h).toBeLessThanOrEqual(l.plot.y);
  });

  it('reserves a band below for a legend and a band above for marker labels', () => {
    const l = layoutFrame({ ...base, rightReserve: 0, bottomReserve: 60, topReserve: 30 });
    expect(l.bottom.h).toBe(60);
    expect(l.bottom.y).toBeGreaterThanOrEqual(l.xTitle.y + l.xTitle.h);
    expect(inside(l.bottom, base.area)).toBe(true);
    expect(l.top.h).toBe(30);
    expect(l.top.y + l.top.h).toBe(l.plot.y);
    expect(l.top.y).toBeGreaterThanOrEqual(l.title.y + l.title.h);
    expect(overlaps(l.plot, l.bottom)).toBe(false);
  });

  it('without a side column, keeps room for the last x tick label only', () => {
    const l = layoutFrame({ ...base, rightReserve: 0, xOverhang: 20 });
    expect(l.plot.x + l.plot.w).toBe(1200 - SPACING.pad - 20);
  });

  it('lays out inside an offset sub-area (panels of a composite figure)', () => {
    const area = { x: 600, y: 350, w: 600, h: 350 };
    const l = layoutFrame({ ...base, area, rightReserve: 0 });
    expect(inside(l.plot, area)).toBe(true);
    expect(inside(l.xTitle, area)).toBe(true);
  });
});

describe('layoutLegend', () => {
  it('right: one column of rows, top-aligned', () => {
    const box = { x: 1000, y: 60, w: 180, h: 500 };
    const { items, w, h } = layoutLegend([40, 80, 60], 'right', box);
    expect(items.map((i) => i.x)).toEqual([1008, 1008, 1008]);
    expect(items[1].y - items[0].y).toBe(22);
    expect(items[0].y).toBe(68);
    expect(w).toBe(30 + 8 + 80 + 16);
    expect(h).toBe(3 * 22 + 16);
  });
  it('below: wraps into centred rows that fit the width', () => {
    const box = { x: 100, y: 600, w: 400, h: 0 };
    const widths = [100, 100, 100, 100, 100];
    const { items } = layoutLegend(widths, 'below', box);
    const rows = new Set(items.map((i) => i.y));
    expect(rows.size).toBeGreaterThan(1);
    for (const it of items) {
      expect(it.x).toBeGreaterThanOrEqual(box.x);
      expect(it.x + it.w).toBeLessThanOrEqual(box.x + box.w);
    }
    // no two entries of a row overlap
    for (const a of items) for (const b of items) {
      if (a !== b && a.y === b.y) expect(a.x + a.w <= b.x || b.x + b.w <= a.x).toBe(true);
    }
  });
});
