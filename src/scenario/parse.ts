// Scenario text (JSON or YAML) → a plain tree of nodes that remember where they came from.
//
// The `yaml` package parses both (JSON is a subset of YAML 1.2 in practice) and gives source
// ranges; LineCounter turns them into 1-based line:col. The validator works on SrcNode only, so it
// can also check a plain JS object built in code (fromValue), just without positions.
import { LineCounter, parseDocument, isAlias, isMap, isScalar, isSeq, isPair, visit, type Alias, type Document, type Node as YNode, type YAMLMap } from 'yaml';
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
      // Null prototype: a key named "__proto__" or "constructor" is data like any other.
      const o: Record<string, unknown> = Object.create(null);
      for (const e of node.entries) o[e.key] = toPlain(e.value);
      return o;
    }
  }
}

/** Deepest nesting of objects and lists a scenario may have (a real scenario needs about 8). */
export const MAX_NESTING = 64;
/** Most values that YAML aliases may expand into, over the whole file (each alias copies its anchor's value). */
export const MAX_ALIAS_VALUES = 20_000;
/**
 * Deepest nesting of flow brackets ("[", "{") read before parsing: deeper text can exhaust the YAML
 * parser's stack or memory. Anything deeper than MAX_NESTING is refused anyway.
 */
const MAX_BRACKET_DEPTH = 256;

const NESTING_EXPECTED = `a scenario nested at most ${MAX_NESTING} levels deep (objects and lists inside each other)`;

/**
 * Parse scenario text. Syntax errors and duplicate keys are added to `problems`; the returned tree is
 * undefined when the text could not be parsed at all.
 */
export function parseText(text: string, problems: Problems): SrcNode | undefined {
  const lc = new LineCounter();
  const posOf = (offset: number | undefined): Pos | undefined => {
    if (offset === undefined) return undefined;
    const { line, col } = lc.linePos(offset);
    return line === 0 ? { line: 1, col: offset + 1 } : { line, col };
  };
  const deep = deepBracketOffset(text, MAX_BRACKET_DEPTH);
  if (deep !== undefined) {
    // Not parsed: the position is counted here.
    const lineStart = text.lastIndexOf('\n', deep - 1) + 1;
    let line = 1;
    for (let i = text.indexOf('\n'); i >= 0 && i < deep; i = text.indexOf('\n', i + 1)) line++;
    problems.add('', sourceLine(text, deep), NESTING_EXPECTED, { line, col: deep - lineStart + 1 });
    return undefined;
  }
  let doc: Document;
  try {
    doc = parseDocument(text, { lineCounter: lc, prettyErrors: false, uniqueKeys: false, keepSourceTokens: false });
  } catch (e) {
    // The parser recursing too deep (block nesting a few hundred levels down): our own message.
    if (e instanceof RangeError) {
      problems.add('', undefined, NESTING_EXPECTED, { line: 1, col: 1 });
      return undefined;
    }
    throw e;
  }
  if (doc.errors.length > 0) {
    // Syntax errors: one per position (the parser often reports a cascade at the same spot); the
    // value shown is the source line there. Validation is skipped: a half-parsed tree would only add noise.
    const seen = new Set<string>();
    for (const err of doc.errors) {
      const pos = posOf(err.pos?.[0]);
      const key = pos ? `${pos.line}:${pos.col}` : '';
      if (seen.has(key)) continue;
      seen.add(key);
      const src = err.pos ? sourceLine(text, err.pos[0]) : undefined;
      const message = err.message.split('\n')[0] ?? '';
      // The parser's own stack overflow on deep nesting is reported as nesting, not as a JS engine message.
      if (/call stack/i.test(message)) problems.add('', src, NESTING_EXPECTED, pos);
      else problems.add('', src, `valid JSON or YAML (${message})`, pos);
    }
    return undefined;
  }
  if (doc.contents === null || doc.contents === undefined) {
    problems.add('', undefined, 'a scenario object with "driver", "route" and the other keys of the scenario format', { line: 1, col: 1 });
    return undefined;
  }
  const converter = new Converter(doc, problems, posOf);
  const root = converter.convert(doc.contents as YNode, '');
  // A recursive alias, an alias bomb or too deep a nesting: that is the problem to report, alone.
  return converter.refused ? undefined : root;
}

/** The source line (trimmed, at most 200 characters) around `offset`. */
function sourceLine(text: string, offset: number): string {
  const a = text.lastIndexOf('\n', offset - 1) + 1;
  let b = text.indexOf('\n', offset);
  if (b < 0) b = text.length;
  return text.slice(a, Math.min(b, a + 200)).replace(/\r$/, '').trim();
}

/**
 * Offset of the first flow bracket nested deeper than `limit`, or undefined. Brackets inside quotes
 * and comments do not count; an opening bracket counts only where a value can start (after ":",
 * ",", "[", "{", "-", "?" or at the start of a line), so "a[1]" in plain text does not.
 */
