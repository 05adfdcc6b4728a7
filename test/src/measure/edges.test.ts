// Edge measurements against waveforms whose answers are known in closed form.
import { describe, expect, it } from 'vitest';
import { measureProbe } from '../../../src/measure/summary.js';
import { analyzeEdges } from '../../../src/measure/edges.js';
import { stateLevels } from '../../../src/measure/levels.js';
import { bisect, dampedCosine, jsonProblems, pwl, ramp, rcStep, sample, secondOrderStep, trapezoidClock } from './waveforms.js';

const ns = 1e-9;
const ps = 1e-12;

describe('transition durations', () => {
  // IEEE Std 181-2011: transition duration is the interval between the 10 % and 90 % reference level
  // instants; on a linear ramp from 0 % to 100 % lasting T that is exactly 0.8·T (and 0.6·T for 20–80 %).
  it('linear ramp: 10–90 % = 0.8 of its duration, 20–80 % = 0.6', () => {
    for (const T of [1 * ns, 0.37 * ns, 2.5 * ns]) {
      const dt = 1 * ps;
      const v = sample(ramp(1.0037 * ns, T), dt, Math.round((3 * ns + T) / dt));
      const m = measureProbe(v, dt);
      expect(m.edges).toHaveLength(1);
      const e = m.edges[0]!;
      expect(e.direction).toBe('rising');
      expect(e.duration1090! / T).toBeCloseTo(0.8, 9);
      expect(e.duration2080! / T).toBeCloseTo(0.6, 9);
      expect(e.t50).toBeCloseTo(1.0037 * ns + T / 2, 20);
      expect(e.monotonic).toBe(true);
      expect(e.crossings).toBe(1);
      expect(e.overshootV).toBe(0);
    }
  });

  it('falling linear ramp: 90–10 % = 0.8 of its duration', () => {
    const T = 0.8 * ns;
    const dt = 2 * ps;
    const v = sample(ramp(1 * ns, T, 3.3, 0), dt, 2000);
    const m = measureProbe(v, dt);
    expect(m.edges).toHaveLength(1);
    const e = m.edges[0]!;
    expect(e.direction).toBe('falling');
    expect(e.duration1090! / T).toBeCloseTo(0.8, 9);
    expect(e.t90!).toBeLessThan(e.t10!);
    expect(e.slewRate!).toBeLessThan(0);
  });

  // First-order (RC) response 1 − e^(−t/τ): the 10 % and 90 % points are at τ·ln(10/9) and τ·ln 10, so
  // 10–90 % = τ·ln 9 ≈ 2.197·τ (the "2.2 τ" of common practice), 20–80 % = τ·ln 4 ≈ 1.386·τ ("1.39 τ").
  it('exponential RC edge: 10–90 % = ln 9·τ ≈ 2.2 τ, 20–80 % = ln 4·τ ≈ 1.39 τ', () => {
    const tau = 200 * ps;
    const dt = 1 * ps;
    for (const nominal of [undefined, { low: 0, high: 1 }]) {
      const m = measureProbe(sample(rcStep(1 * ns, tau), dt, 8000), dt, { nominal });
      const e = m.edges[0]!;
      expect(e.duration1090! / tau).toBeCloseTo(Math.log(9), 4);
      expect(e.duration2080! / tau).toBeCloseTo(Math.log(4), 4);
      expect(Math.abs(e.duration1090! / tau - 2.2)).toBeLessThan(0.01);
      expect(Math.abs(e.duration2080! / tau - 1.39)).toBeLessThan(0.01);
      // the histogram high level is the median of its modal bin, a hair below the final value
      expect(e.overshootV!).toBeLessThan(1e-6);
    }
    const f = measureProbe(sample(rcStep(1 * ns, tau, 2.5, 0.1), dt, 8000), dt).edges[0]!;
    expect(f.direction).toBe('falling');
    expect(f.duration1090! / tau).toBeCloseTo(Math.log(9), 4);
    expect(f.duration2080! / tau).toBeCloseTo(Math.log(4), 4);
  });
});

