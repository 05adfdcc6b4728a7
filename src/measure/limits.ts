// Check limits: the parsed form (`CheckLimit`) and a parser for the strings scenarios use
// ("10%", "0.2V", "200mV", "5ns", "3"). Volts and seconds are read by the project's units module
// (src/units.ts), so a limit accepts exactly the spellings a scenario quantity does.
import { dimensionsOfUnit, parseQuantity } from '../units.js';

/** What a limit's number means. */
export type LimitUnit = 'V' | 's' | '%' | 'count';

/**
 * A parsed limit. `value` is in SI base units (volts, seconds), a percentage (10 means 10 %) when
 * `unit` is '%', or a plain number when `unit` is 'count' (e.g. a number of crossings).
 */
export interface CheckLimit {
  value: number;
  unit: LimitUnit;
  /** The text the limit came from, for messages (optional). */
  text?: string;
}

const NUMBER_UNIT_RE = /^\s*([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*?)\s*$/s;

export class CheckLimitError extends Error {}

const EXPECTED =
  'expected a percentage of the swing ("10%"), a voltage ("0.2V", "200mV"), a time ("5ns", "1.2e-9s") or a plain count ("1")';

/**
 * Parse "10%", "0.2V", "200mV", "5ns", "1.2e-9s", "3" (a count; a JSON number is a count too).
 * Throws CheckLimitError naming the text and what was expected.
 */
export function parseCheckLimit(text: string | number): CheckLimit {
  if (typeof text === 'number') {
    if (!Number.isFinite(text)) throw new CheckLimitError(`limit ${text} is not a finite number`);
    return { value: text, unit: 'count', text: String(text) };
  }
  const m = typeof text === 'string' ? NUMBER_UNIT_RE.exec(text) : null;
  if (!m) throw new CheckLimitError(`cannot read limit ${JSON.stringify(text)}: ${EXPECTED}`);
  const trimmed = text.trim();
  const [, num, unit] = m as unknown as [string, string, string];
  if (unit === '') return { value: Number(num), unit: 'count', text: trimmed };
  if (unit === '%') return { value: Number(num), unit: '%', text: trimmed };
  const dims = dimensionsOfUnit(unit);
  for (const [dim, u] of [['voltage', 'V'], ['time', 's']] as const) {
    if (!dims.includes(dim)) continue;
    const q = parseQuantity(trimmed, dim);
    if (q.ok) return { value: q.value, unit: u, text: trimmed };
  }
  throw new CheckLimitError(`cannot read limit ${JSON.stringify(text)}: ${EXPECTED}`);
}
