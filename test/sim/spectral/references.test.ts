// The spectral solver against outside references (source named beside each check). Tolerances are
// in percent of the source swing at every output sample unless stated otherwise.
import { describe, expect, it } from 'vitest';
import type { Net } from '../../../sim/model.js';
import { rampDuration, signalFunction } from '../../../sim/signals.js';
import { dcOperatingPoint } from '../../../sim/spectral/dc.js';
import { spectralResponse, spectralRun } from '../../../sim/spectral/response.js';
import { latticeVoltage } from '../../support/lattice.js';
import { lineOf, net, part, stepSignal } from '../../support/nets.js';
import { probeTrace, type ProbeRecord } from '../../../sim/result.js';

const Z0 = 50;
const TPD = 6e-9; // s/m

/** Largest |record row − exact(t)| over all samples. */
function worstError(record: ProbeRecord, p: number, dts: number, exact: (t: number) => number): number {
  const v = probeTrace(record, p);
  let worst = 0;
  for (let i = 0; i < v.length; i++) worst = Math.max(worst, Math.abs(v[i] - exact(i * dts)));
  return worst;
}

describe('lossless matched line', () => {
  // Source and load both equal to Z0: the driver pin sits at vs/2 and the receiver sees the source
  // halved and delayed by TD = ℓ·√(L′C′), with no reflection (any transmission-line text, e.g. Pozar,
  // Microwave Engineering, ch. 2). Tolerance 0.05 % of swing; the length makes TD fall between FFT
  // grid points, so the check includes the fractional-delay error of the method.
  it('delivers vs(t − TD)/2 at the receiver within 0.05 % of swing', () => {
    const length = 0.1234;
    const signal = stepSignal(1, 100e-12, 0.3e-9);
    const src = signalFunction(signal);
    const dts = 5e-12;
    const rec = spectralResponse(
      net({ signal, rs: Z0, route: [{ kind: 'line', name: 't', line: lineOf(Z0, TPD), length }], receiver: [part({ r: Z0 })] }),
      { dtSample: dts, samples: 1201 },
    );
    expect(rec.names).toEqual(['driver', 'receiver']);
    expect(rec.values.shape).toEqual([2, 1201]);
    expect(worstError(rec, 0, dts, (t) => src(t) / 2)).toBeLessThan(0.0005);
    expect(worstError(rec, 1, dts, (t) => src(t - length * TPD) / 2)).toBeLessThan(0.0005);
  });
});

describe('lossless line with resistive ends against the lattice diagram', () => {
  // Bounce (lattice) diagram: V(x,t) = a·Σ (ΓsΓl)^n [vs(t − x/v − 2nT) + Γl·vs(t − 2T + x/v − 2nT)]
  // (Pozar, Microwave Engineering, ch. 2; reference implementation test/support/lattice.ts).
  // Source end, 37 % along the line and load end, within 0.1 % of swing over 20 round trips.
  const cases = [
    { name: 'Rs < Z0, open load', rs: 10, rl: Infinity },
    { name: 'Rs > Z0, shorted load', rs: 200, rl: 0 },
    { name: 'Rs < Z0, load > Z0', rs: 25, rl: 100 },
    { name: 'Rs > Z0, load < Z0', rs: 90, rl: 15 },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const length = 0.1234;
      const signal = stepSignal(1, 100e-12, 0.3e-9);
      const dts = 10e-12;
      const rec = spectralResponse(
        net({
          signal,
          rs: c.rs,
          route: [{ kind: 'line', name: 't', line: lineOf(Z0, TPD), length }],
          receiver: c.rl === Infinity ? [] : [part({ r: c.rl })],
          probes: [
            { name: 'src', at: 'driver' },
            { name: 'x37', at: 'line', item: 't', position: 0.37 * length },
            { name: 'load', at: 'receiver' },
          ],
        }),
        { dtSample: dts, samples: 3001 },
      );
      const lc = { z0: Z0, delay: length * TPD, rs: c.rs, rl: c.rl, source: signalFunction(signal) };
      [0, 0.37, 1].forEach((x, p) => {
        expect(worstError(rec, p, dts, (t) => latticeVoltage(lc, x, t))).toBeLessThan(0.001);
      });
    });
  }
});

describe('RC without lines', () => {
  // A series R into a shunt C: the step response is 1 − e^(−t/RC) (circuit theory). For the linear
  // ramp of duration d the source actually makes, superposing two delayed ramp responses gives
  //   v = (t − τ(1 − e^(−t/τ)))/d for 0 ≤ t ≤ d,  v = 1 − (τ/d)(e^(−(t−d)/τ) − e^(−t/τ)) after.
  // R = Rs + R_series = 10 + 90 Ω, C = 10 pF, τ = 1 ns. Tolerance 0.05 % of swing.
  it('charges as 1 − e^(−t/RC)', () => {
    const rise = 200e-12;
    const start = 0.5e-9;
    const tau = 100 * 10e-12;
    const d = rampDuration(rise);
    const exact = (tt: number) => {
      const t = tt - start;
      if (t <= 0) return 0;
      if (t <= d) return (t - tau * (1 - Math.exp(-t / tau))) / d;
      return 1 - (tau / d) * (Math.exp(-(t - d) / tau) - Math.exp(-t / tau));
    };
    const dts = 20e-12;
    const rec = spectralResponse(
      net({ signal: stepSignal(1, rise, start), rs: 10, route: [{ kind: 'series', name: 'r', part: part({ r: 90 }) }], receiver: [part({ c: 10e-12 })] }),
      { dtSample: dts, samples: 501 },
    );
    expect(worstError(rec, 1, dts, exact)).toBeLessThan(0.0005);
    // the driver pin: vs − Rs·i with i = (vs − v_C)/R (Ohm's law)
    const src = signalFunction(stepSignal(1, rise, start));
    expect(worstError(rec, 0, dts, (t) => src(t) - (10 / 100) * (src(t) - exact(t)))).toBeLessThan(0.0005);
  });
});

