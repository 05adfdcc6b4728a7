import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { drawHeatMap, heatMap } from '../../../src/render/heatmap.js';
import { overlaps } from '../../../src/render/layout.js';
import { drawLinePlot, linePlot } from '../../../src/render/lineplot.js';
import { coolWarm, hexToRgb, THEME, TRACE_COLORS, viridis, type RGB } from '../../../src/render/palette.js';
import { encodePng, Surface } from '../../../src/render/surface.js';
import { drawWaveforms, renderWaveforms } from '../../../src/render/waveforms.js';

type Decoded = { width: number; height: number; data: Buffer };
const decode = (buf: Buffer): Decoded => PNG.sync.read(buf);
const px = (img: Decoded, x: number, y: number): RGB => {
  const i = (y * img.width + x) * 4;
  return [img.data[i], img.data[i + 1], img.data[i + 2]];
};
const near = (a: RGB, b: RGB, tol = 2): boolean => a.every((v, k) => Math.abs(v - b[k]) <= tol);

/** Rows in column x, within ±r of row y, whose colour is `c`. */
function rowsWithColour(img: Decoded, x: number, y: number, c: RGB, r = 2): number[] {
  const out: number[] = [];
  for (let j = Math.round(y) - r; j <= Math.round(y) + r; j++) if (near(px(img, x, j), c)) out.push(j);
  return out;
}

describe('renderWaveforms', () => {
  it('draws constant traces on the rows their values map to (± 2 px), in the trace colours', () => {
    const n = 2001, dt = 15e-12; // 30 ns
    const names = ['driver', 'receiver'];
    const values = [new Float64Array(n).fill(1.0), new Float64Array(n).fill(2.5)];
    const s = new Surface(1200, 700);
    const f = drawWaveforms(s, { x: 0, y: 0, w: 1200, h: 700 }, { title: 'Two levels', dtSample: dt, names, values });
    const img = decode(encodePng(s));
    expect([img.width, img.height]).toEqual([1200, 700]);

    // x axis in ns, y in V
    expect(f.xTicks.unit).toBe('ns');
    expect(f.yTicks.unit).toBe('V');
    const blue = hexToRgb(TRACE_COLORS[0]), red = hexToRgb(TRACE_COLORS[1]);
    const y1 = f.y.map(1.0), y2 = f.y.map(2.5);
    expect(y1).toBeGreaterThan(y2); // higher voltage is higher up
    let solidHits = 0, dashedHits = 0, columns = 0;
    for (let x = f.plot.x + 5; x < f.plot.x + f.plot.w - 5; x += 7) {
      columns++;
      if (rowsWithColour(img, x, y1, blue).length > 0) solidHits++;
      if (rowsWithColour(img, x, y2, red).length > 0) dashedHits++;
    }
    expect(solidHits).toBe(columns); // solid: everywhere
    expect(dashedHits / columns).toBeGreaterThan(0.5); // dashed [12, 5]: ~70 % on
    expect(dashedHits).toBeLessThan(columns);
    // and nowhere else in a middle column
    const mid = f.plot.x + Math.floor(f.plot.w / 2);
    for (let j = f.plot.y; j < f.plot.y + f.plot.h; j++) {
      if (Math.abs(j - y1) > 2) expect(near(px(img, mid, j), blue)).toBe(false);
    }
  });

  it('keeps the legend outside the data area', () => {
    const s = new Surface(1200, 700);
    const f = drawWaveforms(s, { x: 0, y: 0, w: 1200, h: 700 }, {
      title: 't',
      dtSample: 1e-12,
      names: ['a', 'b', 'c'],
      values: [new Float64Array(100), new Float64Array(100), new Float64Array(100)],
    });
    expect(f.legend).toBeDefined();
    expect(overlaps(f.legend!, f.plot)).toBe(false);
    expect(f.legend!.x + f.legend!.w).toBeLessThanOrEqual(1200);
  });

  it('returns a PNG of the requested size, with ink in the title band and the legend', async () => {
    const n = 500;
    const v = Float64Array.from({ length: n }, (_, i) => Math.sin(i / 30));
    const img = decode(
      await renderWaveforms({ title: 'Sine', dtSample: 1e-10, names: ['probe A'], values: [v], width: 800, height: 500 }),
    );
    expect([img.width, img.height]).toEqual([800, 500]);
    let titleInk = 0;
    for (let y = 10; y < 40; y++) for (let x = 0; x < 300; x++) if (px(img, x, y)[0] < 100) titleInk++;
    expect(titleInk).toBeGreaterThan(50);
    let blue = 0;
    for (let i = 0; i < img.data.length; i += 4) if (near([img.data[i], img.data[i + 1], img.data[i + 2]], hexToRgb(TRACE_COLORS[0]))) blue++;
    expect(blue).toBeGreaterThan(500);
  });

  it('is deterministic', async () => {
    const spec = { title: 'x', dtSample: 1e-11, names: ['a'], values: [Float64Array.from({ length: 300 }, (_, i) => i % 7)] };
    expect((await renderWaveforms(spec)).equals(await renderWaveforms(spec))).toBe(true);
  });

  // Speed is measured by `npm run bench`; here only that a 10⁶-sample probe plots through the min/max reduction.
  it('plots a 10⁶-sample probe (min/max per column)', async () => {
    const n = 1_000_000;
    const v = new Float64Array(n);
    for (let i = 0; i < n; i++) v[i] = Math.sin(i * 2e-5) + 0.05 * Math.sin(i * 0.9) + (i === 654_321 ? 3 : 0);
    await renderWaveforms({ title: 'warm-up', dtSample: 1e-12, names: ['a'], values: [v.subarray(0, 1000)] });
    const png = await renderWaveforms({ title: 'Long', dtSample: 1e-12, names: ['rx'], values: [v] });
    expect(decode(png).width).toBe(1200);
  });

  it('rejects inconsistent input', async () => {
    await expect(renderWaveforms({ title: 't', dtSample: 0, names: ['a'], values: [new Float64Array(3)] })).rejects.toThrow(RangeError);
    await expect(renderWaveforms({ title: 't', dtSample: 1e-12, names: ['a', 'b'], values: [new Float64Array(3)] })).rejects.toThrow(
      /2 names for 1/,
    );
  });
});

