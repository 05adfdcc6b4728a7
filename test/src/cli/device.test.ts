import { describe, expect, it } from 'vitest';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { PNG } from 'pngjs';
import { runCli } from '../../../src/cli/program.js';
import { collectOutput, tempDirs } from './fixtures.js';

const tempDir = tempDirs('lw-device-');
const LUMEN = 'test/fixtures/ibis/lumen_m4.ibs';

describe('ladderwave device', () => {
  it('prints a pin\'s model, its tables and its waveforms with the model\'s reproduction, and writes two PNGs (exit 0)', async () => {
    const dir = tempDir();
    const io = collectOutput();
    const code = await runCli(['device', LUMEN, '--component', 'LUMEN-M4', '--pin', '3', '--out', dir], { io });
    expect(code, io.stderr).toBe(0);
    const out = io.stdout;
    expect(out).toMatch(/^gpio_8ma: I\/O model, corner typ/);
    expect(out).toMatch(/package R 310\.0 mΩ, L 2\.900 nH, C 550\.0 fF/);
    expect(out).toMatch(/line 24: \[Diff Pin\]/);
    // the reproduction of each file waveform is within the 1 % the two-equation method promises
    const worst = [...out.matchAll(/model within ([\d.]+) % of swing/g)].map((m) => Number(m[1]));
    expect(worst).toHaveLength(4);
    for (const w of worst) expect(w).toBeLessThan(1);
    for (const f of ['iv.png', 'waveforms.png']) {
      const png = PNG.sync.read(readFileSync(join(dir, f)));
      expect(png.width).toBe(1200);
    }
  });

  it('a malformed file exits 2 and lists every problem with file, line and keyword', async () => {
    const dir = tempDir();
    const bad = join(dir, 'bad.ibs');
    writeFileSync(bad, '[IBIS Ver] 5.1\n[Model] x\nModel_type Wobbly\nC_comp 1p NA NA\n[Voltage Range] 3.3 NA NA\n[GND Clamp]\n0 0 NA\n');
    const io = collectOutput();
    expect(await runCli(['device', bad, '--no-plots'], { io })).toBe(2);
    expect(io.stderr).toContain(`${bad}:3 [Model]: Model_type "Wobbly" — expected one of the supported types`);
    expect(io.stderr).toContain(`${bad}:7 [GND Clamp]: row "0 0 NA" — expected 4 columns`);
  });

  it('asks for a model when the file has several, naming them (exit 2)', async () => {
    const io = collectOutput();
    expect(await runCli(['device', LUMEN, '--no-plots'], { io })).toBe(2);
    expect(io.stderr).toMatch(/3 models \("gpio_8ma", "clk_ramp", "in_schmitt"\)/);
  });
});
