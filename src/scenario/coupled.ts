// The "coupled" section of a multi-net scenario: named coupled sections, each listing its conductors
// (line items of the nets, in the matrices' order) and giving its per-unit-length matrices one way —
// L and C (Maxwell convention; optional R and G), odd/even modes of a symmetric pair, or the geometry of
// an edge-coupled microstrip or centred stripline pair (docs/scenario-format.md, docs/coupled-lines.md).
//
//   "coupled": { "bus": { "conductors": ["clk_run", "rst_run"], "microstrip": { "width": "6mil", … } } }
import { coupledFromMicrostrip, coupledFromStripline } from '../../sim/coupled/geometry.js';
import { coupledLineProblems, coupledLineWarnings, pairFromModes, pairModesProblems, type CoupledLine } from '../../sim/coupled/line.js';
import type { CoupledSpec } from '../../sim/model.js';
import { COUPLED_KEYS } from '../lines-report/coupled.js';
import type { Dimension, Range } from '../units.js';
import { NON_NEGATIVE } from '../units.js';
import type { SrcNode } from './parse.js';
import { joinIndex } from './problems.js';
import { Obj, type Reader } from './read.js';

export const COUPLED_FORMS = ['matrices', 'modes', 'microstrip', 'stripline'] as const;
export const COUPLED_SECTION_KEYS = ['conductors', 'l', 'c', 'r', 'g', 'modes', 'microstrip', 'stripline'] as const;

/** A coupled section as read: its matrices and conductors (cross-checked against the routes later). */
export interface CoupledRead {
  spec: CoupledSpec;
  path: string;
  /** Where each conductor name was written. */
  conductorPaths: string[];
}

const WHAT =
  'a coupled section like {"conductors": ["clk_run", "rst_run"], "l": [["300nH/m", "45nH/m"], ["45nH/m", "300nH/m"]], "c": [["120pF/m", "-12pF/m"], ["-12pF/m", "120pF/m"]]} — or "modes", "microstrip" or "stripline" instead of "l" and "c"';

/** Every section of the "coupled" key, by name (undefined where a section was bad; already reported). */
export function readCoupledSections(r: Reader, top: Obj): Map<string, CoupledRead | undefined> {
  const out = new Map<string, CoupledRead | undefined>();
  if (!top.has('coupled')) return out;
  const o = r.object(top.get('coupled'), 'coupled', `named coupled sections like {"bus": ${WHAT}}`, top.pos);
  if (!o) return out;
  for (const name of o.keys()) {
    const e = o.entry(name)!;
    out.set(name, readSection(r, e.value, o.keyPath(name), name));
  }
  return out;
}

