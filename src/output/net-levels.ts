// The levels each probe of a net settles to for the driver's low and high level (the engine's DC
// operating point, sim/settled.ts), and from them the "50 % at" level of each probe: halfway between
// its two settled levels, crossed in the direction of the source's first transition.
import type { Net } from '../../sim/model.js';
import type { Discretization } from '../../sim/result.js';
import { settledProbeLevels } from '../../sim/settled.js';
import { nominalLevels, signalFunction } from '../../sim/signals.js';
import { formatSI } from '../units.js';
import type { CrossingLevel } from './crossing.js';

/** A probe's settled levels (V) with the source at its low and at its high level. */
export interface SettledPair {
  low: number;
  high: number;
}

/** Per probe name, in the net's probe order. */
export type NetSettledLevels = Map<string, SettledPair>;

/** The settled levels of every probe (`plan`: the run's discretization, so probes read the same taps). */
export function netSettledLevels(net: Net, plan?: Discretization): NetSettledLevels {
  const src = nominalLevels(net.driver.signal);
  const s = settledProbeLevels(net, [src.low, src.high], plan);
  return new Map(s.probes.map((name, p) => [name, { low: s.volts[p]![0]!, high: s.volts[p]![1]! }]));
}

/**
 * The level whose first crossing is each probe's "50 % at": the source's 50 % level carried through
 * the probe's DC divider, (settled low + settled high) / 2, in the direction of the source's first
 * transition. None where the probe's settled level does not follow the source, or the source is constant.
 */
export function crossingLevels(net: Net, settled: NetSettledLevels): Map<string, CrossingLevel> {
  const src = nominalLevels(net.driver.signal);
  const swing = src.high - src.low;
  const startsLow = signalFunction(net.driver.signal)(0) <= src.low + swing / 2;
  const out = new Map<string, CrossingLevel>();
  for (const [name, pair] of settled) {
    if (!(swing > 0)) out.set(name, { reason: 'the source is constant: no transition to time' });
    else if (!(Math.abs(pair.high - pair.low) > 1e-9 * swing)) {
      out.set(name, { reason: `the probe settles at ${formatSI(pair.low, 'V')} whatever the source does (no DC path from the driver)` });
    } else out.set(name, { level: (pair.low + pair.high) / 2, direction: startsLow === pair.high >= pair.low ? 'rising' : 'falling' });
  }
  return out;
}
