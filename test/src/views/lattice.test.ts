// The lattice (bounce) diagram computed from a net, against outside references:
// - launched amplitude V⁺ = V_S·Z0/(R_S + Z0) and Γ = (Z − Z0)/(Z + Z0), transmission 1 + Γ at a plain
//   junction (Pozar, Microwave Engineering, ch. 2; Johnson & Graham, High-Speed Digital Design, ch. 4);
// - a series resistor R between lines Z1 and Z2: Γ = (R + Z2 − Z1)/(R + Z2 + Z1), τ = (1 + Γ)·Z2/(R + Z2);
//   a shunt resistor R: Γ = (R‖Z2 − Z1)/(R‖Z2 + Z1), τ = 1 + Γ (Kirchhoff's laws on the junction, with the
//   line beyond it seen as its Z0: the load-reflection formula of Pozar ch. 2 applied to R + Z2 and R‖Z2);
// - the source-end plateaus of C. R. Paul's FDTD worked example (Analysis of Multiconductor Transmission
//   Lines, FDTD chapter) by superposing the step lattice with its delayed negative;
// - the settled level: the DC voltage divider (Ohm's law);
// - the engine's own simulation of the same net: plateaus within 0.5 % of the swing at mid-plateau.
import { describe, expect, it } from 'vitest';
import type { Net, RouteItem } from '../../../sim/model.js';
import { simulate } from '../../../sim/simulate.js';
import { latticeDiagram, latticeLimitations, latticeVoltageAt, type LatticeDiagram, type Plateau } from '../../../src/views/lattice.js';
import { lineOf, net, part, stepSignal } from '../../support/nets.js';
import { probeTrace } from '../../../sim/result.js';

const line = (name: string, z0: number, tpd: number, length: number): RouteItem => ({ kind: 'line', name, line: lineOf(z0, tpd), length });
const supported = (n: Net): LatticeDiagram => {
  const d = latticeDiagram(n);
  if (!d.supported) throw new Error(`unexpectedly unsupported: ${d.reasons.join('; ')}`);
  return d;
};
const gamma = (z: number, z0: number) => (z === Infinity ? 1 : (z - z0) / (z + z0));
const par = (a: number, b: number) => (a * b) / (a + b);

describe('coefficients against the textbook formulas', () => {
  it('launch amplitude and end reflections (Pozar ch. 2)', () => {
    for (const [rs, rl] of [[10, Infinity], [50, 200], [150, 0], [25, 75]] as const) {
      const d = supported(
        net({ signal: stepSignal(3.3, 100e-12, 1e-9), rs, route: [line('t', 50, 6e-9, 0.2)], receiver: rl === Infinity ? [] : [part({ r: rl })] }),
      );
      expect(d.launch.amplitude).toBeCloseTo((3.3 * 50) / (rs + 50), 12);
      expect(d.boundaries[0].gammaFromRight).toBeCloseTo(gamma(rs, 50), 12);
      expect(d.boundaries[1].gammaFromLeft).toBeCloseTo(gamma(rl, 50), 12);
      expect(d.waves[0]).toMatchObject({ segment: 0, direction: 1, x0: 0 });
      expect(d.waves[0].t1 - d.waves[0].t0).toBeCloseTo(0.2 * 6e-9, 18);
    }
  });

  it('a plain junction transmits 1 + Γ each way (Pozar ch. 2)', () => {
    const d = supported(net({ signal: stepSignal(1, 50e-12), rs: 50, route: [line('a', 50, 6e-9, 0.1), line('b', 75, 5e-9, 0.1)], receiver: [part({ r: 75 })] }));
    const j = d.boundaries[1];
    expect(j.gammaFromLeft).toBeCloseTo(0.2, 12);
    expect(j.gammaFromRight).toBeCloseTo(-0.2, 12);
    expect(j.tauLeftToRight).toBeCloseTo(1.2, 12);
    expect(j.tauRightToLeft).toBeCloseTo(0.8, 12);
    // matched load: the transmitted wave ends there; one reflected wave goes back
    expect(d.waves.map((w) => [w.segment, w.direction, Number(w.amplitude.toFixed(12))])).toEqual([
      [0, 1, 0.5],
      [0, -1, 0.1],
      [1, 1, 0.6],
    ]);
  });

  it('series and shunt resistors at a junction (Kirchhoff; Pozar ch. 2 load reflection)', () => {
    const z1 = 50, z2 = 75, r = 20;
    const series = supported(
      net({ signal: stepSignal(1, 50e-12), rs: 50, route: [line('a', z1, 6e-9, 0.1), { kind: 'series', name: 'r', part: part({ r }) }, line('b', z2, 6e-9, 0.1)] }),
    ).boundaries[1];
    const gs = (r + z2 - z1) / (r + z2 + z1);
    expect(series.gammaFromLeft).toBeCloseTo(gs, 12);
    expect(series.tauLeftToRight).toBeCloseTo(((1 + gs) * z2) / (r + z2), 12);
    const gsr = (r + z1 - z2) / (r + z1 + z2);
    expect(series.gammaFromRight).toBeCloseTo(gsr, 12);
    expect(series.tauRightToLeft).toBeCloseTo(((1 + gsr) * z1) / (r + z1), 12);

    const rp = 150;
    const shunt = supported(
      net({ signal: stepSignal(1, 50e-12), rs: 50, route: [line('a', z1, 6e-9, 0.1), { kind: 'shunt', name: 'p', parts: [part({ r: rp })] }, line('b', z2, 6e-9, 0.1)] }),
    ).boundaries[1];
    const gp = (par(rp, z2) - z1) / (par(rp, z2) + z1);
    expect(shunt.gammaFromLeft).toBeCloseTo(gp, 12);
    expect(shunt.tauLeftToRight).toBeCloseTo(1 + gp, 12);
    expect(shunt.gammaFromRight).toBeCloseTo((par(rp, z1) - z2) / (par(rp, z1) + z2), 12);
  });

  it('a series resistor at the driver launches through the Thevenin equivalent', () => {
    const d = supported(net({ signal: stepSignal(3.3, 100e-12), rs: 14, route: [{ kind: 'series', name: 'rs', part: part({ r: 39 }) }, line('t', 55, 6e-9, 0.15)] }));
    expect(d.launch.theveninResistance).toBe(53);
    expect(d.launch.amplitude).toBeCloseTo((3.3 * 55) / (53 + 55), 12);
    expect(d.boundaries[0].gammaFromRight).toBeCloseTo(gamma(53, 55), 12);
  });
});

