// Residual area: how far a probe's waveform strays from the level the net would hold if it settled
// at once, integrated over the record and divided by the probe's settled swing:
//
//   A = (1 / |v_H − v_L|) · ∫ |v(t) − v_ideal(t)| dt,   v_ideal(t) = v_L + (v_H − v_L)·(s(t) − low)/(high − low)
//
// with s(t) the driver's source, low/high its nominal levels and v_L, v_H the probe's settled levels
// for them (the DC operating point). It is the integral-of-absolute-error figure of control theory
// (IAE) applied to the settled response; the termination advisor uses it to order candidates whose
// settling times tie (any reflection left over, however small, adds area; the line's delay adds the
// same amount to every candidate). Unit: seconds. Trapezoidal sum over the recorded samples.
import type { Signal } from '../../sim/model.js';
import { nominalLevels, signalFunction } from '../../sim/signals.js';

/** The residual area (s) of `trace` (sample i at t = i·dt) against the settled levels vL, vH. */
export function residualArea(trace: ArrayLike<number>, dt: number, signal: Signal, vL: number, vH: number): number | null {
  const { low, high } = nominalLevels(signal);
  const swing = vH - vL;
  if (!(high > low) || !(Math.abs(swing) > 0) || trace.length < 2) return null;
  const s = signalFunction(signal);
  const err = (i: number) => Math.abs(trace[i]! - (vL + (swing * (s(i * dt) - low)) / (high - low)));
  let sum = 0;
  let prev = err(0);
  for (let i = 1; i < trace.length; i++) {
    const e = err(i);
    sum += 0.5 * (prev + e);
    prev = e;
  }
  return (sum * dt) / Math.abs(swing);
}
