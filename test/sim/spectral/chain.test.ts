// Building blocks of the spectral solver: per-unit-length models, the chain sweep, the DC operating
// point and its edge cases (ideal shorts, floating nodes, rails).
import { describe, expect, it } from 'vitest';
import { NetError } from '../../../sim/errors.js';
import { fromMicrostrip, yPerLength, zPerLength, type FreqLine } from '../../../sim/lines/freq-model.js';
import type { LineRLGC } from '../../../sim/model.js';
import { transferFunctions } from '../../../sim/spectral/chain.js';
import { dcOperatingPoint } from '../../../sim/spectral/dc.js';
import { perLength, type Complex } from '../../../sim/spectral/per-length.js';
import { lineOf, net, part, stepSignal } from '../../support/nets.js';

// small complex helpers for the closed forms
const c = (re: number, im = 0): Complex => ({ re, im });
const add = (a: Complex, b: Complex) => c(a.re + b.re, a.im + b.im);
const mul = (a: Complex, b: Complex) => c(a.re * b.re - a.im * b.im, a.re * b.im + a.im * b.re);
const div = (a: Complex, b: Complex) => {
  const d = b.re * b.re + b.im * b.im;
  return c((a.re * b.re + a.im * b.im) / d, (a.im * b.re - a.re * b.im) / d);
};
const sqrt = (a: Complex) => {
  const m = Math.hypot(a.re, a.im);
  const r = Math.sqrt((m + a.re) / 2);
  return c(r, r === 0 ? Math.sqrt(m) : a.im / (2 * r));
};
const exp = (a: Complex) => c(Math.exp(a.re) * Math.cos(a.im), Math.exp(a.re) * Math.sin(a.im));
const log = (a: Complex) => c(Math.log(Math.hypot(a.re, a.im)), Math.atan2(a.im, a.re));
const tanh = (a: Complex) => {
  const e = exp(c(-2 * a.re, -2 * a.im));
  return div(c(1 - e.re, -e.im), c(1 + e.re, e.im));
};
const relErr = (a: Complex, b: Complex) => Math.hypot(a.re - b.re, a.im - b.im) / Math.hypot(b.re, b.im);

