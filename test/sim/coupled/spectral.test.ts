import { describe, expect, it } from 'vitest';
import { ceig, cidentity, cmatmul, csolve, czeros, type CMatrix } from '../../../sim/coupled/cmatrix.js';
import type { CoupledLine } from '../../../sim/coupled/line.js';
import { fromRows, identity, solveMatrix } from '../../../sim/coupled/matrix.js';
import { coupledAdmittance, coupledPerLength } from '../../../sim/coupled/spectral.js';
import { cadd, cdiv, cmul, cscale, csqrt, cx, type Complex } from '../../../sim/lines/complex.js';

const entry = (m: CMatrix, n: number, r: number, c: number): Complex => ({ re: m.re[r * n + c], im: m.im[r * n + c] });

function expectClose(a: Complex, b: Complex, rel: number, scale = Math.hypot(b.re, b.im)): void {
  expect(Math.hypot(a.re - b.re, a.im - b.im)).toBeLessThanOrEqual(rel * scale);
}

/** Two-port admittance of one line: y11 = coth(γℓ)/Z0, y12 = −csch(γℓ)/Z0 (Pozar, Microwave Engineering, ch. 2 and 4). */
function lineTwoPort(z: Complex, y: Complex, length: number): { y11: Complex; y12: Complex } {
  const gamma = csqrt(cmul(z, y));
  const z0 = csqrt(cdiv(z, y));
  const u = cscale(gamma, length);
  const e = { re: Math.exp(-u.re) * Math.cos(-u.im), im: Math.exp(-u.re) * Math.sin(-u.im) };
  const e2 = cmul(e, e);
  const den = { re: 1 - e2.re, im: -e2.im };
  const coth = cdiv(cadd(cx(1), e2), den);
  const csch = cdiv(cscale(e, 2), den);
  return { y11: cdiv(coth, z0), y12: cscale(cdiv(csch, z0), -1) };
}

