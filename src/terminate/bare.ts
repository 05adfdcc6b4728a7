// The net without its terminations: the advisor compares every topology on the same bare net, so a
// termination already drawn in the scenario is taken out first (and the scenario as given is reported
// beside the options). Recognised as terminations:
//   - resistor-only series items at the start of the main route, before its first line;
//   - resistor parts at a receiver (to any rail, alone or with a capacitor in series: parallel, split
//     and AC terminations) of at most 3·Z0 of the line arriving there. A larger resistor is taken for
//     the receiver's own input (a 1 kΩ or 10 kΩ input stays); capacitors alone stay (input capacitance).
import type { Net, Part } from '../../sim/model.js';
import { allReceivers } from '../../sim/route-tree.js';
import { formatSI } from '../units.js';
import type { NetFacts } from './net-facts.js';
import type { AddedPart } from './topologies.js';
import { cloneValue, rawParts, rawReceivers, rawRoute, type Obj } from './raw.js';

/** Largest receiver resistor taken for a termination, in units of the arriving line's Z0. */
export const TERMINATION_MAX_Z0 = 3;

export interface BareNet {
  value: Obj;
  /** What was taken out, for the report ("series item rs: 39 Ω"). */
  removed: string[];
  /** The same parts, for the power figures of the scenario as given. */
  parts: AddedPart[];
}

function describePart(p: Part): string {
  const bits = [formatSI(p.r, 'Ω', 4)];
  if (p.c !== undefined) bits.push(`+ ${formatSI(p.c, 'F', 4)}`);
  bits.push(`to ${formatSI(p.rail, 'V', 4)}`);
  return bits.join(' ');
}

export function isTerminationPart(p: Part, z0: number): boolean {
  return p.r > 0 && p.l === 0 && z0 > 0 && p.r <= TERMINATION_MAX_Z0 * z0;
}

/** Probes on removed items go too, and the checks on those probes (each named in `removed`). */
function dropProbesAt(value: Obj, items: ReadonlySet<string>, removed: string[]): void {
  if (items.size === 0 || !Array.isArray(value.probes)) return;
  const gone = new Set<string>();
  value.probes = (value.probes as Obj[]).filter((p) => {
    if (!(typeof p.at === 'string' && items.has(p.at))) return true;
    gone.add(String(p.name ?? p.at));
    removed.push(`probe ${String(p.name ?? p.at)} (at ${p.at})`);
    return false;
  });
  if (gone.size === 0 || !Array.isArray(value.checks)) return;
  value.checks = (value.checks as Obj[]).filter((c) => {
    if (!gone.has(String(c.probe))) return true;
    removed.push(`check ${String(c.metric)} on ${String(c.probe)}`);
    return false;
  });
}

/** The scenario value without the terminations it already has. */
export function bareNet(value: Obj, net: Net, facts: NetFacts): BareNet {
  const out = cloneValue(value);
  const removed: string[] = [];
  const parts: AddedPart[] = [];
  const route = rawRoute(out);
  let lead = 0;
  while (lead < net.route.length) {
    const it = net.route[lead]!;
    if (it.kind !== 'series' || it.part.l !== 0 || it.part.c !== undefined || !(it.part.r > 0)) break;
    removed.push(`series item ${it.name}: ${formatSI(it.part.r, 'Ω', 4)}`);
    parts.push({ r: it.part.r, at: it.name, series: true, where: `series item ${it.name}` });
    lead++;
  }
  route.splice(0, lead);
  dropProbesAt(out, new Set(net.route.slice(0, lead).map((it) => it.name)), removed);
  const raws = rawReceivers(out);
  allReceivers(net).forEach((rx, i) => {
    const z0 = facts.receivers[i]?.z0 ?? 0;
    const drop = new Set<number>();
    rx.parts.forEach((p, k) => {
      if (isTerminationPart(p, z0)) {
        drop.add(k);
        removed.push(`receiver ${rx.name}: ${describePart(p)}`);
        parts.push({ r: p.r, c: p.c, rail: p.c === undefined ? p.rail : undefined, at: rx.name, series: false, where: `at ${rx.name}` });
      }
    });
    if (drop.size === 0) return;
    const holder = raws[i]!.holder;
    holder.parts = rawParts(holder).filter((_, k) => !drop.has(k));
  });
  return { value: out, removed, parts };
}
