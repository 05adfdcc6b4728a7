// An independent frequency-domain solution of a coupled section between resistive ends (the same ends
// as coupled-bench.ts): the section's modal 2k-port admittance (sim/coupled/spectral.ts) plus the end
// conductances, a nodal solve per frequency, and the numerical Laplace transform (a damped FFT; Wilcox
// 1978, reviewed by Moreno & Ramirez, IEEE Trans. Power Delivery 23(4), 2008) back to time.
import FFT from 'fft.js';
import { csolve, czeros } from '../../sim/coupled/cmatrix.js';
import type { CoupledLine } from '../../sim/coupled/line.js';
import { coupledAdmittance, coupledPerLength } from '../../sim/coupled/spectral.js';
import type { EndSpec } from './coupled-bench.js';

export interface SpectralTraces {
  near: Float64Array[];
  far: Float64Array[];
}

/** Voltages at both ends at t = i·dtSample, i < samples, for sources starting from rest. */
/**
 * `oversample` grid steps per output sample; the window is `pad` × the span returned, and the damping
 * σ = ln(10⁶)/window keeps the wrapped-around copies below 10⁻⁶ of the response.
 */
export function coupledSpectral(line: CoupledLine, length: number, near: EndSpec, far: EndSpec, dtSample: number, samples: number, oversample = 2, pad = 2): SpectralTraces {
  const { k } = line;
  const n = 2 * k;
  const h = dtSample / oversample;
  let N = 16;
  while (N < pad * samples * oversample) N *= 2;
  const window = N * h;
  const sigma = Math.log(1e6) / window;
  const fft = new FFT(N);
  const ends = [near, far];
  // damped spectrum of every source, per port
  const spectra: (Float64Array | null)[] = [];
  for (const spec of ends)
    for (let c = 0; c < k; c++) {
      const src = spec.sources?.[c];
      if (!src || spec.toReturn[c] === Infinity) {
        spectra.push(null);
        continue;
      }
      const x = new Float64Array(N);
      for (let m = 0; m < N; m++) x[m] = src(m * h) * Math.exp(-sigma * m * h);
      const X = new Float64Array(2 * N);
      fft.realTransform(X, x);
      fft.completeSpectrum(X);
      spectra.push(X);
    }
  const g = new Float64Array(n * n); // end conductances
  ends.forEach((spec, side) => {
    spec.toReturn.forEach((r, c) => {
      if (r !== Infinity) g[(side * k + c) * (n + 1)] += 1 / r;
    });
    for (const x of spec.across ?? []) {
      const a = side * k + x.a;
      const b = side * k + x.b;
      g[a * n + a] += 1 / x.r;
      g[b * n + b] += 1 / x.r;
      g[a * n + b] -= 1 / x.r;
      g[b * n + a] -= 1 / x.r;
    }
  });
  const volts = Array.from({ length: n }, () => new Float64Array(2 * N));
  const half = N / 2;
  for (let q = 0; q <= half; q++) {
    const s = { re: sigma, im: (2 * Math.PI * q) / window };
    const { z, y } = coupledPerLength(line, s);
    const yy = coupledAdmittance(z, y, k, length);
    for (let e = 0; e < n * n; e++) yy.re[e] += g[e];
    const j = czeros(n);
    spectra.forEach((X, port) => {
      if (!X) return;
      const r = ends[Math.floor(port / k)].toReturn[port % k];
      j.re[port] = X[2 * q] / r;
      j.im[port] = X[2 * q + 1] / r;
    });
    const v = csolve(yy, j, n, 1);
    for (let p = 0; p < n; p++) {
      volts[p][2 * q] = v.re[p];
      volts[p][2 * q + 1] = q === half ? 0 : v.im[p];
      if (q > 0 && q < half) {
        volts[p][2 * (N - q)] = v.re[p];
        volts[p][2 * (N - q) + 1] = -v.im[p];
      }
    }
  }
  const out = new Float64Array(2 * N);
  const traces = volts.map((spectrum) => {
    fft.inverseTransform(out, spectrum);
    return Float64Array.from({ length: samples }, (_, i) => out[2 * i * oversample] * Math.exp(sigma * i * oversample * h));
  });
  return { near: traces.slice(0, k), far: traces.slice(k) };
}
