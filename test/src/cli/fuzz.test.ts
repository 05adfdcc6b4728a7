// The guarantees of every CLI verb on any input, checked over seeded mutations of the demo scenarios
// (test/support/fuzz.ts): exit code 0, 1, 2 or 3 only; no JavaScript error text on the terminal; no
// temporaries left; on an error, nothing that looks like a complete output; on success, no NaN or
// infinity in probes.csv and finite probe statistics in summary.json. The runs are in-process with
// small size limits, so each case is quick and memory stays bounded by the pre-run check.
//
// `npm run fuzz` runs 5 000 cases; LADDERWAVE_FUZZ_CASES and LADDERWAVE_FUZZ_SEED choose others, and a
// failure names its case number so that it can be run alone with LADDERWAVE_FUZZ_CASE=k.
import { existsSync, mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/program.js';
import { pendingTempFiles } from '../../../src/output/atomic.js';
import { demoScenarios, fuzzCase, type FuzzCase } from '../../support/fuzz.js';
import { collectOutput, tempDirs } from './fixtures.js';

const REPO = resolve(import.meta.dirname, '../../..');
const CASES = Number(process.env.LADDERWAVE_FUZZ_CASES ?? 300);
const SEED = Number(process.env.LADDERWAVE_FUZZ_SEED ?? 1);
const ONLY = process.env.LADDERWAVE_FUZZ_CASE === undefined ? undefined : Number(process.env.LADDERWAVE_FUZZ_CASE);
/** Small enough that every case runs in milliseconds; bigger mutations are refused (exit 3). */
const LIMITS = { maxCellSteps: 4e5, maxRecordBytes: 4 * 1024 ** 2, maxNodes: 5e4 };
const JS_ERROR = /TypeError|RangeError|ReferenceError|SyntaxError|Maximum call stack|\n\s+at \S+ \(|internal error|\[object Object\]/;

const dir = tempDirs('lw-fuzz-');

/** Every problem with one case's outcome, as sentences (empty: the guarantees hold). */
async function violations(c: FuzzCase, root: string): Promise<string[]> {
  const file = join(root, c.fileName);
  writeFileSync(file, c.text);
  const out = join(root, 'out');
  const args = c.args.map((a) => a.replace('FILE', file).replace('OUT', out));
  const io = collectOutput();
  const code = await runCli(args, { io, limits: LIMITS });
  const bad: string[] = [];
  const said = io.stdout + io.stderr;
  if (![0, 1, 2, 3].includes(code)) bad.push(`exit code ${code}`);
  if (JS_ERROR.test(said)) bad.push(`JavaScript error text: ${said.slice(0, 400)}`);
  if (pendingTempFiles().length) bad.push(`temporaries in flight: ${pendingTempFiles().join(', ')}`);
  const hidden = readdirSync(root).filter((n) => n.startsWith('.'));
  if (hidden.length) bad.push(`hidden files left: ${hidden.join(', ')}`);
  const verb = c.args[0]!;
  if (verb === 'check') {
    // The report is written whatever the verdict; it must be whole.
    if (existsSync(join(out, 'check.json'))) JSON.parse(readFileSync(join(out, 'check.json'), 'utf8'));
  } else if (code >= 2 && existsSync(out)) bad.push(`exit ${code} but ${out} exists: ${readdirSync(out).join(', ')}`);
  if (code <= 1 && (verb === 'run' || verb === 'eye') && existsSync(out)) {
    type Stats = Record<string, { min: unknown; max: unknown; final: unknown }>;
    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8')) as { probes: Stats; receivers?: Stats };
    for (const [section, entries] of [['probe', summary.probes], ['receiver', summary.receivers ?? {}]] as const) {
      for (const [name, s] of Object.entries(entries)) {
        if (![s.min, s.max, s.final].every((x) => typeof x === 'number' && Number.isFinite(x))) bad.push(`summary.json: ${section} ${name} has min/max/final ${JSON.stringify([s.min, s.max, s.final])}`);
      }
    }
    if (existsSync(join(out, 'probes.csv')) && /\b(NaN|Infinity)\b/.test(readFileSync(join(out, 'probes.csv'), 'utf8').split('\n').slice(1).join('\n'))) bad.push('probes.csv holds NaN or Infinity');
  }
  return bad;
}

describe(`every verb on ${ONLY === undefined ? CASES : 1} mutated demo scenarios (seed ${SEED})`, () => {
  const demos = demoScenarios(REPO);
  it('keeps the guarantees', { timeout: Math.max(120_000, CASES * 2_000) }, async () => {
    const failures: string[] = [];
    const cases = ONLY === undefined ? [...Array(CASES).keys()] : [ONLY];
    const base = dir();
    for (const k of cases) {
      const c = fuzzCase(demos, SEED, k);
      const root = join(base, `case-${k}`);
      mkdirSync(root);
      const bad = await violations(c, root).catch((e: unknown) => [`the test itself failed: ${(e as Error).message}`]);
      if (bad.length) failures.push(`case ${k} (${c.edits.join('; ')}; ${c.args.join(' ')}):\n  ${bad.join('\n  ')}`);
      else rmSync(root, { recursive: true, force: true }); // a failing case's files stay for a look
    }
    expect(failures, failures.join('\n')).toEqual([]);
  });
});
