import { describe, expect, it } from 'vitest';
import { sampleLog as sampleLogSeeded } from '../../support/sample-log.js';
import {
  debyeEpsilon,
  debyeFit,
  debyeFitAuto,
  djordjevicSarkar,
  dsEpsilon,
  dsLossTangent,
  type DSModel,
} from '../../../sim/lines/dielectric.js';

const FR4 = djordjevicSarkar(4.3, 0.02, 1e9); // corners 1 kHz and 1 THz

const sampleLog = (a: number, b: number, n: number) => sampleLogSeeded(a, b, n, 12345);

describe('Djordjevic–Sarkar wideband Debye model (IEEE T-EMC 43(4), 2001)', () => {
  it('matches εr and tanδ exactly at the fit frequency', () => {
    const e = dsEpsilon(FR4, 2 * Math.PI * 1e9);
    expect(e.re).toBeCloseTo(4.3, 12);
    expect(dsLossTangent(FR4, 1e9)).toBeCloseTo(0.02, 14);
  });

  it('has the closed form ε∞ + Δε/(m2 − m1)·log10((ω2 + jω)/(ω1 + jω)), ε(0) = ε∞ + Δε, ε(∞) = ε∞', () => {
    const w = 2 * Math.PI * 3e8;
    const w1 = 2 * Math.PI * FR4.f1;
    const w2 = 2 * Math.PI * FR4.f2;
    // log10 of the complex ratio, computed independently through the polar form.
    const numMag = Math.hypot(w2, w);
    const denMag = Math.hypot(w1, w);
    const arg = Math.atan2(w, w2) - Math.atan2(w, w1);
    const slope = FR4.deltaEps / Math.log10(FR4.f2 / FR4.f1);
    const e = dsEpsilon(FR4, w);
    expect(e.re).toBeCloseTo(FR4.epsInf + slope * Math.log10(numMag / denMag), 12);
    expect(e.im).toBeCloseTo((slope * arg) / Math.LN10, 12);
    expect(dsEpsilon(FR4, 0).re).toBeCloseTo(FR4.epsInf + FR4.deltaEps, 12);
    expect(dsEpsilon(FR4, 1e20).re).toBeCloseTo(FR4.epsInf, 6);
  });

  it('keeps ε″ flat (within 1 % from 1 MHz to 10 GHz) and ε′ falling slowly between the corners, as measured on FR-4', () => {
    const im = [1e6, 1e7, 1e8, 1e9, 1e10].map((f) => -dsEpsilon(FR4, 2 * Math.PI * f).im);
    for (const v of im) expect(Math.abs(v / im[3] - 1)).toBeLessThan(0.01);
    const re = [1e6, 1e8, 1e10].map((f) => dsEpsilon(FR4, 2 * Math.PI * f).re);
    expect(re[0]).toBeGreaterThan(re[1]);
    expect(re[1]).toBeGreaterThan(re[2]);
    // Between the corners ε′ falls by Δε/(m2 − m1) per decade: ≈ 0.126 for tanδ = 0.02, εr = 4.3.
    expect(Math.abs((re[0] - re[2]) / 4 / (FR4.deltaEps / 9) - 1)).toBeLessThan(0.02);
  });

  // Kramers–Kronig: ε′(ω) − ε∞ = (2/π)·∫₀^∞ [ω′ε″(ω′) − ωε″(ω)] / (ω′² − ω²) dω′ (the subtracted,
  // singularity-free form; ε″ = −Im ε). We integrate the imaginary part numerically (Simpson on
  // ln ω′ over 24 decades, 2000 points per decade) and recover the real part within 1e-5·(ε′ − ε∞).
  it('is causal: the real part is recovered from the imaginary part by a numerical Kramers–Kronig integral', () => {
    const eps2 = (w: number) => -dsEpsilon(FR4, w).im;
    const kk = (w: number) => {
      const lo = Math.log(2 * Math.PI * FR4.f1 * 1e-6);
      const hi = Math.log(2 * Math.PI * FR4.f2 * 1e6);
      const n = 2 * Math.ceil(((hi - lo) / Math.LN10) * 1000); // even
      const h = (hi - lo) / n;
      const e2w = eps2(w);
      let sum = 0;
      for (let i = 0; i <= n; i++) {
        // Shift the grid by a quarter step so that no node lands exactly on ω′ = ω.
        const x = lo + (i + 0.25) * h;
        const wp = Math.exp(x);
        const g = ((wp * eps2(wp) - w * e2w) / (wp * wp - w * w)) * wp; // dω′ = ω′ dx
        sum += (i === 0 || i === n ? 1 : i % 2 ? 4 : 2) * g;
      }
      return (2 / Math.PI) * (sum * h) / 3;
    };
    for (const f of [1e5, 1e7, 1e9, 1e11]) {
      const w = 2 * Math.PI * f;
      const expected = dsEpsilon(FR4, w).re - FR4.epsInf;
      expect(Math.abs(kk(w) - expected)).toBeLessThan(1e-5 * expected);
    }
  });

  it('rejects a loss too large for the given permittivity and a lossless input gives a constant', () => {
    expect(() => djordjevicSarkar(1.1, 0.5, 1e9)).toThrow(RangeError);
    const m = djordjevicSarkar(3, 0, 1e9);
    expect(m.deltaEps).toBe(0);
    expect(dsEpsilon(m, 1e10).re).toBe(3);
  });
});