describe('overshoot', () => {
  // Second-order underdamped step response: peak overshoot = exp(−πζ/√(1−ζ²)) of the final value
  // (K. Ogata, Modern Control Engineering, transient-response specifications of second-order systems).
  const wn = 2 * Math.PI * 1e9;
  const dt = 1 * ps;
  for (const zeta of [0.1, 0.3, 0.5, 0.7]) {
    it(`second-order step, ζ = ${zeta}: overshoot = exp(−πζ/√(1−ζ²))`, () => {
      const expected = Math.exp((-Math.PI * zeta) / Math.sqrt(1 - zeta * zeta));
      const v = sample(secondOrderStep(1 * ns, zeta, wn), dt, 40000);
      const nominal = measureProbe(v, dt, { nominal: { low: 0, high: 1 } }).edges[0]!;
      expect(Math.abs(nominal.overshootV! - expected)).toBeLessThan(1e-5);
      expect(Math.abs(nominal.overshootPct! - 100 * expected)).toBeLessThan(1e-3);
      // peak instant π/ωd after the step
      const tPeak = 1 * ns + Math.PI / (wn * Math.sqrt(1 - zeta * zeta));
      expect(Math.abs(nominal.overshootTime! - tPeak)).toBeLessThanOrEqual(dt);
      // with histogram state levels (no nominal): the long settled tail fixes the high level
      const hist = measureProbe(v, dt).edges[0]!;
      expect(Math.abs(hist.overshootPct! - 100 * expected)).toBeLessThan(0.2);
    });
  }

  it('falling second-order edge: the excursion below the low level is the falling edge overshoot', () => {
    const zeta = 0.3;
    const expected = Math.exp((-Math.PI * zeta) / Math.sqrt(1 - zeta * zeta));
    const v = sample(secondOrderStep(1 * ns, zeta, wn, 3.3, 0), dt, 40000);
    const e = measureProbe(v, dt, { nominal: { low: 0, high: 3.3 } }).edges[0]!;
    expect(e.direction).toBe('falling');
    expect(Math.abs(e.overshootV! - 3.3 * expected)).toBeLessThan(1e-4);
    expect(Math.abs(e.overshootPct! - 100 * expected)).toBeLessThan(1e-3);
    // the first return above the low level after the peak: the undershoot of IEEE 181
    const secondPeak = expected * expected; // e^(−2πζ/√(1−ζ²)) of the swing, at 2π/ωd
    expect(Math.abs(e.undershootV! - 3.3 * secondPeak)).toBeLessThan(1e-4);
  });
});

describe('settling', () => {
  // Damped cosine 1 − e^(−t/τ)cos(ωt): the exact settling instant into ±b is the last root of
  // |e^(−t/τ)cos(ωt)| = b, found from the closed form by scanning back from the envelope bound
  // t = τ·ln(1/b) and bisecting; the measurement must agree within one sample interval.
  const tau = 1 * ns;
  const omega = 2 * Math.PI * 0.75e9;
  const t0 = 1 * ns;
  const f = dampedCosine(t0, tau, omega);
  function exactSettling(b: number): number {
    const g = (x: number): number => Math.abs(Math.exp(-x / tau) * Math.cos(omega * x)) - b;
    let x = tau * Math.log(1 / b);
    const step = 1e-13;
    while (g(x) < 0) x -= step;
    const tCross = t0 + bisect(g, x, x + step);
    const t50 = bisect((t) => f(t) - 0.5, t0, t0 + Math.PI / 2 / omega);
    return tCross - t50;
  }
  for (const dt of [5 * ps, 13 * ps]) {
    it(`damped cosine, dt = ${dt / ps} ps: settling into ±5 %, ±3 %, ±1 % within one sample`, () => {
      const v = sample(f, dt, Math.round(15 * ns / dt));
      const m = measureProbe(v, dt, {
        nominal: { low: 0, high: 1 },
        settleBands: [{ fraction: 0.05 }, { fraction: 0.03 }, { volts: 0.01 }],
      });
      expect(m.edges).toHaveLength(1);
      const e = m.edges[0]!;
      const bands = [0.05, 0.03, 0.01];
      e.settling.forEach((s, i) => {
        expect(s.bandV).toBeCloseTo(bands[i]!, 12);
        expect(Math.abs(s.time! - exactSettling(bands[i]!))).toBeLessThanOrEqual(dt);
      });
    });
  }

  it('a waveform still ringing at the end of the record has settling null with a reason', () => {
    const dt = 5 * ps;
    const v = sample(f, dt, Math.round(2.5 * ns / dt));
    const e = measureProbe(v, dt, { nominal: { low: 0, high: 1 } }).edges[0]!;
    expect(e.settling[0]!.time).toBeNull();
    expect(e.settling[0]!.reason).toMatch(/end of the record/);
  });
});

