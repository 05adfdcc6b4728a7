// Paths into a scenario by item name, and the --vary / --spread / --shard parsers.
import { describe, expect, it } from 'vitest';
import { concretePath, getAtPath, parsePath, PathError, withValues } from '../../../src/sweep/paths.js';
import { nominalValue, parseAnyQuantity, parseShard, parseSpread, parseVary, shardPoints, SweepSpecError } from '../../../src/sweep/spec.js';
import { SERIES_NET } from './fixtures.js';

describe('paths', () => {
  it('finds route items by name, line models, the driver and receiver parts', () => {
    const raw = { ...SERIES_NET, receiver: { parts: [{ c: '3pF' }] } };
    expect(getAtPath(raw, 'route.rs.series.r')).toBe('22ohm');
    expect(concretePath(raw, 'route.rs.series.r')).toBe('route[0].series.r');
    expect(getAtPath(raw, 'route[1].length')).toBe('20cm');
    expect(getAtPath(raw, 'lines.trace.z0')).toBe('50ohm');
    expect(getAtPath(raw, 'driver.signal.rise')).toBe('500ps');
    expect(getAtPath(raw, 'receiver.parts[0].c')).toBe('3pF');
    expect(getAtPath(raw, 'driver.signal.fall')).toBeUndefined(); // absent last key: settable
  });

  it('sets values in a copy and leaves the original alone', () => {
    const raw = structuredClone(SERIES_NET);
    const out = withValues(raw, [
      { path: 'route.rs.series.r', value: '38ohm' },
      { path: 'lines.trace.z0', value: 45 },
    ]) as typeof SERIES_NET;
    expect(out.route[0]!.series!.r).toBe('38ohm');
    expect(out.lines.trace.z0).toBe(45);
    expect(raw).toEqual(SERIES_NET);
  });

  it.each([
    ['route.r9.series.r', /no route item named "r9" \(route items: rs, trace\)/],
    ['lines.nope.z0', /no key "nope" \(keys here: trace\)/],
    // the nearest valid paths, by edit distance, among the items and keys that lead on
    ['route.rss.series.r', /— nearest valid path: route\.rs\.series\.r$/],
    ['lines.trac.z0', /— nearest valid path: lines\.trace\.z0$/],
    ['route[5].length', /index \[5\] is past the end of a list of 2/],
    ['driver.resistance[0]', /indexes a list/],
  ])('%s: explains what is missing', (path, msg) => {
    expect(() => getAtPath(SERIES_NET, path)).toThrow(msg);
  });

  it.each([
    ['', 0],
    ['route..r', 6],
    ['route.rs.', 8],
    ['route[x]', 5],
    ['[0].r', 0],
    ['route.r s', 7],
  ])('syntax error in %j at position %i', (text, pos) => {
    try {
      parsePath(text);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(PathError);
      expect((e as PathError).position).toBe(pos);
    }
  });

  it('accepts quoted keys', () => {
    expect(parsePath('lines."my trace".z0')).toEqual([
      { kind: 'key', key: 'lines' },
      { kind: 'key', key: 'my trace' },
      { kind: 'key', key: 'z0' },
    ]);
  });
});

describe('--vary', () => {
  it('a range with a count includes both ends exactly and is evenly spaced', () => {
    const a = parseVary('route.r1.series.r=0ohm..60ohm:25');
    expect(a.path).toBe('route.r1.series.r');
    expect(a.unit).toBe('ohm');
    expect(a.values).toHaveLength(25);
    expect(a.values[0]).toBe(0);
    expect(a.values[24]).toBe(60);
    expect(a.values[12]).toBeCloseTo(30, 12);
  });
  it('units and prefixes follow the scenario units module', () => {
    const rise = parseVary('driver.signal.rise=100ps..1ns:3').values;
    expect([rise[0], rise[2]]).toEqual([1e-10, 1e-9]);
    expect(rise[1]).toBeCloseTo(5.5e-10, 22);
    expect(parseVary('route.trace.length=1in,2in').values).toEqual([0.0254, 0.0508]);
    expect(parseVary('lines.trace.velocity=0.5c,0.6c').unit).toBe('m/s');
  });
  it('a log range is geometric', () => {
    const v = parseVary('receiver.parts[0].c=1pF..100pF:3:log').values;
    expect(v[1]).toBeCloseTo(1e-11, 22);
  });
  it.each([
    ['route.r1.series.r', /expected PATH=VALUES/],
    ['route.r1.series.r=0ohm..60ohm', /a range is A..B:N/],
    ['route.r1.series.r=0ohm..5ns:3', /not the same kind of quantity/],
    ['route.r1.series.r=fast,slow', /not a number with a unit/],
    ['route.r1.series.r=1,,2', /expected a range A..B:N or a list/],
    ['route..r=1,2', /unexpected "\."/],
    ['x=0..1:0', /at least 1/],
  ])('%j is refused', (text, msg) => {
    expect(() => parseVary(text)).toThrow(SweepSpecError);
    expect(() => parseVary(text)).toThrow(msg);
  });
});

describe('--spread and --shard', () => {
  it('reads ±X, +-X and ~N(X); a percentage is relative', () => {
    expect(parseSpread('lines.trace.z0=±10%')).toMatchObject({ distribution: 'uniform', relative: true, amount: 0.1 });
    expect(parseSpread('route.rs.series.r=+-2ohm')).toMatchObject({ distribution: 'uniform', relative: false, amount: 2, unit: 'ohm' });
    expect(parseSpread('lines.trace.z0=~N(5%)')).toMatchObject({ distribution: 'normal', relative: true, amount: 0.05 });
    expect(() => parseSpread('lines.trace.z0=10%')).toThrow(/expected ±X/);
  });
  it('the nominal value is the scenario value; an absolute spread must be in its unit', () => {
    expect(nominalValue(SERIES_NET, parseSpread('lines.trace.z0=±10%'))).toEqual({ value: 50, unit: 'ohm' });
    expect(() => nominalValue(SERIES_NET, parseSpread('lines.trace.z0=±1ns'))).toThrow(/in s, the value at lines.trace.z0 \("50ohm"\) in ohm/);
    expect(() => nominalValue(SERIES_NET, parseSpread('driver.signal.fall=±10%'))).toThrow(/no value at driver.signal.fall/);
  });
  it('shards count from 1: shard 3/16 runs points 2, 18, 34, ... (0-based point numbers)', () => {
    expect(parseShard('3/16')).toEqual({ index: 3, count: 16 });
    expect(shardPoints(40, { index: 3, count: 16 })).toEqual([2, 18, 34]);
    expect(shardPoints(4, null)).toEqual([0, 1, 2, 3]);
    for (const bad of ['0/4', '5/4', '3', 'a/b']) expect(() => parseShard(bad)).toThrow(SweepSpecError);
  });
  it('parseAnyQuantity gives SI numbers and base units', () => {
    expect(parseAnyQuantity('39ohm')).toEqual({ value: 39, unit: 'ohm' });
    expect(parseAnyQuantity('150ps/in')).toEqual({ value: 150e-12 / 0.0254, unit: 's/m' });
    expect(parseAnyQuantity('50%')).toEqual({ value: 0.5, unit: '' });
    expect(parseAnyQuantity(3)).toEqual({ value: 3, unit: '' });
    expect(parseAnyQuantity('3 bananas')).toBeUndefined();
  });
});
