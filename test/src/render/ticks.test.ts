import { describe, expect, it } from 'vitest';
import {
  axisTicks,
  axisTitle,
  decimalsFor,
  engineeringExponent,
  formatSi,
  MINUS,
  niceStep,
  targetTickCount,
  tickValues,
} from '../../../src/render/ticks.js';

describe('niceStep', () => {
  it('picks 1, 2, 2.5 or 5 × 10^k, the smallest giving at most ~target intervals', () => {
    expect(niceStep(30e-9, 6)).toBeCloseTo(5e-9, 20);
    expect(niceStep(4, 6)).toBe(1);
    expect(niceStep(10, 5)).toBe(2);
    expect(niceStep(1, 4)).toBe(0.25);
    expect(niceStep(1, 3)).toBe(0.5);
    expect(niceStep(700, 7)).toBe(100);
    expect(niceStep(2e-12, 4)).toBeCloseTo(0.5e-12, 25);
  });
  it('rejects a non-positive span', () => {
    expect(() => niceStep(0, 5)).toThrow(RangeError);
    expect(() => niceStep(-1, 5)).toThrow(RangeError);
  });
});

describe('tickValues', () => {
  it('lists the multiples of the step inside the range, ends included', () => {
    expect(tickValues(0, 30, 5)).toEqual([0, 5, 10, 15, 20, 25, 30]);
    expect(tickValues(-1.2, 3.1, 1)).toEqual([-1, 0, 1, 2, 3]);
    expect(tickValues(3.1, -1.2, 1)).toEqual([-1, 0, 1, 2, 3]);
  });
  it('keeps an end that is a multiple only up to rounding (0.3 / 0.1)', () => {
    const v = tickValues(0, 0.3, 0.1);
    expect(v).toHaveLength(4);
    expect(v[3]).toBeCloseTo(0.3, 12);
  });
  it('gives exact 0, never −0', () => {
    expect(Object.is(tickValues(-0.5, 0.5, 0.5)[1], 0)).toBe(true);
  });
});

describe('engineeringExponent', () => {
  it('is the multiple of 3 at or below log10|v|', () => {
    expect(engineeringExponent(1000)).toBe(3);
    expect(engineeringExponent(999)).toBe(0);
    expect(engineeringExponent(1)).toBe(0);
    expect(engineeringExponent(0.999)).toBe(-3);
    expect(engineeringExponent(1e-9)).toBe(-9);
    expect(engineeringExponent(-30e-9)).toBe(-9);
    expect(engineeringExponent(0.999e-9)).toBe(-12);
    expect(engineeringExponent(0)).toBe(0);
  });
  it('clamps to the named prefixes f … T', () => {
    expect(engineeringExponent(1e-20)).toBe(-15);
    expect(engineeringExponent(1e20)).toBe(12);
  });
});

