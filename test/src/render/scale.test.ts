import { describe, expect, it } from 'vitest';
import { extent, linearScale, padDomain } from '../../../src/render/scale.js';

describe('linearScale', () => {
  it('maps the domain ends onto the range ends and interpolates linearly', () => {
    const s = linearScale([0, 30e-9], [100, 1100]);
    expect(s.map(0)).toBe(100);
    expect(s.map(30e-9)).toBeCloseTo(1100, 9);
    expect(s.map(15e-9)).toBeCloseTo(600, 9);
    expect(s.map(45e-9)).toBeCloseTo(1600, 9); // not clamped
  });
  it('handles a flipped pixel range (y axis: bottom row first)', () => {
    const s = linearScale([-1, 3], [600, 40]);
    expect(s.map(-1)).toBe(600);
    expect(s.map(3)).toBe(40);
    expect(s.map(1)).toBe(320);
  });
  it('invert undoes map', () => {
    const s = linearScale([-2.5, 7.25], [13, 977]);
    for (const v of [-2.5, 0, 1.234, 7.25, 100]) expect(s.invert(s.map(v))).toBeCloseTo(v, 10);
  });
  it('widens a zero-width domain rather than dividing by zero', () => {
    const s = linearScale([3.3, 3.3], [0, 100]);
    expect(s.map(3.3)).toBeCloseTo(50, 9);
    const z = linearScale([0, 0], [0, 100]);
    expect(z.domain).toEqual([-1, 1]);
  });
  it('rejects non-finite bounds', () => {
    expect(() => linearScale([0, Infinity], [0, 1])).toThrow(RangeError);
    expect(() => linearScale([0, 1], [NaN, 1])).toThrow(RangeError);
  });
});

describe('extent', () => {
  it('spans several arrays and skips NaN and infinities', () => {
    expect(extent([new Float64Array([1, NaN, -2]), [5, Infinity, -Infinity]])).toEqual([-2, 5]);
  });
  it('is null without finite values', () => {
    expect(extent([[NaN], []])).toBeNull();
  });
});

describe('padDomain', () => {
  it('adds a fraction of the span on each side', () => {
    const [a, b] = padDomain(0, 10, 0.05);
    expect(a).toBeCloseTo(-0.5, 12);
    expect(b).toBeCloseTo(10.5, 12);
  });
  it('opens a flat range around its value', () => {
    const [a, b] = padDomain(3.3, 3.3);
    expect(a).toBeCloseTo(2.97, 12);
    expect(b).toBeCloseTo(3.63, 12);
    // noise far below the value's precision counts as flat too
    const [c, d] = padDomain(3.3, 3.3 + 1e-12);
    expect(d - c).toBeGreaterThan(0.6);
    expect(padDomain(0, 0)).toEqual([-1, 1]);
  });
});
