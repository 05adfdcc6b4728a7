// Branched nets in the engine, against outside references.
import { describe, expect, it } from 'vitest';
import type { LineRLGC, Part, ProbeSpec } from '../../sim/model.js';
import { probeTrace } from '../../sim/result.js';
import { simulate } from '../../sim/simulate.js';
import { signalFunction } from '../../sim/signals.js';
import { branch, line, lineOf, net, part, stepSignal } from '../support/nets.js';

const rx = (name: string): ProbeSpec => ({ name, at: 'receiver', receiver: name });

describe('a tree is the chain it reduces to', () => {
  // The same net written two ways: a chain driver → a → b → load, and a tree whose main route ends at
  // the junction (an open receiver there adds nothing) with one branch b → load. The engine numbers
  // both the same way, so the records are equal bit for bit.
  it('a tree with one branch equals the same chain exactly', () => {
    const a = line('a', lineOf(60, 6e-9, 3), 0.07);
    const b = line('b', lineOf(45, 5e-9, 0, 1e-4), 0.11);
    const load = [part({ r: 80 }), part({ c: 2e-12 })];
    const common = { signal: stepSignal(1, 100e-12, 50e-12), rs: 20, duration: 4e-9 };
    const chain = simulate(net({ ...common, route: [a, b], receiver: load, probes: [{ name: 'tx', at: 'driver' }, { name: 'mid', at: 'line', item: 'b', position: 0.05 }, { name: 'rx', at: 'receiver' }] }));
    const tree = simulate(
      net({
        ...common,
        route: [a, branch('tee', { route: [b], receiver: 'rx', parts: load })],
        probes: [{ name: 'tx', at: 'driver' }, { name: 'mid', at: 'line', item: 'b', position: 0.05 }, rx('rx')],
      }),
    );
    expect(tree.discretization.nodes).toBe(chain.discretization.nodes);
    expect(Array.from(tree.record.values.data)).toEqual(Array.from(chain.record.values.data));
  });

  // Two identical branches driven at one node carry identical voltages and currents at every point
  // (symmetry), so joining their corresponding points changes nothing: the pair is one line with the
  // two lines' series elements in parallel and shunt elements summed — L′/2, R′/2, C′·2, G′·2, i.e.
  // Z0/2 with the same delay — ending in the two loads in parallel (twice the load admittance). The
  // leapfrog update of the pair and of the merged line is the same equation (currents add, node
  // charges add), so the records agree to rounding.
  it('two identical branches equal one branch of Z0/2 with twice the load admittance', () => {
    const arm: LineRLGC = lineOf(70, 6e-9, 4, 2e-4);
    const half: LineRLGC = { l: arm.l / 2, c: arm.c * 2, r: arm.r / 2, g: arm.g * 2 };
    const load: Part[] = [part({ r: 90 }), part({ r: 10, c: 3e-12 })];
    const doubled: Part[] = [part({ r: 45 }), part({ r: 5, c: 6e-12 })];
    const common = { signal: stepSignal(1, 80e-12, 40e-12), rs: 15, duration: 5e-9, receiver: [part({ r: 50 })] };
    const trunk = line('trunk', lineOf(50, 6e-9), 0.05);
    const pair = simulate(
      net({
        ...common,
        route: [trunk, branch('hub', { route: [line('p', arm, 0.08)], receiver: 'rp', parts: load }, { route: [line('q', arm, 0.08)], receiver: 'rq', parts: load }), line('tail', lineOf(50, 6e-9), 0.03)],
        probes: [{ name: 'tx', at: 'driver' }, { name: 'j', at: 'branch', item: 'hub' }, rx('rp'), rx('rq'), { name: 'end', at: 'receiver' }],
      }),
    );
    const one = simulate(
      net({
        ...common,
        route: [trunk, branch('hub', { route: [line('p', half, 0.08)], receiver: 'rp', parts: doubled }), line('tail', lineOf(50, 6e-9), 0.03)],
        probes: [{ name: 'tx', at: 'driver' }, { name: 'j', at: 'branch', item: 'hub' }, rx('rp'), { name: 'end', at: 'receiver' }],
      }),
    );
    const names = ['tx', 'j', 'rp', 'end'];
    for (const name of names) {
      const a = probeTrace(pair.record, name);
      const b = probeTrace(one.record, name);
      let worst = 0;
      for (let i = 0; i < a.length; i++) worst = Math.max(worst, Math.abs(a[i] - b[i]));
      expect(worst, name).toBeLessThan(1e-12);
    }
    // and the two arms of the pair are the same
    expect(Array.from(probeTrace(pair.record, 'rq'))).toEqual(Array.from(probeTrace(pair.record, 'rp')));
  });
});

