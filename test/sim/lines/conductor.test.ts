import { describe, expect, it } from 'vitest';
import { COPPER_CONDUCTIVITY, ETA0, MU0 } from '../../../sim/lines/constants.js';
import {
  COPPER_THICKNESS_PER_OZ,
  coaxLossFactor,
  dcResistanceRound,
  dcResistanceStrip,
  hammerstadRoughness,
  microstripLossFactor,
  microstripLossFactorHJ,
  skinCoefficient,
  skinDepth,
  striplineLossFactor,
  surfaceResistance,
  twoWireLossFactor,
} from '../../../sim/lines/conductor.js';
import { coaxZ0 } from '../../../sim/lines/coax.js';
import { microstripZ0Air, synthMicrostripWidth } from '../../../sim/lines/microstrip.js';
import { twoWireZ0 } from '../../../sim/lines/two-wire.js';

const CU = COPPER_CONDUCTIVITY;

describe('skin effect in copper (σ = 5.8e7 S/m)', () => {
  // Pozar, *Microwave Engineering* (skin depth of copper; Rs of copper at 10 GHz).
  it('skin depth 66 µm at 1 MHz and 2.09 µm at 1 GHz (Pozar)', () => {
    expect(skinDepth(1e6, CU) * 1e6).toBeCloseTo(66.1, 1);
    expect(skinDepth(1e9, CU) * 1e6).toBeCloseTo(2.09, 2);
  });

  it('surface resistance 26 mΩ at 10 GHz (Pozar)', () => {
    expect(surfaceResistance(1e10, CU) * 1e3).toBeCloseTo(26.1, 1);
    expect(surfaceResistance(1e10, CU)).toBeCloseTo(1 / (CU * skinDepth(1e10, CU)), 15);
  });

  it('1 oz copper is 35 µm (common practice)', () => {
    expect(COPPER_THICKNESS_PER_OZ).toBe(35e-6);
  });
});

describe('Hammerstad roughness factor K = 1 + (2/π)·atan(1.4(Δ/δ)²)', () => {
  it('is 1 for a smooth surface, tends to 2 when Δ ≫ δ, and equals 1 + (2/π)atan(1.4) at Δ = δ', () => {
    expect(hammerstadRoughness(1e9, 0, CU)).toBe(1);
    expect(hammerstadRoughness(1e12, 10e-6, CU)).toBeGreaterThan(1.99);
    const f = 1e9;
    expect(hammerstadRoughness(f, skinDepth(f, CU), CU)).toBeCloseTo(1 + (2 / Math.PI) * Math.atan(1.4), 14);
  });
});

