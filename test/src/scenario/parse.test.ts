// Hostile scenario text: YAML alias bombs and recursive aliases, nesting deep enough to exhaust the
// parser, and keys that are names of Object.prototype's members. Each must end as one problem with a
// position and our own wording (never the JS engine's "Maximum call stack size exceeded"), quickly.
import { describe, expect, it } from 'vitest';
import { checkScenario } from '../../../src/scenario/load.js';
import { deepBracketOffset, MAX_ALIAS_VALUES, MAX_NESTING, parseText, toPlain } from '../../../src/scenario/parse.js';
import { formatProblem, Problems } from '../../../src/scenario/problems.js';

const problemsOf = (text: string) => {
  const r = checkScenario(text, 't.yaml');
  expect(r.net).toBeUndefined();
  return r.problems.map(formatProblem);
};

describe('YAML aliases', () => {
  it('refuses an alias inside the value it names (a: &x [*x]) as one problem, instead of recursing forever', () => {
    const lines = problemsOf('title: &x [*x]\n');
    expect(lines).toEqual(['t.yaml:1:12 title[0]: "*x" — expected an alias outside the value it names ("&x" contains this alias, so it would never end)']);
  });

  it('refuses a mutual recursion through two anchors', () => {
    const lines = problemsOf('a: &a { b: &b { c: *a } }\n');
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(/^t\.yaml:1:\d+ a\.b\.c: "\*a" — expected an alias outside the value it names/);
  });

  it('stops a ten-million-leaf alias bomb after MAX_ALIAS_VALUES values, at the alias that expands too far', () => {
    // 10 values, each level 10 aliases of the previous: 10^7 leaves at g (a classic entity-expansion attack).
    const rows = ['a: &a ["x","x","x","x","x","x","x","x","x","x"]'];
    for (const [n, p] of [['b', 'a'], ['c', 'b'], ['d', 'c'], ['e', 'd'], ['f', 'e'], ['g', 'f']]) rows.push(`${n}: &${n} [${Array(10).fill(`*${p}`).join(',')}]`);
    const t0 = performance.now();
    const lines = problemsOf(rows.join('\n') + '\n');
    expect(performance.now() - t0).toBeLessThan(20_000); // a guard against hanging, not a timing test
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(new RegExp(`^t\\.yaml:\\d+:\\d+ [a-g]\\[\\d+\\]: \\(missing\\) — expected YAML aliases that expand to at most ${MAX_ALIAS_VALUES.toLocaleString('en-US')} values in all`));
  });

  it('expands ordinary aliases like the YAML spec: the last anchor of the name before the alias', () => {
    const problems = new Problems('t.yaml');
    const root = parseText('x: &v 1\ny: *v\nz: &v 2\nw: *v\n', problems);
    expect(problems.errors).toEqual([]);
    expect(toPlain(root)).toEqual({ x: 1, y: 1, z: 2, w: 2 });
  });

  it('reports an alias to an anchor that comes later as a problem at the alias', () => {
    // The yaml parser itself reports it; either way it is one positioned problem, not a crash.
    const lines = problemsOf('a: *later\nb: &later 1\n');
    expect(lines.length).toBeGreaterThanOrEqual(1);
    expect(lines[0]).toMatch(/^t\.yaml:1:\d+ /);
  });
});

describe('nesting', () => {
  const ourMessage = `expected a scenario nested at most ${MAX_NESTING} levels deep (objects and lists inside each other)`;

  it.each([
    ['100 000 levels of [ in a JSON description', `{"description": ${'['.repeat(100_000)}${']'.repeat(100_000)}}`],
    ['20 000 levels of {"a": …}', `${'{"a":'.repeat(20_000)}1${'}'.repeat(20_000)}`],
    ['65 levels of lists', `{"description": ${'['.repeat(65)}${']'.repeat(65)}}`],
    ['a YAML block nested 300 levels by indentation', Array.from({ length: 300 }, (_, i) => `${' '.repeat(i)}a:`).join('\n') + `\n${' '.repeat(300)}b: 1\n`],
  ])('%s: one problem in our words', (_what, text) => {
    const lines = problemsOf(text);
    expect(lines).toHaveLength(1);
    expect(lines[0]).toContain(ourMessage);
    expect(lines[0]).not.toMatch(/call stack|RangeError/i);
    expect(lines[0]).toMatch(/^t\.yaml:\d+:\d+ /);
  });

  it(`accepts ${MAX_NESTING} levels`, () => {
    const problems = new Problems('t.json');
    parseText(`{"description": ${'['.repeat(MAX_NESTING - 1)}${']'.repeat(MAX_NESTING - 1)}}`, problems);
    expect(problems.errors).toEqual([]);
  });

  it('counts only brackets that open a value: not in quotes, comments or plain text', () => {
    expect(deepBracketOffset('{"a": "[[[[[[[["}', 3)).toBeUndefined();
    expect(deepBracketOffset("a: '[[[[''[[[['\n", 3)).toBeUndefined();
    expect(deepBracketOffset('a: 1 # [[[[[[[[\n', 3)).toBeUndefined();
    expect(deepBracketOffset('title: f[[[[[[[[x\n', 3)).toBeUndefined();
    expect(deepBracketOffset('a: [[[[1]]]]', 3)).toBe(6);
    expect(deepBracketOffset('{"a":{"b":{"c":{"d":1}}}}', 3)).toBe(15);
  });
});

describe("keys named like Object.prototype's members", () => {
  it('keeps "__proto__", "constructor" and "toString" as plain data', () => {
    const problems = new Problems('t.json');
    const plain = toPlain(parseText('{"__proto__": {"x": 1}, "constructor": 2, "toString": 3}', problems)) as Record<string, unknown>;
    expect(Object.keys(plain)).toEqual(['__proto__', 'constructor', 'toString']);
    expect(JSON.parse(JSON.stringify(plain))).toEqual(JSON.parse('{"__proto__": {"x": 1}, "constructor": 2, "toString": 3}'));
  });
});
