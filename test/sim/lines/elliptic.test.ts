import { describe, expect, it } from 'vitest';
import { agm, ellipticK, ellipticKFromComplement, ellipticKRatio } from '../../../sim/lines/elliptic.js';

// Known values of the complete elliptic integral of the first kind (modulus k), Abramowitz & Stegun,
// *Handbook of Mathematical Functions*, ch. 17 (17.3.11, 17.3.26 and table 17.1).
describe('complete elliptic integral K by the AGM', () => {
  it('K(0) = π/2 (A&S 17.3.11)', () => {
    expect(ellipticK(0)).toBeCloseTo(Math.PI / 2, 15);
  });

  it('K(1/√2) = Γ(1/4)² / (4√π) ≈ 1.854 074 677 (A&S 17.3.26, the lemniscatic case)', () => {
    const gammaQuarter = 3.625609908221908; // Γ(1/4), A&S table 6.1
    const exact = (gammaQuarter * gammaQuarter) / (4 * Math.sqrt(Math.PI));
    expect(exact).toBeCloseTo(1.854074677301372, 12);
    expect(ellipticK(Math.SQRT1_2)).toBeCloseTo(exact, 13);
  });

  it('K at sin α = 0.5 (α = 30°) is 1.685 750 354 8 (A&S table 17.1)', () => {
    expect(ellipticK(0.5)).toBeCloseTo(1.6857503548, 9);
  });

  it('diverges logarithmically as k → 1: K ≈ ln(4/k′) (A&S 17.3.26)', () => {
    const kp = 1e-8;
    expect(ellipticKFromComplement(kp)).toBeCloseTo(Math.log(4 / kp), 6);
    expect(ellipticK(1)).toBe(Infinity);
  });

  it('the ratio form agrees with the two integrals and AGM(1, x) is symmetric', () => {
    const k = 0.3;
    const kp = Math.sqrt(1 - k * k);
    expect(ellipticKRatio(k, kp)).toBeCloseTo(ellipticK(k) / ellipticK(kp), 13);
    expect(agm(1, 0.2)).toBeCloseTo(agm(0.2, 1), 15);
  });
});
