// Scenario tree → Net, collecting every problem on the way (see docs/scenario-format.md).
//
// The sections are read one after another and each reader reports into the same Problems list;
// a bad section yields undefined and the others are still checked, so one run lists everything.
// Line forms live in lines.ts, signal kinds in signals.ts, parts in parts.ts.
import { MAIN_RECEIVER, type LineRLGC, type NamedReceiver, type Net, type ProbeSpec, type RouteItem, type RunSettings, type Signal } from '../../sim/model.js';
import { allReceivers } from '../../sim/route-tree.js';
import { NON_NEGATIVE, POSITIVE, formatSI, parseQuantity } from '../units.js';
import { readLine } from './lines.js';
import { RESERVED_NAMES, readReceiver, readRouteList, type PlaceInfo, type RouteContext } from './route.js';
import { readSignal } from './signals.js';
import { readVerification, type CheckedNet } from './checks.js';
import { Obj, Reader } from './read.js';
import { closest, joinKey, Problems, type Pos } from './problems.js';
import { toPlain, type SrcNode } from './parse.js';

export const TOP_KEYS = ['title', 'description', 'driver', 'lines', 'route', 'receiver', 'probes', 'run', 'levels', 'thresholds', 'checks'] as const;
export const DRIVER_KEYS = ['signal', 'resistance'] as const;
export const PROBE_KEYS = ['name', 'at', 'position', 'side', 'thresholds'] as const;
export const RUN_KEYS = ['duration', 'cellsPerRise', 'sample'] as const;
export { ITEM_FORMS, ITEM_KINDS, RECEIVER_KEYS, BRANCH_KEYS, RESERVED_NAMES } from './route.js';

/** Used when a scenario has no "probes" key: one probe at each end of the route. */
export const DEFAULT_PROBES: readonly ProbeSpec[] = [
  { name: 'driver', at: 'driver' },
  { name: 'receiver', at: 'receiver' },
];

/**
 * The probes of a scenario without a "probes" key: the driver pin and every receiver, each named after
 * what it probes ("driver", "receiver" — or the main receiver's own name — and each branch receiver's).
 */
export function defaultProbes(receivers: readonly NamedReceiver[]): ProbeSpec[] {
  return [
    { name: 'driver', at: 'driver' },
    ...receivers.map((rx, k): ProbeSpec => (k === 0 ? { name: rx.name, at: 'receiver' } : { name: rx.name, at: 'receiver', receiver: rx.name })),
  ];
}

export const DEFAULT_CELLS_PER_RISE = 20;
export const MIN_CELLS_PER_RISE = 4;

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
  const ctx: RouteContext = { lines: readLines(r, top), places: new Map() };
  const route = readRoute(r, top, ctx);
  const receiver = readMainReceiver(r, top, ctx);
  const probes = readProbes(r, top, ctx.places, route && receiver ? allReceivers({ route, receiver: receiver.parts, receiverName: receiver.name } as Net) : undefined);
  const run = readRun(r, top);
  // Checks and logic thresholds (checks.ts): extra fields on the Net that the engine ignores.
  const verification = readVerification(r, top, probes?.map((p) => p.name));

  if (problems.count > before) return undefined;
  const net: CheckedNet = {
    title: title!,
    driver: driver!,
    route: route!,
    receiver: receiver!.parts,
    probes: probes!,
    run: run!,
  };
  if (receiver!.name !== MAIN_RECEIVER) net.receiverName = receiver!.name;
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

function readRoute(r: Reader, top: Obj, ctx: RouteContext): RouteItem[] | undefined {
  const what = 'a list of route items (may be empty) like [{"name": "trace1", "line": "trace", "length": "3in"}]';
  if (!top.has('route')) return top.missing('route', what);
  return readRouteList(r, top.get('route'), 'route', ctx, top.pos, what);
}

function readMainReceiver(r: Reader, top: Obj, ctx: RouteContext): NamedReceiver | undefined {
  if (!top.has('receiver')) {
    ctx.places.set(MAIN_RECEIVER, { kind: 'receiver', path: 'receiver', receiver: MAIN_RECEIVER });
    return { name: MAIN_RECEIVER, parts: [] }; // open end
  }
  return readReceiver(r, top.get('receiver'), 'receiver', ctx, true, top.pos);
}

function readProbes(r: Reader, top: Obj, items: Map<string, PlaceInfo>, receivers: NamedReceiver[] | undefined): ProbeSpec[] | undefined {
  // No "probes" key: probe the driver pin and every receiver ("driver" and "receiver" without branches).
  if (!top.has('probes')) return receivers ? defaultProbes(receivers) : DEFAULT_PROBES.map((p) => ({ ...p }));
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

function readProbe(r: Reader, node: SrcNode, path: string, items: Map<string, PlaceInfo>, names: Map<string, string>, at?: Pos): ProbeSpec | undefined {
  const o = r.object(node, path, 'a probe like {"name": "rx", "at": "receiver"}', at);
  if (!o) return undefined;
  let ok = o.checkKeys(PROBE_KEYS);
  const targets = [...new Set([...RESERVED_NAMES, ...items.keys()])];
  let target: string | undefined;
  if (!o.has('at')) ok = !!o.missing('at', `where to probe: ${targets.map((t) => `"${t}"`).join(', ')}`);
  else {
    target = o.string('at', `the name of a route item or receiver, "driver" or "receiver"`);
    if (target !== undefined && !targets.includes(target)) {
      const guess = closest(target, targets);
      const named = (kind: (k: PlaceInfo['kind']) => boolean) => [...items].filter(([n, i]) => kind(i.kind) && n !== 'receiver').map(([n]) => `"${n}"`);
      const itemNames = named((k) => k !== 'receiver');
      const rxNames = named((k) => k === 'receiver');
      const list = `${itemNames.join(', ') || 'the route is empty'}${rxNames.length ? `; receivers: ${rxNames.join(', ')}` : ''}`;
      r.fail(o.keyPath('at'), o.get('at'), `"driver", "receiver" or the name of a route item (${list})${guess ? ` — did you mean "${guess}"?` : ''}`, o.pos);
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

  const info = target !== undefined && target !== 'receiver' ? items.get(target) : undefined;
  const kindText =
    target === 'driver' ? 'the driver' : target === 'receiver' ? 'the receiver' : info?.kind === 'receiver' ? `receiver "${target}"` : info ? `a ${info.kind} item` : undefined;
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
  if (info.kind === 'receiver') return info.path === 'receiver' ? { name, at: 'receiver' } : { name, at: 'receiver', receiver: target };
  if (info.kind === 'branch') return { name, at: 'branch', item: target };
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