describe('linePlot', () => {
  it('keeps a single spike visible after reduction', () => {
    const n = 200_000;
    const v = new Float64Array(n);
    v[123_457] = 1;
    const s = new Surface(900, 500);
    const f = drawLinePlot(s, { x: 0, y: 0, w: 900, h: 500 }, {
      x: { label: 'Time', unit: 's' },
      y: { label: 'Voltage', unit: 'V', domain: [-0.2, 1.2] },
      series: [{ name: 'spike', values: v, dx: 1e-12 }],
      legend: 'none',
    });
    const col = Math.floor(f.x.map(123_457e-12));
    const top = Math.round(f.y.map(1));
    const blue = hexToRgb(TRACE_COLORS[0]);
    let hit = false;
    for (let dx = -1; dx <= 1; dx++) for (let dy = -2; dy <= 2; dy++) if (near(s.getPixel(col + dx, top + dy), blue)) hit = true;
    expect(hit).toBe(true);
  });

  it('moves a legend with long names below the plot, still outside the data', () => {
    const s = new Surface(800, 500);
    const long = 'a probe with a really very long descriptive name, longer than any side column';
    const f = drawLinePlot(s, { x: 0, y: 0, w: 800, h: 500 }, {
      x: { label: 'Time', unit: 's' },
      y: { label: 'Voltage', unit: 'V' },
      series: [{ name: long, values: new Float64Array([0, 1, 0]), dx: 1e-9 }],
    });
    expect(f.legend!.y).toBeGreaterThan(f.plot.y + f.plot.h);
    expect(overlaps(f.legend!, f.plot)).toBe(false);
    expect(f.legend!.y + f.legend!.h).toBeLessThanOrEqual(500);
  });

  it('draws markers and their labels outside the data area', async () => {
    const png = await linePlot({
      title: 'Markers',
      x: { label: 'Distance', unit: 'm' },
      y: { label: 'Impedance', unit: 'Ω' },
      series: [{ name: 'Z', values: new Float64Array([50, 50, 75, 75, 50, 50]), xs: new Float64Array([0, 0.1, 0.1, 0.2, 0.2, 0.3]) }],
      markers: [
        { axis: 'x', at: 0.1, label: 'via1' },
        { axis: 'x', at: 0.2, label: 'conn' },
        { axis: 'y', at: 50, label: 'Z0' },
      ],
      width: 700,
      height: 400,
    });
    const img = decode(png);
    expect([img.width, img.height]).toEqual([700, 400]);
  });
});

