// Switching coefficients: over an edge, the pull-up conducts k_u(τ)·I_pu and the pull-down k_d(τ)·I_pd,
// τ being the time since the edge started. Each edge's coefficients are sampled uniformly (τ_k = k·Δτ)
// and interpolated linearly, so a lookup is one division; after the last sample they hold their final
// values (the driver's steady high or low state).

export interface SwitchingCurve {
  /** Sample spacing (s). */
  dtau: number;
  ku: Float64Array;
  kd: Float64Array;
}

export interface Switching {
  rising: SwitchingCurve;
  falling: SwitchingCurve;
  /** Where the coefficients come from, for summaries ("linear ramps", "two waveforms", …). */
  source: string;
}

export interface Coefficients {
  ku: number;
  kd: number;
}

/** Duration of an edge's coefficient curve (s). */
export function curveDuration(c: SwitchingCurve): number {
  return (c.ku.length - 1) * c.dtau;
}

/** Coefficients at time tau after the edge's start (the first sample before it, the last after its end). */
export function evalSwitching(c: SwitchingCurve, tau: number, out: Coefficients): Coefficients {
  const last = c.ku.length - 1;
  const x = tau / c.dtau;
  if (!(x > 0)) {
    out.ku = c.ku[0];
    out.kd = c.kd[0];
    return out;
  }
  if (x >= last) {
    out.ku = c.ku[last];
    out.kd = c.kd[last];
    return out;
  }
  const k = Math.floor(x);
  const f = x - k;
  out.ku = c.ku[k] + f * (c.ku[k + 1] - c.ku[k]);
  out.kd = c.kd[k] + f * (c.kd[k + 1] - c.kd[k]);
  return out;
}

/** Steady coefficients of the high (after a rising edge) and low (after a falling edge) states. */
export function steadyCoefficients(s: Switching, high: boolean): Coefficients {
  const c = high ? s.rising : s.falling;
  const last = c.ku.length - 1;
  return { ku: c.ku[last], kd: c.kd[last] };
}

/**
 * Complementary linear ramps: over a rising edge k_u goes 0 → 1 and k_d 1 → 0 in `rise` seconds, the
 * reverse over a falling edge in `fall`. With equal resistive tables R this is exactly a Thevenin
 * source ramping 0 → V_supply behind R (I = [V − k_u·V_s]/R), i.e. today's linear driver.
 */
export function linearSwitching(rise: number, fall: number): Switching {
  if (!(rise > 0) || !(fall > 0)) throw new RangeError(`ramp durations must be positive, got ${rise} s and ${fall} s`);
  return {
    rising: { dtau: rise, ku: Float64Array.of(0, 1), kd: Float64Array.of(1, 0) },
    falling: { dtau: fall, ku: Float64Array.of(1, 0), kd: Float64Array.of(0, 1) },
    source: 'linear ramps',
  };
}
