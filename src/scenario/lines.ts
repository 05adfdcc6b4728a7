// LINE descriptions → per-unit-length R', L', G', C' (LineRLGC).
//
// Each way of describing a line is one entry of LINE_FORMS: the keys that identify it (all
// required), optional keys, an example for messages, and a builder that reads its keys and returns
// L' and C' (and R', G' if the form computes them). Adding a form (microstrip, stripline, coax, a
// datasheet fit ...) is adding an entry; readLine below picks the form from the keys present and
// reports a line given two ways, half a form, or unknown keys, without knowing any form itself.
//
// Losses "r" (ohm/m) and "g" (S/m) are accepted on every form whose `losses` is not false.
import type { LineRLGC } from '../../sim/model.js';
import { NON_NEGATIVE, POSITIVE, SPEED_OF_LIGHT } from '../units.js';
import type { Reader } from './read.js';
import type { LineForm } from './line-form.js';
import { toPlain, type SrcNode } from './parse.js';
import type { Pos } from './problems.js';
import { WIDEBAND_FORMS } from './line-geometry.js';

export type { LineForm, LineParams } from './line-form.js';

/** Loss keys accepted on every form (unless the form says otherwise). */
export const LOSS_KEYS = ['r', 'g'] as const;

const Z0 = { dim: 'resistance', range: POSITIVE, example: '50ohm' } as const;
const DELAY = { dim: 'delayPerLength', range: POSITIVE } as const;
const VELOCITY = { dim: 'velocity', range: POSITIVE } as const;

/** From Z0 and delay per length τ = 1/v: L' = Z0·τ, C' = τ/Z0 (lossless telegrapher relations Z0 = √(L'/C'), τ = √(L'C')). */
export function fromZ0AndDelay(z0: number, delayPerLength: number): { l: number; c: number } {
  return { l: z0 * delayPerLength, c: delayPerLength / z0 };
}

export const LINE_FORMS: LineForm[] = [
  {
    id: 'z0+delay',
    required: ['z0', 'delay'],
    example: '{"z0": "50ohm", "delay": "6.67ns/m"}',
    build(o) {
      const z0 = o.quantity('z0', Z0);
      const tau = o.quantity('delay', DELAY);
      return z0 === undefined || tau === undefined ? undefined : fromZ0AndDelay(z0, tau);
    },
  },
  {
    id: 'z0+velocity',
    required: ['z0', 'velocity'],
    example: '{"z0": "50ohm", "velocity": "0.66c"}',
    build(o) {
      const z0 = o.quantity('z0', Z0);
      const v = o.quantity('velocity', VELOCITY);
      return z0 === undefined || v === undefined ? undefined : fromZ0AndDelay(z0, 1 / v);
    },
  },
  {
    id: 'l+c',
    required: ['l', 'c'],
    example: '{"l": "250nH/m", "c": "100pF/m"}',
    build(o) {
      const l = o.quantity('l', { dim: 'inductancePerLength', range: POSITIVE });
      const c = o.quantity('c', { dim: 'capacitancePerLength', range: POSITIVE });
      return l === undefined || c === undefined ? undefined : { l, c };
    },
  },
  // Geometry (microstrip, stripline, coax, twoWire) and datasheet forms with frequency-dependent
  // loss: see line-geometry.ts.
  ...WIDEBAND_FORMS,
];

/** Every key any form (or the loss keys) knows, for unknown-key checks and suggestions. */
export function allLineKeys(forms: readonly LineForm[] = LINE_FORMS): string[] {
  const s = new Set<string>();
  for (const f of forms) {
    for (const k of f.required) s.add(k);
    for (const k of f.optional ?? []) s.add(k);
    if (f.losses !== false) for (const k of LOSS_KEYS) s.add(k);
  }
  return [...s];
}

const isSubset = (a: readonly string[], b: readonly string[]) => a.every((k) => b.includes(k));

/** The forms' examples joined with "or", for messages. */
function formsList(forms: readonly LineForm[]): string {
  return forms.map((f) => f.example).join(' or ');
}

/** Lines faster than this are refused (1 % allowance for rounded inputs like "3.33ns/m"). */
const MAX_SPEED = SPEED_OF_LIGHT * 1.01;

