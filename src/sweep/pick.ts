// --pick: which sweep point is best. A tiny hand-written tokenizer and recursive-descent parser.
//
//   pick       := direction objective [ "where" condition { "and" condition } ]
//   direction  := "minimize" | "maximize"          (also "minimise", "maximise", "min", "max")
//   objective  := ref
//   condition  := ref op value
//   op         := "<" | "<=" | ">" | ">=" | "≤" | "≥"
//   value      := number [unit]                   e.g. 10%  0.2V  200mV  5ns  1  40ohm
//   ref        := [probe "."] metric [ "[" band "]" ]   e.g. overshoot  rx.settling  settling[1%]  worst.overshoot
//              |  [probe "."] column                    e.g. rx.overshoot_V  settling_1pct_s
//              |  varied path                           e.g. route.rs.series.r
//
// Keywords are case-insensitive; a probe name with spaces or dots is quoted: "rx 2".overshoot.
// A metric without a probe means the probe at the main receiver (the first probe "at" it, else the last
// probe). With probes at several receivers (a branched net), the probe name "worst" means the worst of
// them: the largest overshoot, settling, delay … and the smallest noise margin over the receivers, so
// "minimize worst.overshoot" picks the point whose worst receiver rings least. A condition's unit chooses between a metric's variants: overshoot<10% compares the
// percentage of the swing, overshoot<0.3V the volts. An objective without a unit uses a metric's
// default: overshoot, undershoot in %, ringback in V. A settling band in brackets is measured in
// addition to the default ±5 %.
//
// Selection: among the points where every condition holds (a value that cannot be measured does not
// hold), the one with the smallest (largest) objective; ties go to the lowest point number.
import { METRICS, isMetricName, parseCheckLimit, type CheckLimit, type LimitUnit, type MetricName } from '../measure/index.js';
import { closest } from '../scenario/problems.js';
import { columnName, metricColumns, type MetricColumn, type WorstOf } from './columns.js';
import { parseAnyQuantity } from './spec.js';

export class PickError extends Error {
  constructor(
    readonly reason: string,
    readonly text: string,
    /** 0-based position of the problem in `text`. */
    readonly position: number,
  ) {
    super(`${reason} (at column ${position + 1})\n  ${text}\n  ${' '.repeat(Math.max(0, position))}^`);
    this.name = 'PickError';
  }
}

type TokKind = 'word' | 'op' | 'end';
interface Token {
  kind: TokKind;
  text: string;
  pos: number;
}

const OPS = ['<=', '>=', '≤', '≥', '<', '>'];

/** Splits pick text into words and operators. A word runs to the next space or operator (quotes group). */
export function tokenize(text: string): Token[] {
  const out: Token[] = [];
  let i = 0;
  while (i < text.length) {
    const c = text[i]!;
    if (/\s/.test(c)) {
      i++;
      continue;
    }
    const op = OPS.find((o) => text.startsWith(o, i));
    if (op) {
      out.push({ kind: 'op', text: op, pos: i });
      i += op.length;
      continue;
    }
    if (c === '=' || c === '!') throw new PickError(`"${c}" is not an operator here; use <, <=, > or >=`, text, i);
    const start = i;
    let word = '';
    while (i < text.length && !/\s/.test(text[i]!) && !OPS.some((o) => text.startsWith(o, i))) {
      if (text[i] === '"') {
        const end = text.indexOf('"', i + 1);
        if (end < 0) throw new PickError('this quote is not closed', text, i);
        word += text.slice(i, end + 1);
        i = end + 1;
      } else {
        if (text[i] === '=' || text[i] === '!') throw new PickError(`"${text[i]}" is not an operator here; use <, <=, > or >=`, text, i);
        word += text[i];
        i++;
      }
    }
    out.push({ kind: 'word', text: word, pos: start });
  }
  out.push({ kind: 'end', text: '', pos: text.length });
  return out;
}

export type PickOp = '<' | '<=' | '>' | '>=';

export interface RefSyntax {
  text: string;
  pos: number;
}

export interface PickSyntax {
  text: string;
  direction: 'minimize' | 'maximize';
  objective: RefSyntax;
  conditions: { ref: RefSyntax; op: PickOp; value: string; opPos: number; valuePos: number }[];
}

const DIRECTIONS: Record<string, 'minimize' | 'maximize'> = {
  minimize: 'minimize',
  minimise: 'minimize',
  min: 'minimize',
  maximize: 'maximize',
  maximise: 'maximize',
  max: 'maximize',
};

