// Time response of a linear net by the numerical Laplace transform (a damped FFT), independent of
// the time-domain solver: it shares only the net description and the source waveform with it.
//
// v_probe(t) = v_DC + (h * Δvs)(t), where v_DC is the operating point with the source at vs(0) and
// every rail on (dc.ts), and Δvs(t) = vs(t) − vs(0) drives the chain with the rails grounded
// (superposition). The net sits at rest in its DC state at t = 0, so the response to Δvs is a
// zero-state response.
//
// Numerical Laplace transform (Wilcox 1978; Wedepohl 1983; review: Moreno & Ramirez, "Implementation
// of the numerical Laplace transform: a review", IEEE Trans. Power Delivery 23(4), 2008):
//   1. sample Δvs on a grid t_n = n·h, n = 0 … N−1 (window T = N·h, N a power of 2), times e^{−σ t_n};
//   2. FFT: the spectrum at s_k = σ + j·2πk/T;
//   3. multiply by the transfer function H(s_k) of every probe (nodal.ts);
//   4. inverse FFT, times e^{σ t_n}.
// Errors and the choice of σ:
//  - Wrap-around (time aliasing): the inverse FFT returns Σ_{p≥0} e^{−pσT}·y_T(t + pT), y_T the
//    response to Δvs cut off at T. With σ = ln(1/ε)/T the aliased copies are weighted by ε, ε², …,
//    so at every output time the wrap-around error is at most ε/(1 − ε)·max|y_T| — it does not grow
//    with t. Default ε = 1e−6, i.e. σ = ln(1e6)/T: 1 µV per volt of response.
//  - Everything else the FFT gets wrong (content of Δvs above the Nyquist limit π/h, round-off) is
//    multiplied by e^{σt} on the way back, at most ε^{−T_need/T} over the part of the window that is
//    returned. The window is padded to at least `pad` × the needed span (default 2, the least
//    allowed), which keeps that factor ≤ ε^{−1/2} = 1000 with the defaults. The grid step h is a small
//    fraction of the fastest edge (`stepsPerEdge`, default 200): the source's ramps are continuous, so
//    their content above Nyquist falls off as 1/ω², and what is left shows up as a fractional-delay
//    error at the ramps' corners, about 0.01–0.03 % of swing at 200 steps per edge (measured against
//    the lattice diagram). Both defaults were chosen from that measurement: pad 4 or ε = 1e−8 changed
//    no result by more than 1e−5 of swing.
//  - A line model must be causal (analytic in the right half-plane) for the result not to depend on
//    σ. The Hammerstad roughness factor is not (see per-length.ts): with it, results change with σ and
//    converge to the jω-axis (Fourier) answer only as σ → 0, i.e. with a larger `pad`.
// Output samples fall on the grid (h = dtSample / M for an integer M), so no interpolation is needed.
import FFT from 'fft.js';
import ndarray from 'ndarray';
import { RunRefused } from '../errors.js';
import type { Net } from '../model.js';
import type { ProbeRecord } from '../result.js';
import { fastestEdge, signalFunction } from '../signals.js';
import { compileNet } from '../circuit.js';
import { circuitEvaluator } from './nodal.js';
import { dcProbeVoltages } from './dc.js';

export interface SpectralOptions {
  /** Time between output samples (s); sample i is at t = i·dtSample. */
  dtSample: number;
  /** Number of output samples. */
  samples: number;
  /** FFT grid steps per 10–90 % time of the fastest edge (default 200). */
  stepsPerEdge?: number;
  /** Window length over the needed span, ≥ 2 (default 2). */
  pad?: number;
  /** Weight e^{−σT} of the first wrapped-around copy (default 1e−6). */
  wrapBound?: number;
  /** Largest FFT size (default 2^21); the grid is coarsened towards dtSample to fit, else RunRefused. */
  maxPoints?: number;
}

export interface SpectralPlan {
  /** FFT grid step h (s). */
  step: number;
  /** Grid steps per output sample, M = dtSample / h. */
  oversample: number;
  /** FFT size N (a power of 2). */
  points: number;
  /** Window T = N·h (s). */
  window: number;
  /** Damping σ = ln(1/ε)/T (1/s). */
  sigma: number;
  /** ε = e^{−σT}: bound on the wrap-around error relative to the response's size. */
  wrapBound: number;
  /** Span the output covers, (samples − 1)·dtSample (s). */
  needed: number;
  /** e^{σ·needed}: the largest factor by which FFT errors are multiplied in the returned span. */
  amplification: number;
}

export const DEFAULT_STEPS_PER_EDGE = 200;
export const DEFAULT_PAD = 2;
export const DEFAULT_WRAP_BOUND = 1e-6;
export const DEFAULT_MAX_POINTS = 2 ** 21;

function nextPow2(n: number): number {
  let p = 16;
  while (p < n) p *= 2;
  return p;
}

