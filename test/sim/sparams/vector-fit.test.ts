// Vector fitting recovers known rational functions; passivity is checked on data and on fits.
import { describe, expect, it } from 'vitest';
import { evaluateModel, type RationalModel } from '../../../sim/sparams/rational.js';
import { estimateDelays, evaluateFit, vectorFit, type SampledResponse } from '../../../sim/sparams/vector-fit.js';
import { passivityOfData, passivityOfFit } from '../../../sim/sparams/passivity.js';
import { routeSParameters } from '../../../sim/sparams/route.js';
import { gridFrequencies } from '../../../sim/sparams/grid.js';
import type { NetworkData } from '../../../sim/sparams/network.js';
import { lineOf, net, part, stepSignal } from '../../support/nets.js';

const TWO_PI = 2 * Math.PI;

/** A 2-port with common poles: one real, three complex pairs (rad/s); residues and D per entry. */
function knownModel(): RationalModel {
  const poles = Float64Array.of(-2e9, 0, -3e8, TWO_PI * 1e9, -5e8, TWO_PI * 3e9, -1e9, TWO_PI * 6e9);
  const residues = new Float64Array(2 * 4 * 4);
  for (let k = 0; k < 4; k++)
    for (let e = 0; e < 4; e++) {
      residues[2 * (k * 4 + e)] = 1e8 * (1 + k + 0.5 * e) * (e === 2 ? -1 : 1);
      residues[2 * (k * 4 + e) + 1] = k === 0 ? 0 : 2e8 * Math.cos(1 + k + e);
    }
  return { ports: 2, poles, residues, d: Float64Array.of(0.1, 0.02, 0.02, -0.05) };
}

function sample(model: RationalModel, freq: Float64Array): SampledResponse {
  const data = new Float64Array(8 * freq.length);
  const out = new Float64Array(8);
  freq.forEach((f, k) => data.set(evaluateModel(model, TWO_PI * f, out), 8 * k));
  return { ports: 2, freq, data };
}

function sortedPoles(p: Float64Array): Array<[number, number]> {
  const out: Array<[number, number]> = [];
  for (let k = 0; k < p.length; k += 2) out.push([p[k], p[k + 1]]);
  return out.sort((a, b) => a[1] - b[1] || a[0] - b[0]);
}

describe('vectorFit', () => {
  it('recovers the poles, residues and direct terms of a known 7th-order 2-port to 1e-8 relative', () => {
    // Gustavsen & Semlyen 1999: with the right order and noise-free data the poles converge to the true ones.
    const model = knownModel();
    const freq = gridFrequencies({ fmax: 10e9, points: 300, spacing: 'linear' });
    const fit = vectorFit(sample(model, freq), { order: 7, delays: 'none', iterations: 12 });
    const want = sortedPoles(model.poles);
    const got = sortedPoles(fit.model.poles);
    expect(got.length).toBe(want.length);
    got.forEach(([re, im], k) => {
      const scale = Math.hypot(want[k][0], want[k][1]);
      expect(Math.hypot(re - want[k][0], im - want[k][1]) / scale).toBeLessThan(1e-8);
    });
    // residues: match each fitted pole to the true one
    for (let k = 0; k < 4; k++) {
      const j = sortedIndex(fit.model.poles, model.poles[2 * k], model.poles[2 * k + 1]);
      for (let e = 0; e < 4; e++) {
        const wr = model.residues[2 * (k * 4 + e)], wi = model.residues[2 * (k * 4 + e) + 1];
        const gr = fit.model.residues[2 * (j * 4 + e)], gi = fit.model.residues[2 * (j * 4 + e) + 1];
        expect(Math.hypot(gr - wr, gi - wi) / Math.hypot(wr, wi)).toBeLessThan(1e-8);
      }
    }
    for (let e = 0; e < 4; e++) expect(Math.abs(fit.model.d[e] - model.d[e])).toBeLessThan(1e-8 * Math.abs(model.d[e]));
    expect(fit.worstError).toBeLessThan(1e-10);
    expect(fit.order).toBe(7);
  });

  it('keeps every pole stable even when the data has an unstable one (reflected, Gustavsen & Semlyen 1999 §III)', () => {
    const model = knownModel();
    model.poles[2] = +3e8; // pair −3e8 ± j2π·1 GHz made unstable
    const freq = gridFrequencies({ fmax: 10e9, points: 200, spacing: 'linear' });
    const fit = vectorFit(sample(model, freq), { order: 7, delays: 'none' });
    for (let k = 0; k < fit.model.poles.length; k += 2) expect(fit.model.poles[k]).toBeLessThan(0);
  });

  it('extracts the delay of an electrically long matched line and fits the rest with few poles', () => {
    // 50 Ω line with series loss, 2 ns long, in a 50 Ω system: S21 ≈ e^{−γℓ}, phase −ω·TD (Pozar ch. 2)
    const td = 2e-9;
    const n = net({ signal: stepSignal(1, 100e-12), rs: 50, route: [{ kind: 'line', name: 'cable', line: lineOf(50, td / 0.4, 3), length: 0.4 }] });
    const freq = gridFrequencies({ fmax: 5e9, points: 400, spacing: 'linear' });
    const s = routeSParameters(n, freq, 50);
    const delays = estimateDelays(s);
    expect(Math.abs(delays[2] - td) / td).toBeLessThan(0.01); // S21 (row 1, col 0)
    expect(delays[0]).toBe(0); // reflections keep no delay
    const fit = vectorFit(s, { order: 6 });
    expect(fit.worstError).toBeLessThan(2e-3);
    // the same order without the delay cannot follow the 10 turns of S21's phase
    expect(vectorFit(s, { order: 6, delays: 'none' }).worstError).toBeGreaterThan(0.1);
  });
});

