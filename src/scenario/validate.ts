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
import { readCoupledSections, type CoupledRead } from './coupled.js';
import type { SideNet } from '../../sim/model.js';
import { Obj, Reader } from './read.js';
import { closest, joinKey, Problems, type Pos } from './problems.js';
import { toPlain, type SrcNode } from './parse.js';

export const TOP_KEYS = ['title', 'description', 'driver', 'lines', 'route', 'receiver', 'probes', 'run', 'levels', 'thresholds', 'checks', 'nets', 'coupled'] as const;
/** Top-level keys of a multi-net scenario (each net has its own driver, route and receiver). */
export const MULTI_NET_TOP_KEYS = ['title', 'description', 'lines', 'nets', 'coupled', 'probes', 'run', 'levels', 'thresholds', 'checks'] as const;
export const NET_KEYS = ['driver', 'route', 'receiver'] as const;
export const DRIVER_KEYS = ['signal', 'level', 'resistance'] as const;
export const PROBE_KEYS = ['name', 'at', 'net', 'position', 'side', 'thresholds'] as const;
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
  const multi = top.has('nets');
  top.checkKeys(multi ? MULTI_NET_TOP_KEYS : TOP_KEYS, TOP_KEYS);

  const title = top.has('title') ? top.string('title', 'a title text like "3.3 V clock, unterminated"') : baseName(problems.file);
  const description = top.has('description') ? top.string('description', 'a description text') : undefined;

  const ctx: RouteContext = { lines: readLines(r, top), places: new Map(), coupled: readCoupledSections(r, top) };
  const nets = multi ? readNets(r, top, ctx) : readSingleNet(r, top, ctx);
  if (nets) checkConductors(r, ctx);
  const receivers = nets?.flatMap((n) => allReceivers({ route: n.route, receiver: n.receiver.parts, receiverName: n.receiver.name } as Net));
  const netNames = multi && top.get('nets')?.type === 'map' ? (top.get('nets') as { entries: { key: string }[] }).entries.map((e) => e.key) : undefined;
  const probes = readProbes(r, top, ctx.places, receivers, netNames);
  const run = readRun(r, top);
  // Checks and logic thresholds (checks.ts): extra fields on the Net that the engine ignores.
  const verification = readVerification(r, top, probes?.map((p) => p.name));

  if (problems.count > before) return undefined;
  const [first, ...others] = nets!;
  const net: CheckedNet = {
    title: title!,
    driver: first.driver,
    route: first.route,
    receiver: first.receiver.parts,
    probes: probes!,
    run: run!,
  };
  if (first.receiver.name !== MAIN_RECEIVER) net.receiverName = first.receiver.name;
  if (multi) {
    net.netName = first.name;
    net.nets = others.map((n): SideNet => ({ name: n.name, driver: n.driver, route: n.route, receiver: n.receiver.parts, receiverName: n.receiver.name }));
  }
  const sections = [...ctx.coupled!.values()].filter((c): c is CoupledRead => c !== undefined);
  if (sections.length) net.coupled = sections.map((c) => c.spec);
  if (description !== undefined) net.description = description;
  if (verification?.thresholds) net.thresholds = verification.thresholds;
  if (verification?.probeThresholds) net.probeThresholds = verification.probeThresholds;
  if (verification?.checks) net.checks = verification.checks;
  if (verification?.levels) net.levels = verification.levels;
  return net;
}

interface NetRead {
  name: string;
  driver: Net['driver'];
  route: RouteItem[];
  receiver: NamedReceiver;
}

/** A v1/branched scenario: the one net at the top level. */
function readSingleNet(r: Reader, top: Obj, ctx: RouteContext): NetRead[] | undefined {
  const driver = readDriver(r, top, 'driver');
  const route = readRoute(r, top, ctx);
  const receiver = readMainReceiver(r, top, ctx);
  if (!driver || !route || !receiver) return undefined;
  return [{ name: 'driver', driver, route, receiver }];
}

/**
 * "nets": { NAME: { driver, route, receiver }, … } — each net as a one-net scenario's top level; a
 * net's main receiver is named after the net unless it has a name of its own.
 */
function readNets(r: Reader, top: Obj, ctx: RouteContext): NetRead[] | undefined {
  const what = 'named nets like {"clk": {"driver": {...}, "route": [...], "receiver": {...}}, "rst": {...}}';
  const o = r.object(top.get('nets'), 'nets', what, top.pos);
  if (!o) return undefined;
  if (o.keys().length === 0) return r.fail('nets', o.node, `at least one net: ${what}`, top.pos);
  const out: NetRead[] = [];
  let ok = true;
  for (const name of o.keys()) {
    const path = o.keyPath(name);
    const n = r.object(o.get(name), path, 'a net like {"driver": {...}, "route": [...], "receiver": {...}}', o.pos);
    if (!n) {
      ok = false;
      continue;
    }
    n.checkKeys(NET_KEYS);
    if ((RESERVED_NAMES as readonly string[]).includes(name) || ctx.places.has(name)) {
      r.fail(path, n.node, `a net name other than "driver", "receiver" and the names of items and receivers ("${name}")`, o.pos);
      ok = false;
    }
    const driver = readDriver(r, n, joinKey(path, 'driver'));
    const route = n.has('route') ? readRouteList(r, n.get('route'), joinKey(path, 'route'), ctx, n.pos, 'a list of route items (may be empty)') : n.missing('route', 'a list of route items (may be empty) like [{"name": "trace1", "line": "trace", "length": "3in"}]');
    let receiver: NamedReceiver | undefined = { name, parts: [] };
    if (n.has('receiver')) {
      receiver = readReceiver(r, n.get('receiver'), joinKey(path, 'receiver'), ctx, true, n.pos);
      if (receiver?.name === MAIN_RECEIVER) {
        const info = ctx.places.get(MAIN_RECEIVER);
        ctx.places.delete(MAIN_RECEIVER);
        receiver = { name, parts: receiver.parts };
        if (info) info.receiver = name;
        if (ctx.places.has(name)) {
          r.fail(path, n.node, `a net name that no item or receiver has ("${name}" names its receiver; it is also ${ctx.places.get(name)!.path}'s name)`, o.pos);
          receiver = undefined;
        } else if (info) ctx.places.set(name, info);
      }
    } else if (ctx.places.has(name)) {
      r.fail(path, n.node, `a net name that no item or receiver has ("${name}" names its receiver; it is also ${ctx.places.get(name)!.path}'s name)`, o.pos);
      receiver = undefined;
    } else ctx.places.set(name, { kind: 'receiver', path: joinKey(path, 'receiver'), receiver: name });
    if (driver && route && receiver) out.push({ name, driver, route, receiver });
    else ok = false;
  }
  return ok ? out : undefined;
}

