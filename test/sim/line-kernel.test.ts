import { describe, expect, it } from 'vitest';
import { advanceLineCells, type LineKernel } from '../../sim/line-kernel.js';

// Hand-computed leapfrog steps of the telegrapher equations on a three-node, two-cell ladder
// (C. R. Paul, Analysis of Multiconductor Transmission Lines, FDTD update equations).
describe('line kernel', () => {
  it('advances currents from old voltages, then voltages from the new currents', () => {
    // cells: L = 1, R = 0, Δt = 1 → I' = I + (Vk − Vk+1); interior node C = 1 → V' = V + (Iin − Iout)
    const k: LineKernel = {
      nodes: 3,
      v: Float64Array.from([2, 1, 0, 0]),
      i: new Float64Array(4),
      ai: Float64Array.from([0, 1, 1, 0]),
      bi: Float64Array.from([0, 1, 1, 0]),
      cv: Float64Array.from([1, 1, 1]),
      dv: Float64Array.from([0, 1, 2]), // node 0 held (lumped), node 2 a half cell (C = ½)
    };
    advanceLineCells(k);
    // I1 = 0 + (2 − 1) = 1; I2 = 0 + (1 − 0) = 1
    expect(Array.from(k.i)).toEqual([0, 1, 1, 0]);
    // V1 = 1 + (1 − 1) = 1; V2 = 0 + 2·(1 − 0) = 2; V0 unchanged
    expect(Array.from(k.v.subarray(0, 3))).toEqual([2, 1, 2]);
    advanceLineCells(k);
    // I1 = 1 + (2 − 1) = 2; I2 = 1 + (1 − 2) = 0; V1 = 1 + (2 − 0) = 3; V2 = 2 + 2·(0 − 0) = 2
    expect(Array.from(k.i)).toEqual([0, 2, 0, 0]);
    expect(Array.from(k.v.subarray(0, 3))).toEqual([2, 3, 2]);
  });

  it('averages R over the step: (L/Δt + R/2)·I′ = (L/Δt − R/2)·I + ΔV', () => {
    const L = 2;
    const R = 1;
    const k: LineKernel = {
      nodes: 2,
      v: Float64Array.from([1, 0, 0]),
      i: Float64Array.from([0, 0.5, 0]),
      ai: Float64Array.from([0, (L - R / 2) / (L + R / 2), 0]),
      bi: Float64Array.from([0, 1 / (L + R / 2), 0]),
      cv: Float64Array.from([1, 1]),
      dv: Float64Array.from([0, 0]),
    };
    advanceLineCells(k);
    expect(k.i[1]).toBeCloseTo((1.5 * 0.5 + 1) / 2.5, 15);
  });
});
