// An output folder that changes as a whole. Every file of a run is written into a fresh hidden sibling
// folder (`.<name>.lw-stage-<pid>-<hex>` next to the target); when all are written and flushed, the
// staged folder is swapped in with renames done in one synchronous step (no signal handler can run
// between them): the previous folder, if any, is renamed aside, the staged one renamed to the target,
// and the previous one removed. A reader therefore sees the earlier complete set of files, or for an
// instant no folder, or the new complete set — never a mix of two runs, never a half-written file.
// Two runs into the same folder at once each swap in their own complete set; the last one stays.
//
// Because the swap replaces the whole folder, a target holding files ladderwave did not write (the
// user's own) is refused, as are targets that cannot work: a file in the way, a pseudo-filesystem
// such as /proc, a folder that is a mount point. These checks run before any work, without side
// effects, so they fail within a second. Temporaries left by a process that was killed (SIGKILL)
// are removed by the next run writing next to them.
import { randomBytes } from 'node:crypto';
import { existsSync, readdirSync, renameSync, rmSync, statSync } from 'node:fs';
import { access, constants, lstat, mkdir, open, rmdir, stat, statfs } from 'node:fs/promises';
import { basename, dirname, join, resolve, sep } from 'node:path';
import { forgetTemporary, registerTemporary, removeStaleTemporaries, type ChunkSink } from './atomic.js';
import { OutputError } from './errors.js';

/** One file of an output folder: a path inside it and its content (or a writer of its content). */
export interface FolderEntry {
  path: string;
  data: string | Uint8Array | ((sink: ChunkSink) => Promise<void> | void);
}

/**
 * Names ladderwave writes at the top of an output folder (run, eye, tdr, sparams, sweep, merge, device). A folder
 * holding anything else is the user's and is never replaced. test/src/output/folder.test.ts keeps
 * this list equal to the modules' own constants.
 */
export const OUTPUT_NAMES: ReadonlySet<string> = new Set([
  'probes.csv',
  'summary.json',
  'waveforms.png',
  'map.png',
  'bounce.png',
  'eye.png',
  'crosscheck.png',
  'report.html',
  'explore.html',
  'frames',
  'tdr.png',
  'tdr.csv',
  'sweep.csv',
  'sweep.png',
  'sweep.json',
  'best',
  'worst',
  'iv.png',
  'sparams.s2p',
  'sparams.png',
  'sparams.json',
]);

/** Filesystems that hold no ordinary files (statfs f_type values, from linux/magic.h). */
const PSEUDO_FILESYSTEMS: ReadonlyMap<number, string> = new Map([
  [0x9fa0, 'proc'],
  [0x62656572, 'sysfs'],
  [0x1cd1, 'devpts'],
  [0x27e0eb, 'cgroup'],
  [0x63677270, 'cgroup2'],
  [0x64626720, 'debugfs'],
  [0x74726163, 'tracefs'],
  [0x73636673, 'securityfs'],
  [0x6165676c, 'pstore'],
  [0xcafe4a11, 'bpf'],
  [0x62656570, 'configfs'],
  [0xde5e81e4, 'efivarfs'],
  [0xf97cff8c, 'selinuxfs'],
  [0x65735543, 'fusectl'],
  [0x42494e4d, 'binfmt_misc'],
  [0x19800202, 'mqueue'],
  [0x6e736673, 'nsfs'],
]);

const sibling = (target: string, kind: 'stage' | 'old') => join(dirname(target), `.${basename(target)}.lw-${kind}-${process.pid}-${randomBytes(4).toString('hex')}`);

const errText = (e: unknown) => (e as Error).message;

/** The first existing folder at or above `path`, checking that nothing on the way is a file. */
async function nearestExisting(path: string, target: string): Promise<string> {
  let p = path;
  for (;;) {
    try {
      const st = await stat(p);
      if (!st.isDirectory()) throw new OutputError(`cannot write the outputs in ${target}: ${p} is a file, not a folder`);
      return p;
    } catch (e) {
      if (e instanceof OutputError) throw e;
      const code = (e as NodeJS.ErrnoException).code;
      if (code === 'ENOTDIR') {
        p = dirname(p);
        continue;
      }
      if (code !== 'ENOENT') throw new OutputError(`cannot write the outputs in ${target}: ${errText(e)}`, e);
      const up = dirname(p);
      if (up === p) throw new OutputError(`cannot write the outputs in ${target}: no folder of it exists`);
      p = up;
    }
  }
}

