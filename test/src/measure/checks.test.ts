// Check evaluation and limit parsing.
import { describe, expect, it } from 'vitest';
import { checkWaveforms, evaluateChecks, validateCheck, type CheckSpec } from '../../../src/measure/checks.js';
import { parseCheckLimit } from '../../../src/measure/limits.js';
import { measureProbe } from '../../../src/measure/summary.js';
import { dampedCosine, jsonProblems, pwl, sample, secondOrderStep, trapezoidClock } from './waveforms.js';

const ns = 1e-9;
const ps = 1e-12;
const L = parseCheckLimit;

describe('parseCheckLimit', () => {
  it('reads percentages, volts, seconds with SI prefixes, and counts', () => {
    expect(L('10%')).toEqual({ value: 10, unit: '%', text: '10%' });
    expect(L(' 3 % ')).toMatchObject({ value: 3, unit: '%' });
    expect(L('0.2V')).toMatchObject({ value: 0.2, unit: 'V' });
    expect(L('200mV').value).toBeCloseTo(0.2, 15);
    expect(L('-0.3 V')).toMatchObject({ value: -0.3, unit: 'V' });
    expect(L('5ns').value).toBeCloseTo(5e-9, 24);
    expect(L('1.2e-9s')).toMatchObject({ value: 1.2e-9, unit: 's' });
    expect(L('250ps').value).toBeCloseTo(250e-12, 24);
    expect(L('2us').value).toBeCloseTo(2e-6, 20);
    expect(L('2µs').value).toBeCloseTo(2e-6, 20);
    expect(L('1.5 ns')).toMatchObject({ value: 1.5e-9, unit: 's' });
    expect(L('1')).toMatchObject({ value: 1, unit: 'count' });
    expect(L(3)).toMatchObject({ value: 3, unit: 'count' });
  });
  it('rejects what it cannot read, saying what was expected', () => {
    expect(() => L('10 furlongs')).toThrow(/cannot read limit "10 furlongs": expected a percentage of the swing \("10%"\), a voltage/);
    expect(() => L('3ohm')).toThrow(/cannot read limit "3ohm"/);
    expect(() => L('5 nss')).toThrow();
    expect(() => L('')).toThrow();
  });
});