function isKeyword(t: Token, k: string): boolean {
  return t.kind === 'word' && t.text.toLowerCase() === k;
}

/** Parses the grammar above (no knowledge of probes or columns yet). Throws PickError. */
export function parsePickSyntax(text: string): PickSyntax {
  const toks = tokenize(text);
  let k = 0;
  const peek = () => toks[k]!;
  const next = () => toks[k++]!;
  const first = next();
  if (first.kind === 'end') throw new PickError('empty --pick: expected e.g. "minimize settling where overshoot<10%"', text, 0);
  const direction = first.kind === 'word' ? DIRECTIONS[first.text.toLowerCase()] : undefined;
  if (!direction) throw new PickError(`expected "minimize" or "maximize", found "${first.text}"`, text, first.pos);
  const refTok = next();
  if (refTok.kind !== 'word' || isKeyword(refTok, 'where') || isKeyword(refTok, 'and')) {
    throw new PickError(`expected what to ${direction} (a metric like settling, or a varied path), found ${refTok.kind === 'end' ? 'the end' : `"${refTok.text}"`}`, text, refTok.pos);
  }
  const out: PickSyntax = { text, direction, objective: { text: refTok.text, pos: refTok.pos }, conditions: [] };
  const after = peek();
  if (after.kind === 'end') return out;
  if (!isKeyword(after, 'where')) throw new PickError(`expected "where" or the end after the objective, found "${after.text}"`, text, after.pos);
  next();
  for (;;) {
    const ref = next();
    if (ref.kind !== 'word' || isKeyword(ref, 'and') || isKeyword(ref, 'where')) {
      throw new PickError(`expected a condition like overshoot<10%, found ${ref.kind === 'end' ? 'the end' : `"${ref.text}"`}`, text, ref.pos);
    }
    const op = next();
    if (op.kind !== 'op') throw new PickError(`expected <, <=, > or >= after "${ref.text}", found ${op.kind === 'end' ? 'the end' : `"${op.text}"`}`, text, op.pos);
    const val = next();
    if (val.kind !== 'word' || isKeyword(val, 'and')) throw new PickError(`expected a value like 10%, 0.2V or 5ns after "${op.text}", found ${val.kind === 'end' ? 'the end' : `"${val.text}"`}`, text, val.pos);
    const norm: PickOp = op.text === '≤' ? '<=' : op.text === '≥' ? '>=' : (op.text as PickOp);
    out.conditions.push({ ref: { text: ref.text, pos: ref.pos }, op: norm, value: val.text, opPos: op.pos, valuePos: val.pos });
    const t = peek();
    if (t.kind === 'end') return out;
    if (!isKeyword(t, 'and')) throw new PickError(`expected "and" or the end after a condition, found "${t.text}"`, text, t.pos);
    next();
  }
}

/** A ref split into probe, metric part and band (syntax only). */
function splitRef(text: string): { probe?: string; name: string; nameOffset: number; band?: string; bandOffset?: number } {
  let body = text;
  let band: string | undefined;
  let bandOffset: number | undefined;
  const m = /^(.*)\[([^\]]*)\]$/.exec(body);
  if (m && /[%vV]\s*$/.test(m[2]!)) {
    body = m[1]!;
    band = m[2]!;
    bandOffset = m[1]!.length;
  }
  // The probe is everything before the last "." outside quotes.
  let inQ = false;
  let dot = -1;
  for (let i = 0; i < body.length; i++) {
    if (body[i] === '"') inQ = !inQ;
    else if (body[i] === '.' && !inQ) dot = i;
  }
  const unq = (s: string) => (s.startsWith('"') && s.endsWith('"') ? s.slice(1, -1) : s);
  if (dot < 0) return { name: unq(body), nameOffset: 0, band, bandOffset };
  return { probe: unq(body.slice(0, dot)), name: unq(body.slice(dot + 1)), nameOffset: dot + 1, band, bandOffset };
}

/** Settling bands the pick's refs ask for (they must be measured, so they become columns). */
export function pickBands(syntax: PickSyntax): CheckLimit[] {
  const out: CheckLimit[] = [];
  for (const r of [syntax.objective, ...syntax.conditions.map((c) => c.ref)]) {
    const s = splitRef(r.text);
    if (s.band === undefined) continue;
    try {
      out.push(parseCheckLimit(s.band));
    } catch {
      // reported when the ref is resolved
    }
  }
  return out;
}

export interface PickParam {
  path: string;
  /** Header of its sweep.csv column. */
  column: string;
  unit: string;
}

