import { describe, expect, it } from 'vitest';
import { C0 } from '../../../sim/lines/constants.js';
import { analyzeCoax, coaxZ0, synthCoaxInner, synthCoaxShield } from '../../../sim/lines/coax.js';
import { analyzeTwoWire, synthTwoWireSpacing, twoWireZ0 } from '../../../sim/lines/two-wire.js';

describe('coax', () => {
  it('Z0 = (60/√εr)·ln(D/d) (Pozar; Ulaby) — the textbook 60 is η0/2π ≈ 59.96', () => {
    for (const [d, D, er] of [
      [1e-3, 3.5e-3, 1],
      [0.9e-3, 2.95e-3, 2.25],
      [2e-3, 7e-3, 1.5],
    ]) {
      expect(Math.abs(coaxZ0(d, D, er) / ((60 / Math.sqrt(er)) * Math.log(D / d)) - 1)).toBeLessThan(1e-3);
    }
  });

  // Ulaby, *Fundamentals of Applied Electromagnetics* (coaxial line example): εr = 2.25,
  // Z0 = 50 Ω, inner radius a = 1.2 mm → outer radius b ≈ 4.2 mm, u_p = 2 × 10⁸ m/s.
  it('reproduces the Ulaby example: b ≈ 4.2 mm and u_p = 2e8 m/s (Ulaby)', () => {
    const D = synthCoaxShield(50, 2 * 1.2e-3, 2.25);
    expect(D / 2).toBeCloseTo(4.2e-3, 4); // 4.19 mm
    const a = analyzeCoax({ innerDiameter: 2.4e-3, shieldDiameter: D, er: 2.25 });
    expect(a.z0).toBeCloseTo(50, 9);
    expect(C0 / Math.sqrt(a.epsEff)).toBeCloseTo(2e8, -6); // 1.9986e8
    expect(synthCoaxInner(50, D, 2.25)).toBeCloseTo(2.4e-3, 12);
  });

  it('reports the TE11 cutoff ≈ c/(π√εr(a + b))', () => {
    const a = analyzeCoax({ innerDiameter: 0.9e-3, shieldDiameter: 2.95e-3, er: 2.25 });
    expect(a.maxFrequency / 1e9).toBeCloseTo(C0 / (Math.PI * 1.5 * 1.925e-3) / 1e9, 6); // ≈ 33 GHz
  });

  it('rejects a shield smaller than the inner conductor', () => {
    expect(() => analyzeCoax({ innerDiameter: 3e-3, shieldDiameter: 1e-3, er: 1 })).toThrow(RangeError);
  });
});

describe('two-wire line', () => {
  it('Z0 = (η0/π√εr)·acosh(s/d), tending to (120/√εr)·ln(2s/d) for s ≫ d (Ramo, Whinnery & Van Duzer)', () => {
    const z = twoWireZ0(1e-3, 100e-3, 1);
    expect(Math.abs(z / (120 * Math.log(200)) - 1)).toBeLessThan(1e-3);
    // 300 Ω twin-lead-like geometry in air: s/d = cosh(300π/η0) ≈ 6.2.
    const s = synthTwoWireSpacing(300, 1e-3, 1);
    expect(s / 1e-3).toBeGreaterThan(6);
    expect(s / 1e-3).toBeLessThan(6.5);
    expect(analyzeTwoWire({ diameter: 1e-3, spacing: s, er: 1 }).z0).toBeCloseTo(300, 9);
  });

  it('rejects touching wires', () => {
    expect(() => analyzeTwoWire({ diameter: 1e-3, spacing: 0.9e-3, er: 1 })).toThrow(RangeError);
  });
});
