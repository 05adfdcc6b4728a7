// The spectral cross-check as a library function: the time-domain engine's frequency-dependent
// loss (auxiliary states fitted to the exact Z′(jω), Y′(jω)) against the spectral solver, which
// evaluates the exact models; and the causality of the time-domain step response.
import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { crossCheck, crossCheckSummary, drawCrossCheck, renderCrossCheck, signalSwing } from '../../../src/crosscheck/index.js';
import { Surface } from '../../../src/render/surface.js';
import { scenarioFromValue } from '../../../src/scenario/load.js';
import { highFrequencyLimit } from '../../../sim/lines/freq-model.js';
import type { Net } from '../../../sim/model.js';
import { simulate } from '../../../sim/simulate.js';
import { probeTrace } from '../../../sim/result.js';

/** A lossy FR-4 microstrip: skin effect (copper, 1 oz) and Djordjevic–Sarkar dielectric (εr 4.3, tanδ 0.02 at 1 GHz). */
const FR4_MICROSTRIP = { microstrip: { width: '0.3mm', height: '0.18mm', thickness: '1oz', er: 4.3, lossTangent: 0.02, at: '1GHz' } };
/** A thin 50 Ω cable as a datasheet describes it (invented values of the usual size). */
const THIN_COAX = {
  z0: '50ohm',
  velocity: '0.66c',
  rdc: '0.04ohm/m',
  attenuation: [
    { at: '10MHz', loss: '4.6dB/100m' },
    { at: '100MHz', loss: '15.5dB/100m' },
    { at: '400MHz', loss: '33dB/100m' },
    { at: '1GHz', loss: '57dB/100m' },
  ],
};

function stepNet(opts: { line: unknown; length: string; rise: string; start: string; rs: string; load?: string; duration: string; to?: string }): Net {
  return scenarioFromValue({
    title: 'cross-check',
    driver: { signal: { kind: 'step', from: '0V', to: opts.to ?? '1V', start: opts.start, rise: opts.rise }, resistance: opts.rs },
    route: [{ name: 'line', line: opts.line, length: opts.length }],
    receiver: opts.load ? { parts: [{ r: opts.load }] } : {},
    probes: [
      { name: 'drv', at: 'driver' },
      { name: 'mid', at: 'line', position: '50%' },
      { name: 'rx', at: 'receiver' },
    ],
    run: { duration: opts.duration },
  });
}

describe('time domain against the spectral solver, within 0.5 % of swing at every probe and sample (the issue’s acceptance bound)', () => {
  // The two methods share only the net and the source: leapfrog on the RLGC ladder with fitted
  // auxiliary loss states, and chain matrices of the exact per-length models with a numerical
  // Laplace transform (Wedepohl 1983; Moreno & Ramirez, IEEE Trans. Power Delivery 23(4), 2008).
  const cases = [
    {
      name: 'lossy FR-4 microstrip (skin + dielectric), 30 cm, 50 ps edge, open end',
      net: stepNet({ line: FR4_MICROSTRIP, length: '30cm', rise: '50ps', start: '100ps', rs: '20ohm', duration: '8ns' }),
    },
    {
      name: 'lossy FR-4 microstrip (skin + dielectric), 50 cm, 100 ps edge, terminated',
      net: stepNet({ line: FR4_MICROSTRIP, length: '50cm', rise: '100ps', start: '200ps', rs: '50ohm', load: '50ohm', duration: '12ns', to: '3.3V' }),
    },
    {
      name: 'long lossy cable from a datasheet, 30 m, 1 ns edge, terminated',
      net: stepNet({ line: THIN_COAX, length: '30m', rise: '1ns', start: '2ns', rs: '50ohm', load: '50ohm', duration: '400ns' }),
    },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const td = simulate(c.net);
      expect(td.discretization.segments[0].loss, 'the line is realised with auxiliary loss states').toBeDefined();
      const check = crossCheck(c.net, td);
      expect(check.probes.map((p) => p.name)).toEqual(['drv', 'mid', 'rx']);
      for (const p of check.probes) {
        expect(p.percentOfSwing, p.name).toBeLessThan(0.5);
        expect(p.percentOfSwing, `${p.name}: the solvers are independent, so some difference remains`).toBeGreaterThan(0);
      }
      expect(check.worst!.percentOfSwing).toBe(Math.max(...check.probes.map((p) => p.percentOfSwing)));
    });
  }
});

