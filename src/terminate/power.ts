// DC power of a termination in each logic state: the driver's source held at its low and at its high
// level, the net's DC operating point (sim/settled.ts: inductors short, capacitors open), and each
// resistive part's dissipation V²/R from the voltage across it (Ohm's and Joule's laws). A part with a
// capacitor in series (an AC termination) carries no DC current: 0 W at DC (its switching loss,
// C·V²·f per toggling, is not counted here).
import { settledProbeLevels } from '../../sim/settled.js';
import { checkScenarioValue } from '../scenario/load.js';
import { ScenarioError } from '../scenario/problems.js';
import type { NetFacts } from './net-facts.js';
import { cloneValue, type Obj } from './raw.js';
import type { AddedPart } from './topologies.js';

export interface StatePower {
  /** W with the source at its low level. */
  low: number;
  /** W with the source at its high level. */
  high: number;
}

/** Probes at both ends of each part (a receiver's node; a series item's two sides). */
function powerProbes(parts: readonly AddedPart[]): { specs: Obj[]; ends: [string, string | null][] } {
  const specs: Obj[] = [];
  const ends: [string, string | null][] = [];
  parts.forEach((p, k) => {
    if (p.series) {
      specs.push({ name: `$pw${k}a`, at: p.at, side: 'in' }, { name: `$pw${k}b`, at: p.at, side: 'out' });
      ends.push([`$pw${k}a`, `$pw${k}b`]);
    } else {
      specs.push({ name: `$pw${k}a`, at: p.at });
      ends.push([`$pw${k}a`, null]);
    }
  });
  return { specs, ends };
}

/** The DC power of `parts` (already in `value`) with the driver at its low and high level. */
export function terminationPower(value: Obj, parts: readonly AddedPart[], f: NetFacts, mainReceiver: string): StatePower {
  const dc = parts.filter((p) => p.c === undefined && p.r > 0);
  if (dc.length === 0) return { low: 0, high: 0 };
  const v = cloneValue(value);
  const { specs, ends } = powerProbes(dc);
  for (const s of specs) if (s.at === mainReceiver) s.at = 'receiver';
  v.probes = [...(Array.isArray(v.probes) ? (v.probes as Obj[]) : []), ...specs];
  delete v.checks; // the power probes need no checks; the checks' probes may be defaults no longer made
  const r = checkScenarioValue(v, 'power probes');
  if (!r.net) throw new ScenarioError(r.problems, r.warnings);
  const s = settledProbeLevels(r.net, [f.low, f.high]);
  const volt = (name: string, k: number) => s.volts[s.probes.indexOf(name)]![k]!;
  const at = (k: number) =>
    dc.reduce((sum, p, i) => {
      const [a, b] = ends[i]!;
      const dv = volt(a, k) - (b === null ? (p.rail ?? 0) : volt(b, k));
      return sum + (dv * dv) / p.r;
    }, 0);
  return { low: at(0), high: at(1) };
}
