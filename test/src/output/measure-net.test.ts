// Measurements of simulated multi-reflection waveforms against the lattice (bounce) diagram and the DC
// divider. The state levels are the levels the net settles to (IEEE Std 181-2011 lets the user specify
// the state levels instead of estimating them from the waveform's histogram); the 10/50/90 % reference
// levels follow from them. Lattice: V⁺ = Vs·Z0/(Rs + Z0), Γ = (R − Z0)/(R + Z0), the far end sees
// V⁺(1 + ΓL)·Σ (ΓS·ΓL)^k (Pozar, Microwave Engineering, 4th ed., ch. 2; the same sums as
// test/support/lattice.ts). Every line here has Courant number 1, where the engine is exact.
import { describe, expect, it } from 'vitest';
import { measureNet } from '../../../src/output/measure-net.js';
import { crossingLevels, netSettledLevels } from '../../../src/output/net-levels.js';
import { crossing50 } from '../../../src/output/crossing.js';
import { scenarioFromValue } from '../../../src/scenario/load.js';
import { probeTrace } from '../../../sim/result.js';
import { simulate } from '../../../sim/simulate.js';
import { latticeVoltage } from '../../support/lattice.js';

const ns = 1e-9;

/** A scenario value: a step or other signal, one lossless line of delay `td`, a receiver, probes at both ends. */
function scenario(o: { signal: object; rs: string; z0: string; td: number; receiver?: object; duration: string; extra?: object }) {
  return scenarioFromValue({
    title: 'lattice case',
    driver: { signal: o.signal, resistance: o.rs },
    route: [{ name: 'line', line: { z0: o.z0, delay: '5ns/m' }, length: `${o.td / ns / 5}m` }],
    ...(o.receiver ? { receiver: o.receiver } : {}),
    probes: [
      { name: 'pin', at: 'driver' },
      { name: 'rx', at: 'receiver' },
    ],
    run: { duration: o.duration },
    ...o.extra,
  });
}

describe('an unterminated 20 ns line behind a weak 100 Ω driver (ledges, no overshoot)', () => {
  // 3.3 V step, 1 ns rise (a 1.25 ns ramp r) from 2 ns; Z0 = 50 Ω, open end. V⁺ = 3.3·50/150 = 1.1 V,
  // ΓS = 1/3, ΓL = 1. Receiver plateaus 2.2, 2.933, 3.178 V … from TD, 3TD, 5TD; driver pin 1.1, 2.567,
  // 3.056 V … from 0, 2TD, 4TD. DC: no load current, so both ends settle at 3.3 V.
  const TD = 20 * ns;
  const r = 1.25 * ns;
  const start = 2 * ns;
  const net = scenario({ signal: { kind: 'step', from: '0V', to: '3.3V', start: '2ns', rise: '1ns' }, rs: '100ohm', z0: '50ohm', td: TD, duration: '200ns' });
  const result = simulate(net);
  const { measurements } = measureNet(net, result);

  it('takes the DC divider (3.3 V, open end) as the high level at both ends, not a plateau', () => {
    for (const p of ['pin', 'rx']) {
      const m = measurements[p]!;
      expect(m.levels!.method).toBe('settled');
      expect(m.levels!.low).toBeCloseTo(0, 12);
      expect(m.levels!.high).toBeCloseTo(3.3, 12);
      expect(m.edges).toHaveLength(1);
      expect(m.edges[0]!.overshootV).toBeCloseTo(0, 9);
      expect(m.edges[0]!.ringbackV).toBe(0);
    }
  });

  it('receiver: 10 % in the first arrival, 90 % (2.97 V) in the third: rise = 4·TD, delay = TD + r/4', () => {
    const e = measurements.rx!.edges[0]!;
    // 0.33 V is 15 % of the 2.2 V first step; 2.97 V is 15 % of the 2.933 → 3.178 V step at 5TD
    expect(e.t10!).toBeCloseTo(start + TD + 0.15 * r, 21);
    expect(e.t90!).toBeCloseTo(start + 5 * TD + 0.15 * r, 21);
    expect(e.duration1090!).toBeCloseTo(4 * TD, 21);
    // 1.65 V is 75 % of the first step; the source crosses its 50 % at start + r/2
    expect(measurements.rx!.delays![0]!.delay50!).toBeCloseTo(TD + 0.25 * r, 21);
  });

  it('driver pin: the 50 % instant comes with the first reflection, 2·TD − r/8 after the source', () => {
    const e = measurements.pin!.edges[0]!;
    // the 1.1 V ledge is 33 % of the swing; 1.65 V is 37.5 % of the 1.1 → 2.567 V step at 2TD
    expect(e.t50).toBeCloseTo(start + 2 * TD + 0.375 * r, 21);
    expect(measurements.pin!.delays![0]!.delay50!).toBeCloseTo(2 * TD - 0.125 * r, 21);
    // 2.97 V is 82.5 % of the 2.567 → 3.056 V step at 4TD; 0.33 V is 30 % of the first ramp
    expect(e.duration1090!).toBeCloseTo(4 * TD + 0.525 * r, 21);
    expect(e.monotonic).toBe(true);
  });

  it('"50 % at" is the first crossing of the source 50 % level through the DC divider', () => {
    const levels = crossingLevels(net, netSettledLevels(net, result.discretization));
    const c = crossing50(probeTrace(result.record, 'rx'), result.record.dtSample, levels.get('rx'));
    expect(c.level).toBeCloseTo(1.65, 12);
    expect(c.time!).toBeCloseTo(start + TD + 0.75 * r, 21);
  });
});

