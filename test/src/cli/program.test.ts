// The CLI in-process through runCli, with collected output: usage handling and multi-scenario runs.
import { mkdirSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/program.js';
import { BAD_TEXT, SMALL, writeScenario, collectOutput, tempDirs } from './fixtures.js';

const collect = collectOutput;

const dir = tempDirs();

describe('usage', () => {
  it.each([
    [['run'], /missing required argument 'scenario'/],
    [['run', 'a.json', '--bogus'], /unknown option '--bogus'/],
    [['frob'], /unknown command 'frob'/],
    [[], /Usage: ladderwave/],
    [['run', 'a.json', '--out'], /argument missing/],
  ])('%j exits 2 with a message on stderr', async (args, message) => {
    const io = collect();
    expect(await runCli(args, { io })).toBe(2);
    expect(io.stderr).toMatch(message);
    expect(io.stdout).toBe('');
  });

  it.each([[['--help']], [['run', '--help']], [['help', 'run']], [['-h']]])('%j prints help and exits 0', async (args) => {
    const io = collect();
    expect(await runCli(args, { io })).toBe(0);
    expect(io.stdout).toMatch(/Usage: ladderwave/);
  });

  it('prints the version from package.json', async () => {
    const io = collect();
    expect(await runCli(['--version'], { io })).toBe(0);
    expect(io.stdout.trim()).toMatch(/^\d+\.\d+\.\d+/);
  });
});

describe('run', () => {
  it('refuses two scenarios that would share an output folder before running either', async () => {
    const d = dir();
    const a = writeScenario(d, 'net.json', SMALL);
    const sub = join(d, 'sub');
    const io = collect();
    mkdirSync(sub);
    const b = writeScenario(sub, 'net.yaml', SMALL);
    expect(await runCli(['run', a, b, '--out', join(d, 'res')], { io })).toBe(2);
    expect(io.stderr).toMatch(/would both write to/);
    expect(readdirSync(d).sort()).toEqual(['net.json', 'sub']);
  });

  it('runs the good scenarios when another is bad, and exits 2', async () => {
    const d = dir();
    const good = writeScenario(d, 'good.json', SMALL);
    const bad = writeScenario(d, 'bad.json', BAD_TEXT);
    const io = collect();
    expect(await runCli(['run', bad, good, '--out', join(d, 'res')], { io })).toBe(2);
    expect(readdirSync(join(d, 'res'))).toEqual(['good']);
    expect(io.stderr.trimEnd().split('\n')).toHaveLength(4);
    expect(io.stdout).toContain('Small matched line');
  });

  // The matched 10 cm line of SMALL: the receiver settles at half of 1 V (DC divider 50/(50 + 50)),
  // with no overshoot; a max 400 mV on "max" fails, the two others pass.
  const CHECKED = {
    ...SMALL,
    checks: [
      { probe: 'rx', metric: 'overshoot', max: '5%' },
      { probe: 'rx', metric: 'max', max: '0.4V' },
      { probe: 'rx', metric: 'final', min: '0.49V', max: '0.51V' },
    ],
  };

  it('prints the check verdicts and the failing checks, and exits 1 when one fails', async () => {
    const d = dir();
    const file = writeScenario(d, 'checked.json', CHECKED);
    const io = collect();
    expect(await runCli(['run', file, '--out', join(d, 'o'), '--views', 'waveforms'], { io })).toBe(1);
    expect(io.stdout).toMatch(/checks\s+1 of 3 FAIL\n\s+FAIL rx max max 400 mV: max 500(\.\d+)? mV exceeds max 400 mV\n/);
    expect(readdirSync(join(d, 'o'))).toContain('summary.json');
  });

  it('--ignore-checks prints the same verdicts but exits 0; a passing set says so', async () => {
    const d = dir();
    const file = writeScenario(d, 'checked.json', CHECKED);
    const io = collect();
    expect(await runCli(['run', file, '--out', join(d, 'o'), '--views', 'waveforms', '--ignore-checks'], { io })).toBe(0);
    expect(io.stdout).toMatch(/checks\s+1 of 3 FAIL/);
    const passing = writeScenario(d, 'passing.json', { ...CHECKED, checks: [CHECKED.checks[0], CHECKED.checks[2]] });
    const io2 = collect();
    expect(await runCli(['run', passing, '--out', join(d, 'p'), '--views', 'waveforms'], { io: io2 })).toBe(0);
    expect(io2.stdout).toMatch(/checks\s+all 2 PASS/);
  });

  it('"50 % at" is the first arrival of the source 50 % level through the DC divider', async () => {
    const d = dir();
    const file = writeScenario(d, 'small.json', SMALL);
    const io = collect();
    expect(await runCli(['run', file, '--out', join(d, 'o'), '--views', 'waveforms'], { io })).toBe(0);
    // source 50 % at 100 ps + 125 ps/2; the settled receiver level is 0.5 V, its 50 % 0.25 V, reached
    // 0.5 ns (10 cm at 5 ns/m) later: 662.5 ps
    expect(io.stdout).toMatch(/rx\s+\S+ \S*V\s+\S+ \S*V\s+\S+ \S*V\s+662\.5 ps/);
  });
});
