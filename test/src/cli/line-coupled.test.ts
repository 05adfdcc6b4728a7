// `ladderwave line --coupled-…`: the printed and JSON numbers of a coupled pair through the command line,
// against the published formulas and hand calculations of the coupled-line tests.
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/program.js';
import type { CoupledReport, LineReport } from '../../../src/lines-report/index.js';
import { collectOutput } from './fixtures.js';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

async function line(args: string[]) {
  const io = collectOutput();
  const code = await runCli(['line', ...args], { io });
  return { code, ...io };
}

async function json(args: string[]): Promise<{ lines: LineReport[]; coupled: CoupledReport[] }> {
  const r = await line([...args, '--json']);
  expect(r.code, r.stderr).toBe(0);
  return JSON.parse(r.stdout);
}

describe('line --coupled-stripline, --coupled-modes, --coupled-microstrip', () => {
  // Cohn 1955 at εr = 1, W/b = S/b = 0.5: Z0e = 107.15 Ω, Z0o = 93.22 Ω (see test/sim/lines/coupled-stripline.test.ts).
  // Homogeneous: both modes at c0, Z_diff = 2·Z_odd, Z_comm = Z_even/2, K_f = 0.
  it("Cohn's stripline: Z_even, Z_odd, Z_diff, Z_comm and both modes at c0", async () => {
    const { coupled, lines } = await json(['--coupled-stripline', 'width=0.5mm,spacing=0.5mm,planeSpacing=1mm,er=1']);
    expect(lines).toEqual([]);
    const [r] = coupled;
    const p = r.pairs[0];
    expect(p.zEven).toBeCloseTo(107.15, 2);
    expect(p.zOdd).toBeCloseTo(93.22, 2);
    expect(p.zDiff).toBeCloseTo(2 * p.zOdd, 9);
    expect(p.zComm).toBeCloseTo(p.zEven / 2, 9);
    for (const m of r.modes) expect(rel(m.velocity, 299_792_458)).toBeLessThan(1e-12);
    expect(Math.abs(p.kf)).toBeLessThan(1e-12);
  });

  // From the modes: L11 ± L12 = Z·τ and C11 ± C12 = τ/Z per mode (odd −, even +). With Z_o = 45 Ω,
  // τ_o = 150 ps/in = 5.9055 ns/m, Z_e = 56 Ω, τ_e = 160 ps/in = 6.2992 ns/m:
  // L11 = (56·6.2992 + 45·5.9055)/2 nH/m = 309.25 nH/m, L12 = (352.76 − 265.75)/2 = 43.50 nH/m,
  // C11 = (6.2992/56 + 5.9055/45)/2 ns/(m·ohm) = 121.86 pF/m, C12 = (112.49 − 131.23)/2 = −9.371 pF/m;
  // as capacitors: 112.49 pF/m to the return, 9.371 pF/m between; K_b = ¼(43.50/309.25 + 9.371/121.86) = 0.05439.
  it('a pair from its modes: the matrices, the capacitor form and K_b by hand', async () => {
    const { coupled } = await json(['--coupled-modes', 'zOdd=45ohm,zEven=56ohm,delayOdd=150ps/in,delayEven=160ps/in']);
    const [r] = coupled;
    expect(r.l[0][0] * 1e9).toBeCloseTo(309.25, 1);
    expect(r.l[0][1] * 1e9).toBeCloseTo(43.5, 1);
    expect(r.c[0][0] * 1e12).toBeCloseTo(121.86, 1);
    expect(r.c[0][1] * 1e12).toBeCloseTo(-9.371, 2);
    expect(r.capacitanceToReturn[0] * 1e12).toBeCloseTo(112.49, 1);
    expect(r.capacitanceBetween[0][1] * 1e12).toBeCloseTo(9.371, 2);
    expect(r.pairs[0].kb).toBeCloseTo(0.05439, 4);
    expect(r.modes.map((m) => m.label)).toEqual(['odd', 'even']);
    expect(r.modes[0].impedance).toEqual([expect.closeTo(45, 9), expect.closeTo(45, 9)]);
  });

  it('prints the table: matrices, modes, Z_diff and the coupling coefficients', async () => {
    const r = await line(['--coupled-microstrip', 'width=5mil,spacing=6mil,height=4mil,er=4.2']);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/L′ per metre .*nH .*C′ per metre \(Maxwell\)/);
    expect(r.stdout).toMatch(/odd +\(\+1, −1\) +v 0\.\d+c/);
    expect(r.stdout).toMatch(/Z_odd [\d.]+ ohm, Z_even [\d.]+ ohm, Z_diff [\d.]+ ohm, Z_comm [\d.]+ ohm/);
    expect(r.stdout).toMatch(/K_b 0\.0\d+ .*K_f -0\.0\d+/);
    expect(r.stdout).toMatch(/fastest mode .*Courant/);
    expect(r.stderr).toBe('');
  });

  it('names the option, the key and what was expected; exit 2', async () => {
    const r = await line(['--coupled-modes', 'zOdd=60ohm,zEven=56ohm,delayOdd=150ps/in,velocityEven=0.5c']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--coupled-modes\.zOdd: 60 — expected Z_odd 60 ohm exceeds Z_even 56 ohm/);
    const missing = await line(['--coupled-microstrip', 'width=5mil,height=4mil,er=4.2,er=3']);
    expect(missing.code).toBe(2);
    expect(missing.stderr).toMatch(/--coupled-microstrip\.er: "3" — expected each key once/);
    expect(missing.stderr).toMatch(/--coupled-microstrip\.spacing: \(missing\) — expected spacing, like spacing=5mil/);
  });

  it('warns outside the formulas’ stated range', async () => {
    const r = await line(['--coupled-microstrip', 'width=5mil,spacing=0.2mil,height=4mil,er=4.2']);
    expect(r.code).toBe(0);
    expect(r.stderr).toMatch(/warning: .*S\/h = 0\.05 is outside 0\.1 ≤ S\/h ≤ 10/);
  });
});
