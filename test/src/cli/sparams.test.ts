// `ladderwave sparams` in-process: the Touchstone file it writes reads back to the textbook two-port,
// the options and their errors, exit codes. The S-parameter math is checked in test/sim/sparams.
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/program.js';
import { parseTouchstone } from '../../../src/touchstone/index.js';
import { collectOutput, SMALL, tempDirs, writeScenario } from './fixtures.js';

const dir = tempDirs('lw-sparams-');

/** A 75 Ω line, quarter wave at 1 GHz (TD = 250 ps), between 50 Ω ends. */
const QUARTER_WAVE = {
  ...SMALL,
  title: 'Quarter-wave 75 ohm section',
  route: [
    { name: 'rs', series: { r: '0ohm' } },
    { name: 'sec', line: { z0: '75ohm', delay: '5ns/m' }, length: '5cm' },
  ],
  probes: [{ name: 'rx', at: 'receiver' }],
};

describe('ladderwave sparams', () => {
  it('writes sparams.s2p (1.1, # GHz S RI R 50), sparams.png and sparams.json; S11 = 5/13, S21 = −j·12/13 at 1 GHz', async () => {
    const d = dir();
    const file = writeScenario(d, 'qw.json', QUARTER_WAVE);
    const out = join(d, 'res');
    const io = collectOutput();
    expect(await runCli(['sparams', file, '--out', out, '--fmax', '4GHz', '--points', '400'], { io })).toBe(0);
    expect(io.stderr).toBe('');
    expect(readdirSync(out).sort()).toEqual(['sparams.json', 'sparams.png', 'sparams.s2p']);
    const text = readFileSync(join(out, 'sparams.s2p'), 'latin1');
    expect(text).toMatch(/^# GHz S RI R 50$/m);
    const t = parseTouchstone(text, { file: 'sparams.s2p' });
    const k = Array.from(t.freq).indexOf(1e9);
    expect(k).toBe(99);
    // Pozar, Microwave Engineering, 4th ed., Table 4.2 (12 digits in the file)
    expect(Math.abs(t.values[8 * k] - 5 / 13)).toBeLessThan(1e-9);
    expect(Math.abs(t.values[8 * k + 5] + 12 / 13)).toBeLessThan(1e-9);
    const png = PNG.sync.read(readFileSync(join(out, 'sparams.png')));
    expect([png.width, png.height]).toEqual([1200, 1100]);
    const summary = JSON.parse(readFileSync(join(out, 'sparams.json'), 'utf8'));
    expect(summary.stretch).toMatchObject({ from: 'rs', to: 'sec', items: 2 });
    expect(summary.stretch.delay).toBeCloseTo(250e-12, 20);
    // |S11| peaks at 5/13 (−8.30 dB) at the odd quarter waves, 1 and 3 GHz
    expect(summary.worstReturn.db).toBeCloseTo(20 * Math.log10(5 / 13), 6);
    expect(io.stdout).toMatch(/grid {8}400 points, linear, 10 MHz to 4 GHz/);
    expect(io.stdout).toMatch(/σmax\(S\) +1\.000000 .*\(passive\)/);
  });

  it('writes Touchstone 2.0 with --format 2.0, a stretch with --from/--to, and a log grid', async () => {
    const d = dir();
    const file = writeScenario(d, 'qw.json', QUARTER_WAVE);
    const io = collectOutput();
    const out = join(d, 'o');
    expect(await runCli(['sparams', file, '--out', out, '--format', '2.0', '--numbers', 'db', '--from', 'sec', '--log', '--fmin', '1MHz', '--fmax', '1GHz', '--points', '31', '-q'], { io })).toBe(0);
    expect(io.stdout + io.stderr).toBe('');
    const text = readFileSync(join(out, 'sparams.s2p'), 'latin1');
    expect(text).toMatch(/^\[Version\] 2\.0\n# GHz S DB R 50\n\[Number of Ports\] 2\n\[Two-Port Data Order\] 12_21\n\[Number of Frequencies\] 31\n/m);
    const t = parseTouchstone(text, { file: 'x.ts' });
    expect(t.freq[0]).toBeCloseTo(1e6, 3);
    expect(t.freq[30]).toBeCloseTo(1e9, 3);
  });

  it('refuses bad options and unknown items with exit code 2, writing nothing', async () => {
    const d = dir();
    const file = writeScenario(d, 'qw.json', QUARTER_WAVE);
    const cases: Array<[string[], RegExp]> = [
      [['--format', '3.0'], /--format "3\.0": expected 1\.1 or 2\.0/],
      [['--numbers', 'XY'], /expected RI, MA or DB/],
      [['--z0', '-50ohm'], /--z0 "-50ohm": expected/],
      [['--fmin', '1MHz'], /--fmin sets the start of a log grid: add --log/],
      [['--points', '1'], /--points "1": expected a whole number ≥ 2/],
      [['--from', 'conn9'], /no route item named 'conn9'; the route has 'rs', 'sec'/],
    ];
    for (const [args, message] of cases) {
      const io = collectOutput();
      const out = join(d, 'never');
      expect(await runCli(['sparams', file, '--out', out, ...args], { io })).toBe(2);
      expect(io.stderr).toMatch(message);
      expect(existsSync(out)).toBe(false);
    }
  });
});
