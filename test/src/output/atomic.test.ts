import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { pendingTempFiles, tempPathFor, writeFileAtomic } from '../../../src/output/atomic.js';

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'lw-atomic-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

describe('writeFileAtomic', () => {
  it('writes the file under its final name and leaves nothing else', async () => {
    await writeFileAtomic(join(dir, 'a.txt'), 'hello\n');
    expect(readFileSync(join(dir, 'a.txt'), 'utf8')).toBe('hello\n');
    expect(readdirSync(dir)).toEqual(['a.txt']);
    expect(pendingTempFiles()).toEqual([]);
  });

  it('uses a hidden .tmp name in the same folder while writing', async () => {
    const seen: string[][] = [];
    await writeFileAtomic(join(dir, 'b.csv'), async (sink) => {
      await sink.write('x,');
      seen.push(readdirSync(dir));
      await sink.write('y\n');
    });
    expect(seen[0]).toHaveLength(1);
    expect(seen[0][0]).toMatch(/^\.b\.csv\.\d+-[0-9a-f]+\.tmp$/);
    expect(tempPathFor(join(dir, 'b.csv')).startsWith(join(dir, '.b.csv.'))).toBe(true);
    expect(readdirSync(dir)).toEqual(['b.csv']);
  });

  it('leaves no partial file when the write fails midway', async () => {
    const boom = new Error('disk on fire');
    await expect(
      writeFileAtomic(join(dir, 'c.csv'), async (sink) => {
        await sink.write('a'.repeat(1 << 20)); // well past the stream's buffer
        throw boom;
      }),
    ).rejects.toBe(boom);
    expect(readdirSync(dir)).toEqual([]);
    expect(pendingTempFiles()).toEqual([]);
  });

  it('keeps the previous file intact when a rewrite fails', async () => {
    writeFileSync(join(dir, 'd.json'), '{"old":true}\n');
    await expect(
      writeFileAtomic(join(dir, 'd.json'), async (sink) => {
        await sink.write('{"new":');
        throw new Error('interrupted');
      }),
    ).rejects.toThrow('interrupted');
    expect(readFileSync(join(dir, 'd.json'), 'utf8')).toBe('{"old":true}\n');
    expect(readdirSync(dir)).toEqual(['d.json']);
  });

  it('fails cleanly when the folder does not exist', async () => {
    await expect(writeFileAtomic(join(dir, 'missing', 'e.txt'), 'x')).rejects.toThrow(/ENOENT/);
    expect(pendingTempFiles()).toEqual([]);
  });

  it("removes a killed process's temporary of the same file before writing, and keeps a live one's", async () => {
    const dead = spawnSync(process.execPath, ['-e', '']).pid!;
    writeFileSync(join(dir, `.r.xml.${dead}-0badf00d.tmp`), 'half a report');
    writeFileSync(join(dir, `.r.xml.${process.pid}-0000beef.tmp`), 'in flight');
    writeFileSync(join(dir, `.other.xml.${dead}-0badf00d.tmp`), 'not this file');
    await writeFileAtomic(join(dir, 'r.xml'), '<ok/>');
    expect(readdirSync(dir).sort()).toEqual([`.other.xml.${dead}-0badf00d.tmp`, `.r.xml.${process.pid}-0000beef.tmp`, 'r.xml']);
  });
});
