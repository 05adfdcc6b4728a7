// `ladderwave eye` in-process: the whole PRBS-7 pattern is run, eye.png and summary.json are written,
// and bad requests exit 2 without leaving anything behind.
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/program.js';
import { SMALL, writeScenario, collectOutput, tempDirs } from './fixtures.js';

const collect = collectOutput;

const dir = tempDirs('lw-eye-');

/** PRBS-7 at 1 Gb/s over a matched 5 cm line (TD = 300 ps); the scenario's own duration is far too short. */
const BITS = {
  title: 'PRBS-7 over a matched trace',
  driver: {
    signal: { kind: 'bits', low: '0V', high: '1V', bitTime: '1ns', rise: '200ps', fall: '200ps', pattern: 'prbs7' },
    resistance: '50ohm',
  },
  route: [{ name: 'trace', line: { z0: '50ohm', delay: '6ns/m' }, length: '5cm' }],
  receiver: { parts: [{ r: '50ohm' }] },
  probes: [
    { name: 'tx', at: 'driver' },
    { name: 'rx', at: 'receiver' },
  ],
  run: { duration: '5ns' },
};

describe('ladderwave eye', () => {
  it('runs the whole PRBS-7 pattern and writes eye.png and summary.json with the eye section', async () => {
    const d = dir();
    const file = writeScenario(d, 'bits.json', BITS);
    const out = join(d, 'eye');
    const io = collect();
    expect(await runCli(['eye', file, '--out', out], { io })).toBe(0);
    expect(io.stderr).toBe('');
    expect(readdirSync(out).sort()).toEqual(['eye.png', 'summary.json']);
    const png = PNG.sync.read(readFileSync(join(out, 'eye.png')));
    expect([png.width, png.height]).toEqual([1200, 700]);

    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    // PRBS-7 has period 2^7 − 1 = 127 bits (ITU-T O.150); the run covers it, two more UI and 7·TD
    expect(summary.record.end).toBeGreaterThanOrEqual(129e-9 + 7 * 0.3e-9 - 1e-15);
    expect(summary.eye.probe).toBe('rx');
    expect(summary.eye.windows).toBeGreaterThanOrEqual(127);
    // matched lossless line: the receiver sees half the 1 V source (Pozar §2.4), so the eye is 0.5 V tall
    // and one UI wide at 50 % (equal ramps; see test/src/views/eye.test.ts for the derivation)
    expect(summary.eye.eyeHeight).toBeCloseTo(0.5, 6);
    expect(Math.abs(summary.eye.eyeWidth - 1e-9)).toBeLessThanOrEqual(summary.record.dtSample);
    expect(io.stdout).toMatch(/eye\s+height 500 mV, width 1 ns/);
  });

  it('takes another probe, logic thresholds and a sampling instant', async () => {
    const d = dir();
    const file = writeScenario(d, 'bits.json', BITS);
    const out = join(d, 'o');
    const io = collect();
    expect(await runCli(['eye', file, '-o', out, '--probe', 'tx', '--vih', '0.45V', '--vil', '50mV', '--sample-at', '40%', '-q'], { io })).toBe(0);
    expect(io.stdout).toBe('');
    const eye = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8')).eye;
    expect(eye.probe).toBe('tx');
    expect(eye.threshold).toEqual({ level: 0.25, vil: 0.05, vih: 0.45, source: 'vih/vil' });
    expect(eye.samplingPhase).toBe(0.4);
  });

  it.each([
    [['--probe', 'nowhere'], /no probe named 'nowhere' \(probes: tx, rx\)/],
    [['--vih', '2V'], /--vih and --vil go together/],
    [['--vih', '1V', '--vil', '2V'], /must not be above/],
    [['--vih', '1ns', '--vil', '0V'], /--vih '1ns': expected/],
    [['--thresholds', 'lvcmos99'], /unknown threshold preset/],
    [['--sample-at', '150%'], /--sample-at '150%'/],
  ])('%j exits 2 with a message and writes nothing', async (extra, message) => {
    const d = dir();
    const file = writeScenario(d, 'bits.json', BITS);
    const io = collect();
    expect(await runCli(['eye', file, '--out', join(d, 'o'), ...extra], { io })).toBe(2);
    expect(io.stderr).toMatch(message);
    expect(existsSync(join(d, 'o'))).toBe(false);
  });

  it('refuses a signal without unit intervals (a step) with exit 2', async () => {
    const d = dir();
    const file = writeScenario(d, 'step.json', SMALL);
    const io = collect();
    expect(await runCli(['eye', file, '--out', join(d, 'o')], { io })).toBe(2);
    expect(io.stderr).toMatch(/a step; an eye diagram needs a bits or clock signal/);
    expect(existsSync(join(d, 'o'))).toBe(false);
  });
});

