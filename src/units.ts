// Quantities with SI prefixes and units: "3.3V", "600ps", "12ohm", "250nH/m", "150ps/in", "0.66c", "50%".
//
// Every parse states the dimension it expects; a value of another dimension, an unknown unit or
// a malformed number is refused with a phrase saying what was expected (`a time like "600ps"`).
// Plain numbers (JSON numbers or unit-less strings) are taken in the dimension's SI base unit.
//
// Adding a unit is one line in DIMENSIONS below; adding a dimension is one entry. Units marked
// `si(...)` accept the SI prefixes f p n u µ m k M G T in front of them ("mohm" is a milli-ohm,
// "Mohm" a mega-ohm, "mm" a millimetre); units marked `fixed(...)` do not ("in", "mil", "ft", "c").
// An exact unit match always wins over a prefix reading ("ft" is a foot, never a femto-t).

import { editDistance } from './edit-distance.js';

/** Speed of light in vacuum, m/s (exact by the SI definition of the metre). */
export const SPEED_OF_LIGHT = 299_792_458;

/** SI prefixes accepted in front of `si` units. Both micro signs (U+00B5, U+03BC) and "u" mean 1e-6. */
export const SI_PREFIXES: Readonly<Record<string, number>> = {
  f: 1e-15,
  p: 1e-12,
  n: 1e-9,
  u: 1e-6,
  '\u00b5': 1e-6,
  '\u03bc': 1e-6,
  m: 1e-3,
  k: 1e3,
  M: 1e6,
  G: 1e9,
  T: 1e12,
};

interface UnitDef {
  /** Value of one of this unit in the dimension's SI base unit. */
  factor: number;
  /** Whether SI prefixes may be put in front of it. */
  prefixes: boolean;
  /** Divisor applied after `factor` (per-length units divide by the length in metres, which keeps "3ps/in" exact to rounding). */
  per?: number;
}

const si = (factor: number): UnitDef => ({ factor, prefixes: true });
const fixed = (factor: number): UnitDef => ({ factor, prefixes: false });

// Lengths in metres. in = 25.4 mm exactly, ft = 0.3048 m exactly (international yard and pound
// agreement, 1959; NIST SP 811 appendix B); mil = 0.001 in = 25.4 µm.
const INCH = 0.0254;
const LENGTH_UNITS = {
  m: si(1), // also "mm", "um", "µm", "km" ... through the prefixes
  cm: fixed(0.01),
  in: fixed(INCH),
  mil: fixed(25.4e-6),
  ft: fixed(0.3048),
} satisfies Record<string, UnitDef>;

/**
 * Copper foil thickness by weight: 1 oz of copper spread over 1 ft² is about 35 µm thick (common
 * PCB practice; the same value as COPPER_THICKNESS_PER_OZ in sim/lines/conductor.ts).
 */
export const COPPER_THICKNESS_PER_OZ = 35e-6;

/** Thicknesses: every length unit, and copper weight "1oz", "2oz", "0.5oz" (35 µm per oz). */
const THICKNESS_UNITS = { ...LENGTH_UNITS, oz: fixed(COPPER_THICKNESS_PER_OZ) } satisfies Record<string, UnitDef>;

/** Denominators of per-length units: "nH/m", "pF/in", "ps/mm", "dB/100m" ... */
const PER_LENGTH: Readonly<Record<string, number>> = {
  m: 1,
  cm: 0.01,
  mm: 1e-3,
  in: INCH,
  ft: 0.3048,
};

/** `perLength({ H: 1 })` → units "H/m", "H/cm", "H/mm", "H/in", "H/ft" (factor 1, divided by the length in metres); prefixes go on the numerator: "nH/m". */
function perLength(numerators: Record<string, number>, denominators = PER_LENGTH, prefixes = true): Record<string, UnitDef> {
  const out: Record<string, UnitDef> = {};
  for (const [num, f] of Object.entries(numerators)) {
    for (const [den, metres] of Object.entries(denominators)) out[`${num}/${den}`] = { factor: f, per: metres, prefixes };
  }
  return out;
}

