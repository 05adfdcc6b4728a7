import { describe, expect, it } from 'vitest';
import { advanceLineCells, type LineKernel } from '../../sim/line-kernel.js';
import { buildLossySegments } from '../../sim/lossy-segment.js';

const noLossySegments = () => buildLossySegments([], 1, { v: new Float64Array(0), i: new Float64Array(0), lumped: new Float64Array(0) });

// Hand-computed leapfrog steps of the telegrapher equations on a three-node, two-cell ladder
// (C. R. Paul, Analysis of Multiconductor Transmission Lines, FDTD update equations).
function kernel(v: number[], i: number[], a: number, b: number, c: number, d: number, joinD: number): LineKernel {
  return {
    v: Float64Array.from(v),
    i: Float64Array.from(i),
    segStart: Int32Array.from([0]),
    segEnd: Int32Array.from([v.length - 2]),
    segA: Float64Array.from([a]),
    segB: Float64Array.from([b]),
    segC: Float64Array.from([c]),
    segD: Float64Array.from([d]),
    ghosts: new Int32Array(0),
    // node 0 is held by the lumped system; the open far end is a half cell with the last cell flowing in
    joinNode: Int32Array.from([v.length - 2]),
    joinC: Float64Array.from([1]),
    joinD: Float64Array.from([joinD]),
    joinStart: Int32Array.from([0, 1]),
    joinCell: Int32Array.from([v.length - 2]),
    joinSign: Float64Array.from([1]),
    lossy: noLossySegments(),
    coupled: [],
  };
}

describe('line kernel', () => {
  it('advances currents from old voltages, then voltages from the new currents', () => {
    // cells: L = 1, R = 0, Δt = 1 → I' = I + (Vk − Vk+1); interior node C = 1 → V' = V + (Iin − Iout);
    // end node C = ½ → V' = V + 2·(Iin − 0)
    const k = kernel([2, 1, 0, 0], [0, 0, 0, 0], 1, 1, 1, 1, 2);
    advanceLineCells(k);
    // I1 = 0 + (2 − 1) = 1; I2 = 0 + (1 − 0) = 1; V1 = 1 + (1 − 1) = 1; V2 = 0 + 2·(1 − 0) = 2; V0 held
    expect(Array.from(k.i)).toEqual([0, 1, 1, 0]);
    expect(Array.from(k.v.subarray(0, 3))).toEqual([2, 1, 2]);
    advanceLineCells(k);
    // I1 = 1 + (2 − 1) = 2; I2 = 1 + (1 − 2) = 0; V1 = 1 + (2 − 0) = 3; V2 = 2 + 2·(0 − 0) = 2
    expect(Array.from(k.i)).toEqual([0, 2, 0, 0]);
    expect(Array.from(k.v.subarray(0, 3))).toEqual([2, 3, 2]);
  });

  it('averages R over the step: (L/Δt + R/2)·I′ = (L/Δt − R/2)·I + ΔV', () => {
    const L = 2;
    const R = 1;
    const k = kernel([1, 0, 0], [0, 0.5, 0], (L - R / 2) / (L + R / 2), 1 / (L + R / 2), 1, 0, 0);
    advanceLineCells(k);
    expect(k.i[1]).toBeCloseTo((1.5 * 0.5 + 1) / 2.5, 15);
  });
});
