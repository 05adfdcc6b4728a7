// Frequency grids for exporting S-parameters.
import type { Net } from '../model.js';
import { fastestEdge } from '../signals.js';
import { selectRoute, type RouteSelection } from './route.js';
import { lineDelayPerLength } from '../discretize.js';

export interface GridSpec {
  /** Highest frequency (Hz). */
  fmax: number;
  /** Lowest frequency of a log grid (Hz); a linear grid starts at its step. */
  fmin?: number;
  points: number;
  spacing: 'linear' | 'log';
}

/** Bounds on the default number of points (each point costs two chain sweeps). */
export const GRID_POINTS = { min: 201, max: 20_001, perRipple: 20 } as const;

/** One-way delay of a stretch of the route (s), at the lines' high-frequency velocity. */
export function stretchDelay(net: Net, sel: RouteSelection = {}): number {
  let td = 0;
  for (const it of selectRoute(net, sel)) if (it.kind === 'line') td += it.length * lineDelayPerLength(it.line);
  return td;
}

/**
 * The default grid: linear from Δf up to the band the scenario's fastest edge needs, 3.5/t_r (ten
 * times its knee frequency 0.35/t_r, Johnson & Graham, High-Speed Digital Design, ch. 1, as the
 * run's own band in sim/realize.ts), with at least 20 points per period 1/(2·TD) of the
 * reflections' ripple so every quarter-wave point of the stretch is resolved. A given top frequency
 * replaces 3.5/t_r (and the points follow it).
 */
export function defaultGrid(net: Net, sel: RouteSelection = {}, topFrequency?: number): GridSpec {
  const edge = fastestEdge(net.driver.signal);
  const td = stretchDelay(net, sel);
  const fmax = topFrequency ?? (Number.isFinite(edge) ? 3.5 / edge : td > 0 ? 20 / td : 10e9);
  const ripples = fmax * 2 * td;
  const points = Math.min(GRID_POINTS.max, Math.max(GRID_POINTS.min, Math.ceil(ripples * GRID_POINTS.perRipple) + 1));
  return { fmax, points, spacing: 'linear' };
}

/** The frequencies of a grid: linear k·fmax/points for k = 1…points, or log-spaced from fmin to fmax. */
export function gridFrequencies(g: GridSpec): Float64Array {
  if (!(g.fmax > 0) || !(g.points >= 2) || !Number.isInteger(g.points)) throw new RangeError('a grid needs fmax > 0 and a whole number of points ≥ 2');
  const out = new Float64Array(g.points);
  if (g.spacing === 'linear') {
    const df = g.fmax / g.points;
    for (let k = 0; k < g.points; k++) out[k] = (k + 1) * df; // t = n·dt style: never accumulated
    return out;
  }
  const fmin = g.fmin ?? g.fmax / 1e4;
  if (!(fmin > 0 && fmin < g.fmax)) throw new RangeError('a log grid needs 0 < fmin < fmax');
  const r = Math.log(g.fmax / fmin) / (g.points - 1);
  for (let k = 0; k < g.points; k++) out[k] = fmin * Math.exp(k * r);
  out[g.points - 1] = g.fmax;
  return out;
}
