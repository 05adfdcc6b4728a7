// Write-to-a-temporary-name-then-rename, so a reader never sees a half-written output.
//
// A temporary file lives in the same folder as its target (rename is atomic only within one file
// system) and is named `.<target>.<pid>-<random>.tmp`: hidden, and plainly not a finished output.
// If the write fails the temporary file is removed and the target is left as it was. Every
// temporary file still in flight is listed in a registry so that a signal handler (see the CLI)
// can remove them before the process exits.
import { randomBytes } from 'node:crypto';
import { unlinkSync } from 'node:fs';
import { open, rename, unlink } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';

/** Temporary files created by this process and not yet renamed or removed. */
const pending = new Set<string>();

/** The temporary name used for `target`: same folder, hidden, `.tmp` suffix. */
export function tempPathFor(target: string): string {
  return join(dirname(target), `.${basename(target)}.${process.pid}-${randomBytes(4).toString('hex')}.tmp`);
}

/** Removes every temporary file still in flight (synchronously, for use in signal and exit handlers). */
export function removePendingTempFilesSync(): void {
  for (const p of pending) {
    try {
      unlinkSync(p);
    } catch {
      // already gone
    }
    pending.delete(p);
  }
}

/** Temporary files currently in flight (for tests and diagnostics). */
export function pendingTempFiles(): string[] {
  return [...pending];
}

async function removeQuietly(path: string): Promise<void> {
  pending.delete(path);
  await unlink(path).catch(() => undefined);
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
  // 'wx': never overwrite an existing file with our temporary one. Opened before anything is
  // written, so the temporary file exists (and is registered) for the whole write.
  const fh = await open(tmp, 'wx');
  pending.add(tmp);
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
    pending.delete(tmp);
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

/**
 * Several files that appear together or not at all (as far as rename allows): each is written to its
 * temporary name first; only when every one has been written are they renamed, in the order staged.
 * Stage the file that marks a complete output (summary.json) last. If any write fails, all
 * temporary files are removed and no target is touched.
 */
export class AtomicBatch {
  private readonly staged: { tmp: string; target: string }[] = [];
  private closed = false;

  async stage(target: string, data: string | Uint8Array | ((sink: ChunkSink) => Promise<void> | void)): Promise<void> {
    if (this.closed) throw new Error('AtomicBatch: already committed or aborted');
    const produce = typeof data === 'function' ? data : (sink: ChunkSink) => sink.write(data);
    try {
      const tmp = await writeTemp(target, produce);
      this.staged.push({ tmp, target });
    } catch (e) {
      await this.abort();
      throw e;
    }
  }

  /** Renames every staged file to its target; returns the targets. */
  async commit(): Promise<string[]> {
    if (this.closed) throw new Error('AtomicBatch: already committed or aborted');
    this.closed = true;
    const done: string[] = [];
    try {
      for (const { tmp, target } of this.staged) {
        await commitTemp(tmp, target);
        done.push(target);
      }
    } catch (e) {
      for (const { tmp } of this.staged) await removeQuietly(tmp);
      throw e;
    }
    return done;
  }

  /** Removes every staged temporary file. */
  async abort(): Promise<void> {
    this.closed = true;
    for (const { tmp } of this.staged) await removeQuietly(tmp);
    this.staged.length = 0;
  }
}
