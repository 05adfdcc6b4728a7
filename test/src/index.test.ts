// The library entry point: exactly the names docs/library.md documents, and a user's own regression
// test written against it alone (load → simulate → measure → check → render → write).
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import * as api from '../../src/index.js';
import { tempDirs } from './cli/fixtures.js';

const REPO = resolve(import.meta.dirname, '../..');
const dir = tempDirs('lw-api-');

/** The names src/index.ts exports, split into values and types (`export type {…}`, `type X`). */
function indexExports(): { values: Set<string>; types: Set<string> } {
  const src = readFileSync(join(REPO, 'src/index.ts'), 'utf8');
  const values = new Set<string>();
  const types = new Set<string>();
  for (const m of src.matchAll(/export (type )?\{([^}]*)\}/g)) {
    for (const raw of m[2]!.split(',').map((s) => s.trim()).filter(Boolean)) {
      const isType = !!m[1] || raw.startsWith('type ');
      const name = raw.replace(/^type /, '').split(/\s+as\s+/).pop()!;
      (isType ? types : values).add(name);
    }
  }
  return { values, types };
}

/** Every backticked name in the first column of docs/library.md's tables. */
function documentedNames(): Set<string> {
  const names = new Set<string>();
  for (const line of readFileSync(join(REPO, 'docs/library.md'), 'utf8').split('\n')) {
    const first = /^\| ([^|]+) \|/.exec(line)?.[1];
    if (!first || first === 'name' || first.startsWith('---')) continue;
    for (const m of first.matchAll(/`(\w+)`/g)) names.add(m[1]!);
  }
  return names;
}

describe('the library entry point', () => {
  it('exports exactly the names docs/library.md documents, and at run time exactly its values', () => {
    const { values, types } = indexExports();
    expect([...documentedNames()].sort()).toEqual([...values, ...types].sort());
    expect(Object.keys(api).sort()).toEqual([...values].sort());
  });
});

describe("a user's regression test through the library alone", () => {
  // A 1 V step behind 50 Ω into a 50 Ω lossless line of 10 cm at 5 ns/m, ended in 50 Ω: matched at
  // both ends, so the receiver is the source halved and delayed by one line delay TD = ℓ·(delay/m)
  // = 0.5 ns, with no reflection (Pozar, Microwave Engineering, 4th ed., §2.3 and §2.7: a line
  // terminated in Z0 reflects nothing; the source divider Z0/(Rs + Z0) = ½). The leapfrog scheme at
  // Courant 1 moves a wave one cell per step exactly, so the delay is met to the sampling's rounding.
  const TEXT = JSON.stringify({
    title: 'bench supply sense line (invented)',
    driver: { signal: { kind: 'step', from: '0V', to: '1V', start: '100ps', rise: '100ps' }, resistance: '50ohm' },
    route: [{ name: 'trace', line: { z0: '50ohm', delay: '5ns/m' }, length: '10cm' }],
    receiver: { parts: [{ r: '50ohm' }] },
    probes: [{ name: 'rx', at: 'receiver' }],
    checks: [{ probe: 'rx', metric: 'overshoot', max: '1%' }],
    run: { duration: '2ns' },
  });

  it('loads, simulates, measures the delay and the final level, and passes its check', () => {
    const { net, problems } = api.checkScenario(TEXT, 'sense.json');
    expect(problems).toEqual([]);
    const result = api.simulate(net!);
    const { measurements, results } = api.measureNet(net!, result);
    expect(measurements.rx!.delays![0]!.delay50).toBeCloseTo(0.5e-9, 12);
    expect(measurements.rx!.final).toBeCloseTo(0.5, 9);
    expect(results.map((r) => r.pass)).toEqual([true]);
  });

  it('renders and writes the run folder whose summary agrees with the measurement', async () => {
    const { net } = api.checkScenario(TEXT, 'sense.json');
    const result = api.simulate(net!);
    const png = await api.renderResult(net!.title, result);
    expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]); // PNG signature (ISO/IEC 15948 §5.2)
    const summary = api.buildSummary({ scenario: { file: 'sense.json', title: net!.title, sha256: '' }, net: net!, discretization: result.discretization, record: result.record });
    const out = join(dir(), 'run');
    const files = await api.writeRunOutputs(out, { title: net!.title, result, summary }, png);
    expect(files.map((f) => f.slice(out.length + 1)).sort()).toEqual(Object.values(api.OUTPUT_FILES).sort());
    const written = JSON.parse(readFileSync(join(out, api.OUTPUT_FILES.summary), 'utf8'));
    expect(written.probes.rx.final).toBeCloseTo(0.5, 9);
  });

  it('words a failure as the CLI does, with its exit code', () => {
    const { problems } = api.checkScenario(TEXT.replace('"10cm"', '"10cV"'), 'sense.json');
    const f = api.describeFailure(new api.ScenarioError(problems));
    expect(f.code).toBe(api.EXIT.badInput);
    expect(f.lines).toEqual([expect.stringMatching(/^sense\.json:1:\d+ route\[0\]\.length: "10cV" — expected a length/)]);
  });
});
