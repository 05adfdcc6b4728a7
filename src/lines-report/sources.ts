// Where the `line` command's lines come from: the route of a scenario file (each line item, and
// named lines no item uses), or a geometry given on the command line as key=value pairs.
import type { Net, RouteItem } from '../../sim/model.js';
import { describeLineNode, GEOMETRY_SPECS, geometryKeys, lineParams, readGeometryNode, type GeometryKind } from '../scenario/line-geometry.js';
import { readLine } from '../scenario/lines.js';
import { readScenario } from '../scenario/load.js';
import { fromValue, parseText, type MapNode, type SrcNode } from '../scenario/parse.js';
import { joinIndex, joinKey, Problems, ScenarioError, type Problem } from '../scenario/problems.js';
import { Reader } from '../scenario/read.js';
import type { LineInput } from './evaluate.js';
import type { CoupledInput } from './coupled.js';
import { keyedRecord } from '../keyed.js';

export interface LineSources {
  lines: LineInput[];
  /** The scenario's coupled sections (multi-net scenarios). */
  coupled?: CoupledInput[];
  /** Loader warnings (out-of-range geometry, datasheet fit error ...). */
  warnings: Problem[];
}

function entry(node: SrcNode | undefined, key: string): SrcNode | undefined {
  return node?.type === 'map' ? node.entries.find((e) => e.key === key)?.value : undefined;
}

/**
 * The lines of a scenario file: every line item of the route (in route order, with its length), then
 * every named line that no item uses. Throws ScenarioError (listing every problem) for a bad file.
 */
export async function linesFromScenario(file: string): Promise<LineSources> {
  const { net, text, warnings } = await readScenario(file);
  // The file was accepted: read its tree again for the descriptions behind the numbers.
  const root = parseText(text, new Problems(file));
  const coupled = (net.coupled ?? []).map((c): CoupledInput => ({ name: c.name, origin: `coupled.${c.name} (conductors ${c.conductors.join(', ')})`, form: 'matrices', line: c.line, inputs: {}, warnings: [] }));
  return { lines: linesOfTree(net, root, new Reader(new Problems(file))), coupled, warnings };
}

/** The lines of an accepted scenario, given its Net and its source tree. */
export function linesOfTree(net: Net, root: SrcNode | undefined, reader: Reader): LineInput[] {
  const named = entry(root, 'lines');
  const route = entry(root, 'route');
  const used = new Set<string>();
  const out: LineInput[] = [];
  // The route tree and its source nodes side by side: a branch's routes are walked where they appear.
  const walk = (items: readonly RouteItem[], seq: SrcNode | undefined, prefix: string): void => {
    const nodes = seq?.type === 'seq' ? seq.items : [];
    items.forEach((item, i) => {
      const itemPath = joinIndex(prefix, i);
      if (item.kind === 'branch') {
        const bn = entry(nodes[i], 'branch');
        item.branches.forEach((b, j) => {
          const one = bn?.type === 'seq' ? bn.items[j] : bn;
          walk(b.route, entry(one, 'route'), joinKey(bn?.type === 'seq' ? joinIndex(joinKey(itemPath, 'branch'), j) : joinKey(itemPath, 'branch'), 'route'));
        });
        return;
      }
      if (item.kind !== 'line') return;
      const node = entry(nodes[i], 'line');
      let lineNode = node;
      let path = joinKey(itemPath, 'line');
      let lineName: string | undefined;
      if (node?.type === 'scalar' && typeof node.value === 'string') {
        lineName = node.value;
        used.add(lineName);
        lineNode = entry(named, lineName);
        path = joinKey('lines', lineName);
      }
      const section = net.coupled?.find((c) => c.conductors.includes(item.name));
      if (section) {
        out.push({ name: item.name, origin: `conductor of coupled section '${section.name}', its self terms L_ii, C_ii`, length: item.length, rlgc: item.line });
        return;
      }
      const description = describeLineNode(reader, lineNode, path);
      out.push({ name: item.name, origin: 'route item', length: item.length, lineName, rlgc: item.line, description });
    });
  };
  const nets = entry(root, 'nets');
  if (net.netName === undefined) walk(net.route, route, 'route');
  else walk(net.route, entry(entry(nets, net.netName), 'route'), joinKey(joinKey('nets', net.netName), 'route'));
  for (const side of net.nets ?? []) walk(side.route, entry(entry(nets, side.name), 'route'), joinKey(joinKey('nets', side.name), 'route'));
  // Named lines no item uses: checked by the loader all the same, so still worth a report.
  if (named?.type === 'map') {
    for (const e of (named as MapNode).entries) {
      if (used.has(e.key)) continue;
      const path = joinKey('lines', e.key);
      const description = describeLineNode(reader, e.value, path);
      const rlgc = description ? lineParams(description) : readLine(reader, e.value, path);
      if (rlgc) out.push({ name: e.key, origin: 'unused line in "lines"', lineName: e.key, rlgc: { r: 0, g: 0, ...rlgc }, description });
    }
  }
  return out;
}

/** Command-line options that describe a line: `--microstrip width=8mil,height=5mil,...`. */
export const GEOMETRY_OPTIONS: readonly GeometryKind[] = ['microstrip', 'stripline', 'coax', 'twoWire'];

/**
 * A geometry from `key=value,key=value` pairs (the keys of the scenario form; `conductivity=5.8e7S/m`
 * stands for `"conductor": {"conductivity": ...}`). Throws ScenarioError naming the option, the key
 * and what was expected.
 */
export function lineFromOption(kind: GeometryKind, pairs: string, name: string = kind): LineSources {
  const where = `--${kind}`;
  const problems = new Problems('(command line)');
  const value = keyedRecord<unknown>();
  const keys = geometryKeys(kind);
  for (const piece of pairs.split(',')) {
    const text = piece.trim();
    if (text === '') continue;
    const eq = text.indexOf('=');
    if (eq <= 0) {
      problems.add(where, text, `key=value pairs separated by commas, like ${GEOMETRY_SPECS[kind].keys.map((k) => `${k}=…`).join(',')} (keys: ${[...keys, 'conductivity'].join(', ')})`);
      continue;
    }
    const key = text.slice(0, eq).trim();
    const v = text.slice(eq + 1).trim();
    if (Object.hasOwn(value, key) || (key === 'conductivity' && Object.hasOwn(value, 'conductor'))) {
      problems.add(joinKey(where, key), v, `each key once (${key === 'conductivity' ? '"conductivity" and "conductor" say the same thing' : `"${key}" is given twice`})`);
      continue;
    }
    if (key === 'conductivity') value.conductor = { conductivity: v };
    else value[key] = v;
  }
  const reader = new Reader(problems);
  const description = problems.count === 0 ? readGeometryNode(kind, reader, fromValue(value), where) : undefined;
  if (!description || problems.count > 0) throw new ScenarioError(problems.sorted(), problems.warnings);
  return {
    lines: [{ name, origin: where, rlgc: { ...lineParams(description), r: description.line.rdc, g: description.line.gdc }, description }],
    warnings: problems.warnings,
  };
}
