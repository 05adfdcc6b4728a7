// The Touchstone reader against the specifications' own examples (IBIS Open Forum, Touchstone File
// Format Specification Rev 1.1, 2002, and Version 2.0, 2009). Example numbers are those of the 2.0
// specification unless "1.1" is said. Expected complex values follow from the specifications'
// definitions: MA = magnitude and angle in degrees, DB = 20·log10|x| and angle, Z in 1.x normalized to R.
import { describe, expect, it } from 'vitest';
import { parseTouchstone, portsFromFileName, toNetworkData, type TouchstoneData } from '../../../src/touchstone/index.js';
import { ScenarioError } from '../../../src/scenario/problems.js';

const v = (t: TouchstoneData, k: number, i: number, j: number) => {
  const at = 2 * ((k * t.ports + i) * t.ports + j);
  return { re: t.values[at], im: t.values[at + 1] };
};
const polar = (mag: number, deg: number) => ({ re: mag * Math.cos((deg * Math.PI) / 180), im: mag * Math.sin((deg * Math.PI) / 180) });
const near = (a: { re: number; im: number }, b: { re: number; im: number }, tol: number) => {
  expect(Math.abs(a.re - b.re)).toBeLessThanOrEqual(tol);
  expect(Math.abs(a.im - b.im)).toBeLessThanOrEqual(tol);
};
function problems(text: string, file = 'part.s2p'): string[] {
  try {
    parseTouchstone(text, { file });
  } catch (e) {
    if (e instanceof ScenarioError) return e.message.split('\n');
    throw e;
  }
  throw new Error('expected a ScenarioError');
}

const EXAMPLE_8 = '!1-port S-parameter file, single frequency point\n# MHz S MA R 50\n!freq magS11 angS11\n2.000 0.894 -12.136\n';
const EXAMPLE_9 = '!1-port Z-parameter file, multiple frequency points\n# MHz Z MA R 75\n!freq magZ11 angZ11\n100 0.99 -4\n200 0.80 -22\n300 0.707 -45\n400 0.40 -62\n500 0.01 -89\n';
const EXAMPLE_10 =
  '!1-port Z-parameter file, multiple frequency points\n[Version] 2.0\n# MHz Z MA\n[Number of Ports] 1\n[Number of Frequencies] 5\n[Reference] 20.0\n[Network Data]\n!freq magZ11 angZ11\n100 74.25 -4\n200 60 -22\n300 53.025 -45\n400 30 -62\n500 0.75 -89\n[End]\n';
const EXAMPLE_13 =
  '!2-port S-parameter file, three frequency points\n# GHz S RI R 50.0\n!freq ReS11 ImS11 ReS21 ImS21 ReS12 ImS12 ReS22 ImS22\n' +
  '1.0000 0.3926 -0.1211 -0.0003 -0.0021 -0.0003 -0.0021 0.3926 -0.1211\n' +
  '2.0000 0.3517 -0.3054 -0.0096 -0.0298 -0.0096 -0.0298 0.3517 -0.3054\n' +
  '10.000 0.3419 0.3336 -0.0134 0.0379 -0.0134 0.0379 0.3419 0.3336\n';
const ROWS_5GHZ =
  '5.00000 0.60 161.24 0.40 -42.20 0.42 -66.58 0.53 -79.34 !row 1\n0.40 -42.20 0.60 161.20 0.53 -79.34 0.42 -66.58 !row 2\n' +
  '0.42 -66.58 0.53 -79.34 0.60 161.24 0.40 -42.20 !row 3\n0.53 -79.34 0.42 -66.58 0.40 -42.20 0.60 161.24 !row 4\n';
