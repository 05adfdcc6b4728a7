import { describe, expect, it } from 'vitest';
import { RunRefused, type Overrun } from '../../sim/errors.js';
import type { RunLimits } from '../../sim/limits.js';
import type { Net } from '../../sim/model.js';
import { planRun } from '../../sim/simulate.js';
import { lineOf, net, part, stepSignal } from '../support/nets.js';

function refusal(n: Net, limits: Partial<RunLimits>): Overrun[] {
  try {
    planRun(n, { limits });
  } catch (e) {
    if (e instanceof RunRefused) return e.over;
    throw e;
  }
  return [];
}

describe('size limits', () => {
  const base = net({
    signal: stepSignal(1, 50e-12),
    rs: 50,
    route: [{ kind: 'line', name: 't', line: lineOf(50, 6e-9), length: 0.3 }],
    receiver: [part({ c: 2e-12 })],
    duration: 200e-9,
    probes: [
      { name: 'a', at: 'driver' },
      { name: 'b', at: 'receiver' },
    ],
  });

  // Every suggestion in a refusal is a value that would run: planning again with it must pass.
  it('suggests a duration and a cellsPerRise that fit, each checked', () => {
    const limits = { maxCellSteps: 2e6 };
    const [o] = refusal(base, limits);
    expect(o.limit).toBe('cellSteps');
    if (o.limit !== 'cellSteps') return;
    expect(o.fit.duration).toBeGreaterThan(0);
    expect(refusal({ ...base, run: { ...base.run, duration: o.fit.duration } }, limits)).toEqual([]);
    expect(o.fit.cellsPerRise).toBeGreaterThanOrEqual(1);
    expect(refusal({ ...base, run: { ...base.run, cellsPerRise: o.fit.cellsPerRise! } }, limits)).toEqual([]);
    // one more cell per rise would not fit: the suggestion is the largest that does
    expect(refusal({ ...base, run: { ...base.run, cellsPerRise: o.fit.cellsPerRise! + 1 } }, limits)).not.toEqual([]);
  });

  it('suggests a sample interval that fits the records, and none for a duration when not even one step fits', () => {
    const limits = { maxRecordBytes: 4000 };
    const [o] = refusal(base, limits);
    expect(o.limit).toBe('recordBytes');
    if (o.limit !== 'recordBytes') return;
    expect(refusal({ ...base, run: { ...base.run, sample: o.fit.sample } }, limits)).toEqual([]);
    const tiny = refusal(base, { maxCellSteps: 10 });
    expect(tiny[0].limit === 'cellSteps' && tiny[0].fit.duration).toBeFalsy();
  });

  it('counts lumped parts in the work, and refuses a cluster too large for its dense matrix', () => {
    // 3 000 series parts in a row are one cluster of about 3 000 nodes: a 3 000² matrix
    const route = Array.from({ length: 3000 }, (_, k) => ({ kind: 'series' as const, name: `r${k}`, part: part({ r: 0.01 }) }));
    const over = refusal({ ...base, route }, {});
    expect(over.map((o) => o.limit)).toContain('lumpedSize');
  });
});
