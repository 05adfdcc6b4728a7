// Reports: JUnit XML checked by parsing against the elements and attributes of the common JUnit
// schema that CI systems read (testsuites > testsuite > testcase > failure | error), the JSON report,
// the Markdown summary and the terminal table.
import { describe, expect, it } from 'vitest';
import { formatCheckTable, toJsonReport, toJUnitXml, toMarkdown, xmlEscape } from '../../../src/checks/report.js';
import { checkExitCode, tableValue, totalsOf, type CheckRunReport, type ScenarioReport } from '../../../src/checks/run.js';
import { parseXml, type XmlElement } from './xml.js';

const pass = (probe: string, metric: string) => ({ kind: 'check' as const, probe, metric, limit: 'max 10 %', measured: 4, measuredText: '4 %', pass: true, message: `${metric} 4 % within max 10 %` });

const scenarios: ScenarioReport[] = [
  { file: 'nets/a.json', title: 'A & B <net>', sha256: 'ab', verdict: 'pass', rows: [pass('rx', 'overshoot'), pass('rx', 'ringback')], error: null, notes: [], seconds: 0.25 },
  {
    file: 'nets/b.json',
    title: 'B',
    sha256: 'cd',
    verdict: 'fail',
    rows: [pass('rx', 'rise'), { kind: 'check', probe: 'rx', metric: 'overshoot', limit: 'max 10 %', measured: 38.9, measuredText: '38.9 %', pass: false, message: 'overshoot 38.9 % exceeds max 10 % (worst: rising edge 0 at 3.2 ns) "quoted" <tag> & more\u0001' }],
    error: null,
    notes: [],
    seconds: 0.5,
  },
  { file: 'nets/c.json', title: null, sha256: null, verdict: 'error', rows: [], error: { code: 2, lines: ['nets/c.json:3:5 driver.resistance: "-1ohm" — expected a resistance ≥ 0 like "25ohm"'] }, notes: [], seconds: 0.01 },
];
const report: CheckRunReport = { scenarios, totals: totalsOf(scenarios), exitCode: checkExitCode(scenarios) };

const kids = (e: XmlElement, name: string) => e.children.filter((c) => c.name === name);

describe('JUnit XML', () => {
  const xml = toJUnitXml(report);
  const root = parseXml(xml);

  it('is well-formed XML with <testsuites> at the root and one <testsuite> per scenario', () => {
    expect(xml.startsWith('<?xml version="1.0" encoding="UTF-8"?>')).toBe(true);
    expect(root.name).toBe('testsuites');
    expect(kids(root, 'testsuite')).toHaveLength(3);
  });

  it('has the attributes CI systems read, and counts that add up', () => {
    // testsuites: tests, failures, errors; testsuite: name, tests, failures, errors, skipped, time;
    // testcase: name, classname, time; failure/error: message, type.
    let tests = 0;
    let failures = 0;
    let errors = 0;
    for (const s of kids(root, 'testsuite')) {
      for (const a of ['name', 'tests', 'failures', 'errors', 'skipped', 'time']) expect(s.attrs, a).toHaveProperty(a);
      const cases = kids(s, 'testcase');
      expect(Number(s.attrs.tests)).toBe(cases.length);
      expect(Number(s.attrs.failures)).toBe(cases.filter((c) => kids(c, 'failure').length > 0).length);
      expect(Number(s.attrs.errors)).toBe(cases.filter((c) => kids(c, 'error').length > 0).length);
      for (const c of cases) {
        for (const a of ['name', 'classname', 'time']) expect(c.attrs, a).toHaveProperty(a);
        for (const f of [...kids(c, 'failure'), ...kids(c, 'error')]) {
          expect(f.attrs).toHaveProperty('message');
          expect(f.attrs).toHaveProperty('type');
        }
        expect(Number.isFinite(Number(c.attrs.time))).toBe(true);
      }
      tests += Number(s.attrs.tests);
      failures += Number(s.attrs.failures);
      errors += Number(s.attrs.errors);
    }
    expect(Number(root.attrs.tests)).toBe(tests);
    expect(Number(root.attrs.failures)).toBe(failures);
    expect(Number(root.attrs.errors)).toBe(errors);
    expect([tests, failures, errors]).toEqual([5, 1, 1]);
  });

  it('carries the failure message and the scenario error, escaped and round-tripped', () => {
    const b = kids(root, 'testsuite')[1]!;
    const failed = kids(b, 'testcase').find((c) => kids(c, 'failure').length > 0)!;
    expect(failed.attrs.name).toBe('rx overshoot max 10 %');
    expect(failed.attrs.classname).toBe('ladderwave.nets.b');
    const f = kids(failed, 'failure')[0]!;
    expect(f.attrs.message).toBe('overshoot 38.9 % exceeds max 10 % (worst: rising edge 0 at 3.2 ns) "quoted" <tag> & more');
    expect(f.text).toContain('measured 38.9 %, limit max 10 %');
    const c = kids(root, 'testsuite')[2]!;
    const err = kids(kids(c, 'testcase')[0]!, 'error')[0]!;
    expect(err.attrs.type).toBe('bad-input');
    expect(err.text).toContain('driver.resistance');
    const a = kids(root, 'testsuite')[0]!;
    expect(kids(kids(a, 'properties')[0]!, 'property')[0]!.attrs).toEqual({ name: 'title', value: 'A & B <net>' });
  });

  it('escapes what XML 1.0 needs and drops what it cannot hold', () => {
    expect(xmlEscape(`<a b="c" d='e'> & \u0007`)).toBe('&lt;a b=&quot;c&quot; d=&apos;e&apos;&gt; &amp; ');
  });
});