const EXAMPLE_14 =
  '! 4-port S-parameter data, taken at three frequency points\n! note that data points need not be aligned\n# GHz S MA R 50\n' +
  ROWS_5GHZ +
  '6.00000 0.57 150.37 0.40 -44.34 0.41 -81.24 0.57 -95.77 !row 1\n0.40 -44.34 0.57 150.37 0.57 -95.77 0.41 -81.24 !row 2\n' +
  '0.41 -81.24 0.57 -95.77 0.57 150.37 0.40 -44.34 !row 3\n0.57 -95.77 0.41 -81.24 0.40 -44.34 0.57 150.37 !row 4\n' +
  '7.00000 0.50 136.69 0.45 -46.41 0.37 -99.09 0.62 -114.19 !row 1\n0.45 -46.41 0.50 136.69 0.62 -114.19 0.37 -99.09 !row 2\n' +
  '0.37 -99.09 0.62 -114.19 0.50 136.69 0.45 -46.41 !row 3\n0.62 -114.19 0.37 -99.09 0.45 -46.41 0.50 136.69 !row 4\n';
const HEADER_4PORT = '[Version] 2.0\n# GHz S MA R 50\n[Number of Ports] 4\n[Number of Frequencies] 1\n';
// Example 4 of the 2.0 specification prints no [End]; TSIRD 4.1 (IBIS, 2022) makes [End] required
// and corrects the examples, so it is added here.
const EXAMPLE_4 = `! 4-port S-parameter data\n${HEADER_4PORT.replace('[Number of Frequencies] 1\n', '')}[Reference]\n50 75 0.01 0.01\n[Number of Frequencies] 1\n[Network Data]\n${ROWS_5GHZ}[End]\n`;
const EXAMPLE_5 = `${HEADER_4PORT}[Reference] 50 75 0.01 0.01\n[Matrix Format] Full\n[Network Data]\n${ROWS_5GHZ}[End]\n`;
const EXAMPLE_6 =
  `${HEADER_4PORT}[Reference] 50 75\n0.01 0.01\n[Matrix Format] Lower\n[Network Data]\n` +
  '5.00000 0.60 161.24 !row 1\n0.40 -42.20 0.60 161.20 !row 2\n0.42 -66.58 0.53 -79.34 0.60 161.24 !row 3\n0.53 -79.34 0.42 -66.58 0.40 -42.20 0.60 161.24 !row 4\n[End]\n';
const EXAMPLE_17 =
  '!2-port network, S-parameter and noise data\n[Version] 2.0\n#\n[Number of Ports] 2\n[Two-Port Data Order] 21_12\n[Number of Frequencies] 2\n' +
  '[Number of Noise Frequencies] 2\n[Reference] 50 25.0\n[Network Data]\n2 .95 -26 3.57 157 .04 76 .66 -14\n22 .60 -144 1.30 40 .14 40 .56 -85\n' +
  '[Noise Data]\n4 .7 .64 69 19\n18 2.7 .46 -33 20\n[End]\n';
const EXAMPLE_18 =
  '!2-port network, S-parameter and noise data\n#\n! NETWORK PARAMETERS\n2 .95 -26 3.57 157 .04 76 .66 -14\n22 .60 -144 1.30 40 .14 40 .56 -85\n' +
  '! NOISE PARAMETERS\n4 .7 .64 69 .38\n18 2.7 .46 -33 .40\n';

