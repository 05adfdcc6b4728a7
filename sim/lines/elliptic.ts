// Complete elliptic integral of the first kind by the arithmetic–geometric mean.
// K(k) = π / (2·AGM(1, k')), k' = √(1 − k²)   (Abramowitz & Stegun, *Handbook of Mathematical
// Functions*, 17.6; modulus convention k, not parameter m = k²).

/** Arithmetic–geometric mean of two non-negative numbers (quadratic convergence). */
export function agm(a: number, b: number): number {
  if (!(a >= 0 && b >= 0)) throw new RangeError(`agm: arguments must be non-negative (got ${a}, ${b})`);
  if (a === 0 || b === 0) return 0;
  for (let i = 0; i < 64; i++) {
    const an = 0.5 * (a + b);
    const bn = Math.sqrt(a * b);
    if (Math.abs(an - bn) <= 1e-16 * an) return an;
    a = an;
    b = bn;
  }
  return a;
}

/** K(k) for modulus 0 ≤ k ≤ 1 (K(1) = ∞). */
export function ellipticK(k: number): number {
  if (!(k >= 0 && k <= 1)) throw new RangeError(`ellipticK: modulus must be in [0, 1] (got ${k})`);
  return Math.PI / (2 * agm(1, Math.sqrt((1 - k) * (1 + k))));
}

/** K given the complementary modulus k' directly — accurate when k is very close to 1. */
export function ellipticKFromComplement(kp: number): number {
  if (!(kp >= 0 && kp <= 1)) throw new RangeError(`ellipticKFromComplement: k' must be in [0, 1] (got ${kp})`);
  return Math.PI / (2 * agm(1, kp));
}

/**
 * The ratio K(k)/K(k') given both moduli (k² + k'² = 1). Passing both avoids the cancellation of
 * √(1 − k²) when one of them is tiny: K(k)/K(k') = AGM(1, k) / AGM(1, k').
 */
export function ellipticKRatio(k: number, kp: number): number {
  return agm(1, k) / agm(1, kp);
}
