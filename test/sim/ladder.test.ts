import { describe, expect, it } from 'vitest';
import { compileNet } from '../../sim/circuit.js';
import { discretize as discretizeCircuit } from '../../sim/discretize.js';
import { buildLadder as buildCircuitLadder } from '../../sim/ladder.js';
import type { Net } from '../../sim/model.js';
import type { Discretization } from '../../sim/result.js';
import { lineOf, net, part, stepSignal } from '../support/nets.js';

const discretize = (n: Net) => discretizeCircuit(compileNet(n));
const buildLadder = (n: Net, plan: Discretization) => buildCircuitLadder(compileNet(n), plan);

describe('ladder cells', () => {
  // Per-unit-length scaling, a fact of the trade: 1 000 Ω spread over 1 m is 1 Ω per mm, so a cell of
  // length ΔZ carries R′ΔZ, L′ΔZ, G′ΔZ and C′ΔZ.
  it('scales per-unit-length values by the cell length', () => {
    const line = { r: 1000, l: 250e-9, g: 2e-3, c: 100e-12 };
    // 1 m at 5 ns/m; a 0.1 ns edge at 20 steps per rise gives 5 ps cells: 1 000 cells of 1 mm
    const n = net({ signal: stepSignal(1, 0.1e-9), rs: 50, route: [{ kind: 'line', name: 't', line, length: 1 }] });
    const plan = discretize(n);
    expect(plan.segments[0].cells).toBe(1000);
    expect(plan.segments[0].cellLength).toBeCloseTo(1e-3, 15);
    const ladder = buildLadder(n, plan);
    const seg = ladder.segments[0];
    expect(seg.line.r * seg.cellLength).toBeCloseTo(1, 12);
    expect(seg.line.l * seg.cellLength).toBeCloseTo(250e-12, 22);
    // interior nodes carry a whole cell's C and G, the two ends half a cell's
    expect(ladder.nodeC[1]).toBeCloseTo(100e-15, 25);
    expect(ladder.nodeC[0]).toBeCloseTo(50e-15, 25);
    expect(ladder.nodeG[1000]).toBeCloseTo(1e-6, 15);
    const sum = (a: Float64Array) => a.reduce((s, x) => s + x, 0);
    expect(seg.cells * seg.line.r * seg.cellLength).toBeCloseTo(1000, 8);
    expect(sum(ladder.nodeC)).toBeCloseTo(100e-12, 20);
  });

  it('joins two segments at a node holding both half cells, and puts series parts on a branch of their own', () => {
    const n = net({
      signal: stepSignal(1, 0.1e-9),
      rs: 50,
      route: [
        { kind: 'line', name: 'a', line: lineOf(50, 5e-9), length: 0.01 },
        { kind: 'line', name: 'b', line: lineOf(100, 5e-9), length: 0.01 },
        { kind: 'series', name: 'r1', part: part({ r: 33 }) },
        { kind: 'shunt', name: 'via', parts: [part({ c: 1e-12 })] },
      ],
      receiver: [part({ r: 1e3 })],
    });
    const plan = discretize(n);
    const ladder = buildLadder(n, plan);
    const [a, b] = plan.segments;
    expect(ladder.nodeC[a.cells]).toBeCloseTo((5e-9 / 50) * a.cellLength / 2 + (5e-9 / 100) * b.cellLength / 2, 24);
    // the series part joins the last line node to a node of its own, which the shunt hangs on
    const r1 = ladder.lumped.find((l) => l.item === 'r1')!;
    expect([r1.p, r1.q]).toEqual([a.cells + b.cells, a.cells + b.cells + 1]);
    expect(ladder.lumped.find((l) => l.item === 'via')!.p).toBe(a.cells + b.cells + 1);
    expect(ladder.lumped.map((l) => l.role)).toEqual(['driver', 'series', 'shunt', 'receiver']);
    // the junction of a and b meets the last cell of a (flowing in) and the first of b (flowing out)
    expect(ladder.ends.get(a.cells)).toEqual([
      { cell: a.cells, sign: 1 },
      { cell: a.cells + 1, sign: -1 },
    ]);
  });
});

describe('time step and cell counts', () => {
  // Courant–Friedrichs–Lewy: the leapfrog scheme is stable for v·Δt/Δz ≤ 1 (Taflove & Hagness,
  // Computational Electrodynamics, ch. 2); at least cellsPerRise steps per rise time (our rule).
  it('keeps every segment at Courant ≤ 1, the limiting one at 1, and resolves the edge', () => {
    const n = net({
      signal: stepSignal(1, 300e-12),
      rs: 50,
      route: [
        { kind: 'line', name: 'long', line: lineOf(50, 6.5e-9), length: 0.173 },
        { kind: 'line', name: 'short', line: lineOf(70, 5.8e-9), length: 0.0041 },
        { kind: 'line', name: 'cable', line: lineOf(75, 5e-9), length: 1.37 },
      ],
      cellsPerRise: 20,
    });
    const plan = discretize(n);
    expect(plan.dt).toBeLessThanOrEqual(300e-12 / 20);
    for (const s of plan.segments) {
      expect(s.courant).toBeLessThanOrEqual(1 + 1e-12);
      expect(s.delay / s.cells).toBeLessThanOrEqual(300e-12 / 20 + 1e-24); // a cell's delay resolves the edge
    }
    expect(Math.max(...plan.segments.map((s) => s.courant))).toBeCloseTo(1, 12);
    expect(plan.steps).toBe(Math.ceil(plan.duration / plan.dt - 1e-9));
  });
});
