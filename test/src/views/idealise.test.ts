// The idealised net of the bounce view: what is replaced, what is refused, and that the lattice of the
// idealised net still matches the simulation of the real one where the idealisation is honest.
// References: the lattice method (Pozar, Microwave Engineering, ch. 2), superposition of the edges of a
// linear net, the low-loss attenuation α = R′/2Z0 (Pozar §2.7) and the RC time constant τ = Z·C.
import { describe, expect, it } from 'vitest';
import type { Net, Signal } from '../../../sim/model.js';
import { probeTrace } from '../../../sim/result.js';
import { simulate } from '../../../sim/simulate.js';
import { bounceLattice, withEndProbes } from '../../../src/views/bounce.js';
import { idealiseForLattice, signalEdges } from '../../../src/views/idealise.js';
import type { Plateau } from '../../../src/views/lattice.js';
import { lineOf, net, part, stepSignal } from '../../support/nets.js';

const clock = (period: number, rise: number, start = 0.5e-9): Signal => ({ kind: 'clock', low: 0, high: 3.3, period, rise, fall: rise, duty: 0.5, start });

/** Largest |simulated − lattice| over the middle `share` of every plateau at least `minLen` long. */
function plateauError(sim: ArrayLike<number>, dt: number, plateaus: readonly Plateau[], minLen: number, share = 0.5): number {
  let worst = 0;
  for (const p of plateaus) {
    if (p.to - p.from < minLen) continue;
    const a = p.from + ((1 - share) / 2) * (p.to - p.from), b = p.to - ((1 - share) / 2) * (p.to - p.from);
    for (let i = Math.ceil(a / dt); i * dt <= b && i < sim.length; i++) worst = Math.max(worst, Math.abs(sim[i] - p.value));
  }
  return worst;
}

describe('signalEdges: a signal as ideal steps at the 50 % points of its ramps (IEEE 181 linear ramps)', () => {
  it('a clock has a rising and a falling edge per period, half a ramp after each ramp starts', () => {
    const e = signalEdges(clock(10e-9, 0.8e-9), 25e-9);
    if ('refusal' in e) throw new Error(e.refusal);
    // ramp 1 ns (0.8 ns / 0.8): rising 50 % at 0.5 + 0.5 ns, falling 50 % half a period later
    expect(e.edges.map((x) => [Number((x.time * 1e9).toFixed(6)), x.step])).toEqual([
      [1, 3.3], [6, -3.3], [11, 3.3], [16, -3.3], [21, 3.3],
    ]);
    expect(e.first).toEqual({ kind: 'step', from: 0, to: 3.3, start: 0.5e-9, rise: 0.8e-9 });
  });

  it('bits change only where the pattern changes; a table signal is refused', () => {
    const bits: Signal = { kind: 'bits', low: 0, high: 1, bitTime: 2e-9, rise: 0.1e-9, fall: 0.1e-9, start: 0, bits: Uint8Array.from([0, 1, 1, 0]), patternName: 'x' };
    const e = signalEdges(bits, 7.9e-9);
    if ('refusal' in e) throw new Error(e.refusal);
    expect(e.edges.map((x) => x.step)).toEqual([1, -1]);
    expect(e.edges[0].time).toBeCloseTo(2e-9 + 0.0625e-9, 15);
    expect('refusal' in signalEdges({ kind: 'table', points: [[0, 0], [1e-9, 1]] }, 1e-8)).toBe(true);
  });
});

