// Write-to-a-temporary-name-then-rename, so a reader never sees a half-written output.
//
// A temporary file lives in the same folder as its target (rename is atomic only within one file
// system) and is named `.<target>.<pid>-<random>.tmp`: hidden, and plainly not a finished output.
// If the write fails the temporary file is removed and the target is left as it was. Every
// temporary file still in flight is listed in a registry so that a signal handler (see the CLI)
// can remove them before the process exits.
import { randomBytes } from 'node:crypto';
import { readdirSync, rmSync } from 'node:fs';
import { open, rename, unlink } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';

/**
 * Temporary files and folders created by this process and not yet renamed or removed. Process-wide on
 * purpose: a signal handler must find every one of them.
 */
const pending = new Set<string>();

/** What the CLI installs while temporaries exist: signal handlers that remove them before exiting. */
export interface InterruptGuard {
  install(): void;
  remove(): void;
}

let guard: InterruptGuard | undefined;

/**
 * Installs `g` whenever this process has temporaries on disk (and removes it when none are left), so
 * that an interruption cleans them up; outside those moments signals keep their default action. The
 * CLI sets it once at start; a library user may leave it unset.
 */
export function setInterruptGuard(g: InterruptGuard | undefined): void {
  if (guard && pending.size > 0) guard.remove();
  guard = g;
  if (guard && pending.size > 0) guard.install();
}

/** Lists a temporary path (file or folder) for removal on interruption; call before creating it. */
export function registerTemporary(path: string): void {
  pending.add(path);
  if (pending.size === 1) guard?.install();
}

/** The temporary path was renamed into place or removed. */
export function forgetTemporary(path: string): void {
  if (!pending.delete(path)) return;
  if (pending.size === 0) guard?.remove();
}

/** The temporary name used for `target`: same folder, hidden, `.tmp` suffix. */
export function tempPathFor(target: string): string {
  return join(dirname(target), `.${basename(target)}.${process.pid}-${randomBytes(4).toString('hex')}.tmp`);
}

/** Removes every temporary file and folder still in flight (synchronously, for signal and exit handlers). */
export function removePendingTempFilesSync(): void {
  for (const p of [...pending]) {
    try {
      // Retries: a write still in flight may add a file while the folder is being removed.
      rmSync(p, { recursive: true, force: true, maxRetries: 5, retryDelay: 2 });
    } catch {
      // already gone, or not removable: nothing more can be done while exiting
    }
    forgetTemporary(p);
  }
}

/** Temporary files and folders currently in flight (for tests and diagnostics). */
export function pendingTempFiles(): string[] {
  return [...pending];
}

/** Whether process `pid` is still running (EPERM: it is, under another user). */
export function processAlive(pid: number): boolean {
  if (pid === process.pid) return true;
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/**
 * Removes, in `folder`, the temporaries named by `pattern` (its first group the pid) that a process
 * no longer running left behind (killed with SIGKILL, or by a power cut).
 */
export function removeStaleTemporaries(folder: string, pattern: RegExp): string[] {
  let names: string[];
  try {
    names = readdirSync(folder);
  } catch {
    return [];
  }
  const removed: string[] = [];
  for (const name of names) {
    const m = pattern.exec(name);
    if (!m || processAlive(Number(m[1]))) continue;
    try {
      rmSync(join(folder, name), { recursive: true, force: true });
      removed.push(name);
    } catch {
      // someone else's, or already gone
    }
  }
  return removed;
}

/** `.<target>.<pid>-<hex>.tmp` of tempPathFor, with the pid as group 1. */
function staleFilePattern(target: string): RegExp {
  return new RegExp(`^\\.${basename(target).replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}\\.(\\d+)-[0-9a-f]+\\.tmp$`);
}

async function removeQuietly(path: string): Promise<void> {
  await unlink(path).catch(() => undefined);
  forgetTemporary(path);
}

/** Where a producer pushes its output: each write is complete when its promise resolves. */
export interface ChunkSink {
  write(chunk: string | Uint8Array): Promise<void>;
}

/**
 * Writes a file at a temporary name through `produce`, which pushes chunks into the sink, and returns
 * the temporary path without renaming it. On failure the temporary file is removed and the error
 * rethrown. Use {@link commitTemp} (or {@link writeFileAtomic} for the whole sequence) to finish.
 */
export async function writeTemp(target: string, produce: (sink: ChunkSink) => Promise<void> | void): Promise<string> {
  const tmp = tempPathFor(target);
  removeStaleTemporaries(dirname(target), staleFilePattern(target));
  // 'wx': never overwrite an existing file with our temporary one. Registered before it is created,
  // so an interruption at any moment of the write removes it.
  registerTemporary(tmp);
  let fh;
  try {
    fh = await open(tmp, 'wx');
  } catch (e) {
    forgetTemporary(tmp);
    throw e;
  }
  const sink: ChunkSink = {
    async write(chunk) {
      const buf = typeof chunk === 'string' ? Buffer.from(chunk, 'utf8') : chunk;
      let off = 0;
      while (off < buf.length) {
        const { bytesWritten } = await fh.write(buf, off, buf.length - off);
        off += bytesWritten;
      }
    },
  };
  try {
    await produce(sink);
    // Flush to disk before a rename makes the file visible under its final name.
    await fh.sync();
    await fh.close();
    return tmp;
  } catch (e) {
    await fh.close().catch(() => undefined);
    await removeQuietly(tmp);
    throw e;
  }
}

/** Renames a temporary file from {@link writeTemp} to its target; removes it if the rename fails. */
export async function commitTemp(tmp: string, target: string): Promise<void> {
  try {
    await rename(tmp, target);
    forgetTemporary(tmp);
  } catch (e) {
    await removeQuietly(tmp);
    throw e;
  }
}

/** Discards a temporary file from {@link writeTemp}. */
export async function discardTemp(tmp: string): Promise<void> {
  await removeQuietly(tmp);
}

/** Writes `data` (or the chunks `produce` pushes) to `target` atomically: temporary name, then rename. */
export async function writeFileAtomic(
  target: string,
  data: string | Uint8Array | ((sink: ChunkSink) => Promise<void> | void),
): Promise<void> {
  const produce = typeof data === 'function' ? data : (sink: ChunkSink) => sink.write(data);
  const tmp = await writeTemp(target, produce);
  await commitTemp(tmp, target);
}
