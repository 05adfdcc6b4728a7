import { describe, expect, it } from 'vitest';
import {
  DIMENSIONS,
  NON_NEGATIVE,
  POSITIVE,
  SPEED_OF_LIGHT,
  expectedPhrase,
  formatSI,
  parseQuantity,
  quantity,
  suggestUnits,
  unitFactor,
  type Dimension,
} from '../../src/units.js';

const ok = (v: unknown, dim: Dimension) => {
  const r = parseQuantity(v, dim);
  if (!r.ok) throw new Error(`${String(v)} as ${dim}: expected ${r.expected}`);
  return r.value;
};
const close = (a: number, b: number, rel = 1e-12) => expect(Math.abs(a - b)).toBeLessThanOrEqual(rel * Math.abs(b));

describe('parseQuantity: prefixes and units', () => {
  it.each([
    ['3.3V', 'voltage', 3.3],
    ['-1.25 V', 'voltage', -1.25],
    ['600ps', 'time', 600e-12],
    ['1.5ns', 'time', 1.5e-9],
    ['2us', 'time', 2e-6],
    ['2µs', 'time', 2e-6], // U+00B5 micro sign
    ['2μs', 'time', 2e-6], // U+03BC Greek mu
    ['1ms', 'time', 1e-3],
    ['3fs', 'time', 3e-15],
    ['12ohm', 'resistance', 12],
    ['12Ω', 'resistance', 12],
    ['12\u2126', 'resistance', 12], // ohm sign
    ['1kohm', 'resistance', 1e3],
    ['4.7kΩ', 'resistance', 4.7e3],
    ['1Mohm', 'resistance', 1e6], // mega
    ['1mohm', 'resistance', 1e-3], // milli
    ['5mΩ', 'resistance', 5e-3],
    ['2nH', 'inductance', 2e-9],
    ['3pF', 'capacitance', 3e-12],
    ['100nF', 'capacitance', 100e-9],
    ['20mS', 'conductance', 20e-3],
    ['10mA', 'current', 10e-3],
    ['100MHz', 'frequency', 100e6],
    ['2.5GHz', 'frequency', 2.5e9],
    ['1m', 'length', 1], // "m" alone is the metre
    ['10mm', 'length', 0.01],
    ['2cm', 'length', 0.02],
    ['25um', 'length', 25e-6],
    ['25µm', 'length', 25e-6],
    ['1km', 'length', 1000],
    ['0.5ohm/m', 'resistancePerLength', 0.5],
    ['250nH/m', 'inductancePerLength', 250e-9],
    ['100pF/m', 'capacitancePerLength', 100e-12],
    ['20uS/m', 'conductancePerLength', 20e-6],
    ['6.67ns/m', 'delayPerLength', 6.67e-9],
    ['2e8m/s', 'velocity', 2e8],
    ['200 km/s', 'velocity', 2e5],
    ['50%', 'fraction', 0.5],
    ['0.25', 'fraction', 0.25],
    ['3dB', 'decibels', 3],
    ['5.8e7S/m', 'conductivity', 5.8e7],
    ['4.3dB/100m', 'attenuationPerLength', 0.043],
  ] as const)('%s as %s = %d', (text, dim, want) => {
    close(ok(text, dim), want);
  });

  it('takes plain numbers, and unit-less strings, in SI base units', () => {
    expect(ok(50, 'resistance')).toBe(50);
    expect(ok(6e-10, 'time')).toBe(6e-10);
    expect(ok('6e-10', 'time')).toBe(6e-10);
    expect(ok(0.0762, 'length')).toBe(0.0762);
    expect(ok(2e8, 'velocity')).toBe(2e8);
  });

  it('keeps decimal units exact where a double can: "3in" is 0.0762, "1.5nH/m" is 1.5e-9', () => {
    expect(ok('3in', 'length')).toBe(0.0762);
    expect(ok('1.5nH/m', 'inductancePerLength')).toBe(1.5e-9);
    expect(ok('12cm', 'length')).toBe(ok('120mm', 'length'));
    expect(ok('2ft', 'length')).toBe(ok('24in', 'length'));
  });
});