export interface PickContext {
  probes: readonly string[];
  /** The worst over several receivers, when the net has them. */
  worst?: WorstOf | null;
  /** Probe used when a ref names none. */
  defaultProbe: string;
  columns: readonly MetricColumn[];
  params: readonly PickParam[];
}

export interface ResolvedRef {
  text: string;
  /** Header of the sweep.csv column the ref reads. */
  column: string;
  /** Unit of the column's values: a limit unit for metrics, the base unit for a varied value. */
  unit: string;
  kind: 'metric' | 'param';
  /** For metrics: the column key after the probe name ("overshoot_pct"). */
  key?: string;
}

export interface PickCondition {
  ref: ResolvedRef;
  op: PickOp;
  value: number;
  valueText: string;
}

export interface Pick {
  text: string;
  direction: 'minimize' | 'maximize';
  objective: ResolvedRef;
  conditions: PickCondition[];
}

const DEFAULT_UNIT: Partial<Record<MetricName, LimitUnit>> = { overshoot: '%', undershoot: '%', ringback: 'V' };

function limitUnitName(u: string): string {
  return u === '%' ? '%' : u === 'count' ? 'a plain count' : u;
}

function resolveRef(r: RefSyntax, ctx: PickContext, text: string, unit: LimitUnit | undefined, unitPos: number): ResolvedRef {
  const param = ctx.params.find((p) => p.path === r.text || p.column === r.text);
  if (param) return { text: r.text, column: param.column, unit: param.unit, kind: 'param' };
  const s = splitRef(r.text);
  const probe = s.probe ?? ctx.defaultProbe;
  const probePos = r.pos;
  const isWorst = ctx.worst != null && s.probe === ctx.worst.name;
  if (s.probe !== undefined && !ctx.probes.includes(s.probe) && !isWorst) {
    const known = ctx.worst ? [...ctx.probes, ctx.worst.name] : [...ctx.probes];
    const guess = closest(s.probe, known);
    throw new PickError(`no probe named "${s.probe}" (probes: ${known.join(', ')})${guess ? ` — did you mean "${guess}"?` : ''}`, text, probePos);
  }
  const namePos = r.pos + s.nameOffset;
  const sweepMetrics = [...new Set(ctx.columns.map((c) => c.metric))];
  let band: CheckLimit | undefined;
  if (s.band !== undefined) {
    try {
      band = parseCheckLimit(s.band);
    } catch {
      band = undefined;
    }
    if (!band || (band.unit !== '%' && band.unit !== 'V') || !(band.value > 0)) {
      throw new PickError(`"[${s.band}]" is not a settling band like [1%] or [20mV]`, text, r.pos + (s.bandOffset ?? 0));
    }
    if (s.name !== 'settling') throw new PickError(`a band in brackets goes with "settling", not "${s.name}"`, text, r.pos + (s.bandOffset ?? 0));
  }
  let col: MetricColumn | undefined;
  if (isMetricName(s.name)) {
    if (!sweepMetrics.includes(s.name)) {
      throw new PickError(`"${s.name}" is not measured in sweeps; sweep metrics: ${sweepMetrics.join(', ')}`, text, namePos);
    }
    const allowed = METRICS[s.name].units;
    const u = unit ?? DEFAULT_UNIT[s.name] ?? allowed[0]!;
    if (!allowed.includes(u)) {
      throw new PickError(`${s.name} is compared in ${allowed.map(limitUnitName).join(' or ')}, not ${limitUnitName(u)}`, text, unitPos);
    }
    col = ctx.columns.find((c) => c.metric === s.name && c.unit === u && (s.name !== 'settling' || sameBand(c.band, band)));
  } else {
    col = ctx.columns.find((c) => c.key === s.name);
    if (col && unit !== undefined && col.unit !== unit) {
      throw new PickError(`column ${s.name} is in ${limitUnitName(col.unit)}, the value in ${limitUnitName(unit)}`, text, unitPos);
    }
    if (!col) {
      const names = [...sweepMetrics, ...ctx.params.map((p) => p.path)];
      const guess = closest(s.name, [...names, ...ctx.columns.map((c) => c.key)]) ?? closest(r.text, ctx.params.map((p) => p.path));
      throw new PickError(
        `"${s.probe === undefined ? r.text : s.name}" is neither a metric (${sweepMetrics.join(', ')}) nor a varied path (${ctx.params.map((p) => p.path).join(', ') || 'none'})${guess ? ` — did you mean "${guess}"?` : ''}`,
        text,
        s.probe === undefined ? r.pos : namePos,
      );
    }
  }
  if (!col) throw new PickError(`no sweep column for "${r.text}"`, text, r.pos);
  if (isWorst && !ctx.worst!.columns.some((c) => c.key === col!.key)) {
    throw new PickError(`"${col.metric}" has no worst over the receivers (it has no worse direction); the worst is kept for ${[...new Set(ctx.worst!.columns.map((c) => c.metric))].join(', ')}`, text, namePos);
  }
  return { text: r.text, column: columnName(probe, col), unit: col.unit, kind: 'metric', key: col.key };
}

