// Transitions and the initial state on tiny hand-made sample lists (levels 0 … 10 V: 10 % = 1 V,
// 50 % = 5 V, 90 % = 9 V; IEEE Std 181-2011 reference levels of the state levels).
import { describe, expect, it } from 'vitest';
import { referenceLevels } from '../../../src/measure/levels.js';
import { findTransitions, initialState } from '../../../src/measure/transitions.js';
import { makeTrace } from '../../../src/measure/trace.js';

const ref = referenceLevels(0, 10);
const tr = (v: number[]) => makeTrace(Float64Array.from(v), 1);

describe('findTransitions', () => {
  it('a passage from ≤ 10 % to ≥ 90 % is one transition: last sample in the low zone, first in the high one', () => {
    const { transitions, runts } = findTransitions(tr([0, 0, 1, 4, 8, 9, 10, 10]), ref);
    expect(transitions).toEqual([{ dir: 1, o: 2, g: 5 }]);
    expect(runts).toEqual([]);
  });

  it('ringing that stays above 10 % is not a falling edge; a return to ≤ 10 % is', () => {
    const { transitions } = findTransitions(tr([0, 10, 12, 3, 10, 10, 0.5, 0]), ref);
    expect(transitions).toEqual([
      { dir: 1, o: 0, g: 1 },
      { dir: -1, o: 5, g: 6 },
    ]);
  });

  it('an excursion past 50 % that comes back is a runt at its first 50 % crossing, with its peak', () => {
    const { transitions, runts } = findTransitions(tr([0, 4, 7, 3, 0, 0]), ref);
    expect(transitions).toEqual([]);
    // 5 V between samples 1 (4 V) and 2 (7 V): index 1 + 1/3
    expect(runts).toEqual([{ from: 'low', time: 1 + 1 / 3, peak: 7, peakTime: 2, unfinished: false }]);
  });

  it('a record that ends past 50 % is an incomplete transition; before 50 % an unfinished runt', () => {
    expect(findTransitions(tr([0, 0, 3, 6]), ref).transitions).toEqual([{ dir: 1, o: 1, g: -1 }]);
    const r = findTransitions(tr([0, 6, 4]), ref);
    expect(r.transitions).toEqual([]);
    expect(r.runts[0]!.unfinished).toBe(true);
  });
});

describe('initialState', () => {
  it('is the zone of the first sample in a state zone', () => {
    expect(initialState(tr([5, 9.5, 0]), ref)).toEqual({ state: 'high', first: 1 });
    expect(initialState(tr([5, 0.5]), ref)).toEqual({ state: 'low', first: 1 });
    expect(initialState(tr([5, 6]), ref)).toEqual({ state: null, first: -1 });
  });
});
