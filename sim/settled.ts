// Settled probe levels: the voltage each probe settles to when the driver's source is held at a given
// value — the DC operating point of the net for that value (inductors short, capacitors open, every
// rail on), read through the probes' taps exactly as the time loop reads them, on the same ladder the
// run uses (so a simulated waveform that settles reaches exactly this).
//
// One nodal DC solve of the whole graph (dc.ts) per source value: for today's linear nets two values
// would give the whole map (the probe voltage is affine in the source value), but solving per value
// keeps this right for nets whose operating point is not linear in the source (nonlinear devices).
import { compileNet } from './circuit.js';
import { solveDc } from './dc.js';
import { discretize } from './discretize.js';
import { buildLadder } from './ladder.js';
import type { Net } from './model.js';
import { resolveProbes } from './probes.js';
import type { Discretization } from './result.js';
import { signalFunction } from './signals.js';

export interface SettledLevels {
  /** The driver's source values, as asked. */
  source: number[];
  /** Probe names, in the net's order. */
  probes: string[];
  /** volts[p][k]: probe p's settled voltage with the driver held at source[k]. */
  volts: number[][];
}

/**
 * The settled voltage of every probe for each value of the driver's source (any other source held
 * at its value at t = 0). `plan` is the run's discretization (so a probe part-way along a lossy line
 * reads the same interpolated node voltages as the run's start); without it the net is discretized
 * here. Lines with frequency-dependent loss need no fit: at DC only their DC resistance and
 * conductance count.
 */
export function settledProbeLevels(net: Net, source: readonly number[], plan?: Discretization): SettledLevels {
  const circuit = compileNet(net);
  const ladder = buildLadder(circuit, plan ?? discretize(circuit));
  const taps = resolveProbes(circuit.probes, ladder);
  const values = Float64Array.from(circuit.sources, (s) => signalFunction(s.signal)(0));
  const volts: number[][] = circuit.probes.map(() => []);
  for (const s of source) {
    values[0] = s;
    const v = solveDc(ladder, values).v;
    volts.forEach((row, p) => {
      const a = v[taps.a[p]];
      row.push(a + taps.weight[p] * (v[taps.b[p]] - a));
    });
  }
  return { source: [...source], probes: circuit.probes.map((p) => p.name), volts };
}
