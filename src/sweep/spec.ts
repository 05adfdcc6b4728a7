// The command-line descriptions of what a sweep varies:
//
//   --vary  PATH=A..B:N          N values from A to B, evenly spaced, both ends included
//   --vary  PATH=A..B:N:log      N values from A to B, evenly spaced on a log scale (A, B > 0)
//   --vary  PATH=a,b,c           the values listed
//   --spread PATH=±X             Monte Carlo: uniform within ±X around the scenario's value
//   --spread PATH=~N(X)          Monte Carlo: normal with standard deviation X
//
// X is relative when it is a percentage ("±10%") and absolute otherwise ("±2ohm"). Values carry
// units like scenario quantities ("0ohm", "60ohm", "1.2ns", "0.66c"); a plain number is in SI base
// units. Each value is written into the scenario as "<SI number><base unit>" ("39ohm", "1.2e-9s"), so
// the scenario validator checks its dimension and range exactly as for a value typed in the file.
import { DIMENSIONS, dimensionsOfUnit, parseQuantity, type Dimension } from '../units.js';
import { getAtPath, parsePath, PathError } from './paths.js';
import { SizeRefused } from '../size-limits.js';
import { MAX_AXIS_VALUES } from './size.js';

export class SweepSpecError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SweepSpecError';
  }
}

/** A number in SI base units and the base unit it is in ('' for a plain number or a fraction). */
export interface Quantity {
  value: number;
  unit: string;
}

