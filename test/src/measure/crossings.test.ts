// Crossing metrics of one edge on hand-made samples (dt = 1 s, t0 = 0, so instants are fractional
// indices): reference instants by linear interpolation (IEEE Std 181-2011 reference level instants),
// crossing counts with a Schmitt band, monotonicity, threshold instants.
import { describe, expect, it } from 'vitest';
import { referenceLevels } from '../../../src/measure/levels.js';
import { crossingCounts, monotonicity, referenceInstants, thresholdCrossingIndex, thresholdInstants } from '../../../src/measure/crossings.js';
import { edgeSpans } from '../../../src/measure/spans.js';
import { findTransitions } from '../../../src/measure/transitions.js';
import { makeTrace } from '../../../src/measure/trace.js';

const levels = { low: 0, high: 10, reference: referenceLevels(0, 10) };
function spanOf(v: number[]) {
  const tr = makeTrace(Float64Array.from(v), 1);
  return { tr, s: edgeSpans(tr, findTransitions(tr, levels.reference).transitions, levels)[0]! };
}

describe('referenceInstants', () => {
  it('a 0 → 10 V ramp over samples 1…6 (2 V per sample): 10 % at 1.5, 50 % at 3.5, 90 % at 5.5', () => {
    const { tr, s } = spanOf([0, 0, 2, 4, 6, 8, 10, 10]);
    const r = referenceInstants(tr, s, levels.reference, 10);
    expect([r.t10, r.t20, r.t50, r.t80, r.t90]).toEqual([1.5, 2, 3.5, 5, 5.5]);
    expect(r.duration1090).toBe(4);
    expect(r.duration2080).toBe(3);
    expect(r.slewRate).toBe(2); // 0.8·10 V over 4 s
  });

  it('an edge the record cuts off has no 90 % instant, with the reason under t90', () => {
    const { tr, s } = spanOf([0, 0, 4, 7]);
    const r = referenceInstants(tr, s, levels.reference, 10);
    expect(r.t90).toBeNull();
    expect(r.reasons.t90).toMatch(/record ends before .* 90 %/);
  });
});

describe('crossing counts, monotonicity, threshold instants', () => {
  // up to 6, back to 4, on to 10: crosses 5 V three times, reverses by 2 V
  const { tr, s } = spanOf([0, 0, 6, 4, 10, 10]);
  it('counts every crossing of 50 % and of a threshold, with a Schmitt band', () => {
    expect(crossingCounts(tr, s, levels.reference, 5.5, 0)).toEqual({ crossings: 3, thresholdCrossings: 3 });
    // a band of ±1.5 V hides the 6 → 4 wobble around 5 V
    expect(crossingCounts(tr, s, levels.reference, null, 1.5)).toEqual({ crossings: 1, thresholdCrossings: null });
  });

  it('reports the largest reversal, and non-monotonic beyond the hysteresis', () => {
    expect(monotonicity(tr, s, 10, 0)).toEqual({ monotonic: false, reversalV: 2 });
    expect(monotonicity(tr, s, 10, 0.25).monotonic).toBe(true);
  });

  it('first threshold crossing on the way up, last one before the state ends', () => {
    const first = thresholdCrossingIndex(tr, s, 5);
    expect(first).toBeCloseTo(1 + 5 / 6, 15);
    const t = thresholdInstants(tr, s, 5, first);
    expect(t.thresholdFirst).toBeCloseTo(1 + 5 / 6, 15);
    expect(t.thresholdLast).toBeCloseTo(3 + 1 / 6, 15);
  });
});
