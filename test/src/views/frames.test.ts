// Animation frames: which instants are shown, the shared voltage axis, file names, and the images.
import ndarray from 'ndarray';
import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import type { RouteMapRecord } from '../../../sim/result.js';
import { simulate } from '../../../sim/simulate.js';
import { activeRows, firstBurstRows, FRAME_FILE_PATTERN, frameFileName, frameRows, frameVoltageDomain, renderFrames, routeMarks } from '../../../src/views/frames.js';
import { lineOf, net, part, stepSignal } from '../../support/nets.js';

describe('frame instants', () => {
  it('spread evenly from the first row to the last', () => {
    expect(frameRows(901, 4)).toEqual([0, 300, 600, 900]);
    expect(frameRows(10, 1)).toEqual([9]);
    const rows = frameRows(900, 60);
    expect(rows[0]).toBe(0);
    expect(rows[59]).toBe(899);
    for (let i = 1; i < rows.length; i++) expect(rows[i] - rows[i - 1]).toBeGreaterThanOrEqual(15);
  });

  it('name files frame-0001.png … in playing order, widening past 9999', () => {
    expect(frameFileName(0, 12)).toBe('frame-0001.png');
    expect(frameFileName(11, 12)).toBe('frame-0012.png');
    expect(frameFileName(0, 12000)).toBe('frame-00001.png');
    expect(FRAME_FILE_PATTERN.test('frame-0007.png')).toBe(true);
    expect(FRAME_FILE_PATTERN.test('frames.png')).toBe(false);
  });
});

describe('frames of a matched line', () => {
  // 1 V step through 50 Ω into a 1 m, 50 Ω line (5 ns) with a 50 Ω load: a 0.5 V wave travels to the far
  // end and nothing reflects (Pozar, Microwave Engineering, §2.3–2.4).
  const n = net({
    signal: stepSignal(1, 200e-12, 0.5e-9),
    rs: 50,
    route: [
      { kind: 'line', name: 'first', line: lineOf(50, 5e-9), length: 0.5 },
      { kind: 'shunt', name: 'pad', parts: [part({ c: 1e-15 })] },
      { kind: 'line', name: 'second', line: lineOf(50, 5e-9), length: 0.5 },
    ],
    receiver: [part({ r: 50 })],
    duration: 10e-9,
  });
  const map = simulate(n, { routeMap: {} }).routeMap as RouteMapRecord;

  it('share one voltage axis that holds every value of the run', () => {
    const [lo, hi] = frameVoltageDomain(map);
    let min = Infinity, max = -Infinity;
    for (const v of map.values.data) {
      min = Math.min(min, v);
      max = Math.max(max, v);
    }
    expect(lo).toBeLessThan(min);
    expect(hi).toBeGreaterThan(max);
    expect(max).toBeCloseTo(0.5, 2); // the incident wave Vs·Z0/(Rs + Z0)
  });

  it('mark the joint between the segments and label the lumped part', () => {
    const { markers, annotations } = routeMarks(map, 1);
    expect(markers.some((m) => Math.abs(m.at - 0.5) < 1e-9 && m.label === 'pad')).toBe(true);
    expect(annotations.map((a) => a.text)).toEqual(['first', 'second']);
    // a segment too narrow for its name is left unlabelled
    expect(routeMarks(map, 1, (name) => name !== 'first').annotations.map((a) => a.text)).toEqual(['second']);
  });

  it('render one PNG per frame at the requested size', async () => {
    const pngs = await renderFrames({ title: 'Matched line', routeMap: map, count: 3, width: 640, height: 360 });
    expect(pngs).toHaveLength(3);
    for (const p of pngs) expect([PNG.sync.read(p).width, PNG.sync.read(p).height]).toEqual([640, 360]);
  });

  it('cover the interval where the route is active, not the settled tail', () => {
    // The 0.5 V wave leaves the driver with the ramp (0.5 ns to 0.75 ns) and is absorbed by the matched
    // load at TD = 5 ns later (Pozar §2.3–2.4: Γ = 0, nothing comes back): after about 5.75 ns every point
    // sits at 0.5 V, so the last 4 ns of the 10 ns run show nothing new.
    const [a, b] = activeRows(map);
    expect(a * map.dtRow).toBeLessThanOrEqual(0.5e-9);
    expect(a * map.dtRow).toBeGreaterThan(0.3e-9);
    expect(b * map.dtRow).toBeGreaterThan(5.5e-9);
    expect(b * map.dtRow).toBeLessThan(6.2e-9);
    const rows = frameRows(map.values.shape[0], 5, [a, b]);
    expect(rows[0]).toBe(a);
    expect(rows[4]).toBe(b);
  });

  it('refuses a frame count below 1', () => {
    expect(() => frameRows(map.values.shape[0], 0)).toThrow(RangeError);
    expect(() => frameRows(0, 3)).toThrow(RangeError);
  });
});

