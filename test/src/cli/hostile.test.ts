// The reproducers of careless and hostile use, each rebuilt as a test through the CLI in-process:
// every verb ends with exit 0, 1, 2 or 3, prints no JavaScript error text, and leaves nothing that
// looks like an output when it fails.
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/program.js';
import { runTdrFile } from '../../../src/output/tdr.js';
import { refusalLines } from '../../../src/engine-text.js';
import { RunRefused } from '../../../sim/errors.js';
import { collectOutput, SMALL, tempDirs, writeScenario } from './fixtures.js';

const dir = tempDirs('lw-hostile-');
const JS_ERROR = /TypeError|RangeError|ReferenceError|SyntaxError|Maximum call stack|\n\s+at \S+ \(|internal error/;

async function cli(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  const io = collectOutput();
  const code = await runCli(args, { io });
  return { code, stdout: io.stdout, stderr: io.stderr };
}

const BITS = {
  ...SMALL,
  driver: { signal: { kind: 'bits', low: '0V', high: '1V', bitTime: '1ns', rise: '200ps', pattern: '0110' }, resistance: '50ohm' },
};
/** 1 fs edges for 10^6 s: more than any machine holds, forced or not. */
const IMPOSSIBLE = { ...SMALL, driver: { ...SMALL.driver, signal: { ...SMALL.driver.signal, rise: '1fs' } }, run: { duration: '1000000s' } };

describe('outputs that cannot be written: exit 2 at once, before any simulation', () => {
  it.each([
    ['run', (f: string) => ['run', f, '--out', '/proc/self/x']],
    ['run --views none', (f: string) => ['run', f, '--views', 'none', '--out', '/proc/self/x/y/z']],
    ['eye', (f: string) => ['eye', f, '--out', '/proc/self/x']],
    ['tdr', (f: string) => ['tdr', f, '--out', '/proc/self/x']],
    ['sweep', (f: string) => ['sweep', f, '--vary', 'route.trace.length=5cm,10cm', '--out', '/proc/self/x', '-j', '1']],
    ['check --json', (f: string) => ['check', f, '--json', '/proc/self/x/r.json']],
    ['check --junit', (f: string) => ['check', f, '--junit', '/proc/self/x/r.xml']],
    ['check --update-golden', (f: string) => ['check', f, '--golden', '/proc/self/x', '--update-golden']],
  ])('%s under /proc/self', async (_what, args) => {
    const d = dir();
    const file = writeScenario(d, 'net.json', BITS);
    const r = await cli(args(file));
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/\/proc\/self is on the proc pseudo-filesystem/);
    expect(r.stderr).not.toMatch(JS_ERROR);
  });

  it('a file where the output folder should be, or where one of its parents should be', async () => {
    const d = dir();
    const file = writeScenario(d, 'net.json', SMALL);
    expect((await cli(['run', file, '--out', file])).stderr).toMatch(/is a file, not a folder/);
    expect((await cli(['run', file, '--out', join(file, 'sub')])).code).toBe(2);
    expect(readdirSync(d)).toEqual(['net.json']);
  });
});

describe('input files', () => {
  it('run /dev/zero is refused after 8 MiB with exit 2', async () => {
    const r = await cli(['run', '/dev/zero', '--out', join(dir(), 'o')]);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('expected a scenario file of at most 8 MiB');
  });

  it('a self-referencing YAML alias is exit 2 with its line:column', async () => {
    const d = dir();
    const file = writeScenario(d, 'self.yaml', 'title: &x [*x]\n');
    const r = await cli(['check', file]);
    expect(r.code).toBe(2);
    expect(r.stdout + r.stderr).toMatch(/self\.yaml:1:12 title\[0\]: "\*x" — expected an alias outside the value it names/);
    expect(r.stdout + r.stderr).not.toMatch(JS_ERROR);
  });
});

describe('--force never past what the machine can hold', () => {
  it.each([
    ['run', (f: string, o: string) => ['run', f, '--force', '--out', o]],
    ['eye', (f: string, o: string) => ['eye', f, '--force', '--out', o]],
    ['check', (f: string) => ['check', f, '--force']],
  ])('%s: exit 3 naming the size, not "Invalid typed array length"', async (_what, args) => {
    const d = dir();
    const file = writeScenario(d, 'net.json', { ...IMPOSSIBLE, driver: BITS.driver });
    const r = await cli(args(file, join(d, 'o')));
    expect(r.code).toBe(3);
    expect(r.stdout + r.stderr).toMatch(/refused even with --force: it is more than this machine can hold/);
    expect(r.stdout + r.stderr).not.toMatch(JS_ERROR);
    expect(existsSync(join(d, 'o'))).toBe(false);
  });

  it('tdr with a 1 fs step, forced: exit 3', async () => {
    const d = dir();
    const file = writeScenario(d, 'net.json', { ...SMALL, route: [{ name: 'cable', line: { z0: '50ohm', delay: '5ns/m' }, length: '100km' }], probes: undefined });
    const r = await cli(['tdr', file, '--rise', '1fs', '--force', '--out', join(d, 'o')]);
    expect(r.code).toBe(3);
    expect(r.stderr).not.toMatch(JS_ERROR);
  });
});