const OHM = { ohm: si(1), ohms: si(1), Ohm: si(1), '\u03a9': si(1) /* Greek capital omega */, '\u2126': si(1) /* ohm sign */ };

export interface DimensionSpec {
  /** Noun phrase with article, for messages: "a time". */
  noun: string;
  /** A typical value, for messages: "600ps". */
  example: string;
  /** Symbol of the SI base unit the parsed number is in (for formatSI and docs). */
  base: string;
  units: Readonly<Record<string, UnitDef>>;
}

export const DIMENSIONS = {
  voltage: { noun: 'a voltage', example: '3.3V', base: 'V', units: { V: si(1) } },
  current: { noun: 'a current', example: '10mA', base: 'A', units: { A: si(1) } },
  time: { noun: 'a time', example: '600ps', base: 's', units: { s: si(1) } },
  frequency: { noun: 'a frequency', example: '100MHz', base: 'Hz', units: { Hz: si(1) } },
  resistance: { noun: 'a resistance', example: '50ohm', base: 'ohm', units: OHM },
  inductance: { noun: 'an inductance', example: '2nH', base: 'H', units: { H: si(1) } },
  capacitance: { noun: 'a capacitance', example: '3pF', base: 'F', units: { F: si(1) } },
  conductance: { noun: 'a conductance', example: '20mS', base: 'S', units: { S: si(1) } },
  length: { noun: 'a length', example: '3in', base: 'm', units: LENGTH_UNITS },
  /** A conductor thickness: a length, or a copper weight ("1oz" = 35 µm, common PCB practice). */
  thickness: { noun: 'a thickness', example: '1oz', base: 'm', units: THICKNESS_UNITS },
  resistancePerLength: {
    noun: 'a resistance per length',
    example: '0.5ohm/m',
    base: 'ohm/m',
    units: perLength({ ohm: 1, ohms: 1, Ohm: 1, '\u03a9': 1, '\u2126': 1 }),
  },
  inductancePerLength: { noun: 'an inductance per length', example: '250nH/m', base: 'H/m', units: perLength({ H: 1 }) },
  capacitancePerLength: { noun: 'a capacitance per length', example: '100pF/m', base: 'F/m', units: perLength({ F: 1 }) },
  conductancePerLength: { noun: 'a conductance per length', example: '20uS/m', base: 'S/m', units: perLength({ S: 1 }) },
  /** Delay per length (s/m), the reciprocal of velocity: "6.67ns/m", "150ps/in". */
  delayPerLength: { noun: 'a delay per length', example: '6.67ns/m', base: 's/m', units: perLength({ s: 1 }) },
  velocity: {
    noun: 'a velocity',
    example: '0.66c',
    base: 'm/s',
    units: { 'm/s': si(1), c: fixed(SPEED_OF_LIGHT), 'in/ns': fixed(2.54e7), 'mm/ns': fixed(1e6) },
  },
  /** A plain ratio: "50%" or 0.5. */
  fraction: { noun: 'a fraction', example: '50%', base: '', units: { '%': fixed(0.01) } },
  /** A level in decibels (the number is kept in dB). */
  decibels: { noun: 'a level in dB', example: '3dB', base: 'dB', units: { dB: fixed(1) } },
  /** Attenuation in dB per metre: "0.2dB/m", "4.3dB/100m", "0.1dB/in". */
  attenuationPerLength: {
    noun: 'an attenuation per length',
    example: '4.3dB/100m',
    base: 'dB/m',
    units: perLength({ dB: 1 }, { ...PER_LENGTH, '100m': 100, '100ft': 30.48 }, false),
  },
  /** A plain number without unit (relative permittivity, loss tangent): "4.3", 0.02. */
  number: { noun: 'a number', example: '4.3', base: '', units: {} },
  /** Electrical conductivity of a material (S/m), e.g. copper "5.8e7S/m". */
  conductivity: { noun: 'a conductivity', example: '5.8e7S/m', base: 'S/m', units: { 'S/m': si(1) } },
} satisfies Record<string, DimensionSpec>;

export type Dimension = keyof typeof DIMENSIONS;

