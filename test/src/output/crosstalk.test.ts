import { describe, expect, it } from 'vitest';
import { pairMetrics } from '../../../sim/coupled/modes.js';
import { simulate } from '../../../sim/simulate.js';
import { aggressorSwing, crosstalkSection, quietProbes } from '../../../src/output/crosstalk.js';
import { measureNet } from '../../../src/output/measure-net.js';
import type { CheckedNet } from '../../../src/scenario/checks.js';
import { homogeneousPair } from '../../support/coupled.js';
import { pairNet } from '../../support/coupled-nets.js';
import { stepSignal } from '../../support/nets.js';

describe('crosstalk measurements and checks on a quiet net', () => {
  // Homogeneous pair, every end in R = √(Z_e·Z_o), a 1 V step behind R: the aggressor's near end steps
  // by 0.5 V and the victim's by (1 − √(1 − k²))/k·0.5 V = 0.0250628 V, k = 0.1, and the far end stays
  // quiet (exact modal solution, derived in test/sim/coupled/kernel.test.ts; C. R. Paul, Analysis of
  // Multiconductor Transmission Lines, crosstalk). As a fraction of the 1 V aggressor swing: 2.50628 %.
  const p = pairMetrics(homogeneousPair());
  const r = Math.sqrt(p.zEven * p.zOdd);
  const net: CheckedNet = pairNet({ line: homogeneousPair(), length: 0.15, signal: stepSignal(1, 80e-12), rs: r, rt: [r, r], duration: 1.8e-9 });
  net.checks = [
    { probe: 'vicNear', metric: 'crosstalk', max: { value: 3, unit: '%', text: '3%' } },
    { probe: 'vicNear', metric: 'crosstalk', max: { value: 0.02, unit: 'V', text: '20mV' } },
    { probe: 'vicFar', metric: 'crosstalk', max: { value: 0.1, unit: '%', text: '0.1%' } },
    { probe: 'aggFar', metric: 'crosstalk', max: { value: 3, unit: '%', text: '3%' } },
  ];
  const result = simulate(net);
  const m = measureNet(net, result);

  it('finds the quiet probes and the aggressor swing', () => {
    expect([...quietProbes(net)]).toEqual([
      ['vicNear', { net: 'vic', place: 'driver pin' }],
      ['vicFar', { net: 'vic', place: "receiver 'vicFarEnd'" }],
    ]);
    expect(aggressorSwing(net)).toBe(1);
  });

  it('measures the near-end plateau and the quiet far end', () => {
    const x = crosstalkSection(net, m.measurements)!;
    expect(x.vicNear.peakV).toBeCloseTo(0.0250628, 6);
    expect(x.vicNear.peakPct).toBeCloseTo(2.50628, 4);
    expect(Math.abs(x.vicFar.peakV)).toBeLessThan(1e-6);
    expect(x.aggNear).toBeUndefined();
  });

  it('checks hold a crosstalk budget in % and in V, and fail on a probe that is not quiet', () => {
    expect(m.results.map((c) => c.pass)).toEqual([true, false, true, false]);
    expect(m.results[1].measured).toBeCloseTo(0.0250628, 6);
    expect(m.results[3].message).toMatch(/not on a quiet net/);
  });
});
