// Reference solution for a lossless line with resistive ends: the bounce (lattice) diagram.
// Sum of forward and backward waves, V(x,t) = a·Σ (Γs·Γl)^n [vs(t − x/v − 2nT) + Γl·vs(t − 2T + x/v − 2nT)],
// with a = Z0/(Rs+Z0), Γ = (R−Z0)/(R+Z0) (any transmission-line textbook, e.g. Pozar, Microwave
// Engineering, ch. 2; Johnson & Graham, High-Speed Digital Design, ch. 4). Valid for a source that
// starts from 0 V with the line at rest.

export interface LatticeCase {
  z0: number;
  delay: number;
  rs: number;
  /** Load resistance; Infinity = open, 0 = short. */
  rl: number;
  source: (t: number) => number;
}

export function reflection(r: number, z0: number): number {
  return r === Infinity ? 1 : (r - z0) / (r + z0);
}

/** Voltage at fraction `x` (0 = source end, 1 = load end) of the line at time t. */
export function latticeVoltage(c: LatticeCase, x: number, t: number): number {
  const a = c.z0 / (c.rs + c.z0);
  const gs = reflection(c.rs, c.z0);
  const gl = reflection(c.rl, c.z0);
  let v = 0;
  let k = 1;
  for (let n = 0; ; n++) {
    const tf = t - x * c.delay - 2 * n * c.delay;
    if (tf < 0 || Math.abs(k) < 1e-15) break;
    v += a * k * c.source(tf);
    const tb = t - (2 - x) * c.delay - 2 * n * c.delay;
    if (tb >= 0) v += a * k * gl * c.source(tb);
    k *= gs * gl;
  }
  return v;
}