/** The entries of an existing target that ladderwave did not write (hidden temporaries aside). */
function foreignEntries(target: string): string[] {
  return readdirSync(target).filter((n) => !OUTPUT_NAMES.has(n) && !/^\..+\.\d+-[0-9a-f]+\.tmp$/.test(n));
}

/**
 * Checks, without creating anything, that `target` can become an output folder: not a file, not on
 * a pseudo-filesystem, writable, not a mount point, and holding only ladderwave's own files. Throws
 * OutputError saying what is in the way.
 */
export async function checkOutputTarget(target: string): Promise<void> {
  const abs = resolve(target);
  const existing = await nearestExisting(abs, target);
  const fs = await statfs(existing).catch(() => undefined);
  const pseudo = fs ? PSEUDO_FILESYSTEMS.get(Number(fs.type)) : undefined;
  if (pseudo) throw new OutputError(`cannot write the outputs in ${target}: ${existing} is on the ${pseudo} pseudo-filesystem, which holds no ordinary files`);
  if (existing === abs) {
    const parent = dirname(abs);
    if (parent === abs) throw new OutputError(`cannot write the outputs in ${target}: it is the root folder; give a folder inside it`);
    const [own, up] = await Promise.all([lstat(abs), stat(parent)]);
    if (own.isDirectory() && own.dev !== up.dev) {
      throw new OutputError(`cannot write the outputs in ${target}: it is a mount point, and the outputs replace the whole folder; give a folder inside it`);
    }
    const foreign = foreignEntries(abs);
    if (foreign.length > 0) {
      const shown = foreign.slice(0, 3).join(', ') + (foreign.length > 3 ? `, … (${foreign.length} in all)` : '');
      throw new OutputError(
        `cannot write the outputs in ${target}: it holds ${shown}, which ladderwave did not write, and the outputs replace the whole folder; give a new or empty folder with --out`,
      );
    }
    await writable(parent, target);
  } else await writable(existing, target);
}

async function writable(folder: string, target: string): Promise<void> {
  try {
    await access(folder, constants.W_OK | constants.X_OK);
  } catch {
    throw new OutputError(`cannot write the outputs in ${target}: ${folder} is not writable`);
  }
}

/**
 * For one file written atomically (a report, a golden file): checks its place like
 * checkOutputTarget does a folder's (a file in the way, a pseudo-filesystem, a folder at the path,
 * not writable) and creates its missing parent folders. Throws OutputError.
 */
export async function prepareFileTarget(file: string): Promise<void> {
  await checkFileTarget(file);
  await makeFolders(dirname(resolve(file)), file);
}

/** The checks of prepareFileTarget, without creating anything. */
export async function checkFileTarget(file: string): Promise<void> {
  const abs = resolve(file);
  const existing = await nearestExisting(dirname(abs), file);
  const fs = await statfs(existing).catch(() => undefined);
  const pseudo = fs ? PSEUDO_FILESYSTEMS.get(Number(fs.type)) : undefined;
  if (pseudo) throw new OutputError(`cannot write ${file}: ${existing} is on the ${pseudo} pseudo-filesystem, which holds no ordinary files`);
  if (existsSync(abs) && statSync(abs).isDirectory()) throw new OutputError(`cannot write ${file}: it is a folder`);
  await writable(existing, file);
}

/** Creates `folder` and its missing parents one level at a time; returns the folders created, outermost first. */
async function makeFolders(folder: string, target: string): Promise<string[]> {
  const missing: string[] = [];
  for (let p = resolve(folder); !existsSync(p); p = dirname(p)) missing.unshift(p);
  const made: string[] = [];
  for (const p of missing) {
    try {
      await mkdir(p); // not recursive: Node's recursive mkdir can spin forever on /proc
      made.push(p);
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code === 'EEXIST') continue;
      await removeFolders(made);
      throw new OutputError(`cannot create the output folder ${target}: ${errText(e)}`, e);
    }
  }
  return made;
}

