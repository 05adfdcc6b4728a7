// Aberrations (IEEE Std 181-2011: preshoot before an edge, overshoot and undershoot after it) and the
// rail excursions, on hand-made samples with state levels 0 and 10 V (dt = 1 s).
import { describe, expect, it } from 'vitest';
import { referenceLevels } from '../../../src/measure/levels.js';
import { aberration, overshoot, preshoot, railExcursions, undershoot } from '../../../src/measure/aberrations.js';
import { edgeSpans } from '../../../src/measure/spans.js';
import { findTransitions } from '../../../src/measure/transitions.js';
import { makeTrace } from '../../../src/measure/trace.js';

const levels = { low: 0, high: 10, reference: referenceLevels(0, 10) };
function spansOf(v: number[]) {
  const tr = makeTrace(Float64Array.from(v), 1);
  return { tr, spans: edgeSpans(tr, findTransitions(tr, levels.reference).transitions, levels) };
}

describe('aberrations of one edge', () => {
  // dips to −1 V just before rising, peaks at 13 V, falls back to 8 V, settles at 10 V
  const { tr, spans } = spansOf([0, 0, -1, 5, 13, 8, 10, 10, 10]);
  const s = spans[0]!;
  it('preshoot: 1 V below the initial level within one transition duration before the start', () => {
    expect(preshoot(tr, s, 10)).toEqual({ preshootV: 1, preshootPct: 10 });
  });
  it('overshoot: 3 V beyond the final level, at the peak sample', () => {
    expect(overshoot(tr, s, 10)).toMatchObject({ overshootV: 3, overshootPct: 30, overshootTime: 4 });
  });
  it('undershoot: after reaching 10 V, the return to 8 V is 2 V back past it', () => {
    expect(undershoot(tr, s, 10)).toMatchObject({ undershootV: 2, undershootPct: 20, undershootTime: 5 });
  });
  it('a falling edge mirrors every definition', () => {
    const f = spansOf([10, 10, 11, 5, -3, 2, 0, 0]);
    const e = f.spans[0]!;
    expect(e.dir).toBe(-1);
    expect(preshoot(f.tr, e, 10).preshootV).toBe(1);
    expect(overshoot(f.tr, e, 10).overshootV).toBe(3);
    expect(undershoot(f.tr, e, 10).undershootV).toBe(2);
  });
  it('an approach that never reaches the level has no undershoot, and rounding is no aberration', () => {
    const a = spansOf([0, 0, 5, 9.5, 9.9, 9.99]);
    expect(undershoot(a.tr, a.spans[0]!, 10)).toMatchObject({ undershootV: null });
    expect(aberration(1e-9, 10)).toBe(0);
    expect(aberration(2e-5, 10)).toBe(2e-5);
  });
});

describe('railExcursions', () => {
  it('below the low rail and above the high rail, from the record extremes', () => {
    expect(railExcursions({ low: 0, high: 3.3 }, { min: -0.7, max: 4, minTime: 2e-9, maxTime: 1e-9 })).toEqual({
      lowRail: 0,
      highRail: 3.3,
      belowLowRailV: 0.7,
      belowLowRailTime: 2e-9,
      aboveHighRailV: expect.closeTo(0.7, 12),
      aboveHighRailTime: 1e-9,
    });
    expect(railExcursions({ low: 0, high: 3.3 }, { min: 0.1, max: 3, minTime: 0, maxTime: 0 })).toMatchObject({ belowLowRailV: 0, belowLowRailTime: null, aboveHighRailV: 0 });
  });
});
