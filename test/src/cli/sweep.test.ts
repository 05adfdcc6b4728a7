// `ladderwave sweep` and `ladderwave merge` in-process: outputs, exit codes and usage errors.
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/program.js';
import { SMALL, writeScenario, collectOutput, tempDirs } from './fixtures.js';

const dir = tempDirs();
const collect = collectOutput;

const NET = {
  ...SMALL,
  route: [{ name: 'rs', series: { r: '0ohm' } }, ...SMALL.route],
  receiver: { parts: [] },
  probes: [{ name: 'rx', at: 'receiver' }],
  run: { duration: '6ns' },
};

describe('ladderwave sweep', () => {
  it('writes sweep.csv, sweep.png, sweep.json and best/, and reports the best point (exit 0)', async () => {
    const d = dir();
    const f = writeScenario(d, 'net.json', { ...NET, driver: { ...NET.driver, resistance: '10ohm' } });
    const out = join(d, 'out');
    const io = collect();
    const code = await runCli(['sweep', f, '--vary', 'route.rs.series.r=0ohm..60ohm:7', '--pick', 'minimize settling where overshoot<20%', '--out', out, '--jobs', '1'], { io });
    expect(io.stderr).toMatch(/sweep: 7\/7 points \(100 %\), done in/);
    expect(code).toBe(0);
    expect(readdirSync(out).sort()).toEqual(['best', 'sweep.csv', 'sweep.json', 'sweep.png']);
    const csv = readFileSync(join(out, 'sweep.csv'), 'utf8').trimEnd().split('\n');
    expect(csv).toHaveLength(8);
    expect(csv[0]!.startsWith('point,route.rs.series.r_ohm,rx.overshoot_pct,rx.overshoot_V,')).toBe(true);
    // Z0 = 50 Ω, R_out = 10 Ω: 40 Ω of series resistance matches the line (series-termination rule).
    expect(io.stdout).toMatch(/best {5}point 4 for "minimize settling where overshoot<20%"\n {11}route\.rs\.series\.r = 40 Ω/);
    expect(readFileSync(join(out, 'sweep.png')).subarray(1, 4).toString()).toBe('PNG');
  });

  it('exit 1 when no point meets the --pick conditions', async () => {
    const d = dir();
    const f = writeScenario(d, 'net.json', NET);
    const io = collect();
    expect(await runCli(['sweep', f, '--vary', 'route.rs.series.r=0ohm,10ohm', '--pick', 'minimize settling where max<0.1V', '--out', join(d, 'o'), '-q', '-j', '1'], { io })).toBe(1);
    expect(io.stderr).toBe('');
  });

  it('a varied key the scenario format does not know is reported once, with the nearest valid paths (exit 2)', async () => {
    const d = dir();
    const f = writeScenario(d, 'net.json', NET);
    const io = collect();
    expect(await runCli(['sweep', f, '--vary', 'route.rs.series.rr=1ohm..5ohm:5', '--out', join(d, 'o'), '-q'], { io })).toBe(2);
    expect(io.stderr).toBe(
      'ladderwave sweep: --vary route.rs.series.rr: the scenario format has no key "rr" at route[0].series (keys there: r, l, c, to) — nearest valid paths: route.rs.series.r, route.rs.series.l, route.rs.series.c\n',
    );
  });

  it.each([
    [['--vary', 'route.nope.series.r=1ohm,2ohm'], /no route item named "nope" \(route items: rs, trace\)/],
    [['--vary', 'route.rs.series.r=0ohm..60ohm'], /a range is A\.\.B:N/],
    [['--vary', 'route.rs.series.r=0ohm,1ohm', '--pick', 'minimize setling'], /--pick: "setling" is neither a metric .*\n {2}minimize setling\n {11}\^/],
    [['--vary', 'route.rs.series.r=1ns,2ns'], /net\.json:\d+:\d+ route\[0\]\.series\.r: "1e-9s" — expected a resistance ≥ 0.* \(at point 0: route.rs.series.r = 1e-9 s\)/],
    [['--vary', 'route.rs.series.r=1e400..1:3'], /--vary "route.rs.series.r=1e400..1:3": "1e400" is not a finite number/],
    [['--vary', 'route.rs.series.r=1e300ohm..1ohm:3'], /"1e300ohm" — expected a resistance of 0 or from 1µohm to 1Tohm/],
    [['--spread', 'route.rs.series.r=±10%'], /has no "checks"/],
    [[], /nothing to sweep/],
    [['--vary', 'route.rs.series.r=1ohm,2ohm', '--shard', '0/3'], /--shard "0\/3": K must be from 1 to N/],
    [['--vary', 'route.rs.series.r=1ohm,2ohm', '--jobs', 'lots'], /--jobs lots: expected a whole number ≥ 1/],
    [['--vary', 'route.rs.series.r=1ohm,2ohm', '--shard', '1/2', '--explore'], /--explore needs the whole sweep: run it without --shard/],
  ])('%j exits 2 with the reason', async (args, msg) => {
    const d = dir();
    const f = writeScenario(d, 'net.json', NET);
    const io = collect();
    expect(await runCli(['sweep', f, ...args, '--out', join(d, 'o'), '-q'], { io })).toBe(2);
    expect(io.stderr).toMatch(msg);
    expect(existsSync(join(d, 'o'))).toBe(false);
  });
});

describe('ladderwave merge', () => {
  it('merges two shards into the unsharded files (exit 0); a missing shard exits 2', async () => {
    const d = dir();
    const f = writeScenario(d, 'net.json', NET);
    const vary = ['--vary', 'route.rs.series.r=0ohm..50ohm:6', '-q', '-j', '1'];
    expect(await runCli(['sweep', f, ...vary, '--out', join(d, 'whole')], { io: collect() })).toBe(0);
    expect(await runCli(['sweep', f, ...vary, '--shard', '1/2', '--out', join(d, 's1')], { io: collect() })).toBe(0);
    expect(await runCli(['sweep', f, ...vary, '--shard', '2/2', '--out', join(d, 's2')], { io: collect() })).toBe(0);
    const io = collect();
    expect(await runCli(['merge', join(d, 's1'), join(d, 's2'), '--out', join(d, 'merged')], { io })).toBe(0);
    expect(readFileSync(join(d, 'merged', 'sweep.csv'), 'utf8')).toBe(readFileSync(join(d, 'whole', 'sweep.csv'), 'utf8'));
    expect(io.stdout).toContain('6 points');
    const io2 = collect();
    expect(await runCli(['merge', join(d, 's1'), '--out', join(d, 'm2')], { io: io2 })).toBe(2);
    expect(io2.stderr).toMatch(/ladderwave merge: 3 of 6 points are missing: shard\(s\) 2\/2 not given/);
    const io3 = collect();
    expect(await runCli(['merge', join(d, 'nothing-here')], { io: io3 })).toBe(2);
    expect(io3.stderr).toMatch(/not a sweep folder/);
  });
});
