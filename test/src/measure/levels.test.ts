// State levels by the histogram-mode method of IEEE Std 181-2011.
import { describe, expect, it } from 'vitest';
import { histogramLevels, stateLevels } from '../../../src/measure/levels.js';
import { measureProbe } from '../../../src/measure/summary.js';
import { rng, sample, secondOrderStep } from './waveforms.js';

const ns = 1e-9;

/** Random bit stream with linear edges between low and high, plus Gaussian noise of σ volts. */
function noisyBits(seed: number, bits: number, low: number, high: number, sigma: number, dt: number) {
  const r = rng(seed);
  const bitTime = 2 * ns;
  const edge = 0.25 * ns;
  const pattern = Array.from({ length: bits }, () => (r.uniform() < 0.5 ? 0 : 1));
  const n = Math.round((bits * bitTime) / dt);
  const v = new Float64Array(n);
  let transitions = 0;
  for (let b = 1; b < bits; b++) if (pattern[b] !== pattern[b - 1]) transitions++;
  for (let i = 0; i < n; i++) {
    const t = i * dt;
    const b = Math.floor(t / bitTime);
    const x = t - b * bitTime;
    const cur = pattern[b]!;
    const prev = b > 0 ? pattern[b - 1]! : cur;
    const frac = x < edge ? prev + (cur - prev) * (x / edge) : cur;
    v[i] = low + (high - low) * frac + sigma * r.gauss();
  }
  return { v, transitions };
}

describe('histogram-mode state levels (IEEE 181-2011)', () => {
  it('a noisy two-level signal: levels within half a histogram bin of the true ones', () => {
    const dt = 10e-12;
    const { v, transitions } = noisyBits(1, 200, 0.2, 3.1, 0.02, dt);
    const l = stateLevels(v);
    const binWidth = (Math.max(...v) - Math.min(...v)) / 100;
    expect(Math.abs(l.low - 0.2)).toBeLessThan(binWidth / 2);
    expect(Math.abs(l.high - 3.1)).toBeLessThan(binWidth / 2);
    expect(l.lowSource).toBe('histogram');
    expect(l.flat).toBe(false);
    // and every bit transition is found as exactly one edge
    const m = measureProbe(v, dt);
    expect(m.edges.length).toBe(transitions);
    expect(m.edges.every((e) => e.crossings === 1)).toBe(true);
  });

  it('the state levels of a flat-topped signal are exact (median of the modal bin)', () => {
    const v = Float64Array.from([0.3, 0.3, 0.3, 0.31, 1.0, 2.4, 2.5, 2.5, 2.5, 2.5]);
    expect(histogramLevels(v)).toEqual({ low: 0.3, high: 2.5 });
  });

  it('ringing does not move the levels off the settled values', () => {
    const dt = 2e-12;
    const v = sample(secondOrderStep(1 * ns, 0.3, 2 * Math.PI * 1e9), dt, 20000);
    const l = stateLevels(v);
    expect(l.low).toBe(0);
    expect(Math.abs(l.high - 1)).toBeLessThan(1e-3);
  });

  it('nominal levels override the histogram, one or both', () => {
    const v = Float64Array.from([0, 0, 0, 1, 1, 1]);
    const a = stateLevels(v, { high: 3.3 });
    expect(a).toMatchObject({ low: 0, high: 3.3, amplitude: 3.3, lowSource: 'histogram', highSource: 'nominal' });
    const b = stateLevels(v, { low: -1, high: 2 });
    expect(b).toMatchObject({ low: -1, high: 2, lowSource: 'nominal', highSource: 'nominal', bins: 0 });
    expect(b.reference.p50).toBe(0.5);
    expect(b.reference.p10).toBeCloseTo(-0.7, 15);
  });

  it('a flat waveform is flagged flat; bad input throws', () => {
    expect(stateLevels(new Float64Array(10).fill(2)).flat).toBe(true);
    expect(() => stateLevels(new Float64Array(0))).toThrow(/empty/);
    expect(() => stateLevels(Float64Array.from([0, NaN]))).toThrow(/finite/);
  });
});
