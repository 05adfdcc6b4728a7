import { describe, expect, it } from 'vitest';
import type { Signal } from '../../sim/model.js';
import { activityEnd, fastestEdge, rampDuration, signalFunction } from '../../sim/signals.js';

// IEEE 181-2011: transition duration between the 10 % and 90 % reference levels. A linear ramp spends
// 80 % of its length between them, so a 10–90 % time t_r is a ramp of t_r/0.8.
describe('driver signals', () => {
  it('step: a linear ramp whose 10–90 % time is the given rise', () => {
    const s: Signal = { kind: 'step', from: 0, to: 3.3, start: 1e-9, rise: 0.8e-9 };
    const v = signalFunction(s);
    expect(rampDuration(0.8e-9)).toBeCloseTo(1e-9, 20);
    expect(v(0.5e-9)).toBe(0);
    expect(v(1.5e-9)).toBeCloseTo(1.65, 12);
    expect(v(2e-9)).toBeCloseTo(3.3, 12);
    // 10 % at 1.1 ns, 90 % at 1.9 ns: 0.8 ns apart
    expect(v(1.1e-9)).toBeCloseTo(0.33, 12);
    expect(v(1.9e-9)).toBeCloseTo(2.97, 12);
  });

  it('pulse: width is measured between the 50 % points', () => {
    const s: Signal = { kind: 'pulse', from: 0, to: 1, start: 0, rise: 0.4e-9, width: 4e-9, fall: 0.8e-9 };
    const v = signalFunction(s);
    expect(v(0.25e-9)).toBeCloseTo(0.5, 12); // rising 50 % at half of the 0.5 ns ramp
    expect(v(4.25e-9)).toBeCloseTo(0.5, 12); // falling 50 % one width later
    expect(v(4.25e-9 + 0.5e-9)).toBeCloseTo(0, 12);
    expect(activityEnd(s)).toBeCloseTo(4.75e-9, 20);
  });

  it('clock: period and duty between 50 % points', () => {
    const s: Signal = { kind: 'clock', low: 0, high: 1, period: 10e-9, rise: 0.8e-9, fall: 0.8e-9, duty: 0.4, start: 2e-9 };
    const v = signalFunction(s);
    expect(v(2.5e-9)).toBeCloseTo(0.5, 12);
    expect(v(6.5e-9)).toBeCloseTo(0.5, 12); // 40 % of the period later
    expect(v(12.5e-9)).toBeCloseTo(0.5, 12); // next rising edge
    expect(v(9e-9)).toBe(0);
  });

  it('bits: each bit boundary starts a ramp toward the new level, the pattern repeats', () => {
    const s: Signal = {
      kind: 'bits', low: 0, high: 1, bitTime: 1e-9, rise: 0.08e-9, fall: 0.16e-9, start: 0,
      bits: Uint8Array.from([1, 1, 0, 1]), patternName: '1101',
    };
    const v = signalFunction(s);
    expect(v(0.05e-9)).toBeCloseTo(0.5, 12);
    expect(v(1.5e-9)).toBe(1);
    expect(v(2.1e-9)).toBeCloseTo(0.5, 12); // falling ramp of 0.2 ns, midpoint 0.1 ns in
    expect(v(3.05e-9)).toBeCloseTo(0.5, 12);
    expect(v(4.5e-9)).toBe(1); // bit 0 again
    expect(fastestEdge(s)).toBe(0.08e-9);
  });

  it('table: piecewise linear, held at both ends', () => {
    const s: Signal = { kind: 'table', points: [[0, 0], [1e-9, 2], [3e-9, 2], [3.5e-9, -1]] };
    const v = signalFunction(s);
    expect(v(-1)).toBe(0);
    expect(v(0.5e-9)).toBeCloseTo(1, 12);
    expect(v(3.25e-9)).toBeCloseTo(0.5, 12);
    expect(v(1)).toBe(-1);
    expect(fastestEdge(s)).toBeCloseTo(0.4e-9, 20);
  });
});
