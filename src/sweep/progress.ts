// Progress of a sweep on stderr: a bar with the ETA, redrawn in place, when stderr is a terminal;
// plain lines every few seconds otherwise (CI logs); nothing when quiet.
//
// ETA = elapsed / done × (total − done): the points of one sweep cost about the same.

export interface ProgressStream {
  write(text: string): unknown;
  isTTY?: boolean;
  columns?: number;
}

export interface ProgressOptions {
  total: number;
  /** Word before the counts, e.g. "sweep". */
  label?: string;
  stream: ProgressStream;
  quiet?: boolean;
  /** Milliseconds clock (injectable for tests); default performance.now. */
  now?: () => number;
  /** Plain mode: milliseconds between lines (default 5000). */
  interval?: number;
  /** Terminal mode: milliseconds between redraws (default 100). */
  redraw?: number;
}

export interface Progress {
  update(done: number): void;
  /** Final line (terminal: ends the bar line). */
  finish(): void;
}

/** "12 s", "3:07", "1:02:03". */
export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds) || seconds < 0) return '?';
  const s = Math.round(seconds);
  if (s < 60) return `${s} s`;
  const h = Math.floor(s / 3600);
  const m = Math.floor((s % 3600) / 60);
  const ss = String(s % 60).padStart(2, '0');
  return h > 0 ? `${h}:${String(m).padStart(2, '0')}:${ss}` : `${m}:${ss}`;
}

export function etaSeconds(elapsedSeconds: number, done: number, total: number): number | null {
  if (done <= 0) return null;
  return (elapsedSeconds / done) * (total - done);
}

/** The bar line: "sweep [########--------] 45/200  22 %  ETA 12 s". */
export function barLine(label: string, done: number, total: number, elapsed: number, width = 24): string {
  const f = total > 0 ? done / total : 1;
  const fill = Math.round(f * width);
  const eta = etaSeconds(elapsed, done, total);
  const tail = done >= total ? `done in ${formatDuration(elapsed)}` : `ETA ${eta === null ? '?' : formatDuration(eta)}`;
  return `${label} [${'#'.repeat(fill)}${'-'.repeat(width - fill)}] ${done}/${total}  ${Math.floor(100 * f)} %  ${tail}`;
}

/** The plain line: "sweep: 45/200 points (22 %), 3 s elapsed, ETA 12 s". */
export function plainLine(label: string, done: number, total: number, elapsed: number): string {
  const eta = etaSeconds(elapsed, done, total);
  const tail = done >= total ? `done in ${formatDuration(elapsed)}` : `${formatDuration(elapsed)} elapsed, ETA ${eta === null ? '?' : formatDuration(eta)}`;
  return `${label}: ${done}/${total} points (${Math.floor((100 * done) / Math.max(1, total))} %), ${tail}`;
}

export function createProgress(opts: ProgressOptions): Progress {
  if (opts.quiet) return { update() {}, finish() {} };
  const now = opts.now ?? (() => performance.now());
  const label = opts.label ?? 'sweep';
  const t0 = now();
  const s = opts.stream;
  let last = -Infinity;
  let lastDone = 0;
  let finished = false;
  if (s.isTTY) {
    const every = opts.redraw ?? 100;
    let shown = 0;
    const draw = (done: number) => {
      const line = barLine(label, done, opts.total, (now() - t0) / 1000);
      const pad = Math.max(0, shown - line.length);
      s.write(`\r${line}${' '.repeat(pad)}`);
      shown = line.length;
    };
    return {
      update(done) {
        lastDone = done;
        const t = now();
        if (t - last >= every || done >= opts.total) {
          last = t;
          draw(done);
        }
      },
      finish() {
        if (finished) return;
        finished = true;
        draw(lastDone);
        s.write('\n');
      },
    };
  }
  const every = opts.interval ?? 5000;
  last = t0;
  return {
    update(done) {
      lastDone = done;
      const t = now();
      if (t - last >= every && done < opts.total) {
        last = t;
        s.write(plainLine(label, done, opts.total, (t - t0) / 1000) + '\n');
      }
    },
    finish() {
      if (finished) return;
      finished = true;
      s.write(plainLine(label, lastDone, opts.total, (now() - t0) / 1000) + '\n');
    },
  };
}
