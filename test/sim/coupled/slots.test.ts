import { describe, expect, it } from 'vitest';
import { compileNet } from '../../../sim/circuit.js';
import { advanceCoupledSection, buildCoupledSection } from '../../../sim/coupled/kernel.js';
import type { CoupledLine } from '../../../sim/coupled/line.js';
import { fromRows } from '../../../sim/coupled/matrix.js';
import { modalAnalysis, pairMetrics } from '../../../sim/coupled/modes.js';
import { advanceCoupledSlots, type CoupledSlots } from '../../../sim/coupled/slots.js';
import { discretize } from '../../../sim/discretize.js';
import { NetError } from '../../../sim/errors.js';
import { probeTrace } from '../../../sim/result.js';
import { simulate } from '../../../sim/simulate.js';
import { homogeneousPair, inhomogeneousPair } from '../../support/coupled.js';
import { pairNet } from '../../support/coupled-nets.js';
import { line, lineOf, net, part, stepSignal } from '../../support/nets.js';

/** Bit patterns equal (NaN-safe, ±0 distinguished). */
function sameBits(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false;
  const x = new BigUint64Array(Float64Array.from(a).buffer);
  const y = new BigUint64Array(Float64Array.from(b).buffer);
  return x.every((bits, i) => bits === y[i]);
}

function threeConductors(): CoupledLine {
  return {
    k: 3,
    l: fromRows([
      [300e-9, 40e-9, 10e-9],
      [40e-9, 310e-9, 40e-9],
      [10e-9, 40e-9, 300e-9],
    ]),
    c: fromRows([
      [120e-12, -11e-12, -2e-12],
      [-11e-12, 125e-12, -11e-12],
      [-2e-12, -11e-12, 120e-12],
    ]),
    r: fromRows([
      [5, 0, 0],
      [0, 5, 0],
      [0, 0, 5],
    ]),
  };
}

describe('the coupled update on the ladder slots', () => {
  // The in-place update must be kernel.ts's update (tested there against hand steps and the exact modal
  // solution) with another storage layout: conductor c's node n at bases[c] + n instead of n·k + c.
  for (const line of [inhomogeneousPair(), threeConductors()]) {
    it(`${line.k} conductors: the same numbers as the interleaved kernel, bit for bit, over 50 steps`, () => {
      const cells = 7;
      const k = line.k;
      const dt = 1e-12;
      const sec = buildCoupledSection(line, 0.01, cells, dt);
      const bases = Int32Array.from({ length: k }, (_, c) => 3 + c * (cells + 2));
      const v = new Float64Array(3 + k * (cells + 2) + 1);
      const i = new Float64Array(v.length);
      const slots: CoupledSlots = { name: 'x', k, cells, bases, coef: sec.coef, scratch: new Float64Array(4 * k) };
      const ends = new Float64Array(2 * k);
      let seed = 7;
      const rnd = () => ((seed = (seed * 16807) % 2147483647) / 2147483647) - 0.5;
      for (let n = 0; n <= cells; n++) for (let c = 0; c < k; c++) v[bases[c] + n] = sec.v[n * k + c] = rnd();
      for (let n = 0; n < cells; n++) for (let c = 0; c < k; c++) i[bases[c] + n + 1] = sec.i[n * k + c] = rnd() * 0.01;
      for (let step = 0; step < 50; step++) {
        for (let c = 0; c < k; c++) {
          ends[c] = v[bases[c]] = Math.sin(step * 0.3 + c);
          ends[k + c] = v[bases[c] + cells] = Math.cos(step * 0.2 + c);
        }
        advanceCoupledSection(sec, ends);
        advanceCoupledSlots(slots, v, i);
      }
      const vs = new Float64Array((cells + 1) * k);
      const is = new Float64Array(cells * k);
      for (let n = 0; n <= cells; n++) for (let c = 0; c < k; c++) vs[n * k + c] = v[bases[c] + n];
      for (let n = 0; n < cells; n++) for (let c = 0; c < k; c++) is[n * k + c] = i[bases[c] + n + 1];
      expect(sameBits(vs, sec.v)).toBe(true);
      expect(sameBits(is, sec.i)).toBe(true);
    });
  }
});