describe('Heaviside distortionless line', () => {
  // R′/L′ = G′/C′: every frequency travels at 1/√(L′C′) and is attenuated by e^(−αx), α = √(R′G′) =
  // R′/Z0, and Zc = Z0 at all frequencies; matched at both ends the receiver sees ½·e^(−αℓ)·vs(t − TD)
  // (Heaviside; Ramo, Whinnery & Van Duzer, Fields and Waves in Communication Electronics,
  // distortionless line). Receiver and mid-line within 0.05 % of swing.
  it('delivers ½·e^(−αℓ)·vs(t − TD)', () => {
    const r = 5; // Ω/m
    const g = r / (Z0 * Z0); // = R′C′/L′
    const length = 2;
    const alpha = r / Z0;
    const signal = stepSignal(1, 300e-12, 0.2e-9);
    const src = signalFunction(signal);
    const dts = 20e-12;
    const rec = spectralResponse(
      net({
        signal,
        rs: Z0,
        route: [{ kind: 'line', name: 'cable', line: lineOf(Z0, TPD, r, g), length }],
        receiver: [part({ r: Z0 })],
        probes: [
          { name: 'rx', at: 'receiver' },
          { name: 'mid', at: 'line', item: 'cable', position: 0.8 },
        ],
      }),
      { dtSample: dts, samples: 1501 },
    );
    expect(worstError(rec, 0, dts, (t) => 0.5 * Math.exp(-alpha * length) * src(t - length * TPD))).toBeLessThan(0.0005);
    expect(worstError(rec, 1, dts, (t) => 0.5 * Math.exp(-alpha * 0.8) * src(t - 0.8 * TPD))).toBeLessThan(0.0005);
  });
});

describe('DC steady state of a lossy line', () => {
  // V(x) = V(0)·[cosh γ(ℓ−x) + (Zc/ZL) sinh γ(ℓ−x)] / [cosh γℓ + (Zc/ZL) sinh γℓ], γ = √(R′G′),
  // Zc = √(R′/G′), with V(0) from the input impedance Zc(ZL + Zc tanh γℓ)/(Zc + ZL tanh γℓ) (Pozar,
  // Microwave Engineering, ch. 2, lossy line, with jω → 0). The operating point is exact (1e−9
  // relative); the run starts there (within the method's wrap-around bound, 1e−6 of the 3 V change)
  // and after a step settles to the same form at the new level (1e−5 of swing).
  const r = 40;
  const g = 0.02;
  const length = 2;
  const rs = 10;
  const rl = 100;
  const gamma = Math.sqrt(r * g);
  const zc = Math.sqrt(r / g);
  const closedForm = (vs: number, x: number) => {
    const th = Math.tanh(gamma * length);
    const zin = (zc * (rl + zc * th)) / (zc + rl * th);
    const v0 = (vs * zin) / (rs + zin);
    return (v0 * (Math.cosh(gamma * (length - x)) + (zc / rl) * Math.sinh(gamma * (length - x)))) / (Math.cosh(gamma * length) + (zc / rl) * Math.sinh(gamma * length));
  };
  const mk = (from: number, to: number): Net =>
    net({
      signal: stepSignal(to, 1e-9, 2e-9, from),
      rs,
      route: [{ kind: 'line', name: 'cable', line: lineOf(Z0, 5e-9, r, g), length }],
      receiver: [part({ r: rl })],
      probes: [
        { name: 'src', at: 'driver' },
        { name: 'third', at: 'line', item: 'cable', position: length / 3 },
        { name: 'rx', at: 'receiver' },
      ],
    });
  const xs = [0, length / 3, length];

  it('matches the cosh/sinh form at the operating point', () => {
    const dc = dcOperatingPoint(mk(5, 0));
    xs.forEach((x, p) => expect(Math.abs(dc[p] - closedForm(5, x)) / closedForm(5, x)).toBeLessThan(1e-9));
  });

  it('starts there, and settles to the form at the new level after a step', () => {
    const run = spectralRun(mk(5, 2), { dtSample: 0.1e-9, samples: 1001 });
    xs.forEach((x, p) => {
      const v = probeTrace(run.record, p);
      expect(Math.abs(v[0] - closedForm(5, x))).toBeLessThan(3e-6);
      expect(Math.abs(v[1000] - closedForm(2, x)) / 3).toBeLessThan(1e-5);
    });
  });
});
