// Settling into a band around the final level, and whether an edge started from a settled state, on
// hand-made samples with levels 0 and 10 V (dt = 1 s).
import { describe, expect, it } from 'vitest';
import { referenceLevels } from '../../../src/measure/levels.js';
import { settledFromStart, settlingTime } from '../../../src/measure/settling.js';
import { edgeSpans } from '../../../src/measure/spans.js';
import { findTransitions } from '../../../src/measure/transitions.js';
import { makeTrace } from '../../../src/measure/trace.js';

const levels = { low: 0, high: 10, reference: referenceLevels(0, 10) };
function spansOf(v: number[]) {
  const tr = makeTrace(Float64Array.from(v), 1);
  return { tr, spans: edgeSpans(tr, findTransitions(tr, levels.reference).transitions, levels) };
}

describe('settlingTime', () => {
  it('from the 50 % instant to the last entry into the band (interpolated on the band edge)', () => {
    // 50 % at 1.5; last sample outside ±0.5 V is 11.2 V at index 4; it reaches 10.5 V at 4 + 0.7/1.2
    const { tr, spans } = spansOf([0, 0, 10, 12, 11.2, 10, 10]);
    const r = settlingTime(tr, spans[0]!, { volts: 0.5 }, 10);
    expect(r.settledAt).toBeCloseTo(4 + 0.7 / 1.2, 14);
    expect(r.time).toBeCloseTo(4 + 0.7 / 1.2 - 1.5, 14);
  });
  it('still outside the band when the state ends: null with the reason', () => {
    const { tr, spans } = spansOf([0, 0, 10, 12, 0, 0]);
    const r = settlingTime(tr, spans[0]!, { fraction: 0.05 }, 10);
    expect(r.time).toBeNull();
    expect(r.reason).toBe('still outside the ±5 % band when the next transition began');
  });
});

describe('settledFromStart', () => {
  it('true when the record sits within the band of the initial level until the edge departs', () => {
    const { tr, spans } = spansOf([0.2, -0.1, 0, 0.4, 3, 10]);
    expect(settledFromStart(tr, spans[0]!, { fraction: 0.05 }, 10)).toBe(true);
  });
  it('false when the initial state is still ringing', () => {
    const { tr, spans } = spansOf([0.9, -0.8, 0.6, 0, 5, 10]);
    expect(settledFromStart(tr, spans[0]!, { fraction: 0.05 }, 10)).toBe(false);
  });
});
