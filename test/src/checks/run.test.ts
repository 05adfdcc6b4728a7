// The check runner on the demo folder, golden files end to end, exit codes, scenario files by glob,
// and the measurement sections of summary.json.
import { PNG } from 'pngjs';
import { mkdirSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { expandScenarioArgs, globFiles } from '../../../src/checks/files.js';
import { checkExitCode, runChecks } from '../../../src/checks/run.js';
import { runScenarioFile } from '../../../src/output/run.js';
import { TempDirs, writeJson } from '../sweep/fixtures.js';

const REPO = resolve(import.meta.dirname, '../../..');
const CI = join(REPO, 'scenarios/ci');
const tmp = new TempDirs();
afterAll(() => tmp.cleanup());

const SMALL = {
  title: 'Small checked net',
  driver: { signal: { kind: 'step', from: '0V', to: '1V', start: '100ps', rise: '100ps' }, resistance: '50ohm' },
  route: [{ name: 'trace', line: { z0: '50ohm', delay: '5ns/m' }, length: '10cm' }],
  receiver: { parts: [{ r: '50ohm' }] },
  probes: [
    { name: 'tx', at: 'driver' },
    { name: 'rx', at: 'receiver' },
  ],
  checks: [
    { probe: 'rx', metric: 'overshoot', max: '5%' },
    // A matched line: the receiver settles at half the swing (0.5 V), 0.5 ns after the driver pin.
    { probe: 'rx', metric: 'final', min: '0.49V', max: '0.51V' },
  ],
  run: { duration: '2ns' },
};

describe('the demo folder scenarios/ci', () => {
  it('every net passes except the one that fails on purpose, with a clear message; exit code 1', async () => {
    const files = expandScenarioArgs([join(CI, '*.json')]).files;
    expect(files.length).toBeGreaterThanOrEqual(4);
    const report = await runChecks(files);
    expect(report.exitCode).toBe(1);
    const failing = report.scenarios.filter((s) => s.verdict !== 'pass');
    expect(failing.map((s) => s.file.split('/').pop())).toEqual(['irrigation-sd-clock-no-resistor.json']);
    const over = failing[0]!.rows.find((r) => r.metric === 'overshoot')!;
    expect(over.pass).toBe(false);
    expect(over.message).toMatch(/^overshoot \d+(\.\d+)? % exceeds max 10 % \(worst: rising edge \d+ at .*s\)$/);
    expect(report.scenarios.every((s) => s.rows.length > 0 && s.error === null)).toBe(true);
  });
});

describe('golden waveforms', () => {
  it('missing → fails saying how to create it; --update-golden writes it; a changed run fails; exit codes', async () => {
    const dir = tmp.make('lw-check-');
    const file = writeJson(dir, 'small.json', SMALL);
    const golden = join(dir, 'golden');
    const g = { dir: golden, tolerance: 0.01, shift: 20e-12 };

    const missing = await runChecks([file], { golden: { ...g, update: false } });
    expect(missing.exitCode).toBe(1);
    const row = missing.scenarios[0]!.rows.find((r) => r.kind === 'golden')!;
    expect(row.message).toBe(`no golden file ${join(golden, 'small.csv')}; to create or update it on purpose run: ladderwave check ${file} --golden ${golden} --update-golden`);

    const upd = await runChecks([file], { golden: { ...g, update: true } });
    expect(upd.exitCode).toBe(0);
    expect(readFileSync(join(golden, 'small.csv'), 'utf8').split('\n')[0]).toBe('time_s,tx,rx');

    const same = await runChecks([file], { golden: { ...g, update: false } });
    expect(same.exitCode).toBe(0);
    expect(same.scenarios[0]!.rows.filter((r) => r.kind === 'golden').map((r) => [r.probe, r.measured])).toEqual([
      ['tx', 0],
      ['rx', 0],
    ]);

    // The stored rx waveform raised by 20 mV after 1 ns: outside the ±10 mV band, and no time shift helps.
    const lines = readFileSync(join(golden, 'small.csv'), 'utf8').trimEnd().split('\n');
    const edited = lines.map((l, k) => {
      if (k === 0) return l;
      const [t, tx, rx] = l.split(',').map(Number) as [number, number, number];
      return [t, tx, t > 1e-9 ? rx + 0.02 : rx].join(',');
    });
    writeFileSync(join(golden, 'small.csv'), edited.join('\n') + '\n');
    const plots = join(dir, 'diff');
    const changed = await runChecks([file], { golden: { ...g, update: false, plots } });
    expect(changed.exitCode).toBe(1);
    const rx = changed.scenarios[0]!.rows.find((r) => r.kind === 'golden' && r.probe === 'rx')!;
    expect(rx.measured).toBeCloseTo(0.02, 9);
    expect(rx.message).toMatch(/outside ±10 mV: largest difference 20 mV/);
    // the failure draws golden against this run in <plots>/<scenario>.png, named in the message
    expect(rx.message).toContain(`picture: ${join(plots, 'small.png')}`);
    expect(PNG.sync.read(readFileSync(join(plots, 'small.png'))).width).toBe(1200);
    expect(changed.scenarios[0]!.rows.find((r) => r.kind === 'golden' && r.probe === 'tx')!.message).not.toContain('picture');
  });

  it('a golden file with a byte-order mark is read like one without (as scenario files are)', async () => {
    const dir = tmp.make('lw-check-');
    const file = writeJson(dir, 'small.json', SMALL);
    const golden = join(dir, 'golden');
    const g = { dir: golden, tolerance: 0.01, shift: 20e-12 };
    await runChecks([file], { golden: { ...g, update: true } });
    writeFileSync(join(golden, 'small.csv'), '\ufeff' + readFileSync(join(golden, 'small.csv'), 'utf8'));
    const r = await runChecks([file], { golden: { ...g, update: false } });
    expect(r.exitCode).toBe(0);
    expect(r.scenarios[0]!.rows.filter((x) => x.kind === 'golden').map((x) => x.measured)).toEqual([0, 0]);
  });

  it.each([
    ['a missing header', (t: string) => t.split('\n').slice(1).join('\n'), /small\.csv:1: expected a header "time_s,<probe>,…"/],
    ['a short row', (t: string) => t.replace(/\n([^\n]*),[^,\n]*\n/, '\n$1\n'), /small\.csv:2: 2 values, the header has 3/],
    ['a value that is not a number', (t: string) => t.replace(/\n0,0,0\n/, '\n0,zero,0\n'), /small\.csv:2: "zero" is not a number/],
    ['binary garbage', () => '\u0000\u0001PK\u0003\u0004', /small\.csv: expected a header/],
  ])('a corrupted golden file (%s) is bad input: exit 2, not a failed check', async (_what, damage, message) => {
    const dir = tmp.make('lw-check-');
    const file = writeJson(dir, 'small.json', SMALL);
    const golden = join(dir, 'golden');
    const g = { dir: golden, tolerance: 0.01, shift: 20e-12 };
    await runChecks([file], { golden: { ...g, update: true } });
    writeFileSync(join(golden, 'small.csv'), damage(readFileSync(join(golden, 'small.csv'), 'utf8')));
    const r = await runChecks([file], { golden: { ...g, update: false } });
    expect(r.exitCode).toBe(2);
    expect(r.scenarios[0]!.verdict).toBe('error');
    expect(r.scenarios[0]!.error!.lines[0]).toMatch(message);
    expect(r.scenarios[0]!.error!.lines[1]).toMatch(/to create or update it on purpose run: ladderwave check/);
  });

  it('a scenario that cannot be loaded makes the exit code 2, even next to a failed check', async () => {
    const dir = tmp.make('lw-check-');
    const good = writeJson(dir, 'good.json', SMALL);
    const failing = writeJson(dir, 'fail.json', { ...SMALL, checks: [{ probe: 'rx', metric: 'max', max: '0.1V' }] });
    const bad = writeJson(dir, 'bad.json', { ...SMALL, checks: [{ probe: 'nobody', metric: 'max', max: '1V' }] });
    expect((await runChecks([good])).exitCode).toBe(0);
    expect((await runChecks([good, failing])).exitCode).toBe(1);
    const r = await runChecks([good, failing, bad]);
    expect(r.exitCode).toBe(2);
    expect(r.scenarios[2]!.error!.lines[0]).toMatch(/bad\.json:\d+:\d+ checks\[0\]\.probe: "nobody" — expected the name of a probe \("tx", "rx"\)/);
    expect(checkExitCode([])).toBe(0);
  });
});

describe('scenario arguments', () => {
  it('expands globs (*, ?, [..], **) and folders, in order, without duplicates; reports patterns matching nothing', () => {
    const dir = tmp.make('lw-glob-');
    mkdirSync(join(dir, 'a', 'deep'), { recursive: true });
    for (const f of ['x1.json', 'x2.yaml', 'notes.txt', '.hidden.json', 'a/y.json', 'a/deep/z.yml']) writeFileSync(join(dir, f), '{}');
    expect(globFiles(`${dir}/x?.*`)).toEqual([`${dir}/x1.json`, `${dir}/x2.yaml`]);
    expect(globFiles(`${dir}/**/*.json`)).toEqual([`${dir}/a/y.json`, `${dir}/x1.json`]);
    expect(globFiles(`${dir}/**/*.y*ml`)).toEqual([`${dir}/a/deep/z.yml`, `${dir}/x2.yaml`]);
    expect(globFiles(`${dir}/x[!1].yaml`)).toEqual([`${dir}/x2.yaml`]);
    const e = expandScenarioArgs([`${dir}/x1.json`, dir, `${dir}/*.nope`, `${dir}/missing.json`]);
    expect(e.files).toEqual([`${dir}/x1.json`, `${dir}/x2.yaml`, `${dir}/missing.json`]);
    expect(e.problems).toEqual([`${dir}/*.nope: no scenario file (.json, .yaml, .yml) matches this pattern`]);
  });

  it('follows a folder linked into itself without listing a scenario twice (it once ran 41 times)', () => {
    const dir = tmp.make('lw-glob-');
    mkdirSync(join(dir, 'nets', 'sub'), { recursive: true });
    writeFileSync(join(dir, 'nets', 'a.json'), '{}');
    writeFileSync(join(dir, 'nets', 'sub', 'b.json'), '{}');
    symlinkSync('..', join(dir, 'nets', 'sub', 'up'), 'dir');
    symlinkSync('.', join(dir, 'nets', 'self'), 'dir');
    expect(globFiles(`${dir}/nets/**/*.json`)).toEqual([`${dir}/nets/a.json`, `${dir}/nets/sub/b.json`]);
    expect(expandScenarioArgs([`${dir}/nets/**/*.json`, `${dir}/nets/a.json`, `${dir}/nets/sub/up/a.json`]).files).toEqual([`${dir}/nets/a.json`, `${dir}/nets/sub/b.json`]);
  });

  it('expands braces, honours backslash escapes, and takes an existing name with glob characters as it is', () => {
    const dir = tmp.make('lw-glob-');
    mkdirSync(join(dir, 'v[2]'));
    for (const f of ['p.json', 'q.yaml', 'r.json', 'v[2]/s.json', 'net (copy).json']) writeFileSync(join(dir, f), '{}');
    expect(globFiles(`${dir}/{p,q}.*`)).toEqual([`${dir}/p.json`, `${dir}/q.yaml`]);
    expect(globFiles(`${dir}/v\\[2\\]/*.json`)).toEqual([`${dir}/v[2]/s.json`]);
    expect(expandScenarioArgs([`${dir}/v[2]`, `${dir}/net (copy).json`]).files).toEqual([`${dir}/v[2]/s.json`, `${dir}/net (copy).json`]);
  });
});

describe('summary.json of ladderwave run', () => {
  it('has "measurements" per probe and "checks" with the verdicts', async () => {
    const dir = tmp.make('lw-check-');
    const file = writeJson(dir, 'small.json', { ...SMALL, thresholds: { vih: '0.4V', vil: '0.1V' } });
    const rep = await runScenarioFile(file, join(dir, 'out'));
    const s = JSON.parse(readFileSync(join(dir, 'out', 'summary.json'), 'utf8'));
    expect(Object.keys(s.measurements)).toEqual(['tx', 'rx']);
    const rx = s.measurements.rx;
    expect(rx.edges).toHaveLength(1);
    expect(rx.thresholds).toEqual({ vih: 0.4, vil: 0.1 });
    // Matched 50 Ω line of 0.5 ns: the receiver's 50 % instant is 0.5 ns after the source's.
    expect(rx.delays[0].delay50).toBeCloseTo(0.5e-9, 11);
    expect(s.checks.passed).toBe(2);
    expect(s.checks.failed).toBe(0);
    expect(s.checks.results.map((r: { metric: string }) => r.metric)).toEqual(['overshoot', 'final']);
    expect(rep.summary.checks).toEqual(s.checks);
  });
});
