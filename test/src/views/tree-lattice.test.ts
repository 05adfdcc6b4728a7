import { describe, expect, it } from 'vitest';
import { simulate } from '../../../sim/simulate.js';
import { probeTrace } from '../../../sim/result.js';
import { latticeDiagram, type LatticeDiagram, type Plateau } from '../../../src/views/lattice.js';
import { treeLatticeDiagram } from '../../../src/views/tree-lattice.js';
import { branch, line, lineOf, net, part, stepSignal } from '../../support/nets.js';

const tpd = 5e-9;
const rx = (name: string) => ({ name, at: 'receiver' as const, receiver: name });

function supported(d: ReturnType<typeof treeLatticeDiagram>): LatticeDiagram {
  if (!d.supported) throw new Error(d.reasons.join('; '));
  return d;
}

/** The plateau in force at time t. */
const levelAt = (ps: readonly Plateau[], t: number) => ps.find((p) => t >= p.from && t < p.to)!.value;

describe('lattice of a tree along one path: junction coefficients', () => {
  // k equal lines of Z0 meeting at a bare junction: a wave on one of them sees the other k − 1 in
  // parallel, Z0/(k − 1), so Γ = (Z0/(k−1) − Z0)/(Z0/(k−1) + Z0) and 1 + Γ goes into each other line
  // (Pozar, Microwave Engineering, 4th ed., ch. 2; Johnson & Graham, High-Speed Digital Design, §4).
  // Three lines at a T: Γ = −1/3, τ = 2/3; a star of three arms off a trunk (four lines): Γ = −1/2, τ = 1/2.
  const tee = (arms: number) =>
    net({
      signal: stepSignal(1, 50e-12),
      rs: 50,
      route: [
        line('trunk', lineOf(50, tpd), 0.1),
        branch('hub', ...Array.from({ length: arms - 1 }, (_, k) => ({ route: [line(`arm${k + 2}`, lineOf(50, tpd), 0.08)], receiver: `r${k + 2}`, parts: [part({ r: 50 })] }))),
        line('arm1', lineOf(50, tpd), 0.06),
      ],
      receiver: [part({ r: 50 })],
      receiverName: 'r1',
      duration: 3e-9,
    });

  it('three equal lines at a T: Γ = −1/3, τ = 2/3; the receiver settles at V/3 at once (matched ends)', () => {
    const d = supported(treeLatticeDiagram(tee(2)));
    const j = d.boundaries[1];
    expect(j.kind).toBe('junction');
    expect(j.gammaFromLeft).toBeCloseTo(-1 / 3, 12);
    expect(j.tauLeftToRight).toBeCloseTo(2 / 3, 12);
    expect(j.gammaFromRight).toBeCloseTo(-1 / 3, 12);
    expect(j.branches).toEqual(['arm2']);
    // V⁺ = V·Z0/(R_S + Z0) = 0.5 V; the receiver gets (2/3)·0.5 = 1/3 V after TD_trunk + TD_arm1
    const t50 = 50e-12 / 0.8 / 2;
    expect(d.launch.amplitude).toBeCloseTo(0.5, 12);
    expect(levelAt(d.plateaus.receiver, t50 + 0.8e-9 + 1e-12)).toBeCloseTo(1 / 3, 12);
    // the driver pin: 0.5 V, then 0.5·(1 − 1/3) once the junction's reflection is back, and nothing more
    expect(levelAt(d.plateaus.driver, t50 + 0.5e-9)).toBeCloseTo(0.5, 12);
    expect(levelAt(d.plateaus.driver, t50 + 1.0e-9 + 1e-12)).toBeCloseTo(1 / 3, 12);
    expect(d.plateaus.driver[d.plateaus.driver.length - 1].value).toBeCloseTo(1 / 3, 12);
  });

  it('a star of three arms off a trunk: Γ = −1/2, τ = 1/2 along every path', () => {
    for (const path of ['r1', 'r2', 'r3']) {
      const d = supported(treeLatticeDiagram(tee(3), { path }));
      expect(d.path?.receiver).toBe(path);
      expect(d.boundaries[1].gammaFromLeft).toBeCloseTo(-1 / 2, 12);
      expect(d.boundaries[1].tauLeftToRight).toBeCloseTo(1 / 2, 12);
      expect(d.plateaus.receiver[d.plateaus.receiver.length - 1].value).toBeCloseTo(0.25, 12);
    }
  });

  it('names the receivers when the path does not exist', () => {
    const d = treeLatticeDiagram(tee(2), { path: 'r9' });
    expect(d.supported).toBe(false);
    if (!d.supported) expect(d.reasons.join()).toMatch(/no receiver named 'r9' \(receivers: r1, r2\)/);
  });
});

