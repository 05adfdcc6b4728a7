import { describe, expect, it } from 'vitest';
import type { Signal } from '../../../sim/model.js';
import { residualArea } from '../../../src/measure/residual.js';

// Integral of absolute error of a first-order response: a step of height V through a time constant τ
// leaves ∫ V·e^(−t/τ) dt = V·τ behind (Ogata, Modern Control Engineering, 5th ed., §5.3 and the
// IAE index of §10: the first-order step response c(t) = 1 − e^(−t/T)). Divided by the swing: τ.
describe('residualArea', () => {
  const step: Signal = { kind: 'step', from: 0, to: 1, start: 0, rise: 1e-15 };
  it('equals the time constant of a first-order approach to a unit step (Ogata §5.3)', () => {
    const tau = 2e-9;
    const dt = 1e-12;
    const trace = Float64Array.from({ length: 40000 }, (_, i) => 2 * (1 - Math.exp(-(i * dt) / tau)));
    // settled levels 0 V and 2 V: the probe sees twice the source, the area is still τ
    expect(residualArea(trace, dt, step, 0, 2)).toBeCloseTo(tau, 12);
  });
  it('is zero for a waveform that follows the source exactly, and a rectangle for a pure delay', () => {
    const dt = 1e-12;
    const s: Signal = { kind: 'step', from: 0, to: 3.3, start: 1e-9, rise: 1e-10 };
    const exact = Float64Array.from({ length: 5000 }, (_, i) => {
      const t = i * dt;
      return t < 1e-9 ? 0 : t > 1e-9 + 1.25e-10 ? 3.3 : (3.3 * (t - 1e-9)) / 1.25e-10;
    });
    expect(residualArea(exact, dt, s, 0, 3.3)!).toBeLessThan(1e-15);
    // a delay of 500 ps: the error is a parallelogram of height 1 (in swings) and width 500 ps
    const late = Float64Array.from({ length: 5000 }, (_, i) => (i < 500 ? 0 : exact[i - 500]!));
    expect(residualArea(late, dt, s, 0, 3.3)!).toBeCloseTo(500e-12, 14);
  });
  it('has no value for a constant source', () => {
    expect(residualArea([0, 0, 0], 1e-12, { kind: 'step', from: 1, to: 1, start: 0, rise: 1e-9 }, 0, 1)).toBeNull();
  });
});
