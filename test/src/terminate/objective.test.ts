import { describe, expect, it } from 'vitest';
import { compareScores, OBJECTIVE_TABLE, rankOrder, type Score } from '../../../src/terminate/objective.js';

const sc = (value: number, residual = 0): Score => ({ pass: true, margin: -1, value, worst: 0, residual });

// The order the advisor states in docs/termination-advice.md: a settling time that could not be
// measured (never settled in the record) is worse than any measured one, whatever the tolerance.
describe('scores', () => {
  const obj = OBJECTIVE_TABLE.settling;
  it('never ties an unmeasured value with a measured one', () => {
    expect(compareScores(obj)(sc(1.2e-9, 5), sc(Infinity, 1))).toBeLessThan(0);
    expect(rankOrder(obj)({ score: sc(Infinity), parts: 1, power: 0 }, { score: sc(1.2e-9), parts: 2, power: 0.06 }).order).toBeGreaterThan(0);
  });
  it('ties values within the tolerance and then orders by fewer parts', () => {
    const r = rankOrder(obj)({ score: sc(1.0e-9), parts: 1, power: 0 }, { score: sc(0.95e-9), parts: 2, power: 0 });
    expect(r.order).toBeLessThan(0);
    expect(r.why).toBe('settling within 10 %, fewer parts');
  });
});
