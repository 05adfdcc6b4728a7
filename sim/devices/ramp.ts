// The open I/O buffer model standard's [Ramp]: the 20–80 % voltage swing dV of each edge and the time
// dt it takes, measured into R_load (50 Ω by default) — rising into R_load to ground, falling into R_load
// to the supply. From the ramp the model builds a linear V–t edge into that fixture (0–100 % in dt/0.6)
// between the settled levels its I/V tables give, and solves the switching coefficients from it with
// k_u + k_d = 1 (see waveform-fit.ts). The ramp is taken to include C_comp's loading and not the package
// (the standard's reading, from memory).
import type { BufferModel } from './buffer.js';
import { deviceDcPoint } from './dc.js';
import type { Fixture, VtWaveform } from './fixture.js';
import type { Switching } from './switching.js';
import { coefficientsFromWaveforms } from './waveform-fit.js';

export interface RampEdge {
  /** 20–80 % swing (V) and its duration (s). */
  dv: number;
  dt: number;
}

export interface Ramp {
  rising: RampEdge;
  falling: RampEdge;
  /** R_load (Ω). */
  rLoad: number;
}

/** The standard's ramp fixtures: rising into R_load to ground, falling into R_load to the supply. */
export function rampFixture(m: BufferModel, rising: boolean, rLoad: number): Fixture {
  return { r: rLoad, v: rising ? m.ground : m.supply, c: 0 };
}

/** Settled pin voltages before and after an edge into the ramp fixture. */
export function rampLevels(m: BufferModel, rising: boolean, rLoad: number): { from: number; to: number } {
  const f = rampFixture(m, rising, rLoad);
  const g = 1 / f.r;
  const bare = { ...m, pkg: undefined, switching: undefined };
  const low = deviceDcPoint(bare, 'low', g, f.v * g, m.name).vPin;
  const high = deviceDcPoint(bare, 'high', g, f.v * g, m.name).vPin;
  return rising ? { from: low, to: high } : { from: high, to: low };
}

/** The 20–80 % swing (V) the I/V tables give into the ramp fixture: 0.6 × |settled change|. */
export function expectedRampSwing(m: BufferModel, rising: boolean, rLoad: number): number {
  const { from, to } = rampLevels(m, rising, rLoad);
  return 0.6 * Math.abs(to - from);
}

/** A ramp as the linear V–t waveform into its fixture. */
export function rampWaveform(m: BufferModel, rising: boolean, ramp: Ramp): VtWaveform {
  const edge = rising ? ramp.rising : ramp.falling;
  const { from, to } = rampLevels(m, rising, ramp.rLoad);
  // a settled quarter after the ramp, so that the last coefficients are those of the steady state
  const d = edge.dt / 0.6;
  return { fixture: rampFixture(m, rising, ramp.rLoad), t: Float64Array.of(0, d, 1.25 * d), v: Float64Array.of(from, to, to) };
}

/** Switching coefficients from a ramp. */
export function switchingFromRamp(m: BufferModel, ramp: Ramp): Switching {
  const rising = coefficientsFromWaveforms(m, [rampWaveform(m, true, ramp)]).curve;
  const falling = coefficientsFromWaveforms(m, [rampWaveform(m, false, ramp)]).curve;
  return { rising, falling, source: `ramp into ${ramp.rLoad} Ω` };
}
