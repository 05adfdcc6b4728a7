import { describe, expect, it } from 'vitest';
import { checkScenarioValue, parseScenario, scenarioFromValue, ScenarioError } from '../../../src/scenario/load.js';
import type { Signal } from '../../../sim/model.js';

const scenario = (signal: unknown) => ({ driver: { signal, resistance: '25ohm' }, route: [] });
const signalOf = (signal: unknown): Signal => scenarioFromValue(scenario(signal)).driver.signal;
function problems(signal: unknown): Array<[string, unknown, string]> {
  try {
    scenarioFromValue(scenario(signal));
  } catch (e) {
    if (e instanceof ScenarioError) return e.problems.map((p) => [p.path, p.value, p.expected]);
    throw e;
  }
  return [];
}
const P = 'driver.signal';

describe('signals: kinds, units and defaults', () => {
  it('step (start defaults to 0)', () => {
    expect(signalOf({ kind: 'step', from: '0V', to: '3.3V', start: '1ns', rise: '600ps' })).toEqual({ kind: 'step', from: 0, to: 3.3, start: 1e-9, rise: 600e-12 });
    expect(signalOf({ kind: 'step', from: '3.3V', to: 0, rise: '1ns' })).toEqual({ kind: 'step', from: 3.3, to: 0, start: 0, rise: 1e-9 });
  });

  it('pulse (fall defaults to rise)', () => {
    expect(signalOf({ kind: 'pulse', from: '0V', to: '1V', rise: '1ns', width: '4ns' })).toEqual({
      kind: 'pulse',
      from: 0,
      to: 1,
      start: 0,
      rise: 1e-9,
      width: 4e-9,
      fall: 1e-9,
    });
  });

  it('clock (fall = rise, duty 0.5, start 0 by default; duty as a percentage or a number)', () => {
    expect(signalOf({ kind: 'clock', low: '0V', high: '3.3V', period: '40ns', rise: '1ns' })).toEqual({
      kind: 'clock',
      low: 0,
      high: 3.3,
      period: 40e-9,
      rise: 1e-9,
      fall: 1e-9,
      duty: 0.5,
      start: 0,
    });
    const s = signalOf({ kind: 'clock', low: '0V', high: '1V', period: '40ns', rise: '1ns', fall: '2ns', duty: '25%', start: '5ns' });
    expect(s).toMatchObject({ fall: 2e-9, duty: 0.25, start: 5e-9 });
    expect(signalOf({ kind: 'clock', low: 0, high: 1, period: '40ns', rise: '1ns', duty: 0.3 })).toMatchObject({ duty: 0.3 });
  });

  it('bits: prbs7/9/15 and literal patterns', () => {
    const s = signalOf({ kind: 'bits', low: '0V', high: '3.3V', bitTime: '5ns', rise: '600ps', pattern: 'prbs7' });
    if (s.kind !== 'bits') throw new Error(s.kind);
    expect(s).toMatchObject({ low: 0, high: 3.3, bitTime: 5e-9, rise: 600e-12, fall: 600e-12, start: 0, patternName: 'prbs7' });
    expect(s.bits.length).toBe(127);
    const p15 = signalOf({ kind: 'bits', low: 0, high: 1, bitTime: '1ns', rise: '100ps', pattern: 'prbs15' });
    expect(p15.kind === 'bits' && p15.bits.length).toBe(32767);
    const lit = signalOf({ kind: 'bits', low: 0, high: 1, bitTime: '1ns', rise: '100ps', pattern: '0110 1000_1' });
    if (lit.kind !== 'bits') throw new Error(lit.kind);
    expect(Array.from(lit.bits)).toEqual([0, 1, 1, 0, 1, 0, 0, 0, 1]);
    expect(lit.patternName).toBe('literal');
  });

  it('table: points to numbers', () => {
    expect(signalOf({ kind: 'table', points: [['0ns', '0V'], ['1ns', '3.3V'], [2e-9, 0]] })).toEqual({
      kind: 'table',
      points: [
        [0, 0],
        [1e-9, 3.3],
        [2e-9, 0],
      ],
    });
  });

  it('YAML: a literal pattern written without quotes keeps its leading zeros', () => {
    const yaml = 'driver:\n  signal: {kind: bits, low: 0V, high: 1V, bitTime: 1ns, rise: 100ps, pattern: 0011}\n  resistance: 50ohm\nroute: []\n';
    const s = parseScenario(yaml, 'p.yaml').driver.signal;
    expect(s.kind === 'bits' && Array.from(s.bits)).toEqual([0, 0, 1, 1]);
  });
});