/**
 * The magnitudes a quantity of each dimension may have, whatever the key: anything outside is not a
 * board, cable or part value, and would make the arithmetic overflow or lose all precision further
 * down (1e300 V, 1e-300 F). `max` bounds |value|; `minNonZero` bounds |value| from below unless it is
 * exactly 0. The bounds are wide on purpose (common practice: several decades beyond any real part).
 */
export const MAGNITUDE_BOUNDS: Readonly<Record<Dimension, { max?: number; minNonZero?: number }>> = {
  voltage: { max: 1e6, minNonZero: 1e-12 },
  current: { max: 1e6, minNonZero: 1e-15 },
  time: { max: 1e6, minNonZero: 1e-15 },
  frequency: { max: 1e13, minNonZero: 1e-3 },
  resistance: { max: 1e12, minNonZero: 1e-6 },
  inductance: { max: 100, minNonZero: 1e-15 },
  capacitance: { max: 1, minNonZero: 1e-18 },
  conductance: { max: 1e6, minNonZero: 1e-12 },
  length: { max: 1e5, minNonZero: 1e-9 },
  thickness: { max: 1e5, minNonZero: 1e-9 },
  resistancePerLength: { max: 1e9, minNonZero: 1e-9 },
  inductancePerLength: { max: 1e-2, minNonZero: 1e-12 },
  capacitancePerLength: { max: 1e-6, minNonZero: 1e-15 },
  conductancePerLength: { max: 1e6, minNonZero: 1e-15 },
  delayPerLength: { max: 1e-3 },
  velocity: { max: 1e9, minNonZero: 1e3 },
  fraction: {},
  decibels: { max: 1e3 },
  attenuationPerLength: { max: 1e4 },
  number: {},
  conductivity: { max: 1e9, minNonZero: 1e3 },
};

/** Whether |v| lies within the dimension's MAGNITUDE_BOUNDS. */
export function withinMagnitude(v: number, dim: Dimension): boolean {
  const b = MAGNITUDE_BOUNDS[dim];
  const a = Math.abs(v);
  if (b.max !== undefined && a > b.max) return false;
  if (b.minNonZero !== undefined && a !== 0 && a < b.minNonZero) return false;
  return true;
}

/** What is expected of a value outside MAGNITUDE_BOUNDS: `a resistance of 0 or from 1 µΩ to 1 TΩ like "50ohm"`. */
export function magnitudePhrase(dim: Dimension, range?: Range, example: string = DIMENSIONS[dim].example): string {
  const { noun } = DIMENSIONS[dim];
  const b = MAGNITUDE_BOUNDS[dim];
  const hi = b.max !== undefined ? formatBound(b.max, dim) : undefined;
  const lo = b.minNonZero !== undefined ? formatBound(b.minNonZero, dim) : undefined;
  const signed = range?.min === undefined || range.min < 0;
  const zeroOk = !range || range.min === undefined || range.min < 0 || (range.min === 0 && !range.minExclusive);
  const span = lo && hi ? `from ${lo} to ${hi}` : hi ? `up to ${hi}` : `of at least ${lo}`;
  const body = signed ? `${span} in size` : span;
  return `${noun} ${zeroOk && lo ? `of 0 or ${body.replace(/^of /, '')}` : body} like "${example}"`;
}


/** Bounds on a parsed value. `min`/`max` are inclusive unless the matching `...Exclusive` flag is set. */
export interface Range {
  min?: number;
  minExclusive?: boolean;
  max?: number;
  maxExclusive?: boolean;
}

/** Values ≥ 0. */
export const NON_NEGATIVE: Range = { min: 0 };
/** Values > 0. */
export const POSITIVE: Range = { min: 0, minExclusive: true };

export type QuantityResult = { ok: true; value: number } | { ok: false; expected: string };

