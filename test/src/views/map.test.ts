// The space–time map. What is drawn is read back from the pixels (colours inverted through the same
// cool–warm table) and compared with the physics:
// - the first wavefront lies where a wave moving at the line's velocity v = 1/√(L′C′) puts it, within
//   one pixel in every row (and its fitted slope is v);
// - the reflection from an open end has the sign of the incident wave, from a short the opposite sign
//   (Γ = +1 and −1: Pozar, Microwave Engineering, ch. 2).
import ndarray from 'ndarray';
import { describe, expect, it } from 'vitest';
import type { RouteMapRecord } from '../../../sim/result.js';
import { simulate } from '../../../sim/simulate.js';
import { coolWarm } from '../../../src/render/palette.js';
import { Surface } from '../../../src/render/surface.js';
import { drawRouteMap, firstEdgeTransit, idleLevel, mapWindow, renderRouteMap, routeMapGrid, timeSpan } from '../../../src/views/map.js';
import { lineOf, net, part, stepSignal } from '../../support/nets.js';

const TPD = 5e-9; // s/m: v = 2e8 m/s
const V = 1 / TPD;

/** Pixel colour → voltage, through the nearest entry of the map's 256-colour table. */
const TABLE = Array.from({ length: 256 }, (_, i) => coolWarm(i / 255));
const nearest = new Map<number, number>();
function pixelValue(s: Surface, x: number, y: number, range: [number, number]): number {
  const c = s.getPixel(x, y);
  const key = (c[0] << 16) | (c[1] << 8) | c[2];
  let best = nearest.get(key);
  if (best === undefined) {
    let bestD = Infinity;
    best = 0;
    for (let i = 0; i < 256; i++) {
      const m = TABLE[i];
      const d = (m[0] - c[0]) ** 2 + (m[1] - c[1]) ** 2 + (m[2] - c[2]) ** 2;
      if (d < bestD) [best, bestD] = [i, d];
    }
    nearest.set(key, best);
  }
  return range[0] + (best / 255) * (range[1] - range[0]);
}

describe('routeMapGrid', () => {
  it('resamples unevenly spaced nodes linearly onto equal columns, a series part as a jump', () => {
    // nodes at 0, 0.1, 0.3, 0.3 (a series part: two nodes, one place), 0.5 m; v = x before the part, 10 + x after
    const positions = Float64Array.from([0, 0.1, 0.3, 0.3, 0.5]);
    const row = [0, 0.1, 0.3, 10.3, 10.5];
    const rm: RouteMapRecord = {
      positions,
      dtRow: 1e-9,
      values: ndarray(Float64Array.from([...row, ...row.map((v) => 2 * v)]), [2, 5]),
      items: [],
      paths: [],
    };
    const g = routeMapGrid(rm, 10);
    expect([g.nx, g.ny]).toEqual([10, 2]);
    expect(g.xRange).toEqual([0, 0.5]);
    expect(g.yRange[0]).toBeCloseTo(-0.5e-9, 20);
    expect(g.yRange[1]).toBeCloseTo(1.5e-9, 20);
    for (let i = 0; i < 10; i++) {
      const x = (i + 0.5) * 0.05;
      const want = x < 0.3 ? x : 10 + x;
      expect(g.values[i]).toBeCloseTo(want, 12);
      expect(g.values[10 + i]).toBeCloseTo(2 * want, 12);
    }
  });

  it('idles at 0 V unless the whole route sits elsewhere before the first edge', () => {
    const mk = (v0: number): RouteMapRecord => ({
      positions: Float64Array.from([0, 1]),
      dtRow: 1e-9,
      values: ndarray(Float64Array.from([v0, v0, v0 + 1, v0 + 2]), [2, 2]),
      items: [],
      paths: [],
    });
    expect(idleLevel(mk(0))).toBe(0);
    expect(idleLevel(mk(1.65))).toBe(1.65);
  });

  it('writes spans in one unit', () => {
    expect(timeSpan(0, 11.7e-9)).toBe('0–11.7 ns');
    expect(timeSpan(0.087e-9, 10.1e-9)).toBe('0.087–10.1 ns');
  });
});