describe('modal 2k-port admittance', () => {
  // Symmetric lossy pair: the even and odd modes are exact modes, each a single line with
  // Z′ = (R11 ± R12) + s(L11 ± L12), Y′ = (G11 ± G12) + s(C11 ± C12). Driving (V, V) at the near end
  // gives I1 = I2 = y_e·V, driving (V, −V) gives I1 = −I2 = y_o·V, so per end the conductor-to-conductor
  // entries are (y_e + y_o)/2 (same conductor) and (y_e − y_o)/2 (the other), for y11 and y12 alike
  // (Paul, MTL; Pozar, Microwave Engineering, coupled lines).
  const line: CoupledLine = {
    k: 2,
    l: fromRows([[300e-9, 45e-9], [45e-9, 300e-9]]),
    c: fromRows([[120e-12, -12e-12], [-12e-12, 120e-12]]),
    r: fromRows([[12, 2], [2, 12]]),
    g: fromRows([[4e-3, -5e-4], [-5e-4, 4e-3]]),
  };
  for (const [sigma, f] of [[0, 50e6], [3e8, 1.3e9], [0, 7.7e9]]) {
    it(`symmetric lossy pair equals its odd and even lines (s = ${sigma} + j2π·${f / 1e9} GHz)`, () => {
      const s = { re: sigma, im: 2 * Math.PI * f };
      const length = 0.137;
      const { z, y } = coupledPerLength(line, s);
      const yy = coupledAdmittance(z, y, 2, length);
      const mode = (sign: number) => lineTwoPort(cadd(entry(z, 2, 0, 0), cscale(entry(z, 2, 0, 1), sign)), cadd(entry(y, 2, 0, 0), cscale(entry(y, 2, 0, 1), sign)), length);
      const e = mode(1);
      const o = mode(-1);
      const half = (a: Complex, b: Complex, sign: number) => cscale(cadd(a, cscale(b, sign)), 0.5);
      const scale = Math.hypot(e.y11.re, e.y11.im) + Math.hypot(o.y11.re, o.y11.im);
      for (const [r, c, want] of [
        [0, 0, half(e.y11, o.y11, 1)],
        [0, 1, half(e.y11, o.y11, -1)],
        [1, 1, half(e.y11, o.y11, 1)],
        [0, 2, half(e.y12, o.y12, 1)],
        [0, 3, half(e.y12, o.y12, -1)],
        [3, 0, half(e.y12, o.y12, -1)],
        [2, 2, half(e.y11, o.y11, 1)],
        [3, 2, half(e.y11, o.y11, -1)],
      ] as const) {
        expectClose(entry(yy, 4, r, c), want, 1e-10, scale);
      }
    });
  }

  // Homogeneous lossless three-conductor line: Z′Y′ = s²·L·C = (s/v)²·1, all modes degenerate, so any
  // basis is a modal basis and Y_s = Z_C⁻¹·coth(sℓ/v), Y_m = −Z_C⁻¹·csch(sℓ/v) with Z_C = v·L (Paul).
  it('degenerate modes (homogeneous, three conductors): Y_s = Z_C⁻¹·coth, Y_m = −Z_C⁻¹·csch', () => {
    const c = fromRows([[110e-12, -15e-12, -3e-12], [-15e-12, 120e-12, -14e-12], [-3e-12, -14e-12, 105e-12]]);
    const v = 1.8e8;
    const l = solveMatrix(c, identity(3), 3, 3).map((x) => x / (v * v));
    const s = { re: 2e8, im: 2 * Math.PI * 2.2e9 };
    const length = 0.21;
    const { z, y } = coupledPerLength({ k: 3, l, c }, s);
    const yy = coupledAdmittance(z, y, 3, length);
    const yc = solveMatrix(l.map((x) => x * v), identity(3), 3, 3); // Z_C⁻¹
    const u = cscale(s, length / v);
    const e = { re: Math.exp(-u.re) * Math.cos(-u.im), im: Math.exp(-u.re) * Math.sin(-u.im) };
    const e2 = cmul(e, e);
    const den = { re: 1 - e2.re, im: -e2.im };
    const coth = cdiv(cadd(cx(1), e2), den);
    const csch = cdiv(cscale(e, 2), den);
    const scale = Math.max(...yc.map(Math.abs)) * Math.hypot(coth.re, coth.im);
    for (let i = 0; i < 3; i++)
      for (let j = 0; j < 3; j++) {
        expectClose(entry(yy, 6, i, j), cscale(coth, yc[i * 3 + j]), 1e-10, scale);
        expectClose(entry(yy, 6, i, j + 3), cscale(csch, -yc[i * 3 + j]), 1e-10, scale);
      }
  });

  // Independent check for a general lossy three-conductor line: the chain matrix
  // Φ = exp(ℓ·[[0, −Z′], [−Y′, 0]]) maps [V; I] at z = 0 to z = ℓ (Paul, the chain-parameter matrix),
  // computed here by scaling and squaring of the Taylor series, then I(0) = Φ12⁻¹·(V(ℓ) − Φ11·V(0)).
  it('three lossy inhomogeneous conductors agree with the chain-matrix exponential', () => {
    const line: CoupledLine = {
      k: 3,
      l: fromRows([[320e-9, 60e-9, 20e-9], [60e-9, 300e-9, 55e-9], [20e-9, 55e-9, 330e-9]]),
      c: fromRows([[110e-12, -15e-12, -3e-12], [-15e-12, 120e-12, -14e-12], [-3e-12, -14e-12, 105e-12]]),
      r: fromRows([[9, 1, 0.5], [1, 7, 1], [0.5, 1, 11]]),
      g: fromRows([[3e-3, -4e-4, 0], [-4e-4, 2e-3, -3e-4], [0, -3e-4, 2.5e-3]]),
    };
    const length = 0.12;
    for (const f of [80e6, 900e6, 3.1e9]) {
      const s = { re: 1e8, im: 2 * Math.PI * f };
      const { z, y } = coupledPerLength(line, s);
      const yy = coupledAdmittance(z, y, 3, length);
      const want = chainAdmittance(z, y, 3, length);
      let scale = 0;
      for (let e = 0; e < 36; e++) scale = Math.max(scale, Math.hypot(want.re[e], want.im[e]));
      for (let e = 0; e < 36; e++) expectClose({ re: yy.re[e], im: yy.im[e] }, { re: want.re[e], im: want.im[e] }, 1e-8, scale);
    }
  });

  // At s = 0 with G = 0 the section is a resistor network: Z′Y′ = 0, γ·coth γℓ → 1/ℓ and γ·csch γℓ → 1/ℓ,
  // so Y_s = (R·ℓ)⁻¹ = −Y_m (Ohm's law for the matrix of series resistances R·ℓ).
  it('at DC a resistive section is (R·ℓ)⁻¹ between its ends', () => {
    const r = fromRows([[9, 1, 0.5], [1, 7, 1], [0.5, 1, 11]]);
    const line: CoupledLine = { k: 3, l: identity(3).map((x) => x * 3e-7), c: identity(3).map((x) => x * 1e-10), r };
    const length = 0.4;
    const { z, y } = coupledPerLength(line, { re: 0, im: 0 });
    const yy = coupledAdmittance(z, y, 3, length);
    const want = solveMatrix(r.map((x) => x * length), identity(3), 3, 3);
    for (let i = 0; i < 3; i++)
      for (let j = 0; j < 3; j++) {
        expectClose(entry(yy, 6, i, j), { re: want[i * 3 + j], im: 0 }, 1e-12, 1);
        expectClose(entry(yy, 6, i + 3, j), { re: -want[i * 3 + j], im: 0 }, 1e-12, 1);
      }
  });

  it('the eigen-solver reproduces a known non-normal matrix', () => {
    // A = V·diag(1 + 2j, −3, 0.5j)·V⁻¹ with a non-unitary V: the eigenvalues come back, A·x = λ·x for each vector.
    const k = 3;
    const v: CMatrix = { re: Float64Array.from([1, 2, 0, 0, 1, 1, 1, 0, 3]), im: Float64Array.from([0, 1, 0, 0.5, 0, 0, 0, 0, 1]) };
    const d = czeros(9);
    [[1, 2], [-3, 0], [0, 0.5]].forEach(([re, im], i) => {
      d.re[i * 4] = re;
      d.im[i * 4] = im;
    });
    const a = cmatmul(cmatmul(v, d, k), csolve(v, cidentity(k), k, k), k);
    const { values, vectors } = ceig(a, k);
    const got = [0, 1, 2].map((i) => [values.re[i], values.im[i]]).sort((p, q) => p[0] - q[0] || p[1] - q[1]);
    expect(got.flat()).toEqual([-3, 0, 0, 0.5, 1, 2].map((x) => expect.closeTo(x, 10)));
    const ax = cmatmul(a, vectors, k);
    for (let j = 0; j < k; j++)
      for (let i = 0; i < k; i++) {
        const lx = cmul({ re: values.re[j], im: values.im[j] }, entry(vectors, k, i, j));
        expectClose(entry(ax, k, i, j), lx, 1e-12, 4);
      }
  });
});

