// The long-lived point pool: worker threads give exactly the rows of the main thread, whatever plan
// each job brings, and a failing point rejects only its own job.
import { afterAll, describe, expect, it } from 'vitest';
import { evaluatePoint, planSweep } from '../../../src/sweep/index.js';
import { PointPool } from '../../../src/sweep/point-pool.js';
import { SERIES_NET, TempDirs, writeJson } from './fixtures.js';

const tmp = new TempDirs();
afterAll(() => tmp.cleanup());

describe('PointPool', () => {
  it('computes points of several plans on worker threads, identical to the main thread', async () => {
    const dir = tmp.make();
    const file = writeJson(dir, 'series.json', { ...SERIES_NET, run: { duration: '12ns' } });
    const a = await planSweep({ file, vary: ['route.rs.series.r=20ohm,38ohm,60ohm'] });
    const b = await planSweep({ file, vary: ['route.trace.length=10cm,15cm'] });
    const pool = new PointPool({ jobs: 2, useMainThread: false });
    try {
      const jobs = [
        ...[0, 1, 2].map((i) => ({ plan: a, i })),
        ...[0, 1].map((i) => ({ plan: b, i })),
      ];
      const rows = await Promise.all(jobs.map((j) => pool.evaluate(j.plan, j.i)));
      jobs.forEach((j, k) => expect(rows[k]).toEqual(evaluatePoint(j.plan, j.i)));
      expect(pool.evaluated).toBe(5);
    } finally {
      await pool.close();
    }
  });

  it('rejects a failing point with its label and keeps serving the others (main thread only)', async () => {
    const dir = tmp.make();
    const file = writeJson(dir, 'series.json', { ...SERIES_NET, run: { duration: '12ns' } });
    const plan = await planSweep({ file, vary: ['route.rs.series.r=20ohm'] });
    const bad = { ...plan, scenarioValue: { ...(plan.scenarioValue as object), route: [{ name: 'rs', series: { r: '22ohm' } }, { name: 'trace', line: 'trace', length: '-3cm' }] } };
    const pool = new PointPool({ jobs: 1 });
    try {
      const [ok, fail] = await Promise.allSettled([pool.evaluate(plan, 0, 'good one'), pool.evaluate(bad, 0, 'bad one')]);
      expect(ok.status).toBe('fulfilled');
      expect(fail.status).toBe('rejected');
      expect(String((fail as PromiseRejectedResult).reason.problems?.[0]?.message ?? (fail as PromiseRejectedResult).reason)).toMatch(/length/);
    } finally {
      await pool.close();
    }
  });
});
