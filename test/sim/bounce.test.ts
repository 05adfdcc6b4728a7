import { describe, expect, it } from 'vitest';
import { simulate } from '../../sim/simulate.js';
import { signalFunction } from '../../sim/signals.js';
import { latticeVoltage } from '../support/lattice.js';
import { lineOf, net, part, stepSignal } from '../support/nets.js';
import { probeTrace } from '../../sim/result.js';

// Lossless line with resistive ends and a ramp source, against the bounce (lattice) diagram solution
// (Pozar, Microwave Engineering, ch. 2; Johnson & Graham, High-Speed Digital Design, ch. 4).
// Tolerance: 0.2 % of the source swing at every sample, at the source end, mid-line and load end.
const Z0 = 50;
const TPD = 5e-9; // 5 ns/m
const SWING = 1;

interface Case {
  name: string;
  rs: number;
  rl: number;
  /** Segments of the same line; short ones set Δt and leave others below Courant 1. */
  split?: number[];
}

const cases: Case[] = [
  { name: 'Rs < Z0, open load', rs: 10, rl: Infinity },
  { name: 'Rs = Z0, open load', rs: 50, rl: Infinity },
  { name: 'Rs > Z0, open load', rs: 150, rl: Infinity },
  { name: 'Rs < Z0, shorted load', rs: 20, rl: 0 },
  { name: 'Rs > Z0, resistive load', rs: 90, rl: 200 },
  { name: 'Rs < Z0, open load, Courant < 1 in one segment', rs: 25, rl: Infinity, split: [0.2, 0.00144, 0.0024] },
  { name: 'Rs > Z0, low load, Courant < 1 in one segment', rs: 120, rl: 15, split: [0.0024, 0.2, 0.0013] },
];

describe('lossless line against the lattice diagram', () => {
  for (const c of cases) {
    it(c.name, () => {
      const lengths = c.split ?? [0.3];
      const total = lengths.reduce((a, b) => a + b, 0);
      const signal = stepSignal(SWING, 200e-12, 0.1e-9);
      const line = lineOf(Z0, TPD);
      const route = lengths.map((length, k) => ({ kind: 'line' as const, name: `t${k}`, line, length }));
      const receiver = c.rl === Infinity ? [] : [part({ r: c.rl })];
      // probe at mid-line, in whichever segment holds the point total/2
      let before = 0;
      let k = 0;
      while (before + lengths[k] < total / 2) before += lengths[k++];
      const midItem = `t${k}`;
      const midPos = total / 2 - before;
      const res = simulate(
        net({
          signal,
          rs: c.rs,
          route,
          receiver,
          duration: 12 * total * TPD,
          cellsPerRise: 25,
          probes: [
            { name: 'src', at: 'driver' },
            { name: 'mid', at: 'line', item: midItem, position: midPos },
            { name: 'load', at: 'receiver' },
          ],
        }),
      );
      if (c.split) expect(Math.min(...res.discretization.segments.map((s) => s.courant))).toBeLessThan(0.95);
      const ref = { z0: Z0, delay: total * TPD, rs: c.rs, rl: c.rl, source: signalFunction(signal) };
      const dts = res.record.dtSample;
      [0, 0.5, 1].forEach((x, p) => {
        const v = probeTrace(res.record, p);
        const r = Float64Array.from(v, (_, i) => latticeVoltage(ref, x, i * dts));
        // Below Courant 1 leapfrog rounds the corners of a ramp (numerical dispersion, Taflove & Hagness,
        // Computational Electrodynamics, ch. 2): samples within 3 Δt of a corner of the exact waveform
        // get a looser 1 % bound; everywhere else 0.2 %.
        const corner = new Uint8Array(v.length);
        for (let i = 1; i < v.length - 1; i++) {
          if (Math.abs(r[i + 1] - 2 * r[i] + r[i - 1]) > 1e-9) for (let j = Math.max(0, i - 3); j <= Math.min(v.length - 1, i + 3); j++) corner[j] = 1;
        }
        let worst = 0;
        let worstCorner = 0;
        for (let i = 0; i < v.length; i++) {
          const e = Math.abs(v[i] - r[i]) / SWING;
          if (corner[i] && c.split) worstCorner = Math.max(worstCorner, e);
          else worst = Math.max(worst, e);
        }
        expect(worst).toBeLessThan(0.002);
        expect(worstCorner).toBeLessThan(0.01);
      });
    });
  }
});
