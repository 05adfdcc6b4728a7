// `ladderwave tame` in-process: outputs, the written-back scenario, exit codes and usage errors.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/program.js';
import { SMALL, writeScenario, collectOutput, tempDirs } from './fixtures.js';

const dir = tempDirs();
const collect = collectOutput;
const NET = { ...SMALL, driver: { ...SMALL.driver, resistance: '10ohm' }, receiver: { parts: [] }, run: { duration: '6ns' } };

describe('ladderwave tame', () => {
  it('prints the ranked table, writes tame.md/json/png and the winner beside the scenario (exit 0)', async () => {
    const d = dir();
    const f = writeScenario(d, 'net.json', NET);
    const out = join(d, 'out');
    const io = collect();
    const code = await runCli(['tame', f, '--only', 'none,series', '--out', out, '--jobs', '1'], { io });
    expect(io.stderr).toBe('');
    expect(code).toBe(0);
    // Z0 = 50 Ω, R_out = 10 Ω: Rs = Z0 − R_out = 40 Ω (Johnson & Graham ch. 6) → 39 Ω in E24
    expect(io.stdout).toMatch(/1 +series R at the driver +39 Ω +pass/);
    expect(readdirSync(out).sort()).toEqual(['tame.json', 'tame.md', 'tame.png']);
    expect(readdirSync(d).filter((x) => x.endsWith('.json')).sort()).toEqual(['net.json', 'net.tamed-series.json']);
    const written = JSON.parse(readFileSync(join(d, 'net.tamed-series.json'), 'utf8'));
    expect(written.route[0]).toEqual({ name: 'term_rs', series: { r: '39ohm' } });
    expect(JSON.parse(readFileSync(join(out, 'tame.json'), 'utf8')).options[0].id).toBe('series');
    expect(readFileSync(join(out, 'tame.png')).subarray(1, 4).toString()).toBe('PNG');
    const check = collect();
    expect(await runCli(['check', join(d, 'net.tamed-series.json')], { io: check })).toBe(0);
  }, 60_000);

  it('refuses an unknown objective, series or topology with exit 2', async () => {
    const d = dir();
    const f = writeScenario(d, 'net.json', NET);
    for (const [opt, val, msg] of [
      ['--objective', 'speed', /--objective speed: expected one of settling, overshoot/],
      ['--series', 'E25', /--series E25: expected one of E3, E6/],
      ['--only', 'diode', /--only diode: expected topology names from none, series/],
      ['--tolerance', '70%', /--tolerance 70%: expected a percentage/],
    ] as const) {
      const io = collect();
      expect(await runCli(['tame', f, opt, val], { io })).toBe(2);
      expect(io.stderr).toMatch(msg);
    }
  });
});
