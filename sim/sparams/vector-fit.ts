// Vector fitting: a rational model with common poles for every entry of an N-port's sampled response
//   H_e(s) ≈ e^{−s·T_e}·(d_e + Σ_k r_k,e/(s − a_k))
// (B. Gustavsen and A. Semlyen, "Rational approximation of frequency domain responses by vector
// fitting", IEEE Trans. Power Delivery 14(3), 1999), in the relaxed form (B. Gustavsen, "Improving the
// pole relocating properties of vector fitting", IEEE Trans. Power Delivery 21(3), 2006) with the
// per-entry QR reduction of D. Deschrijver, B. Gustavsen and T. Dhaene, "Advancements in iterative
// methods for rational approximation in the frequency domain", IEEE Trans. Power Delivery 22(3), 2007.
//
// Each iteration finds a scaling function σ(s) = d̃ + Σ c̃_k/(s − a_k) such that σ·H_e is fitted by
// a rational function with the same poles; the zeros of σ become the new poles: the eigenvalues of
// A − b·c̃ᵀ/d̃ (A the real block-diagonal pole matrix, a complex pair as [[a′, a″], [−a″, a′]] with
// b = [2, 0]ᵀ). Unstable poles are reflected into the left half-plane. Relaxation: d̃ is free, fixed
// in scale by Re Σ_k σ(s_k) = K. Complex poles are kept in conjugate pairs throughout with real
// unknowns (c′, c″) for the pair's residue c′ + j·c″, so the model is real in the time domain.
// Frequencies are scaled by the top angular frequency ω0 inside the fit for conditioning.
//
// Delay: an electrically long entry (a through path) is fitted as e^{−sT}·R(s) with T from a straight
// line through its unwrapped phase against ω (a pure delay is a phase linear in ω; what is left over
// is smooth and needs few poles).
import { eigenvalues } from './eig.js';
import { leastSquares, type Rows } from '../lines/lsq.js';
import type { RationalModel } from './rational.js';

export interface SampledResponse {
  ports: number;
  /** Frequencies (Hz), increasing, > 0. */
  freq: ArrayLike<number>;
  /** One n×n complex matrix per frequency (re/im interleaved, row-major), as NetworkData.data. */
  data: Float64Array;
}

export interface FitOptions {
  /** Number of poles (a complex pair counts two); default 12. */
  order?: number;
  /** Pole relocation iterations (default 10). */
  iterations?: number;
  /** Per-entry delays (s, n×n row-major), or 'auto' (default) to extract them from transmission entries, or 'none'. */
  delays?: Float64Array | 'auto' | 'none';
  /** Starting poles (rad/s, re/im interleaved as RationalModel.poles); default: pairs spread over the band. */
  startPoles?: Float64Array;
}

export interface FitResult {
  model: RationalModel;
  /** Delay of each entry (s), n×n row-major. */
  delays: Float64Array;
  /** RMS of |H − fit| over all entries and frequencies. */
  rmsError: number;
  /** Largest |H − fit|, and where. */
  worstError: number;
  worstAt: { frequency: number; row: number; col: number };
  order: number;
}

/** A transmission entry is given a delay when its phase turns by more than this over the band (rad). */
const DELAY_PHASE = Math.PI;

/** Least-squares delay of each entry from its unwrapped phase (transmission entries i ≠ j only). */
export function estimateDelays(r: SampledResponse): Float64Array {
  const n = r.ports;
  const K = r.freq.length;
  const out = new Float64Array(n * n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      if (i === j) continue;
      const phi = new Float64Array(K);
      let prev = 0;
      for (let k = 0; k < K; k++) {
        const at = 2 * ((k * n + i) * n + j);
        const p = Math.atan2(r.data[at + 1], r.data[at]);
        phi[k] = k === 0 ? p : phi[k - 1] + wrap(p - prev);
        prev = p;
      }
      if (Math.abs(phi[K - 1] - phi[0]) < DELAY_PHASE) continue;
      // slope of φ = φ0 − ωT by least squares
      let sw = 0, sp = 0, sww = 0, swp = 0;
      for (let k = 0; k < K; k++) {
        const w = 2 * Math.PI * r.freq[k];
        sw += w;
        sp += phi[k];
        sww += w * w;
        swp += w * phi[k];
      }
      const slope = (K * swp - sw * sp) / (K * sww - sw * sw);
      out[i * n + j] = Math.max(0, -slope);
    }
  return out;
}

