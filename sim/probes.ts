// Probe positions on the ladder: each probe reads the voltage between two adjacent nodes with a
// linear weight, so a probe part-way along a line interpolates between the nodes around it.
import { NetError, type NetProblem } from './errors.js';
import type { Ladder } from './ladder.js';
import type { ProbeSpec } from './model.js';

export interface ProbeTaps {
  node: Int32Array;
  weight: Float64Array;
}

export function resolveProbes(probes: ProbeSpec[], ladder: Ladder): ProbeTaps {
  const node = new Int32Array(probes.length);
  const weight = new Float64Array(probes.length);
  const problems: NetProblem[] = [];
  const last = ladder.nodes - 1;
  probes.forEach((p, n) => {
    const path = `probes[${n}]`;
    if (p.at === 'driver') node[n] = 0;
    else if (p.at === 'receiver') node[n] = last;
    else {
      const span = ladder.items.get(p.item);
      if (!span) {
        problems.push({ path, message: `no route item named '${p.item}'` });
        return;
      }
      if (p.at === 'line') {
        const cells = span.end - span.start;
        const x = span.cellLength > 0 ? p.position / span.cellLength : 0;
        if (x < 0 || x > cells * (1 + 1e-12)) {
          problems.push({ path, message: `position ${p.position} m lies outside '${p.item}'` });
          return;
        }
        const k = Math.min(Math.floor(x), Math.max(cells - 1, 0));
        node[n] = span.start + k;
        weight[n] = cells > 0 ? Math.min(x - k, 1) : 0;
      } else if (p.at === 'series') node[n] = p.side === 'in' ? span.start : span.end;
      else node[n] = span.start;
    }
  });
  if (problems.length) throw new NetError(problems);
  return { node, weight };
}

/** Writes probe values into column `sample` of `out` (shape [probes, samples], row-major). */
export function recordProbes(taps: ProbeTaps, v: Float64Array, out: Float64Array, samples: number, sample: number): void {
  const { node, weight } = taps;
  for (let p = 0; p < node.length; p++) {
    const k = node[p];
    const w = weight[p];
    out[p * samples + sample] = v[k] + w * (v[k + 1] - v[k]);
  }
}