describe('what the lattice method cannot describe', () => {
  it('lists every reason: signal kind, lossy segment, reactive parts', () => {
    const n = net({
      signal: { kind: 'clock', low: 0, high: 3.3, period: 40e-9, rise: 1e-9, fall: 1e-9, duty: 0.5, start: 0 },
      rs: 14,
      route: [
        { kind: 'line', name: 'lossy', line: lineOf(55, 6e-9, 4, 0), length: 0.1 },
        { kind: 'shunt', name: 'via', parts: [part({ c: 0.4e-12 })] },
        { kind: 'series', name: 'bead', part: part({ l: 10e-9 }) },
        line('ok', 55, 6e-9, 0.1),
      ],
      receiver: [part({ c: 4e-12 })],
    });
    const d = latticeDiagram(n);
    expect(d.supported).toBe(false);
    const reasons = latticeLimitations(n).join('\n');
    expect(reasons).toMatch(/clock/);
    expect(reasons).toMatch(/'lossy' is lossy/);
    expect(reasons).toMatch(/'via' has a capacitor/);
    expect(reasons).toMatch(/'bead' has an inductor/);
    expect(reasons).toMatch(/receiver has a capacitor/);
    expect(reasons).not.toMatch(/'ok'/);
  });

  it('refuses a route without a line segment', () => {
    const d = latticeDiagram(net({ signal: stepSignal(1, 1e-9), rs: 50, route: [{ kind: 'series', name: 'r', part: part({ r: 10 }) }] }));
    expect(d.supported).toBe(false);
  });
});

describe("Paul's FDTD worked example by superposition of two step lattices", () => {
  it('gives the published source-end plateaus 25, −12.5, −37.5, −18.75, 18.75, 9.375, −9.375, −4.6875 V', () => {
    // 400 m, L = 0.25 µH/m, C = 100 pF/m (Z0 = 50 Ω, TD = 2 µs), Rs = 150 Ω, shorted load; the 100 V pulse
    // of 6 µs is a step at 0 minus a step at 6 µs.
    const n = net({
      signal: stepSignal(100, 1e-12, 0),
      rs: 150,
      route: [{ kind: 'line', name: 'cable', line: { r: 0, l: 0.25e-6, g: 0, c: 100e-12 }, length: 400 }],
      receiver: [part({ r: 0 })],
      duration: 20e-6,
    });
    const d = supported(n);
    const at = (p: Plateau[], t: number) => p.find((q) => t >= q.from && t < q.to)!.value;
    const pulse = (t: number) => at(d.plateaus.driver, t) - (t > 6e-6 ? at(d.plateaus.driver, t - 6e-6) : 0);
    const published = [25, -12.5, -37.5, -18.75, 18.75, 9.375, -9.375, -4.6875];
    [1, 5, 7, 9, 11, 13, 15, 17].forEach((t, k) => expect(pulse(t * 1e-6)).toBeCloseTo(published[k], 9));
  });
});