describe('Touchstone 1.x (no [Version])', () => {
  it('reads Example 8: 0.894∠−12.136° at 2 MHz → 0.874020 − j0.187948', () => {
    const t = parseTouchstone(EXAMPLE_8, { file: 'ex8.s1p' });
    expect(t.version).toBe('1.1');
    expect(Array.from(t.freq)).toEqual([2e6]);
    near(v(t, 0, 0, 0), { re: 0.87402, im: -0.187948 }, 1e-6);
    expect(Array.from(t.reference)).toEqual([50]);
    expect(t.comments[0]).toBe('1-port S-parameter file, single frequency point');
  });

  it('reads the DB form of the same value: −0.97 dB∠−12.136° → 0.874347 − j0.188019', () => {
    // Example 8's value written as dB (20·log10 0.894 = −0.973, rounded to −0.97); not itself an example
    // of the specification, expected value from its DB definition, dB = 20·log10|magnitude|.
    const t = parseTouchstone(EXAMPLE_8.replace('MA', 'DB').replace('0.894', '-0.97'), { file: 'ex8db.s1p' });
    near(v(t, 0, 0, 0), { re: 0.874347, im: -0.188019 }, 1e-6);
  });

  it('reads Example 9: Z normalized to R 75, 0.99∠−4° → 74.069 − j5.179 Ω', () => {
    const t = parseTouchstone(EXAMPLE_9, { file: 'ex9.s1p' });
    expect(t.parameter).toBe('Z');
    expect(Array.from(t.freq)).toEqual([1e8, 2e8, 3e8, 4e8, 5e8]);
    near(v(t, 0, 0, 0), { re: 74.069, im: -5.179 }, 1e-3);
    near(v(t, 4, 0, 0), polar(0.75, -89), 1e-12);
  });

  it('reads Example 13: 2-port RI data in the order 11 21 12 22', () => {
    const t = parseTouchstone(EXAMPLE_13, { file: 'ex13.s2p' });
    expect(t.ports).toBe(2);
    expect(Array.from(t.freq)).toEqual([1e9, 2e9, 10e9]);
    near(v(t, 2, 0, 0), { re: 0.3419, im: 0.3336 }, 1e-15);
    near(v(t, 2, 1, 0), { re: -0.0134, im: 0.0379 }, 1e-15); // S21, the second pair
    near(v(t, 1, 1, 1), { re: 0.3517, im: -0.3054 }, 1e-15);
  });

  it('reads Example 14: a 4-port, one matrix row per line, rows in order', () => {
    const t = parseTouchstone(EXAMPLE_14, { file: 'ex14.s4p' });
    expect(t.freq.length).toBe(3);
    near(v(t, 0, 0, 3), polar(0.53, -79.34), 1e-15); // row 1, 4th pair: S14
    near(v(t, 0, 1, 1), polar(0.6, 161.2), 1e-15); // row 2: S22
    near(v(t, 2, 3, 0), polar(0.62, -114.19), 1e-15); // 7 GHz, row 4, S41
  });

  it('continues rows of five ports and more on the next line (1.1, "5-port and above")', () => {
    // 5-port: four pairs then one on the next line, per row; S_ij = (10i + j) + j·0 in RI
    const rows: string[] = [];
    for (let i = 1; i <= 5; i++) {
      const p = [1, 2, 3, 4, 5].map((j) => `${10 * i + j} ${-j}`);
      rows.push(`${i === 1 ? '1.5 ' : ''}${p.slice(0, 4).join(' ')}`, p[4]);
    }
    const t = parseTouchstone(`# GHz S RI R 50\n${rows.join('\n')}\n`, { file: 'five.s5p' });
    for (let i = 0; i < 5; i++) for (let j = 0; j < 5; j++) near(v(t, 0, i, j), { re: 10 * (i + 1) + j + 1, im: -(j + 1) }, 0);
  });

  it('skips the noise data of Example 18 (a frequency below the last network frequency starts it)', () => {
    const t = parseTouchstone(EXAMPLE_18, { file: 'ex18.s2p' });
    expect(Array.from(t.freq)).toEqual([2e9, 22e9]);
    expect(t.noisePoints).toBe(2);
    near(v(t, 1, 1, 0), polar(1.3, 40), 1e-15);
  });

  it('uses the defaults GHz, S, MA, R 50 for a bare "#" and ignores later option lines', () => {
    const t = parseTouchstone('#\n1 0.5 90\n# MHz Z RI R 75\n2 0.25 0\n', { file: 'x.s1p' });
    expect(t.options).toEqual({ unit: 'GHz', parameter: 'S', format: 'MA', resistance: 50 });
    expect(Array.from(t.freq)).toEqual([1e9, 2e9]);
    near(v(t, 0, 0, 0), { re: 0, im: 0.5 }, 1e-15);
  });

  it('takes the port count from the .snp extension, and asks for it when there is none', () => {
    expect(portsFromFileName('models/conn.S4P')).toBe(4);
    expect(portsFromFileName('conn.ts')).toBeUndefined();
    expect(problems('# GHz S RI\n1 0 0\n', 'data.txt')[0]).toMatch(/data\.txt .*expected a file name ending in \.sNp/);
  });
});

