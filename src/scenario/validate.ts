// Scenario tree → Net, collecting every problem on the way (see docs/scenario-format.md).
//
// The sections are read one after another and each reader reports into the same Problems list;
// a bad section yields undefined and the others are still checked, so one run lists everything.
// Line forms live in lines.ts, signal kinds in signals.ts, parts in parts.ts.
import type { LineRLGC, Net, Part, ProbeSpec, RouteItem, RunSettings, Signal } from '../../sim/model.js';
import { NON_NEGATIVE, POSITIVE, formatSI, parseQuantity } from '../units.js';
import { readLine } from './lines.js';
import { readPart, readPartList } from './parts.js';
import { readSignal } from './signals.js';
import { readVerification, type CheckedNet } from './checks.js';
import { Obj, Reader } from './read.js';
import { closest, joinKey, Problems, type Pos } from './problems.js';
import { toPlain, type SrcNode } from './parse.js';

export const TOP_KEYS = ['title', 'description', 'driver', 'lines', 'route', 'receiver', 'probes', 'run', 'levels', 'thresholds', 'checks'] as const;
export const DRIVER_KEYS = ['signal', 'resistance'] as const;
export const ITEM_KINDS = ['line', 'series', 'shunt'] as const;
export const ITEM_KEYS = { line: ['name', 'line', 'length'], series: ['name', 'series'], shunt: ['name', 'shunt'] } as const;
export const RECEIVER_KEYS = ['parts'] as const;
export const PROBE_KEYS = ['name', 'at', 'position', 'side', 'thresholds'] as const;
export const RUN_KEYS = ['duration', 'cellsPerRise', 'sample'] as const;

/** Probe targets that are not item names. */
export const RESERVED_NAMES = ['driver', 'receiver'] as const;

/** Used when a scenario has no "probes" key: one probe at each end of the route. */
export const DEFAULT_PROBES: readonly ProbeSpec[] = [
  { name: 'driver', at: 'driver' },
  { name: 'receiver', at: 'receiver' },
];

export const DEFAULT_CELLS_PER_RISE = 20;
export const MIN_CELLS_PER_RISE = 4;

type ItemKind = (typeof ITEM_KINDS)[number];

/** What probes need to know about each route item (even one whose other keys were bad). */
interface ItemInfo {
  kind: ItemKind;
  path: string;
  /** Line length (m); undefined for parts, or when the length was bad. */
  length?: number;
}