describe('causality: a lossy line’s step response never starts before length/v∞', () => {
  // No part of a signal outruns the high-frequency limit of the phase velocity, v∞ = 1/√(L∞C∞)
  // (the front velocity; L. Brillouin, Wave Propagation and Group Velocity, 1960 — from memory).
  // The receiver must stay at its initial value (within 1e−6 of the swing) until the source's ramp
  // start plus length/v∞, and must then rise.
  const cases = [
    { name: 'FR-4 microstrip, 30 cm', line: FR4_MICROSTRIP, length: '30cm', rise: '50ps', duration: '5ns' },
    { name: 'datasheet cable, 30 m', line: THIN_COAX, length: '30m', rise: '1ns', duration: '300ns' },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const net = stepNet({ line: c.line, length: c.length, rise: c.rise, start: '1ns', rs: '50ohm', load: '50ohm', duration: c.duration });
      const item = net.route[0];
      if (item.kind !== 'line' || !item.line.wideband) throw new Error('expected a wideband line');
      const front = 1e-9 + item.length / highFrequencyLimit(item.line.wideband).velocity;
      const { record } = simulate(net);
      const n = record.values.shape[1];
      const rx = probeTrace(record, 2);
      let before = 0;
      let i = 0;
      for (; i < n && i * record.dtSample < front; i++) before = Math.max(before, Math.abs(rx[i] - rx[0]));
      expect(i).toBeGreaterThan(100); // the window before the front is not empty
      expect(before).toBeLessThan(1e-6);
      expect(Math.max(...rx.subarray(i)), 'the edge does arrive').toBeGreaterThan(0.3);
    });
  }
});

describe('swing, summary section and plot', () => {
  const net = stepNet({ line: FR4_MICROSTRIP, length: '10cm', rise: '100ps', start: '100ps', rs: '50ohm', load: '50ohm', duration: '3ns', to: '3.3V' });

  it('the swing is the signal’s high − low (nominal levels of a step: its from and to, IEEE 181)', () => {
    expect(signalSwing(net)).toEqual({ swing: 3.3, from: 'signal' });
    const flat = { ...net, driver: { ...net.driver, signal: { kind: 'step' as const, from: 1, to: 1, start: 0, rise: 1e-10 } } };
    expect(signalSwing(flat)).toEqual({ swing: 1, from: 'unit' });
  });

  it('summary section: per-probe largest difference in volts and percent of swing, and where the largest is', async () => {
    const td = simulate(net);
    const check = crossCheck(net, td);
    const s = crossCheckSummary(check) as { swing: number; largestPercentOfSwing: number; largestAt: string; probes: Record<string, { maxAbs: number; percentOfSwing: number }> };
    expect(Object.keys(s.probes)).toEqual(['drv', 'mid', 'rx']);
    for (const p of Object.values(s.probes)) expect(p.percentOfSwing).toBeCloseTo((100 * p.maxAbs) / 3.3, 12);
    expect(s.largestPercentOfSwing).toBe(s.probes[s.largestAt].percentOfSwing);
    expect(JSON.parse(JSON.stringify(s))).toEqual(s); // plain JSON

    const png = PNG.sync.read(await renderCrossCheck({ title: net.title, timeDomain: td.record, check, width: 800, height: 600 }));
    expect([png.width, png.height]).toEqual([800, 600]);
  });

  it('the overlay and difference panels share the time axis pixel for pixel', () => {
    // the two panels' legends ("drv (time domain)" against "drv") and y tick labels ("3", "−0.05")
    // differ in width: the plot columns are aligned all the same
    const td = simulate(net);
    const check = crossCheck(net, td);
    const s = new Surface(1200, 900);
    const { upper, lower } = drawCrossCheck(s, { title: net.title, timeDomain: td.record, check });
    expect([lower.plot.x, lower.plot.w]).toEqual([upper.plot.x, upper.plot.w]);
    for (const t of [0, 0.7e-9, 1.9e-9, 3e-9]) expect(lower.x.map(t)).toBe(upper.x.map(t));
    expect(lower.xTicks.values).toEqual(upper.xTicks.values);
  });
});
