// Switching coefficients from voltage–time waveforms into their fixtures. At every instant of an edge
// the die's current balance into a fixture (R_f to V_f, C_f at the pin) reads
//     k_u(t)·I_pu(V_s − V(t)) + k_d(t)·I_pd(V(t)) = (V_f − V(t))/R_f − (C_comp + C_f)·dV/dt − I_clamps(V(t)),
// one linear equation in k_u and k_d per waveform. Two waveforms of the same edge into different
// fixtures give two equations, solved for k_u(t) and k_d(t) at each instant — the two-equation method
// (Y. Wang and H. N. Tan, "The development of analog SPICE behavioral model based on IBIS model",
// Proc. 9th Great Lakes Symposium on VLSI, 1999; bibliographic details from memory). With one waveform
// the coefficients are taken complementary, k_u + k_d = 1 (common practice), and an open-drain model
// (no pull-up) solves k_d alone. The model then reproduces its waveforms into their own fixtures.
import { bufferCurrent, bufferScratch, type BufferModel } from './buffer.js';
import { ivAt, ivPoint } from './iv-table.js';
import { waveformAt, type VtWaveform } from './fixture.js';
import type { SwitchingCurve } from './switching.js';

export interface FitResult {
  curve: SwitchingCurve;
  /** Instants where the two equations were (nearly) dependent and a fallback was used, as a count. */
  fallbacks: number;
  method: 'two waveforms' | 'one waveform, k_u + k_d = 1' | 'one waveform, pull-down only';
}

/** The waveform's slope at t by a central difference of width 2h (the waveform held outside its table). */
function slopeAt(w: VtWaveform, t: number, h: number): number {
  return (waveformAt(w, t + h) - waveformAt(w, t - h)) / (2 * h);
}

/** Right-hand side b(t) of a waveform's equation: fixture current less capacitive and clamp currents. */
function rhs(m: BufferModel, w: VtWaveform, v: number, dvdt: number): number {
  const clamps = bufferCurrent(m, v, 0, 0, bufferScratch(), ivPoint()).i;
  return (w.fixture.v - v) / w.fixture.r - (m.cComp + w.fixture.c) * dvdt - clamps;
}

/** Pull-up and pull-down currents at pin voltage v (0 where the model has no such table). */
function stageCurrents(m: BufferModel, v: number): [number, number] {
  return [m.pullup ? ivAt(m.pullup, m.supply - v) : 0, m.pulldown ? ivAt(m.pulldown, v - m.ground) : 0];
}

/** Samples of the edge: uniform over the longest waveform, at least 401 and twice the densest table. */
function grid(waves: readonly VtWaveform[]): { t0: number; t1: number; n: number } {
  const t0 = Math.min(0, ...waves.map((w) => w.t[0]));
  const t1 = Math.max(...waves.map((w) => w.t[w.t.length - 1]));
  const n = Math.min(4001, Math.max(401, 2 * Math.max(...waves.map((w) => w.t.length)) + 1));
  return { t0, t1, n };
}

/** The two waveforms whose fixture voltages differ most (the best-conditioned pair). */
function pickPair(waves: readonly VtWaveform[]): [VtWaveform, VtWaveform] {
  let best: [VtWaveform, VtWaveform] = [waves[0], waves[1]];
  let spread = -1;
  for (let a = 0; a < waves.length; a++) {
    for (let b = a + 1; b < waves.length; b++) {
      const d = Math.abs(waves[a].fixture.v - waves[b].fixture.v) + 1e-9 * Math.abs(waves[a].fixture.r - waves[b].fixture.r);
      if (d > spread) {
        spread = d;
        best = [waves[a], waves[b]];
      }
    }
  }
  return best;
}

/** Switching coefficients of one edge from its waveforms (times measured from the edge's start). */
export function coefficientsFromWaveforms(m: BufferModel, waves: readonly VtWaveform[]): FitResult {
  if (waves.length === 0) throw new RangeError(`model "${m.name}": no waveform to fit`);
  const { t0, t1, n } = grid(waves);
  const dtau = (t1 - t0) / (n - 1);
  const ku = new Float64Array(n);
  const kd = new Float64Array(n);
  const two = waves.length >= 2 && m.pullup !== undefined && m.pulldown !== undefined;
  const pair = two ? pickPair(waves) : [waves[0], waves[0]];
  const method: FitResult['method'] = two ? 'two waveforms' : m.pullup ? 'one waveform, k_u + k_d = 1' : 'one waveform, pull-down only';
  let fallbacks = 0;
  let prevU = 0;
  let prevD = 0;
  for (let k = 0; k < n; k++) {
    const t = t0 + k * dtau;
    const [w1, w2] = pair;
    const v1 = waveformAt(w1, t);
    const b1 = rhs(m, w1, v1, slopeAt(w1, t, dtau));
    const [u1, d1] = stageCurrents(m, v1);
    let u = NaN;
    let d = NaN;
    if (two) {
      const v2 = waveformAt(w2, t);
      const b2 = rhs(m, w2, v2, slopeAt(w2, t, dtau));
      const [u2, d2] = stageCurrents(m, v2);
      const det = u1 * d2 - u2 * d1;
      if (Math.abs(det) > 1e-6 * (Math.abs(u1 * d2) + Math.abs(u2 * d1))) {
        u = (b1 * d2 - b2 * d1) / det;
        d = (u1 * b2 - u2 * b1) / det;
      }
    }
    if (!Number.isFinite(u) || !Number.isFinite(d)) {
      if (two) fallbacks++;
      if (m.pullup && Math.abs(u1 - d1) > 1e-12) {
        u = (b1 - d1) / (u1 - d1);
        d = 1 - u;
      } else if (!m.pullup && Math.abs(d1) > 1e-12) {
        u = 0;
        d = b1 / d1;
      } else {
        u = prevU;
        d = prevD;
      }
    }
    ku[k] = prevU = u;
    kd[k] = prevD = d;
  }
  return { curve: { dtau, ku, kd }, fallbacks, method };
}
