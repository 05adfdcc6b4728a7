// A cheap guard on the time loop: every 64 steps the voltages at the probes, the lumped nodes and the
// segment junctions are checked for a non-finite value or a runaway growth (beyond a million times
// the largest source level, rail or starting voltage: a passive net cannot get there). Outside the
// cell loop, so it costs nothing per cell.
import type { LumpedSystem } from './lumped.js';
import { RunDiverged } from './errors.js';
import type { Ladder } from './ladder.js';
import type { ProbeTaps } from './probes.js';
import { nominalLevels } from './signals.js';

export interface Watch {
  /** Check when (n & mask) === 0. */
  mask: number;
  check(v: Float64Array, t: number): void;
}

/** A readable name for a slot: its circuit node, or the line and distance of an interior node. */
export function slotLabel(ladder: Ladder, slot: number): string {
  const node = ladder.nodeSlot.indexOf(slot);
  if (node >= 0) return ladder.circuit.nodes[node].label;
  const seg = ladder.segments.find((s) => slot > s.base && slot < s.base + s.cells);
  if (seg) return `inside '${seg.name}', ${((slot - seg.base) * seg.cellLength).toPrecision(3)} m from its start`;
  return `slot ${slot}`;
}

export function createWatch(ladder: Ladder, taps: ProbeTaps, names: readonly string[], lumped: LumpedSystem, sources: Float64Array): Watch {
  const slots = new Set<number>([...taps.a, ...taps.b, ...ladder.ends.keys()]);
  for (const c of lumped.clusters) for (const s of c.nodes) slots.add(s);
  const watched = Int32Array.from(slots);
  let level = 0;
  for (const s of ladder.circuit.sources) {
    const { low, high } = nominalLevels(s.signal);
    level = Math.max(level, Math.abs(low), Math.abs(high));
  }
  for (const b of ladder.lumped) level = Math.max(level, Math.abs(b.part.rail));
  for (const x of sources) level = Math.max(level, Math.abs(x));
  const bound = 1e6 * Math.max(level, 1e-6);
  const fail = (t: number, where: string, x: number): never => {
    const cause =
      !Number.isFinite(level) || level > 1e150
        ? `the source levels or rails (up to ${level} V) are too large to simulate in floating point`
        : Number.isFinite(x)
          ? `it grew past a million times the largest source level or rail (${level} V): a runaway growth, which a passive net does not show — please report it with the scenario`
          : 'a value became infinite or not a number (an overflow or a numerical instability) — please report it with the scenario';
    throw new RunDiverged(t, where, x, cause);
  };
  return {
    mask: 63,
    check(v, t) {
      for (let k = 0; k < watched.length; k++) {
        const x = v[watched[k]];
        if (!(Math.abs(x) <= bound)) fail(t, slotLabel(ladder, watched[k]), x);
      }
      // the probes' own interpolation, exactly as recorded (a difference of two huge values can overflow)
      for (let p = 0; p < taps.a.length; p++) {
        const va = v[taps.a[p]];
        const x = va + taps.weight[p] * (v[taps.b[p]] - va);
        if (!(Math.abs(x) <= bound)) fail(t, `probe '${names[p]}'`, x);
      }
    },
  };
}
