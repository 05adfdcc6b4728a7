// Where the state after an edge ends, on hand-made samples (levels 0 and 10 V, zone edges 1 and 9 V).
import { describe, expect, it } from 'vitest';
import { referenceLevels } from '../../../src/measure/levels.js';
import { edgeSpans } from '../../../src/measure/spans.js';
import { findTransitions } from '../../../src/measure/transitions.js';
import { makeTrace } from '../../../src/measure/trace.js';

const levels = { low: 0, high: 10, reference: referenceLevels(0, 10) };
function spansOf(v: number[]) {
  const tr = makeTrace(Float64Array.from(v), 1);
  return edgeSpans(tr, findTransitions(tr, levels.reference).transitions, levels);
}

describe('edgeSpans: the end of the state after an edge', () => {
  it('keeps a ringback dip that comes back into the state zone', () => {
    // 12 V peak, dip to 6 V, back at 10 V, then the falling edge (50 % between samples 6 and 7)
    const [rise] = spansOf([0, 0, 12, 6, 10, 10, 10, 0, 0]);
    expect(rise!.jEnd).toBe(6);
    expect(rise!.stateEnd).toBe(6);
  });

  it('gives a wobble after the waveform last left the zone to the next transition', () => {
    // a ledge at 9.6 V; the falling edge drops to 7.5 V, a late reflection lifts it to 7.9 V, then it
    // falls through 50 %: the state ends on the ledge, not at the 7.5 V dip
    const [rise, fall] = spansOf([0, 0, 10, 9.6, 9.6, 9.6, 7.5, 7.9, 7.9, 3, 0, 0]);
    expect(fall!.dir).toBe(-1);
    expect(rise!.stateEnd).toBeLessThanOrEqual(5);
    expect(rise!.stateEnd).toBeGreaterThanOrEqual(2);
  });

  it('after the last edge, a record that ends below the zone ends the state where it left the level', () => {
    const [rise] = spansOf([0, 0, 10, 10, 10, 8, 6]);
    expect(rise!.hasNext).toBe(false);
    expect(rise!.stateEnd).toBe(4);
    expect(rise!.crossEnd).toBe(4);
  });
});
