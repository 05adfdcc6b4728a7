import { describe, expect, it } from 'vitest';
import { C0, INCH } from '../../../sim/lines/constants.js';
import {
  analyzeMicrostrip,
  hjEpsEff,
  hjZ01,
  microstripDispersion,
  synthMicrostripWidth,
} from '../../../sim/lines/microstrip.js';

describe('microstrip, Hammerstad–Jensen 1980', () => {
  // Pozar, *Microwave Engineering* (microstrip section, design example): εr = 2.20, d = 0.127 cm,
  // 50 Ω → W/d = 3.081, ε_eff = 1.87. Pozar uses the simpler Hammerstad (1975) closed forms, which
  // he quotes as good to about 1 %; HJ 1980 is a refinement, so we allow 1 % on W/d and ε_eff.
  it('reproduces the Pozar design example within 1 % (Pozar, Microwave Engineering)', () => {
    const d = 0.127e-2;
    const { width, analysis } = synthMicrostripWidth(50, { height: d, er: 2.2 });
    expect(Math.abs(width / d / 3.081 - 1)).toBeLessThan(0.01);
    expect(Math.abs(analysis.epsEff / 1.87 - 1)).toBeLessThan(0.01);
    expect(analysis.z0).toBeCloseTo(50, 9);
    expect(analysis.validity.inside).toBe(true);
  });

  it('synthesis inverts analysis, with and without strip thickness', () => {
    for (const t of [0, 17e-6, 35e-6]) {
      for (const z of [30, 50, 75, 100]) {
        const g = { height: 0.2e-3, thickness: t, er: 4.3 };
        const { width } = synthMicrostripWidth(z, g);
        expect(analyzeMicrostrip({ ...g, width }).z0).toBeCloseTo(z, 8);
      }
    }
  });

  // A thin-strip FR-4 case evaluated by hand from the published closed forms (zero thickness,
  // W/h = 2, εr = 4.3): f(u) = 6 + (2π − 6)·exp(−(30.666/u)^0.7528), Z01 = (η0/2π)·ln(f/u + √(1 + 4/u²)),
  // a = 1 + ln((u⁴ + (u/52)²)/(u⁴ + 0.432))/49 + ln(1 + (u/18.1)³)/18.7, b = 0.564·((εr − 0.9)/(εr + 3))^0.053,
  // ε_eff = (εr + 1)/2 + (εr − 1)/2·(1 + 10/u)^(−ab).
  it('a thin-strip FR-4 case matches the closed form evaluated step by step (HJ 1980)', () => {
    const u = 2;
    const er = 4.3;
    const f = 6 + (2 * Math.PI - 6) * Math.exp(-Math.pow(30.666 / u, 0.7528));
    const eta0 = 376.730313412;
    const z01 = (eta0 / (2 * Math.PI)) * Math.log(f / u + Math.sqrt(1 + 4 / (u * u)));
    const a = 1 + Math.log((u ** 4 + (u / 52) ** 2) / (u ** 4 + 0.432)) / 49 + Math.log(1 + (u / 18.1) ** 3) / 18.7;
    const b = 0.564 * Math.pow((er - 0.9) / (er + 3), 0.053);
    const ee = (er + 1) / 2 + ((er - 1) / 2) * Math.pow(1 + 10 / u, -a * b);
    const m = analyzeMicrostrip({ width: 2e-4, height: 1e-4, thickness: 0, er });
    expect(m.z0Air).toBeCloseTo(z01, 6);
    expect(m.epsEff).toBeCloseTo(ee, 10);
    expect(m.z0).toBeCloseTo(z01 / Math.sqrt(ee), 6);
    // Sanity: ~50 Ω and ε_eff ≈ 3.3 for a 2:1 trace on FR-4, as every stack-up calculator shows.
    expect(m.z0).toBeGreaterThan(45);
    expect(m.z0).toBeLessThan(52);
    expect(m.epsEff).toBeGreaterThan(3.2);
    expect(m.epsEff).toBeLessThan(3.4);
  });

  it('limits: a wide strip tends to the parallel-plate η0·h/W; εr = 1 gives ε_eff = 1', () => {
    // For u → ∞ the HJ form tends to η0/(u + 1.393 + …); at u = 1000 the fringing term is < 0.3 %.
    expect(hjZ01(1000) / (376.730313412 / 1000)).toBeGreaterThan(0.99);
    expect(hjZ01(1000) / (376.730313412 / 1000)).toBeLessThan(1);
    expect(hjEpsEff(1, 1)).toBeCloseTo(1, 14);
    expect(analyzeMicrostrip({ width: 1e-3, height: 1e-3, thickness: 35e-6, er: 1 }).epsEff).toBeCloseTo(1, 12);
  });

  it('thickness widens the strip electrically: Z0 falls as t grows (HJ 1980 thickness correction)', () => {
    const z = [0, 10e-6, 35e-6, 70e-6].map((t) => analyzeMicrostrip({ width: 0.3e-3, height: 0.2e-3, thickness: t, er: 4.3 }).z0);
    for (let i = 1; i < z.length; i++) expect(z[i]).toBeLessThan(z[i - 1]);
  });

  // Hammerstad–Jensen state 0.2 % accuracy for ε_eff over 0.01 ≤ W/h ≤ 100 and εr ≤ 128.
  it("flags inputs outside Hammerstad–Jensen's stated 0.2 % range, naming the range", () => {
    expect(analyzeMicrostrip({ width: 1e-3, height: 1e-3, er: 4 }).validity.inside).toBe(true);
    const wide = analyzeMicrostrip({ width: 0.2, height: 1e-3, er: 4 });
    expect(wide.validity.inside).toBe(false);
    expect(wide.validity.warnings.join()).toMatch(/0\.01 ≤ W\/h ≤ 100/);
    const highEr = analyzeMicrostrip({ width: 1e-3, height: 1e-3, er: 200 });
    expect(highEr.validity.warnings.join()).toMatch(/εr/);
  });

  it('rejects impossible geometry', () => {
    expect(() => analyzeMicrostrip({ width: -1, height: 1e-3, er: 4 })).toThrow(RangeError);
    expect(() => analyzeMicrostrip({ width: 1e-3, height: 1e-3, er: 0.5 })).toThrow(RangeError);
    expect(() => synthMicrostripWidth(5000, { height: 1e-3, er: 4 })).toThrow(/out of reach/);
  });
});