describe('the first wavefront travels at the line velocity (within one pixel)', () => {
  it('on a matched 1 m line, every row between 0.5 and 4.5 ns after launch', () => {
    const n = net({
      signal: stepSignal(1, 100e-12, 0.5e-9),
      rs: 50,
      route: [{ kind: 'line', name: 'cable', line: lineOf(50, TPD), length: 1 }],
      receiver: [part({ r: 50 })],
      duration: 8e-9,
    });
    const rm = simulate(n, { routeMap: { columns: 480, rows: 900 } }).routeMap!;
    const s = new Surface(1200, 800);
    const d = drawRouteMap(s, { x: 0, y: 0, w: 1200, h: 800 }, { title: 'front', routeMap: rm, zoom: 'none' });
    const f = d.frame;
    expect(d.center).toBe(0);
    const t50 = 0.5e-9 + 100e-12 / 0.8 / 2;
    const half = 0.25; // half of V⁺ = 0.5 V
    const rows: number[] = [], fronts: number[] = [], times: number[] = [];
    let worst = 0;
    for (let j = f.plot.y; j < f.plot.y + f.plot.h; j++) {
      const t = f.y.invert(j);
      if (t < t50 + 0.5e-9 || t > t50 + 4.5e-9) continue;
      let i = f.plot.x + 1;
      let prev = pixelValue(s, i, j, d.range);
      for (i++; i < f.plot.x + f.plot.w - 1; i++) {
        const cur = pixelValue(s, i, j, d.range);
        if (prev >= half && cur < half) break;
        prev = cur;
      }
      const cur = pixelValue(s, i, j, d.range);
      const found = i - 1 + (prev - half) / (prev - cur);
      const expected = f.x.map(V * (t - t50));
      worst = Math.max(worst, Math.abs(found - expected));
      rows.push(j);
      fronts.push(found);
      times.push(t);
    }
    expect(rows.length).toBeGreaterThan(200);
    expect(worst).toBeLessThanOrEqual(1);
    // least-squares slope of the front: distance per time, against v, to within one pixel over the span
    const m = times.length;
    const tm = times.reduce((a, b) => a + b) / m;
    const xm = fronts.map((p) => f.x.invert(p));
    const xmean = xm.reduce((a, b) => a + b) / m;
    let num = 0, den = 0;
    for (let k = 0; k < m; k++) {
      num += (times[k] - tm) * (xm[k] - xmean);
      den += (times[k] - tm) ** 2;
    }
    const vFit = num / den;
    const metresPerPixel = 1 / f.plot.w;
    expect(Math.abs(vFit - V) * (times[m - 1] - times[0])).toBeLessThan(metresPerPixel);
  });
});

describe('reflections from an open and a shorted end (Γ = ±1, Pozar ch. 2)', () => {
  for (const [end, sign] of [['open', 1], ['short', -1]] as const) {
    it(`${end}: the reflected stripe has ${sign > 0 ? 'the same' : 'the opposite'} sign`, () => {
      // a 1 ns pulse on a 1 m line (TD = 5 ns) from a matched source: incident and reflected stripes apart
      const n = net({
        signal: { kind: 'pulse', from: 0, to: 1, start: 0.5e-9, rise: 100e-12, width: 1e-9, fall: 100e-12 },
        rs: 50,
        route: [{ kind: 'line', name: 'cable', line: lineOf(50, TPD), length: 1 }],
        receiver: end === 'open' ? [] : [part({ r: 0 })],
        duration: 12e-9,
      });
      const rm = simulate(n, { routeMap: { columns: 480, rows: 900 } }).routeMap!;
      const tc = 0.5e-9 + 100e-12 / 0.8 / 2 + 0.5e-9; // middle of the pulse at the driver pin
      const col = Math.round(((rm.positions.length - 1) * 0.5) / 1); // mid-line column
      expect(rm.positions[col]).toBeCloseTo(0.5, 2);
      const at = (t: number) => rm.values.get(Math.round(t / rm.dtRow), col);
      const incident = at(tc + 0.5 * TPD);
      const reflected = at(tc + 1.5 * TPD);
      expect(incident).toBeCloseTo(0.5, 2);
      expect(reflected / incident).toBeCloseTo(sign, 2);

      // and on the picture: warm (red over blue) for the incident stripe, warm/cool for the reflection
      const s = new Surface(1200, 800);
      const d = drawRouteMap(s, { x: 0, y: 0, w: 1200, h: 800 }, { title: end, routeMap: rm, zoom: 'none' });
      const pix = (t: number) => s.getPixel(Math.round(d.frame.x.map(0.5)), Math.round(d.frame.y.map(t)));
      const warmth = (c: readonly number[]) => c[0] - c[2];
      expect(warmth(pix(tc + 0.5 * TPD))).toBeGreaterThan(80);
      expect(sign * warmth(pix(tc + 1.5 * TPD))).toBeGreaterThan(80);
      // between the stripes the line is back at the neutral grey of 0 V
      expect(Math.abs(warmth(pix(tc + TPD)))).toBeLessThan(10);
    });
  }
});