describe('idealiseForLattice', () => {
  it('leaves a net the lattice describes exactly as it is, with no notes', () => {
    const n = net({ signal: stepSignal(1, 1e-10), rs: 25, route: [{ kind: 'line', name: 't', line: lineOf(50, 5e-9), length: 0.2 }], receiver: [part({ r: 100 })] });
    const i = idealiseForLattice(n, 10e-9);
    expect(i.net).toBe(n);
    expect(i.notes).toEqual([]);
    expect(i.refusals).toEqual([]);
  });

  it('a small load capacitor becomes an open (τ = Z0·C ≤ a fifth of the round trip), a huge one a short, one in between is refused', () => {
    const withLoad = (c: number): Net =>
      net({ signal: stepSignal(1, 1e-10), rs: 25, route: [{ kind: 'line', name: 't', line: lineOf(50, 5e-9), length: 0.2 }], receiver: [part({ r: 50, c })] });
    // round trip 2 ns; R + Z0 = 100 Ω around the part: 1 pF → τ = 0.1 ns; 10 nF → 1 µs ≫ 10 × the 10 ns shown; 20 pF → 2 ns
    const small = idealiseForLattice(withLoad(1e-12), 10e-9);
    expect(small.refusals).toEqual([]);
    expect(small.net.receiver).toEqual([]);
    expect(small.notes.join()).toMatch(/taken as an open/);
    const large = idealiseForLattice(withLoad(10e-9), 10e-9);
    expect(large.net.receiver).toEqual([part({ r: 50 })]);
    expect(large.notes.join()).toMatch(/capacitor .* taken as a short/);
    const between = idealiseForLattice(withLoad(20e-12), 10e-9);
    expect(between.refusals.join()).toMatch(/the receiver \(C 20 pF; τ ≈ 2 ns/);
  });

  it('a lossy line is drawn lossless with the plateau loss e^(−αℓ), α = R′/2Z0, in the note; a heavy loss is refused', () => {
    const lossy = (r: number): Net => net({ signal: stepSignal(1, 1e-9), rs: 10, route: [{ kind: 'line', name: 'wire', line: lineOf(100, 5e-9, r), length: 20 }], receiver: [part({ r: 1e4 })] });
    // α = 0.5/(2·100) = 2.5e-3 /m over 20 m: e^(−0.05) → 4.9 % off
    const light = idealiseForLattice(lossy(0.5), 2e-6);
    expect(light.refusals).toEqual([]);
    expect(light.notes.join()).toMatch(/takes about 5 % off the plateaus .*'wire': 0\.43 dB/);
    const line = light.net.route[0];
    expect(line.kind === 'line' && line.line.r).toBe(0);
    // α = 10/200 = 0.05 /m: e^(−1) keeps 37 %
    expect(idealiseForLattice(lossy(10), 2e-6).refusals.join()).toMatch(/take about 63 % off/);
  });

  it('a series inductor too large for a short and too small for an open is refused; a tiny one becomes a wire', () => {
    const withL = (l: number): Net =>
      net({
        signal: stepSignal(1, 1e-10),
        rs: 50,
        route: [{ kind: 'line', name: 'a', line: lineOf(50, 5e-9), length: 0.2 }, { kind: 'series', name: 'bead', part: part({ l }) }, { kind: 'line', name: 'b', line: lineOf(50, 5e-9), length: 0.2 }],
      });
    // τ = L/(50 + 50): 1 nH → 10 ps (a short); 200 nH → 2 ns, the round trip of 4 ns is not ≫ it
    const tiny = idealiseForLattice(withL(1e-9), 20e-9);
    expect(tiny.refusals).toEqual([]);
    const bead = tiny.net.route[1];
    expect(bead.kind === 'series' && bead.part.l).toBe(0);
    expect(idealiseForLattice(withL(200e-9), 20e-9).refusals.join()).toMatch(/series part 'bead' \(L 200 nH; τ ≈ 2 ns/);
  });
});

describe('the idealised lattice against the simulation of the real net', () => {
  it('a pulse on a resistive lossless net: the superposed lattice equals the simulation (exact, 0.5 % of the swing)', () => {
    // Pozar ch. 2 lattice, two edges superposed; the engine matches the lattice to 0.2 % (README).
    const pulse: Signal = { kind: 'pulse', from: 0, to: 2, start: 1e-9, rise: 0.2e-9, width: 7e-9, fall: 0.2e-9 };
    const n = withEndProbes(net({ signal: pulse, rs: 15, route: [{ kind: 'line', name: 't', line: lineOf(50, 5e-9), length: 0.3 }], receiver: [part({ r: 200 })], duration: 25e-9 }));
    const r = simulate(n);
    const { diagram } = bounceLattice(n, r.discretization.duration);
    if (!diagram.supported) throw new Error(diagram.reasons.join());
    expect(diagram.edges).toHaveLength(2);
    const dt = r.record.dtSample;
    const rx = n.probes.findIndex((p) => p.at === 'receiver');
    // plateaus longer than 1 ns, read away from the ramps (0.25 ns) at their middle half
    expect(plateauError(probeTrace(r.record, rx), dt, diagram.plateaus.receiver, 1e-9)).toBeLessThan(0.005 * 2);
    const tx = n.probes.findIndex((p) => p.at === 'driver');
    expect(plateauError(probeTrace(r.record, tx), dt, diagram.plateaus.driver, 1e-9)).toBeLessThan(0.005 * 2);
  });

  it('an unterminated clock with a small receiver capacitance: the idealised plateaus follow the simulation within 3 % of the swing', () => {
    // 50 Ω, TD 1 ns, 2 pF load: τ = Z0·C = 0.1 ns. A capacitive end delays each reflection by about τ
    // (the group delay of 1/(1 + jωτ)), so the real plateaus start later with every round trip; in the
    // middle tenth of each plateau (≥ 1.5 ns long, so ≥ 7 τ after the lattice's arrival) the capacitor
    // has charged to within e^(−7) of the open-end level, leaving the ringing of the delayed edges.
    const n = withEndProbes(net({ signal: clock(20e-9, 0.3e-9), rs: 20, route: [{ kind: 'line', name: 't', line: lineOf(50, 5e-9), length: 0.2 }], receiver: [part({ c: 2e-12 })], duration: 40e-9 }));
    const r = simulate(n);
    const { diagram, idealisation } = bounceLattice(n, r.discretization.duration);
    if (!diagram.supported) throw new Error(diagram.reasons.join());
    expect(idealisation.notes.join()).toMatch(/clock .* ideal steps/);
    expect(diagram.edges.length).toBe(4);
    const rx = n.probes.findIndex((p) => p.at === 'receiver');
    expect(plateauError(probeTrace(r.record, rx), r.record.dtSample, diagram.plateaus.receiver, 1.5e-9, 0.1)).toBeLessThan(0.03 * 3.3);
  });

  it('a clock’s settled low level is 0 V exactly, not the rounding left by superposed edges that cancel', () => {
    // Superposition of a linear net: once a falling edge's ringing has died out, every wave of the rising
    // edge has a twin of opposite sign, and the DC divider of a 0 V source with no rails gives 0 V; the
    // sums leave ~1e-15 V of rounding, which the plot printed as "0.507 fV".
    const n = withEndProbes(net({
      signal: clock(125e-9, 1.5e-9, 2e-9),
      rs: 10,
      route: [{ kind: 'line', name: 'a', line: lineOf(50, 6.5e-9), length: 0.0508 }, { kind: 'line', name: 'b', line: lineOf(75, 4.8e-9), length: 0.25 }],
      receiver: [part({ r: 1e6 })],
      duration: 260e-9,
    }));
    const { diagram } = bounceLattice(n, 260e-9);
    if (!diagram.supported) throw new Error(diagram.reasons.join());
    for (const end of ['driver', 'receiver'] as const) {
      // the low half-period: from the falling edge (~65 ns) to the next rising edge (~127.75 ns)
      const low = diagram.plateaus[end].filter((p) => p.from > 70e-9 && p.from < 125e-9);
      expect(low.length).toBeGreaterThan(2);
      for (const p of low) expect(p.value === 0 || Math.abs(p.value) > 1e-9).toBe(true);
      const settled = diagram.plateaus[end].find((p) => p.from <= 125e-9 && p.to > 125e-9);
      expect(settled && Object.is(settled.value, 0)).toBe(true);
    }
  });
});