const NUMBER_UNIT = /^\s*([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*?)\s*$/s;

/** "39ohm" → { 39, 'ohm' }, "1.2ns" → { 1.2e-9, 's' }, "50%" → { 0.5, '' }, "3" → { 3, '' }. */
export function parseAnyQuantity(text: string | number): Quantity | undefined {
  if (typeof text === 'number') return Number.isFinite(text) ? { value: text, unit: '' } : undefined;
  const m = NUMBER_UNIT.exec(text);
  if (!m) return undefined;
  const unit = m[2]!;
  if (unit === '') {
    const value = Number(m[1]);
    return Number.isFinite(value) ? { value, unit: '' } : undefined;
  }
  for (const dim of dimensionsOfUnit(unit) as Dimension[]) {
    const q = parseQuantity(text, dim);
    if (q.ok) return { value: q.value, unit: DIMENSIONS[dim].base };
  }
  return undefined;
}

/** The value to put into the scenario: a plain number for '' units, else "<number><unit>". */
export function scenarioValue(value: number, unit: string): number | string {
  return unit === '' ? value : `${value}${unit}`;
}

export interface VaryAxis {
  /** The path as given (with item names). */
  path: string;
  /** The --vary text. */
  text: string;
  /** Values in SI base units, in sweep order. */
  values: number[];
  /** Base unit of the values ('' for plain numbers). */
  unit: string;
  spacing: 'linear' | 'log' | 'list';
}

function splitAssignment(text: string, option: string, example: string): { path: string; rhs: string } {
  const eq = text.indexOf('=');
  if (eq <= 0) throw new SweepSpecError(`${option} "${text}": expected PATH=VALUES, like ${example}`);
  const path = text.slice(0, eq).trim();
  try {
    parsePath(path);
  } catch (e) {
    if (e instanceof PathError) throw new SweepSpecError(`${option} "${text}": ${e.message}`);
    throw e;
  }
  return { path, rhs: text.slice(eq + 1).trim() };
}

function quantityOf(text: string, what: string): Quantity {
  const q = parseAnyQuantity(text);
  if (q) return q;
  // A number too large to hold (1e400) or a value outside what any part can have (1e300ohm).
  const m = NUMBER_UNIT.exec(text);
  if (m) {
    const unit = m[2]!;
    if (unit === '') throw new SweepSpecError(`${what}: "${text}" is not a finite number`);
    for (const dim of dimensionsOfUnit(unit) as Dimension[]) {
      const r = parseQuantity(text, dim);
      if (!r.ok) throw new SweepSpecError(`${what}: "${text}" — expected ${r.expected}`);
    }
  }
  throw new SweepSpecError(`${what}: "${text}" is not a number with a unit like "39ohm", "1.2ns" or "0.66c"`);
}

function sameUnit(a: Quantity, b: Quantity, what: string, ta: string, tb: string): string {
  if (a.unit === b.unit) return a.unit;
  if (a.unit === '' || b.unit === '') return a.unit || b.unit; // a plain number is in the other's base unit
  throw new SweepSpecError(`${what}: "${ta}" (${a.unit}) and "${tb}" (${b.unit}) are not the same kind of quantity`);
}

/** Parses one --vary. Throws SweepSpecError saying what was expected. */
export function parseVary(text: string): VaryAxis {
  const example = '"route.r1.series.r=0ohm..60ohm:25" or "lines.trace.z0=45ohm,50ohm,55ohm"';
  const { path, rhs } = splitAssignment(text, '--vary', example);
  const what = `--vary "${text}"`;
  const range = /^(.*?)\.\.(.*?):\s*(\d+)\s*(?::\s*(log|lin|linear)\s*)?$/i.exec(rhs);
  if (range) {
    const [, ta, tb, tn, scale] = range as unknown as [string, string, string, string, string | undefined];
    const a = quantityOf(ta.trim(), what);
    const b = quantityOf(tb.trim(), what);
    const unit = sameUnit(a, b, what, ta.trim(), tb.trim());
    const n = Number(tn);
    if (!(n >= 1)) throw new SweepSpecError(`${what}: the count after ":" must be at least 1`);
    if (n > MAX_AXIS_VALUES) {
      throw new SizeRefused(`sweep refused even with --force: ${what} asks for ${tn} values, more than the ${MAX_AXIS_VALUES.toLocaleString('en-US')} one --vary may list`, true);
    }
    const log = scale?.toLowerCase() === 'log';
    if (log && !(a.value > 0 && b.value > 0)) throw new SweepSpecError(`${what}: a log range needs both ends above 0`);
    const values: number[] = [];
    for (let k = 0; k < n; k++) {
      if (n === 1) values.push(a.value);
      else if (k === n - 1) values.push(b.value);
      else if (log) values.push(a.value * (b.value / a.value) ** (k / (n - 1)));
      else values.push(a.value + ((b.value - a.value) * k) / (n - 1));
    }
    return { path, text, values, unit, spacing: log ? 'log' : 'linear' };
  }
  if (rhs.includes('..')) throw new SweepSpecError(`${what}: a range is A..B:N with the number of values, like 0ohm..60ohm:25`);
  const parts = rhs.split(',').map((s) => s.trim());
  if (parts.length === 0 || parts.some((p) => p === '')) throw new SweepSpecError(`${what}: expected a range A..B:N or a list a,b,c, like ${example}`);
  const qs = parts.map((p) => quantityOf(p, what));
  let unit = qs[0]!.unit;
  qs.forEach((q, i) => (unit = sameUnit({ value: 0, unit }, q, what, parts[0]!, parts[i]!)));
  return { path, text, values: qs.map((q) => q.value), unit, spacing: 'list' };
}

export interface SpreadSpec {
  path: string;
  text: string;
  distribution: 'uniform' | 'normal';
  /** Relative (X is a fraction of the nominal value) or absolute (X in `unit`). */
  relative: boolean;
  /** Half-width (uniform) or standard deviation (normal): a fraction when relative, else SI. */
  amount: number;
  /** Unit of an absolute amount ('' when relative or plain). */
  unit: string;
}

/** Parses one --spread. Throws SweepSpecError saying what was expected. */
export function parseSpread(text: string): SpreadSpec {
  const example = '"lines.trace.z0=±10%", "route.rs.series.r=±2ohm" or "lines.trace.z0=~N(5%)"';
  const { path, rhs } = splitAssignment(text, '--spread', example);
  const what = `--spread "${text}"`;
  let distribution: SpreadSpec['distribution'];
  let body: string;
  const normal = /^~\s*N\s*\(\s*(.*?)\s*\)$/i.exec(rhs);
  if (normal) {
    distribution = 'normal';
    body = normal[1]!;
  } else if (rhs.startsWith('±') || rhs.startsWith('+-') || rhs.startsWith('+/-')) {
    distribution = 'uniform';
    body = rhs.replace(/^(±|\+\/-|\+-)\s*/, '');
  } else {
    throw new SweepSpecError(`${what}: expected ±X (uniform) or ~N(X) (normal), like ${example}`);
  }
  const t = body.trim();
  if (t.endsWith('%')) {
    const p = Number(t.slice(0, -1));
    if (!(p >= 0 && p <= 1000) || t.slice(0, -1).trim() === '') throw new SweepSpecError(`${what}: "${t}" is not a percentage from 0% to 1000%`);
    return { path, text, distribution, relative: true, amount: p / 100, unit: '' };
  }
  const q = quantityOf(t, what);
  if (!(q.value >= 0)) throw new SweepSpecError(`${what}: the spread must be ≥ 0`);
  return { path, text, distribution, relative: false, amount: q.value, unit: q.unit };
}

/** The nominal value a spread varies around: the scenario's own value at the path. */
export function nominalValue(raw: unknown, spread: SpreadSpec): Quantity {
  let v: unknown;
  try {
    v = getAtPath(raw, spread.path);
  } catch (e) {
    if (e instanceof PathError) throw new SweepSpecError(`--spread "${spread.text}": ${e.message}`);
    throw e;
  }
  if (v === undefined) throw new SweepSpecError(`--spread "${spread.text}": the scenario has no value at ${spread.path} to spread around`);
  const q = typeof v === 'number' || typeof v === 'string' ? parseAnyQuantity(v) : undefined;
  if (!q) throw new SweepSpecError(`--spread "${spread.text}": the value at ${spread.path} (${JSON.stringify(v)}) is not a quantity`);
  if (!spread.relative && spread.unit !== '' && q.unit !== '' && spread.unit !== q.unit) {
    throw new SweepSpecError(`--spread "${spread.text}": the spread is in ${spread.unit}, the value at ${spread.path} ("${v}") in ${q.unit}`);
  }
  return { value: q.value, unit: q.unit || spread.unit };
}

/** "3/16" → { index: 3, count: 16 } (1-based, like CI matrices). */
export function parseShard(text: string): { index: number; count: number } {
  const m = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(text);
  if (!m) throw new SweepSpecError(`--shard "${text}": expected K/N like 3/16 (the K-th of N shards, counting from 1)`);
  const index = Number(m[1]);
  const count = Number(m[2]);
  if (!(count >= 1) || !(index >= 1 && index <= count)) throw new SweepSpecError(`--shard "${text}": K must be from 1 to N (shards count from 1, like CI matrices)`);
  return { index, count };
}

/** How many of `total` points shard K/N computes (without listing them). */
export function shardPointCount(total: number, shard: { index: number; count: number } | null): number {
  if (!shard) return total;
  return total >= shard.index ? Math.floor((total - shard.index) / shard.count) + 1 : 0;
}

/** Point indices (0-based) of shard K/N out of `total`: every N-th point starting at the K-th. */
export function shardPoints(total: number, shard: { index: number; count: number } | null): number[] {
  const out: number[] = [];
  const step = shard?.count ?? 1;
  for (let i = (shard?.index ?? 1) - 1; i < total; i += step) out.push(i);
  return out;
}