describe('perLength', () => {
  it('is R′ + sL′ and G′ + sC′ for the constant model', () => {
    const p = perLength({ r: 2, l: 3e-7, g: 1e-3, c: 1.2e-10 }, c(1e7, 2e9));
    expect(p.z.re).toBeCloseTo(2 + 1e7 * 3e-7, 12);
    expect(p.z.im).toBeCloseTo(2e9 * 3e-7, 12);
    expect(p.y.re).toBeCloseTo(1e-3 + 1e7 * 1.2e-10, 15);
    expect(p.y.im).toBeCloseTo(2e9 * 1.2e-10, 15);
  });

  it('adds the auxiliary terms R_k·sτ/(1 + sτ) and C_k·s/(1 + sτ)', () => {
    const line: LineRLGC = { r: 1, l: 2e-7, g: 0, c: 1e-10, series: [{ value: 3, tau: 1e-10 }], shunt: [{ value: 2e-11, tau: 5e-11 }] };
    const s = c(3e8, 4e9);
    const p = perLength(line, s);
    const z = add(c(1 + s.re * 2e-7, s.im * 2e-7), div(mul(c(3), mul(s, c(1e-10))), add(c(1), mul(s, c(1e-10)))));
    const y = add(c(s.re * 1e-10, s.im * 1e-10), div(mul(c(2e-11), s), add(c(1), mul(s, c(5e-11)))));
    expect(relErr(p.z, z)).toBeLessThan(1e-14);
    expect(relErr(p.y, y)).toBeLessThan(1e-14);
  });

  const ms = fromMicrostrip({ width: 0.3e-3, height: 0.17e-3, thickness: 35e-6, er: 4.3, lossTangent: 0.02, at: 1e9 }).line;
  const rough = fromMicrostrip({ width: 0.3e-3, height: 0.17e-3, thickness: 35e-6, er: 4.3, lossTangent: 0.02, at: 1e9, roughness: 1e-6 }).line;
  const wide = (f: FreqLine): LineRLGC => ({ r: f.rdc, l: f.lInf, g: f.gdc, c: f.cInf, wideband: f });

  it('delegates to the wideband model on the jω axis', () => {
    for (const f of [ms, rough]) {
      for (const w of [0, 1e5, 2e8, 6e9, 1e11]) {
        const p = perLength(wide(f), c(0, w));
        expect(p.z).toEqual(zPerLength(f, w));
        expect(p.y).toEqual(yPerLength(f, w));
      }
    }
  });

  // Off the axis: the published formulas with jω → s, evaluated here with complex sqrt and log:
  // Z′ = sL∞ + √(R_dc² + K²s) (skin effect blended to R_dc, freq-model.ts) and the Djordjevic–Sarkar
  // ε(s) = ε∞ + Δε/(m2 − m1)·log10((ω2 + s)/(ω1 + s)) (IEEE T-EMC 43(4), 2001), Y′ = G + s·C(s).
  it('continues the wideband model analytically to s = σ + jω', () => {
    const m = ms.dielectric!.model;
    for (const s of [c(1e6, 0), c(3e8, 1e7), c(3e8, 6e9), c(1e9, 2e11)]) {
      const p = perLength(wide(ms), s);
      const z = add(mul(s, c(ms.lInf)), sqrt(add(c(ms.rdc * ms.rdc), mul(c(ms.skinK * ms.skinK), s))));
      const w1 = 2 * Math.PI * m.f1;
      const w2 = 2 * Math.PI * m.f2;
      const L = log(div(add(c(w2), s), add(c(w1), s)));
      const slope = m.deltaEps / Math.log10(m.f2 / m.f1);
      const eps = add(c(m.epsInf), mul(c(slope / Math.LN10), L));
      const cs = add(c(ms.cInf), mul(c(ms.dielectric!.cPerEps), add(eps, c(-m.epsInf))));
      const y = add(c(ms.gdc), mul(s, cs));
      expect(relErr(p.z, z)).toBeLessThan(1e-12);
      expect(relErr(p.y, y)).toBeLessThan(1e-12);
    }
  });

  // Hammerstad roughness K_r(ω) = 1 + (2/π)·atan(1.4·(Δ/δ)²), (Δ/δ)² = Δ²·ωµ0σ/2 (Hammerstad &
  // Jensen 1980; skin depth from Pozar), continued as 1 + (2/π)·atan(−j·b·s) with b = 1.4·Δ²µ0σ/2.
  it('continues the Hammerstad roughness factor analytically', () => {
    const b = (1.4 * 1e-6 * 1e-6 * 4e-7 * Math.PI * 5.8e7) / 2;
    for (const s of [c(3e8, 1e7), c(3e8, 6e9), c(1e9, 2e11)]) {
      const p = perLength(wide(rough), s);
      const q = perLength(wide(ms), s);
      // atan(z) = (1/2j)·ln((1 + jz)/(1 − jz)) with z = −j·b·s
      const bs = mul(c(b), s);
      const at = mul(c(0, -0.5), log(div(add(c(1), bs), add(c(1), mul(c(-1), bs)))));
      const kr = add(c(1), mul(c(2 / Math.PI), at));
      const zInt = add(q.z, mul(s, c(-ms.lInf)));
      expect(relErr(p.z, add(mul(s, c(ms.lInf)), mul(zInt, kr)))).toBeLessThan(1e-6);
    }
  });

  it('is analytic off the axis (Cauchy–Riemann: ∂/∂σ = −j·∂/∂ω)', () => {
    for (const [line, s] of [[ms, c(3e8, 1e8)], [ms, c(3e8, 6e9)], [rough, c(3e8, 6e9)]] as const) {
      const h = 1e-4 * Math.hypot(s.re, s.im);
      const at = (ds: Complex) => perLength(wide(line), add(s, ds));
      for (const k of ['z', 'y'] as const) {
        const a = at(c(h))[k];
        const b = at(c(-h))[k];
        const d = at(c(0, h))[k];
        const e = at(c(0, -h))[k];
        const ds = c((a.re - b.re) / (2 * h), (a.im - b.im) / (2 * h));
        const dw = c((d.re - e.re) / (2 * h), (d.im - e.im) / (2 * h));
        const minusJdw = c(dw.im, -dw.re);
        expect(relErr(ds, minusJdw)).toBeLessThan(1e-5);
      }
    }
  });

  it('is conjugate-symmetric: Z′(s̄) = conj Z′(s)', () => {
    const p = perLength(wide(rough), c(2e8, 5e9));
    const q = perLength(wide(rough), c(2e8, -5e9));
    expect(q.z).toEqual({ re: p.z.re, im: -p.z.im });
    expect(q.y).toEqual({ re: p.y.re, im: -p.y.im });
  });
});

