import { describe, expect, it } from 'vitest';
import { coefficientsAt, edgeSchedule } from '../../../sim/devices/schedule.js';
import { linearSwitching } from '../../../sim/devices/switching.js';
import { rampDuration } from '../../../sim/signals.js';

describe('edge schedule from the signal kinds', () => {
  it('a clock starts a rising edge each period and a falling one where its ramp starts (IEEE 181 50 % duty)', () => {
    const s = edgeSchedule({ kind: 'clock', low: 0, high: 3.3, period: 10e-9, rise: 1e-9, fall: 1e-9, duty: 0.5, start: 2e-9 }, 25e-9);
    expect(s.initialHigh).toBe(false);
    [2e-9, 7e-9, 12e-9, 17e-9, 22e-9].forEach((t, k) => expect(s.times[k]).toBeCloseTo(t, 20));
    expect(s.times.length).toBe(5);
    expect(Array.from(s.rising)).toEqual([1, 0, 1, 0, 1]);
  });

  it('bits change state only where the bit value changes', () => {
    const s = edgeSchedule({ kind: 'bits', low: 0, high: 1, bitTime: 1e-9, rise: 1e-10, fall: 1e-10, start: 0, bits: Uint8Array.of(1, 1, 0, 1), patternName: 'x' }, 4e-9);
    [0, 2e-9, 3e-9].forEach((t, k) => expect(s.times[k]).toBeCloseTo(t, 20));
    expect(s.times.length).toBe(3);
    expect(Array.from(s.rising)).toEqual([1, 0, 1]);
  });

  it('a falling step idles high, and the coefficients before the edge are the settled high state', () => {
    const sw = linearSwitching(1e-9, 1e-9);
    const s = edgeSchedule({ kind: 'step', from: 3.3, to: 0, start: 1e-9, rise: 0.8e-9 }, 5e-9);
    expect(s.initialHigh).toBe(true);
    const c = { ku: 0, kd: 0 };
    expect(coefficientsAt(sw, s, 0.5e-9, c)).toEqual({ ku: 1, kd: 0 });
    coefficientsAt(sw, s, 1.5e-9, c);
    expect(c.ku).toBeCloseTo(0.5, 12);
    expect(c.kd).toBeCloseTo(0.5, 12);
    expect(coefficientsAt(sw, s, 3e-9, c)).toEqual({ ku: 0, kd: 1 });
  });

  it('a pulse falls where the signal\'s falling ramp starts (width measured 50 % to 50 %)', () => {
    const s = edgeSchedule({ kind: 'pulse', from: 0, to: 1, start: 1e-9, rise: 0.8e-9, width: 5e-9, fall: 1.6e-9 }, 20e-9);
    expect(s.times[1]).toBeCloseTo(1e-9 + rampDuration(0.8e-9) / 2 + 5e-9 - rampDuration(1.6e-9) / 2, 20);
  });
});
