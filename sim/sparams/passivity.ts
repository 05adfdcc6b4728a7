// Passivity of S-parameters: a passive network absorbs power, so the largest singular value of S
// is at most 1 at every frequency (Pozar, Microwave Engineering, 4th ed., §4.3: for a lossless
// network S is unitary, σ = 1; loss makes every σ < 1). Checked on the data at its samples, and on a
// fitted model also between the samples (a fit can bulge between them) and beyond the top sample.
import { largestSingularValue } from './cmatrix.js';
import type { NetworkData } from './network.js';
import { toKind } from './network.js';
import { evaluateFit, type FitResult } from './vector-fit.js';

export interface PassivityReport {
  passive: boolean;
  /** Largest singular value found and where. */
  worstSigma: number;
  worstFrequency: number;
  /** 1 − σmax: how far below 1 (> 0) or above it (< 0). */
  margin: number;
  /** Frequencies checked. */
  points: number;
}

/** Allowed excess of σ over 1 before a network is called non-passive (round-off in files and fits). */
export const PASSIVITY_TOLERANCE = 1e-9;

function report(worst: number, at: number, points: number): PassivityReport {
  return { passive: worst <= 1 + PASSIVITY_TOLERANCE, worstSigma: worst, worstFrequency: at, margin: 1 - worst, points };
}

/** σmax(S) at every sample of the data. */
export function passivityOfData(net: NetworkData): PassivityReport {
  const s = toKind(net, 'S');
  const m = 2 * s.ports * s.ports;
  let worst = -Infinity;
  let at = s.freq[0];
  for (let k = 0; k < s.freq.length; k++) {
    const v = largestSingularValue({ n: s.ports, d: s.data.subarray(k * m, (k + 1) * m) });
    if (v > worst) {
      worst = v;
      at = s.freq[k];
    }
  }
  return report(worst, at, s.freq.length);
}

/**
 * σmax(S) of a fitted S-parameter model on a fine grid: `refine` points in every interval between the
 * data's frequencies and from near 0 to the first one.
 */
export function passivityOfFit(fit: FitResult, freq: ArrayLike<number>, refine = 10): PassivityReport {
  const grid: number[] = [];
  const top = freq[freq.length - 1];
  const edges = [top * 1e-6, ...Array.from(freq)];
  for (let i = 0; i + 1 < edges.length; i++) for (let r = 0; r < refine; r++) grid.push(edges[i] + ((edges[i + 1] - edges[i]) * r) / refine);
  grid.push(top);
  return worstOnGrid(fit, grid);
}

/** σmax(S) of a fitted model above the data, from the top frequency to `factor`·top in `points` steps (a fit is unconstrained there). */
export function passivityAboveBand(fit: FitResult, top: number, factor = 2, points = 400): PassivityReport {
  const grid = Array.from({ length: points }, (_, k) => top * (1 + ((factor - 1) * (k + 1)) / points));
  return worstOnGrid(fit, grid);
}

function worstOnGrid(fit: FitResult, grid: readonly number[]): PassivityReport {
  const n = fit.model.ports;
  const out = new Float64Array(2 * n * n);
  let worst = -Infinity;
  let at = grid[0];
  for (const f of grid) {
    evaluateFit(fit.model, fit.delays, 2 * Math.PI * f, out);
    const v = largestSingularValue({ n, d: out });
    if (v > worst) {
      worst = v;
      at = f;
    }
  }
  return report(worst, at, grid.length);
}
