// Reading an input file with a size cap checked before (and while) reading, so that a path such as
// /dev/zero, a named pipe or a huge file by mistake is refused instead of filling the memory.
import { open } from 'node:fs/promises';

/** Largest scenario file read: 8 MiB (a scenario is a few kB; a long "table" signal a few MB). */
export const MAX_SCENARIO_BYTES = 8 * 1024 ** 2;

/** Why a file could not be read, as a phrase to follow "expected a readable … (": "no such file". */
export type ReadFailure = { ok: false; why: string; tooLarge: boolean };

/** "8 MiB", "512 kiB", "100 bytes". */
export function formatBytes(n: number): string {
  if (n >= 1024 ** 3 && n % 1024 ** 3 === 0) return `${n / 1024 ** 3} GiB`;
  if (n >= 1024 ** 2) return `${Number((n / 1024 ** 2).toPrecision(3))} MiB`;
  if (n >= 1024) return `${Number((n / 1024).toPrecision(3))} kiB`;
  return `${n} bytes`;
}

function errnoPhrase(e: unknown): string {
  const code = (e as NodeJS.ErrnoException).code;
  if (code === 'ENOENT') return 'no such file';
  if (code === 'EISDIR') return 'a directory';
  if (code === 'EACCES' || code === 'EPERM') return 'permission denied';
  return code ?? String(e);
}

/**
 * The bytes of `path`, at most `cap` of them. A regular file larger than the cap is refused from its
 * size alone; anything else (a device, a pipe) is read up to cap + 1 bytes and refused past the cap.
 */
export async function readCapped(path: string, cap: number): Promise<{ ok: true; bytes: Buffer } | ReadFailure> {
  let fh;
  try {
    fh = await open(path, 'r');
  } catch (e) {
    return { ok: false, why: errnoPhrase(e), tooLarge: false };
  }
  try {
    const st = await fh.stat();
    if (st.isDirectory()) return { ok: false, why: 'a directory', tooLarge: false };
    if (st.isFile() && st.size > cap) return { ok: false, why: `it is ${formatBytes(st.size)}`, tooLarge: true };
    const chunks: Buffer[] = [];
    let total = 0;
    for (;;) {
      const want = Math.min(64 * 1024, cap + 1 - total);
      const buf = Buffer.alloc(want);
      const { bytesRead } = await fh.read(buf, 0, want, null);
      if (bytesRead === 0) break;
      chunks.push(bytesRead === want ? buf : buf.subarray(0, bytesRead));
      total += bytesRead;
      if (total > cap) return { ok: false, why: st.isFile() ? 'it grew while being read' : 'it is not a regular file, and reading it gave more than that', tooLarge: true };
    }
    return { ok: true, bytes: Buffer.concat(chunks, total) };
  } catch (e) {
    return { ok: false, why: errnoPhrase(e), tooLarge: false };
  } finally {
    await fh.close().catch(() => undefined);
  }
}
