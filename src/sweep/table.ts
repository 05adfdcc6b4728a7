// sweep.csv: header, then one row per point in point order. Numbers are written in full precision
// (JavaScript's shortest round-trip form, as in probes.csv), an unmeasurable value as an empty cell,
// so reading the file back gives the identical numbers (merge relies on this).
import { csvField } from '../output/csv.js';
import type { SweepRow } from './point.js';

export function formatSweepCsv(header: readonly string[], rows: readonly SweepRow[]): string {
  let s = header.map(csvField).join(',') + '\n';
  for (const r of rows) s += r.map((v) => (v === null ? '' : String(v))).join(',') + '\n';
  return s;
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
      if (Number.isNaN(x)) throw new SweepCsvError(`${file}:${k + 2}: "${c}" in column ${header[j]} is not a number`);
      return x;
    });
  });
  return { header, rows };
}
