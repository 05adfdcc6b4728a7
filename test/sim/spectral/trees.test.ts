// The spectral solver on branched nets (each line's two-port stamped into a nodal matrix), and the
// time-domain engine against it on trees.
import { describe, expect, it } from 'vitest';
import { fromMicrostrip, type FreqLine } from '../../../sim/lines/freq-model.js';
import type { LineRLGC, Net, ProbeSpec } from '../../../sim/model.js';
import { simulate } from '../../../sim/simulate.js';
import { compareRecords } from '../../../sim/spectral/compare.js';
import { dcOperatingPoint } from '../../../sim/spectral/dc.js';
import { transferFunctions } from '../../../sim/spectral/nodal.js';
import { spectralRun } from '../../../sim/spectral/response.js';
import { branch, line, lineOf, net, part, stepSignal } from '../../support/nets.js';

const rx = (name: string): ProbeSpec => ({ name, at: 'receiver', receiver: name });

describe('an open stub on a matched trunk: the quarter-wave notch', () => {
  // A stub of length ℓ open at its end presents Y = j·Y0·tan(βℓ) at the junction (Pozar, Microwave
  // Engineering, 4th ed., §2.3, the lossless terminated line with Z_L = ∞). On a trunk matched at
  // both ends (source and load Z0), a shunt admittance Y gives S21 = 2/(2 + Y/Y0) (the ABCD of a
  // shunt element in a Z0 system, Pozar Table 4.2). With ℓ = 10 mm at v = 1.5e8 m/s:
  //   f = v/(8ℓ) = 1.875 GHz: βℓ = π/4, Y/Y0 = j, S21 = 2/(2 + j), |S21| = 2/√5 = 0.8944;
  //   f = v/(4ℓ) = 3.75 GHz: βℓ = π/2, the stub is a short at the trunk, S21 = 0 (the notch).
  // The solver gives V_rx/Vs; with a matched source the incident wave is Vs/2, so S21 = 2·V_rx/Vs.
  const z0 = 50;
  const tpd = 1 / 1.5e8;
  const n = net({
    signal: stepSignal(1, 10e-12),
    rs: z0,
    route: [line('in', lineOf(z0, tpd), 0.02), branch('tp', { route: [line('stub', lineOf(z0, tpd), 0.01)], receiver: 'open' }), line('out', lineOf(z0, tpd), 0.03)],
    receiver: [part({ r: z0 })],
    probes: [{ name: 'rx', at: 'receiver' }],
  });
  const s21 = (sr: number, f: number) => {
    const [[h]] = transferFunctions(n, [{ re: sr, im: 2 * Math.PI * f }]);
    return { re: 2 * h.re, im: 2 * h.im };
  };

  it('|S21| = 2/√5 at 1.875 GHz', () => {
    const s = s21(0, 1.875e9);
    expect(Math.hypot(s.re, s.im)).toBeCloseTo(2 / Math.sqrt(5), 9);
  });

  it('notches at v/(4ℓ) = 3.75 GHz and nowhere else between 1 and 6 GHz', () => {
    // just off the jω axis (the exact notch is a zero of the stub's input impedance)
    expect(Math.hypot(s21(1, 3.75e9).re, s21(1, 3.75e9).im)).toBeLessThan(1e-6);
    let fmin = 0;
    let min = Infinity;
    for (let f = 1e9; f <= 6e9; f += 5e6) {
      const s = s21(0, f);
      const m = Math.hypot(s.re, s.im);
      if (m < min) [min, fmin] = [m, f];
    }
    expect(Math.abs(fmin - 3.75e9)).toBeLessThanOrEqual(5e6);
  });
});

