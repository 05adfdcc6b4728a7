import { describe, expect, it } from 'vitest';
import { C0, COPPER_CONDUCTIVITY, DB_PER_NEPER, INCH, MU0 } from '../../../sim/lines/constants.js';
import { coaxLossFactor, surfaceResistance } from '../../../sim/lines/conductor.js';
import {
  attenuationDbPerM,
  fromCoax,
  fromDatasheet,
  fromMicrostrip,
  fromStripline,
  fromTwoWire,
  highFrequencyLimit,
  phaseVelocity,
  rlgcAt,
  timeDomainRealisation,
  yPerLength,
  yPerLengthRealised,
  z0AndGamma,
  zPerLength,
  zPerLengthRealised,
} from '../../../sim/lines/freq-model.js';

describe('FreqLine from geometry', () => {
  it('a lossless line has L∞ = Z0/v, C∞ = 1/(Z0·v) and a real Z0 at every frequency', () => {
    const b = fromStripline({ width: 0.15e-3, planeSpacing: 0.4e-3, thickness: 17e-6, er: 4.3, conductivity: Infinity });
    const v = C0 / Math.sqrt(4.3);
    expect(b.line.lInf).toBeCloseTo(b.z0 / v, 18);
    expect(b.line.cInf).toBeCloseTo(1 / (b.z0 * v), 22);
    const p = z0AndGamma(b.line, 1e9);
    expect(p.z0.re).toBeCloseTo(b.z0, 9);
    expect(p.gamma.re).toBe(0);
    expect(phaseVelocity(b.line, 1e9)).toBeCloseTo(v, 3);
  });

  // Homogeneous line: α_d = π f √εr tanδ / c0 (Pozar); rule of thumb ≈ 2.3·f[GHz]·tanδ·√εr dB/in
  // (common practice; Bogatin, *Signal and Power Integrity — Simplified*).
  it('dielectric loss of a stripline is π f √εr tanδ / c0 and ≈ 2.3·f[GHz]·tanδ·√εr dB/in (Pozar; Bogatin)', () => {
    const er = 4.3;
    const tand = 0.02;
    const b = fromStripline({ width: 0.15e-3, planeSpacing: 0.4e-3, thickness: 17e-6, er, lossTangent: tand, at: 1e9, conductivity: Infinity });
    const f = 1e9;
    const exact = (Math.PI * f * Math.sqrt(er) * tand) / C0;
    expect(z0AndGamma(b.line, f).gamma.re / exact).toBeCloseTo(1, 3);
    const dbPerIn = attenuationDbPerM(b.line, f) * INCH;
    const rule = 2.3 * 1 * tand * Math.sqrt(er);
    expect(Math.abs(dbPerIn / rule - 1)).toBeLessThan(0.01); // the rule's 2.3 is 2.31 rounded
    // The DS model keeps tanδ nearly flat, so the loss grows about linearly with f.
    const ratio = attenuationDbPerM(b.line, 10e9) / attenuationDbPerM(b.line, 1e9);
    expect(ratio).toBeGreaterThan(9.5);
    expect(ratio).toBeLessThan(10.5);
  });

  // Pozar: α_d = k0·εr·(ε_eff − 1)·tanδ / (2√ε_eff·(εr − 1)) for a microstrip.
  it("microstrip dielectric loss follows Pozar's filling-factor formula (Pozar)", () => {
    const er = 4.3;
    const tand = 0.02;
    const b = fromMicrostrip({ width: 0.36e-3, height: 0.2e-3, thickness: 35e-6, er, lossTangent: tand, conductivity: Infinity });
    const f = 1e9;
    const ee = b.epsEff;
    const pozar = (((2 * Math.PI * f) / C0) * er * (ee - 1) * tand) / (2 * Math.sqrt(ee) * (er - 1));
    expect(z0AndGamma(b.line, f).gamma.re / pozar).toBeCloseTo(1, 3);
  });

  it("coax conductor loss at 1 GHz is Rs/(2π)(1/a + 1/b)/(2Z0) (Pozar)", () => {
    const b = fromCoax({ innerDiameter: 0.9e-3, shieldDiameter: 2.95e-3, er: 2.25 });
    const f = 1e9;
    const rPrime = surfaceResistance(f, COPPER_CONDUCTIVITY) * coaxLossFactor(0.9e-3, 2.95e-3);
    const alpha = z0AndGamma(b.line, f).gamma.re;
    expect(Math.abs(alpha / (rPrime / (2 * b.z0)) - 1)).toBeLessThan(0.01);
    expect(rlgcAt(b.line, f).r / rPrime).toBeCloseTo(1, 2);
  });

  it('R′, L′, G′, C′: DC limits, internal inductance of two round wires 2·µ0/8π, and the high-frequency limit', () => {
    const b = fromTwoWire({ diameter: 0.5e-3, spacing: 50e-3, er: 1 });
    const dc = rlgcAt(b.line, 0);
    expect(dc.r).toBeCloseTo(b.line.rdc, 15);
    // Two wires far apart: each contributes µ0/8π of internal inductance at DC (textbook).
    expect((dc.l - b.line.lInf) / (2 * (MU0 / (8 * Math.PI)))).toBeCloseTo(1, 3);
    // At 1 Hz the blended model is still at its DC values.
    expect(rlgcAt(b.line, 1).r / dc.r).toBeCloseTo(1, 6);
    const hf = highFrequencyLimit(b.line);
    const p = z0AndGamma(b.line, 1e13);
    expect(p.z0.re / hf.z0).toBeCloseTo(1, 3);
    expect(hf.velocity).toBeCloseTo(C0, -3);
  });

  it('with a DS dielectric the high-frequency velocity exceeds the velocity at the reference frequency', () => {
    const b = fromMicrostrip({ width: 0.36e-3, height: 0.2e-3, thickness: 35e-6, er: 4.3, lossTangent: 0.02 });
    expect(highFrequencyLimit(b.line).velocity).toBeGreaterThan(phaseVelocity(b.line, 1e9));
    // With perfect conductors the velocity at the reference frequency is c0/√ε_eff; the skin effect's
    // internal inductance (ωL_int = R_ac, about 1 % of ωL∞ here at 1 GHz) slows it slightly.
    const pec = fromMicrostrip({ width: 0.36e-3, height: 0.2e-3, thickness: 35e-6, er: 4.3, lossTangent: 0.02, conductivity: Infinity });
    expect(Math.abs(phaseVelocity(pec.line, 1e9) / (C0 / Math.sqrt(pec.epsEff)) - 1)).toBeLessThan(1e-4);
    expect(phaseVelocity(b.line, 1e9)).toBeLessThan(phaseVelocity(pec.line, 1e9));
  });

  it('passes out-of-range warnings through and refuses a lossy zero-thickness strip', () => {
    const b = fromMicrostrip({ width: 0.2, height: 1e-3, thickness: 35e-6, er: 4.3 });
    expect(b.warnings.join()).toMatch(/W\/h/);
    expect(() => fromMicrostrip({ width: 1e-3, height: 1e-3, er: 4.3 })).toThrow(/thickness/);
    expect(fromMicrostrip({ width: 1e-3, height: 1e-3, er: 4.3, conductivity: Infinity }).line.rdc).toBe(0);
  });

  it('roughness raises the high-frequency loss, up to ×2', () => {
    const base = { width: 0.36e-3, height: 0.2e-3, thickness: 35e-6, er: 4.3 };
    const smooth = fromMicrostrip(base);
    const rough = fromMicrostrip({ ...base, roughness: 2e-6 });
    const r = rlgcAt(rough.line, 20e9).r / rlgcAt(smooth.line, 20e9).r;
    expect(r).toBeGreaterThan(1.5);
    expect(r).toBeLessThanOrEqual(2);
    expect(rlgcAt(rough.line, 1e3).r / rlgcAt(smooth.line, 1e3).r).toBeCloseTo(1, 5);
  });
});

