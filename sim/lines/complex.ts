// Minimal complex arithmetic on plain {re, im} objects, for the frequency-domain line models.
// Not used in any time-domain hot loop.

export interface Complex {
  re: number;
  im: number;
}

export const cx = (re: number, im = 0): Complex => ({ re, im });
export const cadd = (a: Complex, b: Complex): Complex => ({ re: a.re + b.re, im: a.im + b.im });
export const csub = (a: Complex, b: Complex): Complex => ({ re: a.re - b.re, im: a.im - b.im });
export const cmul = (a: Complex, b: Complex): Complex => ({
  re: a.re * b.re - a.im * b.im,
  im: a.re * b.im + a.im * b.re,
});
export const cscale = (a: Complex, s: number): Complex => ({ re: a.re * s, im: a.im * s });

export function cdiv(a: Complex, b: Complex): Complex {
  // Smith's algorithm: avoids overflow/underflow for widely scaled operands.
  if (Math.abs(b.re) >= Math.abs(b.im)) {
    const r = b.im / b.re;
    const d = b.re + b.im * r;
    return { re: (a.re + a.im * r) / d, im: (a.im - a.re * r) / d };
  }
  const r = b.re / b.im;
  const d = b.re * r + b.im;
  return { re: (a.re * r + a.im) / d, im: (a.im * r - a.re) / d };
}

export const cabs = (a: Complex): number => Math.hypot(a.re, a.im);
export const carg = (a: Complex): number => Math.atan2(a.im, a.re);

/** Principal square root (real part ≥ 0), computed without cancellation. */
export function csqrt(a: Complex): Complex {
  if (a.re === 0 && a.im === 0) return { re: 0, im: 0 };
  const m = Math.hypot(a.re, a.im);
  if (a.re >= 0) {
    const t = Math.sqrt(0.5 * (m + a.re));
    return { re: t, im: a.im / (2 * t) };
  }
  const t = Math.sqrt(0.5 * (m - a.re));
  return { re: Math.abs(a.im) / (2 * t), im: a.im >= 0 ? t : -t };
}

/** Principal natural logarithm. */
export const clog = (a: Complex): Complex => ({ re: Math.log(cabs(a)), im: carg(a) });
