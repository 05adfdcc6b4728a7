import { describe, expect, it } from 'vitest';
import { parseIbisNumber } from '../../../src/ibis/numbers.js';

// ANSI/EIA-656 (IBIS ver. 5.0+), general syntax rules: scaling suffixes T G M k m u n p f; letters after
// the number are ignored; "NA" is not available.
const value = (s: string) => {
  const p = parseIbisNumber(s);
  return p.ok ? p.value : 'bad';
};

describe('IBIS numbers', () => {
  it('M is mega and m is milli (a classic model-file pitfall)', () => {
    expect(value('1M')).toBe(1e6);
    expect(value('1m')).toBe(1e-3);
    expect(value('0.00005M')).toBeCloseTo(50, 12);
  });

  it('suffixes and units: 2.5pF, 1.5nH, 10mA, 3.3V, 50ohm, 1e-3, 1F (farad: F is not a suffix), 1fF', () => {
    expect(value('2.5pF')).toBeCloseTo(2.5e-12, 24);
    expect(value('1.5nH')).toBeCloseTo(1.5e-9, 21);
    expect(value('10mA')).toBeCloseTo(0.01, 15);
    expect(value('3.3V')).toBe(3.3);
    expect(value('50ohm')).toBe(50);
    expect(value('1e-3')).toBe(1e-3);
    expect(value('1F')).toBe(1);
    expect(value('1fF')).toBeCloseTo(1e-15, 27);
    expect(value('-.5u')).toBeCloseTo(-5e-7, 19);
    expect(value('2k')).toBe(2000);
  });

  it('NA is undefined; words are not numbers; an unknown suffix letter is read without scaling and noted', () => {
    expect(value('NA')).toBeUndefined();
    expect(value('na')).toBeUndefined();
    expect(value('fast')).toBe('bad');
    const k = parseIbisNumber('10K');
    expect(k.ok && k.value).toBe(10);
    expect(k.ok && 'note' in k && k.note).toMatch(/not one of the standard's scaling suffixes/);
  });
});