const NUMBER_RE = /^\s*([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*?)\s*$/s;

/** Prefix exponents (10^n) of SI_PREFIXES, for exact decimal scaling. */
const PREFIX_EXP: Readonly<Record<string, number>> = { f: -15, p: -12, n: -9, u: -6, '\u00b5': -6, '\u03bc': -6, m: -3, k: 3, M: 6, G: 9, T: 12 };

/** A unit string resolved in a dimension: its factor and the power of ten of its prefix. */
function resolveUnit(dim: Dimension, unit: string): { factor: number; per: number; prefixExp: number } | undefined {
  const units: Readonly<Record<string, UnitDef>> = DIMENSIONS[dim].units;
  if (unit === '') return { factor: 1, per: 1, prefixExp: 0 };
  const exact = Object.hasOwn(units, unit) ? units[unit] : undefined;
  if (exact) return { factor: exact.factor, per: exact.per ?? 1, prefixExp: 0 };
  for (const [prefix, e] of Object.entries(PREFIX_EXP)) {
    if (!unit.startsWith(prefix)) continue;
    const rest = unit.slice(prefix.length);
    const def = Object.hasOwn(units, rest) ? units[rest] : undefined;
    if (def && def.prefixes) return { factor: def.factor, per: def.per ?? 1, prefixExp: e };
  }
  return undefined;
}

/** Factor of `unit` (with its prefix) in dimension `dim`, or undefined when the unit does not belong to it. */
export function unitFactor(dim: Dimension, unit: string): number | undefined {
  const u = resolveUnit(dim, unit);
  return u && (u.factor * 10 ** u.prefixExp) / u.per;
}

/** "-1.5e-3" → { neg: true, digits: 15, exp: -4 }; undefined when there are too many digits to be exact. */
function decimal(s: string): { neg: boolean; digits: number; exp: number } | undefined {
  const m = /^([+-]?)(\d*)(?:\.(\d*))?(?:[eE]([+-]?\d+))?$/.exec(s);
  if (!m) return undefined;
  const all = ((m[2] ?? '') + (m[3] ?? '')).replace(/^0+(?=\d)/, '');
  if (all.length > 15) return undefined;
  return { neg: m[1] === '-', digits: Number(all), exp: Number(m[4] ?? 0) - (m[3] ?? '').length };
}

/**
 * number × 10^prefixExp × factor, exactly rounded where the factor is a short decimal (in = 0.0254,
 * ft = 0.3048, c = 299792458 ...): "3in" gives 0.0762, not 0.07619999999999999.
 */
function scale(num: string, prefixExp: number, factor: number): number {
  const a = decimal(num);
  const b = decimal(String(factor));
  if (a && b) {
    const prod = a.digits * b.digits;
    if (Number.isSafeInteger(prod)) {
      const v = Number(`${prod}e${a.exp + b.exp + prefixExp}`);
      return a.neg !== b.neg ? -v : v;
    }
  }
  return Number(num) * 10 ** prefixExp * factor;
}

/** The dimensions a unit string belongs to (for docs and hints). */
export function dimensionsOfUnit(unit: string): Dimension[] {
  return (Object.keys(DIMENSIONS) as Dimension[]).filter((d) => unit !== '' && unitFactor(d, unit) !== undefined);
}

function formatBound(n: number, dim: Dimension): string {
  const base = DIMENSIONS[dim].base;
  if (n === 0 || base === '') return String(n);
  // Units without SI prefixes (dB/m) are written as a plain number with the unit, and so are long times (1000000s, not 1Ms).
  if (!(Object.values(DIMENSIONS[dim].units) as UnitDef[]).some((u) => u.prefixes) || (base === 's' && n >= 1)) return `${n}${base}`;
  return formatSI(n, base).replace(' ', '');
}

/** "a time > 0", "a length ≥ 0", "a fraction between 0 and 1 (exclusive)" ... */
export function describeRange(dim: Dimension, range?: Range): string {
  const noun = DIMENSIONS[dim].noun;
  if (!range) return noun;
  const { min, max, minExclusive, maxExclusive } = range;
  if (min !== undefined && max !== undefined) {
    const excl = minExclusive && maxExclusive ? ' (exclusive)' : minExclusive ? ' (excluding ' + formatBound(min, dim) + ')' : maxExclusive ? ' (excluding ' + formatBound(max, dim) + ')' : '';
    return `${noun} between ${formatBound(min, dim)} and ${formatBound(max, dim)}${excl}`;
  }
  if (min !== undefined) return `${noun} ${minExclusive ? '>' : '≥'} ${formatBound(min, dim)}`;
  if (max !== undefined) return `${noun} ${maxExclusive ? '<' : '≤'} ${formatBound(max, dim)}`;
  return noun;
}

/** The phrase used after "expected": `a length ≥ 0 like "3in"`. */
export function expectedPhrase(dim: Dimension, range?: Range, example: string = DIMENSIONS[dim].example): string {
  return `${describeRange(dim, range)} like "${example}"`;
}

function inRange(v: number, r: Range | undefined): boolean {
  if (!r) return true;
  if (r.min !== undefined && (r.minExclusive ? !(v > r.min) : !(v >= r.min))) return false;
  if (r.max !== undefined && (r.maxExclusive ? !(v < r.max) : !(v <= r.max))) return false;
  return true;
}

/** The units a dimension accepts, for messages: "m*, cm, in, mil, ft (*: with an SI prefix f p n u m k M G T)". */
export function unitList(dim: Dimension): string {
  const entries = Object.entries(DIMENSIONS[dim].units as Record<string, UnitDef>).filter(
    ([u]) => !/[\u00b5\u03bc\u03a9\u2126]/.test(u) && !/^(ohms|Ohm)(\/|$)/.test(u),
  );
  const names = entries.map(([u, d]) => (d.prefixes ? `${u}*` : u));
  const anyPrefix = entries.some(([, d]) => d.prefixes);
  return names.join(', ') + (anyPrefix ? ' (*: with an SI prefix f p n u m k M G T)' : '');
}

/** Every spelling a dimension accepts: each unit, and each prefix in front of a unit that takes one. */
function spellings(dim: Dimension): string[] {
  const out: string[] = [];
  for (const [u, d] of Object.entries(DIMENSIONS[dim].units as Record<string, UnitDef>)) {
    out.push(u);
    if (d.prefixes) for (const p of Object.keys(PREFIX_EXP)) if (!/[\u00b5\u03bc]/.test(p)) out.push(p + u);
  }
  return out;
}

/** Words people write for our units, mapped to our spelling (applied case-insensitively before matching). */
const UNIT_WORDS: ReadonlyArray<readonly [RegExp, string]> = [
  [/inch(es)?/gi, 'in'],
  [/mils/gi, 'mil'],
  [/(feet|foot)/gi, 'ft'],
  [/met(er|re)s?/gi, 'm'],
  [/seconds?|secs?/gi, 's'],
  [/volts?/gi, 'V'],
  [/farads?/gi, 'F'],
  [/henr(y|ies|ys)/gi, 'H'],
  [/hertz/gi, 'Hz'],
  [/ounces?/gi, 'oz'],
  [/\s+/g, ''],
];

/**
 * Spellings of this dimension's units that `unit` most likely meant: the same letters in another case
 * ("pf" → "pF", "PS" → "ps"), or a written-out word ("150ps/inch" → "ps/in"), or one letter off.
 * Several when the case decides between prefixes ("MS": "ms" or "Ms"); none when nothing is close.
 */
export function suggestUnits(dim: Dimension, unit: string): string[] {
  if (unit === '') return [];
  const all = spellings(dim);
  let word = unit;
  for (const [re, to] of UNIT_WORDS) word = word.replace(re, to);
  for (const w of [unit, word]) {
    if (w !== unit && all.includes(w)) return [w];
    const same = all.filter((a) => a.toLowerCase() === w.toLowerCase());
    if (same.length) return same;
  }
  const near = all.filter((a) => editDistance(a.toLowerCase(), word.toLowerCase()) === 1 && a.length >= 2);
  return near.length > 0 && near.length <= 3 ? near : [];
}

/**
 * Parse a quantity of dimension `dim`. `value` may be a number (SI base units) or a string such as
 * "600ps", "600 ps", "6e-10" (base units), "-3in". Optionally check it lies in `range`.
 */
export function parseQuantity(value: unknown, dim: Dimension, range?: Range, example?: string): QuantityResult {
  const expected = expectedPhrase(dim, range, example);
  let n: number;
  if (typeof value === 'number') {
    n = value;
  } else if (typeof value === 'string') {
    const m = NUMBER_RE.exec(value);
    if (!m) return { ok: false, expected };
    const unit = resolveUnit(dim, m[2]);
    if (unit === undefined) {
      // A misspelt unit of this dimension ("3 pf", "150ps/inch"): suggest the spelling. Otherwise a unit
      // of some other dimension: just say what was expected. An unknown unit: list ours.
      // A unit of another dimension is only taken for a typo when it differs from ours by case ("2nS").
      const known = dimensionsOfUnit(m[2]).length > 0;
      const guesses = suggestUnits(dim, m[2]).filter((g) => !known || g.toLowerCase() === m[2].toLowerCase());
      if (guesses.length) return { ok: false, expected: `${expected} — did you mean ${guesses.map((g) => `"${m[1]}${g}"`).join(' or ')}?` };
      const units = unitList(dim);
      return { ok: false, expected: known || units === '' ? expected : `${expected}; units: ${units}` };
    }
    n = scale(m[1], unit.prefixExp, unit.factor) / unit.per;
  } else {
    return { ok: false, expected };
  }
  if (Number.isNaN(n)) return { ok: false, expected };
  // 1e999 reads as Infinity: out of range, like 1e300.
  if (!Number.isFinite(n) && inRange(Math.sign(n), range)) return { ok: false, expected: magnitudePhrase(dim, range, example) };
  if (!inRange(n, range)) return { ok: false, expected };
  if (!withinMagnitude(n, dim)) return { ok: false, expected: magnitudePhrase(dim, range, example) };
  return { ok: true, value: n };
}

/** Like parseQuantity, but throws an Error naming the expectation (for code and tests, not user input). */
export function quantity(value: unknown, dim: Dimension): number {
  const r = parseQuantity(value, dim);
  if (!r.ok) throw new Error(`${JSON.stringify(value)}: expected ${r.expected}`);
  return r.value;
}

const FORMAT_PREFIXES: ReadonlyArray<readonly [number, string]> = [
  [12, 'T'],
  [9, 'G'],
  [6, 'M'],
  [3, 'k'],
  [0, ''],
  [-3, 'm'],
  [-6, '\u00b5'],
  [-9, 'n'],
  [-12, 'p'],
  [-15, 'f'],
];

/**
 * Format a value in SI base units with a prefix: formatSI(1.5e-9, 's') → "1.5 ns",
 * formatSI(3.3, 'V') → "3.3 V", formatSI(0, 'V') → "0 V". `digits` significant digits, trailing
 * zeros dropped. Use `{ ascii: true }` for "u" instead of "µ".
 */
export function formatSI(value: number, unit: string, digits = 4, opts: { ascii?: boolean } = {}): string {
  const sep = unit === '' ? '' : ' ';
  if (!Number.isFinite(value)) return `${value}${sep}${unit}`;
  if (value === 0) return `0${sep}${unit}`;
  if (unit === '') return String(Number(value.toPrecision(digits))); // no prefixes on plain numbers
  const exp3 = Math.floor(Math.log10(Math.abs(value)) / 3) * 3;
  let i = FORMAT_PREFIXES.findIndex(([e]) => e <= exp3);
  if (i < 0) i = FORMAT_PREFIXES.length - 1;
  let [e, p] = FORMAT_PREFIXES[i];
  let mant = Number((value / 10 ** e).toPrecision(digits));
  // Rounding may carry into the next prefix: 999.96 → 1000 → 1 k.
  if (Math.abs(mant) >= 1000 && i > 0) {
    [e, p] = FORMAT_PREFIXES[i - 1];
    mant = Number((value / 10 ** e).toPrecision(digits));
  }
  if (opts.ascii && p === '\u00b5') p = 'u';
  const u = `${p}${unit}`;
  return u === '' ? String(mant) : `${mant} ${u}`;
}
