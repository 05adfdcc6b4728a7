// The probe waveforms as the explore page holds them: every sample up to FULL_DATA_LIMIT values, beyond
// that the samples the PNG views' min/max reduction keeps (src/render/reduce.ts), so that every spike
// stays visible at any zoom that shows the whole run, and every value shown is a recorded sample.
import { probeTraces, type ProbeRecord } from '../../sim/result.js';
import { reduceTrace } from '../render/reduce.js';
import { packF64 } from './pack.js';
import type { TraceSet } from './payload.js';

/** Samples × probes up to which the page holds every sample (8 bytes each, about 11 MB of page text at the limit). */
export const FULL_DATA_LIMIT = 1_000_000;

/** Columns of the reduction above the limit: up to 4 kept samples per column and probe. */
export const REDUCED_COLUMNS = 4000;

export interface TraceOptions {
  fullLimit?: number;
  columns?: number;
}

/**
 * Indices of the samples the reduction keeps for any of `rows` over `columns` columns of the whole
 * record, ascending and without repeats.
 */
export function keptIndices(rows: readonly ArrayLike<number>[], samples: number, columns: number): Int32Array {
  const keep = new Uint8Array(samples);
  for (const row of rows) {
    // x = sample index: the reduction's x values are then exact integers
    const { xs } = reduceTrace(row, { x0: 0, dx: 1 }, [0, Math.max(1, samples - 1)], columns);
    for (let k = 0; k < xs.length; k++) if (Number.isFinite(xs[k])) keep[xs[k]] = 1;
  }
  keep[0] = 1;
  keep[samples - 1] = 1;
  let count = 0;
  for (let i = 0; i < samples; i++) count += keep[i];
  const out = new Int32Array(count);
  for (let i = 0, k = 0; i < samples; i++) if (keep[i]) out[k++] = i;
  return out;
}

/** The record's probes in the page's form: full, or reduced when over the limit. */
export function traceSet(record: ProbeRecord, opts: TraceOptions = {}): TraceSet {
  const rows = probeTraces(record);
  const samples = record.values.shape[1];
  const limit = opts.fullLimit ?? FULL_DATA_LIMIT;
  if (samples * rows.length <= limit) {
    return { form: 'full', dt: record.dtSample, samples, names: [...record.names], values: rows.map((r) => packF64(r)) };
  }
  const columns = opts.columns ?? REDUCED_COLUMNS;
  const idx = keptIndices(rows, samples, columns);
  const values = rows.map((r) => packF64(Float64Array.from(idx, (i) => r[i])));
  return { form: 'reduced', dt: record.dtSample, samples, columns, index: packF64(idx), names: [...record.names], values };
}

/** A sentence for the page saying how the waveforms are held. */
export function tracesNote(t: TraceSet): string {
  const total = t.samples * t.names.length;
  if (t.form === 'full') {
    return `Waveforms: every recorded sample (${t.samples.toLocaleString('en-US')} per probe), exactly as in probes.csv.`;
  }
  const kept = t.index?.length ?? 0;
  return (
    `Waveforms: ${total.toLocaleString('en-US')} samples are more than the ${FULL_DATA_LIMIT.toLocaleString('en-US')} the page holds in full; ` +
    `it holds the ${kept.toLocaleString('en-US')} instants kept by the min/max reduction over ${t.columns} columns (first, lowest, highest and last sample of each column, as in the PNG views). ` +
    `Every value shown is a recorded sample; cursors read the nearest kept instant, so zoomed far in, read exact values from probes.csv.`
  );
}