function wrap(d: number): number {
  return d - 2 * Math.PI * Math.round(d / (2 * Math.PI));
}

/** Starting poles (normalized): pairs −β/100 ± jβ with β spread linearly over the band, one real pole if the order is odd. */
function startingPoles(order: number, wmin: number): Float64Array {
  const pairs = Math.floor(order / 2);
  const out: number[] = [];
  for (let m = 0; m < pairs; m++) {
    const beta = wmin + ((1 - wmin) * (m + 0.5)) / pairs;
    out.push(-beta / 100, beta);
  }
  if (order % 2 === 1) out.push(-Math.max(wmin, 0.01), 0);
  return Float64Array.from(out);
}

/** Real basis columns at s = jω: per real pole 1/(s − a); per pair 1/(s − a) + 1/(s − ā) and j/(s − a) − j/(s − ā). */
function basis(poles: Float64Array, w: number, out: Float64Array): void {
  let col = 0;
  for (let k = 0; k < poles.length / 2; k++) {
    const ar = poles[2 * k];
    const ai = poles[2 * k + 1];
    // 1/(jω − a) = (−ar − j(ω − ai))/|.|²
    const d1 = ar * ar + (w - ai) * (w - ai);
    const p1r = -ar / d1;
    const p1i = -(w - ai) / d1;
    if (ai === 0) {
      out[2 * col] = p1r;
      out[2 * col + 1] = p1i;
      col++;
      continue;
    }
    const d2 = ar * ar + (w + ai) * (w + ai);
    const p2r = -ar / d2;
    const p2i = -(w + ai) / d2;
    out[2 * col] = p1r + p2r;
    out[2 * col + 1] = p1i + p2i;
    // j·p1 − j·p2
    out[2 * col + 2] = -p1i + p2i;
    out[2 * col + 3] = p1r - p2r;
    col += 2;
  }
}

/** The entries' responses with their delays removed: H_e(jω)·e^{jωT_e}, per entry a K-long complex array. */
function delayRemoved(r: SampledResponse, delays: Float64Array): Float64Array[] {
  const n = r.ports;
  const K = r.freq.length;
  const out: Float64Array[] = [];
  for (let e = 0; e < n * n; e++) {
    const h = new Float64Array(2 * K);
    for (let k = 0; k < K; k++) {
      const at = 2 * (k * n * n + e);
      const th = 2 * Math.PI * r.freq[k] * delays[e];
      const c = Math.cos(th), s = Math.sin(th);
      h[2 * k] = r.data[at] * c - r.data[at + 1] * s;
      h[2 * k + 1] = r.data[at] * s + r.data[at + 1] * c;
    }
    out.push(h);
  }
  return out;
}

