// Small hand-built nets for engine tests (plain SI numbers, as the validator would produce them).
import type { LineRLGC, Net, Part, ProbeSpec, RouteItem, Signal } from '../../sim/model.js';

/** A branch item with one side route per entry, each ending at a named receiver. */
export function branch(name: string, ...arms: { route: RouteItem[]; receiver: string; parts?: Part[] }[]): RouteItem {
  return { kind: 'branch', name, branches: arms.map((a) => ({ route: a.route, receiver: { name: a.receiver, parts: a.parts ?? [] } })) };
}

/** A line item. */
export function line(name: string, l: LineRLGC, length: number): RouteItem {
  return { kind: 'line', name, line: l, length };
}

/** A line of impedance z0 and one-way delay per metre tpd. */
export function lineOf(z0: number, tpd: number, r = 0, g = 0): LineRLGC {
  return { l: z0 * tpd, c: tpd / z0, r, g };
}

export function part(p: Partial<Part>): Part {
  return { r: 0, l: 0, rail: 0, ...p };
}

export function stepSignal(to: number, rise: number, start = 0, from = 0): Signal {
  return { kind: 'step', from, to, start, rise };
}

export function net(opts: {
  signal: Signal;
  rs: number;
  route: RouteItem[];
  receiver?: Part[];
  receiverName?: string;
  probes?: ProbeSpec[];
  duration?: number;
  cellsPerRise?: number;
  sample?: number;
}): Net {
  return {
    title: 'test net',
    driver: { signal: opts.signal, resistance: opts.rs },
    route: opts.route,
    receiver: opts.receiver ?? [],
    ...(opts.receiverName !== undefined ? { receiverName: opts.receiverName } : {}),
    probes: opts.probes ?? [
      { name: 'driver', at: 'driver' },
      { name: 'receiver', at: 'receiver' },
    ],
    run: { duration: opts.duration, cellsPerRise: opts.cellsPerRise ?? 20, sample: opts.sample },
  };
}
