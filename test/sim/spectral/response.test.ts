// The time-response machinery: the plan's documented bounds, DC-only nets, and compareRecords.
import ndarray from 'ndarray';
import { describe, expect, it } from 'vitest';
import { RunRefused } from '../../../sim/errors.js';
import type { ProbeRecord } from '../../../sim/result.js';
import { compareRecords } from '../../../sim/spectral/compare.js';
import { planSpectral, spectralRun } from '../../../sim/spectral/response.js';
import { lineOf, net, part, stepSignal } from '../../support/nets.js';
import { probeTrace } from '../../../sim/result.js';

const lineNet = (signal = stepSignal(1, 100e-12, 0.2e-9)) =>
  net({ signal, rs: 25, route: [{ kind: 'line', name: 't', line: lineOf(50, 6e-9, 2), length: 0.1 }], receiver: [part({ r: 100, rail: 1 })] });

describe('planSpectral', () => {
  it('puts output samples on the grid, pads the window, and sets σ = ln(1/ε)/T', () => {
    const p = planSpectral(lineNet(), { dtSample: 7e-12, samples: 1000 });
    expect(p.oversample).toBe(Math.ceil(7e-12 / (100e-12 / 200)));
    expect(p.step * p.oversample).toBeCloseTo(7e-12, 24);
    expect(p.points & (p.points - 1)).toBe(0);
    expect(p.window).toBeGreaterThanOrEqual(2 * p.needed);
    expect(Math.exp(-p.sigma * p.window)).toBeCloseTo(1e-6, 12);
    expect(p.amplification).toBeLessThanOrEqual(1e3 * (1 + 1e-12)); // ε^(−1/2) at most with pad 2
  });

  it('coarsens the grid to fit the size limit, and refuses when even dtSample does not fit', () => {
    const p = planSpectral(lineNet(), { dtSample: 50e-12, samples: 5000, maxPoints: 2 ** 16 });
    expect(p.points).toBeLessThanOrEqual(2 ** 16);
    expect(() => planSpectral(lineNet(), { dtSample: 50e-12, samples: 50000, maxPoints: 2 ** 16 })).toThrow(RunRefused);
  });
});

describe('spectralRun', () => {
  it('returns the DC operating point on every sample for a constant source', () => {
    const run = spectralRun(lineNet(stepSignal(3, 1e-10, 0, 3)), { dtSample: 1e-11, samples: 50 });
    for (let p = 0; p < 2; p++) for (const v of probeTrace(run.record, p)) expect(v).toBe(run.dc[p]);
    // 3 V through 25 Ω and 0.2 Ω of line into 100 Ω to a 1 V rail (Ohm's law)
    expect(run.dc[1]).toBeCloseTo(1 + (2 * 100) / 125.2, 12);
  });
});

describe('compareRecords', () => {
  const rec = (names: string[], dt: number, rows: number[][]): ProbeRecord => ({
    names,
    dtSample: dt,
    values: ndarray(Float64Array.from(rows.flat()), [rows.length, rows[0].length]),
  });

  it('reports the largest difference per probe, its percent of swing and its time, matching by name', () => {
    const a = rec(['x', 'y'], 1e-9, [
      [0, 1, 2, 3],
      [5, 5, 5, 5],
    ]);
    const b = rec(['y', 'x', 'z'], 1e-9, [
      [5, 5.1, 5, 5],
      [0, 1, 2.5, 3],
      [9, 9, 9, 9],
    ]);
    const d = compareRecords(a, b, 2);
    expect(d.map((x) => x.name)).toEqual(['x', 'y']);
    expect(d[0].maxAbs).toBeCloseTo(0.5, 12);
    expect(d[0].percentOfSwing).toBeCloseTo(25, 10);
    expect(d[0].time).toBeCloseTo(2e-9, 20);
    expect(d[1].maxAbs).toBeCloseTo(0.1, 12);
    expect(d[1].time).toBeCloseTo(1e-9, 20);
  });

  it('interpolates the second record when the sample intervals differ', () => {
    const a = rec(['x'], 1e-9, [[0, 1, 2, 3, 4]]);
    const b = rec(['x'], 2e-9, [[0, 2, 4.4]]); // a ramp, then 0.4 V high at t = 4 ns
    const [d] = compareRecords(a, b, 4);
    expect(d.maxAbs).toBeCloseTo(0.4, 12);
    expect(d.time).toBeCloseTo(4e-9, 20);
    expect(d.samples).toBe(5);
  });
});