describe('coupled sections in runs', () => {
  it('zero coupling: each net equals its own single-line run bit for bit', () => {
    const la = lineOf(50, 6.67e-9, 2);
    const lb = lineOf(50, 6.67e-9, 1);
    const pair: CoupledLine = { k: 2, l: Float64Array.of(la.l, 0, 0, lb.l), c: Float64Array.of(la.c, 0, 0, lb.c), r: Float64Array.of(la.r, 0, 0, lb.r) };
    const base = pairNet({ line: pair, length: 0.1, signal: stepSignal(1, 100e-12), rs: 25, rsVictim: 30, rt: [1e4, 75], duration: 5e-9 });
    base.nets![0].driver.signal = stepSignal(-0.5, 100e-12, 0.3e-9);
    const both = simulate(base);
    const alone = [
      net({ signal: base.driver.signal, rs: 25, route: [line('a', la, 0.1)], receiver: [part({ r: 1e4 })], duration: 5e-9 }),
      net({ signal: base.nets![0].driver.signal, rs: 30, route: [line('b', lb, 0.1)], receiver: [part({ r: 75 })], duration: 5e-9 }),
    ].map((n) => simulate(n));
    expect(both.discretization.dt).toBe(alone[0].discretization.dt);
    expect(sameBits(probeTrace(both.record, 'aggNear'), probeTrace(alone[0].record, 'driver'))).toBe(true);
    expect(sameBits(probeTrace(both.record, 'aggFar'), probeTrace(alone[0].record, 'receiver'))).toBe(true);
    expect(sameBits(probeTrace(both.record, 'vicNear'), probeTrace(alone[1].record, 'driver'))).toBe(true);
    expect(sameBits(probeTrace(both.record, 'vicFar'), probeTrace(alone[1].record, 'receiver'))).toBe(true);
  });

  // Homogeneous pair (v = 1.5e8 m/s, Z0 = 50 Ω, k = 0.1): every end terminated in R = √(Z_e·Z_o), the
  // aggressor driven behind R. The even and odd modes each see R at both ends and do not mix, so the
  // aggressor's near end steps by V_s/2 and the victim's by (1 − √(1 − k²))/k = 0.0501256 of that
  // (K_b = k/2 = 0.05 to first order), and at the far end the two modes cancel exactly (derivation in
  // test/sim/coupled/kernel.test.ts; C. R. Paul, Analysis of Multiconductor Transmission Lines, crosstalk;
  // the weak-coupling K_b in S. H. Hall and H. L. Heck, Advanced Signal Integrity for High-Speed Digital
  // Designs, crosstalk).
  it('homogeneous pair through the engine: near-end plateau 0.0501256 of the aggressor step, far end quiet', () => {
    const pair = homogeneousPair();
    const p = pairMetrics(pair);
    const r = Math.sqrt(p.zEven * p.zOdd);
    const res = simulate(pairNet({ line: pair, length: 0.15, signal: stepSignal(1, 80e-12), rs: r, rt: [r, r], duration: 2.8e-9 }));
    const dt = res.record.dtSample;
    const mid = Math.round(1.2e-9 / dt); // after the ramp (125 ps), before 2·TD = 2 ns
    const agg = probeTrace(res.record, 'aggNear');
    const vic = probeTrace(res.record, 'vicNear');
    expect(agg[mid]).toBeCloseTo(0.5, 6);
    expect(vic[mid] / agg[mid]).toBeCloseTo((1 - Math.sqrt(1 - 0.01)) / 0.1, 6);
    expect(Math.max(...probeTrace(res.record, 'vicFar').map(Math.abs))).toBeLessThan(1e-6);
    expect(res.discretization.segments.map((s) => s.courant)).toEqual([expect.closeTo(1, 9), expect.closeTo(1, 9)]);
  });

  // Inhomogeneous pair L = [[300, 45], [45, 300]] nH/m, C = [[120, −12], [−12, 120]] pF/m over 0.1 m,
  // every end 50 Ω, the aggressor's source a 2 V, 100 ps ramp (80 ps 10–90 %) behind 50 Ω: exact modal
  // solution near-end plateau 0.062786 V and far-end minimum −0.150560 V (derived in
  // test/sim/coupled/kernel.test.ts; Paul for the modal solution; the weak-coupling estimates 0.0625 V and
  // −(ℓ/2v)(L_m/L − C_m/C)·dV/dt = −0.150 V from Hall & Heck, crosstalk).
  describe('inhomogeneous pair through the engine', () => {
    const run = (cellsPerRise: number) =>
      simulate(pairNet({ line: inhomogeneousPair(), length: 0.1, signal: stepSignal(2, 80e-12), rs: 50, rt: [50, 50], duration: 1.5e-9, cellsPerRise }));
    it('near-end plateau within 0.1 % at 20 steps per rise; far-end minimum within 1 % at 400', () => {
      const coarse = run(20);
      const plateau = probeTrace(coarse.record, 'vicNear')[Math.round(0.8e-9 / coarse.record.dtSample)];
      expect(Math.abs(plateau / 0.0627861 - 1)).toBeLessThan(1e-3);
      const fine = run(400);
      expect(Math.abs(Math.min(...probeTrace(fine.record, 'vicFar')) / -0.1505601 - 1)).toBeLessThan(0.01);
      expect(Math.abs(Math.max(...probeTrace(fine.record, 'vicNear')) / 0.0627861 - 1)).toBeLessThan(0.002);
    });

    // The odd mode (1.7236e8 m/s) is faster than either line alone (1/√(L11·C11) = 1.667e8 m/s): cells
    // sized from the self velocity run it at Courant 1.034 and diverge (Paul, FDTD chapter; Courant
    // limit per mode as in Taflove & Hagness, Computational Electrodynamics, ch. 2).
    it('the time step comes from the fastest mode: Courant 1 for the odd mode, the even mode below', () => {
      const res = run(20);
      const vOdd = modalAnalysis(inhomogeneousPair()).fastestVelocity;
      expect(vOdd).toBeCloseTo(1.7236e8, -4);
      for (const seg of res.discretization.segments) {
        expect(seg.coupled).toBe('pair');
        expect(seg.delay).toBeCloseTo(0.1 / vOdd, 20);
        expect((vOdd * res.discretization.dt) / seg.cellLength).toBeLessThanOrEqual(1 + 1e-9);
        expect(seg.courant).toBeCloseTo(1, 6);
      }
      expect(res.discretization.dt * 1.667e8 * 1.034).toBeGreaterThan(res.discretization.segments[0].cellLength * 0.999);
    });
  });

  it('DC start: a lossy pair with a victim held at 1.2 V stays at its operating point', () => {
    const pair: CoupledLine = { ...inhomogeneousPair(), r: Float64Array.of(20, 0, 0, 20), g: Float64Array.of(1e-3, 0, 0, 1e-3) };
    const n = pairNet({ line: pair, length: 0.2, signal: stepSignal(1, 100e-12, 2e-9), rs: 40, rsVictim: 30, victimLevel: 1.2, rt: [100, 100], duration: 1.5e-9 });
    n.driver.signal = { kind: 'step', from: 0.7, to: 1, start: 2e-9, rise: 100e-12 };
    const res = simulate(n);
    // Victim: 1.2 V behind 30 Ω into 0.2 m of 20 Ω/m (4 Ω) and 100 Ω, leakage 0.2 mS over the line (a
    // small correction): the far end ≈ 1.2·100/134 ≈ 0.896 V; the run must hold whatever the DC solve gave.
    for (const name of ['aggNear', 'aggFar', 'vicNear', 'vicFar']) {
      const tr = probeTrace(res.record, name);
      expect(Math.max(...tr) - Math.min(...tr)).toBeLessThan(1e-12);
    }
    expect(probeTrace(res.record, 'vicFar')[0]).toBeCloseTo((1.2 * 100) / 134, 2);
  });

  it('refuses mismatched lengths, a segment coupled twice and off-diagonal R before allocating', () => {
    const n = pairNet({ line: { ...inhomogeneousPair(), r: Float64Array.of(1, 0.5, 0.5, 1) }, length: 0.1, signal: stepSignal(1, 1e-10), rs: 50, duration: 1e-9 });
    (n.nets![0].route[0] as { length: number }).length = 0.12;
    n.coupled!.push({ name: 'again', conductors: ['a', 'b'], line: inhomogeneousPair() });
    let err: NetError | undefined;
    try {
      compileNet(n);
    } catch (e) {
      err = e as NetError;
    }
    expect(err).toBeInstanceOf(NetError);
    const text = err!.problems.map((p) => `${p.path}: ${p.message}`).join('\n');
    expect(text).toMatch(/coupled\.pair: the conductors must have the same length: 'a' 0\.1 m, 'b' 0\.12 m/);
    expect(text).toMatch(/coupled\.again\.conductors\[0\]: 'a' is already a conductor of coupled section 'pair'/);
    expect(text).toMatch(/coupled\.pair\.r: off-diagonal R/);
  });

  it('the discretizer gives every conductor of a section the same cells', () => {
    const c = compileNet(pairNet({ line: inhomogeneousPair(), length: 0.1, signal: stepSignal(1, 1e-10), rs: 50, duration: 1e-9 }));
    const plan = discretize(c);
    expect(plan.segments[0].cells).toBe(plan.segments[1].cells);
    expect(plan.segments[0].cells).toBeGreaterThan(0);
  });
});