/** Fits a common-pole rational model to every entry of `r`. */
export function vectorFit(r: SampledResponse, opts: FitOptions = {}): FitResult {
  const K = r.freq.length;
  const n = r.ports;
  const order = opts.order ?? 12;
  if (K < 2) throw new RangeError('vector fitting needs at least two frequencies');
  if (2 * K * n * n < order + 1) throw new RangeError(`${K} frequencies are too few for ${order} poles`);
  const w0 = 2 * Math.PI * r.freq[K - 1];
  const ws = Float64Array.from(r.freq, (f) => (2 * Math.PI * f) / w0);
  const delays = opts.delays instanceof Float64Array ? opts.delays : opts.delays === 'none' ? new Float64Array(n * n) : estimateDelays(r);
  const h = delayRemoved(r, delays);
  let poles = opts.startPoles ? opts.startPoles.map((v) => v / w0) : startingPoles(order, ws[0]);
  for (let it = 0; it < (opts.iterations ?? 10); it++) poles = relocate(poles, ws, h);
  const { residues, d } = fitResidues(poles, ws, h, n);
  const model: RationalModel = {
    ports: n,
    poles: poles.map((v) => v * w0),
    residues: residues.map((v) => v * w0),
    d,
  };
  return { ...fitErrors(r, model, delays), model, delays, order: modelOrderOf(poles) };
}

function modelOrderOf(poles: Float64Array): number {
  let n = 0;
  for (let k = 0; k < poles.length / 2; k++) n += poles[2 * k + 1] === 0 ? 1 : 2;
  return n;
}

/** One relaxed pole relocation: returns the zeros of σ, reflected into the left half-plane. */
function relocate(poles: Float64Array, ws: Float64Array, h: Float64Array[]): Float64Array {
  const N = modelOrderOf(poles);
  const K = ws.length;
  const phi = new Float64Array(2 * N);
  const rows: Rows = [];
  // Σ_k Re σ(s_k) = K, weighted like the data
  let norm = 0;
  for (const he of h) for (const v of he) norm += v * v;
  const weight = Math.sqrt(norm) / K;
  const relax = new Array<number>(N + 1).fill(0);
  relax[N] = K * weight;
  for (let k = 0; k < K; k++) {
    basis(poles, ws[k], phi);
    for (let c = 0; c < N; c++) relax[c] += weight * phi[2 * c];
  }
  for (const he of h) rows.push(...sigmaRows(phi, poles, ws, he, N));
  rows.push(relax);
  const b = new Array<number>(rows.length).fill(0);
  b[b.length - 1] = K * weight;
  const x = leastSquares(rows, b);
  let dt = x[N];
  if (Math.abs(dt) < 1e-8) dt = dt < 0 ? -1e-8 : 1e-8; // a vanishing d̃ would make the zeros meaningless (Gustavsen 2006)
  return zerosOfSigma(poles, x.slice(0, N), dt);
}

/**
 * The rows an entry contributes to σ's unknowns after eliminating its own (c_e, d_e): the lower-right
 * block R22 of the QR factorization of [Φ, 1, −H·Φ, −H] (real and imaginary parts as rows).
 */
function sigmaRows(phi: Float64Array, poles: Float64Array, ws: Float64Array, he: Float64Array, N: number): number[][] {
  const K = ws.length;
  const m = 2 * K;
  const cols = 2 * (N + 1);
  const a = new Float64Array(m * cols); // column-major
  for (let k = 0; k < K; k++) {
    basis(poles, ws[k], phi);
    const hr = he[2 * k], hi = he[2 * k + 1];
    for (let c = 0; c < N; c++) {
      const pr = phi[2 * c], pi = phi[2 * c + 1];
      a[c * m + 2 * k] = pr;
      a[c * m + 2 * k + 1] = pi;
      // −H·φ
      a[(N + 1 + c) * m + 2 * k] = -(hr * pr - hi * pi);
      a[(N + 1 + c) * m + 2 * k + 1] = -(hr * pi + hi * pr);
    }
    a[N * m + 2 * k] = 1;
    a[N * m + 2 * k + 1] = 0;
    a[(2 * N + 1) * m + 2 * k] = -hr;
    a[(2 * N + 1) * m + 2 * k + 1] = -hi;
  }
  const R = householderR(a, m, cols);
  const out: number[][] = [];
  for (let i = N + 1; i < Math.min(cols, m); i++) {
    const row = new Array<number>(N + 1);
    for (let j = 0; j <= N; j++) row[j] = R[i * cols + N + 1 + j];
    out.push(row);
  }
  return out;
}

