// Numbers as the page shows them: SI prefixes and four significant digits, as in the report and the
// terminal (src/units.ts formatSI); and the reverse, for times typed into the cursor fields.

const PREFIXES: readonly (readonly [number, string])[] = [
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

/** 1.2345e-9, 's' → "1.235 ns"; 0 → "0 s"; non-finite → "—". */
export function formatSI(value: number | null | undefined, unit: string, digits = 4): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const sep = unit === '' ? '' : ' ';
  if (value === 0) return `0${sep}${unit}`;
  if (unit === '') return String(Number(value.toPrecision(digits)));
  const exp3 = Math.floor(Math.log10(Math.abs(value)) / 3) * 3;
  let i = PREFIXES.findIndex(([e]) => e <= exp3);
  if (i < 0) i = PREFIXES.length - 1;
  let [e, p] = PREFIXES[i]!;
  let mant = Number((value / 10 ** e).toPrecision(digits));
  if (Math.abs(mant) >= 1000 && i > 0) {
    [e, p] = PREFIXES[i - 1]!;
    mant = Number((value / 10 ** e).toPrecision(digits));
  }
  return `${mant} ${p}${unit}`;
}

/** A signed difference: "+1.2 V", "−3 ns", "0 V". */
export function formatDelta(value: number | null | undefined, unit: string, digits = 4): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const s = formatSI(Math.abs(value), unit, digits);
  return value > 0 ? `+${s}` : value < 0 ? `\u2212${s}` : s;
}

const PREFIX_VALUE: Record<string, number> = { T: 1e12, G: 1e9, M: 1e6, k: 1e3, '': 1, m: 1e-3, u: 1e-6, '\u00b5': 1e-6, n: 1e-9, p: 1e-12, f: 1e-15 };

/** "12.5ns", "12.5 ns", "1.2e-8", "3 µs" → seconds; null when the text is not a time. */
export function parseTime(text: string): number | null {
  const m = /^\s*([-+\u2212]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*([TGMkmu\u00b5npf]?)\s*(s?)\s*$/.exec(text);
  if (!m) return null;
  const prefix = m[2] ?? '';
  // "m" alone is milli; "M" mega. Without a unit a bare prefix still scales (12n = 12 ns).
  const k = PREFIX_VALUE[prefix];
  if (k === undefined) return null;
  const v = Number(m[1]!.replace('\u2212', '-')) * k;
  return Number.isFinite(v) ? v : null;
}
