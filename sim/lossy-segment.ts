// Line segments with frequency-dependent loss. Each cell's series impedance is R0 + sL plus R‖L
// sections (skin effect); each interior node's shunt admittance is G + sC plus series R–C branches
// (Debye terms of the dielectric). A section's inductor current i_k and a branch's capacitor voltage
// v_k both obey dx/dt = (u − x)/τ (u the cell current or node voltage), integrated with the
// trapezoidal rule: x(n+1) = α·x(n) + β·(u(n+1) + u(n)), α = (1 − h)/(1 + h), β = h/(1 + h),
// h = Δt/(2τ). Substituting into the leapfrog update keeps it one multiply-add per state:
//   (L/Δt + R_eff/2)·I′ = (L/Δt − R_eff/2)·I + ΔV + Σ R_k(1 + α_k)/2 · i_k,  R_eff = R0 + Σ R_k(1 − β_k)
//   (C/Δt + G_eff/2)·V′ = (C/Δt − G_eff/2)·V + ΔI + Σ (1 + α_k)/(2R_k) · v_k,  G_eff = G + Σ (1 − β_k)/R_k
// (recursive convolution of a sum of exponentials; Paul, Analysis of Multiconductor Transmission
// Lines, FDTD with frequency-dependent parameters, in its trapezoidal form).
import type { DcState } from './dc.js';
import type { ItemSpan } from './ladder.js';

export interface LossySegments {
  count: number;
  start: Int32Array;
  end: Int32Array;
  series: Int32Array;
  shunt: Int32Array;
  coefOffset: Int32Array;
  currentStateOffset: Int32Array;
  voltageStateOffset: Int32Array;
  /** Per segment: a, b, c, d, then (gain, α, β) per section, then (gain, α, β) per branch. */
  coef: Float64Array;
  currentState: Float64Array;
  voltageState: Float64Array;
}

function trapezoid(dt: number, tau: number): [number, number] {
  const h = dt / (2 * tau);
  return [(1 - h) / (1 + h), h / (1 + h)];
}

export function buildLossySegments(spans: ItemSpan[], dt: number, dc: DcState): LossySegments {
  const n = spans.length;
  const ls: LossySegments = {
    count: n,
    start: Int32Array.from(spans, (s) => s.start),
    end: Int32Array.from(spans, (s) => s.end),
    series: Int32Array.from(spans, (s) => s.line!.series?.length ?? 0),
    shunt: Int32Array.from(spans, (s) => s.line!.shunt?.length ?? 0),
    coefOffset: new Int32Array(n),
    currentStateOffset: new Int32Array(n),
    voltageStateOffset: new Int32Array(n),
    coef: new Float64Array(0),
    currentState: new Float64Array(0),
    voltageState: new Float64Array(0),
  };
  let co = 0;
  let io = 0;
  let vo = 0;
  spans.forEach((s, k) => {
    ls.coefOffset[k] = co;
    ls.currentStateOffset[k] = io;
    ls.voltageStateOffset[k] = vo;
    const cells = s.end - s.start;
    co += 4 + 3 * (ls.series[k] + ls.shunt[k]);
    io += cells * ls.series[k];
    vo += Math.max(cells - 1, 0) * ls.shunt[k];
  });
  ls.coef = new Float64Array(co);
  ls.currentState = new Float64Array(io);
  ls.voltageState = new Float64Array(vo);
  spans.forEach((s, k) => {
    const line = s.line!;
    const dz = s.cellLength;
    const c = ls.coef;
    let o = ls.coefOffset[k];
    const l = line.l * dz;
    let rEff = line.r * dz;
    const sections = (line.series ?? []).map((t) => {
      const [alpha, beta] = trapezoid(dt, t.tau);
      const r = t.value * dz;
      rEff += r * (1 - beta);
      return { r, alpha, beta };
    });
    let gEff = line.g * dz;
    const branches = (line.shunt ?? []).map((t) => {
      const [alpha, beta] = trapezoid(dt, t.tau);
      const r = t.tau / (t.value * dz);
      gEff += (1 - beta) / r;
      return { r, alpha, beta };
    });
    const denI = l / dt + rEff / 2;
    const cap = line.c * dz;
    const denV = cap / dt + gEff / 2;
    c[o++] = (l / dt - rEff / 2) / denI;
    c[o++] = 1 / denI;
    c[o++] = (cap / dt - gEff / 2) / denV;
    c[o++] = 1 / denV;
    for (const x of sections) {
      c[o++] = (x.r * (1 + x.alpha)) / 2 / denI;
      c[o++] = x.alpha;
      c[o++] = x.beta;
    }
    for (const x of branches) {
      c[o++] = (1 + x.alpha) / (2 * x.r) / denV;
      c[o++] = x.alpha;
      c[o++] = x.beta;
    }
    // DC start: every section's inductor carries the cell current, every branch capacitor holds the node voltage.
    const cells = s.end - s.start;
    for (let j = 0; j < cells; j++) {
      for (let q = 0; q < ls.series[k]; q++) ls.currentState[ls.currentStateOffset[k] + j * ls.series[k] + q] = dc.branch[s.start + j];
      if (j > 0) for (let q = 0; q < ls.shunt[k]; q++) ls.voltageState[ls.voltageStateOffset[k] + (j - 1) * ls.shunt[k] + q] = dc.v[s.start + j];
    }
  });
  return ls;
}

/** Advances the auxiliary states of one cell's series sections, returning the new cell current. */
function advanceCellCurrent(
  i: Float64Array, v: Float64Array, n: number, a: number, b: number,
  coef: Float64Array, co: number, state: Float64Array, so: number, count: number,
): number {
  const old = i[n + 1];
  let acc = a * old + b * (v[n] - v[n + 1]);
  for (let q = 0; q < count; q++) acc += coef[co + 3 * q] * state[so + q];
  i[n + 1] = acc;
  const sum = acc + old;
  for (let q = 0; q < count; q++) state[so + q] = coef[co + 3 * q + 1] * state[so + q] + coef[co + 3 * q + 2] * sum;
  return acc;
}

export function advanceLossySegment(ls: LossySegments, s: number, v: Float64Array, i: Float64Array): void {
  const start = ls.start[s];
  const end = ls.end[s];
  const ks = ls.series[s];
  const kd = ls.shunt[s];
  const co = ls.coefOffset[s];
  const { coef, currentState, voltageState } = ls;
  const a = coef[co];
  const b = coef[co + 1];
  const c = coef[co + 2];
  const d = coef[co + 3];
  const cs = co + 4;
  const cd = cs + 3 * ks;
  let io = ls.currentStateOffset[s];
  let vo = ls.voltageStateOffset[s];
  let left = advanceCellCurrent(i, v, start, a, b, coef, cs, currentState, io, ks);
  io += ks;
  for (let n = start + 1; n < end; n++) {
    const right = advanceCellCurrent(i, v, n, a, b, coef, cs, currentState, io, ks);
    io += ks;
    const old = v[n];
    let acc = c * old + d * (left - right);
    for (let q = 0; q < kd; q++) acc += coef[cd + 3 * q] * voltageState[vo + q];
    v[n] = acc;
    const sum = acc + old;
    for (let q = 0; q < kd; q++) voltageState[vo + q] = coef[cd + 3 * q + 1] * voltageState[vo + q] + coef[cd + 3 * q + 2] * sum;
    vo += kd;
    left = right;
  }
}
