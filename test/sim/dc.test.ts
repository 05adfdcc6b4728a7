import { describe, expect, it } from 'vitest';
import { solveDc } from '../../sim/dc.js';
import { buildLadder } from '../../sim/ladder.js';
import { prepareRun, simulate } from '../../sim/simulate.js';
import type { Net } from '../../sim/model.js';
import { lineOf, net, part, stepSignal } from '../support/nets.js';
import { probeTrace } from '../../sim/result.js';

function dcOf(n: Net, source: number) {
  const run = prepareRun(n);
  const ladder = buildLadder(run.circuit, run.plan);
  return { ladder, dc: solveDc(ladder, Float64Array.of(source)) };
}

describe('DC operating point', () => {
  // Lossy line at DC: V(x) = V(0)·[cosh γ(ℓ−x) + (Zc/ZL) sinh γ(ℓ−x)] / [cosh γℓ + (Zc/ZL) sinh γℓ],
  // γ = √(R′G′), Zc = √(R′/G′) (steady-state solution of the telegrapher equations; Pozar, Microwave
  // Engineering, ch. 2, lossy lines, with jω → 0). The ladder converges to it as ΔZ² (midpoint rule).
  it('matches the cosh/sinh form of a lossy line within 0.05 %', () => {
    const r = 40; // Ω/m
    const g = 0.02; // S/m
    const length = 2;
    const rs = 10;
    const rl = 100;
    const vs = 5;
    const n = net({
      signal: stepSignal(0, 1e-9, 10e-9, vs),
      rs,
      route: [{ kind: 'line', name: 'cable', line: lineOf(50, 5e-9, r, g), length }],
      receiver: [part({ r: rl })],
      cellsPerRise: 20,
    });
    const { ladder, dc } = dcOf(n, vs);
    const gamma = Math.sqrt(r * g);
    const zc = Math.sqrt(r / g);
    const zin = (zc * (rl + zc * Math.tanh(gamma * length))) / (zc + rl * Math.tanh(gamma * length));
    const v0 = (vs * zin) / (rs + zin);
    const shape = (x: number) =>
      (Math.cosh(gamma * (length - x)) + (zc / rl) * Math.sinh(gamma * (length - x))) /
      (Math.cosh(gamma * length) + (zc / rl) * Math.sinh(gamma * length));
    const cells = ladder.nodes - 1;
    for (const k of [0, Math.floor(cells / 3), cells]) {
      const exact = v0 * shape((k / cells) * length);
      expect(Math.abs(dc.v[k] - exact) / exact).toBeLessThan(5e-4);
    }
    // Kirchhoff's current law at the receiver node: the last cell's current feeds RL and the node's half-cell G
    expect(dc.i[cells]).toBeCloseTo(dc.v[cells] * (1 / rl + ladder.nodeG[cells]), 12);
  });

  // Split (Thevenin) termination 220 Ω to 3.3 V and 330 Ω to ground: open-circuit voltage
  // 3.3·330/550 = 1.98 V (voltage divider, Ohm's law).
  it('settles a split termination at its divider voltage, and the run starts there', () => {
    const n = net({
      signal: stepSignal(0, 0.5e-9, 5e-9, 0), // a constant 0 V source through a high resistance
      rs: 1e9,
      route: [{ kind: 'line', name: 't', line: lineOf(50, 6e-9), length: 0.1 }],
      receiver: [part({ r: 220, rail: 3.3 }), part({ r: 330 })],
      duration: 3e-9,
    });
    const res = simulate(n);
    const v = probeTrace(res.record, 1);
    const expected = 3.3 * (330 / 550) * (1 / (1 + (220 * 330) / 550 / 1e9));
    for (let i = 0; i < v.length; i++) expect(Math.abs(v[i] - expected)).toBeLessThan(1e-9);
  });

  it('starts a net that idles high settled, so a falling edge begins without a transient', () => {
    const n = net({
      signal: stepSignal(0, 0.5e-9, 4e-9, 3.3),
      rs: 20,
      route: [
        { kind: 'line', name: 'a', line: lineOf(60, 6e-9, 5, 1e-4), length: 0.15 },
        { kind: 'series', name: 'r1', part: part({ r: 22, l: 1e-9 }) },
        { kind: 'shunt', name: 'via', parts: [part({ c: 0.5e-12 })] },
        { kind: 'line', name: 'b', line: lineOf(45, 6e-9), length: 0.1 },
      ],
      receiver: [part({ r: 100, rail: 1.2 }), part({ c: 3e-12 }), part({ r: 56, c: 100e-12 })],
      duration: 4e-9,
      probes: [
        { name: 'drv', at: 'driver' },
        { name: 'mid', at: 'line', item: 'a', position: 0.07 },
        { name: 'rx', at: 'receiver' },
      ],
    });
    const res = simulate(n);
    for (let p = 0; p < 3; p++) {
      const v = probeTrace(res.record, p);
      for (let i = 1; i < v.length; i++) expect(Math.abs(v[i] - v[0])).toBeLessThan(1e-9);
    }
  });

  it('reports an ideal source shorted through zero-ohm paths as a net error', () => {
    const n = net({
      signal: stepSignal(1, 1e-9, 0, 1),
      rs: 0,
      route: [{ kind: 'line', name: 't', line: lineOf(50, 5e-9), length: 0.1 }],
      receiver: [part({ r: 0 })],
    });
    expect(() => simulate(n)).toThrow(/ideal sources or rails/);
  });
});

