import { describe, expect, it } from 'vitest';
import { prbs, PRBS_TAPS, type PrbsOrder } from '../../sim/prbs.js';

const ORDERS: PrbsOrder[] = [7, 9, 15];

describe('prbs', () => {
  it.each(ORDERS)('PRBS%i: one full period 2^n − 1 by default, then it repeats', (n) => {
    const period = 2 ** n - 1;
    const one = prbs(n);
    expect(one.length).toBe(period);
    const two = prbs(n, 2 * period + 5);
    let mismatches = 0;
    for (let i = 0; i < two.length; i++) if (two[i] !== one[i % period]) mismatches++;
    expect(mismatches).toBe(0);
  });

  it.each(ORDERS)('PRBS%i: maximal length — every nonzero n-bit window appears exactly once per period', (n) => {
    const period = 2 ** n - 1;
    const bits = prbs(n, period + n - 1); // windows wrap around the period
    const seen = new Uint8Array(2 ** n);
    let w = 0;
    for (let i = 0; i < n - 1; i++) w = (w << 1) | bits[i];
    for (let i = n - 1; i < bits.length; i++) {
      w = ((w << 1) | bits[i]) & (2 ** n - 1);
      seen[w]++;
    }
    expect(seen[0]).toBe(0);
    expect(seen.subarray(1).every((c) => c === 1)).toBe(true);
  });

  it.each(ORDERS)('PRBS%i: balance — 2^(n−1) ones and 2^(n−1) − 1 zeros per period', (n) => {
    const bits = prbs(n);
    const ones = bits.reduce((a, b) => a + b, 0);
    expect(ones).toBe(2 ** (n - 1));
    expect(bits.length - ones).toBe(2 ** (n - 1) - 1);
  });

  it.each(ORDERS)('PRBS%i: seeded all ones (the period starts with n ones) and holds only 0/1', (n) => {
    const bits = prbs(n);
    expect(Array.from(bits.subarray(0, n))).toEqual(new Array(n).fill(1));
    expect(bits[n]).toBe(0);
    expect(bits.every((b) => b === 0 || b === 1)).toBe(true);
  });

  it.each(ORDERS)('PRBS%i follows the recurrence of x^n + x^tap + 1: b[k+n] = b[k] xor b[k+n−tap]', (n) => {
    const tap = PRBS_TAPS[n];
    const bits = prbs(n, 3 * n + 200);
    let bad = 0;
    for (let k = 0; k + n < bits.length; k++) if (bits[k + n] !== (bits[k] ^ bits[k + n - tap])) bad++;
    expect(bad).toBe(0);
  });

  it('PRBS7 matches the published m-sequence of x^7 + x^6 + 1 (OEIS A011686, "expansion of reciprocal of x^7 + x^6 + 1")', () => {
    // A011686 starts from the state 0000001; our all-ones seed reaches that state after the seed's
    // seven ones, so our bits from index 7 on are A011686 from its start (first 102 terms quoted).
    const a011686 = [
      0, 0, 0, 0, 0, 0, 1, 0, 0, 0, 0, 0, 1, 1, 0, 0, 0, 0, 1, 0, 1, 0, 0, 0, 1, 1, 1, 1, 0, 0, 1, 0, 0, 0, 1, 0, 1, 1, 0, 0, 1, 1, 1, 0, 1,
      0, 1, 0, 0, 1, 1, 1, 1, 1, 0, 1, 0, 0, 0, 0, 1, 1, 1, 0, 0, 0, 1, 0, 0, 1, 0, 0, 1, 1, 0, 1, 1, 0, 1, 0, 1, 1, 0, 1, 1, 1, 1, 0, 1, 1,
      0, 0, 0, 1, 1, 0, 1, 0, 0, 1, 0, 1,
    ];
    expect(a011686.length).toBe(102);
    expect(Array.from(prbs(7).subarray(7, 7 + 102))).toEqual(a011686);
  });

  it('rejects bad orders and lengths', () => {
    expect(() => prbs(8 as PrbsOrder)).toThrow(RangeError);
    expect(() => prbs(7, -1)).toThrow(RangeError);
    expect(() => prbs(7, 1.5)).toThrow(RangeError);
    expect(prbs(9, 0).length).toBe(0);
  });
});