/** Every conductor a coupled section lists is a coupled item naming that section. */
function checkConductors(r: Reader, ctx: RouteContext): void {
  for (const [name, sec] of ctx.coupled ?? []) {
    if (!sec) continue;
    sec.spec.conductors.forEach((item, j) => {
      const info = ctx.places.get(item);
      if (info?.coupled === name) return;
      const why = !info ? 'no item has that name' : info.coupled ? `it is a conductor of "${info.coupled}"` : `${info.path} is not a coupled item (write it as {"name": "${item}", "coupled": "${name}", "length": …})`;
      r.problems.add(sec.conductorPaths[j], item, `a line item written as {"name": "${item}", "coupled": "${name}", "length": …} in a net's route (${why})`);
    });
  }
}

function readDriver(r: Reader, top: Obj, path: string): Net['driver'] | undefined {
  const what = 'a driver like {"signal": {"kind": "step", ...}, "resistance": "25ohm"} or a quiet one like {"level": "0V", "resistance": "40ohm"}';
  if (!top.has('driver')) return top.missing('driver', what);
  const o = r.object(top.get('driver'), path, what, top.pos);
  if (!o) return undefined;
  o.checkKeys(DRIVER_KEYS);
  let signal: Signal | undefined;
  if (o.has('signal') && o.has('level')) r.fail(o.keyPath('level'), o.get('level'), 'either "signal" or "level" (a quiet driver holding its level), not both', o.pos);
  else if (o.has('level')) {
    // a quiet driver: a step from its level to its level (no edge; fastestEdge is Infinity)
    const level = o.quantity('level', { dim: 'voltage', example: '0V' });
    if (level !== undefined) signal = { kind: 'step', from: level, to: level, start: 0, rise: 1e-12 };
  } else if (!o.has('signal')) o.missing('signal', 'a signal like {"kind": "step", "from": "0V", "to": "3.3V", "rise": "600ps"}, or "level" for a quiet driver');
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

function readProbes(r: Reader, top: Obj, items: Map<string, PlaceInfo>, receivers: NamedReceiver[] | undefined, nets: string[] | undefined): ProbeSpec[] | undefined {
  const multi = top.has('nets');
  // No "probes" key: probe the driver pin and every receiver ("driver" and "receiver" without branches);
  // with several nets, each net's driver pin as "NET.driver" and every receiver by its name.
  if (!top.has('probes') && multi) {
    return nets && receivers ? [...nets.map((n, k): ProbeSpec => (k === 0 ? { name: `${n}.driver`, at: 'driver' } : { name: `${n}.driver`, at: 'driver', net: n })), ...receivers.map((rx): ProbeSpec => ({ name: rx.name, at: 'receiver', receiver: rx.name }))] : undefined;
  }
  if (!top.has('probes')) return receivers ? defaultProbes(receivers) : DEFAULT_PROBES.map((p) => ({ ...p }));
  const what = 'a list of at least one probe like [{"name": "rx", "at": "receiver"}] (leave "probes" out for probes at the driver and the receiver)';
  const seq = r.list(top.get('probes'), 'probes', what, top.pos);
  if (!seq) return undefined;
  if (seq.items.length === 0) return r.fail('probes', seq, what, top.pos);
  const out: ProbeSpec[] = [];
  const names = new Map<string, string>();
  let ok = true;
  for (const it of Obj.items(seq, 'probes')) {
    const p = readProbe(r, it.node, it.path, items, names, seq.pos, nets);
    if (p) out.push(p);
    else ok = false;
  }
  return ok ? out : undefined;
}

function readProbe(r: Reader, node: SrcNode, path: string, items: Map<string, PlaceInfo>, names: Map<string, string>, at?: Pos, nets?: string[]): ProbeSpec | undefined {
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
  let net: string | undefined;
  if (o.has('net')) {
    net = o.string('net', 'the name of a net');
    if (target !== 'driver') ok = !!r.fail(o.keyPath('net'), o.get('net'), `no "net" on a probe at ${kindText ?? 'this place'} ("net" picks the driver pin of a net; items and receivers are named across all nets)`, o.pos);
    else if (net !== undefined && !nets?.includes(net)) ok = !!r.fail(o.keyPath('net'), o.get('net'), `the name of a net (${(nets ?? []).map((n) => `"${n}"`).join(', ') || 'this scenario has no "nets"'})`, o.pos);
    if (net === undefined) ok = false;
  }
  if (!ok || name === undefined || target === undefined) return undefined;
  if (target === 'driver') return net !== undefined && net !== nets?.[0] ? { name, at: 'driver', net } : { name, at: 'driver' };
  if (target === 'receiver') return { name, at: target };
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