describe('against the simulation of the same net (plateaus within 0.5 % of the swing)', () => {
  const cases: { name: string; rs: number; route: RouteItem[]; receiver: ReturnType<typeof part>[]; swing?: number; from?: number }[] = [
    { name: 'Rs < Z0, open end', rs: 10, route: [line('t', 50, 5e-9, 0.3)], receiver: [] },
    { name: 'Rs > Z0, shorted end', rs: 120, route: [line('t', 50, 5e-9, 0.3)], receiver: [part({ r: 0 })] },
    { name: 'impedance step and resistive load', rs: 25, route: [line('a', 50, 5e-9, 0.2), line('b', 80, 6e-9, 0.15)], receiver: [part({ r: 200 })] },
    {
      name: 'series resistor between segments, termination to a rail',
      rs: 10,
      route: [line('a', 50, 5e-9, 0.2), { kind: 'series', name: 'r1', part: part({ r: 20 }) }, line('b', 75, 6e-9, 0.1)],
      receiver: [part({ r: 100, rail: 0.5 })],
    },
    {
      name: 'series-terminated driver, shunt resistor mid-route, falling edge from 3.3 V',
      rs: 14,
      route: [
        { kind: 'series', name: 'rs', part: part({ r: 33 }) },
        line('a', 50, 5e-9, 0.15),
        { kind: 'shunt', name: 'bleed', parts: [part({ r: 470 })] },
        line('b', 50, 7e-9, 0.12),
      ],
      receiver: [part({ r: 1e3 }), part({ r: 2e3, rail: 3.3 })],
      from: 3.3,
      swing: -3.3,
    },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const from = c.from ?? 0, to = from + (c.swing ?? 1);
      const n = net({ signal: stepSignal(to, 40e-12, 0.2e-9, from), rs: c.rs, route: c.route, receiver: c.receiver, duration: 25e-9, cellsPerRise: 20 });
      const d = supported(n);
      const res = simulate(n);
      const dts = res.record.dtSample;
      const ramp = 40e-12 / 0.8;
      let checked = 0;
      (['driver', 'receiver'] as const).forEach((end, p) => {
        const v = probeTrace(res.record, p);
        for (const pl of d.plateaus[end]) {
          // only plateaus long enough to settle between two ramps
          if (pl.to - pl.from < 2 * ramp + 4 * dts || pl.to > res.discretization.duration) continue;
          const t = (pl.from + pl.to) / 2;
          const got = v[Math.round(t / dts)];
          expect(Math.abs(got - pl.value) / Math.abs(to - from), `${end} at ${t}`).toBeLessThan(0.005);
          checked++;
        }
      });
      expect(checked).toBeGreaterThan(6);
    });
  }

  it('settled levels equal the voltage divider R_L/(R_S + R_L) (Ohm’s law)', () => {
    const d = supported(net({ signal: stepSignal(2, 40e-12), rs: 30, route: [line('t', 50, 5e-9, 0.1)], receiver: [part({ r: 90 })], duration: 40e-9 }));
    expect(d.dc.after.receiver).toBeCloseTo((2 * 90) / 120, 9);
    const last = d.plateaus.receiver[d.plateaus.receiver.length - 1];
    expect(Math.abs(last.value - (2 * 90) / 120)).toBeLessThan(1e-3);
  });

  it('latticeVoltageAt gives the sum of waves passed at mid-line (lattice formula, Pozar ch. 2)', () => {
    // Rs = 10, open: V⁺ = 50/60; at x = L/2 the forward wave arrives at TD/2, the reflected one at 3TD/2.
    const n = net({ signal: stepSignal(1, 1e-12, 0), rs: 10, route: [line('t', 50, 5e-9, 0.2)], receiver: [], duration: 10e-9 });
    const d = supported(n);
    const td = 1e-9, t50 = d.launch.time, a = 50 / 60;
    expect(latticeVoltageAt(d, 0.1, t50 + 0.4 * td)).toBe(0);
    expect(latticeVoltageAt(d, 0.1, t50 + 0.6 * td)).toBeCloseTo(a, 12);
    expect(latticeVoltageAt(d, 0.1, t50 + 1.6 * td)).toBeCloseTo(2 * a, 12);
    expect(latticeVoltageAt(d, 0.1, t50 + 2.6 * td)).toBeCloseTo(2 * a + a * gamma(10, 50), 12);
  });
});
