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
import type { SegmentSpan } from './ladder.js';

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

/** Terms are stored in blocks of four (padded with inert terms: gain 0, α 1, β 0) so the cell loop can be unrolled. */
const BLOCK = 4;
function padToBlock(n: number): number {
  return Math.max(1, Math.ceil(n / BLOCK)) * BLOCK;
}

function trapezoid(dt: number, tau: number): [number, number] {
  const h = dt / (2 * tau);
  return [(1 - h) / (1 + h), h / (1 + h)];
}

export function buildLossySegments(spans: SegmentSpan[], dt: number, dc: DcState): LossySegments {
  const n = spans.length;
  const ls: LossySegments = {
    count: n,
    start: Int32Array.from(spans, (s) => s.base),
    end: Int32Array.from(spans, (s) => s.base + s.cells),
    series: Int32Array.from(spans, (s) => padToBlock(s.line.series?.length ?? 0)),
    shunt: Int32Array.from(spans, (s) => padToBlock(s.line.shunt?.length ?? 0)),
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
    const cells = s.cells;
    co += 4 + 3 * (ls.series[k] + ls.shunt[k]);
    io += cells * ls.series[k];
    vo += Math.max(cells - 1, 0) * ls.shunt[k];
  });
  ls.coef = new Float64Array(co);
  ls.currentState = new Float64Array(io);
  ls.voltageState = new Float64Array(vo);
  spans.forEach((s, k) => {
    const line = s.line;
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
    const inert = { gain: 0, alpha: 1, beta: 0 };
    const seriesCoef = sections.map((x) => ({ gain: (x.r * (1 + x.alpha)) / 2 / denI, alpha: x.alpha, beta: x.beta }));
    const shuntCoef = branches.map((x) => ({ gain: (1 + x.alpha) / (2 * x.r) / denV, alpha: x.alpha, beta: x.beta }));
    while (seriesCoef.length < ls.series[k]) seriesCoef.push(inert);
    while (shuntCoef.length < ls.shunt[k]) shuntCoef.push(inert);
    for (const x of [...seriesCoef, ...shuntCoef]) {
      c[o++] = x.gain;
      c[o++] = x.alpha;
      c[o++] = x.beta;
    }
    // DC start: every section's inductor carries the cell current, every branch capacitor holds the node voltage.
    for (let j = 0; j < s.cells; j++) {
      for (let q = 0; q < ls.series[k]; q++) ls.currentState[ls.currentStateOffset[k] + j * ls.series[k] + q] = dc.i[s.base + 1 + j];
      if (j > 0) for (let q = 0; q < ls.shunt[k]; q++) ls.voltageState[ls.voltageStateOffset[k] + (j - 1) * ls.shunt[k] + q] = dc.v[s.base + j];
    }
  });
  return ls;
}

export function advanceLossySegment(ls: LossySegments, s: number, v: Float64Array, i: Float64Array): void {
  if (ls.series[s] === BLOCK && ls.shunt[s] === BLOCK) advanceOneBlock(ls, s, v, i);
  else advanceBlocks(ls, s, v, i);
}

/**
 * The common case, four series and four shunt terms, with the coefficients held in locals: the
 * current half step and the voltage half step are two passes, so each loop's twelve coefficients
 * stay in registers (one fused loop needs twenty-four and spills them).
 */
function advanceOneBlock(ls: LossySegments, s: number, v: Float64Array, i: Float64Array): void {
  const k = ls.coefOffset[s];
  advanceCurrentsOneBlock(ls.coef, k, ls.currentState, ls.currentStateOffset[s], ls.start[s], ls.end[s], v, i);
  advanceVoltagesOneBlock(ls.coef, k, ls.voltageState, ls.voltageStateOffset[s], ls.start[s], ls.end[s], v, i);
}

/** Current half step of every cell (node n → n+1) with its four sections, from the old voltages. */
function advanceCurrentsOneBlock(C: Float64Array, k: number, si: Float64Array, io: number, start: number, end: number, v: Float64Array, i: Float64Array): void {
  const a = C[k], b = C[k + 1];
  k += 4;
  const g0 = C[k], a0 = C[k + 1], b0 = C[k + 2], g1 = C[k + 3], a1 = C[k + 4], b1 = C[k + 5];
  const g2 = C[k + 6], a2 = C[k + 7], b2 = C[k + 8], g3 = C[k + 9], a3 = C[k + 10], b3 = C[k + 11];
  let vn = v[start];
  for (let n = start; n < end; n++, io += 4) {
    const vNext = v[n + 1];
    const old = i[n + 1];
    const s0 = si[io], s1 = si[io + 1], s2 = si[io + 2], s3 = si[io + 3];
    const now = a * old + b * (vn - vNext) + g0 * s0 + g1 * s1 + g2 * s2 + g3 * s3;
    i[n + 1] = now;
    const sum = now + old;
    si[io] = a0 * s0 + b0 * sum;
    si[io + 1] = a1 * s1 + b1 * sum;
    si[io + 2] = a2 * s2 + b2 * sum;
    si[io + 3] = a3 * s3 + b3 * sum;
    vn = vNext;
  }
}