/** The upper-triangular R (cols × cols, row-major) of the QR factorization of a column-major m × cols matrix. */
function householderR(a: Float64Array, m: number, cols: number): Float64Array {
  const steps = Math.min(m, cols);
  for (let k = 0; k < steps; k++) {
    const ck = k * m;
    let norm = 0;
    for (let i = k; i < m; i++) norm += a[ck + i] * a[ck + i];
    norm = Math.sqrt(norm);
    if (norm === 0) continue;
    const alpha = a[ck + k] > 0 ? -norm : norm;
    const v0 = a[ck + k] - alpha;
    // v = [v0, a[k+1..]], vᵀv = v0² + (norm² − a_kk²)
    const vv = v0 * v0 + (norm * norm - a[ck + k] * a[ck + k]);
    a[ck + k] = alpha;
    if (vv === 0) continue;
    for (let j = k + 1; j < cols; j++) {
      const cj = j * m;
      let d = v0 * a[cj + k];
      for (let i = k + 1; i < m; i++) d += a[ck + i] * a[cj + i];
      const f = (2 * d) / vv;
      a[cj + k] -= f * v0;
      for (let i = k + 1; i < m; i++) a[cj + i] -= f * a[ck + i];
    }
    for (let i = k + 1; i < m; i++) a[ck + i] = 0;
  }
  const R = new Float64Array(cols * cols);
  for (let i = 0; i < steps; i++) for (let j = i; j < cols; j++) R[i * cols + j] = a[j * m + i];
  return R;
}

/** Zeros of σ(s) = d̃ + Σ c̃·basis: eigenvalues of A − b·c̃ᵀ/d̃, unstable ones reflected, as stored poles. */
function zerosOfSigma(poles: Float64Array, ct: number[], dt: number): Float64Array {
  const N = ct.length;
  const A = new Float64Array(N * N);
  const b = new Float64Array(N);
  let col = 0;
  for (let k = 0; k < poles.length / 2; k++) {
    const ar = poles[2 * k];
    const ai = poles[2 * k + 1];
    if (ai === 0) {
      A[col * N + col] = ar;
      b[col] = 1;
      col++;
    } else {
      A[col * N + col] = ar;
      A[col * N + col + 1] = ai;
      A[(col + 1) * N + col] = -ai;
      A[(col + 1) * N + col + 1] = ar;
      b[col] = 2;
      col += 2;
    }
  }
  for (let i = 0; i < N; i++) for (let j = 0; j < N; j++) A[i * N + j] -= (b[i] * ct[j]) / dt;
  const z = eigenvalues(A, N);
  return storedPoles(z);
}

/** Eigenvalues → stored poles: stable (Re < 0), a pair by its member with Im > 0, real ones with Im = 0. */
export function storedPoles(z: Float64Array): Float64Array {
  const out: number[] = [];
  const m = z.length / 2;
  const reals: number[] = [];
  const uppers: Array<[number, number]> = [];
  for (let k = 0; k < m; k++) {
    let re = z[2 * k];
    const im = z[2 * k + 1];
    if (re > 0) re = -re; // reflect an unstable pole (Gustavsen & Semlyen 1999, §III)
    if (re === 0) re = -1e-12;
    if (Math.abs(im) <= 1e-9 * Math.hypot(re, im)) reals.push(re);
    else if (im > 0) uppers.push([re, im]);
  }
  if (reals.length + 2 * uppers.length !== m) throw new Error('vector fitting: the relocated poles do not form conjugate pairs');
  for (const [re, im] of uppers) out.push(re, im);
  for (const re of reals) out.push(re, 0);
  return Float64Array.from(out);
}

