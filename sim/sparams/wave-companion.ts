// The recursive-convolution companion (companion.ts) for a rational model of S-parameters instead of
// admittances: what a Touchstone block gives after vector fitting. The model relates incident and
// reflected power waves at each port, with real reference resistances r_i (Pozar, Microwave
// Engineering, 4th ed., §4.3):  a = W(v + R·i),  b = W(v − R·i),  W = diag(1/(2√r_i)),  R = diag(r_i).
// The convolution gives b(n+1) = S0·a(n+1) + h_s(n) with S0 = D + Σ Re'(R_k·μ_k) (constant) and h_s
// the wave history. Substituting a and b and solving for the port currents:
//   W(v − R i) = S0·W(v + R i) + h_s  ⇒  i = −M⁻¹(S0 − I)W·v − M⁻¹·h_s,  M = (I + S0)·W·R,
// so the block is again i(n+1) = G_eq·v(n+1) + h(n) for a nodal solver, with G_eq = −M⁻¹(S0 − I)W and
// h = −M⁻¹·h_s. M is singular only when S0 has an eigenvalue −1 (an instantaneous short); an
// electrically short, well-matched block (S0 close to a through) gives a large but finite G_eq.
// Pure delays of the entries are not handled here yet: fit with delays 'none', or keep the delay
// shorter than the time step.
import { invert, multiply } from '../dense.js';
import { companionAdvance, companionHistory, createCompanion, type Companion } from './companion.js';
import type { RationalModel } from './rational.js';

export interface WaveCompanion {
  /** The convolution of the S model, driven by the incident waves a. */
  core: Companion;
  ports: number;
  /** Reference resistances (Ω). */
  reference: Float64Array;
  /** i(n+1) = G_eq·v(n+1) + h(n), n×n (S). */
  geq: Float64Array;
  /** h = hmap·h_s, n×n. */
  hmap: Float64Array;
  /** Scratch: wave history h_s and the current history h. */
  hs: Float64Array;
  h: Float64Array;
  a: Float64Array;
}

/** Builds the companion of an S-parameter model for the time step dt, at rest. Throws if M is singular. */
export function createWaveCompanion(model: RationalModel, reference: ArrayLike<number>, dt: number): WaveCompanion {
  const n = model.ports;
  const core = createCompanion(model, dt);
  const s0 = core.geq; // in wave units: b = S0·a + h_s
  const w = Float64Array.from(reference, (r) => 1 / (2 * Math.sqrt(r)));
  const m = new Float64Array(n * n);
  const sw = new Float64Array(n * n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      const ipS = (i === j ? 1 : 0) + s0[i * n + j];
      m[i * n + j] = ipS * w[j] * reference[j];
      sw[i * n + j] = (s0[i * n + j] - (i === j ? 1 : 0)) * w[j];
    }
  const minv = invert(m, n);
  if (!minv) throw new RangeError('the S-parameter model is an instantaneous short at a port (I + S0 is singular): it has no admittance companion');
  const hmap = minv.map((x) => -x);
  const geq = multiply(hmap, sw, n, n, n);
  return { core, ports: n, reference: Float64Array.from(reference), geq, hmap, hs: new Float64Array(n), h: new Float64Array(n), a: new Float64Array(n) };
}

/** The history currents h(n) for the coming step into `h`. */
export function waveHistory(c: WaveCompanion, h: Float64Array): void {
  companionHistory(c.core, c.hs);
  const n = c.ports;
  for (let i = 0; i < n; i++) {
    let acc = 0;
    for (let j = 0; j < n; j++) acc += c.hmap[i * n + j] * c.hs[j];
    h[i] = acc;
    c.h[i] = acc;
  }
}

/** Advances with the solved port voltages v(n+1): i(n+1) from the companion, then a(n+1) into the convolution. */
export function waveAdvance(c: WaveCompanion, vNext: ArrayLike<number>, iOut?: Float64Array): void {
  const n = c.ports;
  for (let i = 0; i < n; i++) {
    let cur = c.h[i];
    for (let j = 0; j < n; j++) cur += c.geq[i * n + j] * vNext[j];
    if (iOut) iOut[i] = cur;
    c.a[i] = (vNext[i] + c.reference[i] * cur) / (2 * Math.sqrt(c.reference[i]));
  }
  companionAdvance(c.core, c.a);
}

/**
 * Sets the state for a start in DC steady state at port voltages v0 (the DC operating point): with
 * S(0) = D − Σ Re'(R_k/a_k), the DC currents are i0 = −M0⁻¹(S(0) − I)W·v0 (M0 = (I + S(0))·W·R, as for
 * G_eq), the incident waves a0 = W(v0 + R·i0), and every pole state its steady value −a0/a_k.
 * Returns i0 (the block's DC port currents, for the DC solve's check). Throws if M0 is singular.
 */
export function startWaveAtDc(c: WaveCompanion, model: RationalModel, v0: ArrayLike<number>): Float64Array {
  const n = c.ports;
  const s0 = Float64Array.from(model.d);
  for (let k = 0; k < model.poles.length / 2; k++) {
    const ar = model.poles[2 * k];
    const ai = model.poles[2 * k + 1];
    const q = ar * ar + ai * ai;
    const wk = ai === 0 ? 1 : 2;
    for (let e = 0; e < n * n; e++) {
      const rr = model.residues[2 * (k * n * n + e)];
      const ri = model.residues[2 * (k * n * n + e) + 1];
      // −r/a = −r·conj(a)/|a|², real part
      s0[e] -= (wk * (rr * ar + ri * ai)) / q;
    }
  }
  const w = Float64Array.from(c.reference, (r) => 1 / (2 * Math.sqrt(r)));
  const m = new Float64Array(n * n);
  const rhs = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      m[i * n + j] = ((i === j ? 1 : 0) + s0[i * n + j]) * w[j] * c.reference[j];
      rhs[i] -= (s0[i * n + j] - (i === j ? 1 : 0)) * w[j] * v0[j];
    }
  }
  const minv = invert(m, n);
  if (!minv) throw new RangeError('the S-parameter model is a short at DC at a port (I + S(0) is singular)');
  const i0 = multiply(minv, rhs, n, n, 1);
  for (let j = 0; j < n; j++) {
    c.a[j] = w[j] * (v0[j] + c.reference[j] * i0[j]);
    c.core.v[j] = c.a[j];
  }
  for (let k = 0; k < c.core.poles; k++) {
    const ar = model.poles[2 * k];
    const ai = model.poles[2 * k + 1];
    const q = ar * ar + ai * ai;
    for (let j = 0; j < n; j++) {
      c.core.x[2 * (k * n + j)] = (-c.a[j] * ar) / q;
      c.core.x[2 * (k * n + j) + 1] = (c.a[j] * ai) / q;
    }
  }
  return i0;
}
