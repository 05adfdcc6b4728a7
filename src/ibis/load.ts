// Reading a model file from disk, with a size cap checked before reading (a device such as /dev/zero
// is refused, not read into memory).
import { formatBytes, readCapped } from '../scenario/file.js';
import { parseIbis } from './parse.js';
import { IbisError, type IbisFileData } from './types.js';

/** Largest model file read: 64 MiB (a model file with many components is a few MB). */
export const MAX_IBIS_BYTES = 64 * 1024 ** 2;

export async function loadIbisFile(path: string): Promise<IbisFileData> {
  const read = await readCapped(path, MAX_IBIS_BYTES);
  if (!read.ok) {
    const what = read.tooLarge ? `a model file of at most ${formatBytes(MAX_IBIS_BYTES)}` : 'a readable model file';
    throw new IbisError([{ file: path, line: 1, keyword: '', message: `expected ${what} (${read.why})` }]);
  }
  return parseIbis(read.bytes.toString('utf8'), path);
}