const PROBE_NAME_RE = /^[^,"\r\n]+$/;

function baseName(file: string): string {
  const b = file.split(/[\\/]/).pop() ?? file;
  return b.replace(/\.(json|ya?ml)$/i, '') || b;
}

/**
 * Check a scenario tree and build the Net. Problems (and warnings) go into `problems`; the Net is
 * returned only when there were none.
 */
export function validateScenario(root: SrcNode, problems: Problems): Net | undefined {
  const r = new Reader(problems);
  const before = problems.count;
  const top = r.object(root, '', 'a scenario object with "driver", "route", "receiver", "probes" ... (see docs/scenario-format.md)', { line: 1, col: 1 });
  if (!top) return undefined;
  top.checkKeys(TOP_KEYS);

  const title = top.has('title') ? top.string('title', 'a title text like "3.3 V clock, unterminated"') : baseName(problems.file);
  const description = top.has('description') ? top.string('description', 'a description text') : undefined;

  const driver = readDriver(r, top);
  const lines = readLines(r, top);
  const route = readRoute(r, top, lines);
  const receiver = readReceiver(r, top);
  const probes = readProbes(r, top, route.items);
  const run = readRun(r, top);
  // Checks and logic thresholds (checks.ts): extra fields on the Net that the engine ignores.
  const verification = readVerification(r, top, probes?.map((p) => p.name));

  if (problems.count > before) return undefined;
  const net: CheckedNet = {
    title: title!,
    driver: driver!,
    route: route.route!,
    receiver: receiver!,
    probes: probes!,
    run: run!,
  };
  if (description !== undefined) net.description = description;
  if (verification?.thresholds) net.thresholds = verification.thresholds;
  if (verification?.probeThresholds) net.probeThresholds = verification.probeThresholds;
  if (verification?.checks) net.checks = verification.checks;
  if (verification?.levels) net.levels = verification.levels;
  return net;
}

function readDriver(r: Reader, top: Obj): Net['driver'] | undefined {
  if (!top.has('driver')) return top.missing('driver', 'a driver like {"signal": {"kind": "step", ...}, "resistance": "25ohm"}');
  const o = r.object(top.get('driver'), 'driver', 'a driver like {"signal": {"kind": "step", ...}, "resistance": "25ohm"}', top.pos);
  if (!o) return undefined;
  o.checkKeys(DRIVER_KEYS);
  let signal: Signal | undefined;
  if (!o.has('signal')) o.missing('signal', 'a signal like {"kind": "step", "from": "0V", "to": "3.3V", "rise": "600ps"}');
  else signal = readSignal(r, o.get('signal'), o.keyPath('signal'), o.pos);
  // 0 ohm is an ideal source; the solver's lumped equations take it as a constraint.
  const resistance = o.quantity('resistance', { dim: 'resistance', range: NON_NEGATIVE, example: '25ohm' });
  if (signal === undefined || resistance === undefined) return undefined;
  return { signal, resistance };
}

/** Named line models. A name maps to undefined when its description was bad (already reported). */
function readLines(r: Reader, top: Obj): Map<string, LineRLGC | undefined> {
  const out = new Map<string, LineRLGC | undefined>();
  if (!top.has('lines')) return out;
  const o = r.object(top.get('lines'), 'lines', 'named line models like {"trace": {"z0": "50ohm", "delay": "6.67ns/m"}}', top.pos);
  if (!o) return out;
  for (const name of o.keys()) {
    const e = o.entry(name)!;
    out.set(name, readLine(r, e.value, o.keyPath(name), e.keyPos));
  }
  return out;
}

function readRoute(r: Reader, top: Obj, lines: Map<string, LineRLGC | undefined>): { route?: RouteItem[]; items: Map<string, ItemInfo> } {
  const items = new Map<string, ItemInfo>();
  const what = 'a list of route items (may be empty) like [{"name": "trace1", "line": "trace", "length": "3in"}]';
  if (!top.has('route')) {
    top.missing('route', what);
    return { items };
  }
  const seq = r.list(top.get('route'), 'route', what, top.pos);
  if (!seq) return { items };
  const route: RouteItem[] = [];
  let ok = true;
  for (const it of Obj.items(seq, 'route')) {
    const item = readItem(r, it.node, it.path, lines, items, seq.pos);
    if (item) route.push(item);
    else ok = false;
  }
  return { route: ok ? route : undefined, items };
}

function readItem(r: Reader, node: SrcNode, path: string, lines: Map<string, LineRLGC | undefined>, items: Map<string, ItemInfo>, at?: Pos): RouteItem | undefined {
  const o = r.object(node, path, 'a route item like {"name": "trace1", "line": "trace", "length": "3in"}, {"name": "r1", "series": {"r": "22ohm"}} or {"name": "c1", "shunt": {"c": "3pF"}}', at);
  if (!o) return undefined;
  const kinds = ITEM_KINDS.filter((k) => o.has(k));
  const allKeys = [...new Set(Object.values(ITEM_KEYS).flat())];
  if (kinds.length !== 1) {
    o.checkKeys(allKeys);
    if (kinds.length === 0) r.fail(path, node, 'a route item with one of "line" (with "length"), "series" or "shunt"', at);
    else {
      const second = o.entry(kinds[1])!;
      r.problems.add(o.keyPath(kinds[1]), toPlain(second.value), `one of "line", "series", "shunt" per item, not both "${kinds[0]}" and "${kinds[1]}" (make two items)`, second.keyPos ?? o.pos);
    }
    return undefined;
  }
  const kind = kinds[0];
  let ok = o.checkKeys(ITEM_KEYS[kind], allKeys);

  // Name: optional, defaults to the item's path ("route[2]"); unique; not "driver"/"receiver".
  let name: string | undefined = path;
  if (o.has('name')) {
    name = o.string('name', 'an item name like "trace1"');
    if (name !== undefined && name.trim() === '') name = r.fail(o.keyPath('name'), o.get('name'), 'a non-empty item name like "trace1"', o.pos);
    else if (name !== undefined && (RESERVED_NAMES as readonly string[]).includes(name)) {
      name = r.fail(o.keyPath('name'), o.get('name'), `an item name other than "driver" and "receiver" (those name the ends of the route in probes)`, o.pos);
    }
  }
  if (name !== undefined) {
    const prev = items.get(name);
    if (prev) {
      r.fail(o.has('name') ? o.keyPath('name') : path, o.get('name') ?? node, `a unique item name ("${name}" is also ${prev.path}'s name)`, o.pos);
      name = undefined;
    }
  }
  const info: ItemInfo = { kind, path };
  if (name !== undefined) items.set(name, info);

  if (kind === 'line') {
    const lineNode = o.get('line')!;
    let line: LineRLGC | undefined;
    if (lineNode.type === 'scalar' && typeof lineNode.value === 'string') {
      const ref = lineNode.value;
      if (!lines.has(ref)) {
        const names = [...lines.keys()];
        const guess = closest(ref, names);
        r.fail(o.keyPath('line'), lineNode, names.length > 0 ? `the name of a line in "lines" (${names.map((n) => `"${n}"`).join(', ')})${guess ? ` — did you mean "${guess}"?` : ''} — or a line description` : 'a line description like {"z0": "50ohm", "delay": "6.67ns/m"} (no "lines" are named in this file)', o.pos);
      } else {
        line = lines.get(ref);
        if (!line) ok = false; // its own problems were reported under lines.<name>
      }
    } else {
      line = readLine(r, lineNode, o.keyPath('line'), o.pos);
    }
    const length = o.quantity('length', { dim: 'length', range: NON_NEGATIVE, example: '3in' });
    info.length = length;
    if (!ok || line === undefined || length === undefined || name === undefined) return undefined;
    return { kind: 'line', name, line, length };
  }
  if (kind === 'series') {
    const part = readPart(r, o.get('series'), o.keyPath('series'), false, o.pos);
    if (!ok || !part || name === undefined) return undefined;
    return { kind: 'series', name, part };
  }
  const parts = readPartList(r, o.get('shunt'), o.keyPath('shunt'), false, o.pos);
  if (!ok || !parts || name === undefined) return undefined;
  return { kind: 'shunt', name, parts };
}

function readReceiver(r: Reader, top: Obj): Part[] | undefined {
  if (!top.has('receiver')) return []; // open end
  const o = r.object(top.get('receiver'), 'receiver', 'a receiver like {"parts": [{"c": "3pF"}]} (or {} for an open end)', top.pos);
  if (!o) return undefined;
  o.checkKeys(RECEIVER_KEYS);
  if (!o.has('parts')) return [];
  return readPartList(r, o.get('parts'), o.keyPath('parts'), true, o.pos);
}

function readProbes(r: Reader, top: Obj, items: Map<string, ItemInfo>): ProbeSpec[] | undefined {
  // No "probes" key: probe both ends of the route, named "driver" and "receiver".
  if (!top.has('probes')) return DEFAULT_PROBES.map((p) => ({ ...p }));
  const what = 'a list of at least one probe like [{"name": "rx", "at": "receiver"}] (leave "probes" out for probes at the driver and the receiver)';
  const seq = r.list(top.get('probes'), 'probes', what, top.pos);
  if (!seq) return undefined;
  if (seq.items.length === 0) return r.fail('probes', seq, what, top.pos);
  const out: ProbeSpec[] = [];
  const names = new Map<string, string>();
  let ok = true;
  for (const it of Obj.items(seq, 'probes')) {
    const p = readProbe(r, it.node, it.path, items, names, seq.pos);
    if (p) out.push(p);
    else ok = false;
  }
  return ok ? out : undefined;
}

function readProbe(r: Reader, node: SrcNode, path: string, items: Map<string, ItemInfo>, names: Map<string, string>, at?: Pos): ProbeSpec | undefined {
  const o = r.object(node, path, 'a probe like {"name": "rx", "at": "receiver"}', at);
  if (!o) return undefined;
  let ok = o.checkKeys(PROBE_KEYS);
  const targets = [...RESERVED_NAMES, ...items.keys()];
  let target: string | undefined;
  if (!o.has('at')) ok = !!o.missing('at', `where to probe: ${targets.map((t) => `"${t}"`).join(', ')}`);
  else {
    target = o.string('at', `the name of a route item, "driver" or "receiver"`);
    if (target !== undefined && !targets.includes(target)) {
      const guess = closest(target, targets);
      const itemNames = [...items.keys()].map((n) => `"${n}"`).join(', ');
      r.fail(o.keyPath('at'), o.get('at'), `"driver", "receiver" or the name of a route item (${itemNames || 'the route is empty'})${guess ? ` — did you mean "${guess}"?` : ''}`, o.pos);
      target = undefined;
    }
    if (target === undefined) ok = false;
  }

  // Name: defaults to the target; unique; usable as a CSV column title.
  let name = o.has('name') ? o.string('name', 'a probe name like "rx"') : target;
  if (name !== undefined && !PROBE_NAME_RE.test(name)) {
    name = r.fail(o.keyPath('name'), o.get('name'), 'a non-empty probe name without commas, double quotes or line breaks, like "rx"', o.pos);
  }
  if (name !== undefined) {
    const prev = names.get(name);
    if (prev !== undefined) {
      r.fail(o.has('name') ? o.keyPath('name') : path, o.get('name') ?? node, `a unique probe name ("${name}" is also ${prev}'s name)`, o.pos);
      name = undefined;
    } else names.set(name, path);
  }
  if (name === undefined) ok = false;

  const info = target !== undefined ? items.get(target) : undefined;
  const kindText = target === 'driver' ? 'the driver' : target === 'receiver' ? 'the receiver' : info ? `a ${info.kind} item` : undefined;
  // Options that do not fit the target's kind.
  if (kindText !== undefined) {
    if (o.has('position') && info?.kind !== 'line') {
      r.fail(o.keyPath('position'), o.get('position'), `no "position" on a probe at ${kindText} ("position" is for line items)`, o.pos);
      ok = false;
    }
    if (o.has('side') && info?.kind !== 'series') {
      r.fail(o.keyPath('side'), o.get('side'), `no "side" on a probe at ${kindText} ("side" is for series items)`, o.pos);
      ok = false;
    }
  }
  if (!ok || name === undefined || target === undefined) return undefined;
  if (target === 'driver' || target === 'receiver') return { name, at: target };
  if (!info) return undefined;
  if (info.kind === 'series') {
    let side: 'in' | 'out' = 'out';
    if (o.has('side')) {
      const s = o.string('side', '"in" or "out"');
      if (s !== 'in' && s !== 'out') {
        if (s !== undefined) r.fail(o.keyPath('side'), o.get('side'), '"in" (the side towards the driver) or "out" (towards the receiver)', o.pos);
        return undefined;
      }
      side = s;
    }
    return { name, at: 'series', item: target, side };
  }
  if (info.kind === 'shunt') return { name, at: 'shunt', item: target };
  // A line: position "50%" of its length, or a length from its start.
  if (!o.has('position')) return o.missing('position', 'a position along the line: a percentage like "50%" or a length from its start like "1in"');
  const position = readPosition(r, o, info.length);
  if (position === undefined) return undefined;
  return { name, at: 'line', item: target, position };
}

/** "50%" → 0.5·length; a length → itself, within [0, length]. Result in metres from the line's start. */
function readPosition(r: Reader, o: Obj, length: number | undefined): number | undefined {
  const node = o.get('position')!;
  const path = o.keyPath('position');
  const raw = node.type === 'scalar' ? node.value : undefined;
  if (typeof raw === 'string' && raw.trim().endsWith('%')) {
    const f = parseQuantity(raw, 'fraction', { min: 0, max: 1 }, '50%');
    if (!f.ok) return r.fail(path, node, 'a percentage between 0% and 100% like "50%"', o.pos);
    return length === undefined ? undefined : f.value * length;
  }
  const within = length === undefined ? NON_NEGATIVE : { min: 0, max: length };
  const q = parseQuantity(raw, 'length', within, '1in');
  if (!q.ok) {
    const range = length === undefined ? '≥ 0' : `from 0 to the line's length ${formatSI(length, 'm')}`;
    return r.fail(path, node, `a percentage like "50%" or a length ${range} like "1in"`, o.pos);
  }
  return length === undefined ? undefined : q.value;
}

function readRun(r: Reader, top: Obj): RunSettings | undefined {
  if (!top.has('run')) return { cellsPerRise: DEFAULT_CELLS_PER_RISE };
  const o = r.object(top.get('run'), 'run', 'run settings like {"duration": "30ns"}', top.pos);
  if (!o) return undefined;
  o.checkKeys(RUN_KEYS);
  const duration = o.optQuantity('duration', { dim: 'time', range: POSITIVE, example: '30ns' });
  const sample = o.optQuantity('sample', { dim: 'time', range: POSITIVE, example: '10ps' });
  let cellsPerRise: number | undefined = DEFAULT_CELLS_PER_RISE;
  if (o.has('cellsPerRise')) cellsPerRise = r.integer(o.get('cellsPerRise'), o.keyPath('cellsPerRise'), MIN_CELLS_PER_RISE, DEFAULT_CELLS_PER_RISE, o.pos);
  if (duration === undefined || sample === undefined || cellsPerRise === undefined) return undefined;
  if (duration !== null && sample !== null && sample > duration) {
    return r.fail(joinKey('run', 'sample'), o.get('sample'), `a sample interval no longer than the duration ${formatSI(duration, 's')}`, o.pos);
  }
  const run: RunSettings = { cellsPerRise };
  if (duration !== null) run.duration = duration;
  if (sample !== null) run.sample = sample;
  return run;
}
