import { describe, expect, it } from 'vitest';
import { runIntoFixture, waveformAt, type Fixture, type VtWaveform } from '../../../sim/devices/fixture.js';
import { driveStrengthModel } from '../../../sim/devices/simple.js';
import { coefficientsFromWaveforms } from '../../../sim/devices/waveform-fit.js';
import { evalSwitching, type Switching, type SwitchingCurve } from '../../../sim/devices/switching.js';
import type { BufferModel } from '../../../sim/devices/buffer.js';

// A "true" buffer whose pull-up and pull-down switch on and off at different paces (not complementary),
// with a die capacitance: its waveforms into two fixtures are what a model maker would measure.
function smooth(n: number, dtau: number, start: number, dur: number, from: number, to: number): Float64Array {
  return Float64Array.from({ length: n }, (_, k) => {
    const x = Math.min(1, Math.max(0, (k * dtau - start) / dur));
    return from + (to - from) * (0.5 - 0.5 * Math.cos(Math.PI * x));
  });
}

function trueSwitching(): Switching {
  const n = 301;
  const dtau = 10e-12;
  const rising: SwitchingCurve = { dtau, ku: smooth(n, dtau, 200e-12, 900e-12, 0, 1), kd: smooth(n, dtau, 150e-12, 500e-12, 1, 0) };
  const falling: SwitchingCurve = { dtau, ku: smooth(n, dtau, 150e-12, 600e-12, 1, 0), kd: smooth(n, dtau, 250e-12, 1100e-12, 0, 1) };
  return { rising, falling, source: 'test' };
}

const base = driveStrengthModel({ name: 'hb33', supply: 3.3, current: 12e-3, rise: 1e-9, fall: 1e-9, cComp: 2.5e-12 });
const truth: BufferModel = { ...base, switching: trueSwitching() };
const fixtures: Fixture[] = [
  { r: 50, v: 0, c: 0 },
  { r: 50, v: 3.3, c: 1e-12 },
];
const duration = 4e-9;

/** The waveforms a model maker would publish: the true buffer's response sampled at 100 points. */
function published(rising: boolean): VtWaveform[] {
  return fixtures.map((fixture) => {
    const run = runIntoFixture(truth, rising, fixture, duration, 1e-12);
    const t = Float64Array.from({ length: 100 }, (_, k) => (k * duration) / 99);
    return { fixture, t, v: t.map((x) => waveformAt(run, x)) };
  });
}

describe('switching coefficients from V–t waveforms (two-equation method)', () => {
  for (const rising of [true, false]) {
    it(`reproduce their own ${rising ? 'rising' : 'falling'} waveforms into both fixtures within 1 % of swing`, () => {
      const waves = published(rising);
      const fit = coefficientsFromWaveforms(base, waves);
      expect(fit.method).toBe('two waveforms');
      const other = coefficientsFromWaveforms(base, published(!rising)).curve;
      const model: BufferModel = { ...base, switching: { rising: rising ? fit.curve : other, falling: rising ? other : fit.curve, source: 'fit' } };
      for (const w of waves) {
        const swing = Math.abs(w.v[w.v.length - 1] - w.v[0]);
        const rerun = runIntoFixture(model, rising, w.fixture, duration, 2e-12);
        let worst = 0;
        for (let k = 0; k < w.t.length; k++) worst = Math.max(worst, Math.abs(waveformAt(rerun, w.t[k]) - w.v[k]));
        expect(worst / swing, `fixture ${w.fixture.r} Ω to ${w.fixture.v} V`).toBeLessThan(0.01);
      }
    });
  }

  it('recover the true, non-complementary coefficients where the edge is under way', () => {
    const fit = coefficientsFromWaveforms(base, published(true)).curve;
    const c = { ku: 0, kd: 0 };
    const t = { ku: 0, kd: 0 };
    for (const tau of [400e-12, 600e-12, 800e-12]) {
      evalSwitching(fit, tau, c);
      evalSwitching(truth.switching!.rising, tau, t);
      expect(Math.abs(c.ku - t.ku)).toBeLessThan(0.03);
      expect(Math.abs(c.kd - t.kd)).toBeLessThan(0.03);
    }
    // the truth is not complementary here, and the fit sees it
    evalSwitching(fit, 600e-12, c);
    expect(Math.abs(c.ku + c.kd - 1)).toBeGreaterThan(0.2);
  });
});
