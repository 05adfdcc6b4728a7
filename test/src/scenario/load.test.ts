import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import {
  checkScenario,
  loadScenario,
  parseScenario,
  readScenario,
  scenarioFromValue,
  ScenarioError,
  type Problem,
} from '../../../src/scenario/load.js';
import { formatProblem } from '../../../src/scenario/problems.js';
import { prbs } from '../../../sim/prbs.js';

const fixture = (name: string) => fileURLToPath(new URL(`../../fixtures/scenarios/${name}`, import.meta.url));
const text = (name: string) => readFileSync(fixture(name), 'utf8');

function problemsOf(src: string, file = 't.json'): Problem[] {
  const r = checkScenario(src, file);
  expect(r.net).toBeUndefined();
  return r.problems;
}

/** A valid scenario object to vary in tests. */
function base(): Record<string, any> {
  return {
    title: 't',
    driver: { signal: { kind: 'step', from: '0V', to: '3.3V', rise: '1ns' }, resistance: '25ohm' },
    lines: { trace: { z0: '50ohm', delay: '6.67ns/m' } },
    route: [
      { name: 't1', line: 'trace', length: '10cm' },
      { name: 'rs', series: { r: '22ohm' } },
      { name: 'c1', shunt: { c: '2pF' } },
    ],
  };
}
const withProblems = (v: unknown) => {
  try {
    scenarioFromValue(v, 'v.json');
  } catch (e) {
    if (e instanceof ScenarioError) return e.problems.map((p) => [p.path, p.expected] as const);
    throw e;
  }
  return [];
};

describe('full fixture: JSON and YAML give the same Net', () => {
  it('full.json and full.yaml are equal', async () => {
    const a = await loadScenario(fixture('full.json'));
    const b = await loadScenario(fixture('full.yaml'));
    expect(b).toEqual(a);
  });

  it('full.json converts every key to SI numbers', async () => {
    const net = await loadScenario(fixture('full.json'));
    expect(net.title).toBe('Clock into a terminated receiver');
    expect(net.description).toMatch(/^Fixture/);
    expect(net.driver).toEqual({
      signal: { kind: 'clock', low: 0, high: 3.3, period: 20e-9, rise: 1e-9, fall: 800e-12, duty: 0.4, start: 2e-9 },
      resistance: 25,
    });
    const tau = 150e-12 / 0.0254;
    const [tr1, rs, conn, cab, tr2] = net.route;
    expect(tr1).toEqual({ kind: 'line', name: 'tr1', line: { r: 0.5, l: 50 * tau, g: 0, c: tau / 50 }, length: 0.0762 });
    expect(rs).toEqual({ kind: 'series', name: 'rs', part: { r: 22, l: 1e-9, rail: 0 } });
    expect(conn).toEqual({ kind: 'shunt', name: 'conn', parts: [{ r: 0, l: 0, c: 0.5e-12, rail: 0 }, { r: 1e6, l: 0, rail: 1.65 }] });
    expect(cab.kind === 'line' && cab.length).toBe(0.6096);
    if (cab.kind !== 'line') throw new Error('cab');
    expect(cab.line.g).toBe(20e-6);
    expect(Math.sqrt(cab.line.l / cab.line.c)).toBeCloseTo(100, 9);
    expect(tr2).toEqual({ kind: 'line', name: 'tr2', line: { r: 0, l: 250e-9, g: 0, c: 100e-12 }, length: 0.12 });
    expect(net.receiver).toEqual([
      { r: 220, l: 0, rail: 3.3 },
      { r: 330, l: 0, rail: 0 },
      { r: 56, l: 0, c: 100e-12, rail: 0 },
    ]);
    expect(net.probes).toEqual([
      { name: 'tx', at: 'driver' },
      { name: 'rx', at: 'receiver' },
      { name: 'mid', at: 'line', item: 'tr1', position: 0.0381 },
      { name: 'cab10', at: 'line', item: 'cab', position: 0.1 },
      { name: 'rs_in', at: 'series', item: 'rs', side: 'in' },
      { name: 'rs', at: 'series', item: 'rs', side: 'out' }, // name defaults to "at", side to "out"
      { name: 'conn', at: 'shunt', item: 'conn' },
    ]);
    expect(net.run).toEqual({ duration: 60e-9, cellsPerRise: 25, sample: 10e-12 });
  });

  it('defaults: title from the file name, open receiver, probes at both ends, cellsPerRise 20, start 0', async () => {
    const net = await loadScenario(fixture('minimal.json'));
    expect(net.title).toBe('minimal');
    expect(net.description).toBeUndefined();
    expect(net.receiver).toEqual([]);
    expect(net.probes).toEqual([
      { name: 'driver', at: 'driver' },
      { name: 'receiver', at: 'receiver' },
    ]);
    expect(net.run).toEqual({ cellsPerRise: 20 });
    expect(net.driver.signal).toEqual({ kind: 'step', from: 0, to: 1, start: 0, rise: 100e-12 });
  });

  it('readScenario also returns the text (for hashing) and warnings', async () => {
    const r = await readScenario(fixture('minimal.json'));
    expect(r.text).toBe(text('minimal.json'));
    expect(r.warnings).toEqual([]);
  });
});

