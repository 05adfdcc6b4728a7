// The spectral solver against the time-domain engine. This is the engine cross-check itself, not an
// outside reference: two independent methods (leapfrog on the RLGC ladder; chain matrices and a
// numerical Laplace transform) must agree on the same net. Tolerance 0.5 % of swing at every sample.
//
// The nets keep every line segment at Courant number 1 (segment delays in integer ratio): with a
// segment below Courant 1 the leapfrog grid disperses the corners of the source's ramps, which on
// these nets at the default 20 steps per rise costs up to about 0.6 % of swing at a series part's input
// (measured with this cross-check; the lattice diagram shows the same on a plain lossless line).
import { describe, expect, it } from 'vitest';
import { fromDatasheet, fromMicrostrip, type FreqLine } from '../../../sim/lines/freq-model.js';
import type { LineRLGC, Net, Signal } from '../../../sim/model.js';
import { prepareRun, simulate } from '../../../sim/simulate.js';
import { compareRecords } from '../../../sim/spectral/compare.js';
import { spectralRun } from '../../../sim/spectral/response.js';
import { lineOf, net, part, stepSignal } from '../../support/nets.js';

/** A lossy two-segment net: series R+L, a shunt C and a pull-up to a rail at the junction, a receiver with a rail termination, input C and an RC. */
function lossyNet(signal: Signal, duration: number): Net {
  return net({
    signal,
    rs: 22,
    route: [
      { kind: 'line', name: 'a', line: lineOf(60, 6e-9, 8, 2e-3), length: 0.15 },
      { kind: 'series', name: 'r1', part: part({ r: 22, l: 2e-9 }) },
      { kind: 'shunt', name: 'via', parts: [part({ c: 1e-12 }), part({ r: 1000, rail: 1.2 })] },
      { kind: 'line', name: 'b', line: lineOf(45, 6e-9, 15, 1e-3), length: 0.3 },
    ],
    receiver: [part({ r: 100, rail: 1.2 }), part({ c: 3e-12 }), part({ r: 56, c: 100e-12 })],
    duration,
    probes: [
      { name: 'drv', at: 'driver' },
      { name: 'mid', at: 'line', item: 'a', position: 0.07 },
      { name: 'r1in', at: 'series', item: 'r1', side: 'in' },
      { name: 'r1out', at: 'series', item: 'r1', side: 'out' },
      { name: 'via', at: 'shunt', item: 'via' },
      { name: 'rx', at: 'receiver' },
    ],
  });
}

function crossCheck(n: Net, swing: number) {
  const td = simulate(n);
  const sp = spectralRun(n, { dtSample: td.record.dtSample, samples: td.record.values.shape[1] });
  return { td, sp, diff: compareRecords(td.record, sp.record, swing) };
}

describe('engine cross-check on a lossy net with series and shunt parts', () => {
  it('a rising edge agrees within 0.5 % of swing at every probe', () => {
    const { td, diff } = crossCheck(lossyNet(stepSignal(3.3, 300e-12, 0.5e-9), 25e-9), 3.3);
    for (const seg of td.discretization.segments) expect(seg.courant).toBe(1);
    expect(diff.map((d) => d.name)).toEqual(['drv', 'mid', 'r1in', 'r1out', 'via', 'rx']);
    for (const d of diff) expect(d.percentOfSwing, d.name).toBeLessThan(0.5);
  });

  it('a falling edge from a net that idles high starts from the same DC state and agrees within 0.5 %', () => {
    const { td, sp, diff } = crossCheck(lossyNet(stepSignal(0, 300e-12, 0.5e-9, 3.3), 25e-9), 3.3);
    for (let p = 0; p < 6; p++) expect(Math.abs(td.record.values.get(p, 0) - sp.record.values.get(p, 0))).toBeLessThan(1e-4);
    for (const d of diff) expect(d.percentOfSwing, d.name).toBeLessThan(0.5);
  });

  it('a clock with unequal rise and fall times agrees within 0.5 %', () => {
    const clock: Signal = { kind: 'clock', low: 0, high: 3.3, period: 8e-9, rise: 300e-12, fall: 400e-12, duty: 0.5, start: 1e-9 };
    const { diff } = crossCheck(lossyNet(clock, 40e-9), 3.3);
    for (const d of diff) expect(d.percentOfSwing, d.name).toBeLessThan(0.5);
  });
});

describe('engine cross-check of frequency-dependent loss', () => {
  // The check of the time-domain loss models: a lossy microstrip (skin effect + Djordjevic–
  // Sarkar dielectric) and a long lossy cable, engine against the spectral solver evaluating the exact
  // wideband model (sim/lines/freq-model.ts), within 0.5 % of swing. The engine realises that model as
  // R‖L sections and R–C branches fitted over the run's band (sim/realize.ts); fed those same terms,
  // the spectral solver evaluates them exactly as rational functions of s, which isolates the time
  // discretization of the auxiliary states from the fit: that part must stay within 0.25 %.
  const asLine = (f: FreqLine): LineRLGC => ({ r: f.rdc, l: f.lInf, g: f.gdc, c: f.cInf, wideband: f });
  const realised = (n: Net): Net => {
    const { net: r } = prepareRun(n);
    return { ...r, route: r.route.map((it) => (it.kind === 'line' ? { ...it, line: { ...it.line, wideband: undefined } } : it)) };
  };
  const cases = [
    {
      name: 'FR-4 microstrip with skin effect and Djordjevic–Sarkar dielectric, 0.3 m, open end',
      line: asLine(fromMicrostrip({ width: 0.3e-3, height: 0.17e-3, thickness: 35e-6, er: 4.3, lossTangent: 0.02, at: 1e9 }).line),
      length: 0.3,
      rise: 50e-12,
      rs: 20,
      duration: 8e-9,
    },
    {
      name: 'datasheet coax (4.3, 14 and 50 dB/100 m at 10 MHz, 100 MHz, 1 GHz), 20 m, open end',
      line: asLine(fromDatasheet({ z0: 50, velocity: 0.66 * 299792458, attenuation: [{ at: 10e6, loss: 0.043 }, { at: 100e6, loss: 0.14 }, { at: 1e9, loss: 0.5 }] }).line),
      length: 20,
      rise: 1e-9,
      rs: 25,
      duration: 250e-9,
    },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const n = net({
        signal: stepSignal(1, c.rise, c.rise),
        rs: c.rs,
        route: [{ kind: 'line', name: 'l', line: c.line, length: c.length }],
        duration: c.duration,
        probes: [
          { name: 'drv', at: 'driver' },
          { name: 'mid', at: 'line', item: 'l', position: c.length / 2 },
          { name: 'rx', at: 'receiver' },
        ],
      });
      const td = simulate(n);
      expect(td.discretization.segments[0].loss?.seriesTerms).toBeGreaterThan(0);
      const opts = { dtSample: td.record.dtSample, samples: td.record.values.shape[1] };
      for (const d of compareRecords(td.record, spectralRun(n, opts).record, 1)) expect(d.percentOfSwing, `exact ${d.name}`).toBeLessThan(0.5);
      for (const d of compareRecords(td.record, spectralRun(realised(n), opts).record, 1)) expect(d.percentOfSwing, `terms ${d.name}`).toBeLessThan(0.25);
    });
  }
});
