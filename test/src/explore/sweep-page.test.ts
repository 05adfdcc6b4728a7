// Which sweep points the explore page holds waveforms of: all up to the limit; beyond it, the limit's
// count spread evenly from the first to the last point, the marked (best, worst) ones always among them.
import { describe, expect, it } from 'vitest';
import { SWEEP_WAVEFORM_POINTS, waveformPoints } from '../../../src/explore/sweep-page.js';

const range = (n: number) => Array.from({ length: n }, (_, i) => i);

describe('waveformPoints', () => {
  it('holds every point up to the limit', () => {
    expect(waveformPoints(range(5), [3], 24)).toEqual([0, 1, 2, 3, 4]);
    expect(waveformPoints(range(SWEEP_WAVEFORM_POINTS), [])).toEqual(range(SWEEP_WAVEFORM_POINTS));
  });

  it('spreads the limit over a larger sweep, keeping the ends and the marked points', () => {
    // 101 points, 5 held: 0, 25, 50, 75, 100 (hand-computed: round(k·100/4))
    expect(waveformPoints(range(101), [], 5)).toEqual([0, 25, 50, 75, 100]);
    // point 37 marked: it replaces the nearest spread point (25)
    expect(waveformPoints(range(101), [37], 5)).toEqual([0, 37, 50, 75, 100]);
    const held = waveformPoints(range(1000), [3, 998], 24);
    expect(held).toHaveLength(24);
    expect(held).toContain(3);
    expect(held).toContain(998);
    expect(held[0]).toBe(0);
    expect(held.every((p, i) => i === 0 || p > held[i - 1]!)).toBe(true);
  });
});
