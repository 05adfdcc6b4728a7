// Time-domain companion of a rational N-port admittance Y(s) = D + Σ_k R_k/(s − a_k) (rational.ts),
// by recursive convolution of each pole's term (A. Semlyen and A. Dabuleanu, "Fast and accurate
// switching transient calculations on transmission lines with ground return using recursive
// convolutions", IEEE Trans. PAS 94(2), 1975), with the port voltages taken piecewise linear between
// time steps, for which the update is exact:
//
//   x_k,j(t) = ∫ e^{a_k(t−τ)} v_j(τ) dτ,   i(t) = D·v(t) + Σ_k R_k·x_k(t)
//   x_k(n+1) = α_k·x_k(n) + λ_k·v(n) + μ_k·v(n+1),   α = e^{aΔt},
//   P = (α − 1)/a,  Q = (α − 1)/a² − Δt/a  (∫₀^Δt e^{a(Δt−τ)}·τ dτ),  μ = Q/Δt,  λ = P − μ
//   (a → 0: λ = μ = Δt/2, the trapezoidal rule).
//
// So at every step the block is a conductance matrix and a current source between its nodes:
//   i(n+1) = G_eq·v(n+1) + h(n),   G_eq = D + Σ_k Re'(R_k·μ_k),   h(n) = Σ_k Re'(R_k·(α_k·x_k(n) + λ_k·v(n)))
// where Re'(z) is Re z for a real pole and 2·Re z for a stored conjugate pair (the pair's second
// member contributes the conjugate). G_eq is constant: a nodal cluster stamps it once into its
// matrix; every step it adds h(n) to its right-hand side (`history`), solves, and hands back v(n+1)
// (`advance`). Port voltages and currents are to the common reference (ground rail); i flows into
// the block at each port.
//
// Everything is in flat Float64Arrays allocated once; history and advance are loops of multiply-adds
// without allocation or branching on pole kinds (real poles are complex poles with zero imaginary
// part and weight 1, pairs weight 2).
import { isPair, poleCount, type RationalModel } from './rational.js';

export interface Companion {
  ports: number;
  poles: number;
  dt: number;
  /** G_eq, n×n row-major (S): i(n+1) = G_eq·v(n+1) + h(n). */
  geq: Float64Array;
  /** Per pole: α, λ, μ (re, im interleaved) and weight (1 real, 2 pair). */
  alpha: Float64Array;
  lambda: Float64Array;
  mu: Float64Array;
  weight: Float64Array;
  /** Residues, per pole an n×n complex matrix (re/im interleaved). */
  residues: Float64Array;
  /** State x_k,j (re/im interleaved), pole-major: index 2(k·n + j). */
  x: Float64Array;
  /** Port voltages of the last step, v(n). */
  v: Float64Array;
  /** Scratch: α·x + λ·v per pole and port (re/im). */
  w: Float64Array;
}

/** Recursive-convolution coefficients of one pole a = ar + j·ai for the step dt (see the header). */
export function poleCoefficients(ar: number, ai: number, dt: number): { alpha: [number, number]; lambda: [number, number]; mu: [number, number] } {
  const e = Math.exp(ar * dt);
  const alr = e * Math.cos(ai * dt);
  const ali = e * Math.sin(ai * dt);
  const zr = ar * dt;
  const zi = ai * dt;
  if (Math.hypot(zr, zi) < 0.1) {
    // |z| = |a|Δt < 0.1: the closed forms cancel (error ~ ε/|z|²), so sum the series
    // P/Δt = Σ z^k/(k+1)!, μ/Δt = Σ z^k/(k+2)! by Horner's rule to k = 10 (truncation < 1e-18).
    let pr = 0;
    let pi = 0;
    let mr = 0;
    let mi = 0;
    for (let k = 10; k >= 0; k--) {
      const fp = 1 / factorial(k + 1);
      const fm = 1 / factorial(k + 2);
      [pr, pi] = [pr * zr - pi * zi + fp, pr * zi + pi * zr];
      [mr, mi] = [mr * zr - mi * zi + fm, mr * zi + mi * zr];
    }
    return { alpha: [alr, ali], lambda: [dt * (pr - mr), dt * (pi - mi)], mu: [dt * mr, dt * mi] };
  }
  // 1/a
  const q = ar * ar + ai * ai;
  const iar = ar / q;
  const iai = -ai / q;
  // P = (α − 1)/a
  const pr = (alr - 1) * iar - ali * iai;
  const pi = (alr - 1) * iai + ali * iar;
  // Q = (P − Δt)/a
  const qr = (pr - dt) * iar - pi * iai;
  const qi = (pr - dt) * iai + pi * iar;
  const mr = qr / dt;
  const mi = qi / dt;
  return { alpha: [alr, ali], lambda: [pr - mr, pi - mi], mu: [mr, mi] };
}

