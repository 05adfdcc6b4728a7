// Probe positions on the ladder: each probe reads the voltage between two real nodes with a linear
// weight, so a probe part-way along a line interpolates between the nodes around it.
import type { CircuitProbe } from './circuit.js';
import type { Ladder } from './ladder.js';

export interface ProbeTaps {
  /** The two slots a probe reads and the weight of the second: v[a] + w·(v[b] − v[a]). */
  a: Int32Array;
  b: Int32Array;
  weight: Float64Array;
}

/** Real slots of a segment's node k (0 … cells): its end nodes, or its interior slots. */
export function segmentNodeSlot(ladder: Ladder, segment: number, k: number): number {
  const s = ladder.segments[segment];
  return k <= 0 ? s.first : k >= s.cells ? s.last : s.base + k;
}

export function resolveProbes(probes: readonly CircuitProbe[], ladder: Ladder): ProbeTaps {
  const taps: ProbeTaps = { a: new Int32Array(probes.length), b: new Int32Array(probes.length), weight: new Float64Array(probes.length) };
  probes.forEach(({ place }, n) => {
    if (place.kind === 'node') {
      taps.a[n] = taps.b[n] = ladder.nodeSlot[place.node];
      return;
    }
    const s = ladder.segments[place.segment];
    const x = s.cellLength > 0 ? place.position / s.cellLength : 0;
    const k = Math.min(Math.floor(x), Math.max(s.cells - 1, 0));
    taps.a[n] = segmentNodeSlot(ladder, place.segment, k);
    taps.b[n] = segmentNodeSlot(ladder, place.segment, k + 1);
    taps.weight[n] = s.cells > 0 ? Math.min(x - k, 1) : 0;
  });
  return taps;
}

/** Writes probe values into column `sample` of `out` (shape [probes, samples], row-major). */
export function recordProbes(taps: ProbeTaps, v: Float64Array, out: Float64Array, samples: number, sample: number): void {
  const { a, b, weight } = taps;
  for (let p = 0; p < a.length; p++) {
    const va = v[a[p]];
    out[p * samples + sample] = va + weight[p] * (v[b[p]] - va);
  }
}
