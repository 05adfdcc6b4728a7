// The termination advisor on point-to-point nets whose answers are known in closed form: a lossless
// 50 Ω line, 1 ns one way, open at the far end, driven by a resistive source.
import { mkdtemp, readdir, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runChecks } from '../../../src/checks/index.js';
import { advise, type Advice, type OptionResult } from '../../../src/terminate/advise.js';
import { neighbours } from '../../../src/terminate/eseries.js';
import { RC_ROUND_TRIPS } from '../../../src/terminate/topologies.js';
import { writeWinner } from '../../../src/terminate/write.js';

const Z0 = 50;
const TD = 1e-9;
const V = 3.3;

function pointToPoint(rOut: number, extra: Record<string, unknown> = {}) {
  return {
    title: `point-to-point, ${rOut} ohm driver`,
    driver: { signal: { kind: 'step', from: '0V', to: `${V}V`, start: '0.5ns', rise: '200ps' }, resistance: `${rOut}ohm` },
    lines: { t: { z0: `${Z0}ohm`, delay: '5ns/m' } },
    route: [{ name: 'tr', line: 't', length: '20cm' }],
    run: { duration: '12ns' },
    ...extra,
  };
}

const option = (a: Advice, id: string): OptionResult => {
  const o = a.options.find((x) => x.id === id);
  if (!o) throw new Error(`no option ${id}`);
  return o;
};

let dir: string;
let tenOhm: Advice;

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'lw-tame-'));
  const file = join(dir, 'p2p.json');
  await writeFile(file, JSON.stringify(pointToPoint(10)));
  tenOhm = await advise({ file, jobs: 1, only: ['none', 'series', 'parallel', 'parallel-vtt', 'split'], tolerance: 0.05, samples: 6 });
}, 120_000);

afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe('advise on a lossless point-to-point line (10 Ω driver, Z0 = 50 Ω)', () => {
  it('finds the series resistor Z0 − R_out and rounds it to the nearest E24 value', () => {
    // Johnson & Graham, High-Speed Digital Design, ch. 6 (source termination): Rs = Z0 − R_out = 40 Ω;
    // IEC 60063 E24 neighbours 39 and 43, geometric midpoint 40.95: 40 rounds to 39.
    const s = option(tenOhm, 'series');
    expect(s.continuous[0]!).toBeGreaterThan(40 * 0.96);
    expect(s.continuous[0]!).toBeLessThan(40 * 1.04);
    expect(s.values).toEqual([neighbours('E24', Z0 - 10).nearest]);
    expect(s.values).toEqual([39]);
    expect(s.score.pass).toBe(true);
    expect(s.rounding).toBe('nearest');
  });

  it('finds the parallel resistor R = Z0 (no reflection, lattice method) and its DC power V²/R when high', () => {
    const p = option(tenOhm, 'parallel');
    expect(p.values).toEqual([51]); // E24 nearest to 50 Ω
    const r = p.values[0]!;
    // DC divider R_out–R, then V²/R (Joule): high 3.3·51/61 V across 51 Ω, low 0 V
    const vHigh = (V * r) / (r + 10);
    expect(p.power.high).toBeCloseTo((vHigh * vHigh) / r, 9);
    expect(p.power.low).toBeCloseTo(0, 12);
  });

  it('gives a parallel resistor to VTT = V/2 the same power in both states', () => {
    const p = option(tenOhm, 'parallel-vtt');
    const r = p.values[0]!;
    const vtt = V / 2;
    // the receiver sits on the divider between the driver level and VTT: V_rx − VTT = (V_s − VTT)·R/(R + R_out)
    const dv = (vtt * r) / (r + 10);
    expect(p.power.high).toBeCloseTo((dv * dv) / r, 9);
    expect(p.power.low).toBeCloseTo((dv * dv) / r, 9);
  });

  it('makes the split pair R1‖R2 ≈ Z0 and states its power in each state by the nodal equation', () => {
    const p = option(tenOhm, 'split');
    const [r1, r2] = p.values as [number, number];
    // Thevenin equivalent of the pair: R1‖R2 matches Z0 within one E24 step (≤ 10 %)
    const req = (r1 * r2) / (r1 + r2);
    expect(Math.abs(req / Z0 - 1)).toBeLessThan(0.1);
    // receiver node: (V_s − v)/R_out + (V − v)/R1 − v/R2 = 0 (Kirchhoff), power (V − v)²/R1 + v²/R2
    const node = (vs: number) => (vs / 10 + V / r1) / (1 / 10 + 1 / r1 + 1 / r2);
    const pw = (v: number) => (V - v) ** 2 / r1 + (v * v) / r2;
    expect(p.power.high).toBeCloseTo(pw(node(V)), 9);
    expect(p.power.low).toBeCloseTo(pw(node(0)), 9);
  });

  it('measures the unterminated line by the lattice diagram and ranks it below every passing option', () => {
    const none = option(tenOhm, 'none');
    // first arrival V·Z0/(Z0 + R_out)·(1 + Γ_L), Γ_L = 1 at the open end: overshoot (Z0 − R_out)/(Z0 + R_out) of the swing
    expect(none.outcome.receivers[0]!.overshootPct!).toBeCloseTo(((Z0 - 10) / (Z0 + 10)) * 100, 0);
    expect(none.score.pass).toBe(false);
    const rank = (id: string) => tenOhm.options.findIndex((o) => o.id === id);
    for (const id of ['series', 'parallel', 'parallel-vtt', 'split']) expect(rank(id)).toBeLessThan(rank('none'));
  });

  it('counts the simulations of each option and runs the tolerance Monte Carlo at the rounded values', () => {
    const s = option(tenOhm, 'series');
    expect(s.sims.search).toBeGreaterThan(5);
    expect(s.sims.rounding).toBe(1);
    expect(s.sims.monteCarlo).toBe(6);
    // 39 Ω ± 5 % keeps the reflection from the source under 4 % of the swing: every sample passes
    expect(s.monteCarlo!.yield).toBe(1);
    expect(tenOhm.totalSims).toBe(tenOhm.options.reduce((n, o) => n + o.sims.search + o.sims.rounding + o.sims.monteCarlo, 0));
  });

  it('writes the winner beside the scenario, never over an existing file, and the file passes ladderwave check', async () => {
    const best = tenOhm.options[0]!;
    const first = await writeWinner(tenOhm, best);
    const second = await writeWinner(tenOhm, best);
    expect(first).not.toBe(second);
    expect(second).toMatch(/-2\.json$/);
    expect((await readdir(dir)).filter((f) => f.includes('.tamed-'))).toHaveLength(2);
    const report = await runChecks([first], {});
    expect(report.exitCode).toBe(0);
    expect(report.scenarios[0]!.rows.length).toBeGreaterThan(0);
    expect(report.scenarios[0]!.verdict).toBe('pass');
  });
});

