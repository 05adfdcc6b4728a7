// Readings of one S-parameter entry against frequency: magnitude in dB, phase unwrapped, group delay.

/** 20·log10|x| of each complex value (re/im interleaved); −Infinity for 0. */
export function magnitudeDb(z: Float64Array): Float64Array {
  const out = new Float64Array(z.length / 2);
  for (let k = 0; k < out.length; k++) out[k] = 20 * Math.log10(Math.hypot(z[2 * k], z[2 * k + 1]));
  return out;
}

/** Phase (rad) of each value, unwrapped: each step between neighbours brought into (−π, π]. */
export function unwrappedPhase(z: Float64Array): Float64Array {
  const out = new Float64Array(z.length / 2);
  let prev = 0;
  for (let k = 0; k < out.length; k++) {
    const p = Math.atan2(z[2 * k + 1], z[2 * k]);
    if (k === 0) out[k] = p;
    else {
      let d = p - prev;
      d -= 2 * Math.PI * Math.round(d / (2 * Math.PI));
      out[k] = out[k - 1] + d;
    }
    prev = p;
  }
  return out;
}

/**
 * Group delay τ = −dφ/dω (s) from the unwrapped phase by central differences (one-sided at the ends).
 * Needs the phase to change by less than π between neighbouring frequencies.
 */
export function groupDelay(freq: ArrayLike<number>, z: Float64Array): Float64Array {
  const phi = unwrappedPhase(z);
  const n = phi.length;
  const out = new Float64Array(n);
  if (n < 2) return out;
  for (let k = 0; k < n; k++) {
    const a = Math.max(0, k - 1);
    const b = Math.min(n - 1, k + 1);
    out[k] = -(phi[b] - phi[a]) / (2 * Math.PI * (freq[b] - freq[a]));
  }
  return out;
}

/** The odd quarter-wave frequencies (2k + 1)/(4·TD) up to fmax of a stretch with one-way delay TD. */
export function quarterWavePoints(td: number, fmax: number): number[] {
  const out: number[] = [];
  if (!(td > 0)) return out;
  for (let k = 0; ; k++) {
    const f = (2 * k + 1) / (4 * td);
    if (f > fmax) return out;
    out.push(f);
  }
}