describe('microstrip dispersion, Kirschning–Jansen 1982', () => {
  const g = { width: 0.36e-3, height: 0.2e-3, thickness: 35e-6, er: 4.3 };
  it('starts at the quasi-static value and rises monotonically toward εr', () => {
    const e0 = analyzeMicrostrip(g).epsEff;
    expect(microstripDispersion(g, 0).epsEff).toBeCloseTo(e0, 12);
    let prev = e0;
    for (const f of [1e8, 1e9, 1e10, 3e10, 1e11]) {
      const e = microstripDispersion(g, f).epsEff;
      expect(e).toBeGreaterThanOrEqual(prev);
      expect(e).toBeLessThan(g.er);
      prev = e;
    }
    // On a 0.2 mm FR-4 substrate the change by 10 GHz is small (fn = 2 GHz·mm): a few percent at most.
    expect(microstripDispersion(g, 1e10).epsEff / e0 - 1).toBeLessThan(0.03);
  });

  it('flags frequencies beyond h/λ0 = 0.13 (the stated range of the model)', () => {
    expect(microstripDispersion(g, 1e10).validity.inside).toBe(true);
    const far = microstripDispersion(g, 0.2 * C0 / g.height);
    expect(far.validity.inside).toBe(false);
    expect(far.validity.warnings.join()).toMatch(/h\/λ0/);
  });

  // Common practice (high-speed digital design handbooks): FR-4 microstrip ≈ 140–150 ps/in.
  it('FR-4 50 Ω microstrip delay is about 140–150 ps/in (common practice)', () => {
    const { analysis } = synthMicrostripWidth(50, { height: 0.2e-3, thickness: 35e-6, er: 4.2 });
    const psPerIn = (Math.sqrt(analysis.epsEff) / C0) * INCH * 1e12;
    // The rule of thumb is quoted for εr ≈ 4 and is itself a ±10 % figure.
    expect(psPerIn).toBeGreaterThan(140 * 0.95);
    expect(psPerIn).toBeLessThan(140 * 1.1);
  });
});