describe('FreqLine from a datasheet', () => {
  it('fits the issue example (4.3 dB/100 m at 10 MHz, 14 dB/100 m at 100 MHz) exactly, reporting the underdetermined fit', () => {
    const d = fromDatasheet({
      z0: 50,
      velocity: 0.66 * C0,
      attenuation: [
        { at: 10e6, loss: 0.043 },
        { at: 100e6, loss: 0.14 },
      ],
    });
    expect(d.fit.maxRelError).toBeLessThan(1e-6);
    expect(d.fit.rdc).toBeGreaterThanOrEqual(0);
    expect(d.fit.skinK).toBeGreaterThan(0);
    expect(d.warnings.join()).toMatch(/underdetermined/);
    expect(d.line.lInf).toBeCloseTo(50 / (0.66 * C0), 18);
    expect(attenuationDbPerM(d.line, 10e6)).toBeCloseTo(0.043, 8);
  });

  it('recovers R_dc, K and tanδ of a known coax from its own attenuation curve', () => {
    const truth = fromCoax({ innerDiameter: 0.9e-3, shieldDiameter: 2.95e-3, er: 2.25, lossTangent: 2e-4, at: 1e9, shieldThickness: 0.2e-3 });
    const fs = [1e6, 3e6, 10e6, 100e6, 400e6, 1e9, 3e9];
    const d = fromDatasheet({
      z0: truth.z0,
      velocity: C0 / Math.sqrt(2.25),
      at: 1e9,
      attenuation: fs.map((f) => ({ at: f, loss: attenuationDbPerM(truth.line, f) })),
    });
    expect(d.fit.rdc / truth.line.rdc).toBeCloseTo(1, 3);
    expect(d.fit.skinK / truth.line.skinK).toBeCloseTo(1, 4);
    expect(d.fit.lossTangent / 2e-4).toBeCloseTo(1, 3);
    expect(d.fit.maxRelError).toBeLessThan(1e-4);
  });

  it('least squares over inconsistent points: reports the residual; R_dc stays ≥ 0; a known R_dc is kept', () => {
    const pts = [
      { at: 1e6, loss: 0.02 },
      { at: 10e6, loss: 0.04 },
      { at: 100e6, loss: 0.15 },
      { at: 1e9, loss: 0.4 },
    ];
    const d = fromDatasheet({ z0: 75, delay: 4.4e-9, attenuation: pts });
    expect(d.fit.rdc).toBeGreaterThanOrEqual(0);
    expect(d.fit.lossTangent).toBeGreaterThanOrEqual(0);
    expect(d.fit.points).toHaveLength(4);
    expect(d.fit.rmsRelError).toBeGreaterThan(0);
    expect(d.fit.maxRelError).toBeLessThan(0.2);
    const fixed = fromDatasheet({ z0: 75, delay: 4.4e-9, attenuation: pts, rdc: 0.01 });
    expect(fixed.fit.rdc).toBe(0.01);
    expect(fixed.fit.fitted).not.toContain('rdc');
  });

  it('caps the loss tangent at its causal limit for a nearly air-filled cable, with a warning', () => {
    // v = 0.95c: ε′ = 1.108; all of a steep loss-vs-frequency curve would need tanδ above the cap.
    const d = fromDatasheet({ z0: 50, velocity: 0.95 * C0, attenuation: [{ at: 1e9, loss: 10 }, { at: 4e9, loss: 40 }] });
    expect(d.warnings.join()).toMatch(/causal limit/);
    expect(d.line.dielectric!.model.epsInf).toBeGreaterThanOrEqual(1);
  });

  it('rejects bad input', () => {
    expect(() => fromDatasheet({ z0: 50 })).toThrow(/velocity/);
    expect(() => fromDatasheet({ z0: 50, velocity: 2 * C0 })).toThrow(/exceeds/);
    expect(() => fromDatasheet({ z0: 50, velocity: 2e8, attenuation: [{ at: 1e6, loss: -1 }] })).toThrow(RangeError);
  });
});