describe('advise on a symmetric star of two equal arms at the driver pin (5 Ω driver)', () => {
  it('finds one series resistor Z0/2 − R_out at the driver and Z0 − 2·R_out per arm', async () => {
    const file = join(dir, 'star.json');
    const arm = (name: string) => ({ name, line: 't', length: '20cm' });
    await writeFile(
      file,
      JSON.stringify({
        ...pointToPoint(5),
        route: [{ name: 'hub', branch: { route: [arm('arm_a')], receiver: { name: 'a' } } }, arm('arm_b')],
        receiver: { name: 'b' },
      }),
    );
    const a = await advise({ file, jobs: 1, only: ['series', 'series-arms'] });
    // Seen from the driver the two arms are Z0/2 in parallel: Rs = Z0/2 − R_out = 20 Ω (Johnson & Graham
    // ch. 6, source termination). By symmetry each arm carries half the current, as if driven alone
    // from 2·R_out: Rs = Z0 − 2·R_out = 40 Ω per arm → E24 39 Ω.
    expect(option(a, 'series').values).toEqual([neighbours('E24', Z0 / 2 - 5).nearest]);
    expect(option(a, 'series-arms').values).toEqual([39, 39]);
    expect(a.facts.receivers.map((r) => r.name)).toEqual(['b', 'a']);
    for (const o of a.options.filter((x) => x.id !== 'as-given')) expect(o.score.pass).toBe(true);
  }, 120_000);
});

describe('advise: RC (AC) termination', () => {
  it('puts R at Z0 and keeps R·C at least 3 round trips (common practice)', async () => {
    const file = join(dir, 'p2p-stiff.json');
    await writeFile(file, JSON.stringify(pointToPoint(1)));
    const a = await advise({ file, jobs: 1, only: ['rc'] });
    const rc = option(a, 'rc');
    const [r, c] = rc.values as [number, number];
    // matched: R = Z0 (lattice method; with the capacitor a short for the edge), E24 nearest 51 Ω
    expect(r).toBe(neighbours('E24', Z0).nearest);
    // common practice: the time constant R·C exceeds a few round-trip delays; the multiple held is 3
    expect(r * c).toBeGreaterThanOrEqual(RC_ROUND_TRIPS * 2 * TD);
    expect(rc.power).toEqual({ low: 0, high: 0 });
  }, 120_000);
});
