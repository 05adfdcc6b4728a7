// Scenario text (JSON or YAML) → a plain tree of nodes that remember where they came from.
//
// The `yaml` package parses both (JSON is a subset of YAML 1.2 in practice) and gives source
// ranges; LineCounter turns them into 1-based line:col. The validator works on SrcNode only, so it
// can also check a plain JS object built in code (fromValue), just without positions.
import { LineCounter, parseDocument, isAlias, isMap, isScalar, isSeq, isPair, type Node as YNode, type Document } from 'yaml';
import { Problems, joinIndex, joinKey, type Pos } from './problems.js';

export type SrcNode = MapNode | SeqNode | ScalarNode;

export interface MapEntry {
  key: string;
  keyPos?: Pos;
  value: SrcNode;
}

export interface MapNode {
  type: 'map';
  entries: MapEntry[];
  pos?: Pos;
}

export interface SeqNode {
  type: 'seq';
  items: SrcNode[];
  pos?: Pos;
}

export interface ScalarNode {
  type: 'scalar';
  value: string | number | boolean | null;
  /** For YAML plain (unquoted) scalars: the text as written, so `pattern: 0110` can still mean "0110". */
  plainSource?: string;
  pos?: Pos;
}

/** Plain data for a node (what a problem shows as the bad value). */
export function toPlain(node: SrcNode | undefined): unknown {
  if (!node) return undefined;
  switch (node.type) {
    case 'scalar':
      // A YAML plain scalar read as a number but written otherwise ("01201") is shown as written.
      return node.plainSource !== undefined && typeof node.value === 'number' && node.plainSource !== String(node.value) ? node.plainSource : node.value;
    case 'seq':
      return node.items.map(toPlain);
    case 'map': {
      const o: Record<string, unknown> = {};
      for (const e of node.entries) o[e.key] = toPlain(e.value);
      return o;
    }
  }
}

/**
 * Parse scenario text. Syntax errors and duplicate keys are added to `problems`; the returned tree is
 * undefined when the text could not be parsed at all.
 */
export function parseText(text: string, problems: Problems): SrcNode | undefined {
  const lc = new LineCounter();
  const doc = parseDocument(text, { lineCounter: lc, prettyErrors: false, uniqueKeys: false, keepSourceTokens: false });
  const posOf = (offset: number | undefined): Pos | undefined => {
    if (offset === undefined) return undefined;
    const { line, col } = lc.linePos(offset);
    return line === 0 ? { line: 1, col: offset + 1 } : { line, col };
  };
  if (doc.errors.length > 0) {
    // Syntax errors: one per position (the parser often reports a cascade at the same spot); the
    // value shown is the source line there. Validation is skipped: a half-parsed tree would only add noise.
    const lines = text.split(/\r?\n/);
    const seen = new Set<string>();
    for (const err of doc.errors) {
      const pos = posOf(err.pos?.[0]);
      const key = pos ? `${pos.line}:${pos.col}` : '';
      if (seen.has(key)) continue;
      seen.add(key);
      const src = pos ? (lines[pos.line - 1] ?? '').trim() : undefined;
      problems.add('', src, `valid JSON or YAML (${err.message.split('\n')[0]})`, pos);
    }
    return undefined;
  }
  if (doc.contents === null || doc.contents === undefined) {
    problems.add('', undefined, 'a scenario object with "driver", "route" and the other keys of the scenario format', { line: 1, col: 1 });
    return undefined;
  }
  return convert(doc.contents as YNode, doc, '', problems, posOf);
}

function convert(
  node: YNode | null | undefined,
  doc: Document,
  path: string,
  problems: Problems,
  posOf: (o: number | undefined) => Pos | undefined,
): SrcNode {
  if (node && isAlias(node)) node = node.resolve(doc) as YNode | undefined;
  if (!node) return { type: 'scalar', value: null };
  const pos = posOf(node.range?.[0]);
  if (isMap(node)) {
    const entries: MapEntry[] = [];
    const seen = new Map<string, Pos | undefined>();
    for (const item of node.items) {
      if (!isPair(item)) continue;
      const k = item.key as YNode | null;
      const kPos = posOf(k?.range?.[0]);
      let key: string;
      if (k && isScalar(k) && (typeof k.value === 'string' || typeof k.value === 'number' || typeof k.value === 'boolean')) {
        key = typeof k.value === 'string' ? k.value : (k.source ?? String(k.value));
      } else {
        problems.add(path, undefined, 'a plain text key', kPos);
        continue;
      }
      const kp = joinKey(path, key);
      const value = convert(item.value as YNode | null, doc, kp, problems, posOf);
      if (seen.has(key)) {
        const first = seen.get(key);
        problems.add(kp, toPlain(value), `each key once in an object (first "${key}"${first ? ` at ${first.line}:${first.col}` : ''})`, kPos);
        continue;
      }
      seen.set(key, kPos);
      entries.push({ key, keyPos: kPos, value: value.pos ? value : { ...value, pos: kPos } });
    }
    return { type: 'map', entries, pos };
  }
  if (isSeq(node)) {
    const items = node.items.map((it, i) => convert(it as YNode | null, doc, joinIndex(path, i), problems, posOf));
    return { type: 'seq', items, pos };
  }
  if (isScalar(node)) {
    const v = node.value;
    const value = typeof v === 'string' || typeof v === 'number' || typeof v === 'boolean' || v === null ? v : String(v);
    const s: ScalarNode = { type: 'scalar', value, pos };
    if (node.type === 'PLAIN' && typeof node.source === 'string') s.plainSource = node.source;
    return s;
  }
  return { type: 'scalar', value: null, pos };
}

/** A plain JS value (e.g. JSON.parse output or an object built in code) as a SrcNode tree, without positions. */
export function fromValue(value: unknown): SrcNode {
  if (Array.isArray(value)) return { type: 'seq', items: value.map(fromValue) };
  if (value !== null && typeof value === 'object') {
    return { type: 'map', entries: Object.entries(value as Record<string, unknown>).map(([key, v]) => ({ key, value: fromValue(v) })) };
  }
  if (typeof value === 'string' || typeof value === 'number' || typeof value === 'boolean' || value === null) {
    return { type: 'scalar', value };
  }
  return { type: 'scalar', value: value === undefined ? null : String(value) };
}
