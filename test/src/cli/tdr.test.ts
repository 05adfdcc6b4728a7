// `ladderwave tdr` in-process: files written, exit codes, bad options, nothing left behind on failure.
// The reading itself is checked against its references in test/src/views/tdr.test.ts; here a matched
// 50 Ω line must read 50 Ω (Z = Z0·(1 + ρ)/(1 − ρ) with ρ = 0; Pozar, Microwave Engineering, ch. 2).
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/program.js';
import { tdrOutputFolder } from '../../../src/cli/commands/tdr.js';
import { BAD_TEXT, HUGE, SMALL, writeScenario, collectOutput, tempDirs } from './fixtures.js';

const collect = collectOutput;
const dir = tempDirs('lw-tdr-');

describe('ladderwave tdr', () => {
  it('writes tdr.png and tdr.csv and prints the reading of each segment', async () => {
    const d = dir();
    const file = writeScenario(d, 'net.json', SMALL);
    const out = join(d, 'res');
    const io = collect();
    expect(await runCli(['tdr', file, '--rise', '50ps', '--out', out], { io })).toBe(0);
    expect(io.stderr).toBe('');
    expect(readdirSync(out).sort()).toEqual(['tdr.csv', 'tdr.png']);
    const png = PNG.sync.read(readFileSync(join(out, 'tdr.png')));
    expect([png.width, png.height]).toEqual([1200, 900]);
    const lines = readFileSync(join(out, 'tdr.csv'), 'utf8').trimEnd().split('\n');
    expect(lines[0]).toBe('time_s,distance_m,impedance_ohm');
    // matched line into a matched load: 50 Ω all along (10 cm), time and distance increasing
    const rows = lines.slice(1).map((l) => l.split(',').map(Number));
    let prev = -Infinity;
    for (const [t, x, z] of rows) {
      expect(t).toBeGreaterThan(prev);
      prev = t;
      if (x > 0.005 && x < 0.095) expect(Math.abs(z - 50)).toBeLessThan(0.5);
    }
    expect(io.stdout).toMatch(/resolution {2}\S+ mm in 'trace' \(v·t_r\/4\)/);
    expect(io.stdout).toMatch(/trace +50 Ω +50 Ω/);
    expect(io.stdout).toContain(join(out, 'tdr.png'));
  });

  it('writes into its own folder by default, out/<scenario>-tdr, apart from the run’s (as eye and sweep do)', () => {
    expect(tdrOutputFolder(join('nets', 'clock.json'), undefined)).toBe(join('out', 'clock-tdr'));
    expect(tdrOutputFolder('clock.json', 'elsewhere')).toBe('elsewhere');
  });

  it('--quiet prints nothing; --z0 sets the reference', async () => {
    const d = dir();
    const file = writeScenario(d, 'net.json', SMALL);
    const io = collect();
    expect(await runCli(['tdr', file, '--z0', '75ohm', '--out', join(d, 'o'), '--quiet'], { io })).toBe(0);
    expect(io.stdout + io.stderr).toBe('');
    // a 50 Ω line seen from 75 Ω reads 50 Ω all the same
    const rows = readFileSync(join(d, 'o', 'tdr.csv'), 'utf8').trimEnd().split('\n').slice(1).map((l) => l.split(',').map(Number));
    const mid = rows.filter(([, x]) => x > 0.03 && x < 0.07);
    expect(mid.length).toBeGreaterThan(10);
    for (const [, , z] of mid) expect(Math.abs(z - 50)).toBeLessThan(0.5);
  });

  it.each([
    [['--rise', '3V'], /--rise "3V": expected a time/],
    [['--rise', '-5ps'], /--rise "-5ps": expected a time > 0/],
    [['--z0', '50pF'], /--z0 "50pF": expected a resistance/],
  ])('%j is a usage error (exit 2) and writes nothing', async (extra, message) => {
    const d = dir();
    const file = writeScenario(d, 'net.json', SMALL);
    const io = collect();
    expect(await runCli(['tdr', file, '--out', join(d, 'o'), ...extra], { io })).toBe(2);
    expect(io.stderr).toMatch(message);
    expect(existsSync(join(d, 'o'))).toBe(false);
  });

  it('a bad scenario lists every problem, exits 2 and leaves no folder', async () => {
    const d = dir();
    const file = writeScenario(d, 'bad.json', BAD_TEXT);
    const io = collect();
    expect(await runCli(['tdr', file, '--out', join(d, 'o')], { io })).toBe(2);
    expect(io.stderr.trimEnd().split('\n')).toHaveLength(4);
    expect(existsSync(join(d, 'o'))).toBe(false);
  });

  it('refuses a run over the size limits with exit 3', async () => {
    const d = dir();
    const file = writeScenario(d, 'huge.json', HUGE);
    const io = collect();
    expect(await runCli(['tdr', file, '--rise', '1ps', '--out', join(d, 'o')], { io })).toBe(3);
    expect(io.stderr).toMatch(/--force/);
    expect(existsSync(join(d, 'o'))).toBe(false);
  });
});