describe('parseQuantity: imperial lengths (international yard and pound agreement, 1959; NIST SP 811 appendix B)', () => {
  it('1 in = 25.4 mm exactly', () => expect(ok('1in', 'length')).toBe(0.0254));
  it('1 mil = 0.001 in = 25.4 µm', () => expect(ok('1mil', 'length')).toBe(25.4e-6));
  it('1 ft = 0.3048 m exactly', () => expect(ok('1ft', 'length')).toBe(0.3048));
  it('5 mil = 127 µm', () => close(ok('5mil', 'length'), 127e-6));
  it('per-length units divide by the same lengths: 150 ps/in = 5.905 ns/m', () => {
    close(ok('150ps/in', 'delayPerLength'), 150e-12 / 0.0254);
    close(ok('1ohm/ft', 'resistancePerLength'), 1 / 0.3048);
    close(ok('3pF/in', 'capacitancePerLength'), 3e-12 / 0.0254);
    close(ok('1ns/mm', 'delayPerLength'), 1e-6);
    close(ok('1nH/cm', 'inductancePerLength'), 1e-7);
  });
});

describe('parseQuantity: velocity', () => {
  it('"0.66c" is 0.66 × 299 792 458 m/s (c exact by the SI definition of the metre)', () => {
    expect(SPEED_OF_LIGHT).toBe(299_792_458);
    close(ok('0.66c', 'velocity'), 0.66 * 299_792_458);
    close(ok('1c', 'velocity'), 299_792_458);
  });
  it('"7in/ns" is 7 × 0.0254 m per 1e-9 s', () => close(ok('7in/ns', 'velocity'), 0.1778e9));
});

describe('parseQuantity: refusals say what was expected', () => {
  it('wrong dimension: a length where a time is expected', () => {
    expect(parseQuantity('3in', 'time')).toEqual({ ok: false, expected: 'a time like "600ps"' });
  });
  it.each([
    ['600ps', 'length', 'a length like "3in"'],
    ['3.3V', 'resistance', 'a resistance like "50ohm"'],
    ['3pF', 'capacitancePerLength', 'a capacitance per length like "100pF/m"'],
    ['100pF/m', 'capacitance', 'a capacitance like "3pF"'],
    ['1ohm', 'resistancePerLength', 'a resistance per length like "0.5ohm/m"'],
    ['250nH/m', 'delayPerLength', 'a delay per length like "6.67ns/m"'],
    ['6.67ns/m', 'velocity', 'a velocity like "0.66c"'],
    ['20uS/m', 'conductance', 'a conductance like "20mS"'],
    ['3pS', 'length', 'a length like "3in"'], // picosiemens: no length unit is spelt p-s in any case
  ] as const)('%s as %s', (text, dim, expected) => {
    expect(parseQuantity(text, dim)).toEqual({ ok: false, expected });
  });
  it('an unknown unit lists the units of the dimension', () => {
    const r = parseQuantity('3 furlongs', 'length');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.expected).toBe('a length like "3in"; units: m*, cm, in, mil, ft (*: with an SI prefix f p n u m k M G T)');
  });
  it.each([[''], ['abc'], ['ns'], ['1.2.3ns'], ['--1ns'], ['1 e 9']])('malformed %j', (text) => {
    expect(parseQuantity(text, 'time').ok).toBe(false);
  });
  it.each([[true], [null], [undefined], [[1]], [{ v: 1 }], [NaN]])('not a quantity: %j', (v) => {
    expect(parseQuantity(v, 'time')).toEqual({ ok: false, expected: 'a time like "600ps"' });
  });
  it.each([[Infinity], ['1e999s'], ['-1e999s']])('beyond any real value: %j (the refusal names the magnitudes accepted)', (v) => {
    expect(parseQuantity(v, 'time')).toEqual({ ok: false, expected: 'a time of 0 or from 1fs to 1000000s in size like "600ps"' });
  });
  it('prefixes do not apply to fixed units ("kin", "Mft", "mc" are not units)', () => {
    expect(parseQuantity('1kin', 'length').ok).toBe(false);
    expect(parseQuantity('1Mft', 'length').ok).toBe(false);
    expect(parseQuantity('1mc', 'velocity').ok).toBe(false);
    expect(parseQuantity('1Kohm', 'resistance').ok).toBe(false); // kilo is lower-case k
  });
  it('ranges: negative lengths, zero or negative times', () => {
    expect(parseQuantity('-3in', 'length', NON_NEGATIVE)).toEqual({ ok: false, expected: 'a length ≥ 0 like "3in"' });
    expect(parseQuantity('0in', 'length', NON_NEGATIVE)).toEqual({ ok: true, value: 0 });
    expect(parseQuantity('0ps', 'time', POSITIVE)).toEqual({ ok: false, expected: 'a time > 0 like "600ps"' });
    expect(parseQuantity('-1ns', 'time', POSITIVE, '1ns')).toEqual({ ok: false, expected: 'a time > 0 like "1ns"' });
    expect(parseQuantity('150%', 'fraction', { min: 0, max: 1, minExclusive: true, maxExclusive: true })).toEqual({
      ok: false,
      expected: 'a fraction between 0 and 1 (exclusive) like "50%"',
    });
    expect(expectedPhrase('length', { min: 0, max: 0.0762 })).toBe('a length between 0 and 76.2mm like "3in"');
  });
  it('quantity() throws with the expectation', () => {
    expect(() => quantity('3in', 'time')).toThrow('expected a time like "600ps"');
    expect(quantity('3in', 'length')).toBe(0.0762);
  });
});

