// Probe records as CSV: header `time_s,<probe names>`, then one row per sample.
//
// Numbers are written in full precision with JavaScript's shortest round-trip formatting
// (`String(x)`: parsing the text gives back the identical double). Sample i's time is computed as
// i·dtSample, never accumulated, so it carries no drift. Long records are produced in chunks of
// rows so that no single string grows beyond a few megabytes, however many probes there are.
import { probeTraces, type ProbeRecord } from '../../sim/result.js';
import type { ChunkSink } from './atomic.js';

/** Characters per chunk, about: each chunk is one string, and strings end near 512 MiB. */
export const CHUNK_CHARS = 4 * 1024 ** 2;

/** Rows per chunk for `probes` probes: at most about 25 characters a value, CHUNK_CHARS a chunk. */
export function rowsPerChunk(probes: number): number {
  return Math.max(1, Math.floor(CHUNK_CHARS / (25 * (probes + 1))));
}

/** RFC 4180 quoting for a header field that needs it (comma, quote, CR or LF). */
export function csvField(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function csvHeader(names: readonly string[]): string {
  return ['time_s', ...names].map(csvField).join(',') + '\n';
}

/** Shortest text that parses back to the same double; `-0` is written as `0`. */
export function formatNumber(x: number): string {
  return String(x);
}


const rowsPerChunkFor = (record: ProbeRecord) => rowsPerChunk(record.names.length);

/** The CSV text in chunks: first the header, then blocks of `rowsPerChunk` rows (a few MB each). */
export function* csvChunks(record: ProbeRecord, rowsPerChunk = rowsPerChunkFor(record)): Generator<string> {
  const rows = probeTraces(record);
  const samples = record.values.shape[1];
  const dt = record.dtSample;
  yield csvHeader(record.names);
  const parts: string[] = [];
  for (let i0 = 0; i0 < samples; i0 += rowsPerChunk) {
    const i1 = Math.min(samples, i0 + rowsPerChunk);
    parts.length = 0;
    for (let i = i0; i < i1; i++) {
      let line = formatNumber(i * dt);
      for (let p = 0; p < rows.length; p++) line += ',' + formatNumber(rows[p][i]);
      parts.push(line);
    }
    yield parts.join('\n') + '\n';
  }
}

/** The whole CSV as one string; for short records and tests. Use {@link writeCsv} for files. */
export function probeRecordToCsv(record: ProbeRecord): string {
  let s = '';
  for (const chunk of csvChunks(record)) s += chunk;
  return s;
}

/** Writes the CSV into a sink chunk by chunk, waiting for the sink between chunks. */
export async function writeCsv(record: ProbeRecord, sink: ChunkSink, rowsPerChunk = rowsPerChunkFor(record)): Promise<void> {
  for (const chunk of csvChunks(record, rowsPerChunk)) await sink.write(chunk);
}
