import { describe, expect, it } from 'vitest';
import { LINE_FORMS, allLineKeys, fromZ0AndDelay, readLine, type LineForm } from '../../../src/scenario/lines.js';
import { fromValue } from '../../../src/scenario/parse.js';
import { Problems } from '../../../src/scenario/problems.js';
import { Reader } from '../../../src/scenario/read.js';
import { SPEED_OF_LIGHT } from '../../../src/units.js';

function line(value: unknown, forms?: readonly LineForm[]) {
  const problems = new Problems('t.json');
  const rlgc = readLine(new Reader(problems), fromValue(value), 'lines.trace', undefined, forms);
  return { rlgc, problems: problems.errors };
}
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('line forms → LineRLGC (telegrapher relations: Z0 = √(L′/C′), v = 1/√(L′C′))', () => {
  it('z0 50 Ω with delay 6.67 ns/m gives L′ = 333.5 nH/m and C′ = 133.4 pF/m', () => {
    const { rlgc, problems } = line({ z0: '50ohm', delay: '6.67ns/m' });
    expect(problems).toEqual([]);
    expect(rel(rlgc!.l, 333.5e-9)).toBeLessThan(1e-12);
    expect(rel(rlgc!.c, 133.4e-12)).toBeLessThan(1e-12);
    expect(rlgc!.r).toBe(0);
    expect(rlgc!.g).toBe(0);
    // and back: Z0 = √(L′/C′), delay per length = √(L′C′)
    expect(rel(Math.sqrt(rlgc!.l / rlgc!.c), 50)).toBeLessThan(1e-12);
    expect(rel(Math.sqrt(rlgc!.l * rlgc!.c), 6.67e-9)).toBeLessThan(1e-12);
  });

  it('delay per inch: 150 ps/in on 50 Ω', () => {
    const { rlgc } = line({ z0: '50ohm', delay: '150ps/in' });
    const tau = 150e-12 / 0.0254;
    expect(rel(rlgc!.l, 50 * tau)).toBeLessThan(1e-12);
    expect(rel(rlgc!.c, tau / 50)).toBeLessThan(1e-12);
  });

  it('z0 with velocity 0.66c: v = 1/√(L′C′) = 0.66c and Z0 = √(L′/C′)', () => {
    const { rlgc } = line({ z0: '75ohm', velocity: '0.66c' });
    expect(rel(1 / Math.sqrt(rlgc!.l * rlgc!.c), 0.66 * SPEED_OF_LIGHT)).toBeLessThan(1e-12);
    expect(rel(Math.sqrt(rlgc!.l / rlgc!.c), 75)).toBeLessThan(1e-12);
  });

  it('z0 with velocity 2e8 m/s', () => {
    const { rlgc } = line({ z0: '50ohm', velocity: '2e8m/s' });
    expect(rel(rlgc!.l, 250e-9)).toBeLessThan(1e-12);
    expect(rel(rlgc!.c, 100e-12)).toBeLessThan(1e-12);
  });

  it('l and c directly, with losses r and g', () => {
    const { rlgc, problems } = line({ l: '250nH/m', c: '100pF/m', r: '0.5ohm/m', g: '20uS/m' });
    expect(problems).toEqual([]);
    expect(rlgc).toEqual({ r: 0.5, l: 250e-9, g: 20e-6, c: 100e-12 });
  });

  it('losses on the z0 forms too', () => {
    expect(line({ z0: '50ohm', delay: '5ns/m', r: '2ohm/m' }).rlgc!.r).toBe(2);
    expect(line({ z0: '50ohm', velocity: '0.5c', g: '1mS/m' }).rlgc!.g).toBe(1e-3);
  });

  it('fromZ0AndDelay: L′ = Z0·τ, C′ = τ/Z0', () => {
    expect(fromZ0AndDelay(100, 5e-9)).toEqual({ l: 500e-9, c: 5e-11 });
  });
});

