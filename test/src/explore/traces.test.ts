// The waveforms as the page holds them. Up to the limit: every sample, bit for bit. Above it: the
// samples the PNG views' min/max reduction keeps, for every probe at once — checked against the brute-
// force column envelope (src/render/reduce.ts columnEnvelope), which must come out identical: every
// spike is still there, and every value held is a recorded sample.
import ndarray from 'ndarray';
import { describe, expect, it } from 'vitest';
import type { ProbeRecord } from '../../../sim/result.js';
import { packF32, packF64, unpack } from '../../../src/explore/pack.js';
import { keptIndices, traceSet } from '../../../src/explore/traces.js';
import { columnEnvelope } from '../../../src/render/reduce.js';

function record(n: number, probes: ((i: number) => number)[]): ProbeRecord {
  const data = new Float64Array(n * probes.length);
  probes.forEach((f, p) => {
    for (let i = 0; i < n; i++) data[p * n + i] = f(i);
  });
  return { names: probes.map((_, p) => `p${p}`), dtSample: 1e-12, values: ndarray(data, [probes.length, n]) };
}

/** A damped ring with one narrow spike (one sample) that a plain decimation would miss. */
const ring = (i: number) => Math.exp(-i / 3000) * Math.sin(i / 37) + (i === 12345 ? 5 : 0);
const step = (i: number) => (i < 7000 ? 0 : 1 - Math.exp(-(i - 7000) / 500));

describe('page traces', () => {
  it('packs doubles exactly and singles to float32', () => {
    const xs = [0, -0.1, 1 / 3, 1e-300, 123456.789];
    expect([...unpack(packF64(xs))]).toEqual(xs);
    expect([...unpack(packF32(xs))]).toEqual(xs.map(Math.fround));
  });

  it('holds every sample up to the limit', () => {
    const r = record(1000, [ring, step]);
    const t = traceSet(r, { fullLimit: 2000 });
    expect(t.form).toBe('full');
    expect([...unpack(t.values[1])]).toEqual(Array.from({ length: 1000 }, (_, i) => step(i)));
  });

  it('above the limit keeps, per column and probe, the same envelope as the full trace', () => {
    const n = 40_000, columns = 500;
    const r = record(n, [ring, step]);
    const t = traceSet(r, { fullLimit: 10_000, columns });
    expect(t.form).toBe('reduced');
    const idx = unpack(t.index!);
    expect(idx.length).toBeLessThanOrEqual(2 * 4 * (columns + 2));
    for (let k = 1; k < idx.length; k++) expect(idx[k]).toBeGreaterThan(idx[k - 1]);
    [ring, step].forEach((f, p) => {
      const kept = unpack(t.values[p]);
      idx.forEach((i, k) => expect(kept[k]).toBe(f(i))); // recorded samples, unchanged
      const full = columnEnvelope(Float64Array.from({ length: n }, (_, i) => f(i)), { x0: 0, dx: 1 }, [0, n - 1], columns);
      const part = columnEnvelope(kept, { xs: idx }, [0, n - 1], columns);
      expect([...part.min]).toEqual([...full.min]);
      expect([...part.max]).toEqual([...full.max]);
    });
    expect(Math.max(...unpack(t.values[0]))).toBe(ring(12345)); // the one-sample spike survives
  });

  it('keeps the first and last sample', () => {
    const idx = keptIndices([Float64Array.from({ length: 10_000 }, () => 1)], 10_000, 100);
    expect(idx[0]).toBe(0);
    expect(idx[idx.length - 1]).toBe(9999);
  });
});
