// The route strip: every item drawn with its values, Z0 = √(L′/C′) and TD = ℓ·√(L′C′) (Pozar, Microwave
// Engineering, §2.1), and all names escaped.
import { describe, expect, it } from 'vitest';
import { describePart, routeSvg } from '../../../src/report/schematic.js';
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
});