describe('errors.json: every deliberate mistake is reported, with path, value and line:col', () => {
  const ps = problemsOf(text('errors.json'), 'errors.json');
  const expected: Array<[path: string, value: unknown, line: number, col: number, expected: RegExp]> = [
    ['driver.signal.rise', '-1ns', 4, 70, /^a time > 0 like "600ps"$/],
    ['driver.signal.fal', '1ns', 4, 94, /did you mean "fall"\?/],
    ['driver.resistance', '25V', 5, 19, /^a resistance ≥ 0 like "25ohm"$/],
    ['lines.trace.l', '333nH/m', 8, 52, /given both as z0\+delay and as l\+c/],
    ['lines.cable.velocity', '0.66c', 9, 49, /given both as z0\+delay and as z0\+velocity/],
    ['lines.half', { z0: '50ohm' }, 10, 13, /^a complete line: "z0" needs the rest of/],
    ['lines.lossy.r', '-1ohm/m', 11, 53, /^a resistance per length ≥ 0 like "0.5ohm\/m"$/],
    ['lines.fast', { z0: '50ohm', delay: '1ns/m' }, 12, 13, /^a line no faster than light/],
    ['route[0].lenght', '3in', 15, 38, /did you mean "length"\?/],
    ['route[1].line', 'nosuch', 16, 29, /^the name of a line in "lines" \("trace", "cable", "half", "lossy", "fast"\)/],
    ['route[1].length', '-3in', 16, 49, /^a length ≥ 0 like "3in"$/],
    ['route[2].name', 't1', 17, 15, /^a unique item name \("t1" is also route\[0\]'s name\)$/],
    ['route[2].series.to', '1V', 17, 47, /^no "to" on a series part/],
    ['route[3].series', {}, 18, 34, /^a series part with at least one of "r", "l", "c"/],
    ['route[4].shunt', [], 19, 31, /^at least one part/],
    ['route[5].length', '3s', 20, 79, /^a length ≥ 0 like "3in"$/],
    ['route[6].shunt.c', '-3pF', 21, 38, /^a capacitance > 0 like "3pF"$/],
    ['route[7].shunt', { c: '1pF' }, 22, 50, /not both "series" and "shunt"/],
    ['receiver.parts[0].too', '1.25V', 24, 43, /did you mean "to"\?/],
    ['probes[1].name', 'rx', 27, 15, /^a unique probe name/],
    ['probes[2].at', 'nothere', 28, 27, /^"driver", "receiver" or the name of a route item/],
    ['probes[3].side', 'in', 29, 41, /^no "side" on a probe at a line item/],
    ['probes[4].position', '50%', 30, 46, /^no "position" on a probe at a shunt item/],
    ['probes[5].position', '150%', 31, 45, /^a percentage between 0% and 100%/],
    ['probes[6].position', undefined, 32, 5, /^a position along the line/],
    ['run.cellsPerRise', 2.5, 34, 48, /^a whole number ≥ 4 like 20$/],
    ['run.smaple', '1ps', 34, 53, /did you mean "sample"\?/],
    ['extra', true, 35, 3, /^a known key \(keys here: title, description, driver, lines, route, receiver, probes, run, levels, thresholds, checks, nets, coupled\)$/],
  ];

  it.each(expected)('%s', (path, value, line, col, exp) => {
    const p = ps.find((q) => q.path === path);
    expect(p, `no problem at ${path}; got:\n${ps.map(formatProblem).join('\n')}`).toBeDefined();
    expect(p!.file).toBe('errors.json');
    expect(p!.value).toEqual(value);
    expect([p!.line, p!.col]).toEqual([line, col]);
    expect(p!.expected).toMatch(exp);
  });

  it('and nothing else (no follow-on noise, e.g. route[0].length is not also "missing")', () => {
    expect(ps.map((p) => p.path).sort()).toEqual(expected.map((e) => e[0]).sort());
  });

  it('problems come in source order', () => {
    const keys = ps.map((p) => p.line! * 1000 + p.col!);
    expect(keys).toEqual([...keys].sort((a, b) => a - b));
  });

  it('loadScenario throws a ScenarioError whose message has one line per problem', async () => {
    const err = await loadScenario(fixture('errors.json')).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ScenarioError);
    const se = err as ScenarioError;
    expect(se.problems).toHaveLength(expected.length);
    const lines = se.message.split('\n');
    expect(lines).toHaveLength(expected.length);
    const file = fixture('errors.json');
    expect(lines).toContain(`${file}:16:49 route[1].length: "-3in" — expected a length ≥ 0 like "3in"`);
    expect(lines).toContain(`${file}:4:70 driver.signal.rise: "-1ns" — expected a time > 0 like "600ps"`);
  });
});

describe('errors.yaml: YAML positions, duplicate keys, plain scalars shown as written', () => {
  const ps = problemsOf(text('errors.yaml'), 'errors.yaml');
  it.each([
    ['driver.signal.pattern', '01201', 10, 14, /^"prbs7", "prbs9", "prbs15" or a string of 0 and 1/],
    ['driver.resistance', '30ohm', 12, 3, /^each key once in an object \(first "resistance" at 11:3\)$/],
    ['route[0].length', '3 furlongs', 18, 13, /^a length ≥ 0 like "3in"; units: m\*, cm, in, mil, ft/],
    ['probes[0].side', 'middle', 24, 30, /^"in" \(the side towards the driver\) or "out"/],
    ['run.sample', '40ns', 25, 32, /^a sample interval no longer than the duration 30 ns$/],
  ] as const)('%s', (path, value, line, col, exp) => {
    const p = ps.find((q) => q.path === path);
    expect(p, ps.map(formatProblem).join('\n')).toBeDefined();
    expect([p!.value, p!.line, p!.col]).toEqual([value, line, col]);
    expect(p!.expected).toMatch(exp);
  });
  it('and only those', () => expect(ps).toHaveLength(5));
});

describe('file-level problems', () => {
  it('a syntax error gives line:col and the source line, and no validation noise', () => {
    const ps = problemsOf('{\n  "title": "x",\n  "driver": { "signal": 3 \n', 'bad.json');
    expect(ps.length).toBeGreaterThanOrEqual(1);
    expect(ps[0].path).toBe('');
    expect(ps[0].expected).toMatch(/^valid JSON or YAML \(/);
    expect(ps[0].line).toBeGreaterThanOrEqual(3);
    expect(formatProblem(ps[0])).toMatch(/^bad\.json:\d+:\d+ \(file\): `.*` — expected valid JSON or YAML/);
  });
  it('an empty file, or a file that is not an object', () => {
    expect(problemsOf('', 'e.json')[0].expected).toMatch(/^a scenario object/);
    expect(problemsOf('[1, 2]', 'e.json')[0].expected).toMatch(/^a scenario object/);
  });
  it('missing driver and route', () => {
    expect(problemsOf('{"title": "x"}').map((p) => [p.path, p.value, p.line, p.col])).toEqual([
      ['driver', undefined, 1, 1],
      ['route', undefined, 1, 1],
    ]);
  });
  it('a missing file is a ScenarioError naming it', async () => {
    const err = await loadScenario('/nonexistent/x.json').catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ScenarioError);
    expect((err as Error).message).toBe('/nonexistent/x.json (file): `/nonexistent/x.json` — expected a readable scenario file (no such file)');
  });
  it('tab-indented JSON and a byte-order mark are fine', () => {
    const src = '\t{\n\t"driver": {"signal": {"kind": "step", "from": 0, "to": 1, "rise": 1e-9},\n\t\t"resistance": 10},\n\t"route": []\n}';
    expect(parseScenario(src, 'tabs.json').route).toEqual([]);
  });
});

describe('route, parts and probes', () => {
  it('the base scenario is valid', () => {
    expect(withProblems(base())).toEqual([]);
  });

  it('an empty route is allowed: the driver pin is the receiver', () => {
    const s = { ...base(), route: [], probes: [{ at: 'driver' }, { at: 'receiver' }] };
    expect(scenarioFromValue(s).route).toEqual([]);
  });

  it('a zero-length line is allowed (length ≥ 0)', () => {
    const s = base();
    s.route[0].length = '0in';
    expect(withProblems(s)).toEqual([]);
  });

  it('item names default to their path; "driver" and "receiver" are reserved', () => {
    const s = base();
    delete s.route[1].name;
    s.probes = [{ at: 'route[1]' }];
    const net = scenarioFromValue(s);
    expect(net.route[1].name).toBe('route[1]');
    expect(net.probes[0]).toEqual({ name: 'route[1]', at: 'series', item: 'route[1]', side: 'out' });
    const t = base();
    t.route[2].name = 'receiver';
    expect(withProblems(t)).toEqual([['route[2].name', expect.stringMatching(/other than "driver" and "receiver"/)]]);
  });

  it('an item needs exactly one of line/series/shunt, and a line item needs a length', () => {
    const s = base();
    s.route = [{ name: 'x' }, { name: 'y', line: 'trace' }];
    expect(withProblems(s)).toEqual([
      ['route[0]', expect.stringMatching(/one of "line" \(with "length"\), "series" or "shunt"/)],
      ['route[1].length', 'a length ≥ 0 like "3in"'],
    ]);
  });

  it('a referenced line name that does not exist, with a suggestion', () => {
    const s = base();
    s.route[0].line = 'trcae';
    expect(withProblems(s)).toEqual([['route[0].line', expect.stringContaining('did you mean "trace"?')]]);
  });

  it('a bad named line is reported once, under lines, not again at each use', () => {
    const s = base();
    s.lines.trace.z0 = '-5ohm';
    s.route.push({ name: 't2', line: 'trace', length: '1in' });
    expect(withProblems(s)).toEqual([['lines.trace.z0', 'a resistance > 0 like "50ohm"']]);
  });

  it('parts: elements, rails, defaults and refusals', () => {
    const s = base();
    s.receiver = { parts: { r: '50ohm', to: '1.25V' } }; // one part without a list
    expect(scenarioFromValue(s).receiver).toEqual([{ r: 50, l: 0, rail: 1.25 }]);
    s.receiver = { parts: [] };
    expect(scenarioFromValue(s).receiver).toEqual([]);
    s.receiver = {};
    expect(scenarioFromValue(s).receiver).toEqual([]);
    s.receiver = { parts: [{ to: '1V' }, { r: '0ohm' }, { r: '-1ohm' }, { l: '-1nH' }, { c: '0F' }, { r: '10ohm', to: '1A' }, 'x'] };
    expect(withProblems(s)).toEqual([
      ['receiver.parts[0]', expect.stringMatching(/^a part with at least one of "r", "l", "c"/)],
      ['receiver.parts[2].r', 'a resistance ≥ 0 like "50ohm"'],
      ['receiver.parts[3].l', 'an inductance ≥ 0 like "2nH"'],
      ['receiver.parts[4].c', 'a capacitance > 0 like "3pF"'],
      ['receiver.parts[5].to', 'a voltage like "1.25V"'],
      ['receiver.parts[6]', expect.stringMatching(/^a part like/)],
    ]);
  });

  it('series parts: no rail, at least one element, not a list', () => {
    const s = base();
    s.route[1].series = { c: '100nF', l: '1nH' };
    expect(scenarioFromValue(s).route[1]).toEqual({ kind: 'series', name: 'rs', part: { r: 0, l: 1e-9, c: 100e-9, rail: 0 } });
    s.route[1].series = [{ r: '1ohm' }];
    expect(withProblems(s)).toEqual([['route[1].series', expect.stringMatching(/^a series part like/)]]);
    // a 0 ohm series part is a wire: accepted (a sweep of a series resistor may start there)
    s.route[1].series = { r: '0ohm' };
    expect(scenarioFromValue(s).route[1]).toEqual({ kind: 'series', name: 'rs', part: { r: 0, l: 0, rail: 0 } });
  });

  it('probes: line positions as percent or length, within the line', () => {
    const s = base();
    s.probes = [
      { name: 'a', at: 't1', position: '0%' },
      { name: 'b', at: 't1', position: '100%' },
      { name: 'c', at: 't1', position: '25mm' },
      { name: 'd', at: 't1', position: 0.05 },
      { name: 'e', at: 'c1' },
    ];
    expect(scenarioFromValue(s).probes).toEqual([
      { name: 'a', at: 'line', item: 't1', position: 0 },
      { name: 'b', at: 'line', item: 't1', position: 0.1 },
      { name: 'c', at: 'line', item: 't1', position: 0.025 },
      { name: 'd', at: 'line', item: 't1', position: 0.05 },
      { name: 'e', at: 'shunt', item: 'c1' },
    ]);
    s.probes = [{ name: 'a', at: 't1', position: '11cm' }, { name: 'b', at: 't1', position: '-1%' }, { name: 'c', at: 't1', position: '3ns' }];
    expect(withProblems(s)).toEqual([
      ['probes[0].position', expect.stringContaining("from 0 to the line's length 100 mm")],
      ['probes[1].position', expect.stringMatching(/^a percentage between 0% and 100%/)],
      ['probes[2].position', expect.stringContaining("from 0 to the line's length 100 mm")],
    ]);
  });

  it('probes: options that do not fit, missing or bad targets, names, and an empty list', () => {
    const s = base();
    s.probes = [
      { name: 'a', at: 'driver', side: 'in' },
      { name: 'b', at: 'receiver', position: '50%' },
      { name: 'c', at: 'rs', position: '50%' },
      { name: 'd' },
      { name: 'e,f', at: 'driver' },
      { name: 'g', at: 'recevier' },
      { name: 'h', at: 'rs', side: 'both' },
    ];
    expect(withProblems(s)).toEqual([
      ['probes[0].side', 'no "side" on a probe at the driver ("side" is for series items)'],
      ['probes[1].position', 'no "position" on a probe at the receiver ("position" is for line items)'],
      ['probes[2].position', 'no "position" on a probe at a series item ("position" is for line items)'],
      ['probes[3].at', expect.stringMatching(/^where to probe: "driver", "receiver", "t1", "rs", "c1"$/)],
      ['probes[4].name', expect.stringMatching(/without commas/)],
      ['probes[5].at', expect.stringContaining('did you mean "receiver"?')],
      ['probes[6].side', expect.stringMatching(/^"in" \(the side towards the driver\)/)],
    ]);
    s.probes = [];
    expect(withProblems(s)).toEqual([['probes', expect.stringMatching(/^a list of at least one probe/)]]);
  });

  it('run: cellsPerRise is a whole number ≥ 4; duration and sample are times > 0', () => {
    const s = base();
    s.run = { duration: '30ns', cellsPerRise: 4, sample: '1ns' };
    expect(scenarioFromValue(s).run).toEqual({ duration: 30e-9, cellsPerRise: 4, sample: 1e-9 });
    s.run = { duration: '-1ns', cellsPerRise: '20', sample: '0s' };
    expect(withProblems(s)).toEqual([
      ['run.duration', 'a time > 0 like "30ns"'],
      ['run.sample', 'a time > 0 like "10ps"'],
      ['run.cellsPerRise', 'a whole number ≥ 4 like 20'],
    ]);
  });

  it('the message format', () => {
    const p: Problem = { file: 'demo.json', path: 'route[2].length', value: '-3in', expected: 'a length ≥ 0 like "3in"', line: 14, col: 7 };
    expect(formatProblem(p)).toBe('demo.json:14:7 route[2].length: "-3in" — expected a length ≥ 0 like "3in"');
    expect(formatProblem({ ...p, line: undefined, col: undefined })).toBe('demo.json route[2].length: "-3in" — expected a length ≥ 0 like "3in"');
    expect(formatProblem({ ...p, value: undefined })).toContain('route[2].length: (missing) — expected');
  });

  it('bits patterns expand through sim/prbs', () => {
    const s = base();
    s.driver.signal = { kind: 'bits', low: '0V', high: '1V', bitTime: '2ns', rise: '200ps', pattern: 'PRBS9' };
    const sig = scenarioFromValue(s).driver.signal;
    if (sig.kind !== 'bits') throw new Error(sig.kind);
    expect(sig.patternName).toBe('prbs9');
    expect(sig.bits).toEqual(prbs(9));
  });
});