function factorial(k: number): number {
  let f = 1;
  for (let i = 2; i <= k; i++) f *= i;
  return f;
}

/** Builds the companion of `model` for the time step dt, at rest (all states and voltages 0). */
export function createCompanion(model: RationalModel, dt: number): Companion {
  const n = model.ports;
  const m = poleCount(model);
  const c: Companion = {
    ports: n,
    poles: m,
    dt,
    geq: Float64Array.from(model.d),
    alpha: new Float64Array(2 * m),
    lambda: new Float64Array(2 * m),
    mu: new Float64Array(2 * m),
    weight: new Float64Array(m),
    residues: Float64Array.from(model.residues),
    x: new Float64Array(2 * m * n),
    v: new Float64Array(n),
    w: new Float64Array(2 * m * n),
  };
  for (let k = 0; k < m; k++) {
    const { alpha, lambda, mu } = poleCoefficients(model.poles[2 * k], model.poles[2 * k + 1], dt);
    c.alpha.set(alpha, 2 * k);
    c.lambda.set(lambda, 2 * k);
    c.mu.set(mu, 2 * k);
    c.weight[k] = isPair(model, k) ? 2 : 1;
    // G_eq += weight·Re(R_k·μ_k)
    for (let e = 0; e < n * n; e++) {
      const rr = model.residues[2 * (k * n * n + e)];
      const ri = model.residues[2 * (k * n * n + e) + 1];
      c.geq[e] += c.weight[k] * (rr * mu[0] - ri * mu[1]);
    }
  }
  return c;
}

/**
 * Sets the state for a start in DC steady state at port voltages v0: x_k = −v0/a_k (the steady state
 * of x' = a·x + v for a stable pole). Returns the DC currents i = Y(0)·v0 into `current` if given.
 */
export function startAtDc(c: Companion, model: RationalModel, v0: ArrayLike<number>): void {
  const n = c.ports;
  for (let j = 0; j < n; j++) c.v[j] = v0[j];
  for (let k = 0; k < c.poles; k++) {
    const ar = model.poles[2 * k];
    const ai = model.poles[2 * k + 1];
    const q = ar * ar + ai * ai;
    for (let j = 0; j < n; j++) {
      // −v/a = −v·conj(a)/|a|²
      c.x[2 * (k * n + j)] = (-v0[j] * ar) / q;
      c.x[2 * (k * n + j) + 1] = (v0[j] * ai) / q;
    }
  }
}

/** The history currents h(n) (one per port) for the coming step, from x(n) and v(n). */
export function companionHistory(c: Companion, h: Float64Array): void {
  const n = c.ports;
  const { x, v, w, alpha, lambda, residues, weight } = c;
  h.fill(0, 0, n);
  for (let k = 0; k < c.poles; k++) {
    const ar = alpha[2 * k];
    const ai = alpha[2 * k + 1];
    const lr = lambda[2 * k];
    const li = lambda[2 * k + 1];
    for (let j = 0; j < n; j++) {
      const s = 2 * (k * n + j);
      w[s] = ar * x[s] - ai * x[s + 1] + lr * v[j];
      w[s + 1] = ar * x[s + 1] + ai * x[s] + li * v[j];
    }
    const wk = weight[k];
    for (let i = 0; i < n; i++) {
      let acc = 0;
      for (let j = 0; j < n; j++) {
        const r = 2 * ((k * n + i) * n + j);
        const s = 2 * (k * n + j);
        acc += residues[r] * w[s] - residues[r + 1] * w[s + 1];
      }
      h[i] += wk * acc;
    }
  }
}

/**
 * Advances the state with the solved port voltages v(n+1): x(n+1) = α·x(n) + λ·v(n) + μ·v(n+1).
 * companionHistory must have run for this step (it leaves α·x(n) + λ·v(n) in the scratch array).
 */
export function companionAdvance(c: Companion, vNext: ArrayLike<number>): void {
  const n = c.ports;
  const { x, w, mu } = c;
  for (let k = 0; k < c.poles; k++) {
    const mr = mu[2 * k];
    const mi = mu[2 * k + 1];
    for (let j = 0; j < n; j++) {
      const s = 2 * (k * n + j);
      x[s] = w[s] + mr * vNext[j];
      x[s + 1] = w[s + 1] + mi * vNext[j];
    }
  }
  for (let j = 0; j < n; j++) c.v[j] = vNext[j];
}

/** Port currents i(n+1) = G_eq·v(n+1) + h(n) into `out` (for probes and energy bookkeeping). */
export function companionCurrent(c: Companion, vNext: ArrayLike<number>, h: Float64Array, out: Float64Array): void {
  const n = c.ports;
  for (let i = 0; i < n; i++) {
    let acc = h[i];
    for (let j = 0; j < n; j++) acc += c.geq[i * n + j] * vNext[j];
    out[i] = acc;
  }
}
