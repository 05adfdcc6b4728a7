// Recursive convolution of pole terms against analytic responses.
import { describe, expect, it } from 'vitest';
import { companionAdvance, companionCurrent, companionHistory, createCompanion, poleCoefficients, startAtDc, type Companion } from '../../../sim/sparams/companion.js';
import { evaluateModel, type RationalModel } from '../../../sim/sparams/rational.js';

/** Drives a one-port companion with the voltage samples v(n) = vAt(n·dt), v(0) as the value before the first step; returns i(n), n ≥ 1. */
function drive(c: Companion, vAt: (t: number) => number, steps: number): Float64Array {
  const h = new Float64Array(c.ports);
  const i = new Float64Array(c.ports);
  const out = new Float64Array(steps + 1);
  c.v[0] = vAt(0);
  for (let n = 0; n < steps; n++) {
    const vNext = [vAt((n + 1) * c.dt)];
    companionHistory(c, h);
    companionCurrent(c, vNext, h, i);
    companionAdvance(c, vNext);
    out[n + 1] = i[0];
  }
  return out;
}

describe('recursive convolution companion', () => {
  it('gives an R–L branch its first-order step current (V/R)(1 − e^{−tR/L}) exactly (1e-12)', () => {
    // Y(s) = 1/(R + sL) = (1/L)/(s + R/L): one real pole a = −R/L, residue 1/L (first-order system, Ogata §5-2)
    const R = 33;
    const L = 12e-9;
    const model: RationalModel = { ports: 1, poles: Float64Array.of(-R / L, 0), residues: Float64Array.of(1 / L, 0), d: Float64Array.of(0) };
    const dt = 7e-12;
    const c = createCompanion(model, dt);
    const i = drive(c, () => 1.5, 400);
    for (let n = 1; n <= 400; n++) {
      const want = (1.5 / R) * (1 - Math.exp((-n * dt * R) / L));
      expect(Math.abs(i[n] - want)).toBeLessThan(1e-12 * (1.5 / R));
    }
  });

  it('is exact for a ramp too (piecewise-linear input): x = (e^{at} − 1)/(a²T) − t/(aT)', () => {
    const a = -2.3e9;
    const T = 1e-9;
    const model: RationalModel = { ports: 1, poles: Float64Array.of(a, 0), residues: Float64Array.of(1, 0), d: Float64Array.of(0) };
    const dt = 13e-12;
    const i = drive(createCompanion(model, dt), (t) => t / T, 300);
    for (let n = 1; n <= 300; n++) {
      const t = n * dt;
      const want = (Math.exp(a * t) - 1) / (a * a * T) - t / (a * T); // ∫₀ᵗ e^{a(t−τ)} τ/T dτ
      expect(Math.abs(i[n] - want)).toBeLessThan(1e-12 * Math.abs(t / (a * T)));
    }
  });

  it('reproduces the second-order step response and its overshoot e^{−πζ/√(1−ζ²)} with one complex pair (1e-9)', () => {
    // H(s) = ωn²/(s² + 2ζωn·s + ωn²): poles −ζωn ± jωd, residue ωn²/(2jωd) at the upper pole.
    // Ogata, Modern Control Engineering, §5-3: c(t) = 1 − e^{−ζωn t}(cos ωd t + ζ/√(1−ζ²)·sin ωd t),
    // peak at t_p = π/ωd with overshoot M_p = e^{−ζπ/√(1−ζ²)}.
    const zeta = 0.3;
    const wn = 2 * Math.PI * 1e9;
    const wd = wn * Math.sqrt(1 - zeta * zeta);
    const model: RationalModel = { ports: 1, poles: Float64Array.of(-zeta * wn, wd), residues: Float64Array.of(0, -(wn * wn) / (2 * wd)), d: Float64Array.of(0) };
    const tp = Math.PI / wd;
    const dt = tp / 200;
    const i = drive(createCompanion(model, dt), () => 1, 1000);
    for (let n = 1; n <= 1000; n++) {
      const t = n * dt;
      const want = 1 - Math.exp(-zeta * wn * t) * (Math.cos(wd * t) + (zeta / Math.sqrt(1 - zeta * zeta)) * Math.sin(wd * t));
      expect(Math.abs(i[n] - want)).toBeLessThan(1e-9);
    }
    const mp = Math.exp((-zeta * Math.PI) / Math.sqrt(1 - zeta * zeta));
    expect(Math.abs(i[200] - (1 + mp))).toBeLessThan(1e-9);
    let peak = 0;
    for (const v of i) peak = Math.max(peak, v);
    expect(peak).toBe(i[200]);
  });

  it('has the trapezoidal coefficients λ = μ = Δt/2 at a = 0 and is continuous across its series switch', () => {
    const dt = 1e-11;
    const z = poleCoefficients(0, 0, dt);
    expect(z.mu[0]).toBe(dt / 2);
    expect(z.lambda[0]).toBe(dt / 2);
    // the series (|aΔt| < 0.1) and the closed form meet without a jump: across z = aΔt = −0.1·(1 ± 1e-9)
    // μ/Δt = Σ z^k/(k+2)! changes by its derivative 1/6 + z/12 + z²/40 + … times Δz = −2e-10, to 1e-13
    const below = poleCoefficients((-0.1 * (1 - 1e-9)) / dt, 0, dt);
    const above = poleCoefficients((-0.1 * (1 + 1e-9)) / dt, 0, dt);
    const z0 = -0.1;
    const slope = 1 / 6 + z0 / 12 + (z0 * z0) / 40 + (z0 * z0 * z0) / 180;
    expect(Math.abs((above.mu[0] - below.mu[0]) / dt - slope * -2e-10)).toBeLessThan(1e-13);
  });

  it('stamps as a two-port between nodes: series R–L block into a resistor converges at second order to the analytic answer', () => {
    // Y = y(s)·[[1, −1], [−1, 1]], y = 1/(R + sL); node 1 held at V, node 2 to ground through Rg:
    // v2(t) = V·Rg/(R + Rg)·(1 − e^{−t(R+Rg)/L}). KCL at node 2: G21·v1 + G22·v2 + h2 + v2/Rg = 0.
    const R = 10;
    const L = 5e-9;
    const Rg = 40;
    const model: RationalModel = {
      ports: 2,
      poles: Float64Array.of(-R / L, 0),
      residues: Float64Array.of(1 / L, 0, -1 / L, 0, -1 / L, 0, 1 / L, 0),
      d: new Float64Array(4),
    };
    const errAt = (dt: number) => {
      const c = createCompanion(model, dt);
      const h = new Float64Array(2);
      c.v[0] = 1;
      const steps = Math.round(0.5e-9 / dt);
      let v2 = 0;
      for (let n = 0; n < steps; n++) {
        companionHistory(c, h);
        v2 = -(c.geq[2] * 1 + h[1]) / (c.geq[3] + 1 / Rg);
        companionAdvance(c, [1, v2]);
      }
      const want = (Rg / (R + Rg)) * (1 - Math.exp((-0.5e-9 * (R + Rg)) / L));
      return Math.abs(v2 - want);
    };
    const e1 = errAt(10e-12);
    const e2 = errAt(5e-12);
    expect(e1).toBeLessThan(1e-3);
    expect(e1 / e2).toBeGreaterThan(3.5); // Δt² (trapezoid-like for the exponential node voltage)
  });

  it('starts in DC steady state: constant voltage, constant current Y(0)·v', () => {
    const model: RationalModel = { ports: 1, poles: Float64Array.of(-3e9, 0, -1e9, 4e9), residues: Float64Array.of(2e9, 0, 1e9, 5e8), d: Float64Array.of(0.01) };
    const c = createCompanion(model, 5e-12);
    startAtDc(c, model, [0.8]);
    const y0 = evaluateModel(model, 0);
    const i = drive(c, () => 0.8, 50);
    for (let n = 1; n <= 50; n++) expect(Math.abs(i[n] - y0[0] * 0.8)).toBeLessThan(1e-12 * Math.abs(y0[0]));
  });
});
