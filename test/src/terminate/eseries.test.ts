// The preferred-value series against IEC 60063 (2015), "Preferred number series for resistors and
// capacitors".
import { describe, expect, it } from 'vitest';
import { membersBetween, membersOutward, neighbours, parseSeriesName, seriesMantissas } from '../../../src/terminate/eseries.js';

describe('E series tables', () => {
  it('E24 is the IEC 60063 Table 1 series, and E12, E6, E3 are every 2nd, 4th, 8th member', () => {
    // IEC 60063, Table 1 (two significant digits), E24 column.
    expect([...seriesMantissas('E24')]).toEqual([10, 11, 12, 13, 15, 16, 18, 20, 22, 24, 27, 30, 33, 36, 39, 43, 47, 51, 56, 62, 68, 75, 82, 91]);
    // IEC 60063, Table 1, E12, E6 and E3 columns.
    expect([...seriesMantissas('E12')]).toEqual([10, 12, 15, 18, 22, 27, 33, 39, 47, 56, 68, 82]);
    expect([...seriesMantissas('E6')]).toEqual([10, 15, 22, 33, 47, 68]);
    expect([...seriesMantissas('E3')]).toEqual([10, 22, 47]);
  });

  it('E24 keeps the standard\'s historical values where the rounded geometric series differs', () => {
    // 10^(k/24) rounded to two digits gives 26, 29, 32, 35, 38, 42, 46 and 83 where IEC 60063 lists
    // 27, 30, 33, 36, 39, 43, 47 and 82: a table computed from the formula would be wrong there.
    const formula = Array.from({ length: 24 }, (_, k) => Math.round(10 * 10 ** (k / 24)));
    const differ = seriesMantissas('E24').filter((v, k) => v !== formula[k]);
    expect(differ).toEqual([27, 30, 33, 36, 39, 43, 47, 82]);
  });

  it('E96 and E48 are the geometric series rounded to three digits (IEC 60063 Table 2); E192 too, except 920', () => {
    // The three-digit series of IEC 60063 Table 2 are 10^(k/n) rounded to three significant digits,
    // with one exception in E192: 920 where the formula gives 919 (from memory of the standard's
    // table; the E96 values also equal the EIA-96 resistor marking table 100 … 976).
    const formula = (n: number) => Array.from({ length: n }, (_, k) => Math.round(100 * 10 ** (k / n)));
    expect([...seriesMantissas('E96')]).toEqual(formula(96));
    expect([...seriesMantissas('E48')]).toEqual(formula(48));
    const e192 = seriesMantissas('E192');
    const f192 = formula(192);
    const differ = e192.map((v, k) => [v, f192[k]]).filter(([v, f]) => v !== f);
    expect(differ).toEqual([[920, 919]]);
    expect(seriesMantissas('E96').slice(0, 8)).toEqual([100, 102, 105, 107, 110, 113, 115, 118]);
    expect(seriesMantissas('E96').slice(-4)).toEqual([909, 931, 953, 976]);
  });

  it('reads series names in any case and refuses others', () => {
    expect(parseSeriesName('e24')).toBe('E24');
    expect(parseSeriesName(' E96 ')).toBe('E96');
    expect(parseSeriesName('E25')).toBeUndefined();
  });
});

describe('rounding to preferred values', () => {
  it('gives the neighbours across decades and the nearer one on a log scale', () => {
    expect(neighbours('E24', 37)).toEqual({ below: 36, above: 39, nearest: 36 });
    expect(neighbours('E24', 38)).toEqual({ below: 36, above: 39, nearest: 39 });
    expect(neighbours('E24', 95)).toEqual({ below: 91, above: 100, nearest: 91 });
    expect(neighbours('E24', 97)).toEqual({ below: 91, above: 100, nearest: 100 });
    expect(neighbours('E24', 47)).toEqual({ below: 47, above: 47, nearest: 47 });
    expect(neighbours('E96', 37)).toEqual({ below: 36.5, above: 37.4, nearest: 37.4 });
    // log scale, not linear: 9.545 is nearer 9.1 linearly but nearer 10 by ratio
    expect(neighbours('E24', 9.545).nearest).toBe(10);
    expect(neighbours('E96', 1e3)).toEqual({ below: 1000, above: 1000, nearest: 1000 });
    // capacitors: 33 pF and 4.7 nF are exact members; 1.3e-10 lies between 120 and 150 pF
    expect(neighbours('E12', 33e-12).nearest).toBeCloseTo(33e-12, 24);
    expect(neighbours('E12', 4.7e-9).below).toBeCloseTo(4.7e-9, 21);
    const n = neighbours('E12', 1.3e-10);
    expect(n.below).toBeCloseTo(1.2e-10, 22);
    expect(n.above).toBeCloseTo(1.5e-10, 22);
    expect(() => neighbours('E24', 0)).toThrow(RangeError);
  });

  it('lists members in a range and outward from a value', () => {
    expect(membersBetween('E12', 30, 120)).toEqual([33, 39, 47, 56, 68, 82, 100, 120]);
    expect(membersOutward('E24', 37, 4)).toEqual([36, 39, 33, 43]);
  });
});
