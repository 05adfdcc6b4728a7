// How many points a sweep may have: refused before anything runs (exit 3), with what would fit.
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runSweep } from '../../../src/sweep/index.js';
import { checkSweepSize, machineSweepPoints, MAX_SWEEP_POINTS } from '../../../src/sweep/size.js';
import { parseVary, shardPointCount, shardPoints } from '../../../src/sweep/spec.js';
import { SizeRefused } from '../../../src/size-limits.js';
import { CLOCK_WITH_CHECKS, SERIES_NET, TempDirs, writeJson } from './fixtures.js';

const tmp = new TempDirs();
afterAll(() => tmp.cleanup());

describe('checkSweepSize', () => {
  it('passes up to the advisory limit and refuses above it, naming the shards that would fit; force lifts it', () => {
    expect(() => checkSweepSize(MAX_SWEEP_POINTS, 40, false)).not.toThrow();
    const e = (() => {
      try {
        checkSweepSize(250_001, 40, false);
      } catch (x) {
        return x as SizeRefused;
      }
    })()!;
    expect(e).toBeInstanceOf(SizeRefused);
    expect(e.hard).toBe(false);
    expect(e.message).toBe(
      'sweep refused before starting: 250,001 points, over the limit of 100,000 (each point is a whole simulation); up to 100,000 would fit: use fewer values or samples, or split it with --shard K/3 and ladderwave merge',
    );
    expect(() => checkSweepSize(250_001, 40, true)).not.toThrow();
  });

  it('refuses even with force the points whose rows would not fit in 40 % of the memory', () => {
    const memory = 1024 ** 3;
    const fit = machineSweepPoints(40, memory);
    expect(fit).toBe(Math.floor((0.4 * memory) / (16 * 40 + 64)));
    expect(() => checkSweepSize(fit, 40, true, memory)).not.toThrow();
    expect(() => checkSweepSize(fit + 1, 40, true, memory)).toThrow(/^sweep refused before starting: .* more than this machine can hold, even with --force/);
  });
});

describe('shardPointCount', () => {
  it('equals the length of shardPoints without listing them', () => {
    for (const total of [0, 1, 2, 7, 11, 100])
      for (const count of [1, 2, 3, 16]) for (let index = 1; index <= count; index++) expect(shardPointCount(total, { index, count })).toBe(shardPoints(total, { index, count }).length);
    expect(shardPointCount(1e11, { index: 1, count: 4 })).toBe(2.5e10);
  });
});

describe('refused before anything runs', () => {
  it('a Monte Carlo run of 1e11 samples (once killed by the system at 2 GB)', async () => {
    const dir = tmp.make();
    const file = writeJson(dir, 'clock.json', CLOCK_WITH_CHECKS);
    await expect(runSweep({ file, spread: ['lines.trace.z0=±20%'], samples: 1e11 }, { out: join(dir, 'o'), jobs: 1, force: true })).rejects.toThrow(
      /^sweep refused before starting: 100,000,000,000 points .* more than this machine can hold, even with --force/,
    );
    await expect(runSweep({ file, spread: ['lines.trace.z0=±20%'], samples: 200_000 }, { out: join(dir, 'o'), jobs: 1 })).rejects.toThrow(/^sweep refused before starting: 200,000 points, over the limit/);
  });

  it('a grid whose axes multiply past the limit, and one --vary of more values than can be listed', async () => {
    const dir = tmp.make();
    const file = writeJson(dir, 'series.json', SERIES_NET);
    await expect(runSweep({ file, vary: ['route.rs.series.r=0ohm..60ohm:1000', 'lines.trace.z0=40ohm..60ohm:1000'] }, { out: join(dir, 'o'), jobs: 1 })).rejects.toThrow(/1,000,000 points, over the limit/);
    expect(() => parseVary('route.rs.series.r=0ohm..60ohm:100000000000')).toThrow(/asks for 100000000000 values, more than the 10,000,000 one --vary may list/);
  });
});
