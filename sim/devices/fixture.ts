// Test fixtures of switching waveforms (the open I/O buffer model standard's [Rising Waveform] and
// [Falling Waveform]): a resistor R_fixture from the pin to V_fixture, and optionally C_fixture from
// the pin to ground. A model's own reproduction of a waveform is a run of the device into its fixture.
import type { BufferModel } from './buffer.js';
import { deviceDcPoint } from './dc.js';
import { deviceStepper, startDevice, stepDevice } from './stepper.js';

export interface Fixture {
  /** R_fixture (Ω), V_fixture (V), C_fixture (F, 0 when absent). */
  r: number;
  v: number;
  c: number;
}

/** A voltage–time waveform at the pin, measured into `fixture`; times increasing from the edge's start. */
export interface VtWaveform {
  fixture: Fixture;
  t: Float64Array;
  v: Float64Array;
}

/** Linear interpolation of a waveform, holding its first and last values outside. */
export function waveformAt(w: { t: Float64Array; v: Float64Array }, t: number): number {
  const n = w.t.length;
  if (t <= w.t[0]) return w.v[0];
  if (t >= w.t[n - 1]) return w.v[n - 1];
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (w.t[mid] <= t) lo = mid;
    else hi = mid;
  }
  return w.v[lo] + ((w.v[hi] - w.v[lo]) * (t - w.t[lo])) / (w.t[hi] - w.t[lo]);
}

/**
 * Runs `model` (its package left out: fixture waveforms describe the die pad) into `fixture` from its
 * settled state before the edge through one edge starting at t = 0, for `duration` with time step dt.
 */
export function runIntoFixture(model: BufferModel, rising: boolean, fixture: Fixture, duration: number, dt: number): { t: Float64Array; v: Float64Array; iterations: { mean: number; max: number } } {
  const bare: BufferModel = { ...model, pkg: undefined };
  const n = Math.max(1, Math.ceil(duration / dt - 1e-9));
  const st = deviceStepper(bare, dt, `${model.name} into its fixture`, { initialHigh: !rising, times: Float64Array.of(0), rising: Uint8Array.of(rising ? 1 : 0) });
  const g0 = 1 / fixture.r;
  const dc = deviceDcPoint(bare, rising ? 'low' : 'high', g0, fixture.v * g0);
  startDevice(st, dc.vPin, dc.iPin);
  const t = new Float64Array(n + 1);
  const v = new Float64Array(n + 1);
  v[0] = dc.vPin;
  const gcf = (2 * fixture.c) / dt;
  let icf = 0;
  for (let k = 1; k <= n; k++) {
    const hist = gcf * st.vPin + icf;
    const vp = stepDevice(st, k, g0 + gcf, fixture.v * g0 + hist);
    icf = gcf * vp - hist;
    t[k] = k * dt;
    v[k] = vp;
  }
  return { t, v, iterations: { mean: st.iterations / st.steps, max: st.maxIterations } };
}
