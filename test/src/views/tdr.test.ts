// The simulated TDR against outside references:
// - Z = Z0·(1 + ρ)/(1 − ρ) and Γ = ±1 at open and shorted ends (Pozar, Microwave Engineering, ch. 2);
// - a 50 → 75 → 50 Ω route reads 75 Ω (±2 %) over the middle section, with its ends where they are
//   (± one resolution), distance taken at each segment's own velocity;
// - resolution d_min = v·t_r/4: discontinuities closer than half the rise time in round-trip time merge
//   (HP 54753A TDR plug-in user's guide, "TDR Fundamentals", rise time and distance resolution);
// - a shunt capacitance C on a matched line reflects ρ(t) whose area is −Z0·C/2 (the capacitive dip of
//   TDR application notes, e.g. Bogatin, Signal and Power Integrity — Simplified, TDR of a capacitive
//   discontinuity: from memory, not confirmed here). Derivation (ours, marked as such): at the junction the incoming line is
//   a Thevenin source 2V⁺ behind Z0 and the outgoing line a load Z0, so the node charges as
//   V⁺(1 − e^(−t/τ)) with τ = Z0·C/2; the reflected wave is V − V⁺ = −V⁺e^(−t/τ), whose integral is
//   −V⁺·Z0·C/2. A finite rise time convolves ρ with a unit-area kernel, so the area is unchanged.
import { describe, expect, it } from 'vitest';
import type { Net, RouteItem } from '../../../sim/model.js';
import { simulate } from '../../../sim/simulate.js';
import { Surface } from '../../../src/render/surface.js';
import { DEFAULT_TDR_Z0, drawTdr, segmentReadings, tdrCsv, tdrImpedanceDomain, tdrLossNote, tdrNet, tdrProfile, type TdrProfile } from '../../../src/views/tdr.js';
import { lineOf, net, part, stepSignal } from '../../support/nets.js';

const RISE = 35e-12;
const C0 = 299_792_458;
const line = (name: string, z0: number, tpd: number, length: number): RouteItem => ({ kind: 'line', name, line: lineOf(z0, tpd), length });

function profileOf(route: RouteItem[], receiver = [part({ r: 50 })], rise = RISE, z0?: number): { net: Net; p: TdrProfile } {
  const original = net({ signal: stepSignal(3.3, 1e-9, 2e-9), rs: 12, route, receiver, probes: [{ name: 'rx', at: 'receiver' }] });
  const n = tdrNet(original, { rise, z0 });
  return { net: n, p: tdrProfile(n, simulate(n)) };
}

/** Distance where the reading first crosses `level` after distance `from` (linear between samples). */
function crossing(p: TdrProfile, level: number, from: number, direction: 1 | -1): number {
  for (let i = 1; i < p.time.length; i++) {
    if (p.distance[i] < from) continue;
    const a = p.impedance[i - 1] - level, b = p.impedance[i] - level;
    if (direction * a < 0 && direction * b >= 0) return p.distance[i - 1] + ((p.distance[i] - p.distance[i - 1]) * a) / (a - b);
  }
  return NaN;
}

describe('tdrNet', () => {
  it('replaces the driver by a matched step, keeps route and receiver, probes the pin', () => {
    const route = [line('a', 60, 6e-9, 0.1), { kind: 'shunt' as const, name: 'via', parts: [part({ c: 1e-12 })] }, line('b', 45, 7e-9, 0.1)];
    const original = net({ signal: stepSignal(3.3, 1e-9), rs: 12, route, receiver: [part({ c: 3e-12 })] });
    const n = tdrNet(original, { rise: RISE });
    // 50 Ω by default, what TDR instruments use (common practice), not the first segment's 60 Ω
    expect(n.driver.resistance).toBe(DEFAULT_TDR_Z0);
    expect(DEFAULT_TDR_Z0).toBe(50);
    expect(n.driver.signal).toMatchObject({ kind: 'step', from: 0, to: 1, rise: RISE });
    expect(n.route).toBe(original.route);
    expect(n.receiver).toBe(original.receiver);
    expect(n.probes).toEqual([{ name: 'tdr', at: 'driver' }]);
    // long enough for the round trip (2 × 1.3 ns) and a margin
    expect(n.run.duration!).toBeGreaterThan(2 * (0.6e-9 + 0.7e-9) + 10 * RISE);
    expect(tdrNet(original, { rise: RISE, z0: 75 }).driver.resistance).toBe(75);
  });
});