describe('activeRows on hand-made maps', () => {
  const mapOf = (rows: number[][]): RouteMapRecord => ({
    positions: Float64Array.from(rows[0].map((_, j) => j)),
    dtRow: 1,
    values: ndarray(Float64Array.from(rows.flat()), [rows.length, rows[0].length]),
    items: [],
    paths: [],
  });
  it('a route that never settles (a clock) is active to the end', () => {
    expect(activeRows(mapOf([[0, 0], [0, 0], [1, 0], [1, 1], [0, 1], [0, 0], [1, 0]]))).toEqual([1, 6]);
  });
  it('a route that settles is active from the row before it moves to the first row that stays settled', () => {
    expect(activeRows(mapOf([[0, 0], [0, 0], [0, 0], [1, 0], [1, 1], [1, 1], [1, 1], [1, 1]]))).toEqual([2, 4]);
  });
  it('a map that never changes is shown whole', () => {
    expect(activeRows(mapOf([[2, 2], [2, 2], [2, 2]]))).toEqual([0, 2]);
  });
});

describe('firstBurstRows on hand-made maps', () => {
  const mapOf = (rows: number[][]): RouteMapRecord => ({
    positions: Float64Array.from(rows[0].map((_, j) => j)),
    dtRow: 1,
    values: ndarray(Float64Array.from(rows.flat()), [rows.length, rows[0].length]),
    items: [],
    paths: [],
  });
  const hold = (row: number[], n: number) => Array.from({ length: n }, () => row);
  it('a repeating source: from the row before the first edge to where the route is still before the next', () => {
    // 20 rows, a quiet stretch of 20 % = 4 rows: the first edge moves rows 2–3, still from row 3 to 9
    const m = mapOf([[0, 0], [0, 0], [1, 0], ...hold([1, 1], 7), [0, 1], ...hold([0, 0], 7), [1, 0], [1, 1]]);
    expect(activeRows(m)).toEqual([1, 19]);
    expect(firstBurstRows(m, undefined, 0.2)).toEqual([1, 3]);
  });
  it('a pause shorter than the quiet stretch is part of the burst', () => {
    const m = mapOf([[0, 0], [1, 0], [1, 1], [1, 1], [1, 2], ...hold([1, 2], 10), [0, 2], [0, 0]]);
    expect(firstBurstRows(m, undefined, 0.2)).toEqual([0, 4]);
  });
  it('a single edge that settles, or a route never still, gives activeRows', () => {
    const step = mapOf([[0, 0], [0, 0], [0, 0], [1, 0], [1, 1], [1, 1], [1, 1], [1, 1]]);
    expect(firstBurstRows(step)).toEqual(activeRows(step));
    const busy = mapOf([[0, 0], [0, 0], [1, 0], [1, 1], [0, 1], [0, 0], [1, 0], [1, 1], [0, 1], [0, 0]]);
    expect(firstBurstRows(busy)).toEqual(activeRows(busy));
  });
});

describe('frames of a clock on a matched line', () => {
  // 1 V clock, period 40 ns, through 50 Ω into a 1 m, 50 Ω line (TD 5 ns) with a 50 Ω load: each edge
  // sends a 0.5 V wave that the matched load absorbs (Pozar, Microwave Engineering, §2.3–2.4), so the
  // route is still from ~5 ns after each edge until the next one, 20 ns later. The frames show the first
  // edge's crossing, not five clock edges 20 ns apart that all look the same.
  const n = net({
    signal: { kind: 'clock', low: 0, high: 1, period: 40e-9, rise: 200e-12, fall: 200e-12, duty: 0.5, start: 0.5e-9 },
    rs: 50,
    route: [{ kind: 'line', name: 'trace', line: lineOf(50, 5e-9), length: 1 }],
    receiver: [part({ r: 50 })],
    duration: 100e-9,
  });
  const map = simulate(n, { routeMap: {} }).routeMap as RouteMapRecord;
  it('cover the first edge until the wave is absorbed', () => {
    const [a, b] = firstBurstRows(map);
    expect(activeRows(map)[1] * map.dtRow).toBeGreaterThan(80e-9);
    expect(a * map.dtRow).toBeLessThanOrEqual(0.5e-9);
    // the ramp (0.5 ns to 0.75 ns) reaches the load at 5.5–5.75 ns; allow a row and the 0.5 % tolerance
    expect(b * map.dtRow).toBeGreaterThan(5.4e-9);
    expect(b * map.dtRow).toBeLessThan(6.2e-9);
  });
});

describe('routeMarks on a hand-made map', () => {
  it('does not mark the route ends as boundaries', () => {
    const m: RouteMapRecord = {
      positions: Float64Array.from([0, 1]),
      dtRow: 1e-9,
      values: ndarray(new Float64Array(4), [2, 2]),
      items: [{ name: 'only', kind: 'line', from: 0, to: 1 }],
      paths: [],
    };
    expect(routeMarks(m, 0).markers).toEqual([]);
  });
});