describe('non-monotonic edges, glitches and ringback', () => {
  const dt = 1 * ps;
  // 0 → 0.6 V, back to 0.4 V, then on to 1 V: slopes of 1 V/ns, so every crossing is known exactly.
  const glitchy = pwl([
    [0, 0],
    [1 * ns, 0],
    [1.6 * ns, 0.6],
    [1.8 * ns, 0.4],
    [2.4 * ns, 1],
    [10 * ns, 1],
  ]);
  it('a glitchy edge is one edge that crosses 50 % three times', () => {
    const m = measureProbe(sample(glitchy, dt, 5000), dt, { thresholds: { vih: 0.55, vil: 0.45 } });
    expect(m.edges).toHaveLength(1);
    const e = m.edges[0]!;
    expect(e.crossings).toBe(3);
    expect(e.thresholdCrossings).toBe(3);
    expect(e.monotonic).toBe(false);
    expect(e.reversalV).toBeCloseTo(0.2, 9);
    expect(e.t50).toBeCloseTo(1.5 * ns, 15);
    expect(e.t50Last).toBeCloseTo(1.9 * ns, 15);
    // IEEE 181 reference instants: last 10 %/20 % crossing before t50, first 80 %/90 % after it
    expect(e.t10).toBeCloseTo(1.1 * ns, 15);
    expect(e.t20).toBeCloseTo(1.2 * ns, 15);
    expect(e.t80).toBeCloseTo(2.2 * ns, 15);
    expect(e.t90).toBeCloseTo(2.3 * ns, 15);
    // after crossing vih = 0.55 it fell back to 0.4 V, below vil: a ringback margin of 0.4 − 0.55 V, a
    // glitch. After it first reached 90 % it never came back below 1 V: no ringback depth.
    expect(e.ringbackMarginV).toBeCloseTo(0.4 - 0.55, 9);
    expect(e.ringbackV).toBe(0);
    expect(e.stateExtreme).toBeCloseTo(0.4, 9);
    expect(e.reachesOppositeLevel).toBe(true);
    expect(m.noiseMargins!.high).toBeCloseTo(0.4 - 0.55, 9);
    const codes = m.flags.map((f) => f.code);
    expect(codes).toContain('non-monotonic');
    expect(codes).toContain('multiple-crossings');
    expect(codes).toContain('glitch-opposite-level');
    expect(codes).toContain('negative-noise-margin');
  });

  it('hysteresis suppresses crossings of a noisy slow edge', () => {
    const v = sample(ramp(1 * ns, 4 * ns), dt, 7000);
    // ±5 mV square ripple: crosses 0.5 V many times on the slow ramp
    for (let i = 0; i < v.length; i++) v[i]! += (i % 2 === 0 ? 1 : -1) * 0.005;
    expect(measureProbe(v, dt, { nominal: { low: 0, high: 1 } }).edges[0]!.crossings).toBeGreaterThan(3);
    expect(measureProbe(v, dt, { nominal: { low: 0, high: 1 }, hysteresis: 0.05 }).edges[0]!.crossings).toBe(1);
  });

  // Overshoot to 1.3 V, ringback to 0.7 V, then settling at 1 V (nominal levels 0 / 1 V).
  const ringing = pwl([
    [0, 0],
    [1 * ns, 0],
    [1.5 * ns, 1.3],
    [2 * ns, 0.7],
    [2.5 * ns, 1],
    [10 * ns, 1],
  ]);
  it('ringback, overshoot, undershoot, noise margin and settling of a ringing edge', () => {
    const m = measureProbe(sample(ringing, dt, 6000), dt, { nominal: { low: 0, high: 1 }, thresholds: { vih: 0.8, vil: 0.3 } });
    const e = m.edges[0]!;
    expect(e.overshootV).toBeCloseTo(0.3, 9);
    expect(e.overshootPct).toBeCloseTo(30, 7);
    expect(e.overshootTime).toBeCloseTo(1.5 * ns, 15);
    expect(e.undershootV).toBeCloseTo(0.3, 9);
    // ringback depth: 1 V − 0.7 V = 0.3 V below the settled level, 30 % of the swing; ringback margin:
    // 0.7 V − vih 0.8 V = −0.1 V, back inside the undefined band
    expect(e.ringbackV).toBeCloseTo(0.3, 9);
    expect(e.ringbackPct).toBeCloseTo(30, 7);
    expect(e.ringbackLevel).toBeCloseTo(0.7, 9);
    expect(e.ringbackTime).toBeCloseTo(2 * ns, 15);
    expect(e.ringbackMarginV).toBeCloseTo(-0.1, 9);
    expect(e.stateExtreme).toBeCloseTo(0.7, 9);
    expect(e.noiseMargin).toBeCloseTo(-0.1, 9);
    expect(e.reentersUndefinedBand).toBe(true);
    expect(e.reachesOppositeLevel).toBe(false);
    expect(e.thresholdFirst).toBeCloseTo(1 * ns + (0.8 / 1.3) * 0.5 * ns, 15);
    expect(e.thresholdLast).toBeCloseTo(2 * ns + (0.1 / 0.3) * 0.5 * ns, 15);
    const t50 = 1 * ns + (0.5 / 1.3) * 0.5 * ns;
    expect(e.t50).toBeCloseTo(t50, 15);
    expect(e.settling[0]!.time).toBeCloseTo(2 * ns + (0.25 / 0.3) * 0.5 * ns - t50, 15);
    expect(m.flags.map((f) => f.code)).toContain('ringback-undefined-band');
  });

  it('the same ringing edge mirrored into a falling edge gives the mirrored answers', () => {
    const v = sample((t) => 1 - ringing(t), dt, 6000);
    const e = measureProbe(v, dt, { nominal: { low: 0, high: 1 }, thresholds: { vih: 0.7, vil: 0.2 } }).edges[0]!;
    expect(e.direction).toBe('falling');
    expect(e.overshootV).toBeCloseTo(0.3, 9);
    expect(e.ringbackV).toBeCloseTo(0.3, 9);
    expect(e.ringbackMarginV).toBeCloseTo(0.2 - 0.3, 9);
    expect(e.stateExtreme).toBeCloseTo(0.3, 9);
    expect(e.noiseMargin).toBeCloseTo(0.2 - 0.3, 9);
    expect(e.reentersUndefinedBand).toBe(true);
  });

  it("the next transition is not counted as ringback, undershoot or a settling failure", () => {
    // clean 1 V pulse with linear 1 ns edges
    const v = sample(pwl([[0, 0], [1 * ns, 0], [2 * ns, 1], [5 * ns, 1], [6 * ns, 0]]), dt, 9000);
    const m = measureProbe(v, dt, { thresholds: { vih: 0.7, vil: 0.3 } });
    expect(m.edges.map((e) => e.direction)).toEqual(['rising', 'falling']);
    for (const e of m.edges) {
      expect(e.ringbackV).toBe(0);
      expect(e.undershootV).toBe(0);
      expect(e.overshootV).toBe(0);
      expect(e.settling[0]!.time).toBeCloseTo(0.45 * ns, 15);
    }
    expect(m.noiseMargins!.high).toBeCloseTo(0.3, 12);
    expect(m.noiseMargins!.low).toBeCloseTo(0.3, 12);
    expect(m.flags).toEqual([]);
  });
});

