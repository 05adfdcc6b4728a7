// A lossless line between two terminations, solved exactly by the method of characteristics: each end
// sees a Thevenin source E(n) = V_far(n − M) + Z0·I_far(n − M) behind Z0, where I is the current into the
// line and M = TD/Δt (an integer). Used to test device terminations before the engine carries them.

/** An end: given the line's Norton equivalent at step n (current into the line = g·V − j), returns V. */
export type LineEnd = (n: number, g: number, j: number) => number;

export interface DelayLineRun {
  va: Float64Array;
  vb: Float64Array;
  /** Current into the line at each end. */
  ia: Float64Array;
  ib: Float64Array;
}

/** Runs steps 1…N from a line at rest at `v0` volts (no current), ends A and B. */
export function runDelayLine(z0: number, m: number, steps: number, v0: number, endA: LineEnd, endB: LineEnd): DelayLineRun {
  const va = new Float64Array(steps + 1).fill(v0);
  const vb = new Float64Array(steps + 1).fill(v0);
  const ia = new Float64Array(steps + 1);
  const ib = new Float64Array(steps + 1);
  const g = 1 / z0;
  for (let n = 1; n <= steps; n++) {
    const k = Math.max(0, n - m);
    const eA = vb[k] + z0 * ib[k];
    const eB = va[k] + z0 * ia[k];
    va[n] = endA(n, g, eA * g);
    vb[n] = endB(n, g, eB * g);
    ia[n] = (va[n] - eA) * g;
    ib[n] = (vb[n] - eB) * g;
  }
  return { va, vb, ia, ib };
}
