// The bounce view: the numbers it prints, the probes it needs, and what it draws.
// Printed amplitudes and coefficients are checked against the lattice formulas
// V⁺ = V_S·Z0/(R_S + Z0) and Γ = (Z − Z0)/(Z + Z0) (Pozar, Microwave Engineering, ch. 2), recomputed here.
import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import type { Net } from '../../../sim/model.js';
import { simulate } from '../../../sim/simulate.js';
import { hexToRgb } from '../../../src/render/palette.js';
import { encodePng, Surface } from '../../../src/render/surface.js';
import { BOUNCE_STYLE, bounceLabels, drawBounce, endProbeIndices, latticeDiagram, renderBounce, withEndProbes } from '../../../src/views/bounce.js';
import { lineOf, net, part, stepSignal } from '../../support/nets.js';

/** "+833 mV" → 0.833, "−1.25 V" → −1.25. */
function parseVolts(s: string): number {
  const m = /^([+\u2212-]?)([\d.]+) (m|µ)?V$/.exec(s);
  if (!m) throw new Error(`not a voltage label: ${s}`);
  const k = m[3] === 'm' ? 1e-3 : m[3] === 'µ' ? 1e-6 : 1;
  return (m[1] === '\u2212' || m[1] === '-' ? -1 : 1) * Number(m[2]) * k;
}
const parseSigned = (s: string) => Number(s.replace('\u2212', '-').replace('+', ''));
/** `label` shows `value` to 3 significant digits: off by at most half a unit in the third digit. */
function printsValue(label: string, value: number): void {
  const half = 0.5 * Math.pow(10, Math.floor(Math.log10(Math.abs(value))) - 2);
  expect(Math.abs(parseVolts(label) - value)).toBeLessThanOrEqual(half * (1 + 1e-9));
}

const RS = 14, Z0 = 55, Z1 = 75, RL = 200, VS = 3.3;
const twoSegments = (): Net =>
  net({
    signal: stepSignal(VS, 200e-12, 1e-9),
    rs: RS,
    route: [
      { kind: 'line', name: 'trace', line: lineOf(Z0, 5.7e-9), length: 0.15 },
      { kind: 'line', name: 'cable', line: lineOf(Z1, 5e-9), length: 0.2 },
    ],
    receiver: [part({ r: RL })],
    probes: [{ name: 'mid', at: 'line', item: 'cable', position: 0.1 }],
    duration: 15e-9,
  });

describe('withEndProbes', () => {
  it('adds a driver and a receiver probe only where missing, with unique names', () => {
    const n = withEndProbes({ ...twoSegments(), probes: [{ name: 'driver', at: 'line', item: 'trace', position: 0 }] });
    expect(n.probes.map((p) => [p.name, p.at])).toEqual([
      ['driver', 'line'],
      ['driver_2', 'driver'],
      ['receiver', 'receiver'],
    ]);
    expect(endProbeIndices(n)).toEqual({ driver: 1, receiver: 2 });
    const again = withEndProbes(n);
    expect(again).toBe(n);
  });
});

describe('printed numbers equal the lattice formulas', () => {
  it('launched amplitude, Γ at both ends and the junction', () => {
    const d = latticeDiagram(twoSegments());
    if (!d.supported) throw new Error('unsupported');
    const labels = bounceLabels(d);
    const vPlus = (VS * Z0) / (RS + Z0);
    // printed with 3 significant digits
    printsValue(labels.waves[0], vPlus);
    expect(labels.formulas[0]).toContain(labels.waves[0]);
    const gS = (RS - Z0) / (RS + Z0), gJ = (Z1 - Z0) / (Z1 + Z0), gJr = (Z0 - Z1) / (Z0 + Z1), gL = (RL - Z1) / (RL + Z1);
    expect(parseSigned(/Γ = (\S+)/.exec(labels.boundaries[0])![1])).toBeCloseTo(gS, 3);
    expect(parseSigned(/Γ = (\S+)/.exec(labels.boundaries[2])![1])).toBeCloseTo(gL, 3);
    const j = /Γ→ (\S+) {2}Γ← (\S+)/.exec(labels.boundaries[1])!;
    expect(parseSigned(j[1])).toBeCloseTo(gJ, 3);
    expect(parseSigned(j[2])).toBeCloseTo(gJr, 3);
    // the second wave on the cable is V⁺·(1 + Γ_junction), the first reflection from the junction V⁺·Γ
    const onCable = d.waves.findIndex((w) => w.segment === 1);
    printsValue(labels.waves[onCable], vPlus * (1 + gJ));
    const back = d.waves.findIndex((w) => w.segment === 0 && w.direction < 0);
    printsValue(labels.waves[back], vPlus * gJ);
  });
});

