// Progress on stderr: a bar with ETA on a terminal, plain lines otherwise, nothing when quiet.
import { describe, expect, it } from 'vitest';
import { barLine, createProgress, etaSeconds, formatDuration, plainLine } from '../../../src/sweep/progress.js';

function stream(isTTY: boolean) {
  const s = { text: '', isTTY, write: (t: string) => void (s.text += t) };
  return s;
}

describe('progress', () => {
  it('ETA is elapsed/done × remaining', () => {
    expect(etaSeconds(10, 25, 100)).toBe(30);
    expect(etaSeconds(10, 0, 100)).toBeNull();
    expect(formatDuration(12.4)).toBe('12 s');
    expect(formatDuration(187)).toBe('3:07');
    expect(formatDuration(3723)).toBe('1:02:03');
  });

  it('draws a bar in place on a terminal, at most every 100 ms, and ends the line', () => {
    let t = 0;
    const s = stream(true);
    const p = createProgress({ total: 200, stream: s, now: () => t });
    t = 50;
    p.update(1); // first draw (nothing drawn before)
    t = 60;
    p.update(2); // within 100 ms of the last draw: skipped
    t = 4000;
    p.update(50);
    p.finish();
    const frames = s.text.split('\r').filter(Boolean);
    expect(frames).toHaveLength(3);
    expect(frames[1]).toContain(barLine('sweep', 50, 200, 4));
    expect(frames[1]).toContain('50/200  25 %  ETA 12 s');
    expect(s.text.endsWith('\n')).toBe(true);
  });

  it('writes plain lines every interval when not a terminal (CI logs)', () => {
    let t = 0;
    const s = stream(false);
    const p = createProgress({ total: 10, stream: s, now: () => t, interval: 1000 });
    t = 500;
    p.update(1);
    t = 1500;
    p.update(3);
    t = 1600;
    p.update(4);
    t = 3000;
    p.update(10);
    p.finish();
    const lines = s.text.trimEnd().split('\n');
    expect(lines).toEqual([plainLine('sweep', 3, 10, 1.5), plainLine('sweep', 10, 10, 3)]);
    expect(lines[0]).toBe('sweep: 3/10 points (30 %), 2 s elapsed, ETA 4 s');
    expect(s.text).not.toContain('\r');
  });

  it('writes nothing when quiet', () => {
    const s = stream(true);
    const p = createProgress({ total: 5, stream: s, quiet: true });
    p.update(5);
    p.finish();
    expect(s.text).toBe('');
  });
});
