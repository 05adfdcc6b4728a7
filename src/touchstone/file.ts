// Reading a Touchstone file from disk, with a size cap checked before reading; the parser itself
// works on text.
import { formatBytes, readCapped } from '../scenario/file.js';
import { ScenarioError } from '../scenario/problems.js';
import { parseTouchstone, type TouchstoneData } from './read.js';

/** Largest Touchstone file read: 64 MiB (a measured four-port over 10 000 points is a few MB). */
export const MAX_TOUCHSTONE_BYTES = 64 * 1024 ** 2;

/** Reads and parses a Touchstone file; a missing, unreadable or oversized file is a ScenarioError too. */
export async function readTouchstoneFile(path: string, ports?: number): Promise<TouchstoneData> {
  const read = await readCapped(path, MAX_TOUCHSTONE_BYTES);
  if (!read.ok) {
    const what = read.why === 'no such file' ? 'an existing Touchstone file' : read.tooLarge ? `a Touchstone file of at most ${formatBytes(MAX_TOUCHSTONE_BYTES)} (${read.why})` : `a readable Touchstone file (${read.why})`;
    throw new ScenarioError([{ file: path, path: '', value: path, expected: what }]);
  }
  return parseTouchstone(read.bytes.toString('latin1'), { file: path, ports });
}
