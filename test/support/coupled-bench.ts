// A bench for coupled sections on their own: resistive ends (a Thevenin source or a resistor to the
// return on each conductor, resistors across conductors), updated with the end-group node equation
// (sim/coupled/ends.ts). The real terminations come from the circuit's lumped clusters; this stands in
// for them in the kernel's tests. Also runs the single-line kernel with the same ends, for comparison.
import type { CoupledLine } from '../../sim/coupled/line.js';
import { advanceCoupledSection, buildCoupledSection, type CoupledSection } from '../../sim/coupled/kernel.js';
import { advanceEndGroup, buildEndGroup, type EndGroup } from '../../sim/coupled/ends.js';
import { compileNet } from '../../sim/circuit.js';
import { buildLadder } from '../../sim/ladder.js';
import { advanceLineCells, buildLineKernel, type LineKernel } from '../../sim/line-kernel.js';
import type { LineRLGC } from '../../sim/model.js';
import { net, stepSignal } from './nets.js';

export interface EndSpec {
  /** Resistance from each conductor's end node to the return (ohm); Infinity = none. */
  toReturn: number[];
  /** Open-circuit voltage behind each of those resistors (V) against time; absent = 0 V. */
  sources?: ((t: number) => number)[];
  /** Resistors between two conductors' end nodes (a differential termination). */
  across?: { a: number; b: number; r: number }[];
}

/** The cells between the two end groups: a coupled section or a single-line kernel. */
interface Cells {
  k: number;
  /** Where the end nodes live. */
  ends: Float64Array;
  near: number[];
  far: number[];
  /** Half-cell C and G at each end (k×k). */
  endC: Float64Array;
  endG: Float64Array;
  step(): void;
  /** Current leaving near node c into the first cell; arriving at far node c from the last cell. */
  nearCurrent(c: number): number;
  farCurrent(c: number): number;
}

export interface BenchRecord {
  /** Near- and far-end voltage of each conductor at t = n·dt, n = 0 … steps. */
  near: Float64Array[];
  far: Float64Array[];
  /** Energy (J) delivered by the sources and turned into heat in the end resistors, over the run. */
  supplied: number;
  dissipatedInEnds: number;
}

function endConductance(spec: EndSpec, k: number, g: Float64Array): Float64Array {
  const out = Float64Array.from(g);
  spec.toReturn.forEach((r, c) => {
    if (r !== Infinity) out[c * k + c] += 1 / r;
  });
  for (const x of spec.across ?? []) {
    out[x.a * k + x.a] += 1 / x.r;
    out[x.b * k + x.b] += 1 / x.r;
    out[x.a * k + x.b] -= 1 / x.r;
    out[x.b * k + x.a] -= 1 / x.r;
  }
  return out;
}

