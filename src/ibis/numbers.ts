// Numbers in the open I/O buffer model standard's files (ANSI/EIA-656, IBIS ver. 5.0+, "General syntax
// rules"): a decimal or exponential number, optionally followed by one scaling suffix — T (1e12), G (1e9),
// M (1e6, mega: not milli), k (1e3), m (1e-3), u (1e-6), n (1e-9), p (1e-12), f (1e-15) — and then any
// letters, which the standard ignores ("2.5pF" is 2.5e-12, "50ohm" is 50). "NA" means not available.

const SUFFIX: Readonly<Record<string, number>> = { T: 1e12, G: 1e9, M: 1e6, k: 1e3, m: 1e-3, u: 1e-6, n: 1e-9, p: 1e-12, f: 1e-15 };

/** Unit letters that follow a number harmlessly (after an optional suffix). */
const UNITS = /^(v|a|f|h|s|ohms?|w|hz|sec)?$/i;

export type IbisNumber = { ok: true; value: number; note?: string } | { ok: true; value: undefined } | { ok: false };

const NUMBER = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)([A-Za-z]*)$/;

/**
 * Parses one token. `value` is undefined for NA. `note` warns when the letters after the number are
 * neither a scaling suffix nor a unit (e.g. "10K", where K is not a suffix: the value is 10).
 */
export function parseIbisNumber(token: string): IbisNumber {
  if (/^na$/i.test(token)) return { ok: true, value: undefined };
  const m = NUMBER.exec(token);
  if (!m) return { ok: false };
  const base = Number(m[1]);
  if (!Number.isFinite(base)) return { ok: false };
  const letters = m[2];
  if (letters === '') return { ok: true, value: base };
  const scale = SUFFIX[letters[0]];
  // "1F" or "2A": a unit letter that is not a suffix. "1f" is femto; "1m" milli; "1M" mega.
  if (scale !== undefined) {
    const rest = letters.slice(1);
    const note = UNITS.test(rest) ? undefined : `"${token}": the letters after "${m[1]}${letters[0]}" are not a unit the standard uses; they were ignored`;
    return note ? { ok: true, value: base * scale, note } : { ok: true, value: base * scale };
  }
  if (UNITS.test(letters)) return { ok: true, value: base };
  return { ok: true, value: base, note: `"${token}": "${letters[0]}" is not one of the standard's scaling suffixes (T G M k m u n p f); the number was read as ${base}` };
}