describe('drawing', () => {
  type Img = { width: number; height: number; data: Buffer };
  const px = (img: Img, x: number, y: number) => {
    const i = (Math.round(y) * img.width + Math.round(x)) * 4;
    return [img.data[i], img.data[i + 1], img.data[i + 2]];
  };
  const near = (a: number[], b: readonly number[], tol = 40) => a.every((v, k) => Math.abs(v - b[k]) <= tol);

  it('draws the lattice, its waves in the direction colours, and both end panels on one time axis', () => {
    const n = withEndProbes(twoSegments());
    const s = new Surface(1500, 950);
    const lay = drawBounce(s, { x: 0, y: 0, w: 1500, h: 950 }, { title: 'two segments', net: n, result: simulate(n) });
    expect(lay.lattice).toBeDefined();
    expect(lay.message).toBeUndefined();
    const img = PNG.sync.read(encodePng(s));
    const f = lay.lattice!;
    // the three panels share the time axis: same pixel rows for the same times
    for (const t of [2e-9, 10e-9]) {
      expect(Math.abs(lay.driver.y.map(t) - f.y.map(t))).toBeLessThan(0.5);
      expect(Math.abs(lay.receiver.y.map(t) - f.y.map(t))).toBeLessThan(0.5);
    }
    expect(f.y.map(10e-9)).toBeGreaterThan(f.y.map(2e-9)); // time runs downward
    // a quarter of the way along the first wave is blue, along the first backward wave green (±1 px)
    if (!lay.diagram.supported) throw new Error('unsupported');
    const at = (w: (typeof lay.diagram.waves)[number], k: number) => [f.x.map(w.x0 + k * (w.x1 - w.x0)), f.y.map(w.t0 + k * (w.t1 - w.t0))];
    const hit = (x: number, y: number, c: readonly number[]) => {
      for (let dx = -1; dx <= 1; dx++) for (let dy = -1; dy <= 1; dy++) if (near(px(img, x + dx, y + dy), c)) return true;
      return false;
    };
    const w0 = lay.diagram.waves[0];
    const wb = lay.diagram.waves.find((w) => w.direction < 0)!;
    expect(hit(...(at(w0, 0.25) as [number, number]), hexToRgb(BOUNCE_STYLE.forward.color))).toBe(true);
    expect(hit(...(at(wb, 0.25) as [number, number]), hexToRgb(BOUNCE_STYLE.backward.color))).toBe(true);
  });

  it('draws the lattice of an idealised net for a net with small reactive and lossy parts, with the note on the picture', async () => {
    // 50 Ω, 0.6 ns one way (round trip 1.2 ns); the 1 pF via sees 25 Ω: τ = 25 ps, a fifth of the round trip or less
    const n = withEndProbes(
      net({
        signal: stepSignal(1, 200e-12, 1e-9),
        rs: 20,
        route: [{ kind: 'line', name: 'lossy', line: lineOf(50, 6e-9, 3, 0), length: 0.1 }, { kind: 'shunt', name: 'via', parts: [part({ c: 1e-12 })] }, { kind: 'line', name: 'tail', line: lineOf(50, 6e-9), length: 0.05 }],
        duration: 8e-9,
      }),
    );
    const s = new Surface(1500, 950);
    const lay = drawBounce(s, { x: 0, y: 0, w: 1500, h: 950 }, { title: 'idealised', net: n, result: simulate(n) });
    expect(lay.diagram.supported).toBe(true);
    expect(lay.lattice).toBeDefined();
    expect(lay.idealisation.notes.join('\n')).toMatch(/lossless[\s\S]*shunt 'via' \(C 1 pF; τ ≈ 25 ps/);
    // the note's tinted box (#fff8e6) spans the width below the panels
    const img = PNG.sync.read(encodePng(s));
    const below = lay.driver.plot.y + lay.driver.plot.h + 60;
    let tinted = 0;
    for (let y = below; y < 950; y++) if (near(px(img, 750, y), hexToRgb('#fff8e6'))) tinted++;
    expect(tinted).toBeGreaterThan(40);
  });

  it('shows a message panel instead of a lattice where the idealisation would mislead (τ of a part ≈ the round trip)', async () => {
    // 50 pF at the far end of a 50 Ω line with a 1 ns round trip: τ = Z0·C = 2.5 ns
    const n = withEndProbes(
      net({
        signal: stepSignal(1, 200e-12, 1e-9),
        rs: 20,
        route: [{ kind: 'line', name: 'trace', line: lineOf(50, 5e-9), length: 0.1 }],
        receiver: [part({ c: 50e-12 })],
        duration: 8e-9,
      }),
    );
    const s = new Surface(1500, 950);
    const lay = drawBounce(s, { x: 0, y: 0, w: 1500, h: 950 }, { title: 'unsupported', net: n, result: simulate(n) });
    expect(lay.lattice).toBeUndefined();
    expect(lay.message).toBeDefined();
    expect(lay.diagram.supported).toBe(false);
    if (!lay.diagram.supported) expect(lay.diagram.reasons.join()).toMatch(/the receiver \(C 50 pF; τ ≈ 2\.5 ns/);
    // the panel sits between the two waveform panels
    expect(lay.message!.x).toBeGreaterThan(lay.driver.plot.x + lay.driver.plot.w);
    expect(lay.message!.x + lay.message!.w).toBeLessThan(lay.receiver.plot.x);
    const png = await renderBounce({ title: 'unsupported', net: n, result: simulate(n), width: 1400, height: 900 });
    const img = PNG.sync.read(png);
    expect([img.width, img.height]).toEqual([1400, 900]);
  });
});

describe('a branched net: the lattice along one path', () => {
  // A 40 mm open stub off a matched 50 Ω line: the tap sees 50 ∥ 50 = 25 Ω, Γ = −1/3 and 2/3 onward
  // (Pozar, Microwave Engineering, ch. 2); the stub's open end returns its 2/3·V⁺ share, of which the
  // tap sends 2/3 again each way: 4/9·V⁺ into the path a stub round trip later.
  const tpd = 6.25e-9;
  const stubNet = (receiverPart = part({ r: 50 })): Net =>
    net({
      signal: stepSignal(1.2, 60e-12, 0.2e-9),
      rs: 50,
      route: [
        { kind: 'line', name: 'near', line: lineOf(50, tpd), length: 0.03 },
        { kind: 'branch', name: 'tap', branches: [{ route: [{ kind: 'line', name: 'stub', line: lineOf(50, tpd), length: 0.04 }], receiver: { name: 'tp', parts: [] } }] },
        { kind: 'line', name: 'far', line: lineOf(50, tpd), length: 0.05 },
      ],
      receiver: [receiverPart],
      receiverName: 'radio',
      probes: [{ name: 'tx', at: 'driver' }, { name: 'radio', at: 'receiver' }, { name: 'tp', at: 'receiver', receiver: 'tp' }],
      duration: 2.5e-9,
    });

  it('follows the main path by default and marks the stub’s returning wave where it enters it', () => {
    const n = stubNet();
    const s = new Surface(1500, 950);
    const lay = drawBounce(s, { x: 0, y: 0, w: 1500, h: 950 }, { title: 'stub', net: n, result: simulate(n) });
    if (!lay.diagram.supported) throw new Error(lay.diagram.reasons.join());
    const d = lay.diagram;
    expect(d.path).toEqual({ receiver: 'radio', receivers: ['radio', 'tp'] });
    expect(d.segments.map((x) => x.name)).toEqual(['near', 'far']);
    expect(d.boundaries[1].branches).toEqual(['stub']);
    const first = d.sideArrivals![0];
    expect(first.from).toBe('stub');
    expect(first.time).toBeCloseTo(0.2e-9 + 0.0375e-9 + 0.03 * tpd + 2 * 0.04 * tpd, 15);
    expect(first.towardsReceiver).toBeCloseTo((4 / 9) * 0.6, 12);
    expect(first.towardsDriver).toBeCloseTo((4 / 9) * 0.6, 12);
    // the dot is drawn in the branch colour at the tap, at that time
    const img = PNG.sync.read(encodePng(s));
    const i = (Math.round(lay.lattice!.y.map(first.time)) * img.width + Math.round(lay.lattice!.x.map(first.position))) * 4;
    const want = hexToRgb(BOUNCE_STYLE.fromBranch.color);
    expect([img.data[i], img.data[i + 1], img.data[i + 2]].every((v, k) => Math.abs(v - want[k]) < 40)).toBe(true);
  });

  it('--path draws the path to another receiver, with that receiver’s probe beside it', () => {
    const n = stubNet();
    const s = new Surface(1500, 950);
    const lay = drawBounce(s, { x: 0, y: 0, w: 1500, h: 950 }, { title: 'stub', net: n, result: simulate(n), path: 'tp' });
    if (!lay.diagram.supported) throw new Error(lay.diagram.reasons.join());
    expect(lay.diagram.segments.map((x) => x.name)).toEqual(['near', 'stub']);
    // the open stub end doubles what reaches it: 2/3·V⁺·2 = 0.8 V
    expect(lay.diagram.plateaus.receiver.find((p) => p.value > 0)!.value).toBeCloseTo(0.8, 12);
    expect(endProbeIndices(n, 'tp').receiver).toBe(2);
    expect(withEndProbes(stubNet(), 'tp').probes.length).toBe(3);
  });

  it('idealises each branch receiver on its own and refuses with every reason where it must', () => {
    // 0.2 pF behind 50 Ω: τ = 10 ps, far below a fifth of the 1.1 ns round trip → an open
    const small = stubNet(part({ c: 0.2e-12 }));
    const a = drawBounce(new Surface(1500, 950), { x: 0, y: 0, w: 1500, h: 950 }, { title: 'small C', net: small, result: simulate(small) });
    expect(a.diagram.supported).toBe(true);
    expect(a.idealisation.notes.join()).toMatch(/receiver 'radio' \(C 200 fF; τ ≈ 10 ps.*taken as an open/);
    // 10 pF: τ = 500 ps, comparable to the round trip → no lattice, the reason printed
    const big = stubNet(part({ c: 10e-12 }));
    const b = drawBounce(new Surface(1500, 950), { x: 0, y: 0, w: 1500, h: 950 }, { title: 'big C', net: big, result: simulate(big) });
    expect(b.lattice).toBeUndefined();
    if (!b.diagram.supported) expect(b.diagram.reasons.join()).toMatch(/receiver 'radio' \(C 10 pF; τ ≈ 500 ps/);
  });
});