describe('DC start on the node graph', () => {
  // An ideal (0 Ω) source through a 0 Ω series part onto a lossless line: the source fixes every node
  // of the route at its level (Kirchhoff's voltage law: no drop across zero resistances), and the
  // current is what the receiver draws, 2 V / 100 Ω (Ohm's law).
  it('holds a 0 Ω driver, a 0 Ω series part and a lossless line at the source level, with the load current everywhere', () => {
    const n = net({
      signal: stepSignal(0, 1e-9, 5e-9, 2),
      rs: 0,
      route: [
        { kind: 'series', name: 'r0', part: part({ r: 0 }) },
        { kind: 'line', name: 't', line: lineOf(50, 5e-9), length: 0.1 },
      ],
      receiver: [part({ r: 100 })],
    });
    const { ladder, dc } = dcOf(n, 2);
    for (let k = 0; k < ladder.slots; k++) expect(dc.v[k]).toBe(2);
    const seg = ladder.segments[0];
    for (let j = 0; j < seg.cells; j++) expect(dc.i[seg.base + 1 + j]).toBeCloseTo(0.02, 15);
    // the source and the 0 Ω part carry the same current as the load
    expect(ladder.lumped.map((b) => b.role)).toEqual(['driver', 'series', 'receiver']);
    for (const i of dc.lumped) expect(i).toBeCloseTo(0.02, 15);
  });

  // A line of R′ only (G′ = 0) between a source and a load is the resistor R′ℓ: the node voltages fall
  // linearly along it (Ohm's law), and the run starts there and stays.
  it('drops linearly along a series-resistive line and starts the run stationary', () => {
    const n = net({
      signal: stepSignal(0, 1e-9, 5e-9, 1),
      rs: 10,
      route: [{ kind: 'line', name: 't', line: lineOf(50, 5e-9, 100), length: 0.5 }],
      receiver: [part({ r: 40 })],
      duration: 3e-9,
      probes: [{ name: 'mid', at: 'line', item: 't', position: 0.25 }],
    });
    const { ladder, dc } = dcOf(n, 1);
    const current = 1 / (10 + 50 + 40);
    const cells = ladder.segments[0].cells;
    for (let k = 0; k <= cells; k++) expect(dc.v[k]).toBeCloseTo(1 - current * (10 + (50 * k) / cells), 13);
    const mid = probeTrace(simulate(n).record, 0);
    for (const x of mid) expect(x).toBeCloseTo(1 - current * (10 + 25), 12);
  });
});

describe('DC start on a long lossy line', () => {
  // The same cosh/sinh closed form as above (Pozar ch. 2, jω → 0), on a line of 20 000 cells with both R′
  // and G′: the node equations are then badly conditioned (ratio of a cell's conductance to a node's
  // leakage ≈ 1e10), and only a well-conditioned elimination keeps the input voltage to 1e-9. The ladder
  // differs from the continuous line by (γΔZ)² ≈ 5e-11 here.
  it('matches the closed form to 1e-9 with 20 000 cells', () => {
    const r = 2;
    const g = 1e-4;
    const length = 10;
    const rs = 25;
    const rl = 100;
    const n = net({ signal: stepSignal(0, 50e-12, 1e-9, 1), rs, route: [{ kind: 'line', name: 'c', line: lineOf(50, 5e-9, r, g), length }], receiver: [part({ r: rl })] });
    const { ladder, dc } = dcOf(n, 1);
    expect(ladder.segments[0].cells).toBe(20000);
    const gamma = Math.sqrt(r * g);
    const zc = Math.sqrt(r / g);
    const t = Math.tanh(gamma * length);
    const zin = (zc * (rl + zc * t)) / (zc + rl * t);
    const v0 = zin / (rs + zin);
    const vl = v0 / (Math.cosh(gamma * length) + (zc / rl) * Math.sinh(gamma * length));
    expect(Math.abs(dc.v[0] - v0) / v0).toBeLessThan(1e-9);
    expect(Math.abs(dc.v[20000] - vl) / vl).toBeLessThan(1e-9);
  });
});