/**
 * Read an inline LINE object at `path`. Returns undefined after reporting problems.
 * `forms` defaults to LINE_FORMS (tests may pass their own table).
 */
export function readLine(reader: Reader, node: SrcNode | undefined, path: string, at?: Pos, forms: readonly LineForm[] = LINE_FORMS): LineRLGC | undefined {
  const o = reader.object(node, path, `a line like ${formsList(forms)}`, at);
  if (!o) return undefined;
  const present = o.keys();

  // Forms whose required keys are all present; one whose keys contain another's is the more specific.
  let matched = forms.filter((f) => isSubset(f.required, present));
  matched = matched.filter((f) => !matched.some((g) => g !== f && g.required.length > f.required.length && isSubset(f.required, g.required)));

  if (matched.length > 1) {
    // A line given two ways: say which keys clash, at the second way's first key.
    const [a, b] = matched;
    const extra = b.required.find((k) => !a.required.includes(k)) ?? b.required[0];
    const e = o.entry(extra);
    reader.problems.add(
      o.keyPath(extra),
      toPlain(e?.value),
      `a line given one way only: it is given both as ${a.id} and as ${b.id} — keep one of ${formsList(matched)}`,
      e?.keyPos ?? o.pos,
    );
    o.checkKeys(allLineKeys(forms));
    return undefined;
  }

  const all = allLineKeys(forms);
  if (matched.length === 0) {
    // Nothing complete: point at the form(s) most of whose keys are here, or list all forms.
    o.checkKeys(all);
    const score = (f: LineForm) => f.required.filter((k) => present.includes(k)).length;
    const bestN = Math.max(0, ...forms.map(score));
    const best = bestN > 0 ? forms.filter((f) => score(f) === bestN) : [];
    if (best.length === 1) {
      const f = best[0];
      for (const k of f.required) {
        if (!present.includes(k)) o.missing(k, `"${k}" to complete the ${f.id} form ${f.example}`);
      }
    } else if (best.length > 1) {
      const given = [...new Set(best.flatMap((f) => f.required.filter((k) => present.includes(k))))];
      reader.fail(path, node, `a complete line: ${given.map((k) => `"${k}"`).join(', ')} needs the rest of ${formsList(best)}`);
    } else {
      reader.fail(path, node, `a line like ${formsList(forms)} (losses "r", "g" are optional on any form)`);
    }
    return undefined;
  }

  const form = matched[0];
  const own = [...form.required, ...(form.optional ?? []), ...(form.losses !== false ? LOSS_KEYS : [])];
  // Keys of another form next to a complete one: the line is given two ways (e.g. z0+delay plus "l").
  let ok = true;
  for (const k of present) {
    if (own.includes(k) || !all.includes(k)) continue;
    ok = false;
    const other = forms.find((f) => f.required.includes(k) || f.optional?.includes(k));
    const e = o.entry(k);
    reader.problems.add(
      o.keyPath(k),
      toPlain(e?.value),
      `a line given one way only: "${k}" belongs to ${other ? other.id : 'another form'}, but this line is given as ${form.id} ${form.example}`,
      e?.keyPos ?? o.pos,
    );
  }
  ok = o.checkKeys(all) && ok;

  const p = form.build(o);
  let r = p?.r ?? 0;
  let g = p?.g ?? 0;
  if (form.losses !== false) {
    const rr = o.optQuantity('r', { dim: 'resistancePerLength', range: NON_NEGATIVE }, 0);
    const gg = o.optQuantity('g', { dim: 'conductancePerLength', range: NON_NEGATIVE }, 0);
    if (rr === undefined || gg === undefined) ok = false;
    else {
      r += rr;
      g += gg;
    }
  }
  if (!p || !ok) return undefined;

  // Physical sanity for every form: the wave may not outrun light, v = 1/√(L'C') ≤ c.
  const v = 1 / Math.sqrt(p.l * p.c);
  if (!(v <= MAX_SPEED)) {
    reader.fail(
      path,
      node,
      `a line no faster than light: this one gives v = 1/√(L'C') = ${(v / SPEED_OF_LIGHT).toFixed(3)}c (a delay of at least 3.336ns/m, 84.7ps/in)`,
    );
    return undefined;
  }
  return { ...p, r, g };
}