describe('heatMap', () => {
  it('colours cells with the diverging map centred at 0, NaN as background, with a colour bar', () => {
    // 2×2 grid: bottom row [−1, +1], top row [0, NaN]
    const values = new Float64Array([-1, 1, 0, NaN]);
    const s = new Surface(800, 500);
    const f = drawHeatMap(s, { x: 0, y: 0, w: 800, h: 500 }, {
      x: { label: 'Distance', unit: 'm' },
      y: { label: 'Time', unit: 's' },
      grid: { values, nx: 2, ny: 2, xRange: [0, 0.2], yRange: [0, 10e-9] },
      color: { kind: 'diverging', label: 'Voltage', unit: 'V' },
    });
    const at = (x: number, y: number): RGB => s.getPixel(Math.floor(f.x.map(x)), Math.floor(f.y.map(y)));
    const rounded = (c: RGB): RGB => c.map(Math.round) as unknown as RGB;
    expect(near(at(0.05, 2.5e-9), rounded(coolWarm(0)), 1)).toBe(true);
    expect(near(at(0.15, 2.5e-9), rounded(coolWarm(1)), 1)).toBe(true);
    expect(near(at(0.05, 7.5e-9), rounded(coolWarm(0.5)), 1)).toBe(true);
    expect(near(at(0.15, 7.5e-9), hexToRgb(THEME.missing), 0)).toBe(true);
    // colour bar right of the plot: warm at the top, cool at the bottom
    const barX = f.layout.right.x + 8;
    expect(near(s.getPixel(barX, f.plot.y), rounded(coolWarm(1)), 1)).toBe(true);
    expect(near(s.getPixel(barX, f.plot.y + f.plot.h - 1), rounded(coolWarm(0)), 1)).toBe(true);
    expect(f.xTicks.unit).toBe('mm');
    expect(f.yTicks.unit).toBe('ns');
  });

  it('uses viridis for densities and returns a PNG of the requested size', async () => {
    const values = Float64Array.from({ length: 50 * 40 }, (_, i) => i % 50);
    const png = await heatMap({
      title: 'Density',
      x: { label: 'Time', unit: 's' },
      y: { label: 'Voltage', unit: 'V' },
      grid: { values, nx: 50, ny: 40, xRange: [0, 2e-9], yRange: [0, 3.3] },
      color: { kind: 'sequential', label: 'Hits', range: [0, 49] },
      width: 640,
      height: 400,
    });
    const img = decode(png);
    expect([img.width, img.height]).toEqual([640, 400]);
    let yellow = 0;
    const top = viridis(1).map(Math.round) as unknown as RGB;
    for (let i = 0; i < img.data.length; i += 4) if (near([img.data[i], img.data[i + 1], img.data[i + 2]], top, 3)) yellow++;
    expect(yellow).toBeGreaterThan(100);
  });

  it('rejects a grid whose size does not match its values', () => {
    const s = new Surface(300, 200);
    expect(() =>
      drawHeatMap(s, { x: 0, y: 0, w: 300, h: 200 }, {
        x: { label: 'x' },
        y: { label: 'y' },
        grid: { values: new Float64Array(5), nx: 2, ny: 2, xRange: [0, 1], yRange: [0, 1] },
        color: { kind: 'sequential', label: 'v' },
      }),
    ).toThrow(RangeError);
  });
});
