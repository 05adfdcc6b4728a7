// Pseudo-random binary sequences from a Fibonacci linear-feedback shift register.
//
// Polynomials as in ITU-T O.150 and common test-equipment practice:
//   PRBS7  x^7 + x^6 + 1,  PRBS9  x^9 + x^5 + 1,  PRBS15  x^15 + x^14 + 1.
// The register is seeded all-ones and the bit shifted out is emitted, so a period starts with n ones
// (the seed) and then follows the recurrence b[k+n] = b[k] ⊕ b[k+n−tap] for x^n + x^tap + 1,
// e.g. b[k+7] = b[k] ⊕ b[k+1] for PRBS7. The sequence is not inverted (O.150 transmits some patterns inverted; a
// line simulation does not care, and low/high can be swapped in the scenario).

export type PrbsOrder = 7 | 9 | 15;

/** Tap (besides n) of each polynomial x^n + x^tap + 1. */
export const PRBS_TAPS: Readonly<Record<PrbsOrder, number>> = { 7: 6, 9: 5, 15: 14 };

/**
 * `length` bits (default one full period, 2^order − 1) of the PRBS of the given order, as 0/1 values.
 * Longer lengths repeat the period.
 */
export function prbs(order: PrbsOrder, length: number = 2 ** order - 1): Uint8Array {
  const tap = PRBS_TAPS[order];
  if (tap === undefined) throw new RangeError(`prbs: order must be 7, 9 or 15, not ${order}`);
  if (!Number.isInteger(length) || length < 0) throw new RangeError(`prbs: length must be a whole number ≥ 0, not ${length}`);
  const mask = (1 << order) - 1;
  const hi = order - 1;
  const lo = tap - 1;
  let state = mask; // all ones
  const out = new Uint8Array(length);
  for (let i = 0; i < length; i++) {
    out[i] = (state >> hi) & 1;
    const fb = ((state >> hi) ^ (state >> lo)) & 1;
    state = ((state << 1) | fb) & mask;
  }
  return out;
}
