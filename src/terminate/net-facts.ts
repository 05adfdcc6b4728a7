// What the advisor needs to know about a net before choosing ranges: the driver's resistance and
// levels, the line impedance seen from the driver and arriving at each receiver, the one-way delay to
// each receiver, and the star points (branch items on the main route) where per-branch resistors go.
import type { LineRLGC, Net, RouteItem } from '../../sim/model.js';
import { allReceivers, receiverDelays } from '../../sim/route-tree.js';
import { nominalLevels } from '../../sim/signals.js';

export interface ReceiverFacts {
  name: string;
  /** Z0 of the last line before the receiver on its path (Ω). */
  z0: number;
  /** One-way delay from the driver pin (s). */
  delay: number;
}

export interface StarArm {
  /** Index of the branch item in the top-level route. */
  item: number;
  /** Which BRANCH of it (−1: the route going on after the item). */
  branch: number;
  /** Z0 of the arm's first line (Ω). */
  z0: number;
  /** Text for reports: the arm's first line item, else the receiver it leads to. */
  label: string;
}

export interface NetFacts {
  rOut: number;
  low: number;
  high: number;
  /** Z0 of the first line from the driver pin (Ω); null when the route has no line. */
  z0Driver: number | null;
  receivers: ReceiverFacts[];
  /** Largest one-way delay to a receiver (s). */
  maxDelay: number;
  arms: StarArm[];
}

function z0Of(line: LineRLGC): number {
  return Math.sqrt(line.l / line.c);
}

function firstLine(route: readonly RouteItem[]): Extract<RouteItem, { kind: 'line' }> | undefined {
  for (const it of route) if (it.kind === 'line' && it.length > 0) return it;
  return undefined;
}

/** Z0 of the last line on the path to each receiver (null: no line on the path). */
function receiverZ0(net: Net): Map<string, number | null> {
  const out = new Map<string, number | null>();
  const walk = (items: readonly RouteItem[], last: number | null, receiver: string) => {
    let z = last;
    for (const it of items) {
      if (it.kind === 'line' && it.length > 0) z = z0Of(it.line);
      else if (it.kind === 'branch') for (const b of it.branches) walk(b.route, z, b.receiver.name);
    }
    out.set(receiver, z);
  };
  walk(net.route, null, allReceivers(net)[0]!.name);
  return out;
}

/** The arms of every branch item on the top-level route: each BRANCH, and the route going on. */
function starArms(net: Net): StarArm[] {
  const arms: StarArm[] = [];
  net.route.forEach((it, k) => {
    if (it.kind !== 'branch') return;
    it.branches.forEach((b, j) => {
      const line = firstLine(b.route);
      if (line) arms.push({ item: k, branch: j, z0: z0Of(line.line), label: `${line.name} (to ${b.receiver.name})` });
    });
    const rest = firstLine(net.route.slice(k + 1).filter((x) => x.kind !== 'branch'));
    if (rest && net.route.slice(k + 1).some((x) => x.kind === 'line' && x.length > 0)) arms.push({ item: k, branch: -1, z0: z0Of(rest.line), label: `${rest.name} (main route)` });
  });
  return arms;
}

export function netFacts(net: Net): NetFacts {
  const { low, high } = nominalLevels(net.driver.signal);
  const first = firstLine(net.route);
  const delays = receiverDelays(net);
  const z0s = receiverZ0(net);
  const receivers = allReceivers(net).map((r) => ({ name: r.name, z0: z0s.get(r.name) ?? (first ? z0Of(first.line) : 0), delay: delays.get(r.name) ?? 0 }));
  return {
    rOut: net.driver.resistance,
    low,
    high,
    z0Driver: first ? z0Of(first.line) : null,
    receivers,
    maxDelay: Math.max(0, ...receivers.map((r) => r.delay)),
    arms: starArms(net),
  };
}