describe('debyeFit: a few Debye terms realising the DS model over a band', () => {
  const cases: [DSModel, number, number, number][] = [
    [FR4, 1e7, 2e10, 4],
    [FR4, 1e8, 1e10, 4],
    [FR4, 1e6, 1e11, 8],
    [djordjevicSarkar(3.5, 0.004, 1e10), 1e8, 5e10, 3],
  ];
  for (const [m, lo, hi, n] of cases) {
    it(`stays within its reported error bound across [${lo}, ${hi}] Hz with ${n} terms`, () => {
      const fit = debyeFit(m, lo, hi, n);
      expect(fit.terms.length).toBeGreaterThan(0);
      expect(fit.terms.length).toBeLessThanOrEqual(n);
      // Passive (Δε_k ≥ 0, τ_k > 0) and physically ordered (ε∞' ≥ 1).
      for (const t of fit.terms) {
        expect(t.deltaEps).toBeGreaterThan(0);
        expect(t.tau).toBeGreaterThan(0);
      }
      expect(fit.epsInf).toBeGreaterThanOrEqual(1);
      // Check on 2000 other frequencies in the band (the bound was computed on a 200-per-decade grid).
      for (const f of sampleLog(lo, hi, 2000)) {
        const w = 2 * Math.PI * f;
        const e = dsEpsilon(m, w);
        const g = debyeEpsilon(fit, w);
        const rel = Math.hypot(g.re - e.re, g.im - e.im) / Math.hypot(e.re, e.im);
        const loss = Math.abs(g.im - e.im) / Math.abs(e.im);
        expect(rel).toBeLessThanOrEqual(fit.maxRelError * 1.001 + 1e-12);
        expect(loss).toBeLessThanOrEqual(fit.maxLossRelError * 1.001 + 1e-12);
      }
    });
  }

  it('four terms over 2 decades fit the loss within 3.5 %, and more terms fit better', () => {
    expect(debyeFit(FR4, 1e8, 1e10, 4).maxLossRelError).toBeLessThan(0.035);
    const e4 = debyeFit(FR4, 1e7, 2e10, 4).maxLossRelError;
    const e8 = debyeFit(FR4, 1e7, 2e10, 8).maxLossRelError;
    expect(e8).toBeLessThan(e4 / 3);
  });

  it('debyeFitAuto picks the fewest terms that meet the tolerance', () => {
    const fit = debyeFitAuto(FR4, 1e7, 2e10, 0.02);
    expect(fit.maxLossRelError).toBeLessThanOrEqual(0.02);
    expect(debyeFit(FR4, 1e7, 2e10, fit.terms.length - 1).maxLossRelError).toBeGreaterThan(0.02);
  });
});
