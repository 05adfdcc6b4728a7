// probeTrace: one probe's samples out of the [probes, samples] record, by index or name.
import ndarray from 'ndarray';
import { describe, expect, it } from 'vitest';
import { probeTrace, probeTraces, type ProbeRecord } from '../../sim/result.js';

// Hand-built 2 × 3 record: probe a = [1, 2, 3], probe b = [4, 5, 6].
const record: ProbeRecord = { names: ['a', 'b'], dtSample: 1e-9, values: ndarray(Float64Array.of(1, 2, 3, 4, 5, 6), [2, 3]) };

describe('probeTrace', () => {
  it('returns the row of a probe by index or name, as a view of the record', () => {
    expect([...probeTrace(record, 1)]).toEqual([4, 5, 6]);
    expect([...probeTrace(record, 'a')]).toEqual([1, 2, 3]);
    expect(probeTrace(record, 'b').buffer).toBe(record.values.data.buffer);
    expect(probeTraces(record).map((r) => [...r])).toEqual([[1, 2, 3], [4, 5, 6]]);
  });

  it('copies a row whose samples are not contiguous (a transposed view)', () => {
    // The same numbers stored sample-major: data [1, 4, 2, 5, 3, 6] read with strides [1, 2].
    const t: ProbeRecord = { names: ['a', 'b'], dtSample: 1e-9, values: ndarray(Float64Array.of(1, 4, 2, 5, 3, 6), [2, 3], [1, 2]) };
    expect([...probeTrace(t, 'b')]).toEqual([4, 5, 6]);
  });

  it('names the probes it has when asked for one it does not', () => {
    expect(() => probeTrace(record, 'rx')).toThrow(/no probe named 'rx'.*a, b/);
    expect(() => probeTrace(record, 2)).toThrow(RangeError);
  });
});
