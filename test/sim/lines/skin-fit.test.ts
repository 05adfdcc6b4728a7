import { describe, expect, it } from 'vitest';
import { sampleLog as sampleLogSeeded } from '../../support/sample-log.js';
import { COPPER_CONDUCTIVITY, MU0 } from '../../../sim/lines/constants.js';
import { skinCoefficient } from '../../../sim/lines/conductor.js';
import { internalImpedance, skinFit, skinFitAuto, skinFitImpedance, type ConductorImpedance } from '../../../sim/lines/skin-fit.js';

const sampleLog = (a: number, b: number, n: number) => sampleLogSeeded(a, b, n, 777);

// A 1 oz, 0.36 mm FR-4 microstrip: R_dc ≈ 2.7 Ω/m, K ≈ 3.8e-4 Ω/(m·√(rad/s)).
const TRACE: ConductorImpedance = { rdc: 2.74, skinK: 3.85e-4 };

describe('conductor internal impedance √(R_dc² + K²·jω)', () => {
  it('is R_dc at DC and K√(jω) (R = ωL_int = K√(ω/2)) far above the crossover', () => {
    expect(internalImpedance(TRACE, 0).re).toBeCloseTo(TRACE.rdc, 12);
    const w = 2 * Math.PI * 1e11;
    const z = internalImpedance(TRACE, w);
    const r = TRACE.skinK * Math.sqrt(w / 2);
    expect(Math.abs(z.re / r - 1)).toBeLessThan(1e-3);
    expect(Math.abs(z.im / r - 1)).toBeLessThan(1e-3);
  });

  // Textbook result (e.g. Ramo, Whinnery & Van Duzer): the DC internal inductance of a round wire
  // is µ/(8π). The blend gives K²/(2R_dc), which for a round wire (g = 1/(πd)) is exactly that.
  it('has the round-wire DC internal inductance µ0/8π', () => {
    const d = 1e-3;
    const c = { rdc: 4 / (COPPER_CONDUCTIVITY * Math.PI * d * d), skinK: skinCoefficient(1 / (Math.PI * d), COPPER_CONDUCTIVITY) };
    const w = 1; // rad/s, deep in the DC regime
    const lInt = internalImpedance(c, w).im / w;
    expect(lInt / (MU0 / (8 * Math.PI))).toBeCloseTo(1, 6);
  });
});

describe('skinFit: R_dc + Σ R‖L sections', () => {
  const cases: [ConductorImpedance, number, number, number][] = [
    [TRACE, 1e7, 2e10, 4],
    [TRACE, 1e6, 1e10, 6],
    [{ rdc: 0.036, skinK: 6.8e-5 }, 1e5, 1e10, 6], // a coax
    [{ rdc: 2.74, skinK: 3.85e-4, roughness: { rms: 0.5e-6, conductivity: COPPER_CONDUCTIVITY } }, 1e7, 2e10, 6],
  ];
  for (const [c, lo, hi, n] of cases) {
    it(`stays within its reported error bound over [${lo}, ${hi}] Hz with ${n} sections${c.roughness ? ', with roughness' : ''}`, () => {
      const fit = skinFit(c, lo, hi, n);
      expect(fit.r0).toBe(c.rdc);
      expect(fit.lExtra).toBeGreaterThanOrEqual(0);
      for (const s of fit.sections) {
        expect(s.r).toBeGreaterThan(0);
        expect(s.l).toBeCloseTo(s.r * s.tau, 20);
      }
      for (const f of sampleLog(lo, hi, 2000)) {
        const w = 2 * Math.PI * f;
        const z = internalImpedance(c, w);
        const g = skinFitImpedance(fit, w);
        const rel = Math.hypot(g.re - z.re, g.im - z.im) / Math.hypot(z.re, z.im);
        expect(rel).toBeLessThanOrEqual(fit.maxRelError * 1.001 + 1e-12);
        expect(Math.abs(g.re - z.re) / z.re).toBeLessThanOrEqual(fit.maxResistanceRelError * 1.001 + 1e-12);
      }
      // Exact at DC.
      expect(skinFitImpedance(fit, 0).re).toBe(c.rdc);
    });
  }

  it('four sections over 3.3 decades are within 6 %; six within 1 %', () => {
    expect(skinFit(TRACE, 1e7, 2e10, 4).maxRelError).toBeLessThan(0.06);
    expect(skinFit(TRACE, 1e7, 2e10, 6).maxRelError).toBeLessThan(0.01);
  });

  it('skinFitAuto meets the tolerance with the fewest sections; no skin term means no sections', () => {
    const fit = skinFitAuto(TRACE, 1e7, 2e10, 0.02);
    expect(fit.maxRelError).toBeLessThanOrEqual(0.02);
    expect(skinFit(TRACE, 1e7, 2e10, fit.sections.length - 1).maxRelError).toBeGreaterThan(0.02);
    expect(skinFit({ rdc: 1, skinK: 0 }, 1e6, 1e9, 4).sections).toHaveLength(0);
  });
});
