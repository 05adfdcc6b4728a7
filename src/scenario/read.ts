// Small typed readers over SrcNode that report problems instead of throwing.
//
// Each reader returns the value, or undefined after adding one problem (file, key path, bad value,
// expectation, line:col). Callers carry on with undefined so that every problem in the file is found.
import { parseQuantity, type Dimension, type Range, expectedPhrase } from '../units.js';
import { closest, joinIndex, joinKey, Problems, type Pos } from './problems.js';
import { toPlain, type MapEntry, type MapNode, type SeqNode, type SrcNode } from './parse.js';

export interface QuantitySpec {
  dim: Dimension;
  range?: Range;
  /** Example for the message, when the dimension's own is not the best fit ("1.25V" for a rail). */
  example?: string;
}

export class Reader {
  constructor(readonly problems: Problems) {}

  /** Report a problem at a node (or at `at` when the node is missing). */
  fail(path: string, node: SrcNode | undefined, expected: string, at?: Pos): undefined {
    this.problems.add(path, toPlain(node), expected, node?.pos ?? at);
    return undefined;
  }

  warn(path: string, node: SrcNode | undefined, expected: string, at?: Pos): void {
    this.problems.warn(path, toPlain(node), expected, node?.pos ?? at);
  }

  /** An object (mapping); `what` completes "expected ...", e.g. `a driver like {"signal": ..., "resistance": "25ohm"}`. */
  object(node: SrcNode | undefined, path: string, what: string, at?: Pos): Obj | undefined {
    if (!node || node.type !== 'map') return this.fail(path, node, what, at);
    return new Obj(node, path, this);
  }

  /** A list; a single non-list value is refused. */
  list(node: SrcNode | undefined, path: string, what: string, at?: Pos): SeqNode | undefined {
    if (!node || node.type !== 'seq') return this.fail(path, node, what, at);
    return node;
  }

  quantity(node: SrcNode | undefined, path: string, spec: QuantitySpec, at?: Pos): number | undefined {
    const raw = node?.type === 'scalar' ? node.value : undefined;
    const r = node ? parseQuantity(raw, spec.dim, spec.range, spec.example) : undefined;
    if (r?.ok) return r.value;
    return this.fail(path, node, r ? r.expected : expectedPhrase(spec.dim, spec.range, spec.example), at);
  }

  /** A text value. YAML plain scalars that look like numbers are taken as written (`name: 1` → "1"). */
  string(node: SrcNode | undefined, path: string, what: string, at?: Pos): string | undefined {
    if (node?.type === 'scalar') {
      if (typeof node.value === 'string') return node.value;
      if (node.plainSource !== undefined && typeof node.value === 'number') return node.plainSource;
    }
    return this.fail(path, node, what, at);
  }

  integer(node: SrcNode | undefined, path: string, min: number, example: number, at?: Pos): number | undefined {
    if (node?.type === 'scalar' && typeof node.value === 'number' && Number.isInteger(node.value) && node.value >= min) return node.value;
    return this.fail(path, node, `a whole number ≥ ${min} like ${example}`, at);
  }
}

/** A mapping being read: tracks which keys were looked at and reports unknown ones with a suggestion. */
export class Obj {
  private readonly byKey = new Map<string, MapEntry>();
  /** Keys suggested for typos ("lenght" → "length"): their absence is not reported again as missing. */
  private readonly suggested = new Set<string>();
  constructor(
    readonly node: MapNode,
    readonly path: string,
    readonly reader: Reader,
  ) {
    for (const e of node.entries) this.byKey.set(e.key, e);
  }

  get pos(): Pos | undefined {
    return this.node.pos;
  }

  has(key: string): boolean {
    return this.byKey.has(key);
  }

  keys(): string[] {
    return [...this.byKey.keys()];
  }

  get(key: string): SrcNode | undefined {
    return this.byKey.get(key)?.value;
  }

  entry(key: string): MapEntry | undefined {
    return this.byKey.get(key);
  }

  keyPath(key: string): string {
    return joinKey(this.path, key);
  }

  /** Report every key not in `known` as unknown, suggesting the closest known key. Returns true when all were known. */
  checkKeys(known: readonly string[], suggestFrom: readonly string[] = known): boolean {
    let ok = true;
    for (const e of this.node.entries) {
      if (known.includes(e.key)) continue;
      ok = false;
      const guess = closest(e.key, suggestFrom);
      if (guess !== undefined) this.suggested.add(guess);
      const hint = guess !== undefined ? ` — did you mean "${guess}"?` : '';
      this.reader.problems.add(joinKey(this.path, e.key), toPlain(e.value), `a known key${hint} (keys here: ${known.join(', ')})`, e.keyPos ?? e.value.pos);
    }
    return ok;
  }

  /** Report a missing required key at this object's position. */
  missing(key: string, expected: string): undefined {
    if (!this.suggested.has(key)) this.reader.problems.add(this.keyPath(key), undefined, expected, this.pos);
    return undefined;
  }

  /** Whether an absent key was already reported as a typo (call checkKeys first). */
  private typoed(key: string): boolean {
    return !this.has(key) && this.suggested.has(key);
  }

  /** A required quantity. */
  quantity(key: string, spec: QuantitySpec): number | undefined {
    if (this.typoed(key)) return undefined;
    return this.reader.quantity(this.get(key), this.keyPath(key), spec, this.pos);
  }

  /** An optional quantity: `fallback` when the key is absent. */
  optQuantity(key: string, spec: QuantitySpec, fallback: number): number | undefined;
  optQuantity(key: string, spec: QuantitySpec): number | undefined | null;
  optQuantity(key: string, spec: QuantitySpec, fallback?: number): number | undefined | null {
    if (!this.has(key)) return fallback === undefined ? null : fallback;
    return this.reader.quantity(this.get(key), this.keyPath(key), spec, this.pos);
  }

  string(key: string, what: string): string | undefined {
    if (this.typoed(key)) return undefined;
    return this.reader.string(this.get(key), this.keyPath(key), what, this.pos);
  }

  /** Items of a list, with their paths. */
  static items(seq: SeqNode, path: string): Array<{ node: SrcNode; path: string; index: number }> {
    return seq.items.map((node, index) => ({ node, path: joinIndex(path, index), index }));
  }
}
