// Small scenarios for the CLI and pipeline tests, written into temporary folders.
import { afterAll } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/** A 0 → 1 V step into a matched 10 cm line with an open end: about 70 ps of work. */
export const SMALL = {
  title: 'Small matched line',
  driver: { signal: { kind: 'step', from: '0V', to: '1V', start: '100ps', rise: '100ps' }, resistance: '50ohm' },
  route: [{ name: 'trace', line: { z0: '50ohm', delay: '5ns/m' }, length: '10cm' }],
  receiver: { parts: [{ r: '50ohm' }] },
  probes: [
    { name: 'tx', at: 'driver' },
    { name: 'mid', at: 'trace', position: '50%' },
    { name: 'rx', at: 'receiver' },
  ],
  run: { duration: '2ns' },
};

/** Four independent mistakes in one file: a bad unit, a negative value, a typo'd key, a missing probe target. */
export const BAD_TEXT = `{
  "title": "four mistakes",
  "driver": { "signal": { "kind": "step", "from": "0V", "to": "1V", "start": "1ns", "rise": "100pV" }, "resistance": "-25ohm" },
  "route": [ { "name": "trace", "line": { "z0": "50ohm", "delay": "5ns/m" }, "lenght": "3in" } ],
  "probes": [ { "name": "rx", "at": "nowhere" } ]
}
`;

/** Valid, but 10 ps edges over a 100 m line for 1 ms: far past the default size limits. */
export const HUGE = {
  title: 'Too big',
  driver: { signal: { kind: 'step', from: '0V', to: '1V', start: '1ns', rise: '10ps' }, resistance: '50ohm' },
  route: [{ name: 'cable', line: { z0: '50ohm', delay: '5ns/m' }, length: '100m' }],
  run: { duration: '1ms' },
};

export function tempDir(prefix = 'lw-cli-'): string {
  return mkdtempSync(join(tmpdir(), prefix));
}

export function writeScenario(dir: string, name: string, content: unknown): string {
  const path = join(dir, name);
  writeFileSync(path, typeof content === 'string' ? content : JSON.stringify(content, null, 2) + '\n');
  return path;
}

/** Output collected from an in-process CLI run (runCli's `io`). */
export function collectOutput() {
  const io = { stdout: '', stderr: '', out: (s: string) => void (io.stdout += s), err: (s: string) => void (io.stderr += s) };
  return io;
}

/** A temporary-folder maker whose folders are removed after the file's tests (call at module level). */
export function tempDirs(prefix?: string): () => string {
  const made: string[] = [];
  afterAll(() => made.forEach((d) => rmSync(d, { recursive: true, force: true })));
  return () => {
    const d = tempDir(prefix);
    made.push(d);
    return d;
  };
}
