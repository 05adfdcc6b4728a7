// sweep.csv: header, then one row per point in point order. Numbers are written in full precision
// (JavaScript's shortest round-trip form, as in probes.csv), an unmeasurable value as an empty cell,
// so reading the file back gives the identical numbers (merge relies on this).
import { CHUNK_CHARS, csvField } from '../output/csv.js';
import type { SweepRow } from './point.js';

/** sweep.csv in chunks of about CHUNK_CHARS characters (a sweep may have 100 000 rows of hundreds of columns). */
export function* sweepCsvChunks(header: readonly string[], rows: readonly SweepRow[]): Generator<string> {
  yield header.map(csvField).join(',') + '\n';
  const parts: string[] = [];
  let size = 0;
  for (const r of rows) {
    const line = r.map((v) => (v === null ? '' : String(v))).join(',') + '\n';
    parts.push(line);
    size += line.length;
    if (size >= CHUNK_CHARS) {
      yield parts.join('');
      parts.length = 0;
      size = 0;
    }
  }
  if (parts.length) yield parts.join('');
}

/** The whole of sweep.csv as one string (short sweeps, tests). */
export function formatSweepCsv(header: readonly string[], rows: readonly SweepRow[]): string {
  return [...sweepCsvChunks(header, rows)].join('');
}

export class SweepCsvError extends Error {}

function splitCsvLine(line: string): string[] {
  const out: string[] = [];
  let i = 0;
  while (i <= line.length) {
    if (line[i] === '"') {
      let s = '';
      i++;
      while (i < line.length) {
        if (line[i] === '"' && line[i + 1] === '"') {
          s += '"';
          i += 2;
        } else if (line[i] === '"') {
          i++;
          break;
        } else s += line[i++];
      }
      out.push(s);
      i++; // the comma
    } else {
      const j = line.indexOf(',', i);
      const end = j < 0 ? line.length : j;
      out.push(line.slice(i, end));
      i = end + 1;
    }
  }
  return out;
}

/** Reads sweep.csv text back into a header and rows. */
export function parseSweepCsv(text: string, file = 'sweep.csv'): { header: string[]; rows: SweepRow[] } {
  const lines = text.split('\n');
  if (lines[lines.length - 1] === '') lines.pop();
  if (lines.length === 0) throw new SweepCsvError(`${file}: empty`);
  const header = splitCsvLine(lines[0]!);
  const rows = lines.slice(1).map((l, k) => {
    const cells = l.split(',');
    if (cells.length !== header.length) throw new SweepCsvError(`${file}:${k + 2}: ${cells.length} values, the header has ${header.length}`);
    return cells.map((c, j) => {
      if (c === '') return null;
      const x = Number(c);
      if (!Number.isFinite(x)) throw new SweepCsvError(`${file}:${k + 2}: "${c}" in column ${header[j]} is not a finite number`);
      return x;
    });
  });
  return { header, rows };
}