describe('parseQuantity: a misspelt unit gets the spelling it most likely meant', () => {
  // Unit and prefix symbols are case-sensitive: F farad, s second, Hz hertz, m milli, M mega (BIPM,
  // The International System of Units, 9th ed. 2019, Tables 4 and 7). A letter in the wrong case is the
  // commonest slip; the suggestion is still a refusal, never a silent reading.
  it.each([
    ['3 pf', 'capacitance', '"3pF"'],
    ['600 PS', 'time', '"600ps"'],
    ['3.3 v', 'voltage', '"3.3V"'],
    ['250nh/M', 'inductancePerLength', '"250nH/m"'],
    ['1 OZ', 'thickness', '"1oz"'],
    ['7 in/NS', 'velocity', '"7in/ns"'],
    // written-out words for our symbols
    ['150ps/inch', 'delayPerLength', '"150ps/in"'],
    ['5 mils', 'length', '"5mil"'],
    ['3 volts', 'voltage', '"3V"'],
    ['10 meters', 'length', '"10m"'],
    // one letter off
    ['4 pff', 'capacitance', '"4fF" or "4pF"'],
  ] as const)('%j as %s → %s', (text, dim, spelled) => {
    const r = parseQuantity(text, dim);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.expected).toMatch(new RegExp(`— did you mean ${spelled.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&')}\\?$`));
  });
  it('where the case decides between two prefixes, both readings are offered: milli or mega', () => {
    expect(suggestUnits('time', 'MS')).toEqual(['ms', 'Ms']);
    expect(suggestUnits('frequency', 'mhz')).toEqual(['mHz', 'MHz']);
  });
  it('a unit of another dimension is taken for a slip only when the case differs: "2nS" (nanosiemens) as a time', () => {
    const r = parseQuantity('2nS', 'time');
    expect(r).toEqual({ ok: false, expected: 'a time like "600ps" — did you mean "2ns"?' });
  });
  it('nothing close: the units are listed instead', () => {
    expect(suggestUnits('length', 'furlongs')).toEqual([]);
    expect(parseQuantity('3 xyz', 'capacitance')).toEqual({ ok: false, expected: 'a capacitance like "3pF"; units: F* (*: with an SI prefix f p n u m k M G T)' });
  });
  it('every suggestion parses in its dimension', () => {
    for (const [text, dim] of [['3 pf', 'capacitance'], ['150ps/inch', 'delayPerLength'], ['2 MS', 'time'], ['4 pff', 'capacitance']] as const) {
      const unit = text.replace(/^[\d.]+\s*/, '');
      for (const g of suggestUnits(dim, unit)) expect(parseQuantity(`1${g}`, dim).ok).toBe(true);
    }
  });
});

describe('the dimension table', () => {
  it('every dimension parses its own example', () => {
    for (const dim of Object.keys(DIMENSIONS) as Dimension[]) {
      const r = parseQuantity(DIMENSIONS[dim].example, dim);
      expect(r.ok, `${dim}: ${DIMENSIONS[dim].example}`).toBe(true);
    }
  });
  it('no unit name is ambiguous: where a listed name could also be read as prefix + unit, both readings agree', () => {
    const PREFIX_EXP: Record<string, number> = { f: -15, p: -12, n: -9, u: -6, '\u00b5': -6, '\u03bc': -6, m: -3, k: 3, M: 6, G: 9, T: 12 };
    for (const dim of Object.keys(DIMENSIONS) as Dimension[]) {
      const units = DIMENSIONS[dim].units as Record<string, { factor: number; prefixes: boolean; per?: number }>;
      for (const [name, def] of Object.entries(units)) {
        for (const [p, e] of Object.entries(PREFIX_EXP)) {
          const rest = name.startsWith(p) ? units[name.slice(p.length)] : undefined;
          if (!rest?.prefixes) continue;
          const prefixed = (rest.factor * 10 ** e) / (rest.per ?? 1);
          close((def.factor / (def.per ?? 1)) as number, prefixed, 1e-12);
        }
      }
    }
    expect(unitFactor('length', 'mm')).toBeCloseTo(1e-3, 15);
  });
});

