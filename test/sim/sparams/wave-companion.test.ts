// The S-parameter (power-wave) companion against circuits whose currents are known.
import { describe, expect, it } from 'vitest';
import { createWaveCompanion, startWaveAtDc, waveAdvance, waveHistory } from '../../../sim/sparams/wave-companion.js';
import type { RationalModel } from '../../../sim/sparams/rational.js';

describe('wave companion', () => {
  it('turns a constant S of a resistor into its conductance: S = (R − r)/(R + r) → G_eq = 1/R (Pozar eq. 2.35)', () => {
    const R = 75;
    const r = 50;
    const model: RationalModel = { ports: 1, poles: new Float64Array(0), residues: new Float64Array(0), d: Float64Array.of((R - r) / (R + r)) };
    const c = createWaveCompanion(model, [r], 1e-12);
    expect(c.geq[0]).toBeCloseTo(1 / R, 15);
  });

  it('turns the S of a series resistor (Pozar Table 4.2: S11 = R/(R + 2r), S21 = 2r/(R + 2r)) into (1/R)·[[1, −1], [−1, 1]]', () => {
    const R = 1.5; // nearly a through: a large conductance, still exact
    const r = 50;
    const s11 = R / (R + 2 * r);
    const s21 = (2 * r) / (R + 2 * r);
    const model: RationalModel = { ports: 2, poles: new Float64Array(0), residues: new Float64Array(0), d: Float64Array.of(s11, s21, s21, s11) };
    const c = createWaveCompanion(model, [r, r], 1e-12);
    const want = [1 / R, -1 / R, -1 / R, 1 / R];
    c.geq.forEach((g, k) => expect(Math.abs(g - want[k])).toBeLessThan(1e-12 / R));
  });

  it('reproduces the current of a series R–C one-port driven by v = V(1 − e^{−t/τ1}), converging as Δt²', () => {
    // Z = R + 1/(sC); S = ((R − r)sC + 1)/((R + r)sC + 1) = D + k/(s − a) with D = (R − r)/(R + r),
    // a = −1/((R + r)C), k = 2r/((R + r)²C). Current: I = V(s)/Z(s) with V(s) = V/(τ1·s·(s + 1/τ1)):
    // i(t) = V/(τ1·R)·(e^{−pt} − e^{−qt})/(q − p), p = 1/τ1, q = 1/(RC).
    const R = 20, C = 10e-12, r = 50, V = 1, tau1 = 0.3e-9;
    const model: RationalModel = {
      ports: 1,
      poles: Float64Array.of(-1 / ((R + r) * C), 0),
      residues: Float64Array.of((2 * r) / ((R + r) ** 2 * C), 0),
      d: Float64Array.of((R - r) / (R + r)),
    };
    const p = 1 / tau1, q = 1 / (R * C);
    const exact = (t: number) => (V / (tau1 * R)) * ((Math.exp(-p * t) - Math.exp(-q * t)) / (q - p));
    const maxErr = (dt: number) => {
      const c = createWaveCompanion(model, [r], dt);
      const h = new Float64Array(1);
      const i = new Float64Array(1);
      let worst = 0;
      for (let n = 0; n * dt < 2e-9; n++) {
        const t = (n + 1) * dt;
        waveHistory(c, h);
        waveAdvance(c, [V * (1 - Math.exp(-t / tau1))], i);
        worst = Math.max(worst, Math.abs(i[0] - exact(t)));
      }
      return worst;
    };
    const peak = exact(Math.log(q / p) / (q - p));
    const e1 = maxErr(4e-12);
    const e2 = maxErr(2e-12);
    expect(e1 / peak).toBeLessThan(1e-3);
    expect(e1 / e2).toBeGreaterThan(3.5);
  });
});

describe('wave companion DC start', () => {
  it('starts an R ‖ C one-port at V in steady state: current V/R from the first step on', () => {
    // Z = R/(1 + sRC); S = (Z − r)/(Z + r) = (R − r − s·rRC)/(R + r + s·rRC) = D + k/(s − a) with
    // D = −1, a = −(R + r)/(rRC), k = 2R/(rRC) (partial fractions; S(0) = (R − r)/(R + r), Pozar eq. 2.35).
    const R = 120, C = 2e-12, r = 50, V = 0.7;
    const a = -(R + r) / (r * R * C);
    const model: RationalModel = { ports: 1, poles: Float64Array.of(a, 0), residues: Float64Array.of((2 * R) / (r * R * C), 0), d: Float64Array.of(-1) };
    const c = createWaveCompanion(model, [r], 1e-12);
    const i0 = startWaveAtDc(c, model, [V]);
    expect(i0[0]).toBeCloseTo(V / R, 14);
    const h = new Float64Array(1);
    const i = new Float64Array(1);
    for (let n = 0; n < 100; n++) {
      waveHistory(c, h);
      waveAdvance(c, [V], i);
      expect(Math.abs(i[0] - V / R)).toBeLessThan(1e-12 * (V / R));
    }
  });
});
