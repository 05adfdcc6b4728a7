// The route and its receivers: a list of items from the driver pin to the main receiver, where a
// branch item attaches side routes that end at receivers of their own (to any depth). Item kinds are
// a table (ITEM_FORMS): each names its keys and reads its own; a new kind is a new entry.
//
//   { "name": "trace1", "line": "trace", "length": "3in" }
//   { "name": "r1",     "series": { "r": "22ohm" } }
//   { "name": "via1",   "shunt": [ { "c": "0.5pF" } ] }
//   { "name": "tee1",   "branch": { "route": [ ... ], "receiver": { "name": "ram2", "parts": [ ... ] } } }
//   { "name": "hub",    "branch": [ { "route": [...], "receiver": {...} }, { "route": [...], "receiver": {...} } ] }
import { selfLine } from '../../sim/circuit.js';
import type { Branch, LineRLGC, NamedReceiver, Part, RouteItem } from '../../sim/model.js';
import type { CoupledRead } from './coupled.js';
import { MAIN_RECEIVER } from '../../sim/model.js';
import { NON_NEGATIVE } from '../units.js';
import { readLine } from './lines.js';
import { readPart, readPartList } from './parts.js';
import { closest, type Pos } from './problems.js';
import { toPlain, type SrcNode } from './parse.js';
import { Obj, type Reader } from './read.js';

/** Probe targets that are not item or receiver names ("receiver" also names the main receiver). */
export const RESERVED_NAMES = ['driver', 'receiver'] as const;
export const RECEIVER_KEYS = ['name', 'parts'] as const;
export const BRANCH_KEYS = ['route', 'receiver'] as const;

/** What probes need to know about each named place (even one whose other keys were bad). */
export interface PlaceInfo {
  kind: 'line' | 'series' | 'shunt' | 'branch' | 'receiver';
  path: string;
  /** For a coupled line item: the section it names. */
  coupled?: string;
  /** Line length (m); undefined for the rest, or when the length was bad. */
  length?: number;
  /** For a receiver: the name the engine knows it by. */
  receiver?: string;
}

/** Everything read so far that later items and probes refer to. */
export interface RouteContext {
  lines: Map<string, LineRLGC | undefined>;
  /** Item and receiver names share one namespace (probes name both). */
  places: Map<string, PlaceInfo>;
  /** Coupled sections by name (undefined: a bad one, already reported). */
  coupled?: Map<string, CoupledRead | undefined>;
}

interface ItemForm {
  keys: readonly string[];
  read(r: Reader, o: Obj, name: string, ctx: RouteContext, info: PlaceInfo): RouteItem | undefined;
}

export const ITEM_FORMS: Readonly<Record<'line' | 'coupled' | 'series' | 'shunt' | 'branch', ItemForm>> = {
  line: { keys: ['name', 'line', 'length'], read: readLineItem },
  coupled: { keys: ['name', 'coupled', 'length'], read: readCoupledItem },
  series: {
    keys: ['name', 'series'],
    read: (r, o, name) => {
      const part = readPart(r, o.get('series'), o.keyPath('series'), false, o.pos);
      return part ? { kind: 'series', name, part } : undefined;
    },
  },
  shunt: {
    keys: ['name', 'shunt'],
    read: (r, o, name) => {
      const parts = readPartList(r, o.get('shunt'), o.keyPath('shunt'), false, o.pos);
      return parts ? { kind: 'shunt', name, parts } : undefined;
    },
  },
  branch: { keys: ['name', 'branch'], read: readBranchItem },
};
export const ITEM_KINDS = Object.keys(ITEM_FORMS) as (keyof typeof ITEM_FORMS)[];

const ITEM_WHAT =
  'a route item like {"name": "trace1", "line": "trace", "length": "3in"}, {"name": "r1", "series": {"r": "22ohm"}}, {"name": "c1", "shunt": {"c": "3pF"}} or {"name": "tee1", "branch": {"route": [...], "receiver": {"name": "rx2"}}}';
const BRANCH_WHAT = 'a branch like {"route": [{"name": "stub", "line": "trace", "length": "1in"}], "receiver": {"name": "rx2", "parts": [{"c": "3pF"}]}}';

/** A list of route items at `path` (the top-level route, or a branch's). */
export function readRouteList(r: Reader, node: SrcNode | undefined, path: string, ctx: RouteContext, at: Pos | undefined, what: string): RouteItem[] | undefined {
  const seq = r.list(node, path, what, at);
  if (!seq) return undefined;
  const route: RouteItem[] = [];
  let ok = true;
  for (const it of Obj.items(seq, path)) {
    const item = readItem(r, it.node, it.path, ctx, seq.pos);
    if (item) route.push(item);
    else ok = false;
  }
  return ok ? route : undefined;
}