describe('ladderwave run --views/--frames/--report', () => {
  it('writes the chosen views, frames and the report; warns about a view the scenario cannot have', async () => {
    const d = dir();
    const file = writeScenario(d, 'small.json', SMALL);
    const out = join(d, 'o');
    const io = collect();
    expect(await runCli(['run', file, '--out', out, '--views', 'map, eye,waveforms', '--frames', '3', '--report'], { io })).toBe(0);
    expect(io.stderr).toMatch(/no eye view: the driver's signal is a step/);
    expect(readdirSync(out).sort()).toEqual(['frames', 'map.png', 'probes.csv', 'report.html', 'summary.json', 'waveforms.png']);
    expect(readdirSync(join(out, 'frames'))).toEqual(['frame-0001.png', 'frame-0002.png', 'frame-0003.png']);
    expect(io.stdout).toMatch(/frames\s+3 PNG frames in/);

    // a second run with fewer frames removes the frames left over from the first
    expect(await runCli(['run', file, '--out', out, '--views', 'waveforms', '--frames', '2', '-q'], { io: collect() })).toBe(0);
    expect(readdirSync(join(out, 'frames'))).toEqual(['frame-0001.png', 'frame-0002.png']);
  });

  it('says in the terminal which views and frames a net cannot have (no line: no map, no frames, no lattice)', async () => {
    const d = dir();
    const file = writeScenario(d, 'jig.json', {
      title: 'Bench jig: a resistor divider without a line',
      driver: { signal: { kind: 'step', from: '0V', to: '1V', start: '1ns', rise: '1ns' }, resistance: '50ohm' },
      route: [{ name: 'r1', series: { r: '100ohm' } }],
      receiver: { parts: [{ r: '100ohm' }] },
      probes: [{ name: 'out', at: 'receiver' }],
      run: { duration: '10ns' },
    });
    const out = join(d, 'o');
    const io = collect();
    expect(await runCli(['run', file, '--out', out, '--views', 'all', '--frames', '2'], { io })).toBe(0);
    expect(io.stderr).toMatch(/no map view: the route has no line segment/);
    expect(io.stderr).toMatch(/no frames: the route has no line segment/);
    expect(io.stderr).toMatch(/bounce view: no lattice drawn .*no line segment/);
    expect(readdirSync(out).sort()).toEqual(['bounce.png', 'probes.csv', 'summary.json', 'waveforms.png']);
  });

  it('does not draw an eye of fewer than ten windows in a run, and says why', async () => {
    const d = dir();
    const file = writeScenario(d, 'bits.json', BITS); // 5 ns of 1 ns bits
    const out = join(d, 'o');
    const io = collect();
    expect(await runCli(['run', file, '--out', out, '--views', 'eye'], { io })).toBe(0);
    expect(io.stderr).toMatch(/no eye view: only \d windows? of 2 UI folded \(fewer than 10\): too few for an eye to trust; `ladderwave eye` runs the whole pattern/);
    expect(readdirSync(out)).not.toContain('eye.png');
  });

  it('draws waveforms and map by default', async () => {
    const d = dir();
    const file = writeScenario(d, 'small.json', SMALL);
    const out = join(d, 'o');
    expect(await runCli(['run', file, '--out', out, '-q'], { io: collect() })).toBe(0);
    expect(readdirSync(out).sort()).toEqual(['map.png', 'probes.csv', 'summary.json', 'waveforms.png']);
  });

  it.each([
    [['--views', 'waveforms,tdr'], /unknown view 'tdr'.*ladderwave tdr SCENARIO/],
    [['--views', 'wavefroms'], /unknown view 'wavefroms' in --views \(known: waveforms, map, bounce, eye, all, none\)/],
    [['--views', ' , '], /--views needs at least one/],
    [['--frames', '0'], /--frames must be a whole number from 1 to 900/],
    [['--frames', '2.5'], /--frames must be a whole number/],
  ])('%j is a usage error (exit 2) before anything runs', async (extra, message) => {
    const d = dir();
    const file = writeScenario(d, 'small.json', SMALL);
    const io = collect();
    expect(await runCli(['run', file, '--out', join(d, 'o'), ...extra], { io })).toBe(2);
    expect(io.stderr).toMatch(message);
    expect(existsSync(join(d, 'o'))).toBe(false);
  });
});

describe('ladderwave eye with the scenario’s logic thresholds', () => {
  it('uses the probe’s vih/vil from the scenario unless the command line gives others', async () => {
    const d = dir();
    const file = writeScenario(d, 'bits.json', { ...BITS, thresholds: { vih: '0.4V', vil: '0.1V' } });
    expect(await runCli(['eye', file, '--out', join(d, 'a'), '-q'], { io: collect() })).toBe(0);
    expect(JSON.parse(readFileSync(join(d, 'a', 'summary.json'), 'utf8')).eye.threshold).toEqual({ level: 0.25, vil: 0.1, vih: 0.4, source: 'vih/vil' });
    expect(await runCli(['eye', file, '--out', join(d, 'b'), '-q', '--vih', '0.3V', '--vil', '0.2V'], { io: collect() })).toBe(0);
    expect(JSON.parse(readFileSync(join(d, 'b', 'summary.json'), 'utf8')).eye.threshold.vih).toBe(0.3);
  });
});