export function deepBracketOffset(text: string, limit: number): number | undefined {
  let depth = 0;
  let prev = '\n'; // last character that is not a space
  for (let i = 0; i < text.length; i++) {
    const c = text[i]!;
    if (c === '"' || c === "'") {
      // Skip the quoted text ("\"" escapes in double quotes, '' in single quotes).
      let j = i + 1;
      while (j < text.length) {
        const d = text[j]!;
        if (c === '"' && d === '\\') j += 2;
        else if (d === c) {
          if (c === "'" && text[j + 1] === "'") j += 2;
          else break;
        } else j++;
      }
      i = j;
      prev = c;
      continue;
    }
    if (c === '#' && (prev === '\n' || /\s/.test(text[i - 1] ?? '\n'))) {
      const nl = text.indexOf('\n', i);
      if (nl < 0) break;
      i = nl;
      prev = '\n';
      continue;
    }
    if ((c === '[' || c === '{') && ':,[{-?\n'.includes(prev)) {
      if (++depth > limit) return i;
    } else if (c === '[' || c === '{') {
      prev = 'a'; // part of plain text: the brackets after it are too
      continue;
    } else if ((c === ']' || c === '}') && depth > 0) depth--;
    if (c === '\n' || !/\s/.test(c)) prev = c;
  }
  return undefined;
}

/** The yaml Document → SrcNode conversion: aliases resolved once each, nesting and alias expansion bounded. */
class Converter {
  /** Each alias node → the anchored node it refers to (the last one of that name before it). */
  private readonly targets = new Map<YNode, YNode | undefined>();
  /** Nodes on the way from the root to the node being converted (an alias to one of them is recursive). */
  private readonly ancestors = new Set<YNode>();
  /** Positions and paths of the aliases being expanded, outermost first. */
  private readonly expanding: { path: string; pos?: Pos }[] = [];
  private aliasValues = 0;
  private reportedDepth = false;
  private reportedAliases = false;
  /** Whether the tree was cut short (recursive alias, too many alias values, too deep). */
  refused = false;

  constructor(
    private readonly doc: Document,
    private readonly problems: Problems,
    private readonly posOf: (o: number | undefined) => Pos | undefined,
  ) {
    // One pass in document order: an anchor is defined from its node onward (YAML 1.2 §3.2.2.2).
    const anchors = new Map<string, YNode>();
    visit(doc, {
      Node: (_k, node) => {
        if (isAlias(node)) this.targets.set(node, anchors.get(node.source));
        else if (node.anchor) anchors.set(node.anchor, node);
      },
    });
  }

  convert(node: YNode | null | undefined, path: string, depth = 1): SrcNode {
    if (node && isAlias(node)) return this.alias(node, path, depth);
    if (!node) return { type: 'scalar', value: null };
    const pos = this.posOf(node.range?.[0]);
    if (this.expanding.length > 0 && ++this.aliasValues > MAX_ALIAS_VALUES) {
      const outer = this.expanding[0]!;
      if (!this.reportedAliases) this.problems.add(outer.path, undefined, `YAML aliases that expand to at most ${MAX_ALIAS_VALUES.toLocaleString('en-US')} values in all (these expand further)`, outer.pos);
      this.reportedAliases = this.refused = true;
      return { type: 'scalar', value: null, pos };
    }
    if ((isMap(node) || isSeq(node)) && depth > MAX_NESTING) {
      if (!this.reportedDepth) this.problems.add(path, undefined, NESTING_EXPECTED, pos);
      this.reportedDepth = this.refused = true;
      return { type: 'scalar', value: null, pos };
    }
    this.ancestors.add(node);
    try {
      if (isMap(node)) return this.map(node as YAMLMap, path, depth, pos);
      if (isSeq(node)) {
        const items = node.items.map((it, i) => this.convert(it as YNode | null, joinIndex(path, i), depth + 1));
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
    } finally {
      this.ancestors.delete(node);
    }
  }

  private alias(node: Alias, path: string, depth: number): SrcNode {
    const pos = this.posOf(node.range?.[0]);
    const target = this.targets.get(node);
    if (!target) {
      this.problems.add(path, `*${node.source}`, `an alias to an anchor defined before it (no "&${node.source}" comes earlier)`, pos);
      return { type: 'scalar', value: null, pos };
    }
    if (this.ancestors.has(target)) {
      this.problems.add(path, `*${node.source}`, `an alias outside the value it names ("&${node.source}" contains this alias, so it would never end)`, pos);
      this.refused = true;
      return { type: 'scalar', value: null, pos };
    }
    if (this.reportedAliases) return { type: 'scalar', value: null, pos };
    this.expanding.push({ path, pos });
    try {
      return this.convert(target, path, depth);
    } finally {
      this.expanding.pop();
    }
  }

  private map(node: YAMLMap, path: string, depth: number, pos: Pos | undefined): MapNode {
    const entries: MapEntry[] = [];
    const seen = new Map<string, Pos | undefined>();
    for (const item of node.items) {
      if (!isPair(item)) continue;
      const k = item.key as YNode | null;
      const kPos = this.posOf(k?.range?.[0]);
      let key: string;
      if (k && isScalar(k) && (typeof k.value === 'string' || typeof k.value === 'number' || typeof k.value === 'boolean')) {
        key = typeof k.value === 'string' ? k.value : (k.source ?? String(k.value));
      } else {
        this.problems.add(path, undefined, 'a plain text key', kPos);
        continue;
      }
      const kp = joinKey(path, key);
      const value = this.convert(item.value as YNode | null, kp, depth + 1);
      if (seen.has(key)) {
        const first = seen.get(key);
        this.problems.add(kp, toPlain(value), `each key once in an object (first "${key}"${first ? ` at ${first.line}:${first.col}` : ''})`, kPos);
        continue;
      }
      seen.set(key, kPos);
      entries.push({ key, keyPos: kPos, value: value.pos ? value : { ...value, pos: kPos } });
    }
    return { type: 'map', entries, pos };
  }
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