describe('axisTicks', () => {
  it('0–30 ns: prefix n, labels 0, 5, 10 …', () => {
    const t = axisTicks(0, 30e-9, { unit: 's', target: 6 });
    expect(t.unit).toBe('ns');
    expect(t.exponent).toBe(-9);
    expect(t.labels).toEqual(['0', '5', '10', '15', '20', '25', '30']);
    t.values.forEach((v, i) => expect(v).toBeCloseTo(i * 5e-9, 20));
  });

  it('−1 to 3 V: labels −1, 0, 1, 2, 3 with a typographic minus', () => {
    const t = axisTicks(-1, 3, { unit: 'V', target: 6 });
    expect(t.unit).toBe('V');
    expect(t.labels).toEqual([`${MINUS}1`, '0', '1', '2', '3']);
  });

  it('a negative range in millivolts', () => {
    const t = axisTicks(-0.25, -0.05, { unit: 'V', target: 4 });
    expect(t.unit).toBe('mV');
    expect(t.labels).toEqual([`${MINUS}250`, `${MINUS}200`, `${MINUS}150`, `${MINUS}100`, `${MINUS}50`]);
  });

  it('a range across zero never prints "−0"', () => {
    const t = axisTicks(-0.6, 0.6, { unit: 'V', target: 6 });
    expect(t.labels).toContain('0');
    expect(t.labels.some((l) => /^[−-]0(\.0*)?$/.test(l))).toBe(false);
  });

  it('a tiny span (2 ps) picks the prefix that gives the shortest labels', () => {
    const t = axisTicks(0, 2e-12, { unit: 's', target: 4 });
    expect(t.unit).toBe('ps');
    expect(t.labels).toEqual(['0.0', '0.5', '1.0', '1.5', '2.0']);
  });

  it('a femtosecond span stays readable', () => {
    const t = axisTicks(0, 40e-15, { unit: 's', target: 4 });
    expect(t.unit).toBe('fs');
    expect(t.labels).toEqual(['0', '10', '20', '30', '40']);
  });

  it('microseconds with quarter steps share one number of decimals', () => {
    const t = axisTicks(0, 1.5e-6, { unit: 's', target: 6 });
    expect(t.unit).toBe('µs');
    expect(t.labels).toEqual(['0.00', '0.25', '0.50', '0.75', '1.00', '1.25', '1.50']);
  });

  it('large values take k, M … prefixes', () => {
    expect(axisTicks(0, 2e6, { unit: 'Ω', target: 4 }).unit).toBe('MΩ');
    expect(axisTicks(0, 5000, { unit: 'Ω', target: 5 }).labels).toEqual(['0', '1', '2', '3', '4', '5']);
  });

  it('a small span far from zero still gives distinct, increasing labels', () => {
    const t = axisTicks(3.2999, 3.3001, { unit: 'V', target: 4 });
    expect(new Set(t.labels).size).toBe(t.labels.length);
    expect(t.values.every((v) => v >= 3.2999 - 1e-12 && v <= 3.3001 + 1e-12)).toBe(true);
    const parsed = t.labels.map((l) => Number(l.replace(MINUS, '-')) * Math.pow(10, t.exponent));
    parsed.forEach((p, i) => expect(p).toBeCloseTo(t.values[i], 9));
  });

  it('labels read back as the tick values, for many random ranges', () => {
    let seed = 12345;
    const rnd = (): number => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
    for (let k = 0; k < 300; k++) {
      const scale = Math.pow(10, Math.floor(rnd() * 24) - 15);
      const a = (rnd() * 2 - 1) * scale, b = a + rnd() * scale * 3 + scale * 1e-3;
      const t = axisTicks(a, b, { unit: 'V', target: 2 + Math.floor(rnd() * 8) });
      expect(t.values.length).toBeGreaterThanOrEqual(1);
      const f = Math.pow(10, t.exponent);
      t.labels.forEach((l, i) => {
        const v = Number(l.replace(MINUS, '-')) * f;
        expect(Math.abs(v - t.values[i])).toBeLessThanOrEqual(t.step * 1e-6);
      });
    }
  });

  it('a dimensionless axis gets plain numbers unless asked for prefixes', () => {
    const t = axisTicks(0, 5000, { target: 5 });
    expect(t.unit).toBe('');
    expect(t.labels).toEqual(['0', '1000', '2000', '3000', '4000', '5000']);
    expect(axisTicks(0, 5000, { target: 5, si: true }).unit).toBe('k');
  });

  it('widens an empty range instead of failing', () => {
    const t = axisTicks(3.3, 3.3, { unit: 'V' });
    expect(t.values.length).toBeGreaterThan(1);
  });
});

describe('helpers', () => {
  it('decimalsFor counts the decimals a step needs', () => {
    expect(decimalsFor(5)).toBe(0);
    expect(decimalsFor(0.5)).toBe(1);
    expect(decimalsFor(0.25)).toBe(2);
    expect(decimalsFor(2.5)).toBe(1);
    expect(decimalsFor(0.1 + 0.2)).toBe(1);
  });
  it('axisTitle puts the unit in parentheses', () => {
    expect(axisTitle('Time', 'ns')).toBe('Time (ns)');
    expect(axisTitle('Hits', '')).toBe('Hits');
  });
  it('targetTickCount scales with the axis length, within 2…12', () => {
    expect(targetTickCount(1000, 100)).toBe(10);
    expect(targetTickCount(50, 100)).toBe(2);
    expect(targetTickCount(1e5, 100)).toBe(12);
  });
  it('formatSi writes one value with prefix and unit', () => {
    expect(formatSi(12.5e-9, 's')).toBe('12.5 ns');
    expect(formatSi(-0.25, 'V')).toBe(`${MINUS}250 mV`);
    expect(formatSi(3.3, 'V')).toBe('3.3 V');
    expect(formatSi(0, 'V')).toBe('0 V');
    expect(formatSi(999.96e-9, 's')).toBe('1 µs');
    expect(formatSi(50, 'Ω')).toBe('50 Ω');
    expect(formatSi(1234, '', 2)).toBe('1.2 k');
  });
});
