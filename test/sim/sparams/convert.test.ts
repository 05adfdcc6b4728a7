// Network conversions against textbook two-ports.
import { describe, expect, it } from 'vitest';
import { cget, cmatmul, cset, czeros, largestSingularValue, type CMatrix } from '../../../sim/sparams/cmatrix.js';
import { abcdToS, cascade, convertMatrix, sToAbcd, sToY, sToZ, yToS, zToS } from '../../../sim/sparams/convert.js';
import { renormalize, singularValueTrace, type NetworkData } from '../../../sim/sparams/network.js';

function m2(a: [number, number], b: [number, number], c: [number, number], d: [number, number]): CMatrix {
  const m = czeros(2);
  cset(m, 0, 0, ...a);
  cset(m, 0, 1, ...b);
  cset(m, 1, 0, ...c);
  cset(m, 1, 1, ...d);
  return m;
}

/** Chain matrix of a lossless line of impedance z at electrical length θ (Pozar Table 4.1). */
function lineAbcd(z: number, theta: number): CMatrix {
  return m2([Math.cos(theta), 0], [0, z * Math.sin(theta)], [0, Math.sin(theta) / z], [Math.cos(theta), 0]);
}

function maxDiff(a: CMatrix, b: CMatrix): number {
  let d = 0;
  for (let k = 0; k < a.d.length; k++) d = Math.max(d, Math.abs(a.d[k] - b.d[k]));
  return d;
}

describe('ABCD ↔ S', () => {
  it('gives S11 = 5/13 and S21 = −j·12/13 for a 75 Ω quarter-wave line in a 50 Ω system', () => {
    // Pozar, Microwave Engineering, 4th ed., Table 4.2 (ABCD → S), applied to the line of Table 4.1
    // at βℓ = π/2: A = D = 0, B = j75, C = j/75; Δ = j(75/50 + 50/75) = j·13/6.
    const s = abcdToS(lineAbcd(75, Math.PI / 2), 50);
    expect(Math.abs(cget(s, 0, 0).re - 5 / 13)).toBeLessThan(1e-9);
    expect(Math.abs(cget(s, 0, 0).im)).toBeLessThan(1e-9);
    expect(Math.abs(cget(s, 1, 0).re)).toBeLessThan(1e-9);
    expect(Math.abs(cget(s, 1, 0).im + 12 / 13)).toBeLessThan(1e-9);
    expect(Math.abs(cget(s, 0, 1).re)).toBeLessThan(1e-9); // reciprocal: S12 = S21
    expect(Math.abs(cget(s, 0, 1).im + 12 / 13)).toBeLessThan(1e-9);
    expect(Math.abs(cget(s, 1, 1).re - 5 / 13)).toBeLessThan(1e-9);
    // the same through Z: Z = [[A/C, ΔABCD/C], [1/C, D/C]] (Pozar Table 4.2), then S = (z − I)(z + I)⁻¹
    const z = m2([0, 0], [0, -75], [0, -75], [0, 0]); // A/C = 0, 1/C = 1/(j/75) = −j75
    expect(maxDiff(zToS(z, [50, 50]), s)).toBeLessThan(1e-12);
  });

  it('matches a 50 → 100 Ω quarter-wave transformer: S11 = 0, |S21| = 1 with port references 50 and 100 Ω', () => {
    // Pozar §5.4: a quarter-wave section of Z1 = √(Z0·RL) matches RL to Z0 at the design frequency.
    const s = abcdToS(lineAbcd(Math.sqrt(50 * 100), Math.PI / 2), 50, 100);
    expect(Math.hypot(cget(s, 0, 0).re, cget(s, 0, 0).im)).toBeLessThan(1e-12);
    expect(Math.hypot(cget(s, 1, 1).re, cget(s, 1, 1).im)).toBeLessThan(1e-12);
    expect(Math.hypot(cget(s, 1, 0).re, cget(s, 1, 0).im)).toBeCloseTo(1, 12);
  });

  it('gives S11 = −Z0/(2Z + Z0) and S21 = 2Z/(2Z + Z0) for a shunt impedance (Pozar Table 4.2 with A = D = 1, B = 0, C = 1/Z)', () => {
    const z = 30;
    const s = abcdToS(m2([1, 0], [0, 0], [1 / z, 0], [1, 0]), 50);
    expect(cget(s, 0, 0).re).toBeCloseTo(-50 / (2 * z + 50), 14);
    expect(cget(s, 1, 0).re).toBeCloseTo((2 * z) / (2 * z + 50), 14);
  });

  it('inverts: S → ABCD → S and ABCD → S → ABCD return the input, also with unequal references', () => {
    const lossy = cascade(lineAbcd(62, 0.7), m2([1, 0], [12, 40], [0, 0], [1, 0]), m2([1, 0], [0, 0], [0.002, 0.01], [1, 0]), lineAbcd(41, 2.1));
    for (const [r1, r2] of [
      [50, 50],
      [50, 75],
      [100, 25],
    ]) {
      const s = abcdToS(lossy, r1, r2);
      expect(maxDiff(sToAbcd(s, r1, r2), lossy)).toBeLessThan(1e-10);
      expect(maxDiff(abcdToS(sToAbcd(s, r1, r2), r1, r2), s)).toBeLessThan(1e-13);
    }
  });

  it('cascades: two eighth-wave sections equal one quarter-wave section', () => {
    const two = cascade(lineAbcd(75, Math.PI / 4), lineAbcd(75, Math.PI / 4));
    expect(maxDiff(two, lineAbcd(75, Math.PI / 2))).toBeLessThan(1e-13);
  });
});

