// `ladderwave run --watch` through the CLI, in process: usage errors, and one bounded session that the
// test interrupts the way Ctrl-C does (through the context's onInterrupt hook).
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/program.js';
import { parsePort } from '../../../src/cli/commands/run-watch.js';
import { UsageError } from '../../../src/exit-codes.js';
import { collectOutput, SMALL, tempDirs, writeScenario } from './fixtures.js';

const newDir = tempDirs('lw-cli-watch-');

describe('ladderwave run --watch', { timeout: 60_000 }, () => {
  it('takes one scenario, and --port only with --watch', async () => {
    const io = collectOutput();
    expect(await runCli(['run', 'a.json', 'b.json', '--watch'], { io })).toBe(2);
    expect(io.stderr).toContain('--watch takes one scenario (got 2)');
    const io2 = collectOutput();
    expect(await runCli(['run', 'a.json', '--port', '8080'], { io: io2 })).toBe(2);
    expect(io2.stderr).toContain('--port goes with --watch');
  });

  it('reads a port from 0 to 65535', () => {
    expect(parsePort(undefined)).toBe(0);
    expect(parsePort('8080')).toBe(8080);
    for (const bad of ['-1', '65536', '80.5', 'http']) expect(() => parsePort(bad)).toThrow(UsageError);
  });

  it('runs, serves on 127.0.0.1, and stops cleanly when interrupted', async () => {
    const d = newDir();
    const file = writeScenario(d, 'net.json', SMALL);
    const io = collectOutput();
    const code = await runCli(['run', file, '--watch', '--out', join(d, 'out')], {
      io,
      onInterrupt: (stop) => {
        const t = setTimeout(stop, 50);
        return () => clearTimeout(t);
      },
    });
    expect(code).toBe(0);
    expect(io.stdout).toMatch(/^watching .*net\.json: open http:\/\/127\.0\.0\.1:\d+\/ /);
    expect(io.stdout).toMatch(/ran .*net\.json \(run 1\)/);
    expect(io.stdout).toContain('stopped watching');
    expect(existsSync(join(d, 'out', 'explore.html'))).toBe(true);
  });
});