describe("conductor loss by Wheeler's incremental-inductance rule, R' = (Rs/η0)·∂Z0,air/∂n", () => {
  it("coax: R' = Rs/(2π)·(1/a + 1/b) — the closed form is the rule applied to ln(b/a) (Pozar)", () => {
    const d = 0.9e-3;
    const D = 2.95e-3;
    const dn = 1e-9;
    const numeric = (coaxZ0(d - 2 * dn, D + 2 * dn, 1) - coaxZ0(d + 2 * dn, D - 2 * dn, 1)) / (2 * dn) / ETA0;
    expect(coaxLossFactor(d, D)).toBeCloseTo(numeric, 3);
    expect(coaxLossFactor(d, D)).toBeCloseTo((1 / (2 * Math.PI)) * (2 / d + 2 / D), 9);
  });

  it('two wires: the closed form equals the rule applied to acosh(s/d), proximity effect included', () => {
    const d = 1e-3;
    const s = 3e-3;
    const dn = 1e-10;
    const numeric = (twoWireZ0(d - 2 * dn, s, 1) - twoWireZ0(d + 2 * dn, s, 1)) / (2 * dn) / ETA0;
    expect(twoWireLossFactor(d, s)).toBeCloseTo(numeric, 2);
    // Far apart: two isolated wires, each Rs/(πd).
    expect(twoWireLossFactor(d, 1) * (Math.PI * d) / 2).toBeCloseTo(1, 5);
  });

  // Pozar's stripline attenuation (after Wheeler) for √εr·Z0 < 120:
  //   α_c = 2.7e-3·Rs·εr·Z0 / (30π(b − t)) · A,  A = 1 + 2W/(b − t) + (1/π)(b + t)/(b − t)·ln((2b − t)/t).
  it("stripline: the rule on our Z0 agrees with Pozar's closed-form α_c within 3 % (Pozar, after Wheeler)", () => {
    const b = 0.4e-3;
    const t = 17e-6;
    const er = 4.3;
    const W = 0.155e-3; // ≈ 50 Ω
    const f = 1e9;
    const rs = surfaceResistance(f, CU);
    const A = 1 + (2 * W) / (b - t) + (1 / Math.PI) * ((b + t) / (b - t)) * Math.log((2 * b - t) / t);
    const z0 = 50;
    const pozar = ((2.7e-3 * rs * er * z0) / (30 * Math.PI * (b - t))) * A;
    const ours = (striplineLossFactor(W, b, t) * rs) / (2 * z0);
    expect(Math.abs(ours / pozar - 1)).toBeLessThan(0.03);
  });

  // Pucel, Massé & Hartwig, "Losses in microstrip", IEEE T-MTT 16(6), 1968 (Wheeler's rule applied
  // to Wheeler's microstrip formulas), for 1/(2π) < W/h ≤ 2:
  //   α_c = Rs/(2π Z0 h)·[1 − (W'/4h)²]·[1 + h/W' + (h/πW')(ln(2h/t) − t/W)],  W' = W + (t/π)(1 + ln(2h/t)).
  it('microstrip: the rule on Hammerstad–Jensen agrees with Pucel et al. (1968) within 20 %, and lies between it and the HJ current-distribution form', () => {
    const h = 0.2e-3;
    const t = 35e-6;
    const { width: W } = synthMicrostripWidth(50, { height: h, thickness: t, er: 4.3 });
    const We = W + (t / Math.PI) * (1 + Math.log((2 * h) / t));
    const pucel = ((1 - (We / (4 * h)) ** 2) * (1 + h / We + (h / (Math.PI * We)) * (Math.log((2 * h) / t) - t / W))) / (Math.PI * h);
    const ours = microstripLossFactor(W, h, t);
    const hj = microstripLossFactorHJ(W, h, t);
    expect(Math.abs(ours / pucel - 1)).toBeLessThan(0.2);
    expect(ours).toBeGreaterThan(pucel);
    expect(ours).toBeLessThan(hj);
  });

  // Wide strip: the W and h terms of the rule on Hammerstad–Jensen's Z0,air against the same terms
  // on an independent closed form, Z = η0/(u + 1.393 + 0.667·ln(u + 1.444)) (Hammerstad 1975 for
  // W/h > 1, as quoted by Pozar). The thickness (edge) term is left out: that formula has no t.
  it('microstrip, wide strip: the flat-wall terms agree within 2 % with the rule on the Hammerstad/Pozar wide-strip formula', () => {
    const zWide = (W: number, h: number) => ETA0 / (W / h + 1.393 + 0.667 * Math.log(W / h + 1.444));
    const zHJ = (W: number, h: number) => microstripZ0Air(W, h, 0);
    const h = 1e-3;
    for (const W of [3e-3, 10e-3, 30e-3]) {
      const dn = 1e-9;
      const flat = (z: (W: number, h: number) => number) => (z(W - 2 * dn, h + 2 * dn) - z(W + 2 * dn, h - 2 * dn)) / (2 * dn) / ETA0;
      expect(Math.abs(flat(zHJ) / flat(zWide) - 1)).toBeLessThan(0.02);
    }
    // With the edges, a wide strip's loss is near the parallel-plate 2/W (strip underside + plane).
    const g = microstripLossFactor(30e-3, h, 35e-6);
    expect((g * 30e-3) / 2).toBeGreaterThan(0.85);
    expect((g * 30e-3) / 2).toBeLessThan(1.05);
  });

  it('skin coefficient K = g√(µ/σ) gives R = K√(ω/2) = g·Rs', () => {
    const g = 1234;
    const f = 3e8;
    const K = skinCoefficient(g, CU);
    expect(K * Math.sqrt(Math.PI * f)).toBeCloseTo(g * surfaceResistance(f, CU), 12);
    expect(K).toBeCloseTo(g * Math.sqrt(MU0 / CU), 18);
  });

  it('DC resistance from the cross-section', () => {
    // 1 oz, 0.2 mm trace: 1/(5.8e7 · 0.2e-3 · 35e-6) = 2.46 Ω/m.
    expect(dcResistanceStrip(0.2e-3, 35e-6, CU)).toBeCloseTo(2.463, 3);
    // AWG 24 (0.511 mm) copper: about 84 mΩ/m (wire tables).
    expect(dcResistanceRound(0.511e-3, CU)).toBeCloseTo(0.084, 3);
  });

  it('refuses a zero-thickness strip (the edge loss diverges)', () => {
    expect(() => microstripLossFactor(1e-3, 1e-3, 0)).toThrow(RangeError);
  });
});
