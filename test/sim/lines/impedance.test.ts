import { describe, expect, it } from 'vitest';
import { fromDatasheet, fromMicrostrip, highFrequencyLimit, losslessZ0 } from '../../../sim/lines/freq-model.js';
import { lineImpedance } from '../../../sim/lines/impedance.js';
import type { LineRLGC } from '../../../sim/model.js';

const wideband = (b: { line: LineRLGC['wideband'] }): LineRLGC => ({ r: 0, l: b.line!.lInf, g: 0, c: b.line!.cInf, wideband: b.line });

describe('one Z0 per line (the figure `line`, summary.json and the report print)', () => {
  it('is the quasi-static Z0 at the description’s frequency for a geometry line (Pozar design example, 50 Ω)', () => {
    // Pozar, Microwave Engineering, microstrip design example: εr = 2.20, d = 0.127 cm, W/d = 3.081 → 50 Ω
    // (Pozar quotes his closed forms as good to about 1 %). A lossy dielectric (tan δ at 1 GHz) makes
    // ε′ fall with frequency, so the quasi-static Z0 at 1 GHz and the high-frequency limit differ.
    const d = 0.127e-2;
    const b = fromMicrostrip({ width: 3.081 * d, height: d, thickness: 0, er: 2.2, lossTangent: 0.02, at: 1e9, conductivity: Infinity });
    const z = lineImpedance(wideband(b));
    expect(z.basis).toBe('quasi-static');
    expect(z.at).toBe(1e9);
    expect(Math.abs(z.z0 / 50 - 1)).toBeLessThan(0.01);
    // the same number the cross-section formula gives (Hammerstad–Jensen at εr(1 GHz))
    expect(z.z0).toBeCloseTo(b.z0, 9);
    // ε∞ < εr(1 GHz) for a Djordjevic–Sarkar dielectric: less C′, so Z0∞ > Z0(1 GHz)
    expect(z.highFrequency).toBeCloseTo(highFrequencyLimit(b.line).z0, 12);
    expect(z.highFrequency).toBeGreaterThan(z.z0);
    // and √(L∞/C′(f)) approaches Z0∞ as f grows
    expect(Math.abs(losslessZ0(b.line, 1e15) - z.highFrequency)).toBeLessThan(1e-3 * z.highFrequency);
  });

  it('is the datasheet’s own Z0 at its reference frequency', () => {
    const b = fromDatasheet({ z0: 75, velocity: 0.8 * 299_792_458, at: 100e6, attenuation: [{ at: 100e6, loss: 0.05 }, { at: 1e9, loss: 0.2 }] });
    const z = lineImpedance(wideband(b));
    expect(z.at).toBe(100e6);
    expect(z.z0).toBeCloseTo(75, 9);
  });

  it('is √(L′/C′) at every frequency for a constant line (Pozar ch. 2: Z0 = √(L/C) for a lossless line)', () => {
    const z = lineImpedance({ r: 4, l: 55 * 5.7e-9, g: 0, c: 5.7e-9 / 55 });
    expect(z).toEqual({ z0: expect.closeTo(55, 12), basis: 'constant', at: null, highFrequency: expect.closeTo(55, 12) });
  });
});
