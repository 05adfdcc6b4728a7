// sweep.png: legends with formatted values, eight series told apart by colour and dash, gaps marked
// and listed, and a Monte Carlo curve with the check's limit and the yield. The plotted rows here are
// hand-made, so each mark's place and text is known.
import { afterAll, describe, expect, it } from 'vitest';
import { hexToRgb } from '../../../src/render/palette.js';
import { Surface } from '../../../src/render/surface.js';
import { planSweep } from '../../../src/sweep/plan.js';
import type { SweepRow } from '../../../src/sweep/point.js';
import { drawSweepPlot, formatSweepValue, SERIES_COLORS, sweepSeriesStyle } from '../../../src/sweep/plot.js';
import { CLOCK_WITH_CHECKS, SERIES_NET, TempDirs, writeJson } from './fixtures.js';

const dirs = new TempDirs();
afterAll(() => dirs.cleanup());

describe('legend values and series styles', () => {
  it('formats varied values with SI prefixes and units', () => {
    expect(formatSweepValue(2e-12, 'F')).toBe('2 pF');
    expect(formatSweepValue(39, 'ohm')).toBe('39 Ω');
    expect(formatSweepValue(4.7e-9, 'H')).toBe('4.7 nH');
    expect(formatSweepValue(12.5, '%')).toBe('12.5 %');
  });

  it('gives up to eight series each their own colour and their own dash pattern', () => {
    const styles = Array.from({ length: 8 }, (_, i) => sweepSeriesStyle(i, 1, 8));
    expect(new Set(styles.map((s) => s.color)).size).toBe(8);
    expect(new Set(styles.map((s) => JSON.stringify(s.dash))).size).toBe(8);
    // every colour stands out on the white plot: contrast ≥ 3:1 (WCAG 2.1 SC 1.4.11, non-text contrast;
    // relative luminance with the sRGB transfer function, WCAG 2.1 definitions)
    const lin = (v: number) => (v <= 0.03928 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4);
    for (const c of SERIES_COLORS) {
      const [r, g, b] = hexToRgb(c).map((v) => lin(v / 255));
      const L = 0.2126 * r + 0.7152 * g + 0.0722 * b;
      expect((1 + 0.05) / (L + 0.05), c).toBeGreaterThanOrEqual(3);
    }
    // more than eight (3 probes × 4 values): colour by value, dash by probe, every pair different
    const many = Array.from({ length: 12 }, (_, i) => sweepSeriesStyle(i, 4, 12));
    expect(new Set(many.map((s) => `${s.color}|${JSON.stringify(s.dash)}`)).size).toBe(12);
  });
});

describe('grid plot', () => {
  it('marks the points without a value with a cross in the series colour and lists them under the plot', async () => {
    const d = dirs.make();
    const file = writeJson(d, 'net.json', SERIES_NET);
    const plan = await planSweep({ file, vary: ['route.rs.series.r=0ohm..40ohm:5', 'driver.resistance=10ohm,20ohm'], metric: 'overshoot' });
    // hand-made rows: every column 1, except rx's overshoot at rs = 10 Ω with the 20 Ω driver (point 3)
    const col = plan.header.indexOf('rx.overshoot_pct');
    const rows: SweepRow[] = Array.from({ length: plan.points }, (_, i) => plan.header.map((_, j) => (j === 0 ? i : j === col && i === 3 ? null : 1)));
    const s = new Surface(1200, 700);
    const drawn = drawSweepPlot(s, plan, rows);
    // legends: probe and the other varied value, formatted
    expect(drawn.series.map((x) => x.name)).toContain('rx, driver.resistance = 20 Ω');
    const k = drawn.series.findIndex((x) => x.name === 'rx, driver.resistance = 20 Ω');
    expect(drawn.gaps).toEqual([{ series: k, xs: [10] }]);
    expect(drawn.notes.join('\n')).toMatch(/rx, driver\.resistance = 20 Ω: no value at route\.rs\.series\.r = 10 Ω/);
    // the cross is drawn in the series' colour at x = 10 Ω
    const cross = drawn.crosses[0]!;
    expect(Math.abs(cross.x - drawn.frame.x.map(10))).toBeLessThanOrEqual(1);
    const want = hexToRgb(drawn.series[k]!.style!.color as string);
    expect(s.getPixel(cross.x, cross.y).slice(0, 3).every((v, c) => Math.abs(v - want[c]!) <= 40)).toBe(true);
  });
});

describe('Monte Carlo plot', () => {
  it('draws the scenario’s check limit on the plotted metric and prints the yield', async () => {
    const d = dirs.make();
    const file = writeJson(d, 'clock.json', CLOCK_WITH_CHECKS); // check: rx overshoot max 6 %
    const plan = await planSweep({ file, spread: ['lines.trace.z0=±10%'], samples: 20, seed: 1, metric: 'overshoot' });
    const col = plan.header.indexOf('rx.overshoot_pct');
    const rows: SweepRow[] = Array.from({ length: 20 }, (_, i) => plan.header.map((_, j) => (j === 0 ? i : j === col ? i * 0.5 : 1)));
    const s = new Surface(1200, 700);
    const drawn = drawSweepPlot(s, plan, rows, { yield: { samples: 20, passed: 13, fraction: 0.65, worst: null } });
    expect(drawn.markers).toContainEqual(expect.objectContaining({ axis: 'x', at: 6, label: 'check: max 6 % (rx)' }));
    expect(drawn.subtitle).toMatch(/yield 65 % \(13 of 20 samples pass every check\)/);
  });
});
