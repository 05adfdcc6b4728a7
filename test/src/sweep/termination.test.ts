// Sweeps against outside references: the series-termination rule, the lattice (bounce) diagram and
// the "long line" rule of thumb.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runSweep } from '../../../src/sweep/index.js';
import { parseSweepCsv } from '../../../src/sweep/table.js';
import { latticeVoltage } from '../../support/lattice.js';
import { RINGING_NET, SERIES_NET, TempDirs, writeJson } from './fixtures.js';

const tmp = new TempDirs();
afterAll(() => tmp.cleanup());

function column(csvText: string, name: string): (number | null)[] {
  const t = parseSweepCsv(csvText);
  const j = t.header.indexOf(name);
  expect(j, `column ${name}`).toBeGreaterThanOrEqual(0);
  return t.rows.map((r) => r[j]!);
}

describe('series termination: the best series resistor is Z0 − R_out', () => {
  // Johnson & Graham, High-Speed Digital Design (1993), series (source) termination: the resistor
  // plus the driver's output resistance should equal Z0, so the reflection from the open end is
  // absorbed at the source. Here Z0 = 50 Ω, R_out = 12 Ω: the rule gives 38 Ω.
  //
  // Overshoot alone cannot pick it: it is 0 for every resistor ≥ Z0 − R_out (an over-terminated line
  // climbs in steps). Settling into a tight band can: the first arrival at the open end is
  // 2·Z0/(Z0 + R_total) of the swing, inside ±1 % only when |Z0 − R_total| ≤ ≈ 1 Ω; every other value
  // needs further round trips of 2·TD = 2 ns. Tolerance: ±2 Ω (the ±1 Ω band plus the 1 Ω grid step).
  it('--pick "minimize settling[1%] where overshoot<5%" lands within ±2 Ω of 38 Ω', async () => {
    const dir = tmp.make();
    const file = writeJson(dir, 'series.json', SERIES_NET);
    const out = join(dir, 'out');
    const o = await runSweep({ file, vary: ['route.rs.series.r=20ohm..60ohm:41'], pick: 'minimize settling[1%] where overshoot<5%' }, { out, jobs: 1 });
    const best = o.result!.pick!.best!;
    expect(best).not.toBeNull();
    const r = best.values['route.rs.series.r_ohm']!;
    expect(Math.abs(r - (50 - 12))).toBeLessThanOrEqual(2);
    // The best point's waveforms are written.
    expect(readFileSync(join(out, 'best', 'probes.csv'), 'utf8').split('\n')[0]).toBe('time_s,tx,rx');
    const summary = JSON.parse(readFileSync(join(out, 'best', 'summary.json'), 'utf8'));
    expect(summary.measurements.rx.edges.length).toBe(1);

    // Overshoot below the match against the lattice diagram: the first arrival at the open end is
    // 2·Z0/(Z0 + R_out + Rs) of the swing, so overshoot = (Z0 − R_total)/(Z0 + R_total)
    // (Pozar, Microwave Engineering, ch. 2; the 625 ps ramp is shorter than the 2 ns round trip, so the
    // first step is reached in full). Within 0.05 % of the swing.
    const csv = readFileSync(join(out, 'sweep.csv'), 'utf8');
    const rs = column(csv, 'route.rs.series.r_ohm');
    const ov = column(csv, 'rx.overshoot_pct');
    rs.forEach((x, k) => {
      const rt = x! + 12;
      const expected = rt < 50 ? (100 * (50 - rt)) / (50 + rt) : 0;
      expect(Math.abs(ov[k]! - expected), `Rs = ${x} Ω`).toBeLessThan(0.05);
    });
  });
});

describe('unterminated net: rings when the line delay exceeds ~1/5 of the rise time', () => {
  // Common practice (a rule of thumb found in high-speed design handbooks): a line whose one-way
  // delay is longer than about 1/5–1/6 of the rise time must be treated as a transmission line; much
  // shorter, it behaves like a lumped wire. Numbers used here: rise time 1 ns (10–90 %),
  // R_out = 25 Ω, Z0 = 50 Ω, open end. "Rings noticeably": overshoot > 10 % of the swing at
  // TD = 400 ps (2× the 1/5 limit). "Does not": overshoot < 3 % at TD = 50 ps (1/20 of the rise time).
  it('overshoot > 10 % at TD = tr/2.5, < 3 % at TD = tr/20, and matches the lattice diagram at every length', async () => {
    const dir = tmp.make();
    const file = writeJson(dir, 'ring.json', RINGING_NET);
    const lengths = [0.01, 0.02, 0.04, 0.08, 0.12]; // m → TD = 50, 100, 200, 400, 600 ps
    const o = await runSweep({ file, vary: [`route.trace.length=${lengths.map((l) => `${l}m`).join(',')}`] }, { out: join(dir, 'out'), jobs: 1 });
    const csv = readFileSync(join(o.outDir, 'sweep.csv'), 'utf8');
    const ov = column(csv, 'rx.overshoot_pct');
    expect(ov[0]!).toBeLessThan(3); // TD = 50 ps = tr/20
    expect(ov[3]!).toBeGreaterThan(10); // TD = 400 ps = tr/2.5
    // Overshoot grows with the line's delay.
    for (let k = 1; k < ov.length; k++) expect(ov[k]!).toBeGreaterThan(ov[k - 1]!);

    // The peak against the bounce diagram with the 1.25 ns ramp (1 ns / 0.8) as source, sampled every
    // 1 ps: within 0.3 % of the swing (Pozar, ch. 2; Johnson & Graham, ch. 4).
    lengths.forEach((len, k) => {
      const td = 5e-9 * len;
      const src = (t: number) => (t <= 1e-9 ? 0 : t >= 1e-9 + 1.25e-9 ? 1 : (t - 1e-9) / 1.25e-9);
      let peak = 0;
      for (let t = 0; t < 20e-9; t += 1e-12) peak = Math.max(peak, latticeVoltage({ z0: 50, delay: td, rs: 25, rl: Infinity, source: src }, 1, t));
      expect(Math.abs(ov[k]! - 100 * (peak - 1)), `TD = ${td * 1e12} ps`).toBeLessThan(0.3);
    });
  });
});