describe('formatSI', () => {
  it.each([
    [1.5e-9, 's', '1.5 ns'],
    [3.3, 'V', '3.3 V'],
    [0, 'V', '0 V'],
    [-2.5e-12, 's', '-2.5 ps'],
    [25.4e-6, 'm', '25.4 µm'],
    [0.0762, 'm', '76.2 mm'],
    [50, 'ohm', '50 ohm'],
    [1e6, 'ohm', '1 Mohm'],
    [999.96, 'V', '1 kV'], // rounding carries into the next prefix
    [12345678, 'Hz', '12.35 MHz'],
    [1e-18, 's', '0.001 fs'],
    [0.5, '', '0.5'],
  ] as const)('%d %s → %s', (v, unit, want) => {
    expect(formatSI(v, unit)).toBe(want);
  });
  it('ascii mode writes u for micro; digits are adjustable', () => {
    expect(formatSI(2e-6, 's', 4, { ascii: true })).toBe('2 us');
    expect(formatSI(1.23456e-9, 's', 2)).toBe('1.2 ns');
  });
  it('round-trips through parseQuantity', () => {
    for (const v of [1.5e-9, 6.67e-9, 3.3, 47e3, 2.2e-12]) {
      const s = formatSI(v, 's', 15, { ascii: true }).replace(' ', '');
      close(ok(s, 'time'), v, 1e-12);
    }
  });
});

describe('parseQuantity: magnitudes beyond any board, cable or part', () => {
  // The bounds are common practice (several decades past real parts), chosen so that products of
  // quantities stay finite; each refusal names the span accepted, not a symptom further down.
  it.each([
    ['1e300ohm', 'resistance', NON_NEGATIVE, 'a resistance of 0 or from 1µohm to 1Tohm like "50ohm"'],
    ['1e-300F', 'capacitance', POSITIVE, 'a capacitance from 0.001fF to 1F like "3pF"'],
    ['1e308V', 'voltage', undefined, 'a voltage of 0 or from 1pV to 1MV in size like "3.3V"'],
    ['1e300Hz', 'frequency', POSITIVE, 'a frequency from 1mHz to 10THz like "100MHz"'],
    ['1e-300S/m', 'conductivity', POSITIVE, 'a conductivity from 1kS/m to 1GS/m like "5.8e7S/m"'],
    ['1e300dB/m', 'attenuationPerLength', POSITIVE, 'an attenuation per length up to 10000dB/m like "4.3dB/100m"'],
    ['1e300m', 'length', POSITIVE, 'a length from 1nm to 100km like "3in"'],
    ['1e-308s', 'time', POSITIVE, 'a time from 1fs to 1000000s like "600ps"'],
  ] as const)('%s as %s', (text, dim, range, expected) => {
    expect(parseQuantity(text, dim, range)).toEqual({ ok: false, expected });
  });

  it('keeps the plain range message for a value on the wrong side of zero', () => {
    expect(parseQuantity('-5ohm', 'resistance', NON_NEGATIVE)).toEqual({ ok: false, expected: 'a resistance ≥ 0 like "50ohm"' });
  });

  it('accepts 0 where the range allows it, and the ends of each span', () => {
    expect(parseQuantity('0ohm', 'resistance', NON_NEGATIVE)).toEqual({ ok: true, value: 0 });
    expect(parseQuantity('1Tohm', 'resistance', NON_NEGATIVE)).toEqual({ ok: true, value: 1e12 });
    expect(parseQuantity('1uohm', 'resistance', NON_NEGATIVE)).toEqual({ ok: true, value: 1e-6 });
    expect(parseQuantity('-1MV', 'voltage')).toEqual({ ok: true, value: -1e6 });
  });
});
