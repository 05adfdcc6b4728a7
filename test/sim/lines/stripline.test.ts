import { describe, expect, it } from 'vitest';
import { C0, INCH } from '../../../sim/lines/constants.js';
import {
  analyzeStripline,
  striplineZ0Cohn,
  striplineZ0Wheeler,
  synthStriplineWidth,
} from '../../../sim/lines/stripline.js';

describe('symmetric stripline', () => {
  // Cohn's K(k)/K(k') form is exact for t = 0; Wheeler (1978) states about 0.5 % for his closed
  // form up to W'/(b − t) = 10.
  it("Cohn's exact form and Wheeler's closed form agree within 0.5 % for 0.01 ≤ W/b ≤ 10 (Cohn 1954; Wheeler 1978)", () => {
    let worst = 0;
    for (let x = Math.log(0.01); x <= Math.log(10); x += 0.02) {
      const wb = Math.exp(x);
      const c = striplineZ0Cohn(wb, 1, 2.2);
      const w = striplineZ0Wheeler(wb, 1, 0, 2.2);
      worst = Math.max(worst, Math.abs(w / c - 1));
    }
    expect(worst).toBeLessThan(0.005);
  });

  // Pozar, *Microwave Engineering*, stripline design example: b = 0.32 cm, εr = 2.20, 50 Ω → W = 0.266 cm.
  // Pozar's synthesis formula is a curve fit to the exact solution good to about 1 %.
  it('reproduces the Pozar stripline example W ≈ 0.266 cm within 1 % (Pozar, Microwave Engineering)', () => {
    const { width, analysis } = synthStriplineWidth(50, { planeSpacing: 0.32e-2, er: 2.2 });
    expect(Math.abs(width / 0.266e-2 - 1)).toBeLessThan(0.01);
    expect(analysis.z0).toBeCloseTo(50, 8);
  });

  it('at t = 0 the result is exactly Cohn; thickness lowers Z0 following Wheeler', () => {
    const g = { width: 0.5e-3, planeSpacing: 1e-3, er: 4.3 };
    const a0 = analyzeStripline({ ...g, thickness: 0 });
    expect(a0.z0).toBeCloseTo(a0.z0Cohn, 12);
    const a1 = analyzeStripline({ ...g, thickness: 35e-6 });
    expect(a1.z0).toBeLessThan(a0.z0);
    // Our value (Cohn × Wheeler's thickness ratio) and Wheeler's own thick-strip value agree to his 0.5 %.
    expect(Math.abs(a1.z0 / a1.z0Wheeler - 1)).toBeLessThan(0.005);
  });

  it('synthesis inverts analysis with thickness', () => {
    for (const z of [35, 50, 65, 90]) {
      const g = { planeSpacing: 0.4e-3, thickness: 17e-6, er: 4.3 };
      const { width } = synthStriplineWidth(z, g);
      expect(analyzeStripline({ ...g, width }).z0).toBeCloseTo(z, 8);
    }
  });

  it("flags a strip wider than Wheeler's W'/(b − t) ≤ 10", () => {
    const a = analyzeStripline({ width: 20e-3, planeSpacing: 1e-3, er: 4 });
    expect(a.validity.inside).toBe(false);
    expect(a.validity.warnings.join()).toMatch(/W'\/\(b − t\)/);
  });

  // Common practice (high-speed digital design handbooks): FR-4 stripline ≈ 170–180 ps/in.
  it('FR-4 stripline delay is 170–180 ps/in (common practice)', () => {
    const a = analyzeStripline({ width: 0.15e-3, planeSpacing: 0.4e-3, thickness: 17e-6, er: 4.3 });
    const psPerIn = (Math.sqrt(a.epsEff) / C0) * INCH * 1e12;
    expect(psPerIn).toBeGreaterThan(170);
    expect(psPerIn).toBeLessThan(180);
  });

  it('rejects a strip as thick as the plane spacing', () => {
    expect(() => analyzeStripline({ width: 1e-3, planeSpacing: 1e-3, thickness: 1e-3, er: 4 })).toThrow(RangeError);
  });
});
