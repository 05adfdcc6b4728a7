import { describe, expect, it } from 'vitest';
import { diodeVoltage, evalDiode, lambertWOfExp, thermalVoltage, typicalCmosClamp } from '../../../sim/devices/diode.js';
import { ivPoint } from '../../../sim/devices/iv-table.js';

describe('Shockley diode', () => {
  it('thermal voltage kT/q is 25.852 mV at 300 K', () => {
    // CODATA 2018 exact k and q; Sedra & Smith, Microelectronic Circuits, 7th ed., §4.2 (V_T ≈ 25 mV near room temperature)
    expect(thermalVoltage(300)).toBeCloseTo(0.025852, 6);
  });

  it('I_s = 1e-14 A, n = 1 conducts 1 mA at 0.655 V and 10 mA at 0.714 V', () => {
    // V = n·V_T·ln(1 + I/I_s): 0.025852·ln(1e11) = 0.6548 V; one decade more adds V_T·ln 10 = 59.5 mV
    const d = { is: 1e-14, n: 1, rs: 0, vt: thermalVoltage(300) };
    expect(Math.abs(diodeVoltage(d, 1e-3) - 0.655)).toBeLessThan(5e-4);
    expect(Math.abs(diodeVoltage(d, 10e-3) - 0.714)).toBeLessThan(5e-4);
    const p = ivPoint();
    expect(evalDiode(d, diodeVoltage(d, 1e-3), p).i).toBeCloseTo(1e-3, 12);
    expect(evalDiode(d, diodeVoltage(d, 10e-3), p).i).toBeCloseTo(10e-3, 11);
    // slope at 1 mA is I/V_T (small-signal conductance, Sedra & Smith §4.3)
    expect(evalDiode(d, diodeVoltage(d, 1e-3), p).g).toBeCloseTo((1e-3 + 1e-14) / d.vt, 8);
  });

  it('with series resistance the closed form agrees with V = n·V_T·ln(1 + I/I_s) + I·R_s', () => {
    const d = typicalCmosClamp();
    const p = ivPoint();
    for (const i of [1e-9, 1e-6, 1e-3, 0.02, 0.2, 2]) {
      const v = diodeVoltage(d, i);
      expect(Math.abs(evalDiode(d, v, p).i - i) / i).toBeLessThan(1e-9);
      // slope against a central difference
      const h = 1e-6;
      const fd = (evalDiode(d, v + h, ivPoint()).i - evalDiode(d, v - h, ivPoint()).i) / (2 * h);
      expect(Math.abs(p.g - fd) / fd).toBeLessThan(1e-4);
    }
  });

  it('never overflows: 100 V across a clamp with R_s is limited by R_s, and without R_s stays finite', () => {
    const d = typicalCmosClamp();
    const p = evalDiode(d, 100, ivPoint());
    expect(Number.isFinite(p.i) && Number.isFinite(p.g)).toBe(true);
    expect(Math.abs(diodeVoltage(d, p.i) - 100)).toBeLessThan(1e-9);
    expect(p.i).toBeGreaterThan((100 - 1.5) / d.rs); // the junction takes little more than a volt
    const bare = evalDiode({ ...d, rs: 0 }, 100, ivPoint());
    expect(Number.isFinite(bare.i) && Number.isFinite(bare.g)).toBe(true);
  });

  it('Lambert W of e^y satisfies w + ln w = y over a wide range', () => {
    for (const y of [-50, -5, -0.3, 0, 1, 3, 20, 700, 1e5]) {
      const w = lambertWOfExp(y);
      expect(Math.abs(w + Math.log(w) - y)).toBeLessThan(1e-12 * Math.max(1, Math.abs(y)));
    }
  });
});
