import ndarray from 'ndarray';
import { describe, expect, it } from 'vitest';
import type { ProbeRecord } from '../../../sim/result.js';
import type { ChunkSink } from '../../../src/output/atomic.js';
import { csvChunks, csvField, csvHeader, probeRecordToCsv, writeCsv } from '../../../src/output/csv.js';

function record(names: string[], samples: number, dtSample: number, f: (p: number, i: number) => number): ProbeRecord {
  const data = new Float64Array(names.length * samples);
  for (let p = 0; p < names.length; p++) for (let i = 0; i < samples; i++) data[p * samples + i] = f(p, i);
  return { names, dtSample, values: ndarray(data, [names.length, samples]) };
}

describe('probes.csv', () => {
  // Awkward values: not exactly representable in few digits, tiny, huge, negative.
  const dt = 1.6678204759907602e-11;
  const rec = record(['driver', 'rx'], 1001, dt, (p, i) => (p === 0 ? Math.sin(i * 0.1) * 3.3 : 1 / (i + 3) - 1e-300 * i));

  it('has the header time_s,<probe names> and one row per sample', () => {
    const lines = probeRecordToCsv(rec).split('\n');
    expect(lines[0]).toBe('time_s,driver,rx');
    expect(lines.at(-1)).toBe(''); // ends with a newline
    expect(lines.length - 2).toBe(1001);
    for (const l of lines.slice(1, -1)) expect(l.split(',')).toHaveLength(3);
  });

  it('writes sample i at exactly i·dtSample (computed, not accumulated)', () => {
    const lines = probeRecordToCsv(rec).trimEnd().split('\n').slice(1);
    let acc = 0;
    let differsFromAccumulated = false;
    lines.forEach((l, i) => {
      const t = Number(l.split(',')[0]);
      expect(t).toBe(i * dt);
      if (t !== acc) differsFromAccumulated = true;
      acc += dt;
    });
    // The check above would be meaningless if accumulation happened to give the same numbers.
    expect(differsFromAccumulated).toBe(true);
  });

  it('round-trips every value exactly', () => {
    const lines = probeRecordToCsv(rec).trimEnd().split('\n').slice(1);
    const data = rec.values.data;
    lines.forEach((l, i) => {
      const [, a, b] = l.split(',').map(Number);
      expect(a).toBe(data[i]);
      expect(b).toBe(data[1001 + i]);
    });
  });

  it('gives the same text in small chunks as in one piece, and writes through a sink', async () => {
    const whole = probeRecordToCsv(rec);
    expect([...csvChunks(rec, 7)].join('')).toBe(whole);
    const got: string[] = [];
    const sink: ChunkSink = { write: async (c) => void got.push(String(c)) };
    await writeCsv(rec, sink, 100);
    expect(got.join('')).toBe(whole);
    expect(got.length).toBe(1 + 11); // header + ceil(1001 / 100) chunks
  });

  it('reads a non-contiguous ndarray view correctly', () => {
    const base = record(['a', 'b'], 4, 0.25, (p, i) => 10 * p + i);
    const transposedTwice: ProbeRecord = { ...base, values: base.values.transpose(1, 0).transpose(1, 0) };
    const swapped = ndarray(new Float64Array([0, 10, 1, 11, 2, 12, 3, 13]), [2, 4], [1, 2]);
    const a = probeRecordToCsv(transposedTwice);
    const b = probeRecordToCsv({ ...base, values: swapped });
    expect(a).toBe('time_s,a,b\n0,0,10\n0.25,1,11\n0.5,2,12\n0.75,3,13\n');
    expect(b).toBe(a);
  });

  it('quotes probe names that need it', () => {
    expect(csvField('plain')).toBe('plain');
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvHeader(['x', 'y,z'])).toBe('time_s,x,"y,z"\n');
  });
});