describe('zoom on the first edge', () => {
  it('zooms when a wave crosses the route in under 1/25 of the run, and stays whole otherwise', async () => {
    const mk = (length: number, duration: number) =>
      simulate(
        net({
          signal: stepSignal(3.3, 500e-12, 1e-9),
          rs: 14,
          route: [{ kind: 'line', name: 'trace', line: lineOf(55, 5.7e-9), length }],
          receiver: [part({ c: 4e-12 })],
          duration,
        }),
        { routeMap: { columns: 200, rows: 900 } },
      ).routeMap!;
    const short = mk(0.15, 60e-9);
    const tr = firstEdgeTransit(short)!;
    expect(tr.end - tr.start).toBeGreaterThan(0.5 * 0.15 * 5.7e-9);
    expect(tr.end - tr.start).toBeLessThan(1.5 * 0.15 * 5.7e-9 + 0.7e-9);
    const w = mapWindow(short);
    expect(w.zoomed).toBe(true);
    expect(w.window[0]).toBeLessThanOrEqual(1e-9);
    expect(w.window[1] - w.window[0]).toBeGreaterThan(4 * 0.15 * 5.7e-9);
    const s = new Surface(1200, 800);
    const d = drawRouteMap(s, { x: 0, y: 0, w: 1200, h: 800 }, { title: 'zoom', routeMap: short });
    expect(d.overview).toBeDefined();
    expect(d.overview!.plot.y).toBe(d.frame.plot.y);
    expect(d.overview!.plot.x + d.overview!.plot.w).toBeLessThan(d.frame.plot.x);

    const long = mk(2, 60e-9);
    expect(mapWindow(long).zoomed).toBe(false);
    expect(mapWindow(short, 'none').zoomed).toBe(false);
    expect(mapWindow(short, [2e-9, 5e-9]).window).toEqual([2e-9, 5e-9]);
    const png = await renderRouteMap({ title: 'long', routeMap: long, width: 900, height: 600 });
    expect(png.readUInt32BE(16)).toBe(900);
    expect(png.readUInt32BE(20)).toBe(600);
  });
});

describe('a branched net: one panel per path', () => {
  // A T of three equal 50 Ω lines with matched ends (lattice method, Pozar ch. 2): beyond the junction
  // each arm carries (1 + Γ)·V⁺ = (2/3)·0.5 V = 1/3 V. The branch's panel must show that level past
  // the junction on its own distance axis (the arm's length, not the main path's), on the shared scale.
  it('draws the main path first, each panel on its own distance axis, with the arms at V/3', () => {
    const arm = (name: string, len: number) => ({ kind: 'line' as const, name, line: lineOf(50, TPD), length: len });
    const rm = simulate(
      net({
        signal: stepSignal(1, 100e-12, 0.2e-9),
        rs: 50,
        route: [arm('trunk', 0.3), { kind: 'branch', name: 'tee', branches: [{ route: [arm('side', 0.1)], receiver: { name: 'rx2', parts: [part({ r: 50 })] } }] }, arm('main', 0.2)],
        receiver: [part({ r: 50 })],
        duration: 5e-9,
      }),
      { routeMap: {} },
    ).routeMap!;
    const s = new Surface(1200, 800);
    const d = drawRouteMap(s, { x: 0, y: 0, w: 1200, h: 800 }, { title: 'tee', routeMap: rm, zoom: 'none' });
    const [main, branch] = d.panels!;
    expect(d.panels).toHaveLength(2);
    expect(main.x.domain[1]).toBeCloseTo(0.5, 2); // trunk + main
    expect(branch.x.domain[1]).toBeCloseTo(0.4, 2); // trunk + side
    expect(branch.plot.x).toBeGreaterThan(main.plot.x + main.plot.w);
    // 0.35 m along each path, 0.5 ns after the front passed: 1/3 V on both arms (and the same scale)
    const t = 0.2e-9 + 0.0625e-9 + 0.35 * TPD + 0.5e-9;
    for (const f of [main, branch]) {
      const v = pixelValue(s, Math.round(f.x.map(0.35)), Math.round(f.y.map(t)), d.range);
      expect(Math.abs(v - 1 / 3)).toBeLessThan(0.02); // 8-bit colour: about 1/255 of the ±0.5 V range
    }
  });
});