function readItem(r: Reader, node: SrcNode, path: string, ctx: RouteContext, at?: Pos): RouteItem | undefined {
  const o = r.object(node, path, ITEM_WHAT, at);
  if (!o) return undefined;
  const kinds = ITEM_KINDS.filter((k) => o.has(k));
  const allKeys = [...new Set(Object.values(ITEM_FORMS).flatMap((f) => f.keys))];
  if (kinds.length !== 1) {
    o.checkKeys(allKeys);
    if (kinds.length === 0) r.fail(path, node, 'a route item with one of "line" (with "length"), "series" or "shunt", or a "branch" with side routes', at);
    else {
      const second = o.entry(kinds[1])!;
      r.problems.add(o.keyPath(kinds[1]), toPlain(second.value), `one of ${ITEM_KINDS.map((k) => `"${k}"`).join(', ')} per item, not both "${kinds[0]}" and "${kinds[1]}" (make two items)`, second.keyPos ?? o.pos);
    }
    return undefined;
  }
  const kind = kinds[0];
  const keysOk = o.checkKeys(ITEM_FORMS[kind].keys, allKeys);
  const info: PlaceInfo = { kind: kind === 'coupled' ? 'line' : kind, path };
  const name = readName(r, o, path, ctx, info, 'an item name like "trace1"');
  const item = ITEM_FORMS[kind].read(r, o, name ?? path, ctx, info);
  return keysOk && name !== undefined ? item : undefined;
}

/**
 * Name of an item or receiver: optional for items (defaults to the path, "route[2]"); unique among
 * items and receivers; never "driver", and "receiver" only for the main receiver.
 */
function readName(r: Reader, o: Obj, fallback: string, ctx: RouteContext, info: PlaceInfo, what: string, required = false): string | undefined {
  let name: string | undefined = fallback;
  if (!o.has('name')) {
    if (required) return o.missing('name', `${what} (every receiver of a branch has a name; probes and checks use it)`);
  } else {
    name = o.string('name', what);
    if (name !== undefined && name.trim() === '') name = r.fail(o.keyPath('name'), o.get('name'), `a non-empty ${what}`, o.pos);
    else if (name !== undefined && (RESERVED_NAMES as readonly string[]).includes(name)) {
      name = r.fail(o.keyPath('name'), o.get('name'), `a name other than "driver" and "receiver" (those name the driver pin and the main receiver in probes)`, o.pos);
    }
  }
  if (name === undefined) return undefined;
  const prev = ctx.places.get(name);
  if (prev) {
    const whose = prev.kind === info.kind || (prev.kind !== 'receiver' && info.kind !== 'receiver') ? '' : '; items and receivers share one set of names';
    r.fail(o.has('name') ? o.keyPath('name') : fallback, o.get('name') ?? o.node, `a unique ${info.kind === 'receiver' ? 'receiver' : 'item'} name ("${name}" is also ${prev.path}'s name${whose})`, o.pos);
    return undefined;
  }
  ctx.places.set(name, info);
  return name;
}

function readLineItem(r: Reader, o: Obj, name: string, ctx: RouteContext, info: PlaceInfo): RouteItem | undefined {
  const lineNode = o.get('line')!;
  let line: LineRLGC | undefined;
  let ok = true;
  if (lineNode.type === 'scalar' && typeof lineNode.value === 'string') {
    const ref = lineNode.value;
    if (!ctx.lines.has(ref)) {
      const names = [...ctx.lines.keys()];
      const guess = closest(ref, names);
      r.fail(
        o.keyPath('line'),
        lineNode,
        names.length > 0
          ? `the name of a line in "lines" (${names.map((n) => `"${n}"`).join(', ')})${guess ? ` — did you mean "${guess}"?` : ''} — or a line description`
          : 'a line description like {"z0": "50ohm", "delay": "6.67ns/m"} (no "lines" are named in this file)',
        o.pos,
      );
    } else {
      line = ctx.lines.get(ref);
      if (!line) ok = false; // its own problems were reported under lines.<name>
    }
  } else {
    line = readLine(r, lineNode, o.keyPath('line'), o.pos);
  }
  const length = o.quantity('length', { dim: 'length', range: NON_NEGATIVE, example: '3in' });
  info.length = length;
  if (!ok || line === undefined || length === undefined) return undefined;
  return { kind: 'line', name, line, length };
}

/**
 * A conductor of a coupled section: {"name": "clk_run", "coupled": "bus", "length": "40mm"}. Its line is
 * the conductor's self terms (L_ii, C_ii, R_ii, G_ii); the run uses the section's matrices.
 */