describe('evaluateChecks', () => {
  const dt = 1 * ps;
  const zeta = 0.3;
  const expected = 100 * Math.exp((-Math.PI * zeta) / Math.sqrt(1 - zeta * zeta)); // 37.2 %
  const ringing = sample(secondOrderStep(1 * ns, zeta, 2 * Math.PI * 1e9), dt, 20000);
  const probes = {
    rx: measureProbe(ringing, dt, { nominal: { low: 0, high: 1 }, thresholds: { vih: 0.7, vil: 0.3 } }),
    quiet: measureProbe(new Float64Array(100), dt),
  };

  it('overshoot in % and in V: pass and fail with the measured value and the worst edge', () => {
    const [pass, fail, volts] = evaluateChecks(
      [
        { probe: 'rx', metric: 'overshoot', max: L('40%') },
        { probe: 'rx', metric: 'overshoot', max: L('10%') },
        { probe: 'rx', metric: 'overshoot', max: L('0.2V') },
      ],
      probes,
    );
    expect(pass!.pass).toBe(true);
    expect(pass!.measured!).toBeCloseTo(expected, 2);
    expect(pass!.limit).toBe('max 40 %');
    expect(fail!.pass).toBe(false);
    expect(fail!.message).toMatch(/overshoot 37\.\d+ % exceeds max 10 % \(worst: rising edge 1 at/);
    expect(fail!.edge).toBe(1);
    expect(volts!.pass).toBe(false);
    expect(volts!.unit).toBe('V');
    expect(volts!.measuredText).toMatch(/mV$/);
  });

  it('a probe with no edge fails edge checks with the reason, and does not crash', () => {
    const [r] = evaluateChecks([{ probe: 'quiet', metric: 'overshoot', max: L('10%') }], probes);
    expect(r!.pass).toBe(false);
    expect(r!.measured).toBeNull();
    expect(r!.message).toMatch(/probe "quiet" has no edge: no edge: the waveform is flat/);
    // probe-level metrics still work on it
    const [mx] = evaluateChecks([{ probe: 'quiet', metric: 'max', max: L('0.1V') }], probes);
    expect(mx!.pass).toBe(true);
  });

  it('unknown probe, unknown metric, wrong unit and missing limit all fail with a message', () => {
    const rs = evaluateChecks(
      [
        { probe: 'tx', metric: 'overshoot', max: L('10%') },
        { probe: 'rx', metric: 'overshot', max: L('10%') },
        { probe: 'rx', metric: 'rise', max: L('10%') },
        { probe: 'rx', metric: 'ringback' },
      ],
      probes,
    );
    expect(rs.map((r) => r.pass)).toEqual([false, false, false, false]);
    expect(rs[0]!.message).toMatch(/no probe named "tx" \(probes: rx, quiet\)/);
    expect(rs[1]!.message).toMatch(/unknown metric "overshot"/);
    expect(rs[2]!.message).toMatch(/expected seconds/);
    expect(rs[3]!.message).toMatch(/needs "max" and\/or "min"/);
    expect(validateCheck({ probe: 'rx', metric: 'settling', max: L('5ns'), band: L('3%') })).toEqual([]);
    expect(validateCheck({ probe: 'rx', metric: 'overshoot', max: L('5%'), band: L('3%') })[0]).toMatch(/only applies to metric "settling"/);
  });

  it('settling with a custom band, measured on demand by checkWaveforms', () => {
    const tau = 1 * ns;
    const omega = 2 * Math.PI * 0.75e9;
    const v = sample(dampedCosine(1 * ns, tau, omega), 5 * ps, 3000);
    const checks: CheckSpec[] = [
      { probe: 'rx', metric: 'settling', max: L('5ns'), band: L('3%') },
      { probe: 'rx', metric: 'settling', max: L('2ns') },
      { probe: 'rx', metric: 'settling', max: L('2ns'), band: L('0.01V') },
    ];
    const { measurements, results } = checkWaveforms(checks, { rx: { values: v, dt: 5 * ps, options: { nominal: { low: 0, high: 1 } } } });
    const e = measurements.rx!.edges[0]!;
    expect(e.settling.map((s) => s.bandPct)).toEqual([5, 3, 1]);
    expect(results[0]!.pass).toBe(true);
    expect(results[0]!.measured).toBe(e.settling[1]!.time);
    expect(results[0]!.limit).toBe('max 5 ns (±3 % band)');
    expect(results[2]!.pass).toBe(false);
    expect(results[2]!.limit).toBe('max 2 ns (±10 mV band)');
    // evaluating on measurements that lack the band fails with a clear message
    const [missing] = evaluateChecks([{ probe: 'rx', metric: 'settling', max: L('5ns'), band: L('2%') }], measurements);
    expect(missing!.pass).toBe(false);
    expect(missing!.message).toMatch(/±2 % band was not measured/);
  });

  it('a settling check on an edge that never settles fails with the reason', () => {
    const v = sample(dampedCosine(1 * ns, 1 * ns, 2 * Math.PI * 0.75e9), 5 * ps, 500);
    const { results } = checkWaveforms([{ probe: 'rx', metric: 'settling', max: L('5ns') }], {
      rx: { values: v, dt: 5 * ps, options: { nominal: { low: 0, high: 1 } } },
    });
    expect(results[0]!.pass).toBe(false);
    expect(results[0]!.message).toMatch(/could not be measured for rising edge 1 .*: still outside the ±5 % band at the end of the record/);
  });

  it('delay, rise/fall, crossings, monotonic, noise margins and edge count on a clock', () => {
    const dt2 = 5 * ps;
    const clock = trapezoidClock(2 * ns, 10 * ns, 1 * ns, 0, 3.3);
    const n = Math.round(38.5 * ns / dt2);
    const src = sample(clock, dt2, n);
    const rx = sample((t) => clock(t - 1 * ns), dt2, n);
    const glitch = sample(pwl([[0, 0], [1 * ns, 0], [1.6 * ns, 2.2], [1.8 * ns, 1.5], [2.4 * ns, 3.3]]), dt2, 1000);
    const { results } = checkWaveforms(
      [
        { probe: 'rx', metric: 'delay', max: L('1.2ns'), min: L('0.8ns') },
        { probe: 'rx', metric: 'delay', max: L('0.9ns') },
        { probe: 'rx', metric: 'delayThreshold', max: L('1.3ns') },
        { probe: 'rx', metric: 'rise', max: L('1ns') },
        { probe: 'rx', metric: 'fall', min: L('0.9ns') },
        { probe: 'rx', metric: 'crossings', max: L('1') },
        { probe: 'rx', metric: 'monotonic' },
        { probe: 'rx', metric: 'noiseMarginHigh', min: L('0.4V') },
        { probe: 'rx', metric: 'noiseMarginLow', min: L('0.4V') },
        { probe: 'rx', metric: 'edges', min: L('6') },
        { probe: 'gl', metric: 'crossings', max: L('1') },
        { probe: 'gl', metric: 'monotonic' },
        { probe: 'gl', metric: 'noiseMarginHigh', min: L('0V') },
      ],
      {
        rx: { values: rx, dt: dt2, options: { source: src, thresholds: 'lvcmos33' } },
        gl: { values: glitch, dt: dt2, options: { thresholds: 'lvcmos33' } },
      },
    );
    const summary = results.map((r) => `${r.probe}.${r.metric}:${r.pass ? 'PASS' : 'FAIL'}`);
    expect(summary).toEqual([
      'rx.delay:PASS',
      'rx.delay:FAIL',
      'rx.delayThreshold:PASS',
      'rx.rise:PASS',
      'rx.fall:FAIL',
      'rx.crossings:PASS',
      'rx.monotonic:PASS',
      'rx.noiseMarginHigh:PASS',
      'rx.noiseMarginLow:PASS',
      'rx.edges:PASS',
      'gl.crossings:FAIL',
      'gl.monotonic:FAIL',
      'gl.noiseMarginHigh:FAIL',
    ]);
    expect(results[0]!.measured!).toBeCloseTo(1 * ns, 15);
    expect(results[0]!.limit).toBe('800 ps … 1.2 ns');
    // worst threshold delay: falling edges reach vil = 0.8 V (3.3 − 0.8)/3.3 of the way down the 1 ns ramp
    expect(results[2]!.measured!).toBeCloseTo(1 * ns + ((3.3 - 0.8) / 3.3 - 0.5) * ns, 15);
    expect(results[2]!.message).toMatch(/worst: falling source edge/);
    expect(results[0]!.message).toMatch(/1 source edge\(s\) near the end of the record, with no probe edge after them, not checked/);
    expect(results[4]!.message).toMatch(/fall 800 ps is below min 900 ps/);
    expect(results[7]!.measured!).toBeCloseTo(1.3, 12);
    expect(results[10]!.measured).toBe(3);
    expect(results[11]!.message).toMatch(/1 of 1 edges are not monotonic; worst: rising edge 1 .* reverses by 700 mV/);
    expect(results[12]!.measured!).toBeCloseTo(1.5 - 2.0, 12);
    for (const r of results) expect(jsonProblems(r)).toEqual([]);
  });

  it('delay checks without a source fail with the reason', () => {
    const [r] = evaluateChecks([{ probe: 'rx', metric: 'delay', max: L('1ns') }], probes);
    expect(r!.pass).toBe(false);
    expect(r!.message).toMatch(/no delay measurements: no source waveform given/);
  });
});