describe('chain sweep', () => {
  // Lossy line terminated in Z_L: Z_in = Zc (Z_L + Zc tanh γℓ)/(Zc + Z_L tanh γℓ) and
  // V_L = V(0)/(cosh γℓ + (Zc/Z_L) sinh γℓ) (Pozar, Microwave Engineering, ch. 2). With a Thevenin
  // source, V(0)/Vs = Z_in/(Rs + Z_in). Checked to 1e−10 relative at several complex frequencies.
  it('matches the input-impedance and load-voltage closed forms of a lossy line', () => {
    const line = lineOf(50, 6e-9, 20, 4e-3);
    const length = 0.7;
    const rs = 15;
    const rl = 120;
    const n = net({
      signal: stepSignal(1, 1e-10),
      rs,
      route: [{ kind: 'line', name: 't', line, length }],
      receiver: [part({ r: rl })],
      probes: [
        { name: 'drv', at: 'driver' },
        { name: 'x', at: 'line', item: 't', position: 0.25 },
        { name: 'rx', at: 'receiver' },
      ],
    });
    const freqs = [c(1e6, 0), c(1e7, 3e8), c(1e7, 6e9), c(5e8, 4e10)];
    const h = transferFunctions(n, freqs);
    freqs.forEach((s, k) => {
      const z = add(c(line.r), mul(s, c(line.l)));
      const y = add(c(line.g), mul(s, c(line.c)));
      const g = sqrt(mul(z, y));
      const zc = sqrt(div(z, y));
      const vAt = (x: number) => {
        // V(x) ∝ cosh γ(ℓ−x) + (Zc/Z_L) sinh γ(ℓ−x), normalised by its value at x = 0
        const shape = (d: number) => {
          const ep = exp(mul(g, c(d)));
          const em = exp(mul(g, c(-d)));
          const ch = c((ep.re + em.re) / 2, (ep.im + em.im) / 2);
          const sh = c((ep.re - em.re) / 2, (ep.im - em.im) / 2);
          return add(ch, mul(div(zc, c(rl)), sh));
        };
        return div(shape(length - x), shape(length));
      };
      const th = tanh(mul(g, c(length)));
      const zin = div(mul(zc, add(c(rl), mul(zc, th))), add(zc, mul(c(rl), th)));
      const h0 = div(zin, add(c(rs), zin));
      expect(relErr(h[0][k], h0)).toBeLessThan(1e-10);
      expect(relErr(h[1][k], mul(h0, vAt(0.25)))).toBeLessThan(1e-10);
      expect(relErr(h[2][k], mul(h0, vAt(length)))).toBeLessThan(1e-10);
    });
  });

  it('keeps a very long, very lossy line finite (log-scaled sweep): matched, H_rx = ½e^(−γℓ)', () => {
    const r = 2000; // Heaviside line, α = R′/Z0 = 40 Np/m: αℓ = 1200 over 30 m, far beyond e^709
    const n = net({
      signal: stepSignal(1, 1e-10),
      rs: 50,
      route: [{ kind: 'line', name: 't', line: lineOf(50, 5e-9, r, r / 2500), length: 30 }],
      receiver: [part({ r: 50 })],
    });
    const [[drv], [rx]] = transferFunctions(n, [c(1e6, 1e9)]);
    expect(relErr(drv, c(0.5))).toBeLessThan(1e-12);
    expect(Number.isFinite(rx.re) && Number.isFinite(rx.im)).toBe(true);
    expect(Math.hypot(rx.re, rx.im)).toBe(0); // ½e^(−1200): underflows cleanly, no NaN
    const [[drv2], [rx2]] = transferFunctions({ ...n, route: [{ kind: 'line', name: 't', line: lineOf(50, 5e-9, r, r / 2500), length: 0.3 }] }, [c(1e6, 1e9)]);
    expect(relErr(drv2, c(0.5))).toBeLessThan(1e-12);
    // ½·e^(−αℓ)·e^(−sTD), α = R′/Z0 = 40/m, TD = 1.5 ns
    const expected = mul(c(0.5 * Math.exp(-40 * 0.3)), exp(mul(c(1e6, 1e9), c(-1.5e-9))));
    expect(relErr(rx2, expected)).toBeLessThan(1e-9);
  });

  // A line shorted at its far end (an ideal zero-ohm part) is a stub: Z_in = Z0·tanh(sTD) (Pozar,
  // ch. 2, the shorted lossless line, jω → s). Everything beyond the short is at 0 V.
  it('treats a zero-ohm shunt part as a short: stub input impedance, 0 V beyond', () => {
    const n = net({
      signal: stepSignal(1, 1e-10),
      rs: 30,
      route: [
        { kind: 'line', name: 'stub', line: lineOf(50, 5e-9), length: 0.2 },
        { kind: 'shunt', name: 'short', parts: [part({})] },
        { kind: 'series', name: 'r', part: part({ r: 10 }) },
      ],
      receiver: [part({ r: 75 })],
      probes: [
        { name: 'drv', at: 'driver' },
        { name: 'sh', at: 'shunt', item: 'short' },
        { name: 'after', at: 'series', item: 'r', side: 'out' },
        { name: 'rx', at: 'receiver' },
      ],
    });
    const s = c(2e7, 3e9);
    const [[drv], [sh], [after], [rx]] = transferFunctions(n, [s]);
    const zin = mul(c(50), tanh(mul(s, c(1e-9))));
    expect(relErr(drv, div(zin, add(c(30), zin)))).toBeLessThan(1e-12);
    for (const v of [sh, after, rx]) expect(Math.hypot(v.re, v.im)).toBe(0);
  });

  it('names problems: a missing item, a position off the line, an ideal source into a short', () => {
    const base = { signal: stepSignal(1, 1e-10), rs: 0, route: [{ kind: 'line' as const, name: 't', line: lineOf(50, 5e-9), length: 0.1 }] };
    expect(() => transferFunctions(net({ ...base, probes: [{ name: 'p', at: 'line', item: 'nope', position: 0 }] }), [c(1, 1)])).toThrow(NetError);
    expect(() => transferFunctions(net({ ...base, probes: [{ name: 'p', at: 'line', item: 't', position: 0.2 }] }), [c(1, 1)])).toThrow(/outside 't'/);
    expect(() => transferFunctions(net({ ...base, route: [{ kind: 'shunt', name: 'x', parts: [part({})] }] }), [c(1, 1)])).toThrow(/ideal source/);
  });
});

