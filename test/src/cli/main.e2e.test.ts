// End to end: the real executable, spawned as `node --import tsx src/cli/main.ts run ...`.
import { spawn } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync, rmSync, symlinkSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { BAD_TEXT, HUGE, SMALL, tempDir, writeScenario } from './fixtures.js';

const REPO = resolve(import.meta.dirname, '../../..');
const MAIN = join(REPO, 'src/cli/main.ts');
const dirs: string[] = [];
afterAll(() => dirs.forEach((d) => rmSync(d, { recursive: true, force: true })));

function workDir(): string {
  const d = tempDir();
  dirs.push(d);
  // `--import tsx` is resolved from the working folder: give it the project's node_modules.
  symlinkSync(join(REPO, 'node_modules'), join(d, 'node_modules'), 'dir');
  return d;
}

function ladderwave(args: string[], cwd: string): Promise<{ code: number | null; stdout: string; stderr: string }> {
  return new Promise((done, fail) => {
    const child = spawn(process.execPath, ['--import', 'tsx', MAIN, ...args], { cwd, stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    child.stdout.setEncoding('utf8').on('data', (s: string) => (stdout += s));
    child.stderr.setEncoding('utf8').on('data', (s: string) => (stderr += s));
    child.on('error', fail);
    child.on('close', (code) => done({ code, stdout, stderr }));
  });
}

const visible = (dir: string) => readdirSync(dir).filter((f) => f !== 'node_modules');

// Each spawn starts Node and tsx afresh (a few seconds on a busy 2-core machine).
describe('ladderwave run (spawned)', { timeout: 120_000 }, () => {
  it('runs a small scenario into out/<name>, exits 0 and writes the CSV, the summary and the default views', async () => {
    const cwd = workDir();
    const file = writeScenario(cwd, 'small.json', SMALL);
    const r = await ladderwave(['run', 'small.json'], cwd);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const out = join(cwd, 'out', 'small');
    expect(readdirSync(out).sort()).toEqual(['map.png', 'probes.csv', 'summary.json', 'waveforms.png']); // default views: waveforms, map

    const csv = readFileSync(join(out, 'probes.csv'), 'utf8').trimEnd().split('\n');
    expect(csv[0]).toBe('time_s,tx,mid,rx');
    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    expect(csv.length - 1).toBe(summary.record.samples);
    expect(summary.scenario.sha256).toBe(createHash('sha256').update(readFileSync(file)).digest('hex'));
    expect(summary.tool.version).toBe(JSON.parse(readFileSync(join(REPO, 'package.json'), 'utf8')).version);
    expect(Object.keys(summary.probes)).toEqual(['tx', 'mid', 'rx']);
    // A matched line: the receiver settles at half the swing, and crosses its 50 % level.
    expect(summary.probes.rx.final).toBeCloseTo(0.5, 3);
    expect(summary.probes.rx.crossing50.time).toBeGreaterThan(0);
    expect(readFileSync(join(out, 'waveforms.png')).subarray(1, 4).toString()).toBe('PNG');

    // The human summary: title, Δt, segments with Courant numbers, probes, files.
    expect(r.stdout).toContain('Small matched line');
    expect(r.stdout).toMatch(/Δt\s+\S+ ps/);
    expect(r.stdout).toMatch(/trace\s+100 mm\s+\d+ cells\s+Courant 1\.0000/);
    expect(r.stdout).toMatch(/rx\s+.*V\s+.*V\s+.*V/);
    expect(r.stdout).toContain(join('out', 'small', 'summary.json'));
  });

  it('prints nothing with --quiet, and puts several scenarios in subfolders of --out', async () => {
    const cwd = workDir();
    writeScenario(cwd, 'a.json', SMALL);
    writeScenario(cwd, 'b.yaml', { ...SMALL, title: 'Second' });
    const r = await ladderwave(['run', 'a.json', 'b.yaml', '--out', 'results', '--quiet'], cwd);
    expect(r).toEqual({ code: 0, stdout: '', stderr: '' });
    expect(readdirSync(join(cwd, 'results')).sort()).toEqual(['a', 'b']);
    expect(readdirSync(join(cwd, 'results', 'b')).sort()).toEqual(['map.png', 'probes.csv', 'summary.json', 'waveforms.png']);
    expect(visible(cwd).sort()).toEqual(['a.json', 'b.yaml', 'results']);
  });

  it('exits 2 on a bad scenario, lists every problem with file:line:col, and leaves no output folder', async () => {
    const cwd = workDir();
    writeScenario(cwd, 'bad.json', BAD_TEXT);
    const r = await ladderwave(['run', 'bad.json'], cwd);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    const lines = r.stderr.trimEnd().split('\n');
    expect(lines).toHaveLength(4);
    for (const l of lines) expect(l).toMatch(/^bad\.json:\d+:\d+ \S+: .* — expected /);
    expect(lines[0]).toMatch(/^bad\.json:3:\d+ driver\.signal\.rise: "100pV" — expected /);
    expect(lines[1]).toMatch(/^bad\.json:3:\d+ driver\.resistance: "-25ohm" — expected /);
    expect(lines[2]).toMatch(/^bad\.json:4:\d+ route\[0\]\.lenght: "3in" — expected .*length/);
    expect(lines[3]).toMatch(/^bad\.json:5:\d+ probes\[0\]\.at: "nowhere" — expected /);
    expect(existsSync(join(cwd, 'out'))).toBe(false);

    const withOut = await ladderwave(['run', 'bad.json', '--out', 'res'], cwd);
    expect(withOut.code).toBe(2);
    expect(visible(cwd)).toEqual(['bad.json']);
  });

  it('exits 3 on an oversized run, says --force overrides, and leaves no output folder', async () => {
    const cwd = workDir();
    writeScenario(cwd, 'huge.json', HUGE);
    const r = await ladderwave(['run', 'huge.json'], cwd);
    expect(r.code).toBe(3);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/^huge\.json: run refused/);
    expect(r.stderr).toContain('--force');
    expect(visible(cwd)).toEqual(['huge.json']);
  });

  it('exits 2 on a usage error (more cases are tested in-process in program.test.ts)', async () => {
    const cwd = workDir();
    const r = await ladderwave(['run', '--bogus'], cwd);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain("unknown option '--bogus'");
    expect(visible(cwd)).toEqual([]);
  });
});
