// Interruption, tested on the real executable (`node --import tsx src/cli/main.ts`): SIGINT, SIGTERM or
// SIGHUP at any moment of a run, sweep, check or merge leaves no file that looks complete and no
// temporary; a SIGKILLed run's temporaries are removed by the next run; two runs into one folder at
// once leave one run's complete set. The write phase is made long (a CSV of tens of MB) so that a
// signal sent when the staged folder appears lands inside it.
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, readFileSync, symlinkSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/program.js';
import { SMALL, tempDirs, writeScenario } from './fixtures.js';

const REPO = resolve(import.meta.dirname, '../../..');
const MAIN = join(REPO, 'src/cli/main.ts');
const dir = tempDirs('lw-int-');

/** A lumped-only net sampled 3·10^5 times: quick to simulate, about 10 MB of probes.csv to write. */
const LONG_WRITE = {
  title: 'Long record',
  driver: { signal: { kind: 'clock', low: '0V', high: '1V', period: '20ns', rise: '100ps' }, resistance: '50ohm' },
  route: [],
  receiver: { parts: [{ r: '50ohm' }, { c: '1pF' }] },
  probes: [
    { name: 'a', at: 'driver' },
    { name: 'b', at: 'receiver' },
  ],
  run: { duration: '1.5us' },
};
/** Another net, with other probe names: a mix of two runs would show in the CSV header. */
const OTHER = { ...SMALL, title: 'Other' };

function workDir(): string {
  const d = dir();
  // `--import tsx` is resolved from the working folder: give it the project's node_modules.
  symlinkSync(join(REPO, 'node_modules'), join(d, 'node_modules'), 'dir');
  return d;
}

interface Outcome {
  code: number | null;
  signal: NodeJS.Signals | null;
  stderr: string;
}

function start(args: string[], cwd: string): { child: ChildProcess; done: Promise<Outcome> } {
  const child = spawn(process.execPath, ['--import', 'tsx', MAIN, ...args], { cwd, stdio: ['ignore', 'ignore', 'pipe'] });
  let stderr = '';
  child.stderr!.setEncoding('utf8').on('data', (s: string) => (stderr += s));
  const done = new Promise<Outcome>((ok, fail) => {
    child.on('error', fail);
    child.on('close', (code, signal) => ok({ code, signal, stderr }));
  });
  return { child, done };
}

/** Polls until `pred` holds (true) or the child ends first (false). */
async function when(pred: () => boolean, done: Promise<Outcome>): Promise<boolean> {
  let ended = false;
  void done.then(() => (ended = true));
  while (!ended) {
    if (pred()) return true;
    await new Promise((r) => setTimeout(r, 10));
  }
  return pred();
}

const hidden = (d: string) => readdirSync(d).filter((n) => n.startsWith('.'));
const staged = (d: string) => () => readdirSync(d).some((n) => /\.lw-stage-/.test(n));
const visible = (d: string) => readdirSync(d).filter((n) => n !== 'node_modules' && !n.startsWith('.')).sort();

/** The CSV header's probe names equal summary.json's probes: one run's files, complete. */
function oneRun(out: string): string[] {
  const header = readFileSync(join(out, 'probes.csv'), 'utf8').slice(0, 200).split('\n')[0]!.split(',').slice(1);
  const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8')) as { probes: Record<string, unknown> };
  expect(Object.keys(summary.probes)).toEqual(header);
  return header;
}

/** Runs the CLI in this process (no spawn), for the runs around the interrupted one; `@x` is cwd/x. */
async function inProcess(args: string[], cwd: string): Promise<number> {
  const io = { out: () => undefined, err: () => undefined };
  return runCli(args.map((a) => (a.startsWith('@') ? join(cwd, a.slice(1)) : a)), { io });
}

