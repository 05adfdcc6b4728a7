// Ringback depth (return below the settled level after first reaching 90 %) and ringback margin (the
// closest return toward vih after first crossing it), on hand-made samples, levels 0 and 10 V, dt = 1 s.
import { describe, expect, it } from 'vitest';
import { referenceLevels } from '../../../src/measure/levels.js';
import { heldExtreme, ringbackDepth, ringbackMargin } from '../../../src/measure/ringback.js';
import { thresholdCrossingIndex } from '../../../src/measure/crossings.js';
import { edgeSpans } from '../../../src/measure/spans.js';
import { findTransitions } from '../../../src/measure/transitions.js';
import { makeTrace } from '../../../src/measure/trace.js';

const levels = { low: 0, high: 10, reference: referenceLevels(0, 10) };
function spanOf(v: number[]) {
  const tr = makeTrace(Float64Array.from(v), 1);
  return { tr, s: edgeSpans(tr, findTransitions(tr, levels.reference).transitions, levels)[0]! };
}

describe('heldExtreme', () => {
  it('a dip is a value below the running maximum; the held level also counts flat stretches and the end', () => {
    const tr = makeTrace(Float64Array.of(1, 3, 3, 2, 4, 3.5), 1);
    expect(heldExtreme(tr, 0, 5, 1)).toEqual({ dip: 2, dipIndex: 3, value: 2, index: 3 });
    // a staircase never turns back: no dip; the held level is its first flat step
    const stairs = makeTrace(Float64Array.of(1, 2, 2, 3, 3), 1);
    expect(heldExtreme(stairs, 0, 4, 1)).toEqual({ dip: null, dipIndex: -1, value: 2, index: 2 });
  });
});

describe('ringback', () => {
  // up to 13 V, back to 6 V, settles at 10 V; vih 7 V, vil 3 V
  const { tr, s } = spanOf([0, 0, 8, 13, 6, 9, 10, 10]);
  it('depth: 10 V − 6 V = 4 V, 40 % of the swing, at the dip', () => {
    expect(ringbackDepth(tr, s, 10)).toMatchObject({ ringbackV: 4, ringbackPct: 40, ringbackTime: 4, ringbackLevel: 6 });
  });
  it('margin: 6 V − vih 7 V = −1 V, back inside the undefined band but not past vil', () => {
    const t = { vih: 7, vil: 3 };
    const m = ringbackMargin(tr, s, t, thresholdCrossingIndex(tr, s, 7));
    expect(m).toMatchObject({ ringbackMarginV: -1, noiseMargin: -1, stateExtreme: 6, reentersUndefinedBand: true, reachesOppositeLevel: false });
  });
  it('without thresholds there is no margin, with the reason', () => {
    const m = ringbackMargin(tr, s, undefined, thresholdCrossingIndex(tr, s, 5));
    expect(m.ringbackMarginV).toBeNull();
    expect(m.reasons.ringbackMarginV).toBe('no logic thresholds given');
  });
  it('a monotone staircase below the level has no ringback depth', () => {
    const st = spanOf([0, 0, 5, 9, 9, 9.6, 9.6]);
    expect(ringbackDepth(st.tr, st.s, 10).ringbackV).toBe(0);
  });
});