describe('S ↔ Y ↔ Z', () => {
  it('reflects Γ = (Z − R)/(Z + R) for a one-port load (Pozar eq. 2.35)', () => {
    const z = czeros(1);
    cset(z, 0, 0, 75, 20);
    const s = zToS(z, [50]);
    const g = { re: ((75 - 50) * (75 + 50) + 20 * 20) / (125 * 125 + 400), im: (20 * 125 - 25 * 20) / (125 * 125 + 400) };
    expect(cget(s, 0, 0).re).toBeCloseTo(g.re, 14);
    expect(cget(s, 0, 0).im).toBeCloseTo(g.im, 14);
  });

  it('round-trips a 3-port through Z and Y with unequal references, and Y·Z = I', () => {
    const s = czeros(3);
    const vals = [0.1, 0.2, 0.5, -0.1, 0.3, 0.05, 0.5, -0.1, -0.2, 0.15, 0.1, 0.3, 0.3, 0.05, 0.1, 0.3, 0.25, -0.4];
    for (let k = 0; k < 18; k++) s.d[k] = vals[k];
    const ref = [50, 75, 28];
    const z = sToZ(s, ref);
    const y = sToY(s, ref);
    expect(maxDiff(zToS(z, ref), s)).toBeLessThan(1e-13);
    expect(maxDiff(yToS(y, ref), s)).toBeLessThan(1e-13);
    const prod = cmatmul(y, z);
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expect(Math.hypot(cget(prod, i, j).re - (i === j ? 1 : 0), cget(prod, i, j).im)).toBeLessThan(1e-12);
    expect(maxDiff(convertMatrix(z, 'Z', 'Y', ref), y)).toBeLessThan(1e-12);
  });

  it('refuses the Z-matrix of an ideal through (S = [[0, 1], [1, 0]], I − S singular) with a message', () => {
    expect(() => sToZ(m2([0, 0], [1, 0], [1, 0], [0, 0]), [50, 50])).toThrow(/no Z-matrix/);
  });
});

describe('renormalize and singular values', () => {
  it('moves a 75 Ω load from Γ = 0.2 in 50 Ω to Γ = 0 in 75 Ω', () => {
    const net: NetworkData = { ports: 1, freq: Float64Array.of(1e9), kind: 'S', data: Float64Array.of(0.2, 0), reference: Float64Array.of(50) };
    const r = renormalize(net, [75]);
    expect(Math.hypot(r.data[0], r.data[1])).toBeLessThan(1e-15);
  });

  it('is 1 for a lossless line (S unitary, Pozar §4.3) and the largest |entry| of a diagonal matrix', () => {
    const s = abcdToS(lineAbcd(75, 1.1), 50);
    expect(largestSingularValue(s)).toBeCloseTo(1, 13);
    const d = czeros(3);
    cset(d, 0, 0, 0.5, 0);
    cset(d, 1, 1, 0, -2);
    cset(d, 2, 2, 0.6, 0.8);
    expect(largestSingularValue(d)).toBeCloseTo(2, 12);
    // a unitary 3×3 (a permutation times phases) has every singular value 1
    const p = czeros(3);
    cset(p, 0, 1, 0, 1);
    cset(p, 1, 2, -1, 0);
    cset(p, 2, 0, Math.SQRT1_2, Math.SQRT1_2);
    expect(largestSingularValue(p)).toBeCloseTo(1, 12);
    const net: NetworkData = { ports: 2, freq: Float64Array.of(1e9), kind: 'S', data: s.d, reference: Float64Array.of(50, 50) };
    expect(singularValueTrace(net)[0]).toBeCloseTo(1, 13);
  });
});
