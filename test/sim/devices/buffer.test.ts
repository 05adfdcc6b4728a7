import { describe, expect, it } from 'vitest';
import { bufferCurrent, bufferScratch, currentParts, groundClampDiode, powerClampDiode, type BufferModel } from '../../../sim/devices/buffer.js';
import { deviceDcPoint } from '../../../sim/devices/dc.js';
import { thermalVoltage } from '../../../sim/devices/diode.js';
import { ivPoint, ivTable } from '../../../sim/devices/iv-table.js';
import { pushPullModel } from '../../../sim/devices/simple.js';

// Conventions of the open I/O buffer model standard (ANSI/EIA-656-B, IBIS ver. 5.0+: [Pullup] and
// [POWER Clamp] are "Vcc relative", V_table = V_cc − V_output; currents are positive into the pin).
const clamp = { is: 1e-15, n: 1, rs: 2, vt: thermalVoltage(300) };
const model: BufferModel = {
  ...pushPullModel({ name: 'pp', supply: 3.3, rUp: 40, rDown: 30, rise: 1e-9, fall: 1e-9 }),
  gndClamp: groundClampDiode(clamp),
  powerClamp: powerClampDiode(clamp),
};

describe('buffer current conventions', () => {
  it('pull-up table is supply-relative: driving high into a pin held at 0 V sources V_s/R_up out of the pin (negative)', () => {
    const p = bufferCurrent(model, 0, 1, 0, bufferScratch(), ivPoint());
    expect(p.i).toBeCloseTo(-3.3 / 40, 9);
    expect(p.g).toBeCloseTo(1 / 40, 6); // plus the clamps' negligible slope at 0 V
  });

  it('pull-down is ground-relative: driving low into a pin held at 3.3 V sinks 3.3/R_down into the pin (positive)', () => {
    expect(bufferCurrent(model, 3.3, 0, 1, bufferScratch(), ivPoint()).i).toBeCloseTo(3.3 / 30, 6);
  });

  it('clamps conduct once, whatever the driver does: above the supply the power clamp adds the same current high, low or off', () => {
    const v = 3.3 + 0.8;
    const parts = currentParts(model, v, 1, 0);
    const total = bufferCurrent(model, v, 1, 0, bufferScratch(), ivPoint()).i;
    expect(total).toBeCloseTo(parts.pullup + parts.powerClamp + parts.gndClamp, 12);
    const off = bufferCurrent(model, v, 0, 0, bufferScratch(), ivPoint()).i;
    expect(off).toBeCloseTo(parts.powerClamp + parts.gndClamp, 12);
    expect(parts.powerClamp).toBeGreaterThan(1e-3); // a diode 0.8 V forward conducts
    expect(total - off).toBeCloseTo(0.8 / 40, 9); // the pull-up adds only its own 20 mA
  });

  it('the ground clamp conducts out of the pin below ground (negative current)', () => {
    expect(currentParts(model, -0.8, 0, 0).gndClamp).toBeLessThan(-1e-3);
    expect(currentParts(model, 0.5, 0, 0).gndClamp).toBeGreaterThan(-1e-12);
  });

  it('a quiet-high driver idles at its supply, a quiet-low one at ground (DC with the pin open)', () => {
    expect(deviceDcPoint(model, 'high', 0, 0).vPin).toBeCloseTo(3.3, 9);
    expect(deviceDcPoint(model, 'low', 0, 0).vPin).toBeCloseTo(0, 9);
    // and into 50 Ω to ground the high level is the divider 3.3·50/90 (package R adds in series)
    const withPkg = { ...model, pkg: { r: 10, l: 5e-9, c: 1e-12 } };
    expect(deviceDcPoint(withPkg, 'high', 1 / 50, 0).vPin).toBeCloseTo((3.3 * 50) / 100, 6);
  });

  it('a power-clamp table in its supply-relative frame: the table point (−1 V, 20 mA) is the pin at V_s + 1 V', () => {
    const m: BufferModel = { ...model, gndClamp: undefined, powerClamp: { kind: 'table', table: ivTable([[-1, 0.02], [0, 0], [3.3, 0]]) } };
    expect(currentParts(m, 4.3, 0, 0).powerClamp).toBeCloseTo(0.02, 12);
    expect(currentParts(m, 2, 0, 0).powerClamp).toBeCloseTo(0, 12);
  });
});
