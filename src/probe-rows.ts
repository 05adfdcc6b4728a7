// Rows of a probe record as Float64Arrays, one per probe (views of the record's data where possible).
import type { ProbeRecord } from '../sim/result.js';

/** Rows of the record as probe-major views: one Float64Array of samples per probe. */
export function probeRows(record: ProbeRecord): Float64Array[] {
  const v = record.values;
  const [probes, samples] = v.shape;
  const rows: Float64Array[] = [];
  for (let p = 0; p < probes; p++) {
    if (v.stride[1] === 1) {
      const start = v.offset + p * v.stride[0];
      rows.push(v.data.subarray(start, start + samples));
    } else {
      const row = new Float64Array(samples);
      for (let i = 0; i < samples; i++) row[i] = v.get(p, i);
      rows.push(row);
    }
  }
  return rows;
}