describe('no edge, runts and incomplete edges', () => {
  const dt = 10 * ps;
  it('a flat signal gives no edge with a reason, never a number', () => {
    const m = measureProbe(new Float64Array(1000).fill(1.2), dt);
    expect(m.edges).toEqual([]);
    expect(m.noEdgeReason).toMatch(/no edge.*flat/);
    expect(m.flags.map((f) => f.code)).toContain('no-edge');
    expect(m.min).toBe(1.2);
    expect(m.final).toBe(1.2);
    expect(jsonProblems(m)).toEqual([]);
  });

  it('a quiet low line with crosstalk never crosses: no edge, noise margin from its highest bump', () => {
    const v = sample(pwl([[0, 0], [3 * ns, 0], [3.2 * ns, 0.5], [3.4 * ns, 0], [10 * ns, 0]]), dt, 1000);
    const m = measureProbe(v, dt, { nominal: { low: 0, high: 3.3 }, thresholds: 'lvcmos33' });
    expect(m.edges).toEqual([]);
    expect(m.noEdgeReason).toMatch(/stays in the low state/);
    expect(m.noiseMargins!.low).toBeCloseTo(0.8 - 0.5, 12);
    expect(m.noiseMargins!.high).toBeNull();
    expect(m.reasons['noiseMargins.high']).toMatch(/never in the high state/);
  });

  it('an excursion past 50 % that returns is a runt, not an edge', () => {
    const v = sample(pwl([[0, 0], [2 * ns, 0], [2.7 * ns, 0.7], [3.4 * ns, 0], [10 * ns, 0]]), dt, 1000);
    const m = measureProbe(v, dt, { nominal: { low: 0, high: 1 } });
    expect(m.edges).toEqual([]);
    expect(m.runts).toHaveLength(1);
    expect(m.runts[0]!.peak).toBeCloseTo(0.7, 12);
    expect(m.runts[0]!.time).toBeCloseTo(2.5 * ns, 15);
    expect(m.noEdgeReason).toMatch(/1 runt/);
  });

  it('an edge cut off by the end of the record is listed as incomplete with reasons', () => {
    const v = sample(ramp(1 * ns, 1 * ns), dt, 171); // ends at 1.7 ns, at 70 %
    const m = measureProbe(v, dt, { nominal: { low: 0, high: 1 } });
    expect(m.edges).toHaveLength(1);
    const e = m.edges[0]!;
    expect(e.complete).toBe(false);
    expect(e.t50).toBeCloseTo(1.5 * ns, 15);
    expect(e.duration1090).toBeNull();
    expect(e.reasons.duration1090).toMatch(/record ends/);
    expect(m.flags.map((f) => f.code)).toContain('incomplete-edge');
    expect(jsonProblems(m)).toEqual([]);
  });

  it('inverted nominal levels are reported, not measured', () => {
    const v = sample(ramp(1 * ns, 1 * ns), dt, 500);
    const m = measureProbe(v, dt, { nominal: { low: 1, high: 0 } });
    expect(m.edges).toEqual([]);
    expect(m.noEdgeReason).toMatch(/below the low state level/);
  });
});