/** 2k-port admittance from the chain matrix exp(ℓ·[[0, −Z′], [−Y′, 0]]) (scaling and squaring, Taylor to 30 terms). */
function chainAdmittance(z: CMatrix, y: CMatrix, k: number, length: number): CMatrix {
  const n = 2 * k;
  const a = czeros(n * n);
  for (let i = 0; i < k; i++)
    for (let j = 0; j < k; j++) {
      a.re[i * n + k + j] = -z.re[i * k + j] * length;
      a.im[i * n + k + j] = -z.im[i * k + j] * length;
      a.re[(k + i) * n + j] = -y.re[i * k + j] * length;
      a.im[(k + i) * n + j] = -y.im[i * k + j] * length;
    }
  let norm = 0;
  for (let e = 0; e < n * n; e++) norm = Math.max(norm, Math.hypot(a.re[e], a.im[e]) * n);
  const squarings = Math.max(0, Math.ceil(Math.log2(norm)) + 4);
  const scale = 2 ** -squarings;
  for (let e = 0; e < n * n; e++) {
    a.re[e] *= scale;
    a.im[e] *= scale;
  }
  let phi = cidentity(n);
  let term = cidentity(n);
  for (let p = 1; p <= 30; p++) {
    term = cmatmul(term, a, n);
    for (let e = 0; e < n * n; e++) {
      term.re[e] /= p;
      term.im[e] /= p;
      phi.re[e] += term.re[e];
      phi.im[e] += term.im[e];
    }
  }
  for (let q = 0; q < squarings; q++) phi = cmatmul(phi, phi, n);
  const block = (r0: number, c0: number): CMatrix => {
    const b = czeros(k * k);
    for (let i = 0; i < k; i++)
      for (let j = 0; j < k; j++) {
        b.re[i * k + j] = phi.re[(r0 + i) * n + c0 + j];
        b.im[i * k + j] = phi.im[(r0 + i) * n + c0 + j];
      }
    return b;
  };
  const [p11, p12, p21, p22] = [block(0, 0), block(0, k), block(k, 0), block(k, k)];
  const p12inv = csolve(p12, cidentity(k), k, k);
  const y11 = cmatmul(p12inv, p11, k).re.map((x) => -x);
  const y11i = cmatmul(p12inv, p11, k).im.map((x) => -x);
  const y11m: CMatrix = { re: y11, im: y11i };
  const y21 = cmatmul(p22, y11m, k);
  const out = czeros(n * n);
  const put = (m: CMatrix, r0: number, c0: number, sign: number) => {
    for (let i = 0; i < k; i++)
      for (let j = 0; j < k; j++) {
        out.re[(r0 + i) * n + c0 + j] = sign * m.re[i * k + j];
        out.im[(r0 + i) * n + c0 + j] = sign * m.im[i * k + j];
      }
  };
  put(y11m, 0, 0, 1);
  put(p12inv, 0, k, 1);
  // I2 = −I(ℓ) = −(Φ21·V0 + Φ22·I0) = −(Φ21 + Φ22·Y11)·V0 − Φ22·Φ12⁻¹·V(ℓ)
  const y21full: CMatrix = { re: p21.re.map((x, e) => -(x + y21.re[e])), im: p21.im.map((x, e) => -(x + y21.im[e])) };
  put(y21full, k, 0, 1);
  put(cmatmul(p22, p12inv, k), k, k, -1);
  return out;
}
