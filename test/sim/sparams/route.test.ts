// S-parameters of a route from the spectral solver, against closed-form two-ports.
import { describe, expect, it } from 'vitest';
import { cget, cset, czeros, type CMatrix } from '../../../sim/sparams/cmatrix.js';
import { abcdToS, cascade } from '../../../sim/sparams/convert.js';
import { entry, matrixAt, singularValueTrace } from '../../../sim/sparams/network.js';
import { groupDelay, magnitudeDb, quarterWavePoints, unwrappedPhase } from '../../../sim/sparams/measures.js';
import { routeSParameters } from '../../../sim/sparams/route.js';
import { defaultGrid, gridFrequencies, stretchDelay } from '../../../sim/sparams/grid.js';
import type { LineRLGC, RouteItem } from '../../../sim/model.js';
import { lineOf, net, part, stepSignal } from '../../support/nets.js';

const chainNet = (route: RouteItem[], rise = 100e-12) => net({ signal: stepSignal(1, rise), rs: 25, route, receiver: [part({ c: 3e-12 })] });

/** Exact chain matrix of a uniform line (Pozar, Microwave Engineering, 4th ed., Table 4.1, lossy form). */
function lineAbcd(line: LineRLGC, len: number, f: number): CMatrix {
  const w = 2 * Math.PI * f;
  const z = { re: line.r, im: w * line.l };
  const y = { re: line.g, im: w * line.c };
  const zy = { re: z.re * y.re - z.im * y.im, im: z.re * y.im + z.im * y.re };
  const mag = Math.hypot(zy.re, zy.im);
  // γ = √(ZY), principal root, computed without cancellation (ZY is near the negative real axis)
  const gi = Math.sqrt((mag - zy.re) / 2);
  const gr = gi > 0 ? zy.im / (2 * gi) : Math.sqrt(mag);
  const ar = gr * len;
  const ai = gi * len;
  const ch = { re: Math.cosh(ar) * Math.cos(ai), im: Math.sinh(ar) * Math.sin(ai) };
  const sh = { re: Math.sinh(ar) * Math.cos(ai), im: Math.cosh(ar) * Math.sin(ai) };
  // Zc = Z/γ, 1/Zc = Y/γ
  const div = (a: { re: number; im: number }, b: { re: number; im: number }) => {
    const d = b.re * b.re + b.im * b.im;
    return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
  };
  const mul = (a: { re: number; im: number }, b: { re: number; im: number }) => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
  const zc = div(z, { re: gr, im: gi });
  const yc = div(y, { re: gr, im: gi });
  const m = czeros(2);
  const b = mul(zc, sh);
  const c = mul(yc, sh);
  cset(m, 0, 0, ch.re, ch.im);
  cset(m, 0, 1, b.re, b.im);
  cset(m, 1, 0, c.re, c.im);
  cset(m, 1, 1, ch.re, ch.im);
  return m;
}

function shuntC(c: number, f: number): CMatrix {
  const m = czeros(2);
  cset(m, 0, 0, 1, 0);
  cset(m, 1, 0, 0, 2 * Math.PI * f * c);
  cset(m, 1, 1, 1, 0);
  return m;
}

function maxDiff(a: CMatrix, b: CMatrix): number {
  let d = 0;
  for (let k = 0; k < a.d.length; k++) d = Math.max(d, Math.abs(a.d[k] - b.d[k]));
  return d;
}

