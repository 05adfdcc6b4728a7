import { describe, expect, it } from 'vitest';
import { measureCrosstalk } from '../../../src/measure/crosstalk.js';

describe('crosstalk of a quiet probe', () => {
  // Hand-computed: rest 1.0 V, departures +0.05 V at sample 2 and −0.08 V at sample 4 (dt = 1 ns).
  it('finds the signed departure of largest magnitude, its instant and both extremes', () => {
    const x = measureCrosstalk(Float64Array.of(1, 1.02, 1.05, 0.99, 0.92, 1), 1e-9, 2);
    expect(x.restV).toBe(1);
    expect(x.peakV).toBeCloseTo(-0.08, 12);
    expect(x.peakTime).toBeCloseTo(4e-9, 18);
    expect(x.aboveV).toBeCloseTo(0.05, 12);
    expect(x.belowV).toBeCloseTo(0.08, 12);
    expect(x.peakPct).toBeCloseTo(4, 10); // 0.08 V of a 2 V swing
  });

  it('has no percentage without a switching aggressor', () => {
    const x = measureCrosstalk(Float64Array.of(0, 0.1), 1e-9, null);
    expect(x.peakPct).toBeNull();
    expect(x.peakV).toBeCloseTo(0.1, 12);
  });
});
