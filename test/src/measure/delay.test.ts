// Delay from the driver's source waveform to a probe.
import { describe, expect, it } from 'vitest';
import { measureProbe } from '../../../src/measure/summary.js';
import { jsonProblems, rcStep, sample, trapezoidClock } from './waveforms.js';

const ns = 1e-9;
const ps = 1e-12;

describe('delay', () => {
  // A waveform shifted by a known time d: every 50 %-to-50 % delay is d (linear edges, so linear
  // interpolation between samples is exact), whatever the shift's fraction of a sample.
  it('a shifted copy of the source: delay50 = the shift on every edge', () => {
    const dt = 5 * ps;
    const shift = 1.2345 * ns;
    const clock = trapezoidClock(2 * ns, 10 * ns, 1 * ns, 0, 3.3);
    const n = Math.round(38.5 * ns / dt); // ends before the shifted copy of the last falling edge
    const src = sample(clock, dt, n);
    const probe = sample((t) => clock(t - shift), dt, n);
    const m = measureProbe(probe, dt, { source: src, thresholds: 'lvcmos33' });
    expect(m.delays).not.toBeNull();
    const d = m.delays!;
    expect(d.map((x) => x.direction)).toEqual(['rising', 'falling', 'rising', 'falling', 'rising', 'falling', 'rising', 'falling']);
    // the last source edge (falling at 37.5 ns) has no probe edge before the end of the record
    const matched = d.filter((x) => x.probeEdge !== null);
    expect(matched).toHaveLength(7);
    for (const x of matched) {
      expect(x.delay50!).toBeCloseTo(shift, 15);
      // to the logic threshold: vih = 2.0 V is reached 2.0/3.3 of the way up a 1 ns ramp whose 50 % point
      // is at 0.5 ns; vil = 0.8 V is (3.3 − 0.8)/3.3 of the way down.
      const frac = x.direction === 'rising' ? 2.0 / 3.3 : (3.3 - 0.8) / 3.3;
      expect(x.delayThresholdFirst!).toBeCloseTo(shift + (frac - 0.5) * ns, 15);
      expect(x.delayThresholdLast!).toBeCloseTo(shift + (frac - 0.5) * ns, 15);
    }
    const last = d[d.length - 1]!;
    expect(last.probeEdge).toBeNull();
    expect(last.delay50).toBeNull();
    expect(last.reasons.delay50).toMatch(/no falling probe edge/);
    expect(last.cutOff).toBe(true);
    expect(m.flags.map((f) => f.code)).toContain('unmatched-source-edge');
    expect(jsonProblems(m)).toEqual([]);
    expect(JSON.parse(JSON.stringify(m))).toEqual(m);
  });

  it('an RC-filtered copy: delay50 = shift + τ·ln 2 (first-order response reaches 50 % at ln 2·τ)', () => {
    const dt = 1 * ps;
    const tau = 100 * ps;
    const shift = 0.5 * ns;
    const n = 6000;
    // the source is an ideal step at 1 ns (50 % instant at the step, by interpolation between 0 and 1)
    const src = sample((t) => (t < 1 * ns - dt / 2 ? 0 : 1), dt, n);
    const probe = sample(rcStep(1 * ns + shift, tau), dt, n);
    const m = measureProbe(probe, dt, { source: src, nominal: { low: 0, high: 1 } });
    const srcT50 = m.delays![0]!.sourceT50;
    expect(m.delays![0]!.delay50!).toBeCloseTo(1 * ns + shift + tau * Math.log(2) - srcT50, 14);
    expect(m.delays![0]!.reasons.delayThresholdFirst).toMatch(/no logic thresholds/);
  });

  it('a probe with no edge: every delay is null with a reason', () => {
    const dt = 10 * ps;
    const src = sample(trapezoidClock(1 * ns, 10 * ns, 1 * ns), dt, 2000);
    const m = measureProbe(new Float64Array(2000), dt, { source: src });
    expect(m.delays!.length).toBeGreaterThan(0);
    expect(m.delays!.every((x) => x.delay50 === null && /no (rising|falling) probe edge/.test(x.reasons.delay50!))).toBe(true);
  });

  it('without a source there are no delays, and the reason says so', () => {
    const m = measureProbe(new Float64Array(10), 1e-12);
    expect(m.delays).toBeNull();
    expect(m.reasons.delays).toMatch(/no source/);
  });
});