// Each spawn starts Node and tsx afresh (seconds on a busy 2-core machine): the reason for this
// file's time. One spawn per case; the runs around it are in-process, and the three signals share
// one handler, so each is sent once.
describe('interrupting the executable', { timeout: 240_000 }, () => {
  it('SIGINT while a run writes into a folder holding an earlier run of another scenario: the earlier run stays, whole', async () => {
    const cwd = workDir();
    writeScenario(cwd, 'long.json', LONG_WRITE);
    writeScenario(cwd, 'other.json', OTHER);
    expect(await inProcess(['run', '@other.json', '--views', 'none', '--out', '@out', '-q'], cwd)).toBe(0);
    const { child, done } = start(['run', 'long.json', '--views', 'none', '--out', 'out', '-q'], cwd);
    expect(await when(staged(cwd), done), 'the staged folder appeared while the run was alive').toBe(true);
    child.kill('SIGINT');
    const r = await done;
    expect(r.code).toBe(130);
    expect(r.stderr).toContain('interrupted (SIGINT); no output file was left half-written');
    expect(oneRun(join(cwd, 'out'))).toEqual(['tx', 'mid', 'rx']);
    expect(hidden(cwd)).toEqual([]);
  });

  it('SIGINT during the simulation ends the process at once and leaves nothing', async () => {
    const cwd = workDir();
    writeScenario(cwd, 'slow.json', { ...LONG_WRITE, run: { duration: '200us' }, probes: [{ name: 'a', at: 'driver' }] });
    const { child, done } = start(['run', 'slow.json', '--views', 'none', '--out', 'out', '-q', '--force'], cwd);
    await new Promise((r) => setTimeout(r, 1500));
    child.kill('SIGINT');
    const r = await done;
    // Killed by the signal (no temporaries, no handler), or a handled exit if it was already writing.
    expect(r.signal === 'SIGINT' || r.code === 130, JSON.stringify(r)).toBe(true);
    expect(visible(cwd)).toEqual(['slow.json']);
    expect(hidden(cwd)).toEqual([]);
  });

  it("SIGKILL while writing leaves the staged folder, which the next run removes; the earlier run's folder is untouched", async () => {
    const cwd = workDir();
    writeScenario(cwd, 'long.json', LONG_WRITE);
    writeScenario(cwd, 'other.json', OTHER);
    expect(await inProcess(['run', '@other.json', '--views', 'none', '--out', '@out', '-q'], cwd)).toBe(0);
    const { child, done } = start(['run', 'long.json', '--views', 'none', '--out', 'out', '-q'], cwd);
    expect(await when(staged(cwd), done)).toBe(true);
    child.kill('SIGKILL');
    await done;
    expect(hidden(cwd).some((n) => n.startsWith('.out.lw-stage-'))).toBe(true);
    expect(oneRun(join(cwd, 'out'))).toEqual(['tx', 'mid', 'rx']);
    expect(await inProcess(['run', '@other.json', '--views', 'none', '--out', '@out', '-q'], cwd)).toBe(0);
    expect(hidden(cwd)).toEqual([]);
  });

  it('two runs into one folder at once (another process and this one): both succeed and the folder holds one complete run', async () => {
    const cwd = workDir();
    writeScenario(cwd, 'long.json', LONG_WRITE);
    writeScenario(cwd, 'other.json', OTHER);
    const spawned = start(['run', 'long.json', '--views', 'none', '--out', 'out', '-q'], cwd);
    expect(await when(staged(cwd), spawned.done)).toBe(true);
    const here = await inProcess(['run', '@other.json', '--views', 'none', '--out', '@out', '-q'], cwd);
    expect([(await spawned.done).code, here]).toEqual([0, 0]);
    expect([['a', 'b'], ['tx', 'mid', 'rx']]).toContainEqual(oneRun(join(cwd, 'out')));
    expect(hidden(cwd)).toEqual([]);
  });

  it('SIGTERM while a sweep writes its folder (its best/ run): no folder, no temporaries', async () => {
    const cwd = workDir();
    writeScenario(cwd, 'long.json', LONG_WRITE);
    const sweep = start(['sweep', 'long.json', '--vary', 'driver.resistance=50ohm', '--pick', 'minimize max', '--out', 'sw', '-q', '-j', '1'], cwd);
    expect(await when(staged(cwd), sweep.done)).toBe(true);
    sweep.child.kill('SIGTERM');
    expect((await sweep.done).code).toBe(143);
    expect(visible(cwd)).toEqual(['long.json']);
    expect(hidden(cwd)).toEqual([]);
  });

  it('SIGHUP while check --update-golden writes a golden file: no file, no temporary', async () => {
    const cwd = workDir();
    writeScenario(cwd, 'long.json', LONG_WRITE);
    mkdirSync(join(cwd, 'golden'));
    const check = start(['check', 'long.json', '--golden', 'golden', '--update-golden', '-q'], cwd);
    expect(await when(() => readdirSync(join(cwd, 'golden')).some((n) => n.endsWith('.tmp')), check.done)).toBe(true);
    check.child.kill('SIGHUP');
    expect((await check.done).code).toBe(129);
    expect(readdirSync(join(cwd, 'golden'))).toEqual([]);
  });

  it('SIGINT while merge writes the merged folder: no folder, no temporaries', async () => {
    const cwd = workDir();
    writeScenario(cwd, 'long.json', LONG_WRITE);
    const vary = ['--vary', 'driver.resistance=40ohm,50ohm', '--pick', 'minimize max', '-q', '-j', '1'];
    for (const k of [1, 2]) expect(await inProcess(['sweep', '@long.json', ...vary, '--shard', `${k}/2`, '--out', `@s${k}`], cwd)).toBe(0);
    const merge = start(['merge', 's1', 's2', '--out', 'merged', '-q'], cwd);
    expect(await when(staged(cwd), merge.done)).toBe(true);
    merge.child.kill('SIGINT');
    expect((await merge.done).code).toBe(130);
    expect(existsSync(join(cwd, 'merged'))).toBe(false);
    expect(hidden(cwd)).toEqual([]);
  });
});
