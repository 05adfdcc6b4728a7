import { describe, expect, it } from 'vitest';
import { simulate } from '../../sim/simulate.js';
import { net, part } from '../support/nets.js';
import { probeTrace } from '../../sim/result.js';

// C. R. Paul, Analysis of Multiconductor Transmission Lines (2nd ed.), FDTD chapter worked example:
// a 400 m line with L = 0.25 µH/m and C = 100 pF/m (Z0 = 50 Ω, v = 2e8 m/s, TD = 2 µs), source
// resistance 150 Ω, shorted load, driven by a 100 V pulse 6 µs wide. The source-end voltage steps
// through the plateaus below, each lasting one round trip (4 µs) after the first 4 µs.
const PLATEAUS = [25, -12.5, -37.5, -18.75, 18.75, 9.375, -9.375, -4.6875];

describe('Paul FDTD worked example (400 m line, 150 Ω source, shorted load)', () => {
  it('reproduces the source-end plateaus within 0.2 % of the 100 V swing', () => {
    // A fast pulse (50 ns ramps) approximates the example's ideal pulse; plateaus are read mid-way.
    const res = simulate(
      net({
        signal: { kind: 'pulse', from: 0, to: 100, start: 0, rise: 40e-9, width: 6e-6, fall: 40e-9 },
        rs: 150,
        route: [{ kind: 'line', name: 'cable', line: { r: 0, l: 0.25e-6, g: 0, c: 100e-12 }, length: 400 }],
        receiver: [part({ r: 0 })],
        duration: 20e-6,
      }),
    );
    const v = probeTrace(res.record, 0);
    const dts = res.record.dtSample;
    // Plateau k holds from the k-th event (0, 4, 6, 8, 10, 12, 14, 16 µs): read 1 µs into each.
    const readAt = [1, 5, 7, 9, 11, 13, 15, 17].map((t) => v[Math.round((t * 1e-6) / dts)]);
    readAt.forEach((got, k) => expect(Math.abs(got - PLATEAUS[k])).toBeLessThan(0.2));
    expect(res.discretization.segments[0].z0).toBeCloseTo(50, 9);
    expect(res.discretization.segments[0].delay).toBeCloseTo(2e-6, 15);
  });
});
