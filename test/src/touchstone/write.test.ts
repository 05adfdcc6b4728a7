// The Touchstone writer: its text follows the specifications' layout (IBIS Open Forum, Touchstone
// 1.1 and 2.0), and the reader gets back what was written.
import { describe, expect, it } from 'vitest';
import type { NetworkData } from '../../../sim/sparams/network.js';
import { asciiOnly, formatTouchstone, parseTouchstone, toNetworkData, touchstoneFileName } from '../../../src/touchstone/index.js';

function sample(ports: number, freqs: number, kind: 'S' | 'Y' | 'Z' = 'S', reference?: number[]): NetworkData {
  const data = new Float64Array(2 * ports * ports * freqs);
  for (let k = 0; k < data.length; k++) data[k] = Math.sin(1.7 * k + 0.3) * (kind === 'Z' ? 40 : kind === 'Y' ? 0.02 : 0.7);
  return {
    ports,
    freq: Float64Array.from({ length: freqs }, (_, k) => 1e7 + k * 2.5e8),
    kind,
    data,
    reference: Float64Array.from(reference ?? new Array(ports).fill(50)),
  };
}

function maxRelDiff(a: Float64Array, b: Float64Array): number {
  let d = 0;
  let m = 0;
  for (let k = 0; k < a.length; k++) {
    d = Math.max(d, Math.abs(a[k] - b[k]));
    m = Math.max(m, Math.abs(a[k]));
  }
  return d / m;
}

describe('Touchstone writer', () => {
  it('writes 1.1 with the option line "# GHz S RI R 50" and one line per 2-port set in the order 11 21 12 22', () => {
    const net = sample(2, 3);
    const text = formatTouchstone(net, { version: '1.1', comments: ['invented connector, 2 mm – 50 Ω'] });
    const lines = text.trim().split('\n');
    expect(lines[0]).toBe('! invented connector, 2 mm - 50 ohm');
    expect(lines[1]).toBe('# GHz S RI R 50');
    expect(lines).toHaveLength(5);
    const first = lines[2].split(' ').map(Number);
    expect(first).toHaveLength(9);
    expect(first[0]).toBeCloseTo(0.01, 15);
    expect(first[3]).toBeCloseTo(net.data[4], 11); // S21 (entry (1, 0)) is the second pair
    expect(first[5]).toBeCloseTo(net.data[2], 11); // S12 the third
  });

  it('round-trips S, Y and Z through 1.1 and 2.0 to 12 significant digits', () => {
    for (const version of ['1.1', '2.0'] as const)
      for (const kind of ['S', 'Y', 'Z'] as const)
        for (const format of ['RI', 'MA', 'DB'] as const) {
          const net = sample(2, 4, kind);
          const back = toNetworkData(parseTouchstone(formatTouchstone(net, { version, format }), { file: 'rt.s2p' }));
          expect(back.kind).toBe(kind);
          expect(maxRelDiff(net.data, back.data)).toBeLessThan(1e-10);
          expect(maxRelDiff(net.freq, back.freq)).toBeLessThan(1e-14);
        }
  });

  it('writes a 5-port as 1.1 rows wrapped after four pairs, and as 2.0 with per-port [Reference]', () => {
    const net = sample(5, 2);
    const t11 = formatTouchstone(net, { version: '1.1' });
    expect(t11.trim().split('\n').length).toBe(1 + 2 * 5 * 2);
    const back11 = parseTouchstone(t11, { file: 'five.s5p' });
    expect(maxRelDiff(net.data, back11.values)).toBeLessThan(1e-10);
    const mixed = sample(5, 2, 'S', [50, 50, 75, 100, 25]);
    const t20 = formatTouchstone(mixed, { version: '2.0', unit: 'MHz' });
    expect(t20).toMatch(/^\[Version\] 2\.0\n# MHz S RI R 50\n\[Number of Ports\] 5\n\[Number of Frequencies\] 2\n\[Reference\] 50 50 75 100 25\n\[Network Data\]\n/);
    expect(t20.trimEnd().endsWith('[End]')).toBe(true);
    const back20 = parseTouchstone(t20, { file: 'five.ts' });
    expect(Array.from(back20.reference)).toEqual([50, 50, 75, 100, 25]);
    expect(maxRelDiff(mixed.data, back20.values)).toBeLessThan(1e-10);
    expect(() => formatTouchstone(mixed, { version: '1.1' })).toThrow(/one reference resistance/);
  });

  it('writes [Two-Port Data Order] 12_21 for a 2.0 2-port and keeps Y and Z in siemens and ohms', () => {
    const z = sample(2, 1, 'Z', [75, 75]);
    const t = formatTouchstone(z, { version: '2.0' });
    expect(t).toMatch(/\[Two-Port Data Order\] 12_21/);
    const row = t.split('\n').find((l) => /^\d/.test(l)) as string;
    expect(Number(row.split(' ')[1])).toBeCloseTo(z.data[0], 9); // not divided by 75
    const t11 = formatTouchstone(z, { version: '1.1' });
    const row11 = t11.split('\n').find((l) => /^\d/.test(l)) as string;
    expect(Number(row11.split(' ')[1])).toBeCloseTo(z.data[0] / 75, 11); // 1.1: normalized to R
  });

  it('names files .snp and keeps comments in printable ASCII', () => {
    expect(touchstoneFileName('out/via', 2)).toBe('out/via.s2p');
    expect(asciiOnly('Z0 = 50 Ω ± 5 %, 3 µm')).toBe('Z0 = 50 ohm +/- 5 %, 3 um');
    expect(asciiOnly('→é')).toBe('->?');
  });
});
