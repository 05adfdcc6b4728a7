import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { hexToRgb } from '../../../src/render/palette.js';
import { clipSegment, dashRuns, encodePng, Surface } from '../../../src/render/surface.js';

function darkPixels(s: Surface, region?: { x: number; y: number; w: number; h: number }): number {
  const r = region ?? { x: 0, y: 0, w: s.width, h: s.height };
  let n = 0;
  for (let y = Math.max(0, r.y); y < Math.min(s.height, r.y + r.h); y++)
    for (let x = Math.max(0, r.x); x < Math.min(s.width, r.x + r.w); x++) if (s.getPixel(x, y)[0] < 128) n++;
  return n;
}

describe('Surface', () => {
  it('starts filled with the background colour', () => {
    const s = new Surface(20, 10, '#fafbfc');
    expect(s.getPixel(0, 0)).toEqual([0xfa, 0xfb, 0xfc]);
    expect(s.getPixel(19, 9)).toEqual([0xfa, 0xfb, 0xfc]);
  });

  it('draws text inside the box it reports, and only there', () => {
    const s = new Surface(300, 80);
    const box = s.text('Voltage (mV) 0.25', 20, 40, { size: 16, color: '#000000' });
    expect(box.w).toBeGreaterThan(100);
    const ink = darkPixels(s);
    expect(ink).toBeGreaterThan(100);
    const grown = { x: Math.floor(box.x) - 2, y: Math.floor(box.y) - 2, w: Math.ceil(box.w) + 4, h: Math.ceil(box.h) + 4 };
    expect(darkPixels(s, grown)).toBe(ink);
  });

  it('aligns text: right-aligned text ends at the anchor, centred text straddles it', () => {
    const s = new Surface(300, 60);
    const r = s.text('12.5', 200, 30, { align: 'right' });
    expect(r.x + r.w).toBeCloseTo(200, 6);
    const c = s.text('12.5', 100, 30, { align: 'center' });
    expect(c.x + c.w / 2).toBeCloseTo(100, 6);
  });

  it('rotates text by −90° for y-axis titles (taller than wide)', () => {
    const s = new Surface(60, 300);
    const box = s.text('Voltage (V)', 30, 150, { size: 14, rotate: -90, align: 'center', baseline: 'middle', color: '#000000' });
    expect(box.h).toBeGreaterThan(box.w * 3);
    let minY = Infinity, maxY = -Infinity, minX = Infinity, maxX = -Infinity;
    for (let y = 0; y < 300; y++) for (let x = 0; x < 60; x++) if (s.getPixel(x, y)[0] < 128) {
      minY = Math.min(minY, y); maxY = Math.max(maxY, y); minX = Math.min(minX, x); maxX = Math.max(maxX, x);
    }
    expect(maxY - minY).toBeGreaterThan(60);
    expect(maxX - minX).toBeLessThan(20);
    expect(Math.abs((minY + maxY) / 2 - 150)).toBeLessThan(4);
  });

  it('draws a 2-px anti-aliased line with its exact colour on the centre row', () => {
    const s = new Surface(100, 40);
    s.line(10, 20, 90, 20, { color: '#0072B2', width: 2 });
    expect(s.getPixel(50, 20)).toEqual(hexToRgb('#0072B2'));
    expect(s.getPixel(50, 30)).toEqual([255, 255, 255]);
  });

  it('dashes a polyline: fewer pixels than solid, gaps where the pattern says', () => {
    const solid = new Surface(200, 20), dashed = new Surface(200, 20);
    solid.polyline([10, 190], [10, 10], { color: '#000000', width: 2 });
    dashed.polyline([10, 110, 190], [10, 10, 10], { color: '#000000', width: 2, dash: [10, 10] });
    const a = darkPixels(solid), b = darkPixels(dashed);
    expect(b).toBeLessThan(a * 0.7);
    expect(b).toBeGreaterThan(a * 0.3);
    // the pattern continues across the vertex at x = 110: 10 on, 10 off from x = 10
    expect(dashed.getPixel(15, 10)[0]).toBeLessThan(128);
    expect(dashed.getPixel(25, 10)[0]).toBeGreaterThan(128);
    expect(dashed.getPixel(115, 10)[0]).toBeLessThan(128);
    expect(dashed.getPixel(125, 10)[0]).toBeGreaterThan(128);
  });

  it('breaks a polyline at NaN and clips it to a rectangle', () => {
    const s = new Surface(100, 100);
    s.polyline([0, 50, NaN, 60, 99], [50, 50, NaN, 80, 80], { color: '#000000', width: 1 }, { x: 20, y: 0, w: 60, h: 100 });
    expect(s.getPixel(10, 50)[0]).toBeGreaterThan(128); // clipped away
    expect(s.getPixel(30, 50)[0]).toBeLessThan(128);
    expect(s.getPixel(55, 65)[0]).toBeGreaterThan(128); // no segment across the gap
    expect(s.getPixel(70, 80)[0]).toBeLessThan(128);
    expect(s.getPixel(90, 80)[0]).toBeGreaterThan(128);
  });

  it('encodes a PNG that decodes to the same pixels', () => {
    const s = new Surface(31, 17, '#ffffff');
    s.fillRect(3, 4, 5, 6, '#d55e00');
    const png = PNG.sync.read(encodePng(s));
    expect([png.width, png.height]).toEqual([31, 17]);
    const i = (5 * 31 + 4) * 4;
    expect([png.data[i], png.data[i + 1], png.data[i + 2], png.data[i + 3]]).toEqual([0xd5, 0x5e, 0x00, 255]);
    expect(png.data[0]).toBe(255);
  });

  it('rejects silly sizes', () => {
    expect(() => new Surface(0, 10)).toThrow(RangeError);
    expect(() => new Surface(10.5, 10)).toThrow(RangeError);
  });
});

describe('geometry helpers', () => {
  it('clipSegment keeps the inside part (Liang–Barsky)', () => {
    const r = { x: 0, y: 0, w: 10, h: 10 };
    expect(clipSegment(-5, 5, 15, 5, r)).toEqual([0, 5, 10, 5]);
    expect(clipSegment(2, 2, 3, 3, r)).toEqual([2, 2, 3, 3]);
    expect(clipSegment(-5, -5, -1, 20, r)).toBeNull();
    expect(clipSegment(11, 0, 11, 10, r)).toBeNull();
  });
  it('dashRuns lists the "on" stretches', () => {
    expect(dashRuns(25, [5, 5])).toEqual([[0, 5], [10, 15], [20, 25]]);
    expect(dashRuns(10, [])).toEqual([[0, 10]]);
    expect(dashRuns(10, [0, 0])).toEqual([[0, 10]]);
  });
});
