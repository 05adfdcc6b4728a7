// Reading input files with a size cap: checked from the size before reading a regular file, and while
// reading anything else (a device such as /dev/zero never ends).
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { formatBytes, MAX_SCENARIO_BYTES, readCapped } from '../../../src/scenario/file.js';
import { readScenario, ScenarioError } from '../../../src/scenario/load.js';

const dir = mkdtempSync(join(tmpdir(), 'lw-file-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('readCapped', () => {
  it('reads a file up to the cap, byte for byte', async () => {
    writeFileSync(join(dir, 'ok.txt'), 'abcdef');
    const r = await readCapped(join(dir, 'ok.txt'), 6);
    expect(r.ok && r.bytes.toString()).toBe('abcdef');
  });

  it('refuses a regular file over the cap from its size, saying how large it is', async () => {
    writeFileSync(join(dir, 'big.txt'), 'x'.repeat(3000));
    expect(await readCapped(join(dir, 'big.txt'), 2048)).toEqual({ ok: false, why: 'it is 2.93 kiB', tooLarge: true });
  });

  it('stops reading an endless device after cap + 1 bytes', async () => {
    expect(await readCapped('/dev/zero', 1000)).toEqual({ ok: false, why: 'it is not a regular file, and reading it gave more than that', tooLarge: true });
  });

  it('names a missing file and a folder', async () => {
    expect(await readCapped(join(dir, 'nope'), 10)).toEqual({ ok: false, why: 'no such file', tooLarge: false });
    expect(await readCapped(dir, 10)).toEqual({ ok: false, why: 'a directory', tooLarge: false });
  });

  it('formats sizes in binary units', () => {
    expect(formatBytes(MAX_SCENARIO_BYTES)).toBe('8 MiB');
    expect(formatBytes(512)).toBe('512 bytes');
    expect(formatBytes(1536)).toBe('1.5 kiB');
  });
});

describe('readScenario', () => {
  it('refuses /dev/zero as a scenario with one problem stating the cap', async () => {
    const e = await readScenario('/dev/zero').catch((x: unknown) => x);
    expect(e).toBeInstanceOf(ScenarioError);
    expect((e as ScenarioError).message).toBe('/dev/zero (file): `/dev/zero` — expected a scenario file of at most 8 MiB (it is not a regular file, and reading it gave more than that)');
  });
});
