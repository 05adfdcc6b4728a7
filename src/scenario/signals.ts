// SIGNAL → Signal. One entry per kind in SIGNAL_KINDS (keys, example, builder); adding a kind is
// adding an entry here and a case in the engine's waveform code.
//
// Conventions (IEEE 181): "rise"/"fall" are 10–90 % times; each edge is a linear ramp lasting
// rise/0.8 (fall/0.8); "start" is where the first ramp starts (default 0); "fall" defaults to "rise";
// pulse "width" is 50 %-to-50 %; clock "duty" is the high fraction of the period (default 0.5).
import type { Signal } from '../../sim/model.js';
import { prbs } from '../../sim/prbs.js';
import { NON_NEGATIVE, POSITIVE, formatSI } from '../units.js';
import { closest } from './problems.js';
import { Obj, type Reader } from './read.js';
import type { SrcNode } from './parse.js';
import type { Pos } from './problems.js';

export interface SignalKind {
  kind: Signal['kind'];
  /** Keys besides "kind". */
  keys: readonly string[];
  example: string;
  build(o: Obj, r: Reader): Signal | undefined;
}

const V = (example: string) => ({ dim: 'voltage', example }) as const;
const EDGE = { dim: 'time', range: POSITIVE, example: '600ps' } as const;
const START = { dim: 'time', range: NON_NEGATIVE, example: '1ns' } as const;
const FRACTION_01 = { dim: 'fraction', range: { min: 0, max: 1, minExclusive: true, maxExclusive: true }, example: '50%' } as const;

const allDefined = (...xs: unknown[]) => xs.every((x) => x !== undefined);

/** "fall" defaults to "rise"; undefined if either is bad. */
function edges(o: Obj): { rise: number | undefined; fall: number | undefined } {
  const rise = o.quantity('rise', EDGE);
  const fall = o.has('fall') ? o.quantity('fall', EDGE) : rise;
  return { rise, fall };
}

/** Report `key` unless value ≥ min (edges are ramps of rise/0.8 and must not overlap). */
function atLeast(o: Obj, key: string, value: number, min: number, expected: (min: string) => string): boolean {
  if (value >= min * (1 - 1e-12)) return true;
  o.reader.fail(o.keyPath(key), o.get(key), expected(formatSI(min, 's').replace(' ', '')), o.pos);
  return false;
}

export const PATTERNS: Readonly<Record<string, 7 | 9 | 15>> = { prbs7: 7, prbs9: 9, prbs15: 15 };

