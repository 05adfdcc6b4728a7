// Problems found in a scenario file, and the error that carries all of them.
//
// Validation never stops at the first problem: every check appends to a Problems list and the
// loader throws one ScenarioError holding them all, one line per problem:
//   demo.json:14:7 route[2].length: "-3in" — expected a length ≥ 0 like "3in"
import { editDistance } from '../edit-distance.js';

export { editDistance };

export interface Problem {
  /** The scenario file's name as given to the loader. */
  file: string;
  /** Key path inside the scenario: `route[2].length`, `driver.signal.rise`, `lines.trace.z0`; '' for the whole file. */
  path: string;
  /** The offending value as plain data (undefined when the key is missing). */
  value: unknown;
  /** What was expected there, as a phrase to follow "expected": `a length ≥ 0 like "3in"`. */
  expected: string;
  /** 1-based source position, when the parser provided one. */
  line?: number;
  col?: number;
}

export interface Pos {
  line: number;
  col: number;
}

/** Thrown by the scenario loader: `problems` lists every problem found; `message` has one line per problem. */
export class ScenarioError extends Error {
  readonly problems: Problem[];
  readonly warnings: Problem[];
  constructor(problems: Problem[], warnings: Problem[] = []) {
    super(problems.map(formatProblem).join('\n'));
    this.name = 'ScenarioError';
    this.problems = problems;
    this.warnings = warnings;
  }
}

/** Compact, single-line rendering of a bad value for messages. */
export function showValue(value: unknown): string {
  if (value === undefined) return '(missing)';
  let s: string;
  try {
    s = JSON.stringify(value, (_k, v) => (v instanceof Uint8Array ? Array.from(v) : v)) ?? String(value);
  } catch {
    s = String(value);
  }
  return s.length > 60 ? s.slice(0, 57) + '...' : s;
}

/** `demo.json:14:7 route[2].length: "-3in" — expected a length ≥ 0 like "3in"` */
export function formatProblem(p: Problem): string {
  const where = p.line !== undefined ? `${p.file}:${p.line}:${p.col ?? 1}` : p.file;
  if (p.path === '') {
    // Whole-file problems (syntax errors): the value is the source line, shown as written.
    const v = typeof p.value === 'string' ? `\`${p.value.length > 60 ? p.value.slice(0, 57) + '...' : p.value}\`` : showValue(p.value);
    return `${where} (file): ${v} — expected ${p.expected}`;
  }
  return `${where} ${p.path}: ${showValue(p.value)} — expected ${p.expected}`;
}

/** Collects problems (errors) and warnings for one file. */
export class Problems {
  readonly errors: Problem[] = [];
  readonly warnings: Problem[] = [];
  constructor(readonly file: string) {}

  add(path: string, value: unknown, expected: string, pos?: Pos): void {
    this.errors.push(this.make(path, value, expected, pos));
  }

  warn(path: string, value: unknown, expected: string, pos?: Pos): void {
    this.warnings.push(this.make(path, value, expected, pos));
  }

  get count(): number {
    return this.errors.length;
  }

  /** Errors sorted by source position (problems without one keep their order, after those with one). */
  sorted(): Problem[] {
    return sortProblems(this.errors);
  }

  private make(path: string, value: unknown, expected: string, pos?: Pos): Problem {
    const p: Problem = { file: this.file, path, value, expected };
    if (pos) {
      p.line = pos.line;
      p.col = pos.col;
    }
    return p;
  }
}

export function sortProblems(list: Problem[]): Problem[] {
  return list
    .map((p, i) => ({ p, i }))
    .sort((a, b) => {
      const la = a.p.line ?? Infinity;
      const lb = b.p.line ?? Infinity;
      if (la !== lb) return la - lb;
      const ca = a.p.col ?? 0;
      const cb = b.p.col ?? 0;
      if (ca !== cb) return ca - cb;
      return a.i - b.i;
    })
    .map((x) => x.p);
}

// ---- key paths ------------------------------------------------------------------------------

const IDENT = /^[A-Za-z_$][A-Za-z0-9_$-]*$/;

/** `joinKey('lines', 'trace')` → `lines.trace`; odd names are quoted: `lines["my trace"]`. */
export function joinKey(path: string, key: string): string {
  if (IDENT.test(key)) return path === '' ? key : `${path}.${key}`;
  return `${path}[${JSON.stringify(key)}]`;
}

/** `joinIndex('route', 2)` → `route[2]`. */
export function joinIndex(path: string, index: number): string {
  return `${path}[${index}]`;
}

// ---- "did you mean" --------------------------------------------------------------------------


/** The known word closest to `word`, if it is close enough to be a plausible typo. */
export function closest(word: string, known: readonly string[]): string | undefined {
  const w = word.toLowerCase();
  let best: string | undefined;
  let bestD = Infinity;
  for (const k of known) {
    const kl = k.toLowerCase();
    let dist = editDistance(w, kl);
    // "riseTime" for "rise", "len" for "length": one contains the other.
    if (dist > 2 && Math.min(w.length, kl.length) >= 3 && (w.includes(kl) || kl.includes(w))) dist = 2;
    if (dist < bestD) {
      bestD = dist;
      best = k;
    }
  }
  if (best === undefined) return undefined;
  const limit = Math.max(1, Math.floor(Math.max(word.length, best.length) / 3));
  return bestD <= Math.max(limit, 2) && bestD < Math.max(word.length, best.length) ? best : undefined;
}
