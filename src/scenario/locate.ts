// Where a key path (`route[2].series.r`, `receiver`, or a route item's name) is in the scenario file,
// so that problems found after validation (by the engine, by a sweep point) still carry line:column.
import type { NetError, NetProblem } from '../../sim/errors.js';
import type { Problem } from './problems.js';
import type { Pos } from './problems.js';
import type { MapEntry, SrcNode } from './parse.js';

/** A NetProblem with the position of its key path in the scenario file, when found. */
export interface LocatedNetProblem extends NetProblem {
  line?: number;
  col?: number;
}

type Step = { key: string } | { index: number };

/** `route[2].series.r` → steps; `lines["my trace"].z0` too. undefined when it is not a key path. */
function steps(path: string): Step[] | undefined {
  const out: Step[] = [];
  const re = /\s*(?:\.?([A-Za-z_$][A-Za-z0-9_$-]*)|\[(\d+)\]|\[("(?:[^"\\]|\\.)*")\])/y;
  let i = 0;
  while (i < path.length) {
    re.lastIndex = i;
    const m = re.exec(path);
    if (!m) return undefined;
    if (m[1] !== undefined) out.push({ key: m[1] });
    else if (m[2] !== undefined) out.push({ index: Number(m[2]) });
    else out.push({ key: JSON.parse(m[3]!) as string });
    i = re.lastIndex;
  }
  return out;
}

/**
 * The position of `path` in the tree: of its last key (or list item). A path whose first key is not
 * a top-level key but a route item's name ("rs", "rs.series") is read as that item. A list of paths
 * ("rs, via1") is located at its first.
 */
export function locatePath(root: SrcNode | undefined, path: string): Pos | undefined {
  if (!root) return undefined;
  const first = path.split(',')[0]!.trim();
  const st = steps(first);
  if (!st || st.length === 0) return undefined;
  let node: SrcNode | undefined = root;
  let pos: Pos | undefined;
  for (let k = 0; k < st.length; k++) {
    const s = st[k]!;
    if ('index' in s) {
      if (node?.type !== 'seq') return pos;
      node = node.items[s.index];
      pos = node?.pos ?? pos;
      continue;
    }
    if (node?.type !== 'map') return pos;
    const entry: MapEntry | undefined = node.entries.find((e) => e.key === s.key);
    if (!entry && k === 0) {
      // A route item's name.
      const route: SrcNode | undefined = node.entries.find((e) => e.key === 'route')?.value;
      const named = (it: SrcNode) => it.type === 'map' && it.entries.some((e) => e.key === 'name' && e.value.type === 'scalar' && e.value.value === s.key);
      const item: SrcNode | undefined = route?.type === 'seq' ? route.items.find(named) : undefined;
      if (!item) return undefined;
      node = item;
      pos = item.pos;
      continue;
    }
    if (!entry) return pos;
    node = entry.value;
    pos = entry.keyPos ?? entry.value.pos ?? pos;
  }
  return pos;
}

/** The NetError's problems with the positions of their paths in the scenario file. */
export function locateNetProblems(e: NetError, root: SrcNode | undefined): LocatedNetProblem[] {
  return e.problems.map((p) => {
    const pos = locatePath(root, p.path);
    return pos ? { ...p, line: pos.line, col: pos.col } : { ...p };
  });
}

/** Problems (of a sweep point, validated from plain data) with the positions of their paths in the scenario file. */
export function locateProblems(problems: readonly Problem[], root: SrcNode | undefined): Problem[] {
  return problems.map((p) => {
    if (p.line !== undefined) return p;
    const pos = locatePath(root, p.path);
    return pos ? { ...p, line: pos.line, col: pos.col } : p;
  });
}
