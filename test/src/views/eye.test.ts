// Eye diagram measurement (src/views/eye.ts) against closed-form results.
//
// The ideal channel: a driver of resistance Rs = Z0 into a lossless line of impedance Z0 terminated in
// RL = Z0. Nothing reflects (Γ = (RL − Z0)/(RL + Z0) = 0), and the receiver sees the source waveform
// times Z0/(Rs + Z0) = 1/2, delayed by the line's one-way delay TD = ℓ·√(L′C′) (Pozar, Microwave
// Engineering, 4th ed., §2.3–2.4). At Courant number 1 the leapfrog solution of a lossless line is exact
// (Taflove & Hagness, Computational Electrodynamics, ch. 2), so the simulated receiver is that waveform.
//
// Eye width of a ramp-edged NRZ signal, derived here. Each edge is a linear ramp starting on a bit
// boundary b_k and lasting D = t_10–90 / 0.8 (IEEE Std 181-2011: a linear ramp spends 80 % of its
// duration between its 10 % and 90 % levels). A ramp crosses the fraction f of its swing f·D after it
// starts. With thresholds at the fractions a (vil) and c (vih) of the swing, a "1" between a rising and a
// falling edge is above vih from b_k + c·D_r to b_{k+1} + (1 − c)·D_f; a "0" between a falling and a
// rising edge is below vil from b_k + (1 − a)·D_f to b_{k+1} + a·D_r. The eye is open where every window
// is on its side, i.e. from max(c·D_r, (1 − a)·D_f) to UI + min((1 − c)·D_f, a·D_r):
//   width = UI − max(c·D_r, (1 − a)·D_f) + min((1 − c)·D_f, a·D_r).
// - One threshold at 50 % (a = c = 1/2): width = UI − max(D_r, D_f)/2 + min(D_r, D_f)/2 = UI − |D_r − D_f|/2,
//   a full UI when rise and fall are equal: the 50 % crossings of an ideal eye are one UI apart.
// - vil, vih at 10 %, 90 % and equal edges: width = UI − 0.8·D = UI − t_10–90.
// - vil, vih → 0 %, 100 %: width → UI − D = UI − t_10–90/0.8, the time the ideal eye is open at its full
//   height (the value the issue quotes; it is the limit of the full-swing band, not the 50 % width).
// Tolerance: ±1 sample interval, as the crossings are interpolated between samples.
import { beforeAll, describe, expect, it } from 'vitest';
import type { Net, Signal } from '../../../sim/model.js';
import { prbs } from '../../../sim/prbs.js';
import { rampDuration } from '../../../sim/signals.js';
import { simulate } from '../../../sim/simulate.js';
import {
  EYE_MIN_WINDOWS,
  eyeCoverageNote,
  eyeDensity,
  eyeInputOf,
  eyeRunDuration,
  eyeTiming,
  foldEye,
  levelCrossings,
  measureEye,
  type EyeInput,
} from '../../../src/views/eye.js';
import { lineOf, net, part } from '../../support/nets.js';

const UI = 1e-9;
const TPD = 6e-9; // s/m
const Z0 = 50;

function bitsSignal(rise: number, fall: number, bits = prbs(7), start = 0): Signal {
  return { kind: 'bits', low: 0, high: 1, bitTime: UI, rise, fall, start, bits, patternName: 'prbs7' };
}

/** Matched, lossless (or constant-R′) channel, run long enough for the whole pattern. */
function channel(signal: Signal, length: number, rPerM = 0): Net {
  const n = net({
    signal,
    rs: Z0,
    route: [{ kind: 'line', name: 'ch', line: lineOf(Z0, TPD, rPerM), length }],
    receiver: [part({ r: Z0 })],
  });
  n.run.duration = eyeRunDuration(n);
  return n;
}

function eyeAt(n: Net, opts: Partial<Pick<EyeInput, 'thresholds' | 'samplingPhase'>> = {}) {
  const result = simulate(n);
  return { eye: measureEye(eyeInputOf(n, result, 'receiver', opts)), dt: result.record.dtSample, plan: result.discretization };
}