describe('Touchstone 2.0', () => {
  it('reads Example 10: the same Z as Example 9, now in ohms, 74.25∠−4° → 74.069 − j5.179 Ω', () => {
    const t10 = parseTouchstone(EXAMPLE_10, { file: 'ex10.ts' });
    const t9 = parseTouchstone(EXAMPLE_9, { file: 'ex9.s1p' });
    expect(t10.version).toBe('2.0');
    expect(Array.from(t10.reference)).toEqual([20]);
    near(v(t10, 0, 0, 0), { re: 74.069, im: -5.179 }, 1e-3);
    for (let k = 0; k < 5; k++) near(v(t10, k, 0, 0), v(t9, k, 0, 0), 1e-12);
  });

  it('reads [Reference] on its own line (Example 4), on the keyword line (Example 5) and split (Example 6)', () => {
    const t4 = parseTouchstone(EXAMPLE_4, { file: 'ex4.ts' });
    const t5 = parseTouchstone(EXAMPLE_5, { file: 'ex5.ts' });
    const t6 = parseTouchstone(EXAMPLE_6, { file: 'ex6.ts' });
    for (const t of [t4, t5, t6]) expect(Array.from(t.reference)).toEqual([50, 75, 0.01, 0.01]);
    expect(t6.matrixFormat).toBe('Lower');
    // Example 6 is Example 5's symmetric matrix in Lower form: the same 16 values
    expect(Array.from(t6.values)).toEqual(Array.from(t5.values));
    expect(Array.from(t4.values)).toEqual(Array.from(t5.values));
    near(v(t6, 0, 0, 3), polar(0.53, -79.34), 1e-15);
  });

  it('reads the Upper form into the same matrix', () => {
    const upper =
      `${HEADER_4PORT}[Matrix Format] Upper\n[Network Data]\n5 0.60 161.24 0.40 -42.20 0.42 -66.58 0.53 -79.34\n0.60 161.20 0.53 -79.34 0.42 -66.58\n` +
      '0.60 161.24 0.40 -42.20\n0.60 161.24\n[End]\n';
    const t = parseTouchstone(upper, { file: 'up.ts' });
    expect(Array.from(t.values)).toEqual(Array.from(parseTouchstone(EXAMPLE_5, { file: 'ex5.ts' }).values));
  });

  it('reads Example 17: [Two-Port Data Order] 21_12, per-port [Reference], noise data skipped', () => {
    const t = parseTouchstone(EXAMPLE_17, { file: 'ex17.ts' });
    expect(t.twoPortOrder).toBe('21_12');
    expect(Array.from(t.reference)).toEqual([50, 25]);
    expect(t.noisePoints).toBe(2);
    near(v(t, 0, 1, 0), polar(3.57, 157), 1e-15); // second pair is 21
    const t12 = parseTouchstone(EXAMPLE_17.replace('21_12', '12_21'), { file: 'ex17b.ts' });
    near(v(t12, 0, 0, 1), polar(3.57, 157), 1e-15); // second pair is 12
  });

  it('lets network data wrap freely (2.0 removed the line rules)', () => {
    const t = parseTouchstone('[Version] 2.0\n# GHz S RI\n[Number of Ports] 2\n[Two-Port Data Order] 12_21\n[Number of Frequencies] 2\n[Network Data]\n1 0.1 0\n0.2 0 0.2 0 0.1 0 2\n0.3 0 0.4 0 0.4 0 0.3 0\n[End]\n', { file: 'w.ts' });
    near(v(t, 1, 0, 1), { re: 0.4, im: 0 }, 0);
  });

  it('converts to NetworkData, and refuses G- and H-parameters for conversion', () => {
    const net = toNetworkData(parseTouchstone(EXAMPLE_10, { file: 'ex10.ts' }));
    expect(net.kind).toBe('Z');
    const h = '[Version] 2.0\n# kHz H MA R 1\n[Number of Ports] 2\n[Two-Port Data Order] 21_12\n[Number of Frequencies] 1\n[Matrix Format] Full\n[Network Data]\n2 .95 -26 3.57 157 .04 76 .66 -14\n[End]\n';
    expect(() => toNetworkData(parseTouchstone(h, { file: 'ex12.ts' }))).toThrow(/G- and H-parameter files are read but not converted/);
  });
});

