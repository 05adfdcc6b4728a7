import { describe, expect, it } from 'vitest';
import { analyzeCoupledStripline, modulusForRatio, synthCoupledStripline } from '../../../sim/lines/coupled-stripline.js';
import { ellipticKRatio } from '../../../sim/lines/elliptic.js';
import { striplineZ0Cohn } from '../../../sim/lines/stripline.js';
import { pairFromModes } from '../../../sim/coupled/line.js';
import { modalAnalysis, pairMetrics } from '../../../sim/coupled/modes.js';

describe('edge-coupled stripline (Cohn 1955)', () => {
  // S. B. Cohn, "Shielded coupled-strip transmission line", IRE Trans. MTT-3, 1955:
  // k_e = tanh(πW/2b)·tanh(π(W+S)/2b), k_o = tanh(πW/2b)·coth(π(W+S)/2b), Z0e,o = (30π/√εr)·K(k′)/K(k).
  // εr = 1, W/b = S/b = 0.5: k_e = tanh(π/4)·tanh(π/2) = 0.601463, k_o = tanh(π/4)/tanh(π/2) = 0.715033,
  // Z0e = 107.15 Ω and Z0o = 93.22 Ω with η0/4 for "30π" (issue 12's values; with 30π exactly they would be 0.07 % higher).
  it('εr = 1, W/b = S/b = 0.5: Z0e = 107.15 Ω, Z0o = 93.22 Ω', () => {
    const a = analyzeCoupledStripline({ width: 0.5e-3, spacing: 0.5e-3, planeSpacing: 1e-3, er: 1 });
    expect(a.zEven).toBeCloseTo(107.15, 2);
    expect(a.zOdd).toBeCloseTo(93.22, 2);
    expect(a.validity.inside).toBe(true);
  });

  // As S → ∞ both moduli tend to tanh(πW/2b) and each strip is a single stripline: Cohn 1954's
  // Z0 = (η0/4√εr)·K(sech)/K(tanh), the same expression.
  it('far apart, both modes become the single stripline of Cohn 1954', () => {
    const g = { width: 0.4e-3, spacing: 12e-3, planeSpacing: 1e-3, er: 3.5 };
    const single = striplineZ0Cohn(g.width, g.planeSpacing, g.er);
    const a = analyzeCoupledStripline(g);
    expect(a.zEven / single).toBeCloseTo(1, 9);
    expect(a.zOdd / single).toBeCloseTo(1, 9);
  });

  // Pozar, Microwave Engineering, coupled-line coupler: a 20 dB coupler on 50 Ω needs
  // Z0e = Z0·√((1 + C)/(1 − C)) = 55.28 Ω and Z0o = Z0·√((1 − C)/(1 + C)) = 45.23 Ω (C = 0.1); in
  // stripline with b = 0.158 cm and εr = 2.56 the book reads W/b ≈ 0.72 and S/b ≈ 0.34 off its design
  // chart (W = 0.114 cm, S = 0.054 cm; chart readings, from memory).
  it("Pozar's 20 dB coupler: the inverted geometry gives back 55.28 Ω and 45.23 Ω", () => {
    const c = 0.1;
    expect(50 * Math.sqrt((1 + c) / (1 - c))).toBeCloseTo(55.28, 2);
    expect(50 * Math.sqrt((1 - c) / (1 + c))).toBeCloseTo(45.23, 2);
    const b = 0.158e-2;
    const s = synthCoupledStripline(55.28, 45.23, b, 2.56);
    expect(s.analysis.zEven).toBeCloseTo(55.28, 9);
    expect(s.analysis.zOdd).toBeCloseTo(45.23, 9);
    const again = analyzeCoupledStripline({ width: s.width, spacing: s.spacing, planeSpacing: b, er: 2.56 });
    expect(again.zEven).toBeCloseTo(55.28, 9);
    expect(again.zOdd).toBeCloseTo(45.23, 9);
    expect(s.width / b).toBeCloseTo(0.72, 1); // chart reading 0.72
    expect(Math.abs(s.spacing / b - 0.34)).toBeLessThan(0.03); // chart reading 0.34
    expect(s.width * 100).toBeCloseTo(0.114, 3);
  });

  // Inverting K(k′)/K(k) through the nome (Abramowitz & Stegun 16.38, 17.3.17): k and k′ come back.
  it('modulus from K(k′)/K(k) round-trips', () => {
    for (const k of [1e-6, 0.01, 0.3, 0.6014631846616133, 0.9, 0.999, 1 - 1e-9]) {
      const kp = Math.sqrt((1 - k) * (1 + k));
      const rho = 1 / ellipticKRatio(k, kp);
      const back = modulusForRatio(rho);
      expect(back.k / k).toBeCloseTo(1, 9);
      expect(back.kp / kp).toBeCloseTo(1, 9);
    }
  });

  // A homogeneous dielectric: both modes travel at c0/√εr, so the pair's K_f is 0 (Paul; no far-end crosstalk in a homogeneous medium).
  it('the pair it describes is homogeneous: equal mode velocities, K_f = 0', () => {
    const a = analyzeCoupledStripline({ width: 0.2e-3, spacing: 0.2e-3, planeSpacing: 0.5e-3, er: 4 });
    const line = pairFromModes({ zOdd: a.zOdd, zEven: a.zEven, delayOdd: a.delayPerMeter, delayEven: a.delayPerMeter });
    const modal = modalAnalysis(line);
    expect(modal.modes[0].velocity / (299_792_458 / 2)).toBeCloseTo(1, 12);
    expect(modal.modes[1].velocity / (299_792_458 / 2)).toBeCloseTo(1, 12);
    expect(pairMetrics(line, modal).kf).toBeCloseTo(0, 12);
  });

  it('refuses impossible inputs', () => {
    expect(() => analyzeCoupledStripline({ width: 0, spacing: 1, planeSpacing: 1, er: 1 })).toThrow(RangeError);
    expect(() => synthCoupledStripline(40, 50, 1e-3, 1)).toThrow(/Z_even > Z_odd/);
  });
});