describe('eye of the ideal channel (matched, lossless)', () => {
  const length = 0.2;
  const td = length * TPD;

  it('equal edges: height = full swing at the receiver, width = one UI at 50 %, delay = TD', () => {
    const rise = 200e-12;
    const { eye, dt, plan } = eyeAt(channel(bitsSignal(rise, rise), length));
    expect(plan.segments[0].courant).toBe(1); // exact lossless propagation
    const swing = 0.5; // Vs·Z0/(Rs + Z0), Pozar §2.4
    expect(eye.windows).toBeGreaterThanOrEqual(127); // one whole PRBS-7 period (ITU-T O.150: 2^7 − 1 bits)
    expect(eye.ones).toBeGreaterThan(0);
    expect(eye.zeros).toBeGreaterThan(0);
    expect(eye.eyeHeight!).toBeCloseTo(swing, 6);
    expect(eye.levels.swing).toBeCloseTo(swing, 6);
    expect(eye.threshold.level).toBeCloseTo(swing / 2, 6);
    expect(Math.abs(eye.eyeWidth! - UI)).toBeLessThanOrEqual(dt);
    expect(Math.abs(eye.delay - td)).toBeLessThanOrEqual(dt); // TD = ℓ·√(L′C′)
    // sampled at the UI centre: TD + UI/2 + (D_r + D_f)/4 after each bit starts at the driver
    expect(Math.abs(eye.samplingTime - (td + UI / 2 + rampDuration(rise) / 2))).toBeLessThanOrEqual(dt);
    expect(eye.open).toBe(true);
  });

  it('unequal edges: width at 50 % = UI − |D_r − D_f|/2', () => {
    const rise = 200e-12, fall = 100e-12;
    const { eye, dt } = eyeAt(channel(bitsSignal(rise, fall), length));
    const expected = UI - Math.abs(rampDuration(rise) - rampDuration(fall)) / 2;
    expect(eye.eyeHeight!).toBeCloseTo(0.5, 6);
    expect(Math.abs(eye.eyeWidth! - expected)).toBeLessThanOrEqual(dt);
  });

  it('vil, vih at the 10 % and 90 % levels: width = UI − t_10–90', () => {
    const rise = 200e-12;
    const { eye, dt } = eyeAt(channel(bitsSignal(rise, rise), length), { thresholds: { vil: 0.05, vih: 0.45 } });
    expect(eye.threshold.source).toBe('vih/vil');
    expect(eye.eyeHeight!).toBeCloseTo(0.5, 6);
    expect(Math.abs(eye.eyeWidth! - (UI - rise))).toBeLessThanOrEqual(dt);
  });

  it('vil, vih at 1 % and 99 %: width = UI − 0.98·D, within 2 % of D of UI − t_10–90/0.8', () => {
    const rise = 200e-12;
    const D = rampDuration(rise);
    const { eye, dt } = eyeAt(channel(bitsSignal(rise, rise), length), { thresholds: { vil: 0.005, vih: 0.495 } });
    expect(Math.abs(eye.eyeWidth! - (UI - 0.98 * D))).toBeLessThanOrEqual(dt);
    expect(Math.abs(eye.eyeWidth! - (UI - D))).toBeLessThanOrEqual(0.02 * D + dt);
  });

  it('a clock: UI = period/2, height = full swing, width = one UI at 50 %', () => {
    const period = 4e-9, rise = 200e-12;
    const clock: Signal = { kind: 'clock', low: 0, high: 1, period, rise, fall: rise, duty: 0.5, start: 0 };
    const { eye, dt } = eyeAt(channel(clock, length));
    expect(eye.ui).toBe(period / 2);
    expect(eye.windows).toBeGreaterThanOrEqual(64);
    expect(eye.eyeHeight!).toBeCloseTo(0.5, 6);
    expect(Math.abs(eye.eyeWidth! - period / 2)).toBeLessThanOrEqual(dt);
  });
});

describe('eye of a lossy channel (constant R′ = 40 Ω/m, matched ends)', () => {
  const rPerM = 40;
  const lengths = [0.25, 0.5, 1, 2];
  let eyes: { len: number; eye: ReturnType<typeof measureEye> }[] = [];
  beforeAll(() => {
    eyes = lengths.map((len) => ({ len, eye: eyeAt(channel(bitsSignal(200e-12, 200e-12), len, rPerM)).eye }));
  });

  it('closes monotonically as the line gets longer (height and width both shrink)', () => {
    for (let i = 1; i < eyes.length; i++) {
      expect(eyes[i].eye.eyeHeight!).toBeLessThan(eyes[i - 1].eye.eyeHeight!);
      expect(eyes[i].eye.eyeWidth!).toBeLessThan(eyes[i - 1].eye.eyeWidth!);
    }
    expect(eyes[0].eye.eyeHeight!).toBeLessThan(0.5); // below the lossless swing
  });

  it('is never taller than the DC swing at the receiver, Vs·RL/(Rs + R′ℓ + RL) (Ohm’s law divider)', () => {
    for (const { len, eye } of eyes) {
      const dcSwing = Z0 / (Z0 + rPerM * len + Z0);
      expect(eye.eyeHeight!).toBeGreaterThan(0);
      expect(eye.eyeHeight!).toBeLessThanOrEqual(dcSwing + 1e-9);
    }
  });
});

