// Settled probe levels: the voltage each probe settles to when the driver's source is held at a given
// value — the DC operating point of the net for that value (inductors short, capacitors open, every
// rail on), read through the probes' taps exactly as the time loop reads them. The measurements use
// these as the state levels of each edge (IEEE Std 181-2011 allows specified reference levels): the
// levels the net itself would settle to, not the plateaus a histogram of the waveform happens to favour.
//
// One DC solve per source value. For today's linear nets two values would give the whole map (the
// probe voltage is affine in the source value), but solving per value keeps this function right for
// nets whose operating point is not linear in the source (non-linear drivers and receivers).
import { solveDc } from './dc.js';
import { discretize } from './discretize.js';
import { buildLadder } from './ladder.js';
import type { Net } from './model.js';
import { resolveProbes } from './probes.js';
import type { Discretization } from './result.js';

export interface SettledLevels {
  /** The source values, as asked. */
  source: number[];
  /** Probe names, in the net's order. */
  probes: string[];
  /** volts[p][k]: probe p's settled voltage with the source held at source[k]. */
  volts: number[][];
}

/**
 * The settled voltage of every probe for each source value. `plan` is the run's discretization (so a
 * probe part-way along a lossy line reads the same interpolated node voltages as the run's start);
 * without it the net is discretized here. Lines with frequency-dependent loss need no fit: at DC only
 * their DC resistance and conductance count.
 */
export function settledProbeLevels(net: Net, source: readonly number[], plan: Discretization = discretize(net)): SettledLevels {
  const ladder = buildLadder(net, plan);
  const { node, weight } = resolveProbes(net.probes, ladder);
  const volts: number[][] = net.probes.map(() => []);
  for (const s of source) {
    const v = solveDc(ladder, s).v;
    // The probe's tap: node k, plus a fraction w of the way to node k+1 (absent past the last node).
    volts.forEach((row, p) => {
      const k = node[p]!;
      const w = weight[p]!;
      row.push(w === 0 ? v[k]! : v[k]! + w * (v[k + 1]! - v[k]!));
    });
  }
  return { source: [...source], probes: net.probes.map((p) => p.name), volts };
}