describe('junction reflection and transmission: first plateaus from the lattice method', () => {
  // A wave meeting a junction of lines Z1 → (Z2 ∥ Z3 …) reflects Γ = (Zp − Z1)/(Zp + Z1) and sends
  // 1 + Γ into every other line (the voltage is common to all lines at the node); a matched source
  // launches V/2 and matched ends reflect nothing (Pozar, Microwave Engineering, 4th ed., ch. 2;
  // Johnson & Graham, High-Speed Digital Design, §4). Plateaus: the driver pin V/2 until 2·TD1, then
  // V/2·(1 + Γ); each receiver V/2·(1 + Γ) from TD1 + TD_arm on.
  const cases = [
    // three equal lines at a T: Γ = (25 − 50)/75 = −1/3, transmission 2/3
    { name: 'three equal 50 Ω lines at a T: Γ = −1/3, 1 + Γ = 2/3', arms: [50, 50], gamma: -1 / 3 },
    { name: 'a 50 Ω trunk into 75 Ω and 100 Ω arms', arms: [75, 100], gamma: (7500 / 175 - 50) / (7500 / 175 + 50) },
    { name: 'a 50 Ω trunk into three 150 Ω arms (a matched star)', arms: [150, 150, 150], gamma: 0 },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const tpd = 5e-9;
      const td1 = 0.1 * tpd;
      const arms = c.arms.map((z, k) => ({ route: [line(`arm${k}`, lineOf(z, tpd), 0.06 + 0.02 * k)], receiver: `r${k}`, parts: [part({ r: z })] }));
      const res = simulate(
        net({
          signal: stepSignal(1, 50e-12),
          rs: 50,
          route: [line('trunk', lineOf(50, tpd), 0.1), branch('tee', ...arms)],
          probes: [{ name: 'tx', at: 'driver' }, ...arms.map((a) => rx(a.receiver))],
          duration: 3e-9,
        }),
      );
      const dt = res.record.dtSample;
      const at = (name: string, t: number) => probeTrace(res.record, name)[Math.round(t / dt)];
      const ramp = 50e-12 / 0.8;
      // driver pin: V/2 before the reflection returns, then V/2·(1 + Γ)
      expect(Math.abs(at('tx', ramp + td1) - 0.5)).toBeLessThan(2e-3);
      expect(Math.abs(at('tx', 2 * td1 + ramp + 0.2e-9) - 0.5 * (1 + c.gamma))).toBeLessThan(2e-3);
      arms.forEach((a, k) => {
        const tdArm = (0.06 + 0.02 * k) * tpd;
        expect(Math.abs(at(a.receiver, td1 + tdArm - 0.05e-9))).toBeLessThan(2e-3); // before the wave
        expect(Math.abs(at(a.receiver, td1 + tdArm + ramp + 0.1e-9) - 0.5 * (1 + c.gamma))).toBeLessThan(2e-3);
      });
    });
  }
});

