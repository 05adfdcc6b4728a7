import { describe, expect, it } from 'vitest';
import { simulate } from '../../sim/simulate.js';
import { lineOf, net, part, stepSignal } from '../support/nets.js';

// The wave launched by the driver travels at v = 1/√(L′C′); an open end reflects it with Γ = +1 and a
// short with Γ = −1 (textbook reflection coefficient, Pozar, Microwave Engineering, ch. 2).
describe('route map', () => {
  const tpd = 5e-9;
  const length = 0.3;
  const run = (receiver: ReturnType<typeof part>[]) =>
    simulate(
      net({
        signal: stepSignal(1, 0.1e-9, 0.2e-9),
        rs: 50,
        route: [{ kind: 'line', name: 'trace', line: lineOf(50, tpd), length }],
        receiver,
        duration: 4e-9,
      }),
      { routeMap: { columns: 100, rows: 400 } },
    ).routeMap!;

  it('bounds its size and records every item with its span', () => {
    const map = run([]);
    expect(map.values.shape[0]).toBeLessThanOrEqual(400);
    expect(map.values.shape[1]).toBeLessThanOrEqual(101);
    expect(map.positions[0]).toBe(0);
    expect(map.positions[map.positions.length - 1]).toBeCloseTo(length, 12);
    expect(map.items).toEqual([{ name: 'trace', kind: 'line', from: 0, to: expect.closeTo(length, 12) }]);
  });

  it('shows the incident wavefront moving at the line velocity and the open-end reflection with the same sign', () => {
    const map = run([]);
    const [rows, cols] = map.values.shape;
    // arrival of the incident wave (first crossing of a quarter of V+ = 0.5 V) at each column
    const arrival = (c: number, level: number, after = 0) => {
      for (let r = Math.max(1, after); r < rows; r++) {
        const a = map.values.get(r - 1, c);
        const b = map.values.get(r, c);
        if ((a - level) * (b - level) <= 0 && a !== b) return (r - 1 + (level - a) / (b - a)) * map.dtRow;
      }
      return NaN;
    };
    const c1 = Math.round(cols * 0.2);
    const c2 = Math.round(cols * 0.7);
    const slope = (arrival(c2, 0.25) - arrival(c1, 0.25)) / (map.positions[c2] - map.positions[c1]);
    expect(slope).toBeCloseTo(tpd, 11); // s/m, within 1e-11 s/m
    // the reflection adds +0.5 V on top of the 0.5 V plateau: crossing 0.75 V later, at (2ℓ − x)/v
    const back = arrival(c1, 0.75, Math.ceil(arrival(c1, 0.25) / map.dtRow) + 1);
    expect(back - arrival(c1, 0.25)).toBeCloseTo(2 * (length - map.positions[c1]) * tpd, 10);
  });

  it('shows a shorted end reflecting with the opposite sign', () => {
    const map = run([part({ r: 0 })]);
    const c = Math.round(map.values.shape[1] * 0.3);
    const t = 0.2e-9 + 0.125e-9 + (2 * length - map.positions[c]) * tpd + 0.3e-9; // after the reflection passed
    const r = Math.round(t / map.dtRow);
    expect(map.values.get(r, c)).toBeCloseTo(0, 6);
    const before = Math.round((0.2e-9 + 0.125e-9 + map.positions[c] * tpd + 0.3e-9) / map.dtRow);
    expect(map.values.get(before, c)).toBeCloseTo(0.5, 6);
  });
});

// A T of three equal 50 Ω lines with matched ends and a matched source: V+ = V/2 runs down the trunk,
// and at the T the wave going on into each arm is (1 + Γ)·V/2 = (2/3)·V/2 = V/3, Γ = −1/3 (lattice
// method, Pozar ch. 2). Each path's columns must show the front at distance/v and that level beyond
// the junction, the branch point listed where the other path leaves.
describe('route map of a branched net', () => {
  const tpd = 5e-9;
  const arm = (name: string, len: number) => ({ kind: 'line' as const, name, line: lineOf(50, tpd), length: len });
  const map = simulate(
    net({
      signal: stepSignal(1, 0.05e-9, 0.1e-9),
      rs: 50,
      route: [arm('trunk', 0.1), { kind: 'branch', name: 'tee', branches: [{ route: [arm('side', 0.06)], receiver: { name: 'rx2', parts: [part({ r: 50 })] } }] }, arm('main', 0.08)],
      receiver: [part({ r: 50 })],
      duration: 2e-9,
    }),
    { routeMap: { columns: 60, rows: 600 } },
  ).routeMap!;

  it('lists one path per receiver with its columns, distances, items and branch point', () => {
    expect(map.paths.map((p) => p.receiver)).toEqual(['receiver', 'rx2']);
    expect(map.paths[0].items.map((i) => i.name)).toEqual(['trunk', 'tee', 'main']);
    expect(map.paths[1].items.map((i) => i.name)).toEqual(['trunk', 'tee', 'side']);
    expect(map.paths[0].junctions).toEqual([{ item: 'tee', at: expect.closeTo(0.1, 12), receivers: ['rx2'] }]);
    expect(map.paths[1].junctions).toEqual([{ item: 'tee', at: expect.closeTo(0.1, 12), receivers: ['receiver'] }]);
    for (const p of map.paths) {
      expect(p.positions[0]).toBe(0);
      for (let k = 1; k < p.positions.length; k++) expect(p.positions[k]).toBeGreaterThanOrEqual(p.positions[k - 1]);
    }
    expect(map.paths[0].positions[map.paths[0].positions.length - 1]).toBeCloseTo(0.18, 12);
    expect(map.paths[1].positions[map.paths[1].positions.length - 1]).toBeCloseTo(0.16, 12);
  });

  it('shows the front at distance/v along each path and V/3 beyond the junction', () => {
    for (const p of map.paths) {
      const n = p.columns.length;
      const c = n - 2; // near the receiver end, past the junction
      const x = p.positions[c];
      const t = 0.1e-9 + 0.0625e-9 / 2 + x * tpd; // the ramp's middle arrives at x/v
      const r = Math.round(t / map.dtRow);
      expect(map.values.get(r - 10, p.columns[c])).toBeCloseTo(0, 3);
      expect(map.values.get(r + 40, p.columns[c])).toBeCloseTo(1 / 3, 3);
    }
  });
});
