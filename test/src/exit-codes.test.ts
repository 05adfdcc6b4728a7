import { describe, expect, it } from 'vitest';
import { NetError, RunRefused } from '../../sim/errors.js';
import { outputFolders, scenarioName } from '../../src/cli/commands/run.js';
import { describeFailure, EXIT, UsageError, worstExitCode } from '../../src/exit-codes.js';
import { OutputError } from '../../src/output/run.js';
import { ScenarioError } from '../../src/scenario/problems.js';
import { SizeRefused } from '../../src/size-limits.js';
import { join } from 'node:path';

describe('exit codes and error lines', () => {
  it('lists every scenario problem, one line each, with exit 2', () => {
    const e = new ScenarioError([
      { file: 'a.json', path: 'route[2].length', value: '-3in', expected: 'a length ≥ 0 like "3in"', line: 14, col: 7 },
      { file: 'a.json', path: 'driver.resistance', value: 'x', expected: 'a resistance', line: 3, col: 2 },
    ]);
    const f = describeFailure(e, 'a.json');
    expect(f.code).toBe(EXIT.badInput);
    expect(f.lines).toHaveLength(2);
    expect(f.lines[0]).toMatch(/^a\.json:14:7 route\[2\]\.length: "-3in" — expected a length/);
  });

  it('reports a net that cannot be simulated as bad input, naming the file and key path', () => {
    const f = describeFailure(new NetError([{ path: 'probes[1]', message: "no route item named 'x'" }]), 'n.json');
    expect(f).toEqual({ code: 2, lines: ["n.json probes[1]: no route item named 'x'"] });
  });

  it('reports a refused run with exit 3, one line per limit with what would fit, and names --force', () => {
    const over = { limit: 'cellSteps', needed: 6e10, allowed: 3e10, steps: 200000, nodes: 300000, fit: { duration: 2.0004e-6, cellsPerRise: 14 } } as const;
    const f = describeFailure(new RunRefused([over]), 'h.json');
    expect(f.code).toBe(EXIT.refused);
    expect(f.lines).toEqual([
      'h.json: run refused before starting:',
      '  200000 steps × 300000 nodes and lumped work = 6.00e+10 cell-steps (limit 3.00e+10); a duration up to 2 µs would fit, or run.cellsPerRise 14 or less',
      '  (--force overrides these limits)',
    ]);
    const records = { limit: 'recordBytes', needed: 3e9, allowed: 2 ** 31, probes: 2, samples: 1.875e8, fit: {} } as const;
    expect(describeFailure(new RunRefused([records]), 'h.json').lines.join('\n')).toContain('--force');
  });

  it('treats output and usage errors as exit 2 and anything else as a bug: exit 4, one line, no stack', () => {
    expect(describeFailure(new OutputError('cannot create the output folder x'), 'a.json')).toEqual({
      code: 2,
      lines: ['a.json: cannot create the output folder x'],
    });
    expect(describeFailure(new UsageError('two outputs')).code).toBe(2);
    const bug = describeFailure(new TypeError('x is undefined'), 'a.json');
    expect(bug.code).toBe(EXIT.bug);
    expect(bug.code).toBe(4);
    expect(bug.lines).toHaveLength(1);
    expect(bug.lines[0]).toMatch(/^a\.json: internal error \(a bug in ladderwave.*\): x is undefined$/);
    expect(bug.lines.join('\n')).not.toMatch(/TypeError|\n\s+at /);
  });

  it('reports a run the machine cannot hold, even forced, with exit 3 and without suggesting --force', () => {
    const hard = describeFailure(new SizeRefused('run refused even with --force: 1e150 steps', true), 'h.json');
    expect(hard).toEqual({ code: 3, lines: ['h.json: run refused even with --force: 1e150 steps'] });
    const soft = describeFailure(new SizeRefused('a sweep of 2e6 points', false), 'h.json');
    expect(soft.code).toBe(3);
    expect(soft.lines.join('\n')).toContain('--force');
  });

  it('exits with the most serious code among several: bug 4, refused 3, bad input 2, a failed check 1', () => {
    expect(worstExitCode([])).toBe(0);
    expect(worstExitCode([0, 2, 0])).toBe(2);
    expect(worstExitCode([2, 3, 2])).toBe(3);
    expect(worstExitCode([3, 1, 2])).toBe(3);
    expect(worstExitCode([1, 0])).toBe(1);
    expect(worstExitCode([3, 4, 1])).toBe(4);
  });
});

describe('output folders', () => {
  it('defaults to out/<file name without extension>', () => {
    expect(scenarioName('nets/clock.json')).toBe('clock');
    expect(scenarioName('nets/clock.v2.yaml')).toBe('clock.v2');
    expect(scenarioName('README')).toBe('README');
    expect(outputFolders(['nets/clock.json'], undefined)).toEqual([join('out', 'clock')]);
  });

  it('uses --out itself for one scenario and one subfolder per scenario for several', () => {
    expect(outputFolders(['a.json'], 'res')).toEqual(['res']);
    expect(outputFolders(['x/a.json', 'b.yaml'], 'res')).toEqual([join('res', 'a'), join('res', 'b')]);
    expect(outputFolders(['x/a.json', 'b.yaml'], undefined)).toEqual([join('out', 'a'), join('out', 'b')]);
  });

  it('refuses two scenarios that would write to the same folder', () => {
    expect(() => outputFolders(['x/a.json', 'y/a.yaml'], undefined)).toThrow(UsageError);
    expect(() => outputFolders(['x/a.json', 'y/a.json'], 'res')).toThrow(/both write to/);
  });
});
