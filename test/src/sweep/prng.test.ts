// The Monte Carlo generator against published reference outputs, and its distributions against
// their textbook moments.
import { describe, expect, it } from 'vitest';
import { splitMix64, Xoshiro128ss } from '../../../src/sweep/prng.js';

describe('xoshiro128**', () => {
  it('matches the reference C implementation (xoshiro128starstar.c) from a known state', () => {
    // State and outputs from the test data of edorfaus/xoshiro-6502 (test-rom/testdata.asm), generated
    // with Blackman & Vigna's reference C code: four outputs and the state after each.
    const g = new Xoshiro128ss([0x964d4a0c, 0xd40ab895, 0xad7fdecb, 0x3006f0f0]);
    const expected = [
      [0xf1391922, [0x72410269, 0xef382c52, 0x2e43bec7, 0x62432f20]],
      [0x6fe53806, [0xff3a011b, 0xb33a90fc, 0x2c5a18ae, 0xd81b946b]],
      [0xa5be2840, [0x941b058c, 0x605a8949, 0xa641e1b5, 0x0824bb59]],
      [0xf510ee70, [0xfc65379c, 0x52006d70, 0x87487639, 0xf1908343]],
    ] as const;
    for (const [out, state] of expected) {
      expect(g.nextUint32()).toBe(out);
      expect(g.state).toEqual(state);
    }
  });

  it('refuses the all-zero state', () => {
    expect(() => new Xoshiro128ss([0, 0, 0, 0])).toThrow(/all zero/);
  });
});

describe('SplitMix64 seeding', () => {
  it('gives the published first outputs for seed 0 (splitmix64.c: e220a8397b1dcdaf, 6e789e6aa1b965f4, 06c45d188009454f)', () => {
    let st = 0n;
    const outs: bigint[] = [];
    for (let k = 0; k < 3; k++) {
      const r = splitMix64(st);
      outs.push(r.value);
      st = r.state;
    }
    expect(outs).toEqual([0xe220a8397b1dcdafn, 0x6e789e6aa1b965f4n, 0x06c45d188009454fn]);
  });

  it('gives each (seed, sample) its own stream, the same every time', () => {
    const a = Xoshiro128ss.forSample(1, 0);
    const b = Xoshiro128ss.forSample(1, 0);
    const c = Xoshiro128ss.forSample(1, 1);
    const d = Xoshiro128ss.forSample(2, 0);
    const xa = [a.nextUint32(), a.nextUint32()];
    expect([b.nextUint32(), b.nextUint32()]).toEqual(xa);
    expect([c.nextUint32(), c.nextUint32()]).not.toEqual(xa);
    expect([d.nextUint32(), d.nextUint32()]).not.toEqual(xa);
  });
});

describe('distributions', () => {
  const n = 100_000;
  it('nextFloat is uniform on [0, 1): mean 1/2, variance 1/12 (within 5 standard errors)', () => {
    const g = Xoshiro128ss.forSample(123, 0);
    let s = 0;
    let s2 = 0;
    let lo = 1;
    let hi = 0;
    for (let i = 0; i < n; i++) {
      const x = g.nextFloat();
      s += x;
      s2 += x * x;
      lo = Math.min(lo, x);
      hi = Math.max(hi, x);
    }
    const mean = s / n;
    const v = s2 / n - mean * mean;
    expect(Math.abs(mean - 0.5)).toBeLessThan(5 * Math.sqrt(1 / 12 / n));
    expect(Math.abs(v - 1 / 12)).toBeLessThan(5 * Math.sqrt(1 / 180 / n)); // var of x² terms: 1/80 − 1/144 = 1/180
    expect(lo).toBeGreaterThanOrEqual(0);
    expect(hi).toBeLessThan(1);
  });

  it('nextNormal (Box–Muller) has mean 0, variance 1 and 68.3 % within ±1σ (within 5 standard errors)', () => {
    const g = Xoshiro128ss.forSample(99, 3);
    let s = 0;
    let s2 = 0;
    let within = 0;
    for (let i = 0; i < n; i++) {
      const x = g.nextNormal();
      s += x;
      s2 += x * x;
      if (Math.abs(x) <= 1) within++;
    }
    const mean = s / n;
    const v = s2 / n - mean * mean;
    expect(Math.abs(mean)).toBeLessThan(5 / Math.sqrt(n));
    expect(Math.abs(v - 1)).toBeLessThan(5 * Math.sqrt(2 / n));
    const p = 0.6826894921; // erf(1/√2)
    expect(Math.abs(within / n - p)).toBeLessThan(5 * Math.sqrt((p * (1 - p)) / n));
  });
});
