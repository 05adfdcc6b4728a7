// Sample-by-sample comparison of two probe records, e.g. the time-domain engine against the spectral
// cross-check.

import { probeTrace, type ProbeRecord } from '../result.js';

export interface ProbeDifference {
  name: string;
  /** Largest |a − b| over the compared samples (V). */
  maxAbs: number;
  /** maxAbs as a percentage of `swing`. */
  percentOfSwing: number;
  /** Time at which the largest difference occurs (s). */
  time: number;
  /** Number of samples compared. */
  samples: number;
}

/**
 * For every probe name present in both records (in `a`'s order): the largest absolute difference,
 * that as a percent of `swing`, and when it occurs. When the two records share their sample interval
 * (to 1e−9 relative) they are compared sample by sample over their common length; otherwise `b` is
 * interpolated linearly at `a`'s sample times within `b`'s span.
 */
export function compareRecords(a: ProbeRecord, b: ProbeRecord, swing: number): ProbeDifference[] {
  if (!(swing > 0)) throw new RangeError(`compareRecords: swing must be > 0 (got ${swing})`);
  const na = a.values.shape[1];
  const nb = b.values.shape[1];
  const same = Math.abs(a.dtSample - b.dtSample) <= 1e-9 * Math.max(a.dtSample, b.dtSample);
  const out: ProbeDifference[] = [];
  a.names.forEach((name, pa) => {
    const pb = b.names.indexOf(name);
    if (pb < 0) return;
    const ra = probeTrace(a, pa);
    const rb = probeTrace(b, pb);
    let maxAbs = 0;
    let at = 0;
    let count = 0;
    if (same) {
      count = Math.min(na, nb);
      for (let i = 0; i < count; i++) {
        const d = Math.abs(ra[i] - rb[i]);
        if (d > maxAbs) {
          maxAbs = d;
          at = i;
        }
      }
      out.push({ name, maxAbs, percentOfSwing: (100 * maxAbs) / swing, time: at * a.dtSample, samples: count });
      return;
    }
    let time = 0;
    const spanB = (nb - 1) * b.dtSample;
    for (let i = 0; i < na; i++) {
      const t = i * a.dtSample;
      if (t > spanB * (1 + 1e-12)) break;
      const x = Math.min(t / b.dtSample, nb - 1);
      const k = Math.min(Math.floor(x), Math.max(nb - 2, 0));
      const w = nb > 1 ? x - k : 0;
      const vb = nb > 1 ? rb[k] + w * (rb[k + 1] - rb[k]) : rb[0];
      const d = Math.abs(ra[i] - vb);
      count++;
      if (d > maxAbs) {
        maxAbs = d;
        time = t;
      }
    }
    out.push({ name, maxAbs, percentOfSwing: (100 * maxAbs) / swing, time, samples: count });
  });
  return out;
}
