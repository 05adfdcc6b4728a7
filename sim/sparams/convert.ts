// Conversions between the network descriptions of an N-port: S (scattering), Y (admittance),
// Z (impedance) and, for two-ports, ABCD (chain). S is normalized to a real reference resistance per
// port, r_i; Y is in siemens and Z in ohms.
//
// With R = diag(r_i) and the normalized matrices z = R^{-1/2}·Z·R^{-1/2}, y = R^{1/2}·Y·R^{1/2}:
//   S = (z − I)(z + I)^{-1},  z = (I + S)(I − S)^{-1}
//   S = (I − y)(I + y)^{-1},  y = (I − S)(I + S)^{-1}
// (Pozar, Microwave Engineering, 4th ed., §4.3, eqs. 4.44–4.45, written per port with real
// reference resistances; the power-wave definition of Kurokawa, IEEE Trans. MTT 13(2), 1965, which
// for real references is the same.) The two factors commute, so the order of product and inverse
// does not matter.
//
// ABCD ↔ S for a two-port with reference resistances r1 (port 1) and r2 (port 2) (Pozar Table 4.2
// for r1 = r2 = Z0; D. A. Frickey, "Conversions between S, Z, Y, h, ABCD, and T parameters which are
// valid for complex source and load impedances", IEEE Trans. MTT 42(2), 1994, Table I, for r1 ≠ r2):
//   Δ   = A·r2 + B + C·r1·r2 + D·r1
//   S11 = (A·r2 + B − C·r1·r2 − D·r1)/Δ      S12 = 2(AD − BC)·√(r1·r2)/Δ
//   S21 = 2√(r1·r2)/Δ                        S22 = (−A·r2 + B − C·r1·r2 + D·r1)/Δ
// and back, with K = 2·S21·√(r1·r2):
//   A = r1·((1 + S11)(1 − S22) + S12·S21)/K   B = r1·r2·((1 + S11)(1 + S22) − S12·S21)/K
//   C = ((1 − S11)(1 − S22) − S12·S21)/K      D = r2·((1 − S11)(1 + S22) + S12·S21)/K
import { caddScaled, cget, cidentity, cinvert, cmatmul, cscaleRowsCols, cset, czeros, type CMatrix } from './cmatrix.js';

export type ParamKind = 'S' | 'Y' | 'Z';

/** Thrown when a matrix has no counterpart in the other description (for example Z of an open-circuit-free through). */
export class ConversionError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ConversionError';
  }
}

function invertOrThrow(m: CMatrix, what: string): CMatrix {
  const inv = cinvert(m);
  if (!inv) throw new ConversionError(what);
  return inv;
}

const sqrtAll = (r: ArrayLike<number>) => Array.from(r, (x) => Math.sqrt(x));
const invSqrtAll = (r: ArrayLike<number>) => Array.from(r, (x) => 1 / Math.sqrt(x));

/** S from Z (ohm) with reference resistances `ref` (one per port). */
export function zToS(z: CMatrix, ref: ArrayLike<number>): CMatrix {
  const zn = cscaleRowsCols(z, invSqrtAll(ref), invSqrtAll(ref));
  const i = cidentity(z.n);
  return cmatmul(caddScaled(zn, i, -1), invertOrThrow(caddScaled(zn, i, 1), 'z + I is singular: the Z-matrix has no S-matrix at this frequency'));
}

/** Z (ohm) from S. */
export function sToZ(s: CMatrix, ref: ArrayLike<number>): CMatrix {
  const i = cidentity(s.n);
  const zn = cmatmul(caddScaled(i, s, 1), invertOrThrow(caddScaled(i, s, -1), 'I − S is singular: the network has no Z-matrix at this frequency (an ideal through or open?)'));
  return cscaleRowsCols(zn, sqrtAll(ref), sqrtAll(ref));
}

/** S from Y (siemens). */
export function yToS(y: CMatrix, ref: ArrayLike<number>): CMatrix {
  const yn = cscaleRowsCols(y, sqrtAll(ref), sqrtAll(ref));
  const i = cidentity(y.n);
  return cmatmul(caddScaled(i, yn, -1), invertOrThrow(caddScaled(i, yn, 1), 'I + y is singular: the Y-matrix has no S-matrix at this frequency'));
}