describe('spectral DC operating point on a tree', () => {
  // A 2 V source behind 20 Ω; the trunk of 1 Ω (R′ℓ) splits into arms of 2 Ω and 3 Ω ending in 100 Ω
  // and 50 Ω to ground (lines without G′ are resistors at DC): series and parallel resistances by Ohm's law.
  it('gives every receiver its divider voltage', () => {
    const n = net({
      signal: stepSignal(0, 1e-10, 1e-9, 2),
      rs: 20,
      route: [line('trunk', lineOf(50, 5e-9, 10), 0.1), branch('tee', { route: [line('a', lineOf(50, 5e-9, 20), 0.1)], receiver: 'ra', parts: [part({ r: 100 })] })],
      receiver: [],
      probes: [rx('ra'), { name: 'j', at: 'branch', item: 'tee' }],
    });
    const withB = {
      ...n,
      route: [...n.route.slice(0, 1), branch('tee', { route: [line('a', lineOf(50, 5e-9, 20), 0.1)], receiver: 'ra', parts: [part({ r: 100 })] }, { route: [line('b', lineOf(50, 5e-9, 30), 0.1)], receiver: 'rb', parts: [part({ r: 50 })] })],
      probes: [...n.probes, rx('rb')],
    };
    const [va, vj, vb] = dcOperatingPoint(withB);
    const rArms = 1 / (1 / 102 + 1 / 53);
    const vJ = (2 * rArms) / (20 + 1 + rArms);
    expect(vj).toBeCloseTo(vJ, 12);
    expect(va).toBeCloseTo((vJ * 100) / 102, 12);
    expect(vb).toBeCloseTo((vJ * 50) / 53, 12);
  });
});

describe('engine against the spectral solver on trees', () => {
  // The cross-check of branched nets: a daisy chain with an open test-point stub and a star
  // arm, lossless and lossy (frequency-dependent loss from a microstrip geometry), every probe within
  // 0.5 % of swing. The stub's quarter-wave notch sits inside the edge's band (stub 12 mm at about
  // 6.7 ns/m: 3.1 GHz against a 100 ps edge's 3.5 GHz knee), so the stub shapes the receivers' edges.
  function tree(trunk: LineRLGC, stub: LineRLGC, arm: LineRLGC): Net {
    return net({
      signal: stepSignal(1, 100e-12, 0.2e-9),
      rs: 30,
      route: [
        line('t1', trunk, 0.06),
        branch('tp', { route: [line('stub', stub, 0.012)], receiver: 'testpoint' }),
        line('t2', trunk, 0.04),
        branch('hub', { route: [line('arm', arm, 0.05), { kind: 'series', name: 'rs2', part: part({ r: 10 }) }], receiver: 'dev2', parts: [part({ c: 2e-12 }), part({ r: 300 })] }),
        line('t3', trunk, 0.03),
      ],
      receiver: [part({ r: 60 }), part({ c: 1.5e-12 })],
      probes: [{ name: 'drv', at: 'driver' }, { name: 'mid', at: 'line', item: 't2', position: 0.02 }, rx('testpoint'), rx('dev2'), { name: 'end', at: 'receiver' }],
      duration: 8e-9,
    });
  }

  it('a lossless tree agrees within 0.5 % of swing at every probe', () => {
    const n = tree(lineOf(55, 6.7e-9), lineOf(55, 6.7e-9), lineOf(70, 6.7e-9));
    const td = simulate(n);
    const sp = spectralRun(n, { dtSample: td.record.dtSample, samples: td.record.values.shape[1] });
    const diff = compareRecords(td.record, sp.record, 1);
    expect(diff.map((d) => d.name)).toEqual(['drv', 'mid', 'testpoint', 'dev2', 'end']);
    for (const d of diff) expect(d.percentOfSwing, d.name).toBeLessThan(0.5);
  });

  it('a tree of lossy microstrip (skin effect and dielectric loss) agrees within 0.5 % of swing', () => {
    const asLine = (f: FreqLine): LineRLGC => ({ r: f.rdc, l: f.lInf, g: f.gdc, c: f.cInf, wideband: f });
    const ms = (w: number) => asLine(fromMicrostrip({ width: w, height: 127e-6, thickness: 35e-6, er: 4.3, lossTangent: 0.02, at: 1e9 }).line);
    const n = tree(ms(200e-6), ms(200e-6), ms(120e-6));
    const td = simulate(n);
    const sp = spectralRun(n, { dtSample: td.record.dtSample, samples: td.record.values.shape[1] });
    for (const d of compareRecords(td.record, sp.record, 1)) expect(d.percentOfSwing, d.name).toBeLessThan(0.5);
  });
});
