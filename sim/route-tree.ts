// Walking a net's route tree: the route from the driver pin to the main receiver, with branch items
// attaching side routes that end at receivers of their own, to any depth.
import { MAIN_RECEIVER, type Branch, type LineRLGC, type Net, type NamedReceiver, type RouteItem } from './model.js';

/** The main receiver as a named receiver. */
export function mainReceiver(net: Net): NamedReceiver {
  return { name: net.receiverName ?? MAIN_RECEIVER, parts: net.receiver };
}

/** Every net's route: the first net's, then the further nets' (multi-net scenarios). */
export function netRoutes(net: Net): RouteItem[][] {
  return [net.route, ...(net.nets ?? []).map((n) => n.route)];
}

/** Every route item of every net (allItems of each route, the first net first). */
export function netItems(net: Net): RouteItem[] {
  return netRoutes(net).flatMap((r) => allItems(r));
}

/** True when the scenario has several nets. */
export function isMultiNet(net: Net): boolean {
  return (net.nets?.length ?? 0) > 0;
}

/** True when the route has at least one branch item (anywhere). */
export function isBranched(net: Net): boolean {
  return net.route.some((it) => it.kind === 'branch');
}

/** Every route item of the tree, depth first in file order (a branch item before the items of its branches). */
export function allItems(route: readonly RouteItem[]): RouteItem[] {
  const out: RouteItem[] = [];
  const walk = (items: readonly RouteItem[]) => {
    for (const it of items) {
      out.push(it);
      if (it.kind === 'branch') for (const b of it.branches) walk(b.route);
    }
  };
  walk(route);
  return out;
}

/**
 * Every receiver: the main one first, then the branches' in the order the compile step reaches them
 * (depth first; a branch's own receiver after the receivers of branches nested in its route).
 */
export function allReceivers(net: Net): NamedReceiver[] {
  const out: NamedReceiver[] = [mainReceiver(net)];
  const side = (net.nets ?? []).flatMap((n) => allReceivers({ ...net, nets: undefined, route: n.route, receiver: n.receiver, receiverName: n.receiverName ?? n.name }));
  const walk = (items: readonly RouteItem[]) => {
    for (const it of items) {
      if (it.kind !== 'branch') continue;
      for (const b of it.branches) {
        walk(b.route);
        out.push(b.receiver);
      }
    }
  };
  walk(net.route);
  return [...out, ...side];
}

/** The route tree with every line replaced by `f(line, item)` (items and branches copied, the rest shared). */
export function mapRouteLines(route: readonly RouteItem[], f: (line: LineRLGC, item: Extract<RouteItem, { kind: 'line' }>) => LineRLGC): RouteItem[] {
  return route.map((it): RouteItem => {
    if (it.kind === 'line') {
      const line = f(it.line, it);
      return line === it.line ? it : { ...it, line };
    }
    if (it.kind === 'branch') return { ...it, branches: it.branches.map((b): Branch => ({ ...b, route: mapRouteLines(b.route, f) })) };
    return it;
  });
}

/** One-way delay of a line item (s). */
export function itemDelay(it: Extract<RouteItem, { kind: 'line' }>): number {
  return it.length * Math.sqrt(it.line.l * it.line.c);
}

/** One-way delay from the driver pin to every receiver, by receiver name (main receiver first). */
export function receiverDelays(net: Net): Map<string, number> {
  const out = new Map<string, number>();
  const walk = (items: readonly RouteItem[], start: number, receiver: NamedReceiver) => {
    let td = start;
    for (const it of items) {
      if (it.kind === 'line') td += itemDelay(it);
      else if (it.kind === 'branch') for (const b of it.branches) walk(b.route, td, b.receiver);
    }
    out.set(receiver.name, td);
  };
  // the main receiver's entry goes first so the map's order is the paths' order
  out.set(mainReceiver(net).name, 0);
  walk(net.route, 0, mainReceiver(net));
  return out;
}

/**
 * The route items from the driver pin to the receiver `name` (default the main one), in order: the
 * main route's items up to the branch item where the path leaves it, then that branch's items, and
 * so on; branch items on the way are kept (they mark the branch points). Null for an unknown name.
 */
export function routeToReceiver(net: Net, name?: string): RouteItem[] | null {
  const main = mainReceiver(net).name;
  if (name === undefined || name === main) return [...net.route];
  const walk = (items: readonly RouteItem[]): RouteItem[] | null => {
    for (let i = 0; i < items.length; i++) {
      const it = items[i];
      if (it.kind !== 'branch') continue;
      for (const b of it.branches) {
        if (b.receiver.name === name) return [...items.slice(0, i + 1), ...b.route];
        const deeper = walk(b.route);
        if (deeper) return [...items.slice(0, i + 1), ...deeper];
      }
    }
    return null;
  };
  return walk(net.route);
}
