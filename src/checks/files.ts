// Command-line scenario arguments → files: plain paths, folders (their *.json, *.yaml, *.yml) and
// glob patterns, so that `ladderwave check "scenarios/**/*.json"` works the same in every shell
// (Node 20 has no fs.glob). Patterns: `*` and `?` within one path segment, `[abc]`/`[a-z]` classes,
// and `**` for any number of folders. As in POSIX shells, wildcards do not match a leading dot.
import { readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';

export const SCENARIO_EXTENSIONS = /\.(json|ya?ml)$/i;

export function isGlob(s: string): boolean {
  return /[*?[]/.test(s);
}

/** A regular expression for one path segment of a glob. */
export function segmentRegExp(segment: string): RegExp {
  let re = '';
  for (let i = 0; i < segment.length; i++) {
    const c = segment[i]!;
    if (c === '*') re += '[^/]*';
    else if (c === '?') re += '[^/]';
    else if (c === '[') {
      const end = segment.indexOf(']', i + 2);
      if (end < 0) re += '\\[';
      else {
        let body = segment.slice(i + 1, end);
        const neg = body.startsWith('!') || body.startsWith('^');
        if (neg) body = body.slice(1);
        re += `[${neg ? '^' : ''}${body.replace(/[\\\]]/g, '\\$&')}]`;
        i = end;
      }
    } else re += c.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  }
  return new RegExp(`^${re}$`);
}

function list(dir: string): { name: string; isDir: boolean }[] {
  try {
    return readdirSync(dir === '' ? '.' : dir, { withFileTypes: true }).map((d) => {
      let isDir = d.isDirectory();
      if (d.isSymbolicLink()) {
        try {
          isDir = statSync(join(dir === '' ? '.' : dir, d.name)).isDirectory();
        } catch {
          isDir = false;
        }
      }
      return { name: d.name, isDir };
    });
  } catch {
    return [];
  }
}

/** Files matching a glob pattern (paths spelled as the pattern is: relative stays relative), sorted. */
export function globFiles(pattern: string): string[] {
  const abs = pattern.startsWith('/');
  const segments = pattern.split('/').filter((s, i) => s !== '' || i === 0);
  if (abs) segments.shift();
  const out = new Set<string>();
  const walk = (dir: string, k: number): void => {
    if (k === segments.length) return;
    const seg = segments[k]!;
    const last = k === segments.length - 1;
    const at = (name: string) => (dir === '' ? name : dir === '/' ? `/${name}` : `${dir}/${name}`);
    if (seg === '**') {
      // zero folders...
      walk(dir, k + 1);
      // ...or one more, then ** again
      for (const e of list(dir)) if (e.isDir && !e.name.startsWith('.')) walk(at(e.name), k);
      return;
    }
    if (!isGlob(seg)) {
      const p = at(seg);
      if (last) {
        try {
          if (statSync(p).isFile()) out.add(p);
        } catch {
          // no such file
        }
      } else walk(p, k + 1);
      return;
    }
    const re = segmentRegExp(seg);
    for (const e of list(dir)) {
      if (e.name.startsWith('.') && !seg.startsWith('.')) continue;
      if (!re.test(e.name)) continue;
      if (last) {
        if (!e.isDir) out.add(at(e.name));
      } else if (e.isDir) walk(at(e.name), k + 1);
    }
  };
  walk(abs ? '/' : '', 0);
  return [...out].sort();
}

export interface ExpandedFiles {
  files: string[];
  /** Arguments that named nothing: a glob matching no file, a folder without scenarios. */
  problems: string[];
}

/**
 * Expands scenario arguments in order, without duplicates. A plain path that does not exist is kept
 * (loading it reports the problem, with the file's name); a pattern or folder that yields nothing is
 * a problem.
 */
export function expandScenarioArgs(args: readonly string[]): ExpandedFiles {
  const files: string[] = [];
  const seen = new Set<string>();
  const problems: string[] = [];
  const add = (f: string) => {
    if (!seen.has(f)) {
      seen.add(f);
      files.push(f);
    }
  };
  for (const a of args) {
    if (isGlob(a)) {
      const found = globFiles(a).filter((f) => SCENARIO_EXTENSIONS.test(f));
      if (found.length === 0) problems.push(`${a}: no scenario file (.json, .yaml, .yml) matches this pattern`);
      found.forEach(add);
      continue;
    }
    let isDir = false;
    try {
      isDir = statSync(a).isDirectory();
    } catch {
      isDir = false;
    }
    if (isDir) {
      const found = list(a)
        .filter((e) => !e.isDir && !e.name.startsWith('.') && SCENARIO_EXTENSIONS.test(e.name))
        .map((e) => join(a, e.name))
        .sort();
      if (found.length === 0) problems.push(`${a}: a folder with no scenario file (.json, .yaml, .yml) in it`);
      found.forEach(add);
    } else add(a);
  }
  return { files, problems };
}
