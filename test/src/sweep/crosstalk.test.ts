// Sweeps of a multi-net scenario: the crosstalk columns against the exact modal solution.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runSweep } from '../../../src/sweep/index.js';
import { parseSweepCsv } from '../../../src/sweep/table.js';
import { TempDirs, writeJson } from './fixtures.js';

const tmp = new TempDirs();
afterAll(() => tmp.cleanup());

// Homogeneous pair, v = 1.5e8 m/s, Z0 = 50 Ω, k = 0.1: C = (1/(v·Z0))·[[1, −k], [−k, 1]], L = C⁻¹/v²;
// Z_e = Z0/(1 − k), Z_o = Z0/(1 + k). Aggressor driven behind R = √(Z_e·Z_o), victim's near end R: the
// near-end plateau is (1 − √(1 − k²))/k·V_s/2 = 0.0250628 V for V_s = 1 V until the far ends answer at
// 2·TD = 2 ns (exact modal solution; C. R. Paul, Analysis of Multiconductor Transmission Lines), so in a
// 1.9 ns run it cannot depend on the far-end terminations. At the far end (aggressor's end in R) the
// victim stays at 0 V whatever its own load: with Z_C = [[a, b], [b, a]] (a, b = (Z_e ± Z_o)/2) the
// launched wave is V⁺ = (1 + R·Y_C)⁻¹·(V_s, 0) and the far-end voltage (1 + R_L·Y_C)⁻¹·2·R_L·Y_C·V⁺ has
// a zero victim entry for R_L = diag(R, R_v), any R_v (computed below; Paul, MTL terminal conditions).
const v = 1.5e8;
const z0 = 50;
const k = 0.1;
const cd = 1 / (v * z0);
const ld = z0 / (v * (1 - k * k));
const R = z0 / Math.sqrt(1 - k * k);
const PAIR = {
  title: 'sweep of a coupled pair',
  nets: {
    agg: {
      driver: { signal: { kind: 'step', from: '0V', to: '1V', rise: '80ps' }, resistance: R },
      route: [{ name: 'a', coupled: 'pair', length: '15cm' }],
      receiver: { name: 'aggFar', parts: { r: R } },
    },
    vic: {
      driver: { level: '0V', resistance: R },
      route: [{ name: 'b', coupled: 'pair', length: '15cm' }],
      receiver: { name: 'vicFar', parts: { r: R } },
    },
  },
  coupled: { pair: { conductors: ['a', 'b'], l: [[ld, k * ld], [k * ld, ld]], c: [[cd, -k * cd], [-k * cd, cd]] } },
  probes: [
    { name: 'vicNear', at: 'driver', net: 'vic' },
    { name: 'vicFar', at: 'vicFar' },
  ],
  run: { duration: '1.9ns' },
};

/** The victim's far-end voltage before any reflection returns, from the terminal equations above. */
function farVictim(rv: number): number {
  const ze = z0 / (1 - k), zo = z0 / (1 + k);
  const a = (ze + zo) / 2, b = (ze - zo) / 2, det = a * a - b * b;
  const y = [a / det, -b / det, -b / det, a / det];
  const solve = (m: number[], x: number[]) => {
    const d = m[0] * m[3] - m[1] * m[2];
    return [(m[3] * x[0] - m[1] * x[1]) / d, (m[0] * x[1] - m[2] * x[0]) / d];
  };
  const vp = solve([1 + R * y[0], R * y[1], R * y[2], 1 + R * y[3]], [1, 0]);
  const ry = [R * y[0], R * y[1], rv * y[2], rv * y[3]];
  const rhs = [2 * (ry[0] * vp[0] + ry[1] * vp[1]), 2 * (ry[2] * vp[0] + ry[3] * vp[1])];
  return solve([1 + ry[0], ry[1], ry[2], 1 + ry[3]], rhs)[1];
}

describe('sweeping a multi-net scenario', () => {
  it('varies a victim termination and reports crosstalk columns: the near end does not move, the far end stays quiet', async () => {
    const dir = tmp.make();
    const file = writeJson(dir, 'pair.json', PAIR);
    const out = join(dir, 'out');
    await runSweep({ file, vary: [`nets.vic.receiver.parts.r=${R}ohm..${3 * R}ohm:3`] }, { out, jobs: 1 });
    const t = parseSweepCsv(readFileSync(join(out, 'sweep.csv'), 'utf8'));
    const col = (name: string) => t.rows.map((r) => r[t.header.indexOf(name)]!);
    expect(t.header).toContain('vicNear.crosstalk_pct');
    for (const x of col('vicNear.crosstalk_V')) expect(x).toBeCloseTo(0.0250628, 6);
    for (const x of col('vicNear.crosstalk_pct')) expect(x).toBeCloseTo(2.50628, 4);
    for (const rv of [R, 2 * R, 3 * R]) expect(Math.abs(farVictim(rv))).toBeLessThan(1e-12);
    for (const x of col('vicFar.crosstalk_V')) expect(Math.abs(x!)).toBeLessThan(1e-6);
  });
});
