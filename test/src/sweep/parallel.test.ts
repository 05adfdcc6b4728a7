// Determinism: workers give the same rows as a serial run; three shards merged give the unsharded
// files byte for byte; a Monte Carlo run is reproducible from its seed.
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { mergeSweeps, planSweep, runPoints, runSweep, SweepInputError } from '../../../src/sweep/index.js';
import { CLOCK_WITH_CHECKS, SERIES_NET, TempDirs, writeJson } from './fixtures.js';
import { formatSweepReport } from '../../../src/sweep/report.js';

const tmp = new TempDirs();
afterAll(() => tmp.cleanup());

describe('parallel == serial', () => {
  it('rows from worker threads equal the rows of a serial run, in point order', async () => {
    const dir = tmp.make();
    const file = writeJson(dir, 'series.json', SERIES_NET);
    const plan = await planSweep({ file, vary: ['route.rs.series.r=0ohm..60ohm:7', 'lines.trace.z0=45ohm,55ohm'] });
    const all = [...Array(plan.points).keys()];
    const serial = await runPoints(plan, all, { jobs: 1 });
    const seen: number[] = [];
    // Two worker threads doing every point, then two workers plus this thread.
    const workers = await runPoints(plan, all, { jobs: 2, useMainThread: false, onProgress: (d) => seen.push(d) });
    expect(workers).toEqual(serial);
    expect(workers.map((r) => r[0])).toEqual(all);
    expect(seen[seen.length - 1]).toBe(plan.points);
    expect(await runPoints(plan, all, { jobs: 3 })).toEqual(serial);
  });
});

describe('shards and merge', () => {
  it('merging shards 1/3, 2/3, 3/3 writes the unsharded sweep.csv and sweep.json byte for byte', async () => {
    const dir = tmp.make();
    const file = writeJson(dir, 'series.json', SERIES_NET);
    const req = { file, vary: ['route.rs.series.r=10ohm..60ohm:11'], pick: 'minimize settling where overshoot<10%' };
    const whole = await runSweep(req, { out: join(dir, 'whole'), jobs: 2 });
    const shardDirs: string[] = [];
    for (const k of [2, 1, 3]) {
      const d = join(dir, `shard-${k}`);
      const s = await runSweep({ ...req, shard: `${k}/3` }, { out: d, jobs: 1 });
      // Shard k of 3 holds every 3rd point from the k-th (1-based): points k−1, k+2, k+5, ...
      expect(s.rows.map((r) => r[0])).toEqual([...Array(11).keys()].filter((i) => i % 3 === k - 1));
      expect(readdirSync(d).sort()).toEqual(['sweep.csv', 'sweep.json']);
      shardDirs.push(d);
    }
    const merged = await mergeSweeps(shardDirs, { out: join(dir, 'merged') });
    for (const f of ['sweep.csv', 'sweep.json', 'best/probes.csv', 'best/summary.json']) {
      expect(readFileSync(join(dir, 'merged', f)).equals(readFileSync(join(dir, 'whole', f))), f).toBe(true);
    }
    expect(merged.result!.pick!.best!.point).toBe(whole.result!.pick!.best!.point);

    // Incomplete or doubled shards are refused with the reason.
    await expect(mergeSweeps(shardDirs.slice(0, 2), { out: join(dir, 'bad') })).rejects.toThrow(/points are missing: shard\(s\) 3\/3 not given/);
    await expect(mergeSweeps([...shardDirs, shardDirs[0]!], { out: join(dir, 'bad') })).rejects.toThrow(SweepInputError);
  });
});

describe('Monte Carlo', () => {
  it('is reproducible from the seed, independent of the workers, and reports the yield and the worst sample', async () => {
    const dir = tmp.make();
    const file = writeJson(dir, 'clock.json', CLOCK_WITH_CHECKS);
    const req = { file, spread: ['lines.trace.z0=±20%', 'route.rs.series.r=~N(15%)'], samples: 24, seed: 7 };
    const a = await runSweep(req, { out: join(dir, 'a'), jobs: 1 });
    const b = await runSweep(req, { out: join(dir, 'b'), jobs: 2 });
    expect(readFileSync(join(dir, 'a', 'sweep.csv'), 'utf8')).toBe(readFileSync(join(dir, 'b', 'sweep.csv'), 'utf8'));
    const c = await runSweep({ ...req, seed: 8 }, { out: join(dir, 'c'), jobs: 1 });
    expect(c.rows.map((r) => r[1])).not.toEqual(a.rows.map((r) => r[1]));

    // Uniform ±20 % around 50 Ω: every sample within [40, 60] Ω.
    const z = a.rows.map((r) => r[a.plan.header.indexOf('lines.trace.z0_ohm')]!);
    for (const v of z) {
      expect(v).toBeGreaterThanOrEqual(40);
      expect(v).toBeLessThan(60);
    }

    const y = a.result!.yield!;
    const failed = a.rows.map((r) => r[a.plan.header.indexOf('checks_failed')]);
    expect(y.passed).toBe(failed.filter((f) => f === 0).length);
    expect(y.fraction).toBeCloseTo(y.passed / 24, 12);
    // ±20 % on Z0 and σ = 15 % on the resistor move the overshoot across its 6 % limit: some pass, some fail.
    expect(y.passed).toBeGreaterThan(0);
    expect(y.passed).toBeLessThan(24);
    // The worst sample has the largest margin; its waveforms are in worst/.
    const mi = a.plan.header.indexOf('checks_margin');
    const margins = a.rows.map((r) => r[mi] ?? Infinity);
    expect(y.worst!.point).toBe(margins.indexOf(Math.max(...(margins as number[]))));
    expect(readdirSync(join(dir, 'a', 'worst')).sort()).toEqual(['probes.csv', 'summary.json', 'waveforms.png']);
    // It names the check that decides it, with its limit and value (the worst sample fails: margin > 0),
    // and the terminal's worst line says the same.
    const check = y.worst!.check!;
    expect(check).toMatchObject({ probe: 'rx', pass: false });
    expect(['max 6 %', 'min 500 mV']).toContain(check.limit);
    const text = formatSweepReport(a);
    expect(text).toContain(`the worst, ${check.metric} at rx: ${check.measuredText} against ${check.limit}`);
  });
});