describe('eye measurement on hand-built waveforms', () => {
  // Bits 1,0,1,0,… sampled every 10 ps with instant edges at the bit boundaries; levels 0 and 1 V.
  const dt = 10e-12;
  const bits = Uint8Array.from({ length: 16 }, (_, i) => (i % 2 === 0 ? 1 : 0));
  const signal: Signal = { kind: 'bits', low: 0, high: 1, bitTime: UI, rise: 8e-12, fall: 8e-12, start: 0, bits, patternName: '10' };
  const perBit = Math.round(UI / dt);
  function waveform(edit?: (v: Float64Array) => void): Float64Array {
    const v = new Float64Array(16 * perBit + 1);
    for (let i = 0; i < v.length; i++) v[i] = bits[Math.min(15, Math.floor(i / perBit))];
    edit?.(v);
    return v;
  }

  it('a "0" above a "1" at the sampling instant gives a negative height and a closed eye (definition)', () => {
    const v = waveform((w) => {
      // bit 4 is a "1", bit 5 a "0": lower the one to 0.7 V and raise the zero to 0.8 V around their centres
      for (let i = 4 * perBit + 30; i < 4 * perBit + 70; i++) w[i] = 0.7;
      for (let i = 5 * perBit + 30; i < 5 * perBit + 70; i++) w[i] = 0.8;
    });
    const eye = measureEye({ signal, values: v, dt, delay: 0 });
    expect(eye.lowestOne).toBeCloseTo(0.7, 12);
    expect(eye.highestZero).toBeCloseTo(0.8, 12);
    expect(eye.eyeHeight!).toBeCloseTo(-0.1, 12);
    expect(eye.open).toBe(false);
    expect(eye.eyeWidth).toBe(0);
  });

  it('takes the eye height over the sampling window: a dip inside it counts, one outside it does not (definition)', () => {
    // The sampling instant of bit k is k·UI + UI/2 + (D_r + D_f)/4 = k·UI + 505 ps (ramps of 10 ps). Bit 4
    // ("1") dips to 0.6 V from 540 to 560 ps into the bit: 35–55 ps after its sampling instant.
    const v = waveform((w) => {
      for (let i = 4 * perBit + 54; i <= 4 * perBit + 56; i++) w[i] = 0.6;
    });
    const wide = measureEye({ signal, values: v, dt, delay: 0, samplingWindow: 0.2 }); // ±100 ps
    expect(wide.samplingWindow.width).toBeCloseTo(200e-12, 18);
    expect(wide.lowestOne).toBeCloseTo(0.6, 12);
    expect(wide.eyeHeight!).toBeCloseTo(0.6, 12);
    const narrow = measureEye({ signal, values: v, dt, delay: 0, samplingWindow: 0.05 }); // ±25 ps
    expect(narrow.eyeHeight!).toBeCloseTo(1, 12);
    // the default window is the central fifth of the UI (common practice)
    expect(measureEye({ signal, values: v, dt, delay: 0 }).samplingWindow.share).toBe(0.2);
  });

  it('warns when a threshold lies beyond the signal’s levels; such an eye is closed, whatever the gap between the traces', () => {
    // a 0 … 1 V signal read with vih = 1.2 V: no "1" reaches vih
    const eye = measureEye({ signal, values: waveform(), dt, delay: 0, thresholds: { vih: 1.2, vil: 0.3 } });
    expect(eye.open).toBe(false);
    expect(eye.eyeHeight!).toBeCloseTo(1, 12); // the gap between the 1s and 0s is still reported in the data
    expect(eye.warnings.join()).toMatch(/vih 1\.2 V is above the signal's high level 1 V/);
    expect(measureEye({ signal, values: waveform(), dt, delay: 0, thresholds: { vih: 0.7, vil: 0.3 } }).warnings).toEqual([]);
  });

  it('notes an eye of fewer than ten windows as too few to trust', () => {
    // 16 bits of 1 ns hold 14 complete two-UI windows; the first 8 bits only 6
    const short = waveform().subarray(0, 8 * perBit + 1);
    const eye = measureEye({ signal, values: short, dt, delay: 0 });
    expect(eye.windows).toBeLessThan(EYE_MIN_WINDOWS);
    expect(eye.notes.windows).toMatch(/too few for an eye to trust/);
    expect(measureEye({ signal, values: waveform(), dt, delay: 0 }).notes.windows).toBeUndefined();
  });

  it('a glitch across the threshold shortens the width to the time on the right side (definition)', () => {
    // bit 6 ("1") dips to 0.2 V from 700 ps to 800 ps into the bit: open only until 700 ps (the dip
    // starts between samples 69 and 70: 1 V → 0.2 V crosses 0.5 V at 690 ps + 0.625·10 ps = 696.25 ps)
    const v = waveform((w) => {
      for (let i = 6 * perBit + 70; i < 6 * perBit + 80; i++) w[i] = 0.2;
    });
    const eye = measureEye({ signal, values: v, dt, delay: 0 });
    const centre = UI / 2 + (rampDuration(8e-12) * 2) / 4; // where bit k's window puts the bit's start + UI/2
    // inside the window, bit 6 starts at UI − centre + UI/2 … the opening ends where the dip crosses 0.5 V
    const windowStartOfBit = UI - centre; // x of the bit boundary b_6 in its own window
    expect(eye.openTo!).toBeCloseTo(windowStartOfBit + 696.25e-12, 15);
  });

  it('finds level crossings by linear interpolation between samples', () => {
    const c = levelCrossings([0, 2, 0, 0, 4], 0, 1, 1);
    expect(c).toEqual([
      { t: 0.5, rising: true },
      { t: 1.5, rising: false },
      { t: 3.25, rising: true },
    ]);
  });

  it('draws a sparsely sampled straight trace as a continuous line: every column and row hit once', () => {
    // One window, three samples across 2 UI going from the bottom to the top of the grid. A line-drawing
    // digital differential analyzer lights at least one cell in every column and row it spans.
    const t = eyeTiming(signal)!;
    const n = 40;
    const input: EyeInput = { signal, values: [0, 0.5, 1], dt: UI, delay: 0 };
    const counts = eyeDensity(input, { timing: t, bits: [0], starts: [0] }, { nx: n, ny: n, yRange: [0, 1] });
    for (let ix = 0; ix < n; ix++) {
      let col = 0;
      for (let iy = 0; iy < n; iy++) col += counts[iy * n + ix];
      expect(col).toBeGreaterThanOrEqual(1);
    }
    for (let iy = 0; iy < n; iy++) {
      let row = 0;
      for (let ix = 0; ix < n; ix++) row += counts[iy * n + ix];
      expect(row).toBeGreaterThanOrEqual(1);
    }
    expect(Math.max(...counts)).toBe(1); // one trace: one hit per cell it passes
  });
});

describe('eye timing and run length', () => {
  it('a clock has UI = period/2 with alternating bits, starting high', () => {
    const t = eyeTiming({ kind: 'clock', low: 0, high: 3.3, period: 40e-9, rise: 1e-9, fall: 1e-9, duty: 0.5, start: 1e-9 })!;
    expect(t.ui).toBe(20e-9);
    expect([0, 1, 2, 3].map(t.bit)).toEqual([1, 0, 1, 0]);
    expect(eyeTiming({ kind: 'step', from: 0, to: 1, start: 0, rise: 1e-9 })).toBeNull();
  });

  it('runs the whole PRBS-7 period (127 bits, ITU-T O.150) plus 2 UI and the settle time 7·TD', () => {
    const n = channel(bitsSignal(200e-12, 200e-12), 0.5);
    n.run.duration = undefined;
    expect(eyeRunDuration(n)).toBeCloseTo(129 * UI + 7 * 0.5 * TPD, 18);
  });

  it('repeats a short pattern until it covers at least 127 bits', () => {
    const n = channel(bitsSignal(200e-12, 200e-12, Uint8Array.from([1, 0, 1, 1])), 0.5);
    n.run.duration = undefined;
    expect(eyeRunDuration(n)).toBeCloseTo((128 + 2) * UI + 7 * 0.5 * TPD, 18); // 32 repeats of 4 bits
  });

  it('flags an eye that folds less than one pattern pass', () => {
    expect(eyeCoverageNote({ windows: 3, signal: 'bits', patternLength: 127, pattern: 'prbs7' })).toMatch(/only 3 windows/);
    expect(eyeCoverageNote({ windows: 130, signal: 'bits', patternLength: 127, pattern: 'prbs7' })).toBeNull();
  });

  it('folds only complete windows inside the record', () => {
    const v = new Float64Array(1001); // 10 UI at 10 ps
    const { windows } = foldEye({ signal: bitsSignal(8e-12, 8e-12), values: v, dt: 10e-12, delay: 0 });
    for (const s of windows.starts) {
      expect(s).toBeGreaterThanOrEqual(0);
      expect(s + 2 * UI).toBeLessThanOrEqual(1000 * 10e-12 + 1e-21);
    }
    expect(windows.bits.length).toBe(8);
  });
});