describe('signals: bad parameters', () => {
  it('rise ≤ 0, wrong dimensions, missing keys', () => {
    expect(problems({ kind: 'step', from: '0V', to: '1V', rise: '0ns' })).toEqual([[`${P}.rise`, '0ns', 'a time > 0 like "600ps"']]);
    expect(problems({ kind: 'step', from: '0V', to: '1V', rise: '-1ns' })).toEqual([[`${P}.rise`, '-1ns', 'a time > 0 like "600ps"']]);
    expect(problems({ kind: 'step', from: '0V', to: '1ns', rise: '1V' })).toEqual([
      [`${P}.to`, '1ns', 'a voltage like "3.3V"'],
      [`${P}.rise`, '1V', 'a time > 0 like "600ps"'],
    ]);
    expect(problems({ kind: 'step', to: '1V', rise: '1ns' })).toEqual([[`${P}.from`, undefined, 'a voltage like "0V"']]);
    expect(problems({ kind: 'step', from: 0, to: 1, rise: '1ns', start: '-1ns' })).toEqual([[`${P}.start`, '-1ns', 'a time ≥ 0 like "1ns"']]);
  });

  it('kind: missing, unknown (with a suggestion), or keys of another kind', () => {
    expect(problems({ from: '0V' })[0]).toEqual([`${P}.kind`, undefined, '"kind": one of "step", "pulse", "clock", "bits", "table"']);
    expect(problems({ kind: 'clok' })).toEqual([[`${P}.kind`, 'clok', 'one of "step", "pulse", "clock", "bits", "table" (did you mean "clock"?)']]);
    const ps = problems({ kind: 'step', from: 0, to: 1, rise: '1ns', width: '3ns' });
    expect(ps).toEqual([[`${P}.width`, '3ns', 'a known key (keys here: kind, from, to, start, rise)']]);
  });

  it('duty outside (0, 1)', () => {
    const c = { kind: 'clock', low: 0, high: 1, period: '40ns', rise: '1ns' };
    for (const duty of ['0%', '100%', 0, 1, '-10%', 1.5]) {
      expect(problems({ ...c, duty })).toEqual([[`${P}.duty`, duty, 'a fraction between 0 and 1 (exclusive) like "50%"']]);
    }
  });

  it('edges that do not fit: pulse width, clock period, bit time', () => {
    expect(problems({ kind: 'pulse', from: 0, to: 1, rise: '1ns', fall: '1ns', width: '1ns' })).toEqual([
      [`${P}.width`, '1ns', 'a width ≥ (rise + fall)/1.6 = 1.25ns so the pulse reaches its top'],
    ]);
    expect(problems({ kind: 'pulse', from: 0, to: 1, rise: '1ns', width: '1.25ns' })).toEqual([]);
    expect(problems({ kind: 'clock', low: 0, high: 1, period: '2ns', rise: '1ns' })[0][2]).toMatch(/^a period ≥ 2.5ns so that with duty 0.5/);
    expect(problems({ kind: 'clock', low: 0, high: 1, period: '2.5ns', rise: '1ns' })).toEqual([]);
    expect(problems({ kind: 'clock', low: 0, high: 1, period: '5ns', rise: '1ns', duty: '20%' })[0][2]).toMatch(/^a period ≥ 6.25ns/);
    expect(problems({ kind: 'bits', low: 0, high: 1, bitTime: '1ns', rise: '1ns', pattern: '01' })[0][2]).toMatch(/^a bit time ≥ max\(rise, fall\)\/0.8 = 1.25ns/);
  });

  it('bit patterns: empty, not 0/1, unknown prbs', () => {
    const b = { kind: 'bits', low: 0, high: 1, bitTime: '1ns', rise: '100ps' };
    const exp = '"prbs7", "prbs9", "prbs15" or a string of 0 and 1 like "0110"';
    for (const pattern of ['', '  ', '0120', 'prbs31', 'abc']) expect(problems({ ...b, pattern })).toEqual([[`${P}.pattern`, pattern, exp]]);
    expect(problems(b)).toEqual([[`${P}.pattern`, undefined, exp]]);
    expect(problems({ ...b, pattern: 101 })).toEqual([[`${P}.pattern`, 101, exp]]); // a JSON number is not a pattern
  });

  it('table: too few points, times not increasing, malformed pairs', () => {
    expect(problems({ kind: 'table', points: [] })[0][2]).toMatch(/^at least two \[time, voltage\] points/);
    expect(problems({ kind: 'table', points: [['0ns', '0V']] })[0][2]).toMatch(/^at least two/);
    expect(problems({ kind: 'table', points: [['0ns', '0V'], ['2ns', '1V'], ['2ns', '0V']] })).toEqual([
      [`${P}.points[2][0]`, '2ns', "a time later than the previous point's 2 ns (times must increase)"],
    ]);
    expect(problems({ kind: 'table', points: [['0ns', '0V'], ['1ns'], ['2ns', '1A'], ['-1ns', '0V']] })).toEqual([
      [`${P}.points[1]`, ['1ns'], 'a [time, voltage] pair like ["1ns", "3.3V"]'],
      [`${P}.points[2][1]`, '1A', 'a voltage like "3.3V"'],
      [`${P}.points[3][0]`, '-1ns', 'a time ≥ 0 like "1ns"'],
    ]);
  });

  it('a step without an edge is a warning, not an error', () => {
    const r = checkScenarioValue(scenario({ kind: 'step', from: '1V', to: '1V', rise: '1ns' }));
    expect(r.net).toBeDefined();
    expect(r.warnings.map((w) => w.path)).toEqual([`${P}.to`]);
  });
});