describe('50 Ω → 75 Ω → 50 Ω', () => {
  // the 75 Ω section has another velocity (0.66 c against 0.5 c), so its far end is only found where it
  // is if distance is taken at the local velocity
  const tpd50 = 1 / (0.5 * C0), tpd75 = 1 / (0.66 * C0);
  const { p } = profileOf([line('in', 50, tpd50, 0.1), line('mid', 75, tpd75, 0.05), line('out', 50, tpd50, 0.1)]);

  it('states the resolution v·t_r/4 (HP 54753A guide)', () => {
    expect(p.resolution).toBeCloseTo((0.5 * C0 * RISE) / 4, 12);
    expect(p.segments[1].resolution).toBeCloseTo((0.66 * C0 * RISE) / 4, 12);
  });

  it('reads 75 Ω ± 2 % over the middle section, away from the edges of the reading', () => {
    // a junction blurs the reading over the step's whole ramp (t_r/0.8 of round-trip time), i.e.
    // ± v·(t_r/0.8)/4 = ± 1.25 resolutions around it
    const edge = 1.25 * p.segments[1].resolution;
    let n = 0;
    for (let i = 0; i < p.time.length; i++) {
      if (p.time[i] > p.segments[1].timeTo) break;
      if (p.distance[i] < 0.1 + edge || p.distance[i] > 0.15 - edge) continue;
      expect(Math.abs(p.impedance[i] - 75) / 75).toBeLessThan(0.02);
      n++;
    }
    expect(n).toBeGreaterThan(20);
    // and 50 Ω before it
    for (let i = 0; i < p.time.length && p.distance[i] < 0.1 - 1.25 * p.resolution; i++) expect(Math.abs(p.impedance[i] - 50)).toBeLessThan(0.5);
    expect(segmentReadings(p)[1].reading).toBeCloseTo(75, 0);
  });

  it('puts both ends of the 75 Ω section where they are, within one resolution', () => {
    const up = crossing(p, 62.5, 0.05, 1);
    expect(Math.abs(up - 0.1)).toBeLessThanOrEqual(p.segments[0].resolution);
    // the far end reads down towards 50 Ω (a little above it: what the first junction lets back through)
    const after = p.impedance[p.distance.findIndex((d) => d > 0.2)];
    const down = crossing(p, (75 + after) / 2, 0.12, -1);
    expect(Math.abs(down - 0.15)).toBeLessThanOrEqual(p.segments[1].resolution);
    // with one velocity for the whole route it would have been read 12 mm short: far outside the tolerance
    expect(Math.abs(0.1 + 0.05 * (0.5 / 0.66) - 0.15)).toBeGreaterThan(5 * p.segments[1].resolution);
  });
});

describe('ends of the line (Γ = +1 open, −1 short: Pozar ch. 2)', () => {
  it('an open end reads infinite impedance, a short reads zero, past the route end', () => {
    const open = profileOf([line('t', 50, 6e-9, 0.1)], []).p;
    const short = profileOf([line('t', 50, 6e-9, 0.1)], [part({ r: 0 })]).p;
    const late = (p: TdrProfile) => p.time.findIndex((t) => t > p.routeTime + 4 * RISE);
    expect(open.rho[late(open)]).toBeCloseTo(1, 3);
    expect(open.impedance[late(open)]).toBeGreaterThan(50 * 100);
    expect(short.rho[late(short)]).toBeCloseTo(-1, 3);
    expect(short.impedance[late(short)]).toBeLessThan(0.05);
    // the step from 50 Ω sits at the end of the line, within one resolution
    expect(Math.abs(crossing(open, 150, 0.05, 1) - 0.1)).toBeLessThanOrEqual(open.resolution);
  });
});

