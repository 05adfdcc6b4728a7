// The option line: `# <frequency unit> <parameter> <format> R <n>`, every field optional and in any
// order except that n follows R; defaults GHz, S, MA, R 50 (Touchstone 1.1, "Option Line";
// Touchstone 2.0, "Option Line", same rules).
import type { Problems } from '../scenario/problems.js';
import { numberOf, type SourceLine, tokensOf } from './lines.js';

export type FrequencyUnit = 'Hz' | 'kHz' | 'MHz' | 'GHz';
export type Parameter = 'S' | 'Y' | 'Z' | 'G' | 'H';
export type NumberFormat = 'MA' | 'DB' | 'RI';

export interface OptionLine {
  unit: FrequencyUnit;
  parameter: Parameter;
  format: NumberFormat;
  /** The reference resistance after R (Ω). */
  resistance: number;
}

export const DEFAULT_OPTIONS: OptionLine = { unit: 'GHz', parameter: 'S', format: 'MA', resistance: 50 };

const UNITS: Record<string, FrequencyUnit> = { HZ: 'Hz', KHZ: 'kHz', MHZ: 'MHz', GHZ: 'GHz' };
export const UNIT_SCALE: Record<FrequencyUnit, number> = { Hz: 1, kHz: 1e3, MHz: 1e6, GHz: 1e9 };
const PARAMETERS = new Set(['S', 'Y', 'Z', 'G', 'H']);
const FORMATS = new Set(['MA', 'DB', 'RI']);

/** Reads an option line (its text starts with "#"); problems go to `problems` under the path "option line". */
export function parseOptionLine(l: SourceLine, problems: Problems): OptionLine {
  const out: OptionLine = { ...DEFAULT_OPTIONS };
  const seen = new Set<string>();
  const tokens = tokensOf({ ...l, text: l.text.slice(1), col: l.col + 1 });
  const once = (field: string, t: { text: string; line: number; col: number }): boolean => {
    if (!seen.has(field)) return (seen.add(field), true);
    problems.add('option line', t.text, `one ${field} only`, t);
    return false;
  };
  for (let i = 0; i < tokens.length; i++) {
    const t = tokens[i];
    const u = t.text.toUpperCase();
    if (u in UNITS) {
      if (once('frequency unit', t)) out.unit = UNITS[u];
    } else if (PARAMETERS.has(u)) {
      if (once('parameter', t)) out.parameter = u as Parameter;
    } else if (FORMATS.has(u)) {
      if (once('format', t)) out.format = u as NumberFormat;
    } else if (u === 'R') {
      const v = tokens[i + 1];
      const r = v ? numberOf(v.text) : NaN;
      if (!(r > 0)) problems.add('option line', v?.text, 'a positive reference resistance in ohms after R, like "R 50"', v ?? t);
      else if (once('reference resistance', t)) out.resistance = r;
      i++;
    } else {
      problems.add('option line', t.text, 'a frequency unit (Hz, kHz, MHz, GHz), a parameter (S, Y, Z, G, H), a format (DB, MA, RI) or "R <ohms>"', t);
    }
  }
  return out;
}
