// "Nice" tick choice with SI-prefixed labels.
//
// Steps are 1, 2, 2.5 or 5 × 10^k. The SI prefix of an axis is chosen so its
// labels are short: from the largest |tick| (engineering notation) or from the
// step, whichever gives the shorter longest label (ties: the larger prefix).
// Labels on one axis share one number of decimals. Negative numbers use the
// typographic minus sign U+2212.

export const MINUS = '\u2212';

/** Engineering exponents we name, with their prefix symbols. */
const PREFIXES: ReadonlyMap<number, string> = new Map([
  [-15, 'f'],
  [-12, 'p'],
  [-9, 'n'],
  [-6, '\u00b5'], // µ (micro sign)
  [-3, 'm'],
  [0, ''],
  [3, 'k'],
  [6, 'M'],
  [9, 'G'],
  [12, 'T'],
]);
const MIN_EXP = -15;
const MAX_EXP = 12;

/** Prefix symbol for an engineering exponent (a multiple of 3 in [−15, 12]). */
export function siPrefix(exponent: number): string {
  const p = PREFIXES.get(exponent);
  if (p === undefined) throw new RangeError(`no SI prefix for 10^${exponent}`);
  return p;
}

/** The multiple of 3 at or below log10(|v|), clamped to the named prefixes; 0 for v = 0. */
export function engineeringExponent(v: number): number {
  const a = Math.abs(v);
  if (a === 0 || !Number.isFinite(a)) return 0;
  // a tiny nudge so that 1000 (log10 = 2.9999999999999996) lands on 3
  const e = Math.floor(Math.floor(Math.log10(a) + 1e-12) / 3) * 3;
  return Math.min(MAX_EXP, Math.max(MIN_EXP, e));
}

/** Smallest step in {1, 2, 2.5, 5} × 10^k that gives at most about `target` intervals over `span`. */
export function niceStep(span: number, target: number): number {
  if (!(span > 0) || !Number.isFinite(span)) throw new RangeError(`niceStep: span must be > 0, got ${span}`);
  const raw = span / Math.max(1, target);
  const mag = Math.pow(10, Math.floor(Math.log10(raw)));
  for (const m of [1, 2, 2.5, 5, 10]) {
    if (m * mag >= raw * (1 - 1e-9)) return m * mag;
  }
  return 10 * mag;
}

/** Multiples of `step` inside [lo, hi] (inclusive, with a tolerance of 1e-9 step). */
export function tickValues(lo: number, hi: number, step: number): number[] {
  if (lo > hi) [lo, hi] = [hi, lo];
  const k0 = Math.ceil(lo / step - 1e-9);
  const k1 = Math.floor(hi / step + 1e-9);
  const out: number[] = [];
  for (let k = k0; k <= k1; k++) out.push(k === 0 ? 0 : k * step);
  return out;
}

/** Number of decimals needed to write multiples of `s` exactly (up to 12). */
export function decimalsFor(s: number): number {
  for (let d = 0; d < 12; d++) {
    const x = s * Math.pow(10, d);
    if (Math.abs(x - Math.round(x)) <= 1e-6 * Math.max(1, Math.abs(x))) return d;
  }
  return 12;
}

/** Format a plain number with fixed decimals and a typographic minus; never "−0". */
export function formatFixed(x: number, decimals: number): string {
  let s = x.toFixed(decimals);
  if (/^-0(\.0*)?$/.test(s)) s = s.slice(1);
  return s.replace('-', MINUS);
}

/** Labels for tick `values` spaced by `step`, scaled by 10^exponent. */
export function formatTickLabels(values: readonly number[], step: number, exponent: number): string[] {
  const f = Math.pow(10, exponent);
  const d = decimalsFor(step / f);
  return values.map((v) => formatFixed(v / f, d));
}

export interface AxisTicks {
  /** Tick positions in data units (SI base units). */
  values: number[];
  /** Labels in the prefixed unit, e.g. "0", "5", "10" for nanoseconds. */
  labels: string[];
  step: number;
  /** Engineering exponent of the prefix (−9 for "n"). */
  exponent: number;
  /** Prefixed unit, e.g. "ns", "mV", "kΩ"; "" when the axis has no unit and no prefix. */
  unit: string;
}

export interface AxisTickOptions {
  /** Base SI unit, e.g. "s", "V", "Ω", "m". "" for dimensionless. */
  unit?: string;
  /** About how many intervals to aim for (default 6). */
  target?: number;
  /** Use SI prefixes (default: true when `unit` is given, false for dimensionless axes). */
  si?: boolean;
}

/** Suggested tick count for an axis `lengthPx` long with labels about `spacingPx` apart. */
export function targetTickCount(lengthPx: number, spacingPx: number): number {
  return Math.max(2, Math.min(12, Math.floor(lengthPx / spacingPx)));
}

/** Ticks, labels and prefixed unit for an axis covering [lo, hi]. */
export function axisTicks(lo: number, hi: number, opts: AxisTickOptions = {}): AxisTicks {
  const unit = opts.unit ?? '';
  const si = opts.si ?? unit !== '';
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) throw new RangeError(`axisTicks: bounds must be finite, got [${lo}, ${hi}]`);
  if (lo > hi) [lo, hi] = [hi, lo];
  if (lo === hi) {
    const pad = lo === 0 ? 1 : Math.abs(lo) * 0.01;
    lo -= pad;
    hi += pad;
  }
  const step = niceStep(hi - lo, opts.target ?? 6);
  const values = tickValues(lo, hi, step);
  let exponent = 0;
  let labels: string[];
  if (si) {
    const maxAbs = Math.max(...values.map(Math.abs), 0);
    const candidates = [engineeringExponent(maxAbs || step), engineeringExponent(step)];
    let best: { e: number; labels: string[]; len: number } | null = null;
    for (const e of candidates) {
      const ls = formatTickLabels(values, step, e);
      const len = Math.max(0, ...ls.map((s) => s.length));
      if (best === null || len < best.len) best = { e, labels: ls, len };
    }
    exponent = best!.e;
    labels = best!.labels;
  } else {
    labels = formatTickLabels(values, step, 0);
  }
  return { values, labels, step, exponent, unit: si ? siPrefix(exponent) + unit : unit };
}

/** Axis title with its unit in parentheses: "Time (ns)"; the bare label when there is no unit. */
export function axisTitle(label: string, unit: string): string {
  return unit ? `${label} (${unit})` : label;
}

/**
 * One value with an SI prefix and unit, `digits` significant digits, trailing
 * zeros dropped: formatSi(12.5e-9, 's') → "12.5 ns", formatSi(-0.25, 'V') → "−250 mV".
 */
export function formatSi(value: number, unit: string, digits = 3): string {
  if (!Number.isFinite(value)) return `${value} ${unit}`.trim();
  let e = engineeringExponent(value);
  let m = value / Math.pow(10, e);
  // rounding can carry into the next prefix (999.96 → "1000")
  if (Math.abs(Number(m.toPrecision(digits))) >= 1000 && e < MAX_EXP) {
    e += 3;
    m = value / Math.pow(10, e);
  }
  let s = Number(m.toPrecision(digits)).toString();
  if (s.includes('e')) s = m.toFixed(Math.max(0, digits - 1));
  if (/^-0(\.0*)?$/.test(s)) s = s.slice(1);
  s = s.replace('-', MINUS);
  const u = siPrefix(e) + unit;
  return u ? `${s} ${u}` : s;
}