function readSection(r: Reader, node: SrcNode, path: string, name: string): CoupledRead | undefined {
  const o = r.object(node, path, WHAT, undefined);
  if (!o) return undefined;
  let ok = o.checkKeys(COUPLED_SECTION_KEYS);
  const conductors: string[] = [];
  const conductorPaths: string[] = [];
  if (!o.has('conductors')) ok = !!o.missing('conductors', 'the line items running alongside, in the matrices\' order, like ["clk_run", "rst_run"]');
  else {
    const seq = r.list(o.get('conductors'), o.keyPath('conductors'), 'a list of at least two line item names, like ["clk_run", "rst_run"]', o.pos);
    if (!seq) ok = false;
    else if (seq.items.length < 2) ok = !!r.fail(o.keyPath('conductors'), seq, 'at least two line item names, like ["clk_run", "rst_run"]', o.pos);
    else
      for (const it of Obj.items(seq, o.keyPath('conductors'))) {
        const n = r.string(it.node, it.path, 'the name of a coupled line item', seq.pos);
        if (n === undefined) ok = false;
        else if (conductors.includes(n)) ok = !!r.fail(it.path, it.node, `a conductor listed once ("${n}" is also ${joinIndex(o.keyPath('conductors'), conductors.indexOf(n))})`, seq.pos);
        else {
          conductors.push(n);
          conductorPaths.push(it.path);
        }
      }
  }
  const forms = (['l', 'modes', 'microstrip', 'stripline'] as const).filter((k) => o.has(k) || (k === 'l' && o.has('c')));
  if (forms.length !== 1) {
    r.fail(path, node, forms.length === 0 ? 'one description of the section: "l" and "c" matrices, "modes", "microstrip" or "stripline"' : `one description of the section, not ${forms.map((f) => (f === 'l' ? '"l"/"c"' : `"${f}"`)).join(' and ')}`, o.pos);
    return undefined;
  }
  if (forms[0] !== 'l' && (o.has('r') || o.has('g'))) {
    r.fail(o.keyPath(o.has('r') ? 'r' : 'g'), o.get(o.has('r') ? 'r' : 'g'), `"r" and "g" only with the "l"/"c" form (the ${forms[0]} form is lossless)`, o.pos);
    ok = false;
  }
  const line = forms[0] === 'l' ? readMatrices(r, o) : forms[0] === 'modes' ? readModes(r, o) : readGeometry(r, o, forms[0]);
  if (!line) return undefined;
  for (const p of coupledLineProblems(line)) r.fail(`${path}.${p.path}`, o.get(p.path.replace(/\[.*$/, '')) ?? node, p.message, o.pos);
  for (const w of coupledLineWarnings(line)) r.warn(path, node, `a section with positive capacitance to the return — ${w}`, o.pos);
  if (ok && conductors.length !== line.k) {
    r.fail(o.keyPath('conductors'), o.get('conductors'), `${line.k} conductors for ${line.k}×${line.k} matrices (got ${conductors.length})`, o.pos);
    ok = false;
  }
  if (!ok || coupledLineProblems(line).length) return undefined;
  return { spec: { name, conductors, line }, path, conductorPaths };
}

/** A k×k matrix of quantities: a list of k rows of k entries. */
function readMatrix(r: Reader, o: Obj, key: string, dim: Dimension, range: Range | undefined, example: string): { m: Float64Array; k: number } | undefined {
  const path = o.keyPath(key);
  const what = `a square matrix as a list of rows, like [["${example}", "…"], ["…", "${example}"]]`;
  const rows = r.list(o.get(key), path, what, o.pos);
  if (!rows) return undefined;
  const k = rows.items.length;
  if (k < 2) return r.fail(path, rows, `${what} (at least 2×2)`, o.pos);
  const m = new Float64Array(k * k);
  let ok = true;
  for (const row of Obj.items(rows, path)) {
    const cells = r.list(row.node, row.path, `a row of ${k} entries`, rows.pos);
    if (!cells || cells.items.length !== k) {
      if (cells) r.fail(row.path, row.node, `a row of ${k} entries (the matrix has ${k} rows)`, rows.pos);
      ok = false;
      continue;
    }
    for (const cell of Obj.items(cells, row.path)) {
      const x = r.quantity(cell.node, cell.path, { dim, range: cell.index === row.index ? range : undefined, example }, cells.pos);
      if (x === undefined) ok = false;
      else m[row.index * k + cell.index] = x;
    }
  }
  return ok ? { m, k } : undefined;
}

function readMatrices(r: Reader, o: Obj): CoupledLine | undefined {
  if (!o.has('l')) return o.missing('l', 'the inductance matrix, like [["300nH/m", "45nH/m"], ["45nH/m", "300nH/m"]]');
  if (!o.has('c')) return o.missing('c', 'the capacitance matrix (Maxwell: off-diagonal ≤ 0), like [["120pF/m", "-12pF/m"], ["-12pF/m", "120pF/m"]]');
  const l = readMatrix(r, o, 'l', 'inductancePerLength', undefined, '300nH/m');
  const c = readMatrix(r, o, 'c', 'capacitancePerLength', undefined, '120pF/m');
  const rm = o.has('r') ? readMatrix(r, o, 'r', 'resistancePerLength', NON_NEGATIVE, '5ohm/m') : null;
  const gm = o.has('g') ? readMatrix(r, o, 'g', 'conductancePerLength', NON_NEGATIVE, '20uS/m') : null;
  if (!l || !c || rm === undefined || gm === undefined) return undefined;
  const sizes = [l, c, rm, gm].filter((x) => x !== null).map((x) => x!.k);
  if (sizes.some((k) => k !== l.k)) return r.fail(o.path, o.node, `matrices of one size (got ${sizes.map((k) => `${k}×${k}`).join(', ')})`, o.pos);
  return { k: l.k, l: l.m, c: c.m, ...(rm ? { r: rm.m } : {}), ...(gm ? { g: gm.m } : {}) };
}

/** Odd/even modes of a symmetric pair: zOdd, zEven and a delay or velocity per mode. */
function readModes(r: Reader, o: Obj): CoupledLine | undefined {
  const m = r.object(o.get('modes'), o.keyPath('modes'), 'odd and even modes like {"zOdd": "45ohm", "zEven": "56ohm", "delayOdd": "150ps/in", "delayEven": "160ps/in"}', o.pos);
  if (!m) return undefined;
  const keys = COUPLED_KEYS['coupled-modes'];
  if (!m.checkKeys(Object.keys(keys))) return undefined;
  const zOdd = m.quantity('zOdd', keys.zOdd);
  const zEven = m.quantity('zEven', keys.zEven);
  const delay = (mode: 'Odd' | 'Even') => {
    const d = m.has(`delay${mode}`);
    const v = m.has(`velocity${mode}`);
    if (d === v) return r.fail(m.keyPath(`delay${mode}`), m.get(`delay${mode}`), `one of delay${mode} (like "150ps/in") or velocity${mode} (like "0.55c")`, m.pos);
    return d ? m.quantity(`delay${mode}`, keys[`delay${mode}`]) : 1 / m.quantity(`velocity${mode}`, keys[`velocity${mode}`])!;
  };
  const delayOdd = delay('Odd');
  const delayEven = delay('Even');
  if (zOdd === undefined || zEven === undefined || !(delayOdd! > 0) || !(delayEven! > 0)) return undefined;
  const modes = { zOdd, zEven, delayOdd: delayOdd!, delayEven: delayEven! };
  const bad = pairModesProblems(modes);
  for (const p of bad) r.fail(m.keyPath(p.path), m.get(p.path), p.message, m.pos);
  return bad.length ? undefined : pairFromModes(modes);
}

function readGeometry(r: Reader, o: Obj, form: 'microstrip' | 'stripline'): CoupledLine | undefined {
  const key = form === 'microstrip' ? 'coupled-microstrip' : 'coupled-stripline';
  const example = form === 'microstrip' ? '{"width": "6mil", "spacing": "8mil", "height": "4mil", "er": 4.2}' : '{"width": "4mil", "spacing": "5mil", "planeSpacing": "12mil", "er": 4.3}';
  const g = r.object(o.get(form), o.keyPath(form), `an edge-coupled ${form} pair like ${example}`, o.pos);
  if (!g) return undefined;
  const keys = COUPLED_KEYS[key];
  let ok = g.checkKeys(Object.keys(keys));
  const got: Record<string, number> = Object.create(null);
  for (const k of Object.keys(keys)) {
    const x = g.quantity(k, keys[k]);
    if (x === undefined) ok = false;
    else got[k] = x;
  }
  if (!ok) return undefined;
  const { line, analysis } =
    form === 'microstrip'
      ? coupledFromMicrostrip({ width: got.width, spacing: got.spacing, height: got.height, er: got.er })
      : coupledFromStripline({ width: got.width, spacing: got.spacing, planeSpacing: got.planeSpacing, er: got.er });
  for (const w of analysis.validity.warnings) r.warn(o.keyPath(form), o.get(form), `a geometry inside the model's range of validity — ${w}`, g.pos);
  return line;
}