describe('JSON, Markdown and the table', () => {
  it('JSON holds the verdict, totals and every check', () => {
    const j = JSON.parse(toJsonReport(report));
    expect(j.verdict).toBe('error');
    expect(j.exitCode).toBe(2);
    expect(j.totals).toEqual({ scenarios: 3, checks: 4, passed: 3, failed: 1, errors: 1, failedScenarios: 1 });
    expect(j.scenarios[1].checks[1].pass).toBe(false);
    expect(j.scenarios[2].error.lines[0]).toMatch(/driver.resistance/);
  });

  it('Markdown leads with the verdict and lists the failures first, with pipes escaped', () => {
    const md = toMarkdown({ ...report, scenarios: [scenarios[0]!, { ...scenarios[1]!, rows: [{ ...scenarios[1]!.rows[1]!, limit: 'a | b' }] }] } as CheckRunReport);
    const lines = md.split('\n');
    expect(lines[0]).toMatch(/^❌ \*\*ladderwave check\*\*/);
    expect(md).toContain('### Failed checks');
    expect(md).toContain('a \\| b');
    expect(md.indexOf('### Failed checks')).toBeLessThan(md.indexOf('<details>'));
  });

  it('the table has the columns scenario, probe, metric, limit, measured, result', () => {
    const t = formatCheckTable(report).split('\n');
    expect(t[0]!.split(/\s{2,}/)).toEqual(['scenario', 'probe', 'metric', 'limit', 'measured', 'result']);
    expect(t.some((l) => /nets\/b\.json\s+rx\s+overshoot\s+max 10 %\s+38\.9 %\s+FAIL/.test(l))).toBe(true);
    expect(t.some((l) => /nets\/c\.json .*ERROR/.test(l))).toBe(true);
    expect(t).toContain('FAIL nets/b.json: rx overshoot: overshoot 38.9 % exceeds max 10 % (worst: rising edge 0 at 3.2 ns) "quoted" <tag> & more\u0001');
  });
});

describe('the test XML parser is strict (so a malformed report would fail above)', () => {
  it.each([
    ['<a><b></a>', /closes/],
    ['<a x=1/>', /not quoted/],
    ['<a x="1" x="2"/>', /duplicate/],
    ['<a>&</a>', /bare "&"/],
    ['<a/><b/>', /after the root/],
    ['<a>', /unclosed/],
  ])('%j is refused', (xml, msg) => {
    expect(() => parseXml(xml)).toThrow(msg);
  });
});

describe('sensible precision and names', () => {
  it('prints measured values without floating-point dust or exponents (0.01 %, 1 µV, 1 fs)', () => {
    expect(tableValue(1.332e-14, '%', '1.332e-14 %')).toBe('0 %');
    expect(tableValue(38.94321, '%', '')).toBe('38.94 %');
    expect(tableValue(2.168e-19, 'V', '0.0002168 fV')).toBe('0 V');
    expect(tableValue(0.0123456, 'V', '')).toBe('12.35 mV');
    expect(tableValue(3.1674e-9, 's', '')).toBe('3.167 ns');
    expect(tableValue(3, 'count', '3')).toBe('3');
    expect(tableValue(null, '%', 'n/a')).toBe('n/a');
  });

  it('names a JUnit test case after the probe, the metric and the limit, without repeating the metric', () => {
    const mono = { kind: 'check' as const, probe: 'mcu_in', metric: 'monotonic', limit: 'monotonic', measured: 1, measuredText: 'yes', pass: true, message: 'monotonic' };
    const one: ScenarioReport[] = [{ file: 'n.json', title: 'n', sha256: 'x', verdict: 'pass', rows: [mono, pass('rx', 'overshoot')], error: null, notes: [], seconds: 0 }];
    const names = kids(kids(parseXml(toJUnitXml({ scenarios: one, totals: totalsOf(one), exitCode: 0 })), 'testsuite')[0]!, 'testcase').map((c) => c.attrs.name);
    expect(names).toEqual(['mcu_in monotonic', 'rx overshoot max 10 %']);
  });
});
