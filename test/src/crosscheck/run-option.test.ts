// `ladderwave run --cross-check` end to end (in process): the comparison is printed, summary.json
// gets a "crossCheck" section and crosscheck.png is written next to the other outputs.
import { existsSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { PNG } from 'pngjs';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/program.js';
import { tempDir, writeScenario } from '../cli/fixtures.js';

const dirs: string[] = [];
afterAll(() => dirs.forEach((d) => rmSync(d, { recursive: true, force: true })));

function collect() {
  const io = { stdout: '', stderr: '', out: (s: string) => void (io.stdout += s), err: (s: string) => void (io.stderr += s) };
  return io;
}

const LOSSY = {
  title: 'Lossy FR-4 trace',
  driver: { signal: { kind: 'step', from: '0V', to: '2.5V', start: '100ps', rise: '100ps' }, resistance: '50ohm' },
  route: [{ name: 'trace', line: { microstrip: { width: '0.3mm', height: '0.18mm', thickness: '1oz', er: 4.3, lossTangent: 0.02 } }, length: '10cm' }],
  receiver: { parts: [{ r: '50ohm' }] },
  probes: [
    { name: 'tx', at: 'driver' },
    { name: 'rx', at: 'receiver' },
  ],
  run: { duration: '3ns' },
};

describe('run --cross-check', () => {
  it('prints the largest difference per probe, writes crosscheck.png and summary.json "crossCheck" (within 0.5 % of the 2.5 V swing)', async () => {
    const d = tempDir('lw-cc-');
    dirs.push(d);
    const file = writeScenario(d, 'lossy.json', LOSSY);
    const out = join(d, 'out');
    const io = collect();
    expect(await runCli(['run', file, '--out', out, '--cross-check'], { io })).toBe(0);
    expect(io.stdout).toMatch(/cross-check: largest \d+\.\d{3} % of the 2\.5 V swing at (tx|rx) \(tx \d+\.\d{3} %, rx \d+\.\d{3} %\)/);
    expect(io.stdout).toContain(join(out, 'crosscheck.png'));
    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    expect(summary.crossCheck.swing).toBe(2.5);
    expect(Object.keys(summary.crossCheck.probes)).toEqual(['tx', 'rx']);
    for (const p of Object.values(summary.crossCheck.probes) as { percentOfSwing: number }[]) expect(p.percentOfSwing).toBeLessThan(0.5);
    const png = PNG.sync.read(readFileSync(join(out, 'crosscheck.png')));
    expect([png.width, png.height]).toEqual([1200, 900]);
  });

  it('without --cross-check there is neither file nor section', async () => {
    const d = tempDir('lw-cc-');
    dirs.push(d);
    const file = writeScenario(d, 'lossy.json', LOSSY);
    const out = join(d, 'out');
    expect(await runCli(['run', file, '--out', out, '--quiet'], { io: collect() })).toBe(0);
    expect(existsSync(join(out, 'crosscheck.png'))).toBe(false);
    expect(JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8')).crossCheck).toBeUndefined();
  });
});