/** Steps `cells` with resistive ends for `steps` steps of `dt`, recording both ends. */
export function runBench(cells: Cells, dt: number, steps: number, nearSpec: EndSpec, farSpec: EndSpec, observe?: (n: number) => void): BenchRecord {
  const { k, ends } = cells;
  const nearGroup = buildEndGroup(cells.near, cells.endC, endConductance(nearSpec, k, cells.endG), dt);
  const farGroup = buildEndGroup(cells.far, cells.endC, endConductance(farSpec, k, cells.endG), dt);
  const near = Array.from({ length: k }, () => new Float64Array(steps + 1));
  const far = Array.from({ length: k }, () => new Float64Array(steps + 1));
  const inflow = new Float64Array(k);
  const rec = { near, far, supplied: 0, dissipatedInEnds: 0 };
  const record = (n: number) => {
    for (let c = 0; c < k; c++) {
      near[c][n] = ends[cells.near[c]];
      far[c][n] = ends[cells.far[c]];
    }
  };
  record(0);
  const source = (spec: EndSpec, c: number, t: number) => spec.sources?.[c]?.(t) ?? 0;
  for (let n = 1; n <= steps; n++) {
    const t0 = (n - 1) * dt;
    const t1 = n * dt;
    cells.step();
    const update = (group: EndGroup, spec: EndSpec, current: (c: number) => number) => {
      const before = Array.from(group.nodes, (node) => ends[node]);
      for (let c = 0; c < k; c++) {
        const r = spec.toReturn[c];
        const vs = (source(spec, c, t0) + source(spec, c, t1)) / 2;
        inflow[c] = (r !== Infinity ? vs / r : 0) + current(c);
      }
      advanceEndGroup(group, ends, inflow);
      // energy with the step's averages, as the centred node equation sees them
      for (let c = 0; c < k; c++) {
        const r = spec.toReturn[c];
        if (r === Infinity) continue;
        const vs = (source(spec, c, t0) + source(spec, c, t1)) / 2;
        const vn = (before[c] + ends[group.nodes[c]]) / 2;
        rec.supplied += (dt * vs * (vs - vn)) / r;
        rec.dissipatedInEnds += (dt * (vs - vn) ** 2) / r;
      }
      for (const x of spec.across ?? []) {
        const va = (before[x.a] + ends[group.nodes[x.a]]) / 2;
        const vb = (before[x.b] + ends[group.nodes[x.b]]) / 2;
        rec.dissipatedInEnds += (dt * (va - vb) ** 2) / x.r;
      }
    };
    update(nearGroup, nearSpec, (c) => -cells.nearCurrent(c));
    update(farGroup, farSpec, (c) => cells.farCurrent(c));
    record(n);
    observe?.(n);
  }
  return rec;
}

/** A coupled section as bench cells (its end nodes in a small array of 2k). */
export function coupledCells(line: CoupledLine, length: number, cells: number, dt: number): Cells & { section: CoupledSection } {
  const section = buildCoupledSection(line, length, cells, dt);
  const { k } = line;
  const ends = new Float64Array(2 * k);
  const last = (cells - 1) * k;
  return {
    section,
    k,
    ends,
    near: [...section.nearNodes],
    far: [...section.farNodes],
    endC: section.endLoad.c,
    endG: section.endLoad.g,
    step: () => advanceCoupledSection(section, ends),
    nearCurrent: (c) => section.i[c],
    farCurrent: (c) => section.i[last + c],
  };
}

/**
 * One line segment through the engine's own ladder and single-line kernel (sim/ladder.ts,
 * sim/line-kernel.ts), both end nodes left to the bench, as in a run where parts touch both ends.
 */
export function singleLineCells(line: LineRLGC, length: number, cells: number, dt: number): Cells & { kernel: LineKernel } {
  const n = net({ signal: stepSignal(1, 1e-10), rs: 50, route: [{ kind: 'line', name: 'seg', line, length }] });
  const cellLength = length / cells;
  const plan = {
    dt,
    steps: 1,
    duration: dt,
    cells,
    nodes: cells + 1,
    segments: [{ name: 'seg', length, cells, cellLength, delay: length * Math.sqrt(line.l * line.c), z0: Math.sqrt(line.l / line.c), courant: 1 }],
    dtRule: { rule: 'duration' as const, duration: dt, steps: 1 },
  };
  const ladder = buildLadder(compileNet(n), plan);
  const zero = { v: new Float64Array(cells + 1), i: new Float64Array(cells + 2), lumped: new Float64Array(ladder.lumped.length) };
  const lumpedNode = new Uint8Array(cells + 1);
  lumpedNode[0] = 1;
  lumpedNode[cells] = 1;
  const kernel = buildLineKernel(ladder, dt, zero, lumpedNode);
  return {
    kernel,
    k: 1,
    ends: kernel.v,
    near: [0],
    far: [cells],
    endC: Float64Array.of(ladder.nodeC[0]),
    endG: Float64Array.of(ladder.nodeG[0]),
    step: () => advanceLineCells(kernel),
    nearCurrent: () => kernel.i[1],
    farCurrent: () => kernel.i[cells],
  };
}

/** A 0 → `to` linear ramp of duration `rise` starting at `start` (the IEEE 181 trapezoid's edge). */
export function ramp(to: number, rise: number, start = 0): (t: number) => number {
  return (t) => (t <= start ? 0 : t >= start + rise ? to : (to * (t - start)) / rise);
}
