// The route strip: every item drawn with its values, Z0 = √(L′/C′) and TD = ℓ·√(L′C′) (Pozar, Microwave
// Engineering, §2.1), and all names escaped.
import { describe, expect, it } from 'vitest';
import { describePart, routeSvg } from '../../../src/report/schematic.js';
import { fromMicrostrip, rlgcAt } from '../../../sim/lines/freq-model.js';
import { formatSI } from '../../../src/units.js';
import { lineOf, net, part, stepSignal } from '../../support/nets.js';

describe('routeSvg', () => {
  const n = net({
    signal: stepSignal(3.3, 1e-9),
    rs: 14,
    route: [
      { kind: 'series', name: 'r<s>', part: part({ r: 39 }) },
      // L′ = 300 nH/m, C′ = 120 pF/m: Z0 = 50 Ω, 6 in (0.1524 m) → TD = 0.1524·6 ns = 914.4 ps
      { kind: 'line', name: 'trace & co', line: { r: 0, g: 0, l: 300e-9, c: 120e-12 }, length: 0.1524 },
      { kind: 'shunt', name: 'via', parts: [part({ c: 0.4e-12 }), part({ r: 50, rail: 1.25 })] },
      { kind: 'line', name: 'tail', line: lineOf(75, 5e-9, 4), length: 0.1 },
    ],
    receiver: [part({ c: 4e-12 })],
  });
  n.title = 'A "quoted" <title>';
  const svg = routeSvg(n);

  it('shows each item with its values', () => {
    expect(svg).toContain('Z0 50 Ω');
    expect(svg).toContain('TD 914 ps · 152 mm');
    expect(svg).toContain('Z0 75 Ω');
    expect(svg).toContain('R′ 4 Ω/m');
    expect(svg).toContain('R 39 Ω');
    expect(svg).toContain('C 400 fF');
    expect(svg).toContain('R 50 Ω to 1.25 V');
    expect(svg).toContain('C 4 pF');
    expect(svg).toContain('Rs 14 Ω');
  });

  it('escapes names and the title', () => {
    expect(svg).toContain('r&lt;s&gt;');
    expect(svg).toContain('trace &amp; co');
    expect(svg).toContain('A &quot;quoted&quot; &lt;title&gt;');
    expect(svg).not.toContain('<s>');
  });

  it('draws an open end when the receiver has no parts', () => {
    expect(routeSvg({ ...n, receiver: [] })).toContain('open end');
  });

  it('describes parts as their elements in series', () => {
    expect(describePart(part({ r: 56, c: 100e-12 }))).toBe('R 56 Ω + C 100 pF');
    expect(describePart(part({}))).toBe('short (0 Ω)');
  });

  it('labels a skin-effect line’s Z0 and R′ with the frequency they hold at, not the DC resistance', () => {
    // FR-4 microstrip, 1 oz on 5 mil, εr 4.1 at 1 GHz: R′ at 1 GHz is several times R_dc (skin effect,
    // Pozar §2.7: R_s = √(ωµ0/2σ)); the strip shows the 1 GHz value, labelled, and the quasi-static Z0
    // (Hammerstad–Jensen) at the same frequency, as `line` prints them.
    const b = fromMicrostrip({ width: 9 * 25.4e-6, height: 5 * 25.4e-6, thickness: 35e-6, er: 4.1, lossTangent: 0.018, at: 1e9 });
    const line = { r: b.line.rdc, l: b.line.lInf, g: 0, c: b.line.cInf, wideband: b.line };
    const strip = routeSvg(net({ signal: stepSignal(1, 1e-10), rs: 20, route: [{ kind: 'line', name: 'top', line, length: 0.0254 }] }));
    const r1g = rlgcAt(b.line, 1e9).r;
    expect(r1g).toBeGreaterThan(3 * b.line.rdc);
    expect(strip).toContain(`R′ ${formatSI(r1g, 'Ω/m', 3)} at 1 GHz`);
    expect(strip).not.toContain(`R′ ${formatSI(b.line.rdc, 'Ω/m', 3)}`);
    expect(strip).toContain(`Z0 ${formatSI(b.z0, 'Ω', 4)} at 1 GHz`);
  });

  it('draws each element with its own symbol: resistor box, inductor coil, capacitor plates', () => {
    const count = (svg: string, kind: string) => (svg.match(new RegExp(`class="el el-${kind}"`, 'g')) ?? []).length;
    const only = (route: Parameters<typeof net>[0]['route'], receiver = [part({ r: 1e6 })]) =>
      routeSvg(net({ signal: stepSignal(1, 1e-10), rs: 20, route: [{ kind: 'line', name: 't', line: lineOf(50, 5e-9), length: 0.1 }, ...route], receiver }));
    // a series R + L + C part: one of each, in that order along the wire
    const rlc = only([{ kind: 'series', name: 'x', part: part({ r: 1, l: 5e-9, c: 1e-9 }) }], []);
    expect([count(rlc, 'r'), count(rlc, 'l'), count(rlc, 'c')]).toEqual([1, 1, 1]);
    expect(rlc.indexOf('el-r')).toBeLessThan(rlc.indexOf('el-l'));
    expect(rlc.indexOf('el-l')).toBeLessThan(rlc.indexOf('el-c'));
    // the coil is drawn with arcs, the plates with two lines, the resistor with a box
    expect(/<g class="el el-l"><path d="M [^"]* a /.test(rlc)).toBe(true);
    expect(/<g class="el el-c">(<line [^>]*\/>){2}<\/g>/.test(rlc)).toBe(true);
    expect(/<g class="el el-r"><rect /.test(rlc)).toBe(true);
    // a shunt capacitor alone: plates, no box; a receiver of C ‖ (R + L)
    const shunt = only([{ kind: 'shunt', name: 'via', parts: [part({ c: 1e-12 })] }], [part({ c: 3e-12 }), part({ r: 1e4, l: 5e-9 })]);
    expect([count(shunt, 'r'), count(shunt, 'l'), count(shunt, 'c')]).toEqual([1, 1, 2]);
  });
});

