// `ladderwave merge` reads shard folders as input to be checked: a damaged sweep.json or sweep.csv
// is bad input (exit 2) naming the file and the field, never a crash.
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/program.js';
import { mergeSweeps, runSweep, SweepInputError } from '../../../src/sweep/index.js';
import { validateSweepFile } from '../../../src/sweep/sweep-file.js';
import { collectOutput } from '../cli/fixtures.js';
import { SERIES_NET, TempDirs, writeJson } from './fixtures.js';

const tmp = new TempDirs();
afterAll(() => tmp.cleanup());

let good: { json: unknown; csv: string };
beforeAll(async () => {
  const dir = tmp.make();
  const file = writeJson(dir, 'series.json', SERIES_NET);
  await runSweep({ file, vary: ['route.rs.series.r=10ohm..30ohm:3'], shard: '1/1' }, { out: join(dir, 's'), jobs: 1 });
  good = { json: JSON.parse(readFileSync(join(dir, 's', 'sweep.json'), 'utf8')), csv: readFileSync(join(dir, 's', 'sweep.csv'), 'utf8') };
});

/** A shard folder with sweep.json and sweep.csv as given. */
function shard(json: string, csv = good.csv): string {
  const d = join(tmp.make(), 'shard');
  mkdirSync(d);
  writeFileSync(join(d, 'sweep.json'), json);
  writeFileSync(join(d, 'sweep.csv'), csv);
  return d;
}

const edit = (f: (o: any) => void) => {
  const o = structuredClone(good.json) as any;
  f(o);
  return JSON.stringify(o);
};

describe('validateSweepFile', () => {
  it('accepts what a sweep wrote', () => {
    expect(validateSweepFile(good.json).ok).toBe(true);
  });

  it.each([
    ['null', () => 'null', '(top level): expected an object'],
    ['no tool', () => edit((o) => delete o.tool), 'tool: missing (expected an object)'],
    ['a numeric version', () => edit((o) => (o.tool.version = 1)), 'tool.version: expected a text'],
    ['a plan without probes', () => edit((o) => delete o.plan.probes), 'plan.probes: missing (expected a list)'],
    ['an axis value that is not a number', () => edit((o) => (o.plan.axes[0].values[1] = 'ten')), 'plan.axes[0].values[1]: expected a finite number'],
    ['a shard 0 of 1', () => edit((o) => (o.shard = { index: 0, count: 1 })), 'shard: 0 of 1 (expected K from 1 to N)'],
    ['points that disagree with the grid', () => edit((o) => (o.plan.points = 4)), 'plan.points: 4, but the varied values make 3 grid points'],
    ['a header of the wrong width', () => edit((o) => o.plan.header.push('extra')), /^plan\.header: \d+ columns, but the plan makes \d+$/],
    ['an unknown metric', () => edit((o) => (o.plan.columns[0].metric = 'vibes')), 'plan.columns[0].metric: expected a metric name'],
  ])('refuses %s', (_what, json, message) => {
    const v = validateSweepFile(JSON.parse(json()));
    expect(v.ok).toBe(false);
    if (!v.ok) expect(v.message).toMatch(typeof message === 'string' ? new RegExp(`^${message.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}$`) : message);
  });
});

describe('ladderwave merge on damaged shards', () => {
  it.each([
    ['sweep.json is null', () => shard('null'), /sweep\.json: not a ladderwave sweep file of format 1 \(\(top level\): expected an object\)/],
    ['sweep.json lacks the tool', () => shard(edit((o) => delete o.tool)), /sweep\.json: not a ladderwave sweep file of format 1 \(tool: missing/],
    ['sweep.json is not JSON', () => shard('{"format": 1,'), /sweep\.json: not valid JSON/],
    ['sweep.csv holds Infinity', () => shard(JSON.stringify(good.json), good.csv.replace(/\n(\d+),([^,\n]+)/, '\n$1,Infinity')), /sweep\.csv:2: "Infinity" in column .* is not a finite number/],
    ['sweep.csv is missing', () => {
      const d = shard(JSON.stringify(good.json));
      writeFileSync(join(d, 'sweep.csv'), '');
      return d;
    }, /sweep\.csv: empty/],
  ])('%s: exit 2 naming the file and the field', async (_what, make, message) => {
    const d = make();
    await expect(mergeSweeps([d], { out: join(d, '..', 'merged') })).rejects.toBeInstanceOf(SweepInputError);
    const io = collectOutput();
    expect(await runCli(['merge', d, '--out', join(d, '..', 'merged'), '-q'], { io })).toBe(2);
    expect(io.stderr).toMatch(message);
    expect(io.stderr).not.toMatch(/TypeError|RangeError|internal error|\n\s+at /);
  });
});
