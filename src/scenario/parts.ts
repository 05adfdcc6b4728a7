// PART → Part: the given elements (r, l, c) in series; for shunt and receiver parts, from the node to
// a rail ("to", default 0 V). A list of parts means parts in parallel.
import type { Part } from '../../sim/model.js';
import { NON_NEGATIVE, POSITIVE } from '../units.js';
import { Obj, type Reader } from './read.js';
import type { SrcNode } from './parse.js';
import type { Pos } from './problems.js';

export const PART_KEYS = ['r', 'l', 'c', 'to'] as const;
export const PART_NO_RAIL_KEYS = ['r', 'l', 'c'] as const;

const PART_EXAMPLE = '{"r": "50ohm", "to": "1.25V"}';
const SERIES_EXAMPLE = '{"r": "22ohm"}';

/**
 * Read one PART. `rail` false: a series part (PART_NO_RAIL), where "to" is an error.
 * Absent r → 0, absent l → 0, absent c → undefined (no capacitor: a DC path), absent to → 0 V.
 */
export function readPart(reader: Reader, node: SrcNode | undefined, path: string, rail: boolean, at?: Pos): Part | undefined {
  const o = reader.object(node, path, rail ? `a part like ${PART_EXAMPLE} or {"c": "3pF"}` : `a series part like ${SERIES_EXAMPLE} or {"c": "100nF"}`, at);
  if (!o) return undefined;
  let ok = true;
  if (!rail && o.has('to')) {
    const e = o.entry('to')!;
    reader.problems.add(
      o.keyPath('to'),
      e.value.type === 'scalar' ? e.value.value : undefined,
      'no "to" on a series part: it sits between two nodes and has no rail (use a "shunt" item for a part to a rail)',
      e.keyPos ?? o.pos,
    );
    ok = false;
  }
  ok = o.checkKeys(rail ? PART_KEYS : [...PART_NO_RAIL_KEYS, 'to'], PART_KEYS) && ok;

  const r = o.optQuantity('r', { dim: 'resistance', range: NON_NEGATIVE, example: '50ohm' }, 0);
  const l = o.optQuantity('l', { dim: 'inductance', range: NON_NEGATIVE, example: '2nH' }, 0);
  const c = o.optQuantity('c', { dim: 'capacitance', range: POSITIVE, example: '3pF' });
  const to = rail ? o.optQuantity('to', { dim: 'voltage', example: '1.25V' }, 0) : 0;
  if (!o.has('r') && !o.has('l') && !o.has('c')) {
    reader.fail(path, node, rail ? `a part with at least one of "r", "l", "c", like ${PART_EXAMPLE}` : `a series part with at least one of "r", "l", "c", like ${SERIES_EXAMPLE}`, at);
    return undefined;
  }
  if (r === undefined || l === undefined || c === undefined || to === undefined || !ok) return undefined;
  // A zero-impedance part is allowed: a 0 ohm series part is a wire (sweeps of a series resistor start
  // there) and a 0 ohm shunt ties its node to the rail; the solver handles both exactly.
  const part: Part = { r, l, rail: to };
  if (c !== null) part.c = c;
  return part;
}

/**
 * One PART or a list of them (in parallel). `allowEmpty`: an empty list (or none) is fine, e.g. an open
 * receiver; otherwise at least one part is required.
 */
export function readPartList(reader: Reader, node: SrcNode | undefined, path: string, allowEmpty: boolean, at?: Pos): Part[] | undefined {
  if (node?.type === 'map') {
    const p = readPart(reader, node, path, true, at);
    return p ? [p] : undefined;
  }
  if (node?.type !== 'seq') {
    return reader.fail(path, node, `a part like ${PART_EXAMPLE} or a list of parts in parallel like [{"r": "220ohm", "to": "3.3V"}, {"r": "330ohm"}]`, at);
  }
  if (node.items.length === 0 && !allowEmpty) {
    return reader.fail(path, node, `at least one part, like [${PART_EXAMPLE}]`, at);
  }
  const parts: Part[] = [];
  let ok = true;
  for (const it of Obj.items(node, path)) {
    const p = readPart(reader, it.node, it.path, true, node.pos ?? at);
    if (p) parts.push(p);
    else ok = false;
  }
  return ok ? parts : undefined;
}
