import { describe, expect, it } from 'vitest';
import { simulate } from '../../sim/simulate.js';
import { signalFunction } from '../../sim/signals.js';
import { lineOf, net, part, stepSignal } from '../support/nets.js';
import { probeTrace } from '../../sim/result.js';

describe('lossy line convergence', () => {
  // Heaviside's distortionless line, R′/L′ = G′/C′: every frequency travels at 1/√(L′C′) and is
  // attenuated by e^(−αx) with α = √(R′G′) = R′/Z0, so with matched ends the receiver sees exactly
  // ½·e^(−αℓ)·vs(t − TD) (Heaviside; Ramo, Whinnery & Van Duzer, Fields and Waves in Communication
  // Electronics, distortionless line). Halving ΔZ must shrink the error (second order: about 4×).
  it('halving the cell length shrinks the error against the exact solution', () => {
    const z0 = 50;
    const tpd = 5e-9;
    const r = 10;
    const g = r / (z0 * z0);
    const length = 1;
    const signal = stepSignal(1, 0.5e-9, 0.2e-9);
    const src = signalFunction(signal);
    const errors = [8, 16, 32].map((cellsPerRise) => {
      const res = simulate(
        net({
          signal,
          rs: z0,
          route: [{ kind: 'line', name: 'lossy', line: lineOf(z0, tpd, r, g), length }],
          receiver: [part({ r: z0 })],
          duration: 12e-9,
          cellsPerRise,
        }),
      );
      const v = probeTrace(res.record, 1);
      const dts = res.record.dtSample;
      const atten = Math.exp(-(r / z0) * length);
      let worst = 0;
      for (let i = 0; i < v.length; i++) worst = Math.max(worst, Math.abs(v[i] - 0.5 * atten * src(i * dts - length * tpd)));
      return worst;
    });
    expect(errors[1]).toBeLessThan(errors[0] / 2.5);
    expect(errors[2]).toBeLessThan(errors[1] / 2.5);
    expect(errors[2]).toBeLessThan(1e-5); // 0.001 % of the 1 V swing at 32 steps per rise
  });
});

describe('energy balance', () => {
  // Conservation of energy on a lossless line with resistive ends: what the source delivers equals
  // what Rs and RL dissipate plus what the line stores, ½C·V² + ½L·I² at the settled end state
  // (Poynting's theorem for a TEM line; Ramo, Whinnery & Van Duzer).
  it('source energy = dissipated + stored within 0.1 %', () => {
    const z0 = 50;
    const tpd = 5e-9;
    const length = 0.5;
    const rs = 30;
    const rl = 120;
    const signal = stepSignal(1, 0.2e-9, 0.1e-9);
    const src = signalFunction(signal);
    const line = lineOf(z0, tpd);
    const res = simulate(
      net({
        signal,
        rs,
        route: [{ kind: 'line', name: 't', line, length }],
        receiver: [part({ r: rl })],
        duration: 40 * length * tpd,
      }),
    );
    const v0 = probeTrace(res.record, 0);
    const vl = probeTrace(res.record, 1);
    const dts = res.record.dtSample;
    let supplied = 0;
    let lost = 0;
    for (let i = 1; i < v0.length; i++) {
      const p = (k: number) => {
        const vs = src(k * dts);
        const i0 = (vs - v0[k]) / rs;
        return { s: vs * i0, d: i0 * i0 * rs + (vl[k] * vl[k]) / rl };
      };
      const a = p(i - 1);
      const b = p(i);
      supplied += ((a.s + b.s) / 2) * dts;
      lost += ((a.d + b.d) / 2) * dts;
    }
    const vdc = rl / (rs + rl);
    const idc = 1 / (rs + rl);
    const stored = 0.5 * line.c * length * vdc * vdc + 0.5 * line.l * length * idc * idc;
    expect(Math.abs(supplied - (lost + stored)) / supplied).toBeLessThan(1e-3);
  });
});
