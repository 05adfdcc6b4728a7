// Counting and decoding Touchstone network data: data sets of tokens → frequencies in Hz and complex
// matrices, for both versions (pair formats MA, DB, RI; 2-port order; Full, Lower and Upper matrices).
import type { Problems } from '../scenario/problems.js';
import { numberOf, type Token } from './lines.js';
import { UNIT_SCALE, type OptionLine } from './options.js';

export type MatrixFormat = 'Full' | 'Lower' | 'Upper';
export type TwoPortOrder = '12_21' | '21_12';

/** Records a problem and stops reading. */
export type FailFn = (path: string, value: unknown, expected: string, at?: { line: number; col: number }) => never;

/** Largest number of complex values read (n²·frequencies): 20 million is 320 MB of doubles. */
export const MAX_VALUES = 20_000_000;

export function checkSetCount(tokens: Token[], perSet: number, n: number, fail: FailFn): number {
  if (tokens.length === 0) fail('network data', undefined, 'at least one data set after the option line', undefined);
  if (tokens.length % perSet !== 0) {
    const sets = Math.floor(tokens.length / perSet);
    const t = tokens[sets * perSet];
    fail('network data', t.text, `complete data sets of ${perSet} numbers (a frequency and ${n * n} pairs for ${n} ports); the last set starting here has ${tokens.length - sets * perSet}`, t);
  }
  const sets = tokens.length / perSet;
  if (sets * n * n > MAX_VALUES) fail('network data', sets, `at most ${Math.floor(MAX_VALUES / (n * n))} frequencies for ${n} ports`, tokens[0]);
  return sets;
}

/** Turns `sets` data sets of tokens into frequencies (Hz) and complex matrices. */
export function decodeSets(
  tokens: Token[],
  sets: number,
  n: number,
  options: OptionLine,
  problems: Problems,
  order: TwoPortOrder | undefined,
  format: MatrixFormat,
): { freq: Float64Array; values: Float64Array } {
  const pairs = format === 'Full' ? n * n : (n * (n + 1)) / 2;
  const perSet = 1 + 2 * pairs;
  const freq = new Float64Array(sets);
  const values = new Float64Array(2 * n * n * sets);
  const slots = pairSlots(n, order, format);
  const scale = UNIT_SCALE[options.unit];
  const num = (t: Token): number => {
    const v = numberOf(t.text);
    if (Number.isNaN(v) && problems.count < 50) problems.add('network data', t.text, 'a number', t);
    return v;
  };
  for (let s = 0; s < sets; s++) {
    const base = s * perSet;
    const ft = tokens[base];
    const f = num(ft) * scale;
    if (f < 0) problems.add('network data', ft.text, 'a frequency ≥ 0', ft);
    if (s > 0 && !(f > freq[s - 1])) problems.add('network data', ft.text, `a frequency above the previous one (${freq[s - 1] / scale} ${options.unit}): frequencies must increase strictly`, ft);
    freq[s] = f;
    for (let p = 0; p < pairs; p++) {
      const a = num(tokens[base + 1 + 2 * p]);
      const b = num(tokens[base + 2 + 2 * p]);
      const [re, im] = complexOf(a, b, options.format);
      for (const [i, j] of slots[p]) {
        const at = 2 * ((s * n + i) * n + j);
        values[at] = re;
        values[at + 1] = im;
      }
    }
  }
  return { freq, values };
}

/** For each pair in file order, the matrix entries (i, j) it fills (two for the off-diagonal of Lower/Upper). */
function pairSlots(n: number, order: TwoPortOrder | undefined, format: MatrixFormat): Array<Array<[number, number]>> {
  if (n === 2 && format === 'Full' && order === '21_12') return [[[0, 0]], [[1, 0]], [[0, 1]], [[1, 1]]];
  const out: Array<Array<[number, number]>> = [];
  for (let i = 0; i < n; i++) {
    const from = format === 'Upper' ? i : 0;
    const to = format === 'Lower' ? i : n - 1;
    for (let j = from; j <= to; j++) out.push(i === j || format === 'Full' ? [[i, j]] : [[i, j], [j, i]]);
  }
  return out;
}

/** A value pair in MA (magnitude, degrees), DB (20·log10 magnitude, degrees) or RI as re, im. */
export function complexOf(a: number, b: number, format: 'MA' | 'DB' | 'RI'): [number, number] {
  if (format === 'RI') return [a, b];
  const mag = format === 'DB' ? 10 ** (a / 20) : a;
  const rad = (b * Math.PI) / 180;
  return [mag * Math.cos(rad), mag * Math.sin(rad)];
}