/** Voltage half step of every interior node with its four branches, from the new currents. */
function advanceVoltagesOneBlock(C: Float64Array, k: number, sv: Float64Array, vo: number, start: number, end: number, v: Float64Array, i: Float64Array): void {
  const c = C[k + 2], d = C[k + 3];
  k += 16;
  const h0 = C[k], e0 = C[k + 1], f0 = C[k + 2], h1 = C[k + 3], e1 = C[k + 4], f1 = C[k + 5];
  const h2 = C[k + 6], e2 = C[k + 7], f2 = C[k + 8], h3 = C[k + 9], e3 = C[k + 10], f3 = C[k + 11];
  let left = i[start + 1];
  for (let n = start + 1; n < end; n++, vo += 4) {
    const right = i[n + 1];
    const old = v[n];
    const t0 = sv[vo], t1 = sv[vo + 1], t2 = sv[vo + 2], t3 = sv[vo + 3];
    const now = c * old + d * (left - right) + h0 * t0 + h1 * t1 + h2 * t2 + h3 * t3;
    v[n] = now;
    const sum = now + old;
    sv[vo] = e0 * t0 + f0 * sum;
    sv[vo + 1] = e1 * t1 + f1 * sum;
    sv[vo + 2] = e2 * t2 + f2 * sum;
    sv[vo + 3] = e3 * t3 + f3 * sum;
    left = right;
  }
}

/** Σ gain·state over one cell's terms, four at a time. */
function termSum(coef: Float64Array, co: number, state: Float64Array, so: number, count: number): number {
  let acc = 0;
  for (let q = 0; q < count; q += BLOCK) {
    const k = co + 3 * q;
    const o = so + q;
    acc += coef[k] * state[o] + coef[k + 3] * state[o + 1] + coef[k + 6] * state[o + 2] + coef[k + 9] * state[o + 3];
  }
  return acc;
}

/** x ← α·x + β·sum for one cell's terms, four at a time. */
function termUpdate(coef: Float64Array, co: number, state: Float64Array, so: number, count: number, sum: number): void {
  for (let q = 0; q < count; q += BLOCK) {
    const k = co + 3 * q;
    const o = so + q;
    state[o] = coef[k + 1] * state[o] + coef[k + 2] * sum;
    state[o + 1] = coef[k + 4] * state[o + 1] + coef[k + 5] * sum;
    state[o + 2] = coef[k + 7] * state[o + 2] + coef[k + 8] * sum;
    state[o + 3] = coef[k + 10] * state[o + 3] + coef[k + 11] * sum;
  }
}

/** Any number of blocks of terms (8 for a wide band). */
function advanceBlocks(ls: LossySegments, s: number, v: Float64Array, i: Float64Array): void {
  const start = ls.start[s];
  const end = ls.end[s];
  const ks = ls.series[s];
  const kd = ls.shunt[s];
  const co = ls.coefOffset[s];
  const { coef, currentState: si, voltageState: sv } = ls;
  const a = coef[co];
  const b = coef[co + 1];
  const c = coef[co + 2];
  const d = coef[co + 3];
  const cs = co + 4; // (gain, α, β) per section
  const cd = cs + 3 * ks; // (gain, α, β) per branch
  let io = ls.currentStateOffset[s];
  let vo = ls.voltageStateOffset[s];
  let vn = v[start];
  let left = 0;
  for (let n = start; n < end; n++) {
    const vNext = v[n + 1];
    const old = i[n + 1];
    const right = a * old + b * (vn - vNext) + termSum(coef, cs, si, io, ks);
    i[n + 1] = right;
    termUpdate(coef, cs, si, io, ks, right + old);
    io += ks;
    if (n > start) {
      const vNew = c * vn + d * (left - right) + termSum(coef, cd, sv, vo, kd);
      v[n] = vNew;
      termUpdate(coef, cd, sv, vo, kd, vNew + vn);
      vo += kd;
    }
    left = right;
    vn = vNext;
  }
}
