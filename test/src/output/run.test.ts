// The library pipeline in-process: runScenarioFile and what it leaves on disk.
import { existsSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { addSummarySection, OutputError, RunRefused, runScenarioFile, ScenarioError } from '../../../src/index.js';
import { BAD_TEXT, SMALL, tempDir, writeScenario } from '../cli/fixtures.js';

const dirs: string[] = [];
function dir(): string {
  const d = tempDir('lw-run-');
  dirs.push(d);
  return d;
}
afterAll(() => dirs.forEach((d) => rmSync(d, { recursive: true, force: true })));

describe('runScenarioFile', () => {
  it('loads, simulates and writes the three files, reporting what it did', async () => {
    const d = dir();
    const file = writeScenario(d, 'small.json', SMALL);
    const out = join(d, 'deep', 'er', 'out');
    const phases: string[] = [];
    const report = await runScenarioFile(file, out, { onPhase: (p) => phases.push(p) });
    expect(phases).toEqual(['load', 'simulate', 'render', 'write']);
    expect(report.files).toEqual(['probes.csv', 'waveforms.png', 'summary.json'].map((f) => join(out, f)));
    expect(readdirSync(out).sort()).toEqual(['probes.csv', 'summary.json', 'waveforms.png']);
    expect(report.scenario.net.title).toBe('Small matched line');
    expect(report.result.record.names).toEqual(['tx', 'mid', 'rx']);
    expect(report.wallTime.simulate).toBeGreaterThanOrEqual(0);
    expect(report.wallTime.total).toBeGreaterThanOrEqual(report.wallTime.simulate);
    expect(JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'))).toEqual(JSON.parse(JSON.stringify(report.summary)));
  });

  it('gives the same summary.json bytes on a second run (nothing run-specific in it)', async () => {
    const d = dir();
    const file = writeScenario(d, 's.json', SMALL);
    await runScenarioFile(file, join(d, 'a'));
    await runScenarioFile(file, join(d, 'b'));
    expect(readFileSync(join(d, 'b', 'summary.json'), 'utf8')).toBe(readFileSync(join(d, 'a', 'summary.json'), 'utf8'));
    expect(readFileSync(join(d, 'b', 'probes.csv'), 'utf8')).toBe(readFileSync(join(d, 'a', 'probes.csv'), 'utf8'));
  });

  it('lets other modules add summary sections before writing', async () => {
    const d = dir();
    const file = writeScenario(d, 's.json', SMALL);
    await runScenarioFile(file, join(d, 'o'), {
      extendSummary: ({ summary, result }) => addSummarySection(summary, 'checks', { passed: result.record.names.length, failed: 0, results: [] }),
    });
    expect(JSON.parse(readFileSync(join(d, 'o', 'summary.json'), 'utf8')).checks).toEqual({ passed: 3, failed: 0, results: [] });
  });

  it('throws ScenarioError with every problem and creates nothing on bad input', async () => {
    const d = dir();
    const file = writeScenario(d, 'bad.json', BAD_TEXT);
    const err = await runScenarioFile(file, join(d, 'out'), {}).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ScenarioError);
    expect((err as ScenarioError).problems.length).toBe(4);
    expect(readdirSync(d)).toEqual(['bad.json']);
  });

  it('refuses a run over the size limits before creating anything; force overrides', async () => {
    const d = dir();
    const file = writeScenario(d, 's.json', SMALL);
    const limits = { maxCellSteps: 1000 };
    await expect(runScenarioFile(file, join(d, 'out'), { limits })).rejects.toBeInstanceOf(RunRefused);
    expect(readdirSync(d)).toEqual(['s.json']);
    await runScenarioFile(file, join(d, 'out'), { limits, force: true });
    expect(readdirSync(join(d, 'out')).sort()).toEqual(['probes.csv', 'summary.json', 'waveforms.png']);
  });

  it('reports an output folder that cannot be created as OutputError', async () => {
    const d = dir();
    const file = writeScenario(d, 's.json', SMALL);
    writeFileSync(join(d, 'taken'), 'a file, not a folder');
    const err = await runScenarioFile(file, join(d, 'taken', 'out')).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(OutputError);
    expect(readdirSync(d).sort()).toEqual(['s.json', 'taken']);
  });

  /** A value JSON cannot hold (a BigInt), slipped past the section's type to make summary.json fail. */
  const UNSERIALIZABLE = 1n as never;

  it('removes the staged files and the folders it created when writing fails', async () => {
    const d = dir();
    const file = writeScenario(d, 's.json', SMALL);
    // A BigInt cannot be serialized: summary.json fails after probes.csv and the PNG were staged.
    const err = await runScenarioFile(file, join(d, 'new', 'out'), {
      extendSummary: ({ summary }) => addSummarySection(summary, 'crossCheck', UNSERIALIZABLE),
    }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(OutputError);
    expect(existsSync(join(d, 'new'))).toBe(false);
    expect(readdirSync(d)).toEqual(['s.json']);
  });

  it('leaves earlier outputs in place when a rerun into the same folder fails', async () => {
    const d = dir();
    const file = writeScenario(d, 's.json', SMALL);
    const out = join(d, 'out');
    await runScenarioFile(file, out);
    const before = readFileSync(join(out, 'probes.csv'), 'utf8');
    await expect(
      runScenarioFile(file, out, { extendSummary: ({ summary }) => addSummarySection(summary, 'crossCheck', UNSERIALIZABLE) }),
    ).rejects.toBeInstanceOf(OutputError);
    expect(readdirSync(out).sort()).toEqual(['probes.csv', 'summary.json', 'waveforms.png']);
    expect(readFileSync(join(out, 'probes.csv'), 'utf8')).toBe(before);
  });
});