describe('pulse trains', () => {
  it('every edge of a clock is listed, alternating, with its own metrics', () => {
    // trapezoid clock 0 → 3.3 V, period 10 ns, 1 ns ramps, first rising ramp at 2 ns; record 55 ns
    const dt = 5 * ps;
    const v = sample(trapezoidClock(2 * ns, 10 * ns, 1 * ns, 0, 3.3), dt, Math.round(55 * ns / dt) + 1);
    const m = measureProbe(v, dt, { thresholds: 'lvcmos33' });
    expect(m.edgeCount).toEqual({ rising: 6, falling: 5 });
    m.edges.forEach((e, k) => {
      expect(e.number).toBe(k + 1);
      expect(e.direction).toBe(k % 2 === 0 ? 'rising' : 'falling');
      expect(e.t50).toBeCloseTo(2 * ns + k * 5 * ns + 0.5 * ns, 14);
      expect(e.duration1090).toBeCloseTo(0.8 * ns, 14);
      expect(e.crossings).toBe(1);
      expect(e.thresholdCrossings).toBe(1);
      expect(e.ringbackV).toBe(0);
      expect(e.settling[0]!.time).toBeCloseTo(0.45 * ns, 14);
    });
    expect(m.noiseMargins!.high).toBeCloseTo(3.3 - 2.0, 12);
    expect(m.noiseMargins!.low).toBeCloseTo(0.8, 12);
    expect(m.flags).toEqual([]);
    expect(jsonProblems(m)).toEqual([]);
    expect(JSON.parse(JSON.stringify(m))).toEqual(m);
  });

  it('a record that ends as the next transition begins leaves the last edge clean', () => {
    // the falling ramp starting at 47 ns is 40 % down when the record ends at 47.4 ns (never crosses 50 %)
    const dt = 5 * ps;
    const v = sample(trapezoidClock(2 * ns, 10 * ns, 1 * ns, 0, 3.3), dt, Math.round(47.4 * ns / dt) + 1);
    const m = measureProbe(v, dt, { thresholds: 'lvcmos33' });
    expect(m.edgeCount).toEqual({ rising: 5, falling: 4 });
    const last = m.edges[m.edges.length - 1]!;
    expect(last.ringbackV).toBe(0);
    expect(last.thresholdCrossings).toBe(1);
    expect(last.settling[0]!.time).toBeCloseTo(0.45 * ns, 14);
    expect(m.noiseMargins!.high).toBeCloseTo(1.3, 12);
    expect(m.flags).toEqual([]);
  });

  it('analyzeEdges on a ringing clock keeps ringing inside each state (no spurious edges)', () => {
    const dt = 2 * ps;
    const wn = 2 * Math.PI * 2e9;
    // sum of second-order step responses: +1 at 1 ns, −1 at 6 ns, +1 at 11 ns
    const a = secondOrderStep(1 * ns, 0.2, wn);
    const b = secondOrderStep(6 * ns, 0.2, wn);
    const c = secondOrderStep(11 * ns, 0.2, wn);
    const v = sample((t) => a(t) - b(t) + c(t), dt, Math.round(16 * ns / dt));
    const levels = stateLevels(v, { low: 0, high: 1 });
    const r = analyzeEdges(v, levels, { dt });
    expect(r.edges.map((e) => e.direction)).toEqual(['rising', 'falling', 'rising']);
    const expected = Math.exp((-Math.PI * 0.2) / Math.sqrt(1 - 0.04));
    for (const e of r.edges) expect(Math.abs(e.overshootPct! - 100 * expected)).toBeLessThan(0.05);
  });
});
