// `ladderwave check` in-process: exit codes 0 / 1 / 2, the table, and the report files.
import { existsSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/program.js';
import { SMALL, writeScenario, collectOutput, tempDirs } from './fixtures.js';

const REPO = resolve(import.meta.dirname, '../../..');
const dir = tempDirs();
const collect = collectOutput;

const PASSING = { ...SMALL, checks: [{ probe: 'rx', metric: 'final', min: '0.49V', max: '0.51V' }] };
const FAILING = { ...SMALL, checks: [{ probe: 'rx', metric: 'max', max: '0.2V' }] };

describe('ladderwave check', () => {
  it('exit 0 when every check passes, with the table on stdout', async () => {
    const d = dir();
    const f = writeScenario(d, 'ok.json', PASSING);
    const io = collect();
    expect(await runCli(['check', f], { io })).toBe(0);
    expect(io.stdout.split('\n')[0]).toMatch(/^scenario\s+probe\s+metric\s+limit\s+measured\s+result$/);
    expect(io.stdout).toMatch(/rx\s+final\s+490 mV … 510 mV\s+500 mV\s+PASS/);
    expect(io.stdout).toContain('all 1 check(s) passed in 1 scenario(s)');
    expect(io.stderr).toBe('');
  });

  it('exit 1 when a check fails; JUnit, JSON and Markdown written', async () => {
    const d = dir();
    const ok = writeScenario(d, 'ok.json', PASSING);
    const bad = writeScenario(d, 'fail.json', FAILING);
    const io = collect();
    const junit = join(d, 'reports', 'junit.xml');
    const code = await runCli(['check', ok, bad, '--junit', junit, '--json', join(d, 'r.json'), '--markdown', join(d, 'r.md'), '--quiet'], { io });
    expect(code).toBe(1);
    expect(io.stdout).toBe('');
    expect(readFileSync(junit, 'utf8')).toContain('<failure message="max 500 mV exceeds max 200 mV');
    expect(JSON.parse(readFileSync(join(d, 'r.json'), 'utf8')).totals.failed).toBe(1);
    expect(readFileSync(join(d, 'r.md'), 'utf8')).toMatch(/^❌ \*\*ladderwave check\*\*: 1 of 2 check\(s\) failed/);
  });

  it('the demo folder, by glob, fails on its purposely failing net', async () => {
    const io = collect();
    expect(await runCli(['check', join(REPO, 'scenarios/ci/*.json')], { io })).toBe(1);
    expect(io.stdout).toMatch(/FAIL .*irrigation-sd-clock-no-resistor\.json: sd_clk overshoot: overshoot .* exceeds max 10 %/);
  });

  it.each([
    [['check', '/nonexistent/*.json'], /no scenario file .* matches this pattern/],
    [['check', 'x.json', '--update-golden'], /--update-golden needs --golden DIR/],
    [['check', 'x.json', '--golden', 'g', '--golden-tolerance', '5ns'], /--golden-tolerance 5ns: expected a voltage > 0/],
    [['check'], /missing required argument/],
  ])('%j: bad usage exits 2', async (args, msg) => {
    const io = collect();
    expect(await runCli(args, { io })).toBe(2);
    expect(io.stderr).toMatch(msg);
  });

  it('exit 2 for a scenario that cannot be loaded, with file, line:col and key path', async () => {
    const d = dir();
    const f = writeScenario(d, 'bad.json', { ...SMALL, checks: [{ probe: 'rx', metric: 'overshot', max: '10%' }] });
    const io = collect();
    expect(await runCli(['check', f], { io })).toBe(2);
    expect(io.stdout).toMatch(/bad\.json:\d+:\d+ checks\[0\]\.metric: "overshot" — expected a metric: .* did you mean "overshoot"\?/);
  });

  it('--golden: a missing golden file fails (exit 1) saying how to create it; --update-golden then passes', async () => {
    const d = dir();
    const f = writeScenario(d, 'ok.json', PASSING);
    const g = join(d, 'golden');
    const io = collect();
    expect(await runCli(['check', f, '--golden', g], { io })).toBe(1);
    expect(io.stdout).toContain(`no golden file ${join(g, 'ok.csv')}; to create or update it on purpose run: ladderwave check ${f} --golden ${g} --update-golden`);
    expect(await runCli(['check', f, '--golden', g, '--update-golden', '-q'], { io: collect() })).toBe(0);
    expect(existsSync(join(g, 'ok.csv'))).toBe(true);
    expect(await runCli(['check', f, '--golden', g, '-q'], { io: collect() })).toBe(0);
  });
});
