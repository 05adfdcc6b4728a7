// Preferred values of resistors and capacitors: the E series of IEC 60063 (2015, "Preferred number
// series for resistors and capacitors"). E3 … E24 have two significant digits (the standard's
// Table 1), E48 … E192 three (Table 2). The two-digit series are not the rounded geometric series
// 10^(k/24): 27, 30, 33, 36, 39, 43, 47 and 82 are historical values the standard keeps, so the tables
// are written out, not computed.
//
// A value is rounded to a series by its two neighbours (the largest member ≤ it and the smallest ≥
// it); "nearest" is measured on a log scale, because the series are geometric (the geometric midpoint
// of 9.1 and 10 is 9.539, so 9.545 rounds to 10, where a linear midpoint would round it to 9.1).

export type SeriesName = 'E3' | 'E6' | 'E12' | 'E24' | 'E48' | 'E96' | 'E192';

/** Mantissas of one decade (two digits: 10 … 91; three digits: 100 … 990). */
const E24 = [10, 11, 12, 13, 15, 16, 18, 20, 22, 24, 27, 30, 33, 36, 39, 43, 47, 51, 56, 62, 68, 75, 82, 91];

const E192 = [
  100, 101, 102, 104, 105, 106, 107, 109, 110, 111, 113, 114, 115, 117, 118, 120, 121, 123, 124, 126, 127, 129, 130, 132,
  133, 135, 137, 138, 140, 142, 143, 145, 147, 149, 150, 152, 154, 156, 158, 160, 162, 164, 165, 167, 169, 172, 174, 176,
  178, 180, 182, 184, 187, 189, 191, 193, 196, 198, 200, 203, 205, 208, 210, 213, 215, 218, 221, 223, 226, 229, 232, 234,
  237, 240, 243, 246, 249, 252, 255, 258, 261, 264, 267, 271, 274, 277, 280, 284, 287, 291, 294, 298, 301, 305, 309, 312,
  316, 320, 324, 328, 332, 336, 340, 344, 348, 352, 357, 361, 365, 370, 374, 379, 383, 388, 392, 397, 402, 407, 412, 417,
  422, 427, 432, 437, 442, 448, 453, 459, 464, 470, 475, 481, 487, 493, 499, 505, 511, 517, 523, 530, 536, 542, 549, 556,
  562, 569, 576, 583, 590, 597, 604, 612, 619, 626, 634, 642, 649, 657, 665, 673, 681, 690, 698, 706, 715, 723, 732, 741,
  750, 759, 768, 777, 787, 796, 806, 816, 825, 835, 845, 856, 866, 876, 887, 898, 909, 920, 931, 942, 953, 965, 976, 988,
];

/** Every n-th member, from the first: E12 is every other E24 value, E96 every other E192 value. */
function everyNth(values: readonly number[], n: number): number[] {
  return values.filter((_, k) => k % n === 0);
}

const MANTISSAS: Record<SeriesName, readonly number[]> = {
  E3: everyNth(E24, 8),
  E6: everyNth(E24, 4),
  E12: everyNth(E24, 2),
  E24,
  E48: everyNth(E192, 4),
  E96: everyNth(E192, 2),
  E192,
};

export const SERIES_NAMES: readonly SeriesName[] = ['E3', 'E6', 'E12', 'E24', 'E48', 'E96', 'E192'];

/** The series' values in one decade as the standard prints them (10 … 91 or 100 … 988). */
export function seriesMantissas(name: SeriesName): readonly number[] {
  return MANTISSAS[name];
}

/** The series name from user text ("e24", "E96"); undefined when unknown. */
export function parseSeriesName(text: string): SeriesName | undefined {
  const t = text.trim().toUpperCase();
  return (SERIES_NAMES as readonly string[]).includes(t) ? (t as SeriesName) : undefined;
}

/** Digits of the series' mantissas (2 for E3 … E24, 3 for E48 … E192). */
function digits(name: SeriesName): number {
  return MANTISSAS[name][0]! >= 100 ? 3 : 2;
}

/** Member k of the series counted over all decades: k = 0 is 1.0, k = n is 10 (n members per decade). */
function member(name: SeriesName, k: number): number {
  const m = MANTISSAS[name];
  const n = m.length;
  const decade = Math.floor(k / n);
  const j = k - decade * n;
  // Scale by powers of ten as an exact decimal: mantissa·10^(decade − digits + 1).
  const e = decade - digits(name) + 1;
  return e >= 0 ? m[j]! * 10 ** e : m[j]! / 10 ** -e;
}

/** The index k with member(k) ≤ x < member(k + 1). */
function floorIndex(name: SeriesName, x: number): number {
  // A guess from the geometric ideal 10^(k/n), off by a member at most (the series are rounded): walk.
  let k = Math.round(Math.log10(x) * MANTISSAS[name].length);
  while (member(name, k) > x * (1 + 1e-12)) k--;
  while (member(name, k + 1) <= x * (1 + 1e-12)) k++;
  return k;
}

export interface Neighbours {
  /** The largest member ≤ x. */
  below: number;
  /** The smallest member ≥ x (equal to `below` when x is a member). */
  above: number;
  /** The one nearer x on a log scale (ties: the larger). */
  nearest: number;
}

/** The series members around x (x > 0, finite). */
export function neighbours(name: SeriesName, x: number): Neighbours {
  if (!(x > 0) || !Number.isFinite(x)) throw new RangeError(`a preferred value needs a positive finite number, got ${x}`);
  const k = floorIndex(name, x);
  const below = member(name, k);
  if (Math.abs(below - x) <= 1e-12 * x) return { below, above: below, nearest: below };
  const above = member(name, k + 1);
  const nearest = Math.log(x / below) < Math.log(above / x) ? below : above;
  return { below, above, nearest };
}

/** The members of the series from lo to hi inclusive (lo, hi > 0). */
export function membersBetween(name: SeriesName, lo: number, hi: number): number[] {
  const out: number[] = [];
  for (let k = floorIndex(name, lo); ; k++) {
    const v = member(name, k);
    if (v > hi * (1 + 1e-12)) break;
    if (v >= lo * (1 - 1e-12)) out.push(v);
  }
  return out;
}

/** Members stepping outward from x: the nearest first, then alternately further below and above. */
export function membersOutward(name: SeriesName, x: number, count: number): number[] {
  const k = floorIndex(name, x);
  const out: number[] = [];
  let lo = k;
  let hi = k + 1;
  while (out.length < count) {
    const a = member(name, lo);
    const b = member(name, hi);
    if (Math.log(x / a) <= Math.log(b / x)) {
      out.push(a);
      lo--;
    } else {
      out.push(b);
      hi++;
    }
  }
  return out;
}