describe('line problems', () => {
  const paths = (value: unknown) => line(value).problems.map((p) => [p.path, p.value, p.expected] as const);

  it('a line given two ways: z0+delay and l+c', () => {
    const ps = paths({ z0: '50ohm', delay: '6.67ns/m', l: '333nH/m', c: '133pF/m' });
    expect(ps).toHaveLength(1);
    expect(ps[0][0]).toBe('lines.trace.l');
    expect(ps[0][2]).toMatch(/^a line given one way only: it is given both as z0\+delay and as l\+c/);
  });

  it('delay and velocity together', () => {
    const ps = paths({ z0: '50ohm', delay: '6.67ns/m', velocity: '0.5c' });
    expect(ps.map((p) => p[0])).toEqual(['lines.trace.velocity']);
    expect(ps[0][2]).toContain('z0+delay and as z0+velocity');
  });

  it('a complete form plus a stray key of another form ("c" next to z0+delay)', () => {
    const ps = paths({ z0: '50ohm', delay: '6.67ns/m', c: '100pF/m' });
    expect(ps).toEqual([['lines.trace.c', '100pF/m', expect.stringContaining('"c" belongs to l+c, but this line is given as z0+delay')]]);
  });

  it('half a form: a missing key, or z0 alone', () => {
    expect(paths({ l: '250nH/m' })).toEqual([['lines.trace.c', undefined, expect.stringContaining('"c" to complete the l+c form')]]);
    expect(paths({ z0: '50ohm' })[0][2]).toMatch(/^a complete line: "z0" needs the rest of/);
    expect(paths({})[0][2]).toMatch(/^a line like /);
    expect(paths('50ohm')[0][2]).toMatch(/^a line like /);
  });

  it('unknown keys are typos with a suggestion, and the typo is not reported again as missing', () => {
    const ps = paths({ z0: '50ohm', dealy: '6.67ns/m' });
    expect(ps.some((p) => p[0] === 'lines.trace.dealy' && p[2].includes('did you mean "delay"?'))).toBe(true);
  });

  it('wrong dimensions and signs', () => {
    expect(paths({ z0: '50ohm', delay: '6.67ns' })).toEqual([['lines.trace.delay', '6.67ns', 'a delay per length > 0 like "6.67ns/m"']]);
    expect(paths({ z0: '-50ohm', delay: '6.67ns/m' })).toEqual([['lines.trace.z0', '-50ohm', 'a resistance > 0 like "50ohm"']]);
    expect(paths({ l: '250nH/m', c: '0pF/m' })).toEqual([['lines.trace.c', '0pF/m', 'a capacitance per length > 0 like "100pF/m"']]);
    expect(paths({ l: '250nH/m', c: '100pF/m', r: '-1ohm/m' })).toEqual([['lines.trace.r', '-1ohm/m', 'a resistance per length ≥ 0 like "0.5ohm/m"']]);
    expect(paths({ l: '250nH/m', c: '100pF/m', g: '1ohm/m' })).toEqual([['lines.trace.g', '1ohm/m', 'a conductance per length ≥ 0 like "20uS/m"']]);
  });

  it('a line faster than light is refused (1 % allowance for rounding: "3.33ns/m" passes)', () => {
    expect(paths({ z0: '50ohm', delay: '1ns/m' })[0][2]).toMatch(/^a line no faster than light/);
    expect(paths({ z0: '50ohm', velocity: '1.5c' })[0][2]).toMatch(/^a line no faster than light/);
    expect(paths({ z0: '50ohm', delay: '3.33ns/m' })).toEqual([]);
    expect(paths({ z0: '50ohm', velocity: '1c' })).toEqual([]);
  });
});

describe('the form table is open for new forms', () => {
  // A stand-in for a later form (a coax-like description by εr): only a table entry, no core change.
  const byEr: LineForm = {
    id: 'z0+er',
    required: ['z0', 'er'],
    example: '{"z0": "50ohm", "er": 2.25}',
    build(o) {
      const z0 = o.quantity('z0', { dim: 'resistance' });
      const er = o.quantity('er', { dim: 'fraction', range: { min: 1 } });
      return z0 === undefined || er === undefined ? undefined : fromZ0AndDelay(z0, Math.sqrt(er) / SPEED_OF_LIGHT);
    },
  };
  // A more specific form (its keys contain another's) wins over the general one.
  const datasheet: LineForm = {
    id: 'z0+delay+loss',
    required: ['z0', 'delay', 'loss'],
    example: '{"z0": "50ohm", "delay": "5ns/m", "loss": "1ohm/m"}',
    losses: false,
    build(o) {
      const base = LINE_FORMS[0].build(o);
      const r = o.quantity('loss', { dim: 'resistancePerLength' });
      return base && r !== undefined ? { ...base, r } : undefined;
    },
  };
  const forms = [...LINE_FORMS, byEr, datasheet];

  it('a new form is picked from its keys', () => {
    const { rlgc, problems } = line({ z0: '50ohm', er: 2.25 }, forms);
    expect(problems).toEqual([]);
    expect(rel(1 / Math.sqrt(rlgc!.l * rlgc!.c), SPEED_OF_LIGHT / 1.5)).toBeLessThan(1e-12);
  });

  it('clashes with the old forms are still found', () => {
    const { problems } = line({ z0: '50ohm', er: 2.25, delay: '5ns/m' }, forms);
    expect(problems[0].expected).toContain('given both as z0+delay and as z0+er');
  });

  it('the more specific form wins; its own r (and its refusal of the common loss keys) apply', () => {
    expect(line({ z0: '50ohm', delay: '5ns/m', loss: '3ohm/m' }, forms).rlgc!.r).toBe(3);
    const { problems } = line({ z0: '50ohm', delay: '5ns/m', loss: '3ohm/m', r: '1ohm/m' }, forms);
    expect(problems.map((p) => p.path)).toEqual(['lines.trace.r']);
  });

  it('allLineKeys lists every key of every form', () => {
    expect(allLineKeys().sort()).toEqual(['attenuation', 'c', 'coax', 'delay', 'g', 'l', 'microstrip', 'r', 'rdc', 'stripline', 'twoWire', 'velocity', 'z0']);
    expect(allLineKeys(forms)).toContain('er');
  });
});
