// Changes to a scenario's raw value (the parsed JSON/YAML, before validation): the advisor adds its
// parts here, so every candidate goes through the same validator as a file, and the winner is
// written back as a scenario a user can read. The original value is never changed: callers clone.
//
// Receivers in the raw value: the main one at the top level (`receiver`, possibly absent), the
// branches' inside branch items (`branch`: one BRANCH or a list), each with `parts`: one PART or a list.
import { formatSI } from '../units.js';

export type Obj = Record<string, unknown>;

export function isObj(v: unknown): v is Obj {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

export function cloneValue<T>(v: T): T {
  return structuredClone(v);
}

/** The top-level route list (created empty when missing). */
export function rawRoute(root: Obj): Obj[] {
  if (!Array.isArray(root.route)) root.route = [];
  return root.route as Obj[];
}

/** The BRANCH objects of a branch item, as a list. */
export function rawBranches(item: Obj): Obj[] {
  const b = item.branch;
  if (Array.isArray(b)) return b.filter(isObj);
  return isObj(b) ? [b] : [];
}

/** A receiver's raw object and name: the main one first, then every branch's in depth-first order. */
export interface RawReceiver {
  name: string;
  holder: Obj;
}

/** Every receiver's raw object (the main one's is created when the scenario has none). */
export function rawReceivers(root: Obj): RawReceiver[] {
  if (!isObj(root.receiver)) root.receiver = {};
  const main = root.receiver as Obj;
  const out: RawReceiver[] = [{ name: typeof main.name === 'string' ? main.name : 'receiver', holder: main }];
  const walk = (route: unknown) => {
    if (!Array.isArray(route)) return;
    for (const it of route) {
      if (!isObj(it) || it.branch === undefined) continue;
      for (const b of rawBranches(it)) {
        walk(b.route);
        if (isObj(b.receiver)) out.push({ name: String(b.receiver.name), holder: b.receiver });
      }
    }
  };
  walk(root.route);
  return out;
}

/** A receiver's parts as a list (the holder keeps the list from now on). */
export function rawParts(holder: Obj): unknown[] {
  const p = holder.parts;
  const list = p === undefined ? [] : Array.isArray(p) ? p : [p];
  holder.parts = list;
  return list;
}

/** "39ohm", "4.7kohm", "120pF": a value in SI units as a scenario quantity (7 significant digits). */
export function quantity(value: number, unit: 'ohm' | 'F' | 'V'): string {
  return formatSI(value, unit, 7, { ascii: true }).replace(/\s+/g, '');
}

/** A PART: a resistor (and capacitor in series) to a rail. */
export function rawPart(r: number, opts: { c?: number; to?: number } = {}): Obj {
  const part: Obj = { r: quantity(r, 'ohm') };
  if (opts.c !== undefined) part.c = quantity(opts.c, 'F');
  if (opts.to !== undefined && opts.to !== 0) part.to = quantity(opts.to, 'V');
  return part;
}

/** A series route item holding a resistor. */
export function rawSeries(name: string, r: number): Obj {
  return { name, series: { r: quantity(r, 'ohm') } };
}
