// Settled probe levels: the DC operating point for given source values, read at the probes.
// Every expected value is a DC voltage divider (Ohm's law and Thevenin's theorem).
import { describe, expect, it } from 'vitest';
import { settledProbeLevels } from '../../sim/settled.js';
import { simulate } from '../../sim/simulate.js';
import { probeTrace } from '../../sim/result.js';
import { lineOf, net, part, stepSignal } from '../support/nets.js';

describe('settledProbeLevels', () => {
  it('is the DC divider of a weak driver and a resistive receiver, at both ends of a lossless line', () => {
    // 3.3 V through 100 Ω into 1 kΩ: 3.3·1000/1100 = 3 V everywhere on the line (no series loss).
    const n = net({ signal: stepSignal(3.3, 1e-9), rs: 100, route: [{ kind: 'line', name: 'l', line: lineOf(50, 5e-9), length: 2 }], receiver: [part({ r: 1000 })] });
    const s = settledProbeLevels(n, [0, 3.3]);
    expect(s.probes).toEqual(['driver', 'receiver']);
    expect(s.source).toEqual([0, 3.3]);
    for (const p of [0, 1]) {
      expect(s.volts[p]![0]).toBeCloseTo(0, 14);
      expect(s.volts[p]![1]).toBeCloseTo(3, 12);
    }
  });

  it('follows the series resistance of a lossy line to a probe part-way along it', () => {
    // 5 V, 10 Ω driver, 12 m of 0.09 Ω/m cable (1.08 Ω), 1 kΩ receiver; probe at 6 m:
    // current 5/1011.08 A, probe voltage = current·(1000 + 0.54 Ω).
    const n = net({
      signal: stepSignal(5, 4e-9),
      rs: 10,
      route: [{ kind: 'line', name: 'cable', line: lineOf(75, 5.05e-9, 0.09), length: 12 }],
      receiver: [part({ r: 1000 })],
      probes: [{ name: 'mid', at: 'line', item: 'cable', position: 6 }, { name: 'rx', at: 'receiver' }],
    });
    const s = settledProbeLevels(n, [5]);
    const i = 5 / 1011.08;
    expect(s.volts[0]![0]).toBeCloseTo(i * 1000.54, 9);
    expect(s.volts[1]![0]).toBeCloseTo(i * 1000, 9);
  });

  it('is affine in the source value with a split termination to a rail', () => {
    // 220 Ω to 3.3 V and 330 Ω to ground: Thevenin 1.98 V behind 132 Ω. With a 25 Ω driver at s volts
    // the receiver sits at 1.98 + (s − 1.98)·132/157.
    const n = net({ signal: stepSignal(3.3, 1e-9), rs: 25, route: [{ kind: 'line', name: 'l', line: lineOf(50, 6e-9), length: 0.1 }], receiver: [part({ r: 220, rail: 3.3 }), part({ r: 330 })] });
    const source = [0, 1.2, 3.3];
    const s = settledProbeLevels(n, source);
    source.forEach((v, k) => expect(s.volts[1]![k]).toBeCloseTo(1.98 + ((v - 1.98) * 132) / 157, 12));
  });

  it('does not follow the source through a series capacitor (no DC path)', () => {
    const n = net({
      signal: stepSignal(1, 1e-9),
      rs: 50,
      route: [
        { kind: 'series', name: 'cap', part: part({ c: 100e-9 }) },
        { kind: 'line', name: 'l', line: lineOf(50, 6e-9), length: 0.1 },
      ],
      receiver: [part({ r: 50 })],
    });
    const s = settledProbeLevels(n, [0, 1]);
    expect(s.volts[0]).toEqual([0, 1]); // the driver pin sees no load at DC
    expect(s.volts[1]).toEqual([0, 0]);
  });

  it('is where the simulated waveform ends once the reflections have died down', () => {
    // 40 Ω driver, 50 Ω line, 200 Ω load: Γs·Γl = (−1/9)(3/5), the reflections shrink 15× per round
    // trip, so after 20 round trips the waveform sits on the divider 200/240 of the source.
    const n = net({ signal: stepSignal(1, 0.5e-9), rs: 40, route: [{ kind: 'line', name: 'l', line: lineOf(50, 5e-9), length: 0.2 }], receiver: [part({ r: 200 })], duration: 40e-9 });
    const res = simulate(n);
    const s = settledProbeLevels(n, [1], res.discretization);
    for (const p of [0, 1]) {
      const v = probeTrace(res.record, p);
      expect(s.volts[p]![0]).toBeCloseTo(200 / 240, 12);
      expect(Math.abs(v[v.length - 1]! - s.volts[p]![0]!)).toBeLessThan(1e-9);
    }
  });
});