describe('net-level errors carry the line:column of the item involved', () => {
  it('two ideal sources tied together by zero-ohm paths', async () => {
    const d = dir();
    const file = writeScenario(
      d,
      'tied.json',
      `{
  "title": "tied",
  "driver": { "signal": { "kind": "step", "from": "0V", "to": "1V", "rise": "100ps" }, "resistance": "0ohm" },
  "route": [
    { "name": "short", "shunt": { "r": "0ohm", "to": "1V" } },
    { "name": "trace", "line": { "z0": "50ohm", "delay": "5ns/m" }, "length": "10cm" }
  ]
}
`,
    );
    const r = await cli(['run', file, '--out', join(d, 'o')]);
    expect(r.code).toBe(2);
    expect(r.stderr).toBe(`${file}:5:5 short: two ideal sources or rails (0 V and 1 V) are tied together by zero-ohm paths (with driver)\n`);
  });
});

describe('a 0 Ω driver and a lone 0 Ω part are accepted, as the scenario format says', () => {
  it('runs an ideal source through a 0 Ω series part', async () => {
    const d = dir();
    const file = writeScenario(d, 'ideal.json', { ...SMALL, driver: { ...SMALL.driver, resistance: '0ohm' }, route: [{ name: 'wire', series: { r: '0ohm' } }, ...SMALL.route] });
    expect((await cli(['run', file, '--views', 'none', '--out', join(d, 'o'), '-q'])).code).toBe(0);
  });
});

describe('names of Object.prototype members are names like any other', () => {
  it('probes "__proto__", "constructor", "toString" and a line "__proto__" all reach summary.json and probes.csv', async () => {
    const d = dir();
    const file = writeScenario(d, 'proto.json', {
      ...SMALL,
      // A computed key: a literal `__proto__:` would set the object's prototype instead.
      lines: { ['__proto__']: { z0: '50ohm', delay: '5ns/m' } },
      route: [{ name: 'constructor', line: '__proto__', length: '10cm' }],
      probes: [
        { name: '__proto__', at: 'driver' },
        { name: 'constructor', at: 'constructor', position: '50%' },
        { name: 'toString', at: 'receiver', thresholds: 'lvcmos33' },
      ],
      checks: [{ probe: 'toString', metric: 'overshoot', max: '50%' }],
    });
    const r = await cli(['run', file, '--views', 'none', '--out', join(d, 'o'), '-q']);
    expect(r).toEqual({ code: 0, stdout: '', stderr: '' });
    const summary = JSON.parse(readFileSync(join(d, 'o', 'summary.json'), 'utf8'));
    expect(Object.keys(summary.probes)).toEqual(['__proto__', 'constructor', 'toString']);
    expect(Object.keys(summary.measurements.probes ?? summary.measurements)).toEqual(['__proto__', 'constructor', 'toString']);
    expect(readFileSync(join(d, 'o', 'probes.csv'), 'utf8').split('\n')[0]).toBe('time_s,__proto__,constructor,toString');
  });
});

describe('refusal texts suggest values that run', () => {
  it("tdr's suggested --rise fits the limits it was refused against, and names only tdr's own options", async () => {
    const d = dir();
    const file = writeScenario(d, 'net.json', { ...SMALL, route: [{ name: 'cable', line: { z0: '50ohm', delay: '5ns/m' }, length: '2m' }], probes: undefined });
    const limits = { maxCellSteps: 2e6 };
    const e = await runTdrFile(file, join(d, 'o'), { rise: 1e-12, limits }).catch((x: unknown) => x);
    expect(e).toBeInstanceOf(RunRefused);
    // The words the CLI prints for it.
    const text = refusalLines(e as RunRefused).join('\n');
    expect(text).not.toMatch(/cellsPerRise|duration up to|e[+-]\d+ s/);
    const m = /--rise (\d+(?:\.\d+)?)(fs|ps|ns|us)\b/.exec(text);
    expect(m, text).not.toBeNull();
    const rise = Number(m![1]) * { fs: 1e-15, ps: 1e-12, ns: 1e-9, us: 1e-6 }[m![2] as 'fs' | 'ps' | 'ns' | 'us'];
    const ok = await runTdrFile(file, join(d, 'o'), { rise, limits });
    expect(ok.profile.rise).toBeCloseTo(rise, 20);
  });

  it('tdr refuses a step slower than ten round trips, suggesting a --rise that is accepted', async () => {
    const d = dir();
    const file = writeScenario(d, 'net.json', SMALL);
    const r = await cli(['tdr', file, '--rise', '1s', '--out', join(d, 'o')]);
    expect(r.code).toBe(2);
    const m = /give --rise (\S+) or faster/.exec(r.stderr);
    expect(m, r.stderr).not.toBeNull();
    expect((await cli(['tdr', file, '--rise', m![1]!, '--out', join(d, 'o'), '-q'])).code).toBe(0);
  });
});
