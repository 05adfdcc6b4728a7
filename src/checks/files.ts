// Command-line scenario arguments → files: plain paths, folders (their *.json, *.yaml, *.yml) and
// glob patterns, so that `ladderwave check "scenarios/**/*.json"` works the same in every shell.
// Patterns are matched by tinyglobby (picomatch syntax: `*`, `?`, `[a-z]`, `**`, braces `{a,b}`,
// backslash escapes); as in POSIX shells, wildcards do not match a leading dot. Symbolic links to
// folders are followed, each real file is listed once (a folder linked into itself cannot make a
// scenario run twice), and an argument naming an existing file or folder is taken as it is even if
// its name contains glob characters.
import { readdirSync, realpathSync, statSync } from 'node:fs';
import { isAbsolute, join, resolve } from 'node:path';
import { globSync, isDynamicPattern } from 'tinyglobby';

export const SCENARIO_EXTENSIONS = /\.(json|ya?ml)$/i;

/** Whether an argument is a pattern rather than a path (it has glob syntax and names no existing path). */
export function isGlob(s: string): boolean {
  if (!isDynamicPattern(s)) return false;
  try {
    statSync(s);
    return false;
  } catch {
    return true;
  }
}

/** The real path of a file, or the path itself when it cannot be resolved. */
function realPath(p: string): string {
  try {
    return realpathSync(p);
  } catch {
    return p;
  }
}

/**
 * Files matching a glob pattern, sorted, one per real file: the path through no symbolic link when
 * there is one, else the shortest. A relative pattern gives paths relative to the working folder,
 * an absolute one absolute paths.
 */
export function globFiles(pattern: string): string[] {
  const found = globSync(pattern, { absolute: isAbsolute(pattern), expandDirectories: false, onlyFiles: true, dot: false, followSymbolicLinks: true });
  const byReal = new Map<string, string>();
  for (const f of found) {
    const real = realPath(f);
    const prev = byReal.get(real);
    const direct = (p: string) => resolve(p) === real;
    if (prev === undefined || (direct(f) && !direct(prev)) || (direct(f) === direct(prev) && f.length < prev.length)) byReal.set(real, f);
  }
  return [...byReal.values()].sort();
}

export interface ExpandedFiles {
  files: string[];
  /** Arguments that named nothing: a glob matching no file, a folder without scenarios. */
  problems: string[];
}

/** The scenario files directly in a folder, sorted. */
function folderScenarios(dir: string): string[] {
  try {
    return readdirSync(dir, { withFileTypes: true })
      .filter((e) => !e.name.startsWith('.') && SCENARIO_EXTENSIONS.test(e.name) && (e.isFile() || (e.isSymbolicLink() && statSync(join(dir, e.name), { throwIfNoEntry: false })?.isFile())))
      .map((e) => join(dir, e.name))
      .sort();
  } catch {
    return [];
  }
}

/**
 * Expands scenario arguments in order, each real file once. A plain path that does not exist is
 * kept (loading it reports the problem, with the file's name); a pattern or folder that yields
 * nothing is a problem.
 */
export function expandScenarioArgs(args: readonly string[]): ExpandedFiles {
  const files: string[] = [];
  const seen = new Set<string>();
  const problems: string[] = [];
  const add = (f: string) => {
    const real = realPath(f);
    if (!seen.has(real)) {
      seen.add(real);
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
    if (statSync(a, { throwIfNoEntry: false })?.isDirectory()) {
      const found = folderScenarios(a);
      if (found.length === 0) problems.push(`${a}: a folder with no scenario file (.json, .yaml, .yml) in it`);
      found.forEach(add);
    } else add(a);
  }
  return { files, problems };
}