describe('routeSvg of a branched net: a tree', () => {
  // A star of two arms at 'hub' and a stub on one arm: the trunk's row on top, each side route in a
  // row of its own below, starting under its branch point (the arm with the nested stub first gets
  // its own stub row below it).
  const t = (name: string, length: number) => ({ kind: 'line' as const, name, line: lineOf(50, 5e-9), length });
  const n = net({
    signal: stepSignal(1, 1e-10),
    rs: 20,
    route: [
      t('trunk', 0.02),
      {
        kind: 'branch',
        name: 'hub',
        branches: [
          { route: [t('armB', 0.03), { kind: 'branch', name: 'tee', branches: [{ route: [t('stub', 0.01)], receiver: { name: 'tp', parts: [] } }] }, t('armB2', 0.01)], receiver: { name: 'adcB', parts: [part({ c: 2e-12 })] } },
          { route: [t('armC', 0.04)], receiver: { name: 'adcC', parts: [part({ r: 100 })] } },
        ],
      },
      t('armA', 0.05),
    ],
    receiver: [part({ c: 3e-12 })],
    receiverName: 'adcA',
  });
  const svg = routeSvg(n);
  /** The translate of the group holding a line's name. */
  const place = (name: string): [number, number] => {
    const i = svg.indexOf(`>${name}</text>`);
    const g = svg.lastIndexOf('<g transform="translate(', i);
    const m = /translate\(([\d.]+),([\d.]+)\)/.exec(svg.slice(g, g + 60))!;
    return [Number(m[1]), Number(m[2])];
  };

  it('names every receiver and draws every line once', () => {
    for (const name of ['adcA', 'adcB', 'adcC', 'tp', 'trunk', 'armA', 'armB', 'armB2', 'armC', 'stub']) expect(svg.split(`>${name}</text>`).length - 1, name).toBe(1);
    expect(svg).toContain('→ adcB');
    expect(svg).toContain('as a tree');
  });

  it('puts the trunk on top and each side route below and to the right of its branch point', () => {
    const [xTrunk, yTrunk] = place('trunk');
    const [xA, yA] = place('armA');
    const [xB, yB] = place('armB');
    const [xC, yC] = place('armC');
    const [xStub, yStub] = place('stub');
    const [xB2, yB2] = place('armB2');
    expect(yA).toBe(yTrunk);
    expect(xA).toBeGreaterThan(xTrunk);
    // both arms start right of the trunk, below it, in rows of their own
    for (const [x, y] of [[xB, yB], [xC, yC]]) {
      expect(x).toBeGreaterThan(xTrunk);
      expect(y).toBeGreaterThan(yTrunk);
    }
    expect(yB2).toBe(yB);
    expect(new Set([yB, yC, yStub]).size).toBe(3);
    // the stub hangs below its arm, right of where the arm starts
    expect(yStub).toBeGreaterThan(yB);
    expect(xStub).toBeGreaterThan(xB);
  });

  it('an unbranched route is still one strip', () => {
    const flat = routeSvg({ ...n, route: [t('only', 0.1)], receiverName: undefined });
    expect(flat).not.toContain('as a tree');
    expect(/height="(\d+)"/.exec(flat)![1]).toBe(String(56 + 104 + 3 * 16 + 8));
  });
});
