// Golden comparison: the tolerance band and the time shift, against closed forms.
import { describe, expect, it } from 'vitest';
import { compareWaveform, compareWithGolden, parseGoldenCsv, shiftGrid } from '../../../src/checks/golden.js';
import { drawGoldenOverlay, goldenDifference } from '../../../src/checks/golden-plot.js';
import { Surface } from '../../../src/render/surface.js';

const dt = 1e-11; // 10 ps
const n = 1001; // 0 … 10 ns
/** A 0 → 1 V linear ramp from t0 lasting T. */
function ramp(t0: number, T: number, count = n, step = dt): Float64Array {
  const v = new Float64Array(count);
  for (let i = 0; i < count; i++) v[i] = Math.min(1, Math.max(0, (i * step - t0) / T));
  return v;
}
const times = (count = n, step = dt) => Float64Array.from({ length: count }, (_, i) => i * step);

describe('compareWaveform', () => {
  it('without a shift, a ramp delayed by τ differs by slope·τ (closed form)', () => {
    const tau = 50e-12;
    const d = compareWaveform(ramp(2e-9 + tau, 1e-9), dt, { times: times(), values: ramp(2e-9, 1e-9) }, { tolerance: 0.01, shift: 0 });
    expect(d.maxDiff).toBeCloseTo(tau / 1e-9, 12); // 1 V/ns × 50 ps = 50 mV
    expect(d.shift).toBe(0);
  });

  it('with shifts up to S ≥ τ allowed, the same ramp matches (E = 0 at s = τ)', () => {
    const tau = 50e-12;
    const d = compareWaveform(ramp(2e-9 + tau, 1e-9), dt, { times: times(), values: ramp(2e-9, 1e-9) }, { tolerance: 0.01, shift: 100e-12 });
    expect(d.maxDiff).toBeLessThan(1e-12);
    expect(d.shift).toBeCloseTo(tau, 20);
  });

  it('with S < τ, E is slope·(τ − S): the band is reached by the largest allowed shift', () => {
    const tau = 80e-12;
    const d = compareWaveform(ramp(2e-9 + tau, 1e-9), dt, { times: times(), values: ramp(2e-9, 1e-9) }, { tolerance: 0.01, shift: 30e-12 });
    expect(d.maxDiff).toBeCloseTo((tau - 30e-12) / 1e-9, 12);
    expect(d.shift).toBeCloseTo(30e-12, 20);
  });

  it('interpolates a golden record on another time grid linearly (exact on a ramp)', () => {
    const g = ramp(2e-9, 1e-9, 401, 25e-12);
    const d = compareWaveform(ramp(2e-9, 1e-9), dt, { times: times(401, 25e-12), values: g }, { tolerance: 1e-3, shift: 0 });
    expect(d.maxDiff).toBeLessThan(1e-12);
  });

  it('shift grid: multiples of the finer sample interval, ±S included, at most 401 shifts', () => {
    expect(shiftGrid(0, dt, dt)).toEqual([0]);
    const g = shiftGrid(25e-12, 1e-11, 2e-11);
    expect(g[0]).toBe(-25e-12);
    expect(g[g.length - 1]).toBe(25e-12);
    expect(g).toContain(0);
    expect(shiftGrid(1e-6, 1e-12, 1e-12).length).toBeLessThanOrEqual(403);
  });
});

describe('compareWithGolden', () => {
  const golden = { names: ['tx', 'rx'], times: times(), columns: [ramp(1e-9, 1e-9), ramp(2e-9, 1e-9)] };
  it('passes within the band, fails outside it with the largest difference and where', () => {
    const run = { names: ['tx', 'rx'], dt, rows: [ramp(1e-9, 1e-9), ramp(2.03e-9, 1e-9)] };
    const [tx, rx] = compareWithGolden(run, golden, { tolerance: 0.01, shift: 0 }, 'HINT');
    expect(tx!.pass).toBe(true);
    expect(rx!.pass).toBe(false);
    expect(rx!.measured).toBeCloseTo(0.03, 12);
    expect(rx!.message).toMatch(/outside ±10 mV: largest difference 30 mV at .* ns .*HINT/);
    expect(compareWithGolden(run, golden, { tolerance: 0.01, shift: 40e-12 }, 'HINT')[1]!.pass).toBe(true);
  });
  it('a probe missing from the golden file, or another time span, fails with the hint', () => {
    const r1 = compareWithGolden({ names: ['tx', 'new'], dt, rows: golden.columns }, golden, { tolerance: 0.01, shift: 0 }, 'HINT');
    expect(r1[1]!.pass).toBe(false);
    expect(r1[1]!.message).toMatch(/probe "new" is not in the golden file \(it has tx, rx\); HINT/);
    const short = { names: ['tx'], dt, rows: [ramp(1e-9, 1e-9, 500)] };
    expect(compareWithGolden(short, golden, { tolerance: 0.01, shift: 0 }, 'HINT')[0]!.message).toMatch(/spans .* this run .*HINT/);
  });
});

describe('parseGoldenCsv', () => {
  it('reads the probes.csv format', () => {
    const g = parseGoldenCsv('time_s,tx,rx\n0,0,0\n1e-11,0.5,0.25\n');
    expect(g.names).toEqual(['tx', 'rx']);
    expect(Array.from(g.columns[1]!)).toEqual([0, 0.25]);
  });
  it.each([
    ['t,tx\n0,0\n1,1\n', /:1: expected a header "time_s/],
    ['time_s,tx\n0,0\n1\n', /:3: 1 values, the header has 2/],
    ['time_s,tx\n0,0\n0,x\n', /:3: "x" is not a number/],
    ['time_s,tx\n1,0\n0,0\n', /:3: times must increase/],
  ])('refuses %j', (text, msg) => {
    expect(() => parseGoldenCsv(text, 'g.csv')).toThrow(msg);
  });
});

describe('the picture of a failed comparison', () => {
  it('marks the largest difference where it happened, with the tolerance band, both panels on one time axis', () => {
    // golden: a ramp; this run: the same ramp with a 30 mV bump at 6 ns (no shift helps): E = 30 mV at 6 ns
    const golden = ramp(2e-9, 1e-9);
    const run = Float64Array.from(golden, (v, i) => v + (Math.abs(i * dt - 6e-9) < 1e-12 ? 0.03 : 0));
    const d = compareWaveform(run, dt, { times: times(), values: golden }, { tolerance: 0.01, shift: 0 });
    expect(d.maxDiff).toBeCloseTo(0.03, 12);
    expect(d.time).toBeCloseTo(6e-9, 15);
    const s = new Surface(1200, 800);
    const drawn = drawGoldenOverlay(s, {
      title: 't',
      dt,
      goldenTimes: times(),
      failures: [{ probe: 'rx', values: run, golden, shift: d.shift, maxDiff: d.maxDiff, time: d.time }],
      tolerance: 0.01,
    });
    expect(drawn.markers).toEqual([expect.objectContaining({ axis: 'x', at: 6e-9, label: 'largest: 30 mV at 6 ns (rx)' })]);
    for (const t of [0, 3e-9, 6e-9, 10e-9]) expect(drawn.lower.x.map(t)).toBe(drawn.upper.x.map(t));
    // the difference v(t) − g(t − s) is the bump alone
    const diff = goldenDifference(run, dt, times(), golden, 0);
    expect(diff[600]).toBeCloseTo(0.03, 12);
    expect(diff[300]).toBe(0);
  });
});