export const SIGNAL_KINDS: SignalKind[] = [
  {
    kind: 'step',
    keys: ['from', 'to', 'start', 'rise'],
    example: '{"kind": "step", "from": "0V", "to": "3.3V", "start": "1ns", "rise": "600ps"}',
    build(o) {
      const from = o.quantity('from', V('0V'));
      const to = o.quantity('to', V('3.3V'));
      const start = o.optQuantity('start', START, 0);
      const rise = o.quantity('rise', EDGE);
      if (!allDefined(from, to, start, rise)) return undefined;
      if (from === to) o.reader.warn(o.keyPath('to'), o.get('to'), `a "to" different from "from": this step has no edge`, o.pos);
      return { kind: 'step', from: from!, to: to!, start: start!, rise: rise! };
    },
  },
  {
    kind: 'pulse',
    keys: ['from', 'to', 'start', 'rise', 'width', 'fall'],
    example: '{"kind": "pulse", "from": "0V", "to": "3.3V", "start": "1ns", "rise": "600ps", "width": "4ns"}',
    build(o) {
      const from = o.quantity('from', V('0V'));
      const to = o.quantity('to', V('3.3V'));
      const start = o.optQuantity('start', START, 0);
      const { rise, fall } = edges(o);
      const width = o.quantity('width', { dim: 'time', range: POSITIVE, example: '4ns' });
      if (!allDefined(from, to, start, rise, fall, width)) return undefined;
      // width is 50 %-to-50 %: the rising ramp's second half and the falling ramp's first half must fit in it.
      const minWidth = (rise! + fall!) / 1.6;
      if (!atLeast(o, 'width', width!, minWidth, (m) => `a width ≥ (rise + fall)/1.6 = ${m} so the pulse reaches its top`)) return undefined;
      return { kind: 'pulse', from: from!, to: to!, start: start!, rise: rise!, width: width!, fall: fall! };
    },
  },
  {
    kind: 'clock',
    keys: ['low', 'high', 'period', 'rise', 'fall', 'duty', 'start'],
    example: '{"kind": "clock", "low": "0V", "high": "3.3V", "period": "40ns", "rise": "1ns"}',
    build(o) {
      const low = o.quantity('low', V('0V'));
      const high = o.quantity('high', V('3.3V'));
      const period = o.quantity('period', { dim: 'time', range: POSITIVE, example: '40ns' });
      const { rise, fall } = edges(o);
      const duty = o.optQuantity('duty', FRACTION_01, 0.5);
      const start = o.optQuantity('start', START, 0);
      if (!allDefined(low, high, period, rise, fall, duty, start)) return undefined;
      // Each level must last at least the slower edge's ramp, max(rise, fall)/0.8.
      const minPeriod = Math.max(rise!, fall!) / 0.8 / Math.min(duty!, 1 - duty!);
      if (!atLeast(o, 'period', period!, minPeriod, (m) => `a period ≥ ${m} so that with duty ${duty} each level lasts at least max(rise, fall)/0.8`)) return undefined;
      return { kind: 'clock', low: low!, high: high!, period: period!, rise: rise!, fall: fall!, duty: duty!, start: start! };
    },
  },
  {
    kind: 'bits',
    keys: ['low', 'high', 'bitTime', 'rise', 'fall', 'start', 'pattern'],
    example: '{"kind": "bits", "low": "0V", "high": "3.3V", "bitTime": "5ns", "rise": "600ps", "pattern": "prbs7"}',
    build(o, r) {
      const low = o.quantity('low', V('0V'));
      const high = o.quantity('high', V('3.3V'));
      const bitTime = o.quantity('bitTime', { dim: 'time', range: POSITIVE, example: '5ns' });
      const { rise, fall } = edges(o);
      const start = o.optQuantity('start', START, 0);
      const pat = readPattern(o, r);
      if (!allDefined(low, high, bitTime, rise, fall, start, pat)) return undefined;
      // A lone bit must reach its level: the bit lasts at least the slower edge's ramp, max(rise, fall)/0.8.
      const minBit = Math.max(rise!, fall!) / 0.8;
      if (!atLeast(o, 'bitTime', bitTime!, minBit, (m) => `a bit time ≥ max(rise, fall)/0.8 = ${m} so a lone bit reaches its level`)) return undefined;
      return { kind: 'bits', low: low!, high: high!, bitTime: bitTime!, rise: rise!, fall: fall!, start: start!, bits: pat!.bits, patternName: pat!.name };
    },
  },
  {
    kind: 'table',
    keys: ['points'],
    example: '{"kind": "table", "points": [["0ns", "0V"], ["1ns", "3.3V"]]}',
    build(o, r) {
      const node = o.get('points');
      const what = 'at least two [time, voltage] points with increasing times, like [["0ns", "0V"], ["1ns", "3.3V"]]';
      const seq = r.list(node, o.keyPath('points'), what, o.pos);
      if (!seq) return undefined;
      if (seq.items.length < 2) return r.fail(o.keyPath('points'), node, what, o.pos);
      const points: Array<readonly [number, number]> = [];
      let ok = true;
      let prevT = -Infinity;
      for (const it of Obj.items(seq, o.keyPath('points'))) {
        const pair = it.node;
        if (pair.type !== 'seq' || pair.items.length !== 2) {
          r.fail(it.path, pair, 'a [time, voltage] pair like ["1ns", "3.3V"]', seq.pos);
          ok = false;
          continue;
        }
        const t = r.quantity(pair.items[0], `${it.path}[0]`, { dim: 'time', range: NON_NEGATIVE, example: '1ns' }, pair.pos);
        const v = r.quantity(pair.items[1], `${it.path}[1]`, { dim: 'voltage', example: '3.3V' }, pair.pos);
        if (t === undefined || v === undefined) {
          ok = false;
          continue;
        }
        if (!(t > prevT)) {
          r.fail(`${it.path}[0]`, pair.items[0], `a time later than the previous point's ${formatSI(prevT, 's')} (times must increase)`, pair.pos);
          ok = false;
        }
        prevT = t;
        points.push([t, v] as const);
      }
      return ok ? { kind: 'table', points } : undefined;
    },
  },
];

/** "prbs7" | "prbs9" | "prbs15" (any case) | a literal string of 0/1 (spaces and "_" ignored). */
function readPattern(o: Obj, r: Reader): { bits: Uint8Array; name: string } | undefined {
  const path = o.keyPath('pattern');
  const expected = '"prbs7", "prbs9", "prbs15" or a string of 0 and 1 like "0110"';
  const s = r.string(o.get('pattern'), path, expected, o.pos);
  if (s === undefined) return undefined;
  const key = s.trim().toLowerCase();
  const order = Object.hasOwn(PATTERNS, key) ? PATTERNS[key] : undefined;
  if (order !== undefined) return { bits: prbs(order), name: key };
  const literal = s.replace(/[\s_]/g, '');
  if (literal.length === 0 || !/^[01]+$/.test(literal)) return r.fail(path, o.get('pattern'), expected, o.pos);
  return { bits: Uint8Array.from(literal, (ch) => (ch === '1' ? 1 : 0)), name: 'literal' };
}

export function readSignal(reader: Reader, node: SrcNode | undefined, path: string, at?: Pos, kinds: readonly SignalKind[] = SIGNAL_KINDS): Signal | undefined {
  const names = kinds.map((k) => k.kind);
  const o = reader.object(node, path, `a signal like ${kinds[0].example}`, at);
  if (!o) return undefined;
  if (!o.has('kind')) {
    o.missing('kind', `"kind": one of ${names.map((n) => `"${n}"`).join(', ')}`);
    o.checkKeys(['kind', ...new Set(kinds.flatMap((k) => k.keys))]);
    return undefined;
  }
  const kindName = reader.string(o.get('kind'), o.keyPath('kind'), `one of ${names.map((n) => `"${n}"`).join(', ')}`, o.pos);
  if (kindName === undefined) return undefined;
  const kind = kinds.find((k) => k.kind === kindName);
  if (!kind) {
    const guess = closest(kindName, names);
    reader.fail(o.keyPath('kind'), o.get('kind'), `one of ${names.map((n) => `"${n}"`).join(', ')}${guess ? ` (did you mean "${guess}"?)` : ''}`, o.pos);
    return undefined;
  }
  const keysOk = o.checkKeys(['kind', ...kind.keys]);
  const s = kind.build(o, reader);
  return keysOk ? s : undefined;
}
