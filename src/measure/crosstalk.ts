// Crosstalk on a quiet net: how far a probe of a net whose driver holds its level departs from its
// resting level (the DC operating point at t = 0) while other nets switch — the near-end and far-end
// noise of a victim, in volts and as a fraction of the aggressor's swing (the usual way to state a
// crosstalk budget; e.g. H. Johnson and M. Graham, High-Speed Digital Design, crosstalk).
import type { Samples } from './levels.js';

export interface CrosstalkMeasurement {
  /** Resting level: the first sample (V). */
  restV: number;
  /** Signed departure of largest magnitude from the resting level (V), and when. */
  peakV: number;
  peakTime: number;
  /** Largest departure above and below the resting level (V, both ≥ 0). */
  aboveV: number;
  belowV: number;
  /** The swing it is compared with: the largest nominal swing among the switching drivers (V); null without one. */
  aggressorSwingV: number | null;
  /** |peakV| as a percentage of aggressorSwingV; null without an aggressor. */
  peakPct: number | null;
}

/** The crosstalk of one probe's record (samples at t0 + i·dt). */
export function measureCrosstalk(values: Samples, dt: number, aggressorSwing: number | null, t0 = 0): CrosstalkMeasurement {
  const rest = values[0] ?? 0;
  let above = 0;
  let below = 0;
  let peak = 0;
  let at = 0;
  for (let i = 0; i < values.length; i++) {
    const d = values[i]! - rest;
    if (d > above) above = d;
    if (-d > below) below = -d;
    if (Math.abs(d) > Math.abs(peak)) {
      peak = d;
      at = i;
    }
  }
  const swing = aggressorSwing !== null && aggressorSwing > 0 ? aggressorSwing : null;
  return { restV: rest, peakV: peak, peakTime: t0 + at * dt, aboveV: above, belowV: below, aggressorSwingV: swing, peakPct: swing === null ? null : (100 * Math.abs(peak)) / swing };
}