/** Chooses the FFT grid, window and damping for a run (see the header for the error bounds). */
export function planSpectral(net: Net, opts: SpectralOptions): SpectralPlan {
  const { dtSample, samples } = opts;
  if (!(dtSample > 0) || !Number.isInteger(samples) || samples < 1) {
    throw new RangeError(`spectral: need dtSample > 0 and an integer samples ≥ 1 (got ${dtSample}, ${samples})`);
  }
  const stepsPerEdge = opts.stepsPerEdge ?? DEFAULT_STEPS_PER_EDGE;
  const pad = Math.max(2, opts.pad ?? DEFAULT_PAD);
  const eps = opts.wrapBound ?? DEFAULT_WRAP_BOUND;
  const maxPoints = opts.maxPoints ?? DEFAULT_MAX_POINTS;
  if (!(eps > 0 && eps < 1)) throw new RangeError(`spectral: wrapBound must lie in (0, 1) (got ${eps})`);
  const edge = fastestEdge(net.driver.signal);
  let m = edge > 0 && Number.isFinite(edge) ? Math.max(1, Math.ceil(dtSample / (edge / stepsPerEdge) - 1e-9)) : 1;
  const sizeFor = (mm: number) => nextPow2(pad * ((samples - 1) * mm + 1));
  while (m > 1 && sizeFor(m) > maxPoints) m = Math.max(1, Math.floor(m / 2));
  const points = sizeFor(m);
  if (points > maxPoints) {
    const fitSamples = Math.floor((maxPoints - 1) / pad) + 1;
    throw new RunRefused([{ limit: 'fftPoints', needed: points, allowed: maxPoints, samples, fit: { samples: fitSamples >= 2 ? fitSamples : undefined } }], 'spectral cross-check');
  }
  const step = dtSample / m;
  const window = points * step;
  const sigma = Math.log(1 / eps) / window;
  const needed = (samples - 1) * dtSample;
  return { step, oversample: m, points, window, sigma, wrapBound: eps, needed, amplification: Math.exp(sigma * needed) };
}

export interface SpectralRun {
  plan: SpectralPlan;
  record: ProbeRecord;
  /** DC operating point of every probe (the value at t = 0). */
  dc: Float64Array;
}

/** The probe waveforms of `net` on the grid t = i·dtSample, computed in the frequency domain. */
export function spectralResponse(net: Net, opts: SpectralOptions): ProbeRecord {
  return spectralRun(net, opts).record;
}

export function spectralRun(net: Net, opts: SpectralOptions): SpectralRun {
  const plan = planSpectral(net, opts);
  const circuit = compileNet(net);
  const probes = circuit.probes.length;
  const { samples } = opts;
  const source = signalFunction(net.driver.signal);
  const v0 = source(0);
  const dc = dcProbeVoltages(circuit, [v0]);
  const values = new Float64Array(probes * samples);
  for (let p = 0; p < probes; p++) values.fill(dc[p], p * samples, (p + 1) * samples);
  const record: ProbeRecord = { names: circuit.probes.map((p) => p.name), dtSample: opts.dtSample, values: ndarray(values, [probes, samples]) };

  const { points: N, step: h, sigma, oversample: M } = plan;
  // 1. damped samples of the source's change
  const x = new Float64Array(N);
  let any = false;
  for (let n = 0; n < N; n++) {
    const t = n * h;
    const d = source(t) - v0;
    if (d !== 0) any = true;
    x[n] = d * Math.exp(-sigma * t);
  }
  if (!any || probes === 0) return { plan, record, dc };

  // 2. spectrum at s_k = σ + j2πk/T, k = 0 … N/2
  const fft = new FFT(N);
  const X = new Float64Array(2 * N);
  fft.realTransform(X, x);
  // 3. times H(s_k) for every probe
  const half = N / 2;
  const Y = new Float64Array(probes * 2 * (half + 1));
  const ev = circuitEvaluator(circuit);
  const H = new Float64Array(2 * probes);
  const dw = (2 * Math.PI) / plan.window;
  for (let k = 0; k <= half; k++) {
    ev.transfer(sigma, k * dw, H);
    const xr = X[2 * k];
    const xi = k === half ? 0 : X[2 * k + 1];
    for (let p = 0; p < probes; p++) {
      const hr = H[2 * p];
      const hi = k === half ? 0 : H[2 * p + 1]; // the Nyquist bin of a real signal is real
      const o = p * 2 * (half + 1) + 2 * k;
      Y[o] = hr * xr - hi * xi;
      Y[o + 1] = hr * xi + hi * xr;
    }
  }
  // 4. inverse FFT of the Hermitian spectrum, undo the damping, add the DC operating point
  const full = new Float64Array(2 * N);
  const y = new Float64Array(2 * N);
  for (let p = 0; p < probes; p++) {
    const o = p * 2 * (half + 1);
    for (let k = 0; k <= half; k++) {
      full[2 * k] = Y[o + 2 * k];
      full[2 * k + 1] = Y[o + 2 * k + 1];
    }
    for (let k = half + 1; k < N; k++) {
      full[2 * k] = Y[o + 2 * (N - k)];
      full[2 * k + 1] = -Y[o + 2 * (N - k) + 1];
    }
    fft.inverseTransform(y, full);
    const row = p * samples;
    for (let i = 0; i < samples; i++) {
      const n = i * M;
      values[row + i] = dc[p] + y[2 * n] * Math.exp(sigma * n * h);
    }
  }
  return { plan, record, dc };
}
