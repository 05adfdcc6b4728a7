// Paths into a scenario's raw value (the parsed JSON/YAML, before validation), using item names:
//
//   route.r1.series.r        the "series" part of the route item named "r1"
//   route[2].length          the third route item (by position)
//   route.tee1.branch.route.stub1.length   an item inside a branch (a star: route.hub.branch[1].route...)
//   route.tee1.branch.receiver.parts[0].c  a branch's receiver
//   lines.trace.z0           a named line model (every item that uses it changes)
//   driver.resistance, driver.signal.rise, receiver.parts[0].c, run.cellsPerRise
//
// A key is a run of letters, digits, "_", "-" and "$", or a quoted string (`lines."my trace".z0`);
// `[n]` indexes a list. After `route` (the top level's or a branch's), a key names a route item by its
// "name"; a name that is not on that route but elsewhere in the tree is reported with its full path.
// Setting a value copies the scenario (the original is never changed) and creates a missing last
// key, so a default can be swept too; the validator then checks the result like any scenario.

import { editDistance } from '../scenario/problems.js';

export type PathStep = { kind: 'key'; key: string } | { kind: 'index'; index: number };

export class PathError extends Error {
  constructor(
    message: string,
    /** 0-based character position in the path text, when the problem is at one. */
    readonly position?: number,
  ) {
    super(message);
    this.name = 'PathError';
  }
}

const KEY_CHAR = /[A-Za-z0-9_$-]/;

/** Parses a path; throws PathError with the position of the problem. */
export function parsePath(text: string): PathStep[] {
  const steps: PathStep[] = [];
  let i = 0;
  const n = text.length;
  if (n === 0) throw new PathError('empty path: expected something like route.r1.series.r or lines.trace.z0', 0);
  let expectKey = true;
  while (i < n) {
    const c = text[i]!;
    if (c === '[') {
      const end = text.indexOf(']', i);
      if (end < 0) throw new PathError(`"[" at ${i + 1} has no closing "]"`, i);
      const body = text.slice(i + 1, end).trim();
      if (!/^\d+$/.test(body)) throw new PathError(`expected a list index like [0] at ${i + 1}, found "[${body}]"`, i);
      if (steps.length === 0) throw new PathError('a path starts with a key (route, lines, driver, receiver, run, ...), not an index', i);
      steps.push({ kind: 'index', index: Number(body) });
      i = end + 1;
      expectKey = false;
      continue;
    }
    if (c === '.') {
      if (expectKey) throw new PathError(`unexpected "." at ${i + 1}: expected a key`, i);
      i++;
      expectKey = true;
      if (i >= n) throw new PathError('the path ends with "."; expected a key after it', i - 1);
      continue;
    }
    if (!expectKey) throw new PathError(`expected "." or "[" at ${i + 1}, found "${c}"`, i);
    if (c === '"') {
      let j = i + 1;
      let key = '';
      while (j < n && text[j] !== '"') {
        if (text[j] === '\\' && j + 1 < n) j++;
        key += text[j];
        j++;
      }
      if (j >= n) throw new PathError(`the quote at ${i + 1} is not closed`, i);
      steps.push({ kind: 'key', key });
      i = j + 1;
    } else if (KEY_CHAR.test(c)) {
      let j = i;
      while (j < n && KEY_CHAR.test(text[j]!)) j++;
      steps.push({ kind: 'key', key: text.slice(i, j) });
      i = j;
    } else {
      throw new PathError(`unexpected "${c}" at ${i + 1}: keys are letters, digits, "_" and "-" (quote others: "my key")`, i);
    }
    expectKey = false;
  }
  return steps;
}

/** The canonical text of a path. */
export function formatPath(steps: readonly PathStep[]): string {
  let s = '';
  steps.forEach((st, i) => {
    if (st.kind === 'index') s += `[${st.index}]`;
    else {
      const k = /^[A-Za-z0-9_$-]+$/.test(st.key) ? st.key : JSON.stringify(st.key);
      s += i === 0 ? k : `.${k}`;
    }
  });
  return s;
}

type Container = Record<string, unknown> | unknown[];

function isObject(v: unknown): v is Record<string, unknown> {
  return v !== null && typeof v === 'object' && !Array.isArray(v);
}

function describe(v: unknown): string {
  return Array.isArray(v) ? 'a list' : isObject(v) ? 'an object' : v === undefined ? 'nothing' : JSON.stringify(v);
}

/**
 * Up to `n` whole paths like `steps` with step `at` replaced by the nearest of `candidates` (by edit
 * distance, ties in the given order), for "nearest valid paths" in messages.
 */
export function nearestPaths(steps: readonly PathStep[], at: number, candidates: readonly string[], n = 3): string[] {
  const word = steps[at]?.kind === 'key' ? (steps[at] as { key: string }).key.toLowerCase() : '';
  return candidates
    .map((c, order) => ({ c, d: editDistance(word, c.toLowerCase()), order }))
    .sort((a, b) => a.d - b.d || a.order - b.order)
    .slice(0, n)
    .map(({ c }) => formatPath(steps.map((st, k) => (k === at ? { kind: 'key' as const, key: c } : st))));
}

function nearestText(paths: readonly string[]): string {
  return paths.length ? ` — nearest valid path${paths.length > 1 ? 's' : ''}: ${paths.join(', ')}` : '';
}

/**
 * Position of a route item by name; throws PathError listing the names here, where the name is if it
 * sits elsewhere in the route tree, or else the nearest valid paths.
 */
