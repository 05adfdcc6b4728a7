// Reading a model file from disk.
import { readFile } from 'node:fs/promises';
import { parseIbis } from './parse.js';
import type { IbisFileData } from './types.js';

export async function loadIbisFile(path: string): Promise<IbisFileData> {
  return parseIbis(await readFile(path, 'utf8'), path);
}
