import { describe, expect, it } from 'vitest';
import { simulate } from '../../sim/simulate.js';
import { signalFunction } from '../../sim/signals.js';
import { lineOf, net, part, stepSignal } from '../support/nets.js';
import { probeTrace } from '../../sim/result.js';

describe('auxiliary loss states', () => {
  // Heaviside's distortionless line (R′/L′ = G′/C′) with matched ends: the receiver sees exactly
  // ½·e^(−αℓ)·vs(t − TD), α = R′/Z0 (Ramo, Whinnery & Van Duzer, Fields and Waves in Communication
  // Electronics). Here R′ and G′ are supplied only through auxiliary terms whose time constants are
  // far above the run, so an R‖L section acts as its resistance (ωτ ≫ 1) and an R–C branch as the
  // conductance C_k/τ: the lossy kernel must then reproduce the distortionless line.
  it('reproduces a distortionless line built from fast R‖L sections and R–C branches', () => {
    const z0 = 50;
    const tpd = 5e-9;
    const r = 10;
    const g = r / (z0 * z0);
    const tau = 1;
    const base = lineOf(z0, tpd);
    const line = {
      ...base,
      series: [
        { value: r / 2, tau },
        { value: r / 2, tau: 2 * tau },
      ],
      shunt: [{ value: g * tau, tau }],
    };
    const length = 1;
    const signal = stepSignal(1, 0.5e-9, 0.2e-9);
    const src = signalFunction(signal);
    const res = simulate(
      net({
        signal,
        rs: z0,
        route: [{ kind: 'line', name: 'lossy', line, length }],
        receiver: [part({ r: z0 })],
        duration: 12e-9,
        cellsPerRise: 32,
      }),
    );
    const v = probeTrace(res.record, 1);
    const dts = res.record.dtSample;
    const atten = Math.exp(-(r / z0) * length);
    let worst = 0;
    for (let i = 0; i < v.length; i++) worst = Math.max(worst, Math.abs(v[i] - 0.5 * atten * src(i * dts - length * tpd)));
    expect(worst).toBeLessThan(2e-4); // 0.02 % of the 1 V swing
  });

  // A fast R‖L section (τ far below the time step) is an inductor L_k = R_k·τ in series for every
  // frequency the run contains (ωτ ≪ 1): the line's delay becomes ℓ·√((L′+L_k)·C′) (telegrapher equations).
  it('a fast R‖L section adds its inductance to the line', () => {
    const base = lineOf(50, 5e-9);
    const extraL = 0.44 * base.l; // delay grows by √1.44 = 1.2
    const tau = 1e-16;
    const line = { ...base, series: [{ value: extraL / tau, tau }] };
    const res = simulate(
      net({
        signal: stepSignal(1, 0.1e-9, 0.1e-9),
        rs: 50,
        route: [{ kind: 'line', name: 't', line, length: 0.5 }],
        receiver: [part({ r: 60 })],
        duration: 6e-9,
      }),
    );
    const v = probeTrace(res.record, 1);
    const level = 0.5 * (60 / (50 + 60)); // half the launched wave V+ = Z0/(Rs+Z0) with Z0 = 50·1.2 Ω, matched load
    let t50 = NaN;
    for (let i = 1; i < v.length; i++) if (v[i] >= level) { t50 = (i - 1 + (level - v[i - 1]) / (v[i] - v[i - 1])) * res.record.dtSample; break; }
    const t50Source = 0.1e-9 + 0.1e-9 / 0.8 / 2;
    expect(t50 - t50Source).toBeCloseTo(0.5 * 5e-9 * 1.2, 11);
  });
});
