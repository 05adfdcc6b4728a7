// An output folder replaced as a whole: staged in a hidden sibling and swapped in, or nothing changes.
// What a reader may rely on (README, "What a reader of an output folder may rely on") is what these
// tests check: never a mix of two runs, nothing half-written, no temporaries left, places that cannot
// work refused at once.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { pendingTempFiles } from '../../../src/output/atomic.js';
import { OutputError } from '../../../src/output/errors.js';
import { checkOutputTarget, OUTPUT_NAMES, prepareFileTarget, writeOutputFolder, type FolderEntry } from '../../../src/output/folder.js';
import { OUTPUT_FILES } from '../../../src/output/run.js';
import { EYE_FILES } from '../../../src/output/eye.js';
import { TDR_FILES } from '../../../src/output/tdr.js';
import { SWEEP_FILES } from '../../../src/sweep/run.js';
import { VIEW_FILES } from '../../../src/views/select.js';
import { FRAMES_DIR } from '../../../src/views/frames.js';
import { REPORT_FILE } from '../../../src/report/report.js';
import { CROSSCHECK_FILE } from '../../../src/crosscheck/plot.js';
import { EXPLORE_FILE } from '../../../src/explore/page.js';
import { DEVICE_FILES } from '../../../src/cli/commands/device.js';
import { SPARAMS_FILES } from '../../../src/output/sparams.js';

const made: string[] = [];
afterAll(() => made.forEach((d) => rmSync(d, { recursive: true, force: true })));
function dir(): string {
  const d = mkdtempSync(join(tmpdir(), 'lw-folder-'));
  made.push(d);
  return d;
}

const files = (d: string) => readdirSync(d).sort();
const entries = (o: Record<string, string>): FolderEntry[] => Object.entries(o).map(([path, data]) => ({ path, data }));
const deadPid = (): number => spawnSync(process.execPath, ['-e', '']).pid!;