describe('a short open stub behaves like its capacitance', () => {
  // Common practice (signal-integrity rule of thumb): a stub whose round-trip delay is well below the
  // rise time acts as a lumped capacitance equal to its total C′ℓ. The engine's response with the stub
  // must approach the response with that capacitor as the stub shortens.
  it('the difference from the lumped C shrinks with the stub and is under 1 % of swing at round trip = rise/10', () => {
    const rise = 200e-12;
    const tpd = 6e-9;
    const stubLine = lineOf(60, tpd);
    const trunk = (name: string) => line(name, lineOf(50, tpd), 0.1);
    const errors = [0.5, 0.25, 0.1].map((fraction) => {
      const len = (fraction * rise) / (2 * tpd);
      const common = { signal: stepSignal(1, rise, 50e-12), rs: 50, receiver: [part({ r: 50 })], duration: 3e-9, cellsPerRise: 40 };
      const withStub = simulate(net({ ...common, route: [trunk('a'), branch('tp', { route: [line('stub', stubLine, len)], receiver: 'open' }), trunk('b')] }));
      const withC = simulate(net({ ...common, route: [trunk('a'), { kind: 'shunt', name: 'c', parts: [part({ c: stubLine.c * len })] }, trunk('b')] }));
      const a = probeTrace(withStub.record, 'receiver');
      const b = probeTrace(withC.record, 'receiver');
      let worst = 0;
      for (let i = 0; i < Math.min(a.length, b.length); i++) worst = Math.max(worst, Math.abs(a[i] - b[i]));
      return worst;
    });
    expect(errors[1]).toBeLessThan(errors[0]);
    expect(errors[2]).toBeLessThan(errors[1]);
    expect(errors[2]).toBeLessThan(0.01);
  });
});

describe('energy balance on a tree', () => {
  // Conservation of energy on lossless lines with resistive ends (Poynting's theorem for TEM lines;
  // Ramo, Whinnery & Van Duzer): what the source delivers equals what Rs and the loads dissipate plus
  // what the lines store at the end, ½C′ℓV² + ½L′ℓI² per segment at the settled state.
  it('source energy = dissipated + stored within 0.1 %', () => {
    const rs = 30;
    const loads = { main: 120, s1: 75, s2: 200 };
    const tpd = 5e-9;
    const lines = { trunk: lineOf(50, tpd), a: lineOf(60, tpd), b: lineOf(80, tpd), c: lineOf(40, tpd) };
    const len = { trunk: 0.2, a: 0.15, b: 0.1, c: 0.12 };
    const signal = stepSignal(1, 0.2e-9, 0.1e-9);
    const res = simulate(
      net({
        signal,
        rs,
        route: [line('trunk', lines.trunk, len.trunk), branch('tee', { route: [line('b', lines.b, len.b)], receiver: 's1', parts: [part({ r: loads.s1 })] }, { route: [line('c', lines.c, len.c)], receiver: 's2', parts: [part({ r: loads.s2 })] }), line('a', lines.a, len.a)],
        receiver: [part({ r: loads.main })],
        probes: [{ name: 'tx', at: 'driver' }, { name: 'main', at: 'receiver' }, rx('s1'), rx('s2')],
        duration: 60e-9,
      }),
    );
    const dts = res.record.dtSample;
    const src = signalFunction(signal);
    const tx = probeTrace(res.record, 'tx');
    const v = { main: probeTrace(res.record, 'main'), s1: probeTrace(res.record, 's1'), s2: probeTrace(res.record, 's2') };
    const power = (k: number) => {
      const i0 = (src(k * dts) - tx[k]) / rs;
      const lost = i0 * i0 * rs + v.main[k] ** 2 / loads.main + v.s1[k] ** 2 / loads.s1 + v.s2[k] ** 2 / loads.s2;
      return { supplied: src(k * dts) * i0, lost };
    };
    let supplied = 0;
    let lost = 0;
    for (let k = 1; k < tx.length; k++) {
      const a = power(k - 1);
      const b = power(k);
      supplied += ((a.supplied + b.supplied) / 2) * dts;
      lost += ((a.lost + b.lost) / 2) * dts;
    }
    // settled state: every lossless line at the node voltage, carrying the current of the loads beyond it
    const rl = 1 / (1 / loads.main + 1 / loads.s1 + 1 / loads.s2);
    const vdc = rl / (rs + rl);
    const current = { trunk: vdc / rl, a: vdc / loads.main, b: vdc / loads.s1, c: vdc / loads.s2 };
    let stored = 0;
    for (const k of ['trunk', 'a', 'b', 'c'] as const) stored += 0.5 * lines[k].c * len[k] * vdc * vdc + 0.5 * lines[k].l * len[k] * current[k] ** 2;
    expect(Math.abs(supplied - (lost + stored)) / supplied).toBeLessThan(1e-3);
  });
});
