// Number formatting for messages and limit texts: SI prefixes via the project's units module,
// with null shown as "n/a".
import { formatSI as unitsFormatSI } from '../units.js';

/** formatSI(1.23e-9, 's') → "1.23 ns"; null/undefined → "n/a". */
export function formatSI(value: number | null | undefined, unit: string, digits = 4): string {
  if (value === null || value === undefined) return 'n/a';
  return unitsFormatSI(value, unit, digits);
}

/** formatPercent(12.345) → "12.35 %"; null/undefined → "n/a". */
export function formatPercent(value: number | null | undefined, digits = 4): string {
  if (value === null || value === undefined) return 'n/a';
  if (!Number.isFinite(value)) return `${value} %`;
  return `${Number(value.toPrecision(digits))} %`;
}