describe('writeOutputFolder', () => {
  it('creates the folder with exactly the entries, subfolders included, and leaves no sibling behind', async () => {
    const d = dir();
    const out = join(d, 'a', 'b', 'out');
    const written = await writeOutputFolder(out, entries({ 'probes.csv': 'x\n', 'frames/frame-0001.png': 'p', 'summary.json': '{}\n' }));
    expect(written).toEqual([join(out, 'probes.csv'), join(out, 'frames/frame-0001.png'), join(out, 'summary.json')]);
    expect(files(out)).toEqual(['frames', 'probes.csv', 'summary.json']);
    expect(readFileSync(join(out, 'frames', 'frame-0001.png'), 'utf8')).toBe('p');
    expect(files(join(d, 'a', 'b'))).toEqual(['out']);
    expect(pendingTempFiles()).toEqual([]);
  });

  it('replaces a previous run of another scenario as a whole: no file of the old run survives', async () => {
    const d = dir();
    const out = join(d, 'out');
    await writeOutputFolder(out, entries({ 'probes.csv': 'old', 'bounce.png': 'old', 'summary.json': 'old', 'frames/frame-0009.png': 'old' }));
    await writeOutputFolder(out, entries({ 'probes.csv': 'new', 'summary.json': 'new' }));
    expect(files(out)).toEqual(['probes.csv', 'summary.json']);
    expect(readFileSync(join(out, 'probes.csv'), 'utf8') + readFileSync(join(out, 'summary.json'), 'utf8')).toBe('newnew');
    expect(files(d)).toEqual(['out']);
  });

  it('leaves the previous folder untouched and removes what it made when a write fails midway', async () => {
    const d = dir();
    const out = join(d, 'out');
    await writeOutputFolder(out, entries({ 'probes.csv': 'old', 'summary.json': 'old' }));
    const boom = async () => {
      throw new Error('renderer broke');
    };
    await expect(writeOutputFolder(out, [{ path: 'probes.csv', data: 'new' }, { path: 'summary.json', data: boom }])).rejects.toThrow(OutputError);
    expect(files(out)).toEqual(['probes.csv', 'summary.json']);
    expect(readFileSync(join(out, 'probes.csv'), 'utf8')).toBe('old');
    expect(files(d)).toEqual(['out']);
    await expect(writeOutputFolder(join(d, 'new', 'deeper'), [{ path: 'a', data: boom }])).rejects.toThrow(OutputError);
    expect(files(d)).toEqual(['out']);
    expect(pendingTempFiles()).toEqual([]);
  });

  it('reports a full disk (an injected ENOSPC from the writer) as OutputError naming it, and leaves nothing', async () => {
    const d = dir();
    const enospc = async () => {
      throw Object.assign(new Error('ENOSPC: no space left on device, write'), { code: 'ENOSPC' });
    };
    const e = await writeOutputFolder(join(d, 'out'), [{ path: 'probes.csv', data: enospc }]).catch((x: unknown) => x);
    expect(e).toBeInstanceOf(OutputError);
    expect((e as Error).message).toBe(`cannot write the outputs in ${join(d, 'out')}: ENOSPC: no space left on device, write`);
    expect(files(d)).toEqual([]);
  });

  it('refuses a folder holding files ladderwave did not write, without touching it', async () => {
    const d = dir();
    mkdirSync(join(d, 'mine'));
    writeFileSync(join(d, 'mine', 'notes.txt'), 'mine');
    writeFileSync(join(d, 'mine', 'probes.csv'), 'old');
    await expect(writeOutputFolder(join(d, 'mine'), entries({ 'probes.csv': 'new' }))).rejects.toThrow(
      `cannot write the outputs in ${join(d, 'mine')}: it holds notes.txt, which ladderwave did not write, and the outputs replace the whole folder; give a new or empty folder with --out`,
    );
    expect(files(join(d, 'mine'))).toEqual(['notes.txt', 'probes.csv']);
    expect(files(d)).toEqual(['mine']);
  });

  it('refuses at once a file in the way, and a path under /proc (where a recursive mkdir spins forever)', async () => {
    const d = dir();
    writeFileSync(join(d, 'taken'), 'a file');
    await expect(checkOutputTarget(join(d, 'taken'))).rejects.toThrow(`${join(d, 'taken')} is a file, not a folder`);
    await expect(checkOutputTarget(join(d, 'taken', 'out'))).rejects.toThrow(`${join(d, 'taken')} is a file, not a folder`);
    await expect(writeOutputFolder('/proc/self/x', entries({ a: 'b' }))).rejects.toThrow('/proc/self is on the proc pseudo-filesystem, which holds no ordinary files');
    await expect(prepareFileTarget('/proc/self/x/report.xml')).rejects.toThrow(OutputError);
    await expect(prepareFileTarget(d)).rejects.toThrow(`cannot write ${d}: it is a folder`);
  });

  it("removes a killed process's staged and set-aside folders next to the target, and keeps a live one's", async () => {
    const d = dir();
    const dead = deadPid();
    const stale = [`.out.lw-stage-${dead}-0a0b0c0d`, `.out.lw-old-${dead}-01020304`];
    for (const s of stale) mkdirSync(join(d, s));
    writeFileSync(join(d, stale[0]!, 'probes.csv'), 'half');
    const live = `.out.lw-stage-${process.pid}-ffffffff`;
    mkdirSync(join(d, live));
    await writeOutputFolder(join(d, 'out'), entries({ 'summary.json': '{}' }));
    expect(files(d)).toEqual([live, 'out']);
  });

  it('lets two writes into one folder at once each swap in a complete set; the folder holds one of them', async () => {
    const d = dir();
    const out = join(d, 'out');
    const set = (tag: string) => entries({ 'probes.csv': tag, 'summary.json': tag, 'waveforms.png': tag });
    await Promise.all([writeOutputFolder(out, set('A')), writeOutputFolder(out, set('B')), writeOutputFolder(out, set('C'))]);
    const contents = files(out).map((f) => readFileSync(join(out, f), 'utf8'));
    expect(files(out)).toEqual(['probes.csv', 'summary.json', 'waveforms.png']);
    expect(new Set(contents).size).toBe(1);
    expect(files(d)).toEqual(['out']);
  });

  it('names every file the commands write in OUTPUT_NAMES (and nothing else)', () => {
    const written = new Set<string>([
      ...Object.values(OUTPUT_FILES),
      ...Object.values(VIEW_FILES),
      ...Object.values(EYE_FILES),
      ...Object.values(TDR_FILES),
      ...Object.values(SWEEP_FILES),
      ...Object.values(DEVICE_FILES),
      ...Object.values(SPARAMS_FILES),
      FRAMES_DIR,
      REPORT_FILE,
      EXPLORE_FILE,
      CROSSCHECK_FILE,
    ]);
    expect([...OUTPUT_NAMES].sort()).toEqual([...written].sort());
  });
});

// A real full disk: a 64 kB tmpfs, where the machine lets this process mount one (root in a
// container with CAP_SYS_ADMIN); otherwise the injected ENOSPC above stands in for it.
const tmpfs = (() => {
  if (process.platform !== 'linux' || process.getuid?.() !== 0) return undefined;
  const d = mkdtempSync(join(tmpdir(), 'lw-tmpfs-'));
  const r = spawnSync('mount', ['-t', 'tmpfs', '-o', 'size=64k', 'tmpfs', d]);
  if (r.status !== 0) {
    rmSync(d, { recursive: true, force: true });
    return undefined;
  }
  afterAll(() => {
    spawnSync('umount', [d]);
    rmSync(d, { recursive: true, force: true });
  });
  return d;
})();

describe.skipIf(!tmpfs)('on a full disk (a 64 kB tmpfs)', () => {
  it('fails with OutputError naming ENOSPC, leaves the previous folder as it was and no temporaries', async () => {
    const d = tmpfs!;
    const out = join(d, 'out');
    await writeOutputFolder(out, entries({ 'probes.csv': 'old', 'summary.json': 'old' }));
    const e = await writeOutputFolder(out, entries({ 'probes.csv': 'x'.repeat(200_000), 'summary.json': 'new' })).catch((x: unknown) => x);
    expect(e).toBeInstanceOf(OutputError);
    expect((e as Error).message).toMatch(/ENOSPC|no space left/);
    expect(files(d)).toEqual(['out']);
    expect(readFileSync(join(out, 'probes.csv'), 'utf8')).toBe('old');
  });

  it('refuses a mount point as the output folder itself: the swap cannot rename it', async () => {
    await expect(checkOutputTarget(tmpfs!)).rejects.toThrow('it is a mount point');
    expect(existsSync(join(tmpfs!, 'out'))).toBe(true);
  });
});