describe('errors name the file, the line and what was expected', () => {
  it('refuses frequencies that do not increase', () => {
    const p = problems('# MHz S MA R 50\n100 0.5 0\n100 0.4 0\n', 'a.s1p');
    expect(p[0]).toMatch(/^a\.s1p:3:1 network data: "100" — expected a frequency above the previous one/);
  });

  it('points at a token that is not a number', () => {
    expect(problems('# GHz S RI R 50\n1 0.5 O.1\n', 'b.s1p')[0]).toMatch(/^b\.s1p:2:7 network data: "O\.1" — expected a number/);
  });

  it('says how many numbers a set needs', () => {
    expect(problems('# GHz S RI R 50\n1 0.5 0.1 0.2 0.3 0.4 0.5 0.6\n', 'c.s2p')[0]).toMatch(/expected complete data sets of 9 numbers/);
  });

  it('checks the option line field by field', () => {
    const p = problems('# GHz S XY R -5\n1 0 0\n', 'd.s1p');
    expect(p.join('\n')).toMatch(/d\.s1p:1:9 option line: "XY" — expected a frequency unit/);
    expect(p.join('\n')).toMatch(/d\.s1p:1:14 option line: "-5" — expected a positive reference resistance/);
  });

  it('wants a 1.x matrix row to start on a new line', () => {
    const bad = EXAMPLE_14.replace(' !row 1\n0.40 -42.20 0.60 161.20', ' 0.40 -42.20 0.60 161.20');
    expect(problems(bad, 'e.s4p').join('\n')).toMatch(/e\.s4p:4:\d+ network data: .* — expected row 2 of the 4×4 matrix to start on a new line/);
  });

  it('requires [End], [Number of Ports], [Two-Port Data Order] in 2-port files, and the announced count of numbers', () => {
    expect(problems(EXAMPLE_10.replace('[End]\n', ''), 'f.ts')[0]).toMatch(/expected the \[End\] keyword/);
    expect(problems(EXAMPLE_10.replace('[Number of Ports] 1\n', ''), 'f.ts')[0]).toMatch(/\[Reference\]|\[Number of Ports\]/);
    expect(problems(EXAMPLE_17.replace('[Two-Port Data Order] 21_12\n', ''), 'f.ts')[0]).toMatch(/expected \[Two-Port Data Order\] 12_21 or 21_12/);
    expect(problems(EXAMPLE_10.replace('[Number of Frequencies] 5', '[Number of Frequencies] 6'), 'f.ts')[0]).toMatch(/expected 6 frequencies × 3 values/);
  });

  it('suggests the keyword meant, and refuses mixed-mode data', () => {
    expect(problems(EXAMPLE_10.replace('[Number of Ports]', '[Number of Port]'), 'g.ts')[0]).toMatch(/g\.ts:4:1 .*did you mean \[Number of Ports\]/);
    expect(problems(EXAMPLE_5.replace('[Matrix Format] Full', '[Mixed-Mode Order] D1,2 D3,4 C1,2 C3,4'), 'h.ts')[0]).toMatch(/mixed-mode files are not supported yet/);
  });

  it('refuses an empty file and a file that starts with data', () => {
    expect(problems('! only a comment\n', 'i.s2p')[0]).toMatch(/expected an option line/);
    expect(problems('1 0.5 0\n', 'j.s1p')[0]).toMatch(/j\.s1p:1:1 .*expected the option line/);
  });
});