function sameBand(a: CheckLimit | undefined, b: CheckLimit | undefined): boolean {
  const def = (x: CheckLimit | undefined) => !x || (x.unit === '%' && x.value === 5);
  if (def(a) || def(b)) return def(a) && def(b);
  return a!.unit === b!.unit && a!.value === b!.value;
}

/** Resolves parsed pick text against the sweep's probes, columns and varied paths. Throws PickError. */
export function resolvePick(syntax: PickSyntax, ctx: PickContext): Pick {
  const text = syntax.text;
  const objective = resolveRef(syntax.objective, ctx, text, undefined, syntax.objective.pos);
  const conditions = syntax.conditions.map((c): PickCondition => {
    const param = ctx.params.find((p) => p.path === c.ref.text || p.column === c.ref.text);
    if (param) {
      const q = parseAnyQuantity(c.value);
      if (!q) throw new PickError(`"${c.value}" is not a number with a unit`, text, c.valuePos);
      if (q.unit !== '' && param.unit !== '' && q.unit !== param.unit) throw new PickError(`${param.path} is in ${param.unit}, "${c.value}" is not`, text, c.valuePos);
      return { ref: { text: c.ref.text, column: param.column, unit: param.unit, kind: 'param' }, op: c.op, value: q.value, valueText: c.value };
    }
    let limit: CheckLimit;
    try {
      limit = parseCheckLimit(c.value);
    } catch {
      throw new PickError(`"${c.value}" is not a value like 10%, 0.2V, 200mV, 5ns or 1`, text, c.valuePos);
    }
    const ref = resolveRef(c.ref, ctx, text, limit.unit, c.valuePos);
    return { ref, op: c.op, value: limit.value, valueText: c.value };
  });
  return { text, direction: syntax.direction, objective, conditions };
}

/** Parse and resolve in one go. */
export function parsePick(text: string, ctx: PickContext): Pick {
  return resolvePick(parsePickSyntax(text), ctx);
}

/** The columns a pick needs measured, given the scenario's own bands (for building a context). */
export function pickContextColumns(syntax: PickSyntax | undefined, scenarioBands: readonly CheckLimit[]): MetricColumn[] {
  return metricColumns([...scenarioBands, ...(syntax ? pickBands(syntax) : [])]);
}

export interface PickOutcome {
  /** Index into the rows of the best point; null when no point meets every condition. */
  row: number | null;
  objective: number | null;
  /** How many rows meet every condition. */
  feasible: number;
  /** Per condition: how many rows meet it. */
  holds: number[];
}

function compare(a: number, op: PickOp, b: number): boolean {
  switch (op) {
    case '<':
      return a < b;
    case '<=':
      return a <= b;
    case '>':
      return a > b;
    case '>=':
      return a >= b;
  }
}

/** Chooses the best row of a sweep table (rows in point order). */
export function selectBest(pick: Pick, header: readonly string[], rows: readonly (readonly (number | null)[])[]): PickOutcome {
  const idx = (c: string) => {
    const i = header.indexOf(c);
    if (i < 0) throw new Error(`sweep table has no column ${c}`);
    return i;
  };
  const oi = idx(pick.objective.column);
  const ci = pick.conditions.map((c) => idx(c.ref.column));
  const holds = pick.conditions.map(() => 0);
  let best: number | null = null;
  let bestV: number | null = null;
  let feasible = 0;
  rows.forEach((row, r) => {
    let ok = true;
    pick.conditions.forEach((c, k) => {
      const v = row[ci[k]!];
      const h = v !== null && v !== undefined && compare(v, c.op, c.value);
      if (h) holds[k]!++;
      else ok = false;
    });
    if (!ok) return;
    const v = row[oi];
    if (v === null || v === undefined) return;
    feasible++;
    if (bestV === null || (pick.direction === 'minimize' ? v < bestV : v > bestV)) {
      best = r;
      bestV = v;
    }
  });
  return { row: best, objective: bestV, feasible, holds };
}