describe('lattice of a tree: an unbranched route gives the chain lattice', () => {
  // The chain lattice (src/views/lattice.ts: V⁺ through the Thevenin equivalent, Γ and τ of each
  // junction's resistive network, Pozar ch. 2) and the tree's nodal scattering must agree on a chain.
  it('plateaus at both ends agree to 1e-12 V with series and shunt resistors between mismatched lines', () => {
    const n = net({
      signal: stepSignal(3.3, 100e-12, 0.2e-9),
      rs: 18,
      route: [
        { kind: 'series', name: 'rs', part: part({ r: 15 }) },
        line('a', lineOf(60, tpd), 0.1),
        { kind: 'shunt', name: 'pull', parts: [part({ r: 300, rail: 1.2 })] },
        line('b', lineOf(40, tpd), 0.07),
        { kind: 'series', name: 'rmid', part: part({ r: 10 }) },
        line('c', lineOf(75, tpd), 0.05),
      ],
      receiver: [part({ r: 500 }), part({ r: 1000, rail: 3.3 })],
      duration: 12e-9,
    });
    const chain = latticeDiagram(n);
    const tree = supported(treeLatticeDiagram(n));
    if (!chain.supported) throw new Error('chain lattice refused');
    for (const end of ['driver', 'receiver'] as const) {
      for (let t = 0; t < 12e-9; t += 0.05e-9 + 1e-13) {
        expect(Math.abs(levelAt(tree.plateaus[end], t) - levelAt(chain.plateaus[end], t)), `${end} at ${t}`).toBeLessThan(1e-12);
      }
    }
    expect(tree.dc.after.receiver).toBeCloseTo(chain.dc.after.receiver, 12);
  });
});

describe('lattice of a tree against the engine', () => {
  // A lossless tree at Courant 1 is exact in the leapfrog scheme between edges, so the simulated
  // plateaus equal the lattice's within the 0.2 % of swing (lattice method, Pozar ch. 2).
  it('every plateau at the driver pin and at each receiver, mid-plateau, within 0.2 % of swing', () => {
    const n = net({
      signal: stepSignal(1, 50e-12, 0.1e-9),
      rs: 20,
      route: [
        line('trunk', lineOf(50, tpd), 0.1),
        branch('tee', { route: [line('armA', lineOf(75, tpd), 0.06)], receiver: 'ra', parts: [part({ r: 200 })] }, { route: [line('stub', lineOf(50, tpd), 0.04)], receiver: 'tp' }),
        { kind: 'series', name: 'rser', part: part({ r: 10 }) },
        line('armB', lineOf(40, tpd), 0.08),
      ],
      receiver: [part({ r: 15 })],
      receiverName: 'rb',
      probes: [{ name: 'tx', at: 'driver' }, rx('ra'), rx('tp'), rx('rb')],
      duration: 8e-9,
    });
    const res = simulate(n);
    const dt = res.record.dtSample;
    const ramp = 50e-12 / 0.8;
    let checked = 0;
    for (const rxName of ['ra', 'tp', 'rb']) {
      const d = supported(treeLatticeDiagram(n, { path: rxName }));
      for (const [probe, plateaus] of [['tx', d.plateaus.driver], [rxName, d.plateaus.receiver]] as const) {
        const trace = probeTrace(res.record, probe);
        for (const p of plateaus) {
          if (p.to - p.from < 2 * ramp + 4 * dt || p.to > 8e-9) continue;
          const v = trace[Math.round((p.from + p.to) / 2 / dt)];
          expect(Math.abs(v - p.value), `${probe} on the path to ${rxName}, ${p.from}–${p.to} s`).toBeLessThan(2e-3);
          checked++;
        }
      }
    }
    expect(checked).toBeGreaterThan(20);
  });
});