describe('routeSParameters', () => {
  it('gives S11 = 5/13 and S21 = −j·12/13 for a 75 Ω quarter-wave line in a 50 Ω system', () => {
    // Pozar, Microwave Engineering, 4th ed., Table 4.2; quarter wave at 1 GHz: TD = 250 ps
    const td = 250e-12;
    const n = chainNet([{ kind: 'line', name: 'qw', line: lineOf(75, td / 0.1), length: 0.1 }]);
    const s = matrixAt(routeSParameters(n, [1e9], 50), 0);
    expect(Math.abs(cget(s, 0, 0).re - 5 / 13)).toBeLessThan(1e-9);
    expect(Math.abs(cget(s, 0, 0).im)).toBeLessThan(1e-9);
    expect(Math.abs(cget(s, 1, 0).re)).toBeLessThan(1e-9);
    expect(Math.abs(cget(s, 1, 0).im + 12 / 13)).toBeLessThan(1e-9);
    expect(Math.abs(cget(s, 0, 1).im + 12 / 13)).toBeLessThan(1e-9);
    expect(Math.abs(cget(s, 1, 1).re - 5 / 13)).toBeLessThan(1e-9);
  });

  it('matches the closed-form lossy line and a via (line + shunt C + line) to 1e-12', () => {
    const trace: LineRLGC = { r: 8, l: 3.3e-7, g: 2e-4, c: 1.25e-10 };
    const route: RouteItem[] = [
      { kind: 'line', name: 'in', line: trace, length: 0.04 },
      { kind: 'shunt', name: 'via', parts: [part({ c: 0.6e-12 })] },
      { kind: 'line', name: 'out', line: lineOf(55, 6e-9), length: 0.03 },
    ];
    const freq = [1e6, 3e8, 2.2e9, 7.9e9];
    const got = routeSParameters(chainNet(route), freq, 50);
    freq.forEach((f, k) => {
      const want = abcdToS(cascade(lineAbcd(trace, 0.04, f), shuntC(0.6e-12, f), lineAbcd(lineOf(55, 6e-9), 0.03, f)), 50);
      expect(maxDiff(matrixAt(got, k), want)).toBeLessThan(1e-12);
    });
    // reciprocal (S12 = S21) and passive (lossy): Pozar §4.3; the nodal solve rounds to a few 1e-13
    for (let k = 0; k < freq.length; k++) {
      const m = matrixAt(got, k);
      expect(Math.abs(cget(m, 0, 1).re - cget(m, 1, 0).re) + Math.abs(cget(m, 0, 1).im - cget(m, 1, 0).im)).toBeLessThan(1e-12);
    }
    for (const sv of singularValueTrace(got)) expect(sv).toBeLessThan(1);
  });

  it('matches a 50 → 100 Ω quarter-wave transformer with references 50 and 100 Ω (Pozar §5.4): S11 = S22 = 0', () => {
    const td = 250e-12;
    const n = chainNet([{ kind: 'line', name: 'qw', line: lineOf(Math.sqrt(5000), td / 0.1), length: 0.1 }]);
    const s = matrixAt(routeSParameters(n, [1e9], 50, 100), 0);
    expect(Math.hypot(cget(s, 0, 0).re, cget(s, 0, 0).im)).toBeLessThan(1e-12);
    expect(Math.hypot(cget(s, 1, 1).re, cget(s, 1, 1).im)).toBeLessThan(1e-12);
    expect(Math.hypot(cget(s, 1, 0).re, cget(s, 1, 0).im)).toBeCloseTo(1, 12);
  });

  it('exports a stretch of the route by item names, and names the items when one is missing', () => {
    const a: RouteItem = { kind: 'line', name: 'a', line: lineOf(50, 6e-9), length: 0.02 };
    const rs: RouteItem = { kind: 'series', name: 'rs', part: part({ r: 22 }) };
    const b: RouteItem = { kind: 'line', name: 'b', line: lineOf(60, 6e-9), length: 0.05 };
    const whole = chainNet([a, rs, b]);
    const only = routeSParameters(whole, [1e9], 50, 50, { from: 'rs', to: 'rs' });
    // a series resistor R: S11 = R/(R + 2Z0), S21 = 2Z0/(R + 2Z0) (Pozar Table 4.2 with B = R)
    expect(only.data[0]).toBeCloseTo(22 / 122, 14);
    expect(only.data[4]).toBeCloseTo(100 / 122, 14);
    expect(() => routeSParameters(whole, [1e9], 50, 50, { from: 'c' })).toThrow(/no route item named 'c'; the route has 'a', 'rs', 'b'/);
    expect(stretchDelay(whole, { from: 'rs' })).toBeCloseTo(0.05 * 6e-9, 20);
  });
});

describe('frequency grids', () => {
  it('defaults to 3.5/t_r with 20 points per ripple period 1/(2·TD)', () => {
    const n = chainNet([{ kind: 'line', name: 'run', line: lineOf(50, 6e-9), length: 0.3 }], 700e-12); // TD = 1.8 ns
    const g = defaultGrid(n);
    expect(g.fmax).toBeCloseTo(3.5 / 700e-12, 0);
    expect(g.points).toBe(Math.ceil(5e9 * 2 * 1.8e-9 * 20) + 1);
    const f = gridFrequencies(g);
    expect(f[0]).toBeCloseTo(g.fmax / g.points, 3);
    expect(f[f.length - 1]).toBeCloseTo(g.fmax, 3);
    // a given top frequency brings its own points: 20 per ripple up to 20 GHz
    expect(defaultGrid(n, {}, 20e9).points).toBe(Math.ceil(20e9 * 2 * 1.8e-9 * 20) + 1);
  });

  it('spaces a log grid evenly in log f, ending exactly at fmax', () => {
    const f = gridFrequencies({ fmax: 1e10, fmin: 1e6, points: 5, spacing: 'log' });
    expect(Array.from(f).map((x) => Math.round(Math.log10(x) * 1e9) / 1e9)).toEqual([6, 7, 8, 9, 10]);
  });
});

describe('readings of S21', () => {
  it('gives a matched lossless line the group delay TD and phase −ωTD (Pozar ch. 2: V⁻ = 0, V⁺ e^{−jβz})', () => {
    const td = 1.3e-9;
    const n = chainNet([{ kind: 'line', name: 'm', line: lineOf(50, td / 0.2), length: 0.2 }]);
    const freq = gridFrequencies({ fmax: 4e9, points: 400, spacing: 'linear' });
    const s = routeSParameters(n, freq, 50);
    const s21 = entry(s, 1, 0);
    for (const v of groupDelay(freq, s21)) expect(Math.abs(v - td)).toBeLessThan(1e-15);
    const phi = unwrappedPhase(s21);
    freq.forEach((f, k) => expect(Math.abs(phi[k] + 2 * Math.PI * f * td)).toBeLessThan(1e-9));
    for (const db of magnitudeDb(s21)) expect(Math.abs(db)).toBeLessThan(1e-10); // |S21| = 1 to round-off
  });

  it('lists the odd quarter-wave frequencies (2k + 1)/(4·TD)', () => {
    const f = quarterWavePoints(250e-12, 6e9);
    expect(f).toHaveLength(3);
    [1e9, 3e9, 5e9].forEach((want, k) => expect(f[k]).toBeCloseTo(want, 3));
  });
});
