// Reading a Touchstone file from disk; the parser itself works on text.
import { readFile } from 'node:fs/promises';
import { ScenarioError } from '../scenario/problems.js';
import { parseTouchstone, type TouchstoneData } from './read.js';

/** Reads and parses a Touchstone file; a missing or unreadable file is a ScenarioError too. */
export async function readTouchstoneFile(path: string, ports?: number): Promise<TouchstoneData> {
  let text: string;
  try {
    text = await readFile(path, 'latin1');
  } catch (e) {
    const why = (e as NodeJS.ErrnoException).code === 'ENOENT' ? 'an existing Touchstone file' : `a readable Touchstone file (${(e as Error).message})`;
    throw new ScenarioError([{ file: path, path: '', value: path, expected: why }]);
  }
  return parseTouchstone(text, { file: path, ports });
}
