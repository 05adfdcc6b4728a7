import { describe, expect, it } from 'vitest';
import type { Score } from '../../../src/terminate/objective.js';
import { neighbourSets, roundAndCheck } from '../../../src/terminate/round.js';

const sc = (pass: boolean, value: number): Score => ({ pass, margin: pass ? -1 : 1, value, worst: 0, residual: 0 });
const cmp = (a: Score, b: Score) => (a.pass !== b.pass ? (a.pass ? -1 : 1) : a.value - b.value);

// IEC 60063 E24 decade: …, 36, 39, 43, 47, … (Table 1).
describe('roundAndCheck', () => {
  it('keeps the nearest E24 value when it passes (one simulation)', async () => {
    const seen: number[][] = [];
    const r = await roundAndCheck([40], 'E24', async (pv) => (seen.push(pv), { result: null, score: sc(true, pv[0]!) }), cmp);
    expect(r.values).toEqual([39]);
    expect(r.how).toBe('nearest');
    expect(r.sims).toBe(1);
    expect(seen).toEqual([[39]]);
  });
  it('takes the neighbour when the nearest breaks a check', async () => {
    const r = await roundAndCheck([40], 'E24', async (pv) => ({ result: null, score: sc(pv[0]! > 40, pv[0]!) }), cmp);
    expect(r.values).toEqual([43]);
    expect(r.how).toBe('neighbour');
    expect(r.sims).toBe(2);
  });
  it('never returns a set that breaks the topology rule', async () => {
    const r = await roundAndCheck([40, 1.5e-10], 'E24', async (pv) => ({ result: null, score: sc(true, 0) }), cmp, (pv) => pv[0]! * pv[1]! >= 6e-9);
    expect(r.values[0]! * r.values[1]!).toBeGreaterThanOrEqual(6e-9);
  });
  it('tries every below/above combination for up to four values', () => {
    // 40 → 39/43, 100 p → 100 p exactly (a member: below = above)
    expect(neighbourSets([40, 1e-10], 'E24').map((x) => x[0])).toEqual([43]);
    expect(neighbourSets([40, 1.05e-10], 'E24')).toHaveLength(3);
  });
});