/** Residues and direct terms of every entry by linear least squares with the poles fixed. */
function fitResidues(poles: Float64Array, ws: Float64Array, h: Float64Array[], n: number): { residues: Float64Array; d: Float64Array } {
  const N = modelOrderOf(poles);
  const K = ws.length;
  const stored = poles.length / 2;
  const residues = new Float64Array(2 * stored * n * n);
  const d = new Float64Array(n * n);
  const phi = new Float64Array(2 * N);
  const rows: Rows = [];
  for (let k = 0; k < K; k++) {
    basis(poles, ws[k], phi);
    const re = new Array<number>(N + 1);
    const im = new Array<number>(N + 1);
    for (let c = 0; c < N; c++) {
      re[c] = phi[2 * c];
      im[c] = phi[2 * c + 1];
    }
    re[N] = 1;
    im[N] = 0;
    rows.push(re, im);
  }
  h.forEach((he, e) => {
    const x = leastSquares(rows, Array.from(he));
    let col = 0;
    for (let k = 0; k < stored; k++) {
      const at = 2 * (k * n * n + e);
      if (poles[2 * k + 1] === 0) {
        residues[at] = x[col++];
      } else {
        residues[at] = x[col++];
        residues[at + 1] = x[col++];
      }
    }
    d[e] = x[N];
  });
  return { residues, d };
}

/** The fitted response at jω (with delays) into out (n×n complex). */
export function evaluateFit(model: RationalModel, delays: Float64Array, omega: number, out: Float64Array): void {
  const n = model.ports;
  const nn = n * n;
  for (let e = 0; e < nn; e++) {
    out[2 * e] = model.d[e];
    out[2 * e + 1] = 0;
  }
  for (let k = 0; k < model.poles.length / 2; k++) {
    const ar = model.poles[2 * k];
    const ai = model.poles[2 * k + 1];
    const d1 = ar * ar + (omega - ai) * (omega - ai);
    const d2 = ar * ar + (omega + ai) * (omega + ai);
    for (let e = 0; e < nn; e++) {
      const rr = model.residues[2 * (k * nn + e)];
      const ri = model.residues[2 * (k * nn + e) + 1];
      // r/(jω − a) with jω − a = −ar + j(ω − ai)
      out[2 * e] += (rr * -ar + ri * (omega - ai)) / d1;
      out[2 * e + 1] += (ri * -ar - rr * (omega - ai)) / d1;
      if (ai !== 0) {
        // r̄/(jω − ā), jω − ā = −ar + j(ω + ai)
        out[2 * e] += (rr * -ar - ri * (omega + ai)) / d2;
        out[2 * e + 1] += (-ri * -ar - rr * (omega + ai)) / d2;
      }
    }
  }
  for (let e = 0; e < nn; e++) {
    if (delays[e] === 0) continue;
    const th = -omega * delays[e];
    const c = Math.cos(th), s = Math.sin(th);
    const xr = out[2 * e], xi = out[2 * e + 1];
    out[2 * e] = xr * c - xi * s;
    out[2 * e + 1] = xr * s + xi * c;
  }
}

function fitErrors(r: SampledResponse, model: RationalModel, delays: Float64Array): Pick<FitResult, 'rmsError' | 'worstError' | 'worstAt'> {
  const n = r.ports;
  const nn = n * n;
  const out = new Float64Array(2 * nn);
  let sum = 0;
  let worst = 0;
  let worstAt = { frequency: r.freq[0], row: 0, col: 0 };
  for (let k = 0; k < r.freq.length; k++) {
    evaluateFit(model, delays, 2 * Math.PI * r.freq[k], out);
    for (let e = 0; e < nn; e++) {
      const at = 2 * (k * nn + e);
      const err = Math.hypot(out[2 * e] - r.data[at], out[2 * e + 1] - r.data[at + 1]);
      sum += err * err;
      if (err > worst) {
        worst = err;
        worstAt = { frequency: r.freq[k], row: Math.floor(e / n), col: e % n };
      }
    }
  }
  return { rmsError: Math.sqrt(sum / (r.freq.length * nn)), worstError: worst, worstAt };
}
