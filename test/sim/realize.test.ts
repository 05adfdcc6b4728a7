import { describe, expect, it } from 'vitest';
import { C0 } from '../../sim/lines/constants.js';
import { attenuationDbPerM, fromMicrostrip, fromStripline, yPerLengthRealised, zPerLengthRealised } from '../../sim/lines/index.js';
import { realizeLine, termsForBand } from '../../sim/realize.js';
import { csqrt, cmul } from '../../sim/lines/complex.js';

const DB_PER_NEPER = 20 / Math.LN10;

/** Attenuation (dB/m) of a realised line, from γ = √(Z′Y′). */
function realisedAttenuation(fit: Parameters<typeof zPerLengthRealised>[0], f: number): number {
  const w = 2 * Math.PI * f;
  return DB_PER_NEPER * csqrt(cmul(zPerLengthRealised(fit, w), yPerLengthRealised(fit, w))).re;
}

describe('time-domain realisation of a wideband line', () => {
  it('chooses two terms per decade of band, four to eight', () => {
    expect(termsForBand({ fmin: 1e8, fmax: 1e10 })).toBe(4);
    expect(termsForBand({ fmin: 5e6, fmax: 35e9 })).toBe(8);
    expect(termsForBand({ fmin: 1e3, fmax: 1e12 })).toBe(8);
  });

  // A homogeneous dielectric (stripline) loses α_d = π·f·√εr·tanδ / c (Pozar, Microwave Engineering,
  // ch. 3, dielectric loss of a TEM line). With a perfect conductor that is the whole attenuation.
  it('keeps the dielectric loss of a stripline within 2 % of π f √εr tanδ / c across the band', () => {
    const er = 4.3;
    const tand = 0.02;
    const built = fromStripline({ width: 0.15e-3, planeSpacing: 0.5e-3, thickness: 17e-6, er, lossTangent: tand, at: 1e9, conductivity: Infinity });
    const band = { fmin: 5e6, fmax: 35e9 };
    const { fit } = realizeLine({ r: 0, l: 0, g: 0, c: 0, wideband: built.line }, band);
    for (const f of [1e8, 1e9, 1e10]) {
      // the Djordjevic–Sarkar model's εr and tanδ drift slowly with frequency; compare with its own values at f
      const exact = attenuationDbPerM(built.line, f);
      expect(Math.abs(realisedAttenuation(fit, f) - exact) / exact).toBeLessThan(0.02);
    }
    const at1GHz = (DB_PER_NEPER * Math.PI * 1e9 * Math.sqrt(er) * tand) / C0;
    expect(Math.abs(realisedAttenuation(fit, 1e9) - at1GHz) / at1GHz).toBeLessThan(0.02);
  });

  it('keeps the total loss of an FR-4 microstrip within 2 % of the exact model over 3.8 decades', () => {
    const built = fromMicrostrip({ width: 0.2e-3, height: 0.1e-3, thickness: 35e-6, er: 4.2, lossTangent: 0.02, at: 1e9 });
    const { fit, line } = realizeLine({ r: 0, l: 0, g: 0, c: 0, wideband: built.line }, { fmin: 5e6, fmax: 35e9 });
    expect(line.series).toHaveLength(8);
    expect(line.shunt).toHaveLength(8);
    for (let f = 1e7; f <= 3e10; f *= 1.7) {
      const exact = attenuationDbPerM(built.line, f);
      expect(Math.abs(realisedAttenuation(fit, f) - exact) / exact).toBeLessThan(0.02);
    }
  });
});
