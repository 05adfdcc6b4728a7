import { describe, expect, it } from 'vitest';
import { ivAt } from '../../../sim/devices/iv-table.js';
import { driveStrengthModel, squareLawTable } from '../../../sim/devices/simple.js';

describe('drive-strength form', () => {
  it('"8 mA at 3.3 V": 8 mA at V_OL = 0.4 V, about 46 Ω near the rail, 28.6 mA saturated (square law, by hand)', () => {
    // Shichman & Hodges square law with V_th = 0.66 V: V_ov = 2.64 V, k = 8 mA / (2.64·0.4 − 0.08) = 8.197 mA/V²;
    // small-signal resistance 1/(k·V_ov) = 46.2 Ω; saturation k·V_ov²/2 = 28.56 mA.
    const t = squareLawTable(3.3, 8e-3, 0.4, 0.66);
    expect(ivAt(t, 0.4)).toBeCloseTo(8e-3, 4); // 0.4 V falls between table points: interpolation within 0.05 mA
    expect(ivAt(t, 0)).toBe(0);
    expect(ivAt(t, 3.3)).toBeCloseTo(28.56e-3, 5);
    const rNear = 1 / ((ivAt(t, 3.3 / 14) - ivAt(t, -3.3 / 14)) / ((2 * 3.3) / 14));
    expect(rNear).toBeGreaterThan(45);
    expect(rNear).toBeLessThan(49);
    const m = driveStrengthModel({ name: 'd', supply: 3.3, current: 8e-3, rise: 1e-9, fall: 1e-9 });
    // the pull-up is the mirror image in its supply-relative frame: current out of the pin
    expect(ivAt(m.pullup!, 3.3)).toBeCloseTo(-28.56e-3, 5);
  });
});