/** Y (siemens) from S. */
export function sToY(s: CMatrix, ref: ArrayLike<number>): CMatrix {
  const i = cidentity(s.n);
  const yn = cmatmul(caddScaled(i, s, -1), invertOrThrow(caddScaled(i, s, 1), 'I + S is singular: the network has no Y-matrix at this frequency (an ideal through or short?)'));
  return cscaleRowsCols(yn, invSqrtAll(ref), invSqrtAll(ref));
}

/** Converts one matrix between S, Y and Z. */
export function convertMatrix(m: CMatrix, from: ParamKind, to: ParamKind, ref: ArrayLike<number>): CMatrix {
  if (from === to) return m;
  const s = from === 'S' ? m : from === 'Z' ? zToS(m, ref) : yToS(m, ref);
  return to === 'S' ? s : to === 'Z' ? sToZ(s, ref) : sToY(s, ref);
}

/** S of a two-port from its chain matrix [[A, B], [C, D]], reference resistances r1 and r2. */
export function abcdToS(abcd: CMatrix, r1: number, r2 = r1): CMatrix {
  const a = cget(abcd, 0, 0);
  const b = cget(abcd, 0, 1);
  const c = cget(abcd, 1, 0);
  const d = cget(abcd, 1, 1);
  const rr = r1 * r2;
  const q = Math.sqrt(rr);
  const den = { re: a.re * r2 + b.re + c.re * rr + d.re * r1, im: a.im * r2 + b.im + c.im * rr + d.im * r1 };
  const det = { re: a.re * d.re - a.im * d.im - (b.re * c.re - b.im * c.im), im: a.re * d.im + a.im * d.re - (b.re * c.im + b.im * c.re) };
  const out = czeros(2);
  const put = (i: number, j: number, re: number, im: number) => {
    const dd = den.re * den.re + den.im * den.im;
    cset(out, i, j, (re * den.re + im * den.im) / dd, (im * den.re - re * den.im) / dd);
  };
  put(0, 0, a.re * r2 + b.re - c.re * rr - d.re * r1, a.im * r2 + b.im - c.im * rr - d.im * r1);
  put(0, 1, 2 * q * det.re, 2 * q * det.im);
  put(1, 0, 2 * q, 0);
  put(1, 1, -a.re * r2 + b.re - c.re * rr + d.re * r1, -a.im * r2 + b.im - c.im * rr + d.im * r1);
  return out;
}

/** Chain matrix [[A, B], [C, D]] of a two-port from its S-matrix (S21 ≠ 0). */
export function sToAbcd(s: CMatrix, r1: number, r2 = r1): CMatrix {
  const s11 = cget(s, 0, 0);
  const s12 = cget(s, 0, 1);
  const s21 = cget(s, 1, 0);
  const s22 = cget(s, 1, 1);
  if (s21.re === 0 && s21.im === 0) throw new ConversionError('S21 = 0: a two-port that passes nothing has no chain matrix');
  const mul = (x: { re: number; im: number }, y: { re: number; im: number }) => ({ re: x.re * y.re - x.im * y.im, im: x.re * y.im + x.im * y.re });
  const p = mul(s12, s21);
  const onePlus = (x: { re: number; im: number }) => ({ re: 1 + x.re, im: x.im });
  const oneMinus = (x: { re: number; im: number }) => ({ re: 1 - x.re, im: -x.im });
  const q = Math.sqrt(r1 * r2);
  const k = { re: 2 * q * s21.re, im: 2 * q * s21.im };
  const kd = k.re * k.re + k.im * k.im;
  const out = czeros(2);
  const put = (i: number, j: number, f: number, x: { re: number; im: number }) =>
    cset(out, i, j, (f * (x.re * k.re + x.im * k.im)) / kd, (f * (x.im * k.re - x.re * k.im)) / kd);
  const sum = (x: { re: number; im: number }, y: { re: number; im: number }, sign: number) => ({ re: x.re + sign * y.re, im: x.im + sign * y.im });
  put(0, 0, r1, sum(mul(onePlus(s11), oneMinus(s22)), p, 1));
  put(0, 1, r1 * r2, sum(mul(onePlus(s11), onePlus(s22)), p, -1));
  put(1, 0, 1, sum(mul(oneMinus(s11), oneMinus(s22)), p, -1));
  put(1, 1, r2, sum(mul(oneMinus(s11), onePlus(s22)), p, 1));
  return out;
}

/** Product of chain matrices (a cascade, first item first). */
export function cascade(...abcd: CMatrix[]): CMatrix {
  return abcd.reduce((acc, m) => cmatmul(acc, m), cidentity(2));
}