describe('passivity', () => {
  const via = () =>
    routeSParameters(
      net({
        signal: stepSignal(1, 100e-12),
        rs: 50,
        route: [
          { kind: 'line', name: 'a', line: lineOf(50, 6e-9, 5), length: 0.02 },
          { kind: 'shunt', name: 'via', parts: [part({ c: 0.5e-12 })] },
          { kind: 'line', name: 'b', line: lineOf(50, 6e-9, 5), length: 0.02 },
        ],
      }),
      gridFrequencies({ fmax: 10e9, points: 200, spacing: 'linear' }),
      50,
    );

  it('passes a lossy via (σ < 1, Pozar §4.3) and flags the same data with S21, S12 raised 10 %, naming the worst frequency', () => {
    const good = via();
    const ok = passivityOfData(good);
    expect(ok.passive).toBe(true);
    expect(ok.margin).toBeGreaterThan(0);
    const bad: NetworkData = { ...good, data: Float64Array.from(good.data) };
    for (let k = 0; k < bad.freq.length; k++) for (const at of [2, 3, 4, 5]) bad.data[8 * k + at] *= 1.1;
    const r = passivityOfData(bad);
    expect(r.passive).toBe(false);
    expect(r.margin).toBeLessThan(0);
    expect(r.worstSigma).toBeGreaterThan(1.05);
    // where |S11| is smallest the raised S21 dominates: the worst point is at the low end
    expect(r.worstFrequency).toBeLessThan(2e9);
  });

  it('finds a fit bulging above 1 between its samples that the samples alone do not show', () => {
    // one sharp resonance (Q = 500) at 1.0525 GHz, between samples every 100 MHz: |S21| peaks at 1.2
    const a = Float64Array.of(-TWO_PI * 1.0525e9 / 1000, TWO_PI * 1.0525e9);
    const r21 = 1.2 * -a[0]; // |r/(jω − a)| at ω = Im a is |r|/|Re a|
    const residues = Float64Array.of(0, 0, r21, 0, r21, 0, 0, 0);
    const fit = { model: { ports: 2, poles: a, residues, d: new Float64Array(4) }, delays: new Float64Array(4), rmsError: 0, worstError: 0, worstAt: { frequency: 0, row: 0, col: 0 }, order: 2 };
    const freq = gridFrequencies({ fmax: 2e9, points: 20, spacing: 'linear' });
    const data = new Float64Array(8 * freq.length);
    const out = new Float64Array(8);
    freq.forEach((f, k) => {
      evaluateFit(fit.model, fit.delays, TWO_PI * f, out);
      data.set(out, 8 * k);
    });
    expect(passivityOfData({ ports: 2, freq, kind: 'S', data, reference: Float64Array.of(50, 50) }).passive).toBe(true);
    const r = passivityOfFit(fit, freq, 40);
    expect(r.passive).toBe(false);
    expect(Math.abs(r.worstFrequency - 1.0525e9)).toBeLessThan(3e6);
    expect(r.worstSigma).toBeGreaterThan(1.15);
  });
});

function sortedIndex(poles: Float64Array, re: number, im: number): number {
  let best = 0;
  let bd = Infinity;
  for (let k = 0; k < poles.length / 2; k++) {
    const d = Math.hypot(poles[2 * k] - re, poles[2 * k + 1] - im);
    if (d < bd) {
      bd = d;
      best = k;
    }
  }
  return best;
}