describe('DC operating point', () => {
  it('settles a split termination at its divider voltage (Ohm’s law: 3.3·330/550 = 1.98 V)', () => {
    const n = net({ signal: stepSignal(0, 1e-10), rs: 1e12, route: [{ kind: 'line', name: 't', line: lineOf(50, 5e-9, 1), length: 0.1 }], receiver: [part({ r: 220, rail: 3.3 }), part({ r: 330 })] });
    const [drv, rx] = dcOperatingPoint(n);
    expect(rx).toBeCloseTo(1.98, 9);
    expect(drv).toBeCloseTo(1.98, 9);
  });

  it('leaves a node with no DC path at 0 V and gives a node behind a coupling capacitor its rail', () => {
    const n = net({
      signal: stepSignal(0, 1e-10, 0, 2.5),
      rs: 25,
      route: [
        { kind: 'line', name: 'a', line: lineOf(50, 5e-9, 3, 1e-3), length: 0.2 },
        { kind: 'series', name: 'cap', part: part({ c: 100e-9 }) },
        { kind: 'line', name: 'b', line: lineOf(50, 5e-9), length: 0.2 },
      ],
      receiver: [part({ r: 50, rail: 1.2 }), part({ r: 50 })],
      probes: [
        { name: 'in', at: 'series', item: 'cap', side: 'in' },
        { name: 'out', at: 'series', item: 'cap', side: 'out' },
      ],
    });
    const [vin, vout] = dcOperatingPoint(n);
    expect(vout).toBeCloseTo(0.6, 12);
    // the driver side: 2.5 V through 25 Ω and 0.6 Ω of line into G′ℓ = 0.2 mS (closed form, Pozar ch. 2)
    const g = Math.sqrt(3 * 1e-3);
    const zc = Math.sqrt(3 / 1e-3);
    const zin = zc / Math.tanh(g * 0.2); // open end
    const v0 = (2.5 * zin) / (25 + zin);
    expect(vin).toBeCloseTo(v0 / Math.cosh(g * 0.2), 12);
    const floating = dcOperatingPoint({ ...n, receiver: [part({ c: 1e-12 })] });
    expect(floating[1]).toBe(0);
  });

  it('refuses two different ideal rails tied together', () => {
    const n = net({ signal: stepSignal(0, 1e-10), rs: 50, route: [{ kind: 'shunt', name: 'x', parts: [part({ rail: 1 }), part({ l: 1e-9, rail: 2 })] }] });
    expect(() => dcOperatingPoint(n)).toThrow(/ideal sources or rails/);
  });
});