function readCoupledItem(r: Reader, o: Obj, name: string, ctx: RouteContext, info: PlaceInfo): RouteItem | undefined {
  const length = o.quantity('length', { dim: 'length', range: { min: 0, minExclusive: true }, example: '40mm' });
  info.length = length;
  const ref = o.string('coupled', 'the name of a section in "coupled"');
  if (ref === undefined) return undefined;
  info.coupled = ref;
  const sections: Map<string, CoupledRead | undefined> = ctx.coupled ?? new Map();
  if (!sections.has(ref)) {
    const names = [...sections.keys()];
    const guess = closest(ref, names);
    return r.fail(
      o.keyPath('coupled'),
      o.get('coupled'),
      names.length ? `the name of a section in "coupled" (${names.map((n) => `"${n}"`).join(', ')})${guess ? ` — did you mean "${guess}"?` : ''}` : 'the name of a section in "coupled" (this file has no "coupled" key)',
      o.pos,
    );
  }
  const sec = sections.get(ref);
  if (!sec) return undefined; // reported under coupled.<ref>
  const j = sec.spec.conductors.indexOf(name);
  if (j < 0) return r.fail(o.has('name') ? o.keyPath('name') : o.path, o.get('name') ?? o.node, `one of the conductors of "${ref}" (${sec.spec.conductors.map((c) => `"${c}"`).join(', ')}): list "${name}" in ${sec.path}.conductors`, o.pos);
  if (length === undefined) return undefined;
  return { kind: 'line', name, line: selfLine(sec.spec.line, j), length };
}

/** "branch": one BRANCH or a non-empty list of them (a star). */
function readBranchItem(r: Reader, o: Obj, name: string, ctx: RouteContext): RouteItem | undefined {
  const node = o.get('branch')!;
  const path = o.keyPath('branch');
  if (node.type === 'seq') {
    if (node.items.length === 0) return r.fail(path, node, `at least one branch, like [${BRANCH_WHAT}]`, o.pos);
    const branches: Branch[] = [];
    let ok = true;
    for (const it of Obj.items(node, path)) {
      const b = readBranch(r, it.node, it.path, ctx, node.pos ?? o.pos);
      if (b) branches.push(b);
      else ok = false;
    }
    return ok ? { kind: 'branch', name, branches } : undefined;
  }
  const b = readBranch(r, node, path, ctx, o.pos);
  return b ? { kind: 'branch', name, branches: [b] } : undefined;
}

function readBranch(r: Reader, node: SrcNode, path: string, ctx: RouteContext, at?: Pos): Branch | undefined {
  const o = r.object(node, path, `${BRANCH_WHAT} or a list of such branches`, at);
  if (!o) return undefined;
  let ok = o.checkKeys(BRANCH_KEYS);
  let route: RouteItem[] | undefined;
  const routeWhat = 'a non-empty list of route items, like [{"name": "stub", "line": "trace", "length": "1in"}] (a part right at the branch point is a "shunt" item instead)';
  if (!o.has('route')) ok = !!o.missing('route', `the branch's route: ${routeWhat}`);
  else {
    const rn = o.get('route')!;
    if (rn.type === 'seq' && rn.items.length === 0) ok = !!r.fail(o.keyPath('route'), rn, routeWhat, o.pos);
    else route = readRouteList(r, rn, o.keyPath('route'), ctx, o.pos, routeWhat);
  }
  let receiver: NamedReceiver | undefined;
  if (!o.has('receiver')) ok = !!o.missing('receiver', 'the receiver the branch ends at, with a name, like {"name": "rx2", "parts": [{"c": "3pF"}]} ({"name": "stub1"} for an open stub)');
  else receiver = readReceiver(r, o.get('receiver'), o.keyPath('receiver'), ctx, false, o.pos);
  if (!ok || !route || !receiver) return undefined;
  return { route, receiver };
}

/**
 * A receiver: {"name": …, "parts": PART or [PART, …]}; no parts = an open end. The main receiver's
 * name is optional ("receiver"); a branch's is required.
 */
export function readReceiver(r: Reader, node: SrcNode | undefined, path: string, ctx: RouteContext, main: boolean, at?: Pos): NamedReceiver | undefined {
  const o = r.object(node, path, main ? 'a receiver like {"parts": [{"c": "3pF"}]} (or {} for an open end)' : 'a receiver like {"name": "rx2", "parts": [{"c": "3pF"}]} ({"name": "stub1"} for an open stub)', at);
  if (!o) return undefined;
  const keysOk = o.checkKeys(RECEIVER_KEYS);
  const info: PlaceInfo = { kind: 'receiver', path };
  let name: string | undefined = MAIN_RECEIVER;
  // the main receiver is "receiver" unless named otherwise (saying so explicitly is fine)
  const explicitDefault = main && o.get('name')?.type === 'scalar' && (o.get('name') as { value: unknown }).value === MAIN_RECEIVER;
  if ((!main || o.has('name')) && !explicitDefault) name = readName(r, o, path, ctx, info, 'a receiver name like "rx2"', !main);
  if (name === MAIN_RECEIVER) ctx.places.set(MAIN_RECEIVER, info);
  if (name !== undefined) info.receiver = name;
  let parts: Part[] | undefined = [];
  if (o.has('parts')) parts = readPartList(r, o.get('parts'), o.keyPath('parts'), true, o.pos);
  if (!keysOk || name === undefined || !parts) return undefined;
  return { name, parts };
}