/** Removes folders this call created (innermost first), if they are empty. */
async function removeFolders(made: readonly string[]): Promise<void> {
  for (const p of [...made].reverse()) await rmdir(p).catch(() => undefined);
}

async function writeEntry(folder: string, entry: FolderEntry): Promise<void> {
  const path = join(folder, entry.path);
  if (!resolve(path).startsWith(resolve(folder) + sep)) throw new Error(`output entry outside its folder: ${entry.path}`);
  // Subfolders one level at a time, never recursively: if an interruption removes the staged folder
  // meanwhile, nothing here may create it again.
  const parts = entry.path.split(/[\\/]/).slice(0, -1);
  for (let k = 1; k <= parts.length; k++) {
    await mkdir(join(folder, ...parts.slice(0, k))).catch((e: NodeJS.ErrnoException) => {
      if (e.code !== 'EEXIST') throw e;
    });
  }
  const fh = await open(path, 'wx');
  try {
    const sink: ChunkSink = {
      async write(chunk) {
        const buf = typeof chunk === 'string' ? Buffer.from(chunk, 'utf8') : chunk;
        for (let off = 0; off < buf.length; ) off += (await fh.write(buf, off, buf.length - off)).bytesWritten;
      },
    };
    if (typeof entry.data === 'function') await entry.data(sink);
    else await sink.write(entry.data);
    await fh.sync(); // on disk before the rename makes it visible
  } finally {
    await fh.close();
  }
}

/**
 * Renames the staged folder to `target` in one synchronous step, moving a previous target aside and
 * removing it. Retries when another process swapped its own folder in at the same moment.
 */
function swapIn(staged: string, target: string): void {
  for (let attempt = 0; ; attempt++) {
    let old: string | undefined;
    if (existsSync(target)) {
      const foreign = statSync(target).isDirectory() ? foreignEntries(target) : ['(a file)'];
      if (foreign.length > 0) throw new OutputError(`cannot write the outputs in ${target}: ${foreign[0]} appeared in it while this run was writing; nothing was replaced`);
      old = sibling(target, 'old');
      registerTemporary(old);
      try {
        renameSync(target, old);
      } catch (e) {
        forgetTemporary(old);
        if ((e as NodeJS.ErrnoException).code !== 'ENOENT') throw e;
        old = undefined;
      }
    }
    try {
      renameSync(staged, target);
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code;
      if (old) {
        // Put the previous folder back if nothing took its place.
        try {
          renameSync(old, target);
          forgetTemporary(old);
          old = undefined;
        } catch {
          // another run's folder is there now
        }
      }
      if ((code === 'ENOTEMPTY' || code === 'EEXIST') && attempt < 8) continue;
      throw e;
    }
    forgetTemporary(staged);
    if (old) {
      rmSync(old, { recursive: true, force: true });
      forgetTemporary(old);
    }
    return;
  }
}

/**
 * Writes `entries` as the whole content of `target`: staged in a hidden sibling folder, then swapped
 * in (see the file comment). If anything fails, the staged folder and the parents this call created
 * are removed, the previous content of `target` is untouched, and OutputError is thrown. Returns the
 * final paths of the entries, in order.
 */
export async function writeOutputFolder(target: string, entries: readonly FolderEntry[]): Promise<string[]> {
  await checkOutputTarget(target);
  const parent = dirname(resolve(target));
  const made = await makeFolders(parent, target);
  removeStaleTemporaries(parent, new RegExp(`^\\.${escape(basename(resolve(target)))}\\.lw-(?:stage|old)-(\\d+)-[0-9a-f]+$`));
  const staged = sibling(resolve(target), 'stage');
  registerTemporary(staged);
  try {
    await mkdir(staged);
    for (const e of entries) await writeEntry(staged, e);
    swapIn(staged, resolve(target));
  } catch (e) {
    rmSync(staged, { recursive: true, force: true });
    forgetTemporary(staged);
    await removeFolders(made);
    if (e instanceof OutputError) throw e;
    throw new OutputError(`cannot write the outputs in ${target}: ${errText(e)}`, e);
  }
  return entries.map((e) => join(target, e.path));
}

const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