describe('a shunt capacitance', () => {
  it('dips with an area ∫ρ dτ = −Z0·C/2 (within 2 %)', () => {
    for (const c of [0.5e-12, 2e-12]) {
      const { p } = profileOf([line('a', 50, 6e-9, 0.1), { kind: 'shunt', name: 'via', parts: [part({ c })] }, line('b', 50, 6e-9, 0.1)]);
      // integrate ρ over the round trip between the two line halves' middles
      let area = 0;
      for (let i = 1; i < p.time.length; i++) {
        if (p.time[i] < 0.6e-9 || p.time[i] > 1.8e-9) continue;
        area += 0.5 * (p.rho[i] + p.rho[i - 1]) * (p.time[i] - p.time[i - 1]);
      }
      expect(area).toBeLessThan(0);
      expect(Math.abs(area / (-(50 * c) / 2) - 1)).toBeLessThan(0.02);
      // its deepest point sits at the capacitor, within one resolution plus half a rise time of travel
      let k = 0;
      for (let i = 0; i < p.time.length; i++) if (p.impedance[i] < p.impedance[k]) k = i;
      expect(Math.abs(p.distance[k] - 0.1)).toBeLessThanOrEqual(p.resolution + (RISE / 0.8 / 4) / 6e-9);
    }
  });

  it('two capacitors merge into one dip when closer than v·t_r/4, and show two when 4× farther (HP 54753A guide)', () => {
    const tpd = 6e-9;
    const dmin = (RISE / tpd) / 4;
    const minima = (gap: number) => {
      const { p } = profileOf([
        line('a', 50, tpd, 0.05),
        { kind: 'shunt', name: 'c1', parts: [part({ c: 0.3e-12 })] },
        line('gap', 50, tpd, gap),
        { kind: 'shunt', name: 'c2', parts: [part({ c: 0.3e-12 })] },
        line('b', 50, tpd, 0.05),
      ]);
      // dips: runs of readings below half the deepest point's depth
      let zmin = Infinity;
      for (const z of p.impedance) zmin = Math.min(zmin, z);
      const level = 50 - 0.5 * (50 - zmin);
      let count = 0;
      for (let i = 1; i < p.time.length; i++) if (p.impedance[i] < level && p.impedance[i - 1] >= level) count++;
      return count;
    };
    expect(minima(0.5 * dmin)).toBe(1);
    expect(minima(4 * dmin)).toBe(2);
  });
});

describe('output', () => {
  it('writes time_s,distance_m,impedance_ohm at full precision, inf for an open reading', () => {
    const { p } = profileOf([line('t', 50, 6e-9, 0.05)], []);
    const csv = tdrCsv(p).trimEnd().split('\n');
    expect(csv[0]).toBe('time_s,distance_m,impedance_ohm');
    expect(csv).toHaveLength(p.time.length + 1);
    const [t, d, z] = csv[1].split(',').map(Number);
    expect([t, d, z]).toEqual([p.time[0], p.distance[0], p.impedance[0]]);
    expect(csv[csv.length - 1].endsWith(',inf') || Number(csv[csv.length - 1].split(',')[2]) > 1e4).toBe(true);
  });

  it('draws two panels that share the impedance scale, capped at 4 × Z_ref', () => {
    const { p } = profileOf([line('a', 50, 6e-9, 0.05), line('b', 75, 5e-9, 0.05)], []);
    const dom = tdrImpedanceDomain(p);
    expect(dom[0]).toBeLessThan(50);
    expect(dom[1]).toBeGreaterThan(75);
    expect(dom[1]).toBeLessThanOrEqual(4 * 50 * 1.25);
    const s = new Surface(1200, 900);
    const f = drawTdr(s, { x: 0, y: 0, w: 1200, h: 900 }, { title: 't', profile: p });
    expect(f.distance.y.domain).toEqual(f.time.y.domain);
    expect(f.distance.plot.y + f.distance.plot.h).toBeLessThan(f.time.plot.y);
    expect(f.distance.xTicks.unit).toBe('mm');
    expect(f.time.xTicks.unit).toMatch(/s$/);
  });
});

describe('a lossy line', () => {
  it('reads Z0 + R′·x at distance x (low-loss expansion of Z0(s) = √((R′ + sL′)/(sC′)), Pozar §2.7), within 1 % of the tilt', () => {
    // 50 Ω, R′ = 5 Ω/m, 4 m open line, 1 ns step: the first-order reading climbs 5 Ω per metre
    const { p } = profileOf([{ kind: 'line', name: 'wire', line: lineOf(50, 5e-9, 5), length: 4 }], [], 1e-9);
    for (const x of [1, 2, 3]) {
      const i = p.distance.findIndex((d) => d >= x);
      expect(Math.abs(p.impedance[i] - (50 + 5 * x))).toBeLessThan(0.01 * 5 * x);
    }
    // the plot and the terminal say so, with the readings near the ends
    const note = tdrLossNote(p)!;
    expect(note).toMatch(/Loss tilts the reading/);
    expect(note).toMatch(/'wire' reads 5\d(\.\d+)? Ω near its start and 6\d(\.\d+)? Ω near its end \(R′ℓ = 20 Ω at DC\)/);
    expect(tdrLossNote(profileOf([line('t', 50, 6e-9, 0.1)]).p)).toBeNull();
  });
});