describe('time-domain realisation', () => {
  it('Z′ and Y′ of the realisation stay within the reported bounds, with passive elements', () => {
    const b = fromMicrostrip({ width: 0.36e-3, height: 0.2e-3, thickness: 35e-6, er: 4.3, lossTangent: 0.02, roughness: 0.3e-6 });
    const r = timeDomainRealisation(b.line, 1e7, 2e10, { skinTerms: 4, debyeTerms: 4 });
    expect(r.series.sections.length).toBeLessThanOrEqual(4);
    expect(r.shunt.branches.length).toBeLessThanOrEqual(4);
    for (const s of r.series.sections) expect(s.r > 0 && s.l > 0).toBe(true);
    for (const br of r.shunt.branches) expect(br.c > 0 && br.r > 0).toBe(true);
    expect(r.series.l).toBeGreaterThanOrEqual(b.line.lInf);
    expect(r.shunt.c).toBeGreaterThanOrEqual(b.line.cInf);
    for (let f = 1e7; f <= 2e10; f *= 1.37) {
      const w = 2 * Math.PI * f;
      const z = zPerLength(b.line, w);
      const zr = zPerLengthRealised(r, w);
      const y = yPerLength(b.line, w);
      const yr = yPerLengthRealised(r, w);
      expect(Math.hypot(zr.re - z.re, zr.im - z.im) / Math.hypot(z.re, z.im)).toBeLessThanOrEqual(r.maxRelErrorZ * 1.001 + 1e-12);
      expect(Math.hypot(yr.re - y.re, yr.im - y.im) / Math.hypot(y.re, y.im)).toBeLessThanOrEqual(r.maxRelErrorY * 1.001 + 1e-12);
    }
    // Attenuation of the realised line at 1 GHz within 10 % of the exact model.
    const w = 2 * Math.PI * 1e9;
    const zr = zPerLengthRealised(r, w);
    const yr = yPerLengthRealised(r, w);
    const gam = Math.sqrt(Math.hypot(zr.re, zr.im) * Math.hypot(yr.re, yr.im)) * Math.cos((Math.atan2(zr.im, zr.re) + Math.atan2(yr.im, yr.re)) / 2);
    expect(Math.abs((gam * DB_PER_NEPER) / attenuationDbPerM(b.line, 1e9) - 1)).toBeLessThan(0.1);
  });
});