describe('a 50 ns cable into a 1 kΩ receiver behind a stiff 10 Ω driver (ringing)', () => {
  // 5 V, 2 ns rise (r = 2.5 ns) from 2 ns; Z0 = 75 Ω. V⁺ = 5·75/85, ΓS = −65/85, ΓL = 925/1075.
  // DC divider: 5·1000/1010. Far-end plateaus P_k = V⁺(1 + ΓL)·Σ_{j≤k} (ΓS·ΓL)^j from (2k + 1)·TD.
  const TD = 50 * ns;
  const r = 2.5 * ns;
  const start = 2 * ns;
  const vPlus = (5 * 75) / 85;
  const gS = -65 / 85;
  const gL = 925 / 1075;
  const high = 5000 / 1010;
  const plateau = (k: number) => vPlus * (1 + gL) * ((1 - (gS * gL) ** (k + 1)) / (1 - gS * gL));
  const base = { rs: '10ohm', z0: '75ohm', td: TD, receiver: { parts: [{ r: '1kohm' }] } };
  const step = { kind: 'step', from: '0V', to: '5V', start: '2ns', rise: '2ns' };
  const net = scenario({ ...base, signal: step, duration: '1.2us', extra: { thresholds: { vih: '3.5V', vil: '1.5V' } } });
  const result = simulate(net);
  const m = measureNet(net, result).measurements.rx!;
  const e = m.edges[0]!;

  it('measures overshoot against the DC divider level, not against a reflection plateau', () => {
    expect(m.levels!.high).toBeCloseTo(high, 12);
    expect(m.edges).toHaveLength(1);
    // first arrival P0 = V⁺(1 + ΓL) = 8.208 V: 65.8 % above the 4.950 V settled level
    expect(e.overshootV!).toBeCloseTo(plateau(0) - high, 9);
    expect(e.overshootPct!).toBeCloseTo((100 * (plateau(0) - high)) / high, 7);
  });

  it('ringback: depth below the settled level at the first dip, and the margin to vih', () => {
    // the deepest return is the 3TD plateau P1 = 2.807 V (later dips are shallower: |ΓS·ΓL| < 1)
    expect(e.ringbackV!).toBeCloseTo(high - plateau(1), 9);
    expect(e.ringbackPct!).toBeCloseTo((100 * (high - plateau(1))) / high, 7);
    expect(e.ringbackTime!).toBeGreaterThan(start + 3 * TD);
    expect(e.ringbackTime!).toBeLessThan(start + 5 * TD);
    // IEEE 181 undershoot is the same return past the final level, after first reaching it
    expect(e.undershootV!).toBeCloseTo(high - plateau(1), 9);
    // with vih = 3.5 V: 2.807 − 3.5 = −0.693 V, back in the undefined band
    expect(e.ringbackMarginV!).toBeCloseTo(plateau(1) - 3.5, 9);
    expect(e.reentersUndefinedBand).toBe(true);
    expect(m.flags.map((f) => f.code)).toContain('ringback-undefined-band');
  });

  it('settles into ±5 % at the first plateau that stays inside it', () => {
    const band = 0.05 * high;
    let k = 0;
    while (Array.from({ length: 40 }, (_, j) => k + j).some((j) => Math.abs(plateau(j) - high) > band)) k++;
    // the band edge is crossed on the ramp into plateau k, at (2k + 1)·TD
    const prev = plateau(k - 1) - high;
    const next = plateau(k) - high;
    const frac = (prev - Math.sign(prev) * band) / (prev - next);
    const t50 = start + TD + ((high / 2) / plateau(0)) * r;
    expect(e.settledAfter).toBe(true);
    expect(e.settling[0]!.time!).toBeCloseTo(start + (2 * k + 1) * TD + frac * r - t50, 20);
  });

  it('a long pulse: the falling edge rings below ground by the same first-arrival step', () => {
    const pulse = { kind: 'pulse', from: '0V', to: '5V', start: '2ns', rise: '2ns', width: '1.2us', fall: '2ns' };
    const pn = scenario({ ...base, signal: pulse, duration: '2.4us' });
    const pm = measureNet(pn, simulate(pn)).measurements.rx!;
    // the lattice of the same pulse, sampled finely: its lowest value is the below-ground excursion
    const src = (t: number) => (t < start ? 0 : t < start + r ? (5 * (t - start)) / r : t < 1.2e-6 + start ? 5 : t < 1.2e-6 + start + r ? 5 - (5 * (t - 1.2e-6 - start)) / r : 0);
    const lc = { z0: 75, delay: TD, rs: 10, rl: 1000, source: src };
    let lowest = Infinity;
    for (let t = 0; t < 2.4e-6; t += 0.05 * ns) lowest = Math.min(lowest, latticeVoltage(lc, 1, t));
    expect(lowest).toBeLessThan(-3);
    expect(pm.rails!.belowLowRailV).toBeCloseTo(-lowest, 6);
    expect(pm.rails!.aboveHighRailV).toBeCloseTo(plateau(0) - 5, 6);
    // …which is the IEEE 181 overshoot of the falling edge (the low settled level is 0 V)
    expect(pm.edges[1]!.direction).toBe('falling');
    expect(pm.edges[1]!.overshootV!).toBeCloseTo(-lowest, 6);
  });

  it('a clock faster than the cable settles: the edges say so instead of a settling time', () => {
    // period 4·TD = 200 ns: each state lasts one round trip, while settling into ±5 % takes about 14·TD
    const clock = { kind: 'clock', low: '0V', high: '5V', period: '200ns', rise: '2ns', start: '2ns' };
    const cn = scenario({ ...base, signal: clock, duration: '1us' });
    const cm = measureNet(cn, simulate(cn)).measurements.rx!;
    expect(cm.levels!.high).toBeCloseTo(high, 12);
    expect(cm.edges.length).toBeGreaterThanOrEqual(8);
    expect(cm.edges.map((x) => x.number)).toEqual(cm.edges.map((_, i) => i + 1));
    expect(cm.edges[0]!.settledBefore).toBe(true);
    // the first edges ring through their whole state (first arrival 8.2 V, 65.8 % over the level)
    for (const x of cm.edges.slice(0, 3)) {
      expect(x.settledAfter).toBe(false);
      expect(x.settling[0]!.time).toBeNull();
      expect(x.settling[0]!.reason).toBe('still outside the ±5 % band when the next transition began');
    }
    for (const x of cm.edges.slice(1, 4)) expect(x.settledBefore).toBe(false);
    // every edge that starts from a state still ringing is flagged, and only those
    const unsettled = cm.edges.filter((x) => !x.settledBefore).map((x) => x.number);
    expect(cm.flags.filter((f) => f.code === 'unsettled-start').map((f) => f.edge)).toEqual(unsettled);
    cm.edges.slice(1).forEach((x, i) => expect(x.settledBefore).toBe(cm.edges[i]!.settledAfter));
  });

  it('"levels": "histogram" measures against the waveform histogram instead, and says so', () => {
    const hn = scenario({ ...base, signal: step, duration: '1.2us', extra: { levels: 'histogram' } });
    const hm = measureNet(hn, simulate(hn)).measurements.rx!;
    expect(hm.levels!.method).toBe('histogram');
    expect(hm.levels!.lowSource).toBe('histogram');
  });
});

describe('a probe behind a series capacitor', () => {
  it('has no DC path from the driver: histogram levels, with the reason in levels.note', () => {
    const n = scenarioFromValue({
      title: 'ac coupled',
      driver: { signal: { kind: 'clock', low: '0V', high: '1V', period: '20ns', rise: '1ns' }, resistance: '50ohm' },
      route: [
        { name: 'cap', series: { c: '100nF' } },
        { name: 'line', line: { z0: '50ohm', delay: '5ns/m' }, length: '0.2m' },
      ],
      receiver: { parts: [{ r: '50ohm' }] },
      probes: [{ name: 'rx', at: 'receiver' }],
      run: { duration: '100ns' },
    });
    const m = measureNet(n, simulate(n)).measurements.rx!;
    expect(m.levels!.method).toBe('histogram');
    expect(m.levels!.note).toMatch(/no DC path/);
    expect(m.edges.length).toBeGreaterThan(0);
  });
});
