import { describe, expect, it } from 'vitest';
import {
  coolWarm,
  hexToRgb,
  OKABE_ITO,
  rgbToHex,
  tableColorMap,
  TRACE_COLORS,
  TRACE_DASHES,
  traceStyle,
  viridis,
  type RGB,
} from '../../../src/render/palette.js';

const round = (c: RGB): number[] => c.map((v) => Math.round(v));

describe('Okabe–Ito palette', () => {
  // Okabe & Ito (2008), "Color Universal Design (CUD) — how to make figures and
  // presentations that are friendly to colorblind people": the eight published colours.
  it('matches the published hex codes', () => {
    expect(Object.values(OKABE_ITO).map((h) => h.toUpperCase())).toEqual([
      '#E69F00',
      '#56B4E9',
      '#009E73',
      '#F0E442',
      '#0072B2',
      '#D55E00',
      '#CC79A7',
      '#000000',
    ]);
    expect(hexToRgb(OKABE_ITO.orange)).toEqual([230, 159, 0]);
    expect(hexToRgb(OKABE_ITO.blue)).toEqual([0, 114, 178]);
    expect(hexToRgb(OKABE_ITO.vermillion)).toEqual([213, 94, 0]);
  });
  it('trace colours are those eight, each once, yellow last', () => {
    expect([...TRACE_COLORS].sort()).toEqual(Object.values(OKABE_ITO).slice().sort());
    expect(TRACE_COLORS[TRACE_COLORS.length - 1]).toBe(OKABE_ITO.yellow);
  });
  it('traces also differ in dash pattern, so they stay apart in grey', () => {
    const styles = Array.from({ length: 8 }, (_, i) => traceStyle(i));
    expect(new Set(styles.map((s) => JSON.stringify(s.dash))).size).toBe(8);
    expect(styles[0].dash).toEqual([]);
    expect(traceStyle(8).color).toBe(traceStyle(0).color);
    expect(traceStyle(8).dash).not.toEqual(traceStyle(0).dash);
    expect(TRACE_DASHES.length).toBe(8);
  });
});

describe('cool–warm diverging map', () => {
  // K. Moreland, "Diverging Color Maps for Scientific Visualization" (ISVC 2009), the
  // 33-entry 8-bit cool-warm table. The values were written from memory and then
  // compared with several independent public copies of that table; they agree.
  it('has Moreland’s endpoints and grey midpoint', () => {
    expect(round(coolWarm(0))).toEqual([59, 76, 192]);
    expect(round(coolWarm(0.5))).toEqual([221, 221, 221]);
    expect(round(coolWarm(1))).toEqual([180, 4, 38]);
  });
  it('hits the quarter points of the table', () => {
    expect(round(coolWarm(0.25))).toEqual([141, 176, 254]);
    expect(round(coolWarm(0.75))).toEqual([244, 154, 123]);
  });
  it('clamps outside [0, 1] and maps NaN to the low end', () => {
    expect(round(coolWarm(-3))).toEqual([59, 76, 192]);
    expect(round(coolWarm(7))).toEqual([180, 4, 38]);
    expect(round(coolWarm(NaN))).toEqual([59, 76, 192]);
  });
  it('is lightest in the middle: CIE L* rises to 0.5 and falls after', () => {
    const L = (c: RGB): number => {
      const lin = c.map((v) => {
        const s = v / 255;
        return s <= 0.04045 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
      });
      const Y = 0.2126 * lin[0] + 0.7152 * lin[1] + 0.0722 * lin[2];
      return Y > 216 / 24389 ? 116 * Math.cbrt(Y) - 16 : (24389 / 27) * Y;
    };
    let prev = -1;
    for (let t = 0; t <= 0.5 + 1e-9; t += 1 / 32) {
      const l = L(coolWarm(t));
      expect(l).toBeGreaterThan(prev);
      prev = l;
    }
    for (let t = 0.5 + 1 / 32; t <= 1 + 1e-9; t += 1 / 32) {
      const l = L(coolWarm(t));
      expect(l).toBeLessThan(prev);
      prev = l;
    }
  });
});

describe('viridis sequential map', () => {
  // matplotlib's viridis (van der Walt, Smith & Firing, 2015): first, middle (#21918C)
  // and last (#FDE725) entries of the published 256-entry table.
  it('matches the published table at its ends and middle', () => {
    expect(rgbToHex(viridis(0))).toBe('#440154');
    expect(rgbToHex(viridis(128 / 255))).toBe('#21918c');
    expect(rgbToHex(viridis(1))).toBe('#fde725');
  });
  it('grows in lightness (sum of channels as a rough proxy) from end to end', () => {
    const lum = (c: RGB): number => 0.2126 * c[0] + 0.7152 * c[1] + 0.0722 * c[2];
    let prev = -1;
    for (let t = 0; t <= 1; t += 1 / 64) {
      const l = lum(viridis(t));
      expect(l).toBeGreaterThan(prev);
      prev = l;
    }
  });
});

describe('colour helpers', () => {
  it('parses and writes hex colours', () => {
    expect(hexToRgb('#abc')).toEqual([170, 187, 204]);
    expect(rgbToHex([1, 2, 255.4])).toBe('#0102ff');
    expect(() => hexToRgb('blue')).toThrow();
  });
  it('interpolates a table linearly', () => {
    const m = tableColorMap([
      [0, 0, 0, 0],
      [1, 200, 100, 50],
    ]);
    expect(m(0.5)).toEqual([100, 50, 25]);
  });
});
