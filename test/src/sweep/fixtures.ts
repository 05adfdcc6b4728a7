// Scenario files for the sweep tests, written into temporary folders.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/**
 * A lossless 50 Ω line with an open end, driven through R_out = 12 Ω and a series resistor "rs";
 * TD = 1 ns (20 cm at 5 ns/m), a 500 ps edge: a long line in the rule-of-thumb sense.
 */
export const SERIES_NET = {
  title: 'Series termination search',
  driver: { signal: { kind: 'step', from: '0V', to: '1V', start: '1ns', rise: '500ps' }, resistance: '12ohm' },
  lines: { trace: { z0: '50ohm', delay: '5ns/m' } },
  route: [
    { name: 'rs', series: { r: '22ohm' } },
    { name: 'trace', line: 'trace', length: '20cm' },
  ],
  probes: [
    { name: 'tx', at: 'driver' },
    { name: 'rx', at: 'receiver' },
  ],
  run: { duration: '40ns' },
};

/** An unterminated net: R_out = 25 Ω into a 50 Ω line with an open end, 1 ns (10–90 %) edge. */
export const RINGING_NET = {
  title: 'Unterminated line, rule of thumb',
  driver: { signal: { kind: 'step', from: '0V', to: '1V', start: '1ns', rise: '1ns' }, resistance: '25ohm' },
  lines: { trace: { z0: '50ohm', delay: '5ns/m' } },
  route: [{ name: 'trace', line: 'trace', length: '8cm' }],
  probes: [{ name: 'rx', at: 'receiver' }],
  run: { duration: '40ns' },
};

/** A 25 MHz clock net with checks, for Monte Carlo runs. */
export const CLOCK_WITH_CHECKS = {
  title: 'Clock with checks',
  driver: { signal: { kind: 'clock', low: '0V', high: '3.3V', period: '40ns', rise: '1ns', start: '1ns' }, resistance: '18ohm' },
  lines: { trace: { z0: '50ohm', delay: '160ps/in' } },
  route: [
    { name: 'rs', series: { r: '33ohm' } },
    { name: 'trace', line: 'trace', length: '4in' },
  ],
  receiver: { parts: [{ c: '3pF' }] },
  probes: [
    { name: 'tx', at: 'driver' },
    { name: 'rx', at: 'receiver' },
  ],
  thresholds: 'lvcmos33',
  checks: [
    { probe: 'rx', metric: 'overshoot', max: '6%' },
    { probe: 'rx', metric: 'noiseMarginHigh', min: '0.5V' },
  ],
  run: { duration: '60ns' },
};

export class TempDirs {
  private readonly dirs: string[] = [];
  make(prefix = 'lw-sweep-'): string {
    const d = mkdtempSync(join(tmpdir(), prefix));
    this.dirs.push(d);
    return d;
  }
  cleanup(): void {
    for (const d of this.dirs.splice(0)) rmSync(d, { recursive: true, force: true });
  }
}

export function writeJson(dir: string, name: string, value: unknown): string {
  const p = join(dir, name);
  writeFileSync(p, JSON.stringify(value, null, 2) + '\n');
  return p;
}
