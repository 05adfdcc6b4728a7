import { describe, expect, it } from 'vitest';
import { compileNet } from '../../sim/circuit.js';
import { solveDc } from '../../sim/dc.js';
import { discretize } from '../../sim/discretize.js';
import { buildLadder } from '../../sim/ladder.js';
import { buildLumped } from '../../sim/lumped.js';
import type { Net, Part } from '../../sim/model.js';
import { probeTrace } from '../../sim/result.js';
import { simulate } from '../../sim/simulate.js';
import { lineOf, net, part, stepSignal } from '../support/nets.js';

/** The driver pin's cluster of a net with no lines, at rest with the source at 0 V, and its Δt. */
function pinCluster(rs: number, load: Part) {
  const n = net({ signal: stepSignal(1, 1e-9), rs, route: [], receiver: [load], cellsPerRise: 100 });
  const c = compileNet(n);
  const plan = discretize(c);
  const ladder = buildLadder(c, plan);
  const sources = Float64Array.of(0);
  const dc = solveDc(ladder, sources);
  const lumped = buildLumped(ladder, plan.dt, dc);
  expect(lumped.clusters).toHaveLength(1);
  const v = new Float64Array(ladder.slots + 1);
  const i = new Float64Array(ladder.slots + 1);
  const step = (e: number) => {
    sources[0] = e;
    lumped.clusters[0].advance(v, i, sources);
    return v[0];
  };
  return { dt: plan.dt, step };
}

describe('lumped companion models, hand-computed', () => {
  // Trapezoidal companion of an R + L branch (Dommel 1969): v(n+1) = (R + 2L/Δt)·i(n+1) − 2L/Δt·i(n) − vL(n),
  // vL(n+1) = 2L/Δt·(i(n+1) − i(n)) − vL(n). With a source E behind Rs, from rest:
  //   i1 = E/(Rs + R + 2L/Δt),  i2 = (E + 2·(2L/Δt)·i1)/(Rs + R + 2L/Δt),  v = E − Rs·i.
  it('steps an R + L branch as the trapezoidal rule says', () => {
    const rs = 10;
    const r = 40;
    const l = 1e-6;
    const { dt, step } = pinCluster(rs, part({ r, l }));
    const kl = (2 * l) / dt;
    const i1 = 1 / (rs + r + kl);
    const i2 = (1 + 2 * kl * i1) / (rs + r + kl);
    expect(step(1)).toBeCloseTo(1 - rs * i1, 13);
    expect(step(1)).toBeCloseTo(1 - rs * i2, 13);
  });

  // R + C branch: v(n+1) = R·i(n+1) + vC(n+1), vC(n+1) = vC(n) + Δt/(2C)·(i(n+1) + i(n)). From rest:
  //   i1 = E/(Rs + R + Δt/2C),  i2 = (E − 2·(Δt/2C)·i1)/(Rs + R + Δt/2C).
  it('steps an R + C branch as the trapezoidal rule says', () => {
    const rs = 25;
    const r = 50;
    const c = 100e-12;
    const { dt, step } = pinCluster(rs, part({ r, c }));
    const kc = dt / (2 * c);
    const i1 = 1 / (rs + r + kc);
    const i2 = (1 - 2 * kc * i1) / (rs + r + kc);
    expect(step(1)).toBeCloseTo(1 - rs * i1, 13);
    expect(step(1)).toBeCloseTo(1 - rs * i2, 13);
  });
});

describe('lumped responses against circuit theory', () => {
  // First-order RL circuit: a step E into Rs + (R + L) gives i(t) = E/(Rs+R)·(1 − e^(−t/τ)), τ = L/(Rs+R)
  // (any circuit text, e.g. Nilsson & Riedel, Electric Circuits, natural and step response of RL
  // circuits). The source is a linear ramp of length T, so the exact current is the step response's
  // integral differenced over T: i(t) = [I(t) − I(t − T)]/T, I(t) = E/(Rs+R)·(t − τ(1 − e^(−t/τ))).
  it('an RL step response follows the exponential within 0.05 % of swing', () => {
    const rs = 20;
    const r = 30;
    const l = 500e-9; // τ = 10 ns
    const rise = 0.4e-9;
    const tau = l / (rs + r);
    const res = simulate(net({ signal: stepSignal(1, rise), rs, route: [], receiver: [part({ r, l })], duration: 60e-9, cellsPerRise: 20 }));
    const v = probeTrace(res.record, 0);
    const ramp = rise / 0.8;
    const integral = (t: number) => (t <= 0 ? 0 : (t - tau * (1 - Math.exp(-t / tau))) / (rs + r));
    const source = (t: number) => Math.min(Math.max(t / ramp, 0), 1);
    let worst = 0;
    for (let k = 0; k < v.length; k++) {
      const t = k * res.record.dtSample;
      const i = (integral(t) - integral(t - ramp)) / ramp;
      worst = Math.max(worst, Math.abs(v[k] - (source(t) - rs * i)));
    }
    expect(worst).toBeLessThan(5e-4);
  });

  // Series RLC driven by a step, output across C: the standard second-order system with
  // ωn = 1/√(LC), ζ = (R/2)·√(C/L); maximum overshoot Mp = exp(−ζπ/√(1 − ζ²)) at tp = π/(ωn√(1 − ζ²))
  // (Ogata, Modern Control Engineering, 5th ed., §5-3, transient-response specifications).
  it('a series RLC overshoots by exp(−ζπ/√(1−ζ²)) at π/ωd, within 0.1 % of swing', () => {
    const l = 100e-9;
    const c = 10e-12;
    const zeta = 0.3;
    const r = 2 * zeta * Math.sqrt(l / c); // 60 Ω, all in the driver
    const rise = 10e-12;
    const res = simulate(
      net({ signal: stepSignal(1, rise), rs: r, route: [{ kind: 'series', name: 'l1', part: part({ l }) }], receiver: [part({ c })], duration: 8e-9, cellsPerRise: 20 }),
    );
    const v = probeTrace(res.record, 1);
    let peak = -Infinity;
    let at = 0;
    v.forEach((x, k) => {
      if (x > peak) [peak, at] = [x, k * res.record.dtSample];
    });
    const wd = Math.sqrt(1 - zeta * zeta) / Math.sqrt(l * c);
    const mp = Math.exp((-zeta * Math.PI) / Math.sqrt(1 - zeta * zeta));
    expect(Math.abs(peak - (1 + mp))).toBeLessThan(1e-3);
    // the ramp delays the response by half its length
    expect(Math.abs(at - (Math.PI / wd + rise / 0.8 / 2)) / (Math.PI / wd)).toBeLessThan(0.01);
  });

  // 3 000 parts of 150 kΩ in parallel are 50 Ω (Ohm's law for parallel resistors): a 50 Ω line ending in
  // them reflects nothing, so the receiver sees half the source one delay later and stays there. The
  // cluster is one node: the parts cost one multiply-add each per step, not a dense 3 000² matrix.
  it('a receiver of 3 000 parallel parts terminates like the one resistor they make', () => {
    const parts = Array.from({ length: 3000 }, () => part({ r: 150e3 }));
    const res = simulate(net({ signal: stepSignal(1, 0.1e-9), rs: 50, route: [{ kind: 'line', name: 't', line: lineOf(50, 5e-9), length: 0.1 }], receiver: parts, duration: 3e-9 }));
    const rx = probeTrace(res.record, 1);
    expect(rx[rx.length - 1]).toBeCloseTo(0.5, 9);
    const tx = probeTrace(res.record, 0);
    expect(Math.max(...tx)).toBeLessThan(0.5 + 1e-9);
  });
});
