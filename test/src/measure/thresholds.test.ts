// Logic threshold presets. Values: JEDEC JESD8 family as published in FPGA vendors' I/O tables
// (Intel, Microchip) for the I/O standard of each name; 3.3 V from device data sheets and memory of
// JESD8C.01 (see src/measure/thresholds.ts for each source).
import { describe, expect, it } from 'vitest';
import { findPreset, presetNames, presetThresholds, resolveThresholds, THRESHOLD_PRESETS } from '../../../src/measure/thresholds.js';

describe('JEDEC JESD8 LVCMOS presets', () => {
  it('LVCMOS 3.3 V (JESD8C.01): VIH 2.0 V, VIL 0.8 V', () => {
    expect(presetThresholds('lvcmos33')).toMatchObject({ vih: 2.0, vil: 0.8, vdd: 3.3 });
  });
  it('LVCMOS 2.5 V (JESD8-5A): VIH 1.7 V, VIL 0.7 V', () => {
    expect(presetThresholds('lvcmos25')).toMatchObject({ vih: 1.7, vil: 0.7, vdd: 2.5 });
  });
  it('LVCMOS 1.8 V (JESD8-7A): 0.65·VDD / 0.35·VDD', () => {
    const t = presetThresholds('lvcmos18');
    expect(t.vih).toBeCloseTo(1.17, 12);
    expect(t.vil).toBeCloseTo(0.63, 12);
    const low = presetThresholds('lvcmos18', 1.71);
    expect(low.vih).toBeCloseTo(0.65 * 1.71, 12);
  });
  it('LVCMOS 1.5 V (JESD8-11) and 1.2 V (JESD8-12): 0.65·VDD / 0.35·VDD', () => {
    expect(presetThresholds('lvcmos15').vih).toBeCloseTo(0.975, 12);
    expect(presetThresholds('lvcmos15').vil).toBeCloseTo(0.525, 12);
    expect(presetThresholds('lvcmos12').vih).toBeCloseTo(0.78, 12);
    expect(presetThresholds('lvcmos12').vil).toBeCloseTo(0.42, 12);
  });
  it('every preset names its standard and where its values were confirmed', () => {
    for (const name of presetNames()) {
      const p = THRESHOLD_PRESETS[name]!;
      expect(p.standard).toMatch(/JESD8/);
      expect(p.confirmedBy.length).toBeGreaterThan(10);
      const t = presetThresholds(name);
      expect(t.vil).toBeLessThan(t.vih);
      expect(t.vih).toBeLessThan(p.vdd);
    }
  });
  it('accepts common spellings; rejects unknown names and vil ≥ vih', () => {
    expect(findPreset('LVCMOS-3.3')?.name).toBe('lvcmos33');
    expect(findPreset('3.3V')?.name).toBe('lvcmos33');
    expect(findPreset('lvcmos_1v8')?.name).toBe('lvcmos18');
    expect(findPreset('ttl')).toBeUndefined();
    expect(() => resolveThresholds('ttl')).toThrow(/unknown threshold preset "ttl"; known: lvcmos33/);
    expect(() => resolveThresholds({ vih: 0.5, vil: 0.8 })).toThrow(/must be below vih/);
    expect(resolveThresholds({ preset: 'lvcmos25' })).toMatchObject({ vih: 1.7, preset: 'lvcmos25' });
    expect(resolveThresholds({ vih: 2, vil: 0.8 })).toEqual({ vih: 2, vil: 0.8 });
  });
});
