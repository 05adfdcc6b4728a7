import { describe, expect, it } from 'vitest';
import { simulate } from '../../sim/simulate.js';
import { rampDuration } from '../../sim/signals.js';
import { lineOf, net, part, stepSignal } from '../support/nets.js';
import { probeTrace } from '../../sim/result.js';

const Z0 = 50;
const TPD = 6e-9;

describe('capacitive load through a matched line', () => {
  // Matched source, line, load C: the load sees twice the incident wave through a first-order lag with
  // τ = Z0·C (Johnson & Graham, High-Speed Digital Design, ch. 4; Bogatin, Signal and Power Integrity —
  // Simplified, capacitive-load reflections). For a ramp of height 2A and duration T arriving at t = 0:
  // v = 2A/T·(t − τ(1 − e^(−t/τ))) while ramping, then 2A·(1 − (τ/T)(e^(−(t−T)/τ) − e^(−t/τ))).
  it('charges with τ = Z0·C within 0.2 % of swing', () => {
    const C = 10e-12;
    const tau = Z0 * C;
    const rise = 100e-12;
    const start = 0.2e-9;
    const length = 0.2;
    const res = simulate(
      net({
        signal: stepSignal(1, rise, start),
        rs: Z0,
        route: [{ kind: 'line', name: 't', line: lineOf(Z0, TPD), length }],
        receiver: [part({ c: C })],
        duration: 8e-9,
        cellsPerRise: 25,
      }),
    );
    const v = probeTrace(res.record, 1);
    const dts = res.record.dtSample;
    const T = rampDuration(rise);
    const A = 0.5;
    const exact = (tt: number) => {
      const t = tt - start - length * TPD;
      if (t <= 0) return 0;
      if (t <= T) return ((2 * A) / T) * (t - tau * (1 - Math.exp(-t / tau)));
      return 2 * A * (1 - (tau / T) * (Math.exp(-(t - T) / tau) - Math.exp(-t / tau)));
    };
    let worst = 0;
    for (let i = 0; i < v.length; i++) worst = Math.max(worst, Math.abs(v[i] - exact(i * dts)));
    expect(worst).toBeLessThan(0.002);
  });
});

describe('series termination', () => {
  // Source resistance plus series resistor equal to Z0: the driver side sits at half the swing for one
  // round trip (2·TD), then the reflection from the open end brings it to full swing (Johnson & Graham,
  // High-Speed Digital Design, series termination).
  it('holds the half-amplitude plateau for 2·TD', () => {
    const length = 0.25;
    const td = length * TPD;
    const rise = 100e-12;
    const start = 0.1e-9;
    const res = simulate(
      net({
        signal: stepSignal(3.3, rise, start),
        rs: 18,
        route: [
          { kind: 'series', name: 'rterm', part: part({ r: 32 }) },
          { kind: 'line', name: 't', line: lineOf(Z0, TPD), length },
        ],
        duration: 6 * td,
        probes: [
          { name: 'after', at: 'series', item: 'rterm', side: 'out' },
          { name: 'rx', at: 'receiver' },
        ],
      }),
    );
    const v = probeTrace(res.record, 0);
    const dts = res.record.dtSample;
    const rampEnd = start + rampDuration(rise);
    const at = (t: number) => v[Math.round(t / dts)];
    // plateau from the end of the launched ramp until the reflection's ramp starts at start + 2·TD
    for (let t = rampEnd + 0.05e-9; t < start + 2 * td - 0.05e-9; t += 0.05e-9) expect(Math.abs(at(t) - 1.65)).toBeLessThan(0.0066);
    expect(Math.abs(at(start + 2 * td + rampDuration(rise) + 0.1e-9) - 3.3)).toBeLessThan(0.0066);
    // the receiver of a series-terminated line sees the full swing at once
    const rx = probeTrace(res.record, 1);
    expect(Math.abs(rx[Math.round((rampEnd + td + 0.1e-9) / dts)] - 3.3)).toBeLessThan(0.0066);
  });
});

describe('line delay and impedance', () => {
  // delay = length·√(L'C'), Z0 = √(L'/C') (telegrapher equations, lossless line; Pozar, ch. 2)
  it('moves the 50 % point by length·√(L′C′)', () => {
    const l = 400e-9;
    const c = 160e-12;
    const length = 0.3;
    const res = simulate(
      net({
        signal: stepSignal(1, 100e-12, 0.1e-9),
        rs: 50,
        route: [{ kind: 'line', name: 't', line: { r: 0, g: 0, l, c }, length }],
        receiver: [part({ r: 50 })],
        duration: 5e-9,
      }),
    );
    const seg = res.discretization.segments[0];
    expect(seg.z0).toBeCloseTo(Math.sqrt(l / c), 12);
    expect(seg.delay).toBeCloseTo(length * Math.sqrt(l * c), 20);
    const cross = (p: number, level: number) => {
      const v = probeTrace(res.record, p);
      for (let i = 1; i < v.length; i++) if (v[i] >= level) return (i - 1 + (level - v[i - 1]) / (v[i] - v[i - 1])) * res.record.dtSample;
      return NaN;
    };
    const level = 0.25; // half of the matched plateau
    expect(cross(1, level) - cross(0, level)).toBeCloseTo(length * Math.sqrt(l * c), 13);
  });
});