describe('labels', () => {
  it('keeps segment names, Z_ref and "past the receiver" off the curve', () => {
    // a 20 Ω section reads near the bottom of the scale, where the segment labels go first
    const { p } = profileOf([line('in', 50, 6e-9, 0.05), line('low', 20, 6e-9, 0.05), line('out', 50, 6e-9, 0.05)], []);
    const s = new Surface(1200, 900);
    const d = drawTdr(s, { x: 0, y: 0, w: 1200, h: 900 }, { title: 't', profile: p });
    expect(d.labels.map((l) => l.text)).toEqual(expect.arrayContaining(['Z_ref 50 Ω', 'past the receiver', 'low · 20 Ω']));
    for (const { panel, rect } of d.labels) {
      const f = d[panel];
      const xs = panel === 'distance' ? p.distance : p.time;
      for (let i = 0; i < xs.length; i++) {
        const px = f.x.map(xs[i]), py = f.y.map(p.impedance[i]);
        const inside = px >= rect.x && px <= rect.x + rect.w && py >= rect.y && py <= rect.y + rect.h;
        expect(inside, `${panel} label at (${rect.x}, ${rect.y}) over the curve at sample ${i}`).toBe(false);
      }
    }
  });
});

describe('a branched net: the profile along one path', () => {
  // A step on a 50 Ω line meeting two more 50 Ω lines at a T reflects Γ = (25 − 50)/(25 + 50) = −1/3,
  // so the reading past the branch point is Z_ref·(1 + ρ)/(1 − ρ) = 25 Ω, the two lines in parallel
  // (Pozar, Microwave Engineering, ch. 2), until the open stub's reflection returns: it adds
  // (2/3)·(+1)·(2/3) = 4/9 of the incident wave, ρ = −1/3 + 4/9 = 1/9, Z = 50·(10/9)/(8/9) = 62.5 Ω.
  const tpd = 6.25e-9;
  const stub = (): Net =>
    net({
      signal: stepSignal(1, 1e-9, 1e-9),
      rs: 50,
      route: [
        line('near', 50, tpd, 0.03),
        { kind: 'branch', name: 'tap', branches: [{ route: [line('stub', 50, tpd, 0.04)], receiver: { name: 'tp', parts: [] } }] },
        line('far', 50, tpd, 0.05),
      ],
      receiver: [part({ r: 50 })],
      receiverName: 'radio',
      probes: [{ name: 'rx', at: 'receiver' }],
    });

  it('reads 25 Ω past the T and 62.5 Ω once the open stub answers, on either path; marks the branch point', () => {
    const n = tdrNet(stub(), { rise: RISE });
    const res = simulate(n);
    for (const path of ['radio', 'tp']) {
      const p = tdrProfile(n, res, path);
      expect(p.path).toEqual({ receiver: path, receivers: ['radio', 'tp'] });
      const at = (tau: number) => p.impedance[p.time.findIndex((t) => t >= tau)];
      expect(at(0.2e-9)).toBeCloseTo(50, 1);
      // branch point at 2·0.1875 = 0.375 ns of round trip; the stub answers 2·0.25 ns later
      expect(Math.abs(at(0.6e-9) - 25) / 25).toBeLessThan(0.02);
      expect(Math.abs(at(1.0e-9) - 62.5) / 62.5).toBeLessThan(0.02);
      const place = p.places.find((pl) => pl.kind === 'branch')!;
      expect(place.label).toBe(path === 'radio' ? 'tap ∥ stub' : 'tap ∥ far');
      expect(place.distance).toBeCloseTo(0.03, 12);
      expect(p.segments.map((s) => s.name)).toEqual(path === 'radio' ? ['near', 'far'] : ['near', 'stub']);
    }
    expect(() => tdrProfile(n, res, 'nowhere')).toThrow(/no receiver named 'nowhere' \(receivers: radio, tp\)/);
  });
});