function routeIndex(route: unknown[], name: string, where: string, root: unknown, concrete: string, steps: readonly PathStep[], at: number): number {
  const i = route.findIndex((it) => isObject(it) && it.name === name);
  if (i >= 0) return i;
  const names = route.map((it, k) => (isObject(it) && typeof it.name === 'string' ? it.name : `[${k}]`));
  const elsewhere = findItemPath(isObject(root) ? root.route : undefined, name, 'route');
  // otherwise candidates that lead on: items with the next key of the path ("series" for route.x.series.r)
  const next = steps[at + 1];
  const leads = (it: unknown) => next === undefined || (next.kind === 'key' && isObject(it) && Object.prototype.hasOwnProperty.call(it, next.key));
  const named = route.filter((it) => isObject(it) && typeof it.name === 'string' && leads(it)).map((it) => (it as { name: string }).name);
  const hint = elsewhere ? ` — "${name}" is at ${elsewhere}` : nearestText(nearestPaths(steps, at, named));
  const list = concrete === 'route' ? '' : ` in ${concrete}`;
  throw new PathError(`${where}: no route item named "${name}"${list} (route items: ${names.join(', ') || 'none'})${hint}`);
}

/** The path by names of a route item anywhere in the route tree (`route.tee1.branch.route.stub1`), if any. */
export function findItemPath(route: unknown, name: string, prefix: string): string | undefined {
  if (!Array.isArray(route)) return undefined;
  for (const it of route) {
    if (!isObject(it)) continue;
    const key = typeof it.name === 'string' ? formatPath([{ kind: 'key', key: it.name }]) : undefined;
    if (it.name === name) return `${prefix}.${key}`;
    if (key === undefined || it.branch === undefined) continue;
    const branches = Array.isArray(it.branch) ? it.branch : [it.branch];
    for (let b = 0; b < branches.length; b++) {
      const br = branches[b];
      const at = `${prefix}.${key}.branch${Array.isArray(it.branch) ? `[${b}]` : ''}.route`;
      const found = isObject(br) ? findItemPath(br.route, name, at) : undefined;
      if (found) return found;
    }
  }
  return undefined;
}

/** True when `concrete` names a route list: the top level's or a branch's. */
function isRouteList(concrete: string): boolean {
  return concrete === 'route' || concrete.endsWith('.route');
}

interface Resolved {
  /** The object or list holding the value. */
  parent: Container;
  key: string | number;
  /** Canonical path with route items by position, for messages. */
  concrete: string;
}

/** Walks `steps` through `root` to the holder of the last step. */
function resolve(root: unknown, steps: readonly PathStep[], text: string): Resolved {
  let cur: unknown = root;
  let concrete = '';
  for (let k = 0; k < steps.length; k++) {
    const st = steps[k]!;
    const last = k === steps.length - 1;
    const where = concrete === '' ? text : `${text} (at ${concrete})`;
    let key: string | number;
    if (st.kind === 'index') {
      if (!Array.isArray(cur)) throw new PathError(`${where}: [${st.index}] indexes a list, but here is ${describe(cur)}`);
      if (st.index >= cur.length) throw new PathError(`${where}: index [${st.index}] is past the end of a list of ${cur.length}`);
      key = st.index;
      concrete += `[${st.index}]`;
    } else if (Array.isArray(cur) && isRouteList(concrete)) {
      key = routeIndex(cur, st.key, text, root, concrete, steps, k);
      concrete += `[${key}]`;
    } else {
      if (!isObject(cur)) throw new PathError(`${where}: "${st.key}" is a key of an object, but here is ${describe(cur)}`);
      if (!last && !Object.prototype.hasOwnProperty.call(cur, st.key)) {
        const keys = Object.keys(cur);
        throw new PathError(`${where}: no key "${st.key}"${keys.length ? ` (keys here: ${keys.join(', ')})` : ''}${nearestText(nearestPaths(steps, k, keys))}`);
      }
      key = st.key;
      concrete += concrete === '' ? st.key : `.${st.key}`;
    }
    if (last) return { parent: cur as Container, key, concrete };
    cur = (cur as Record<string | number, unknown>)[key];
  }
  throw new PathError('empty path');
}

/** The value at a path (undefined when the last key is absent). Throws PathError when the way there does not exist. */
export function getAtPath(root: unknown, text: string): unknown {
  const r = resolve(root, parsePath(text), text);
  return Array.isArray(r.parent) ? r.parent[r.key as number] : Object.prototype.hasOwnProperty.call(r.parent, r.key) ? r.parent[r.key as string] : undefined;
}

/** The path with route items by position (`route.r1.series.r` → `route[0].series.r`), as the validator names keys. */
export function concretePath(root: unknown, text: string): string {
  return resolve(root, parsePath(text), text).concrete;
}

/** A deep copy of `root` (plain data). */
export function clonePlain<T>(root: T): T {
  return structuredClone(root);
}

/** Sets values at paths in a copy of `root`; the original is left unchanged. */
export function withValues(root: unknown, assignments: ReadonlyArray<{ path: string; value: unknown }>): unknown {
  const copy = clonePlain(root);
  for (const a of assignments) {
    const r = resolve(copy, parsePath(a.path), a.path);
    if (Array.isArray(r.parent)) r.parent[r.key as number] = a.value;
    // defineProperty: a key named "__proto__" is set as data, never as the object's prototype.
    else Object.defineProperty(r.parent, r.key as string, { value: a.value, writable: true, enumerable: true, configurable: true });
  }
  return copy;
}
