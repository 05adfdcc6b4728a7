// Help texts: prose wrapped for an 80-column terminal, example commands whole on one line each, so
// they can be copied (80 columns: commander's default help width; common practice for terminals).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/program.js';
import { collectOutput } from './fixtures.js';

const COMMANDS = ['run', 'tdr', 'eye', 'line', 'device', 'check', 'sweep', 'merge', 'sparams'];

async function help(command: string): Promise<string[]> {
  const io = collectOutput();
  expect(await runCli([command, '--help'], { io })).toBe(0);
  return io.stdout.trimEnd().split('\n');
}

/** The lines of the "Examples:" block at the end of a help text (none when there is no such block). */
function exampleLines(lines: readonly string[]): string[] {
  const at = lines.indexOf('Examples:');
  return at < 0 ? [] : lines.slice(at + 1);
}

describe('help texts', () => {
  it.each(COMMANDS)('%s: every line outside the examples fits 80 columns; each example is one whole command', async (command) => {
    const lines = await help(command);
    const examples = exampleLines(lines);
    const prose = lines.slice(0, lines.length - examples.length);
    for (const l of prose) expect(l.length, l).toBeLessThanOrEqual(80);
    for (const l of examples) expect(l).toMatch(new RegExp(`^  ladderwave ${command} \\S`));
    // no stray continuation of a broken command line ("width=8mil,…" alone on a line)
    for (const l of prose) expect(l).not.toMatch(/^\s*[a-zA-Z]+=[^\s]*,/);
  });

  it('line: the geometry examples are printed whole, exactly as they are typed', async () => {
    const lines = await help('line');
    expect(lines).toContain('  ladderwave line --microstrip width=8mil,height=5mil,thickness=1oz,er=4.3,lossTangent=0.02');
    expect(lines).toContain('  ladderwave line --coupled-modes zOdd=45ohm,zEven=56ohm,delayOdd=150ps/in,delayEven=160ps/in');
  });
});

describe('the CI examples in the docs', () => {
  // A report written into the checkout must not end up in a commit: every --junit/--json/--markdown path
  // of a documented `ladderwave check` command lies under a folder that .gitignore leaves out.
  const ignored = readFileSync('.gitignore', 'utf8').split('\n').map((l) => l.trim()).filter((l) => l.endsWith('/'));
  it.each(['README.md', 'docs/checks-and-sweeps.md', 'scenarios/ci/README.md'])('%s', (file) => {
    const text = readFileSync(file, 'utf8');
    const commands = text.split('\n').filter((l) => l.includes('npx ladderwave check'));
    const paths = commands.flatMap((l) => [...l.matchAll(/--(?:junit|json|markdown) (\S+)/g)].map((m) => m[1]));
    expect(paths.length).toBeGreaterThan(0);
    for (const p of paths) expect(ignored.some((dir) => p.startsWith(dir)), `${file}: ${p}`).toBe(true);
  });
});
