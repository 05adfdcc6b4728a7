// LINE forms with frequency-dependent loss: lines described by their geometry (microstrip,
// stripline, coax, two wires) or by a datasheet (Z0, velocity or delay, attenuation points).
//
// Each form reads its keys, checks them (every problem with its key path, like the rest of the
// validator), and calls the builders of sim/lines (formulas, sources and validity ranges are in
// docs/line-models.md). The result is a FreqLine: the net's LineRLGC gets r = R_dc, l = L∞,
// g = G_dc, c = C∞ and `wideband`, which the engine realises for the band a run needs. A description
// outside its model's range of validity, and a datasheet fit that misses a point by more than 5 %,
// are warnings naming the range (or the error).
//
// `describeLineNode` reads the same keys again and returns the whole description (Z0, ε_eff, the
// conductor, the datasheet fit...) for the `line` report; the scenario loader uses only the FreqLine.
import { dsMaxLossTangent } from '../../sim/lines/dielectric.js';
import {
  fromCoax,
  fromDatasheet,
  fromMicrostrip,
  fromStripline,
  fromTwoWire,
  type DatasheetFit,
  type FreqLine,
} from '../../sim/lines/freq-model.js';
import { COPPER_CONDUCTIVITY } from '../../sim/lines/constants.js';
import { NON_NEGATIVE, POSITIVE, SPEED_OF_LIGHT, formatSI } from '../units.js';
import type { LineForm, LineParams } from './line-form.js';
import type { SrcNode } from './parse.js';
import type { Pos } from './problems.js';
import { Obj, type QuantitySpec, type Reader } from './read.js';

export type GeometryKind = 'microstrip' | 'stripline' | 'coax' | 'twoWire';
export type DescribedForm = GeometryKind | 'datasheet';

/** Everything known about a frequency-dependent line description (plain SI numbers). */
export interface LineDescription {
  form: DescribedForm;
  /** The exact frequency-domain model (Z′(jω), Y′(jω)). */
  line: FreqLine;
  /** Z0 and ε_eff at `at`: quasi-static for a geometry, as given for a datasheet. */
  z0: number;
  epsEff: number;
  /** Delay per metre at `at` (s/m). */
  delayPerMeter: number;
  /** Frequency (Hz) at which er and the loss tangent (or the datasheet's z0 and velocity) hold. */
  at: number;
  /** Conductor conductivity (S/m); Infinity for a perfect conductor; undefined for a datasheet. */
  conductivity?: number;
  /** Upper frequency of the quasi-TEM model (Hz); Infinity when none applies; undefined for a datasheet. */
  maxFrequency?: number;
  /** The parsed inputs (m, S/m, Hz, plain numbers). */
  inputs: Record<string, number | string>;
  /** The datasheet fit (datasheet form only). */
  fit?: DatasheetFit;
  /** Out-of-range and fit warnings, one line each, naming the range. */
  warnings: string[];
}

const GHZ = 1e9;
/** Djordjevic–Sarkar corner frequencies the builders use by default (1 kHz, 1 THz; docs/line-models.md). */
const DS_F1 = 1e3;
const DS_F2 = 1e12;

const POS_LENGTH = (example: string): QuantitySpec => ({ dim: 'length', range: POSITIVE, example });
const ER: QuantitySpec = { dim: 'number', range: { min: 1 }, example: '4.3' };
const LOSS_TANGENT: QuantitySpec = { dim: 'number', range: { min: 0, max: 1, maxExclusive: true }, example: '0.02' };
const AT: QuantitySpec = { dim: 'frequency', range: { min: DS_F1, max: DS_F2 }, example: '1GHz' };
const ROUGHNESS: QuantitySpec = { dim: 'length', range: NON_NEGATIVE, example: '0.5um' };

/** Material keys shared by the geometric forms. */
export const MATERIAL_KEYS = ['er', 'lossTangent', 'at', 'conductor', 'roughness'] as const;

/** Named conductors: "copper" (annealed copper, IACS, 5.8e7 S/m) and "perfect" (no conductor loss). */
export const CONDUCTORS: Readonly<Record<string, number>> = { copper: COPPER_CONDUCTIVITY, perfect: Infinity };

interface GeometrySpec {
  kind: GeometryKind;
  /** Geometry keys, all required unless listed in `optional`. */
  keys: readonly string[];
  optional?: readonly string[];
  /** An example of the inner object, for messages. */
  inner: string;
}

export const GEOMETRY_SPECS: Readonly<Record<GeometryKind, GeometrySpec>> = {
  microstrip: {
    kind: 'microstrip',
    keys: ['width', 'height', 'thickness'],
    inner: '{"width": "8mil", "height": "5mil", "thickness": "1oz", "er": 4.3, "lossTangent": 0.02}',
  },
  stripline: {
    kind: 'stripline',
    keys: ['width', 'planeSpacing', 'thickness'],
    inner: '{"width": "5mil", "planeSpacing": "16mil", "thickness": "0.5oz", "er": 4.3, "lossTangent": 0.02}',
  },
  coax: {
    kind: 'coax',
    keys: ['innerDiameter', 'shieldDiameter'],
    optional: ['shieldThickness'],
    inner: '{"innerDiameter": "0.9mm", "shieldDiameter": "2.95mm", "er": 2.25}',
  },
  twoWire: {
    kind: 'twoWire',
    keys: ['diameter', 'spacing'],
    inner: '{"diameter": "0.5mm", "spacing": "1.5mm", "er": 1}',
  },
};

/** All keys of a geometric form's inner object. */
export function geometryKeys(kind: GeometryKind): string[] {
  const g = GEOMETRY_SPECS[kind];
  return [...g.keys, ...(g.optional ?? []), ...MATERIAL_KEYS];
}

interface Material {
  er: number;
  lossTangent: number;
  at: number;
  conductivity: number;
  conductorName: string;
  roughness: number;
}

/** "conductor": "copper" | "perfect" | {"conductivity": "5.8e7S/m"} (default copper). */
function readConductor(g: Obj): { conductivity: number; name: string } | undefined {
  if (!g.has('conductor')) return { conductivity: COPPER_CONDUCTIVITY, name: 'copper' };
  const node = g.get('conductor')!;
  const path = g.keyPath('conductor');
  const names = Object.keys(CONDUCTORS);
  const what = `${names.map((n) => `"${n}"`).join(' or ')}, or {"conductivity": "5.8e7S/m"}`;
  if (node.type === 'scalar') {
    const name = typeof node.value === 'string' ? node.value.trim() : undefined;
    if (name !== undefined && Object.hasOwn(CONDUCTORS, name)) return { conductivity: CONDUCTORS[name], name };
    return g.reader.fail(path, node, `a conductor: ${what}`, g.pos);
  }
  const c = g.reader.object(node, path, `a conductor: ${what}`, g.pos);
  if (!c) return undefined;
  const ok = c.checkKeys(['conductivity']);
  const sigma = c.quantity('conductivity', { dim: 'conductivity', range: POSITIVE, example: '5.8e7S/m' });
  if (!ok || sigma === undefined) return undefined;
  return { conductivity: sigma, name: formatSI(sigma, 'S/m') };
}

function readMaterial(g: Obj): Material | undefined {
  const er = g.quantity('er', ER);
  const lossTangent = g.optQuantity('lossTangent', LOSS_TANGENT, 0);
  const at = g.optQuantity('at', AT, GHZ);
  const conductor = readConductor(g);
  const roughness = g.optQuantity('roughness', ROUGHNESS, 0);
  // The Djordjevic–Sarkar model carries a loss tangent only up to where ε∞ would fall below 1.
  let capOk = true;
  if (er !== undefined && lossTangent !== undefined && lossTangent > 0 && at !== undefined) {
    const cap = dsMaxLossTangent(er, at, DS_F1, DS_F2);
    if (!(lossTangent < cap)) {
      capOk = false;
      const why = er === 1 ? 'an air-filled line (er 1) has no dielectric loss' : `for er ${er} at ${formatSI(at, 'Hz')} the causal wideband (Djordjevic–Sarkar) model allows at most ${cap.toPrecision(3)}`;
      g.reader.fail(g.keyPath('lossTangent'), g.get('lossTangent'), `a smaller loss tangent (${why})`, g.pos);
    }
  }
  if (er === undefined || lossTangent === undefined || at === undefined || !conductor || roughness === undefined || !capOk) return undefined;
  return { er, lossTangent, at, conductivity: conductor.conductivity, conductorName: conductor.name, roughness };
}

/** Reads a geometric form's inner object at `LINE.<kind>` and builds its description. */
function readGeometry(kind: GeometryKind, o: Obj): LineDescription | undefined {
  return readGeometryNode(kind, o.reader, o.get(kind), o.keyPath(kind), o.pos);
}

/**
 * Reads the inner object of a geometric form ({"width": ..., "er": ...}) at `path` and builds its
 * description; problems go to `reader` (the `line` command uses it for --microstrip key=value lists).
 */
export function readGeometryNode(kind: GeometryKind, reader: Reader, node: SrcNode | undefined, path: string, at?: Pos): LineDescription | undefined {
  const spec = GEOMETRY_SPECS[kind];
  const g = reader.object(node, path, `a ${kind} description like ${spec.inner}`, at);
  if (!g) return undefined;
  let ok = g.checkKeys(geometryKeys(kind));
  const mat = readMaterial(g);
  const lossy = mat !== undefined && mat.conductivity !== Infinity;
  const needT = 'a thickness > 0 like "1oz" or "35um" (a lossy conductor needs one; "conductor": "perfect" allows 0)';
  // Each quantity: read and range-checked by itself; relations between them below.
  const q = (key: string): number | undefined => {
    switch (key) {
      case 'thickness': {
        const t = g.quantity('thickness', { dim: 'thickness', range: NON_NEGATIVE, example: '1oz' });
        if (t === 0 && lossy) return g.reader.fail(g.keyPath('thickness'), g.get('thickness'), needT, g.pos);
        return t;
      }
      case 'shieldThickness':
        return g.optQuantity('shieldThickness', { dim: 'length', range: POSITIVE, example: '0.1mm' }, 0);
      default:
        return g.quantity(key, POS_LENGTH(key === 'height' || key === 'width' ? '5mil' : '1mm'));
    }
  };
  const v: Record<string, number | undefined> = {};
  for (const k of [...spec.keys, ...(spec.optional ?? [])]) v[k] = q(k);
  if (!ok || !mat || Object.values(v).some((x) => x === undefined)) return undefined;
  const n = v as Record<string, number>;

  // Relations the formulas need (each reported at the key that breaks it).
  const relation = (key: string, holds: boolean, expected: string) => {
    if (holds) return;
    ok = false;
    g.reader.fail(g.keyPath(key), g.get(key), expected, g.pos);
  };
  if (kind === 'stripline') {
    relation('thickness', n.thickness < n.planeSpacing, `a thickness less than planeSpacing ${formatSI(n.planeSpacing, 'm')} (the strip sits between the planes)`);
  }
  if (kind === 'coax') {
    relation('shieldDiameter', n.shieldDiameter > n.innerDiameter, `a shield diameter larger than innerDiameter ${formatSI(n.innerDiameter, 'm')}`);
  }
  if (kind === 'twoWire') {
    relation('spacing', n.spacing > n.diameter, `a centre-to-centre spacing larger than the wire diameter ${formatSI(n.diameter, 'm')} (the wires may not touch)`);
  }
  if (!ok) return undefined;

  const loss = { lossTangent: mat.lossTangent, at: mat.at, conductivity: mat.conductivity, roughness: mat.roughness };
  const inputs: Record<string, number | string> = { ...n, er: mat.er, lossTangent: mat.lossTangent, at: mat.at, conductivity: mat.conductivity, conductor: mat.conductorName };
  if (mat.roughness > 0) inputs.roughness = mat.roughness;
  if (inputs.shieldThickness === 0) delete inputs.shieldThickness;
  try {
    let b;
    if (kind === 'microstrip') b = fromMicrostrip({ width: n.width, height: n.height, thickness: n.thickness, er: mat.er, ...loss });
    else if (kind === 'stripline') b = fromStripline({ width: n.width, planeSpacing: n.planeSpacing, thickness: n.thickness, er: mat.er, ...loss });
    else if (kind === 'coax') b = fromCoax({ innerDiameter: n.innerDiameter, shieldDiameter: n.shieldDiameter, er: mat.er, shieldThickness: n.shieldThickness || undefined, ...loss });
    else b = fromTwoWire({ diameter: n.diameter, spacing: n.spacing, er: mat.er, ...loss });
    for (const w of b.warnings) g.reader.warn(g.path, g.node, `a description inside the model's range of validity — ${w}`, g.pos);
    return {
      form: kind,
      line: b.line,
      z0: b.z0,
      epsEff: b.epsEff,
      delayPerMeter: b.delayPerMeter,
      at: mat.at,
      conductivity: b.conductivity,
      maxFrequency: b.maxFrequency,
      inputs,
      warnings: b.warnings,
    };
  } catch (e) {
    // The checks above should leave nothing for the builders to refuse; if they do, say so here.
    return g.reader.fail(g.path, g.node, `a ${kind} the line models accept (${(e as Error).message})`, g.pos);
  }
}

/** The datasheet form: z0, velocity or delay, attenuation points [{at, loss}], optional known rdc. */
function readDatasheet(o: Obj): LineDescription | undefined {
  const z0 = o.quantity('z0', { dim: 'resistance', range: POSITIVE, example: '50ohm' });
  let velocity: number | undefined;
  let delay: number | undefined;
  // v ≤ c0 (ε′ = (c0/v)² ≥ 1): the datasheet fit takes the line's permittivity from its velocity.
  const faster = (v: number) => v > SPEED_OF_LIGHT * (1 + 1e-12);
  if (o.has('velocity')) {
    velocity = o.quantity('velocity', { dim: 'velocity', range: POSITIVE });
    if (velocity !== undefined && faster(velocity)) velocity = o.reader.fail(o.keyPath('velocity'), o.get('velocity'), 'a velocity no faster than light (≤ 1c)', o.pos);
  } else {
    delay = o.quantity('delay', { dim: 'delayPerLength', range: POSITIVE });
    if (delay !== undefined && faster(1 / delay)) delay = o.reader.fail(o.keyPath('delay'), o.get('delay'), 'a delay per length of at least 3.336ns/m (84.7ps/in; no faster than light)', o.pos);
  }
  const rdc = o.optQuantity('rdc', { dim: 'resistancePerLength', range: NON_NEGATIVE, example: '0.02ohm/m' });
  const points = readAttenuation(o);
  if (z0 === undefined || (velocity === undefined && delay === undefined) || rdc === undefined || !points) return undefined;
  try {
    const d = fromDatasheet({ z0, velocity, delay, attenuation: points, rdc: rdc ?? undefined });
    for (const w of d.warnings) o.reader.warn(o.keyPath('attenuation'), o.get('attenuation'), `attenuation points the loss model fits — ${w}`, o.pos);
    const inputs: Record<string, number | string> = { z0, ...(velocity !== undefined ? { velocity } : { delay: delay! }) };
    if (rdc !== null) inputs.rdc = rdc;
    const at = Math.exp(points.reduce((s, p) => s + Math.log(p.at), 0) / points.length);
    return { form: 'datasheet', line: d.line, z0: d.z0, epsEff: d.epsEff, delayPerMeter: d.delayPerMeter, at, inputs, fit: d.fit, warnings: d.warnings };
  } catch (e) {
    return o.reader.fail(o.path, o.node, `a datasheet line the fit accepts (${(e as Error).message})`, o.pos);
  }
}

/** "attenuation": [{ "at": "10MHz", "loss": "4.3dB/100m" }, ...], at least one point, each at a different frequency. */
function readAttenuation(o: Obj): { at: number; loss: number }[] | undefined {
  const example = '[{"at": "10MHz", "loss": "4.3dB/100m"}, {"at": "100MHz", "loss": "14dB/100m"}]';
  const seq = o.reader.list(o.get('attenuation'), o.keyPath('attenuation'), `a list of attenuation points like ${example}`, o.pos);
  if (!seq) return undefined;
  if (seq.items.length === 0) return o.reader.fail(o.keyPath('attenuation'), seq, `at least one attenuation point, like ${example}`, o.pos);
  const out: { at: number; loss: number }[] = [];
  const seen = new Map<number, string>();
  let ok = true;
  for (const it of Obj.items(seq, o.keyPath('attenuation'))) {
    const p = o.reader.object(it.node, it.path, 'an attenuation point like {"at": "100MHz", "loss": "14dB/100m"}', seq.pos);
    if (!p) {
      ok = false;
      continue;
    }
    ok = p.checkKeys(['at', 'loss']) && ok;
    const at = p.quantity('at', { dim: 'frequency', range: POSITIVE, example: '100MHz' });
    const loss = p.quantity('loss', { dim: 'attenuationPerLength', range: POSITIVE, example: '14dB/100m' });
    if (at === undefined || loss === undefined) {
      ok = false;
      continue;
    }
    const prev = seen.get(at);
    if (prev !== undefined) {
      o.reader.fail(p.keyPath('at'), p.get('at'), `a frequency not given twice (${prev} is also at ${formatSI(at, 'Hz')})`, p.pos);
      ok = false;
      continue;
    }
    seen.set(at, it.path);
    out.push({ at, loss });
  }
  return ok ? out : undefined;
}

/** The LineRLGC the engine gets from a description: DC R′ and G′, high-frequency L′ and C′, and the wideband model. */
export function lineParams(d: LineDescription): LineParams {
  return { r: d.line.rdc, l: d.line.lInf, g: d.line.gdc, c: d.line.cInf, wideband: d.line };
}

function geometryForm(kind: GeometryKind): LineForm {
  return {
    id: kind,
    required: [kind],
    losses: false,
    example: `{"${kind}": ${GEOMETRY_SPECS[kind].inner}}`,
    build: (o) => {
      const d = readGeometry(kind, o);
      return d && lineParams(d);
    },
  };
}

const DATASHEET_OPTIONAL = ['rdc'] as const;

/** The new entries of LINE_FORMS (src/scenario/lines.ts). */
export const WIDEBAND_FORMS: readonly LineForm[] = [
  geometryForm('microstrip'),
  geometryForm('stripline'),
  geometryForm('coax'),
  geometryForm('twoWire'),
  {
    id: 'z0+delay+attenuation',
    required: ['z0', 'delay', 'attenuation'],
    optional: DATASHEET_OPTIONAL,
    losses: false,
    example: '{"z0": "50ohm", "delay": "5.05ns/m", "attenuation": [{"at": "100MHz", "loss": "14dB/100m"}]}',
    build: (o) => {
      const d = readDatasheet(o);
      return d && lineParams(d);
    },
  },
  {
    id: 'z0+velocity+attenuation',
    required: ['z0', 'velocity', 'attenuation'],
    optional: DATASHEET_OPTIONAL,
    losses: false,
    example: '{"z0": "50ohm", "velocity": "0.66c", "attenuation": [{"at": "100MHz", "loss": "14dB/100m"}]}',
    build: (o) => {
      const d = readDatasheet(o);
      return d && lineParams(d);
    },
  },
];

/**
 * The full description of a LINE node that uses one of the wideband forms (undefined for the
 * constant forms, or when the node has problems; those go into the reader's Problems).
 * Call it on a node the scenario loader has accepted.
 */
export function describeLineNode(reader: Reader, node: SrcNode | undefined, path: string): LineDescription | undefined {
  if (!node || node.type !== 'map') return undefined;
  const o = new Obj(node, path, reader);
  for (const kind of Object.keys(GEOMETRY_SPECS) as GeometryKind[]) if (o.has(kind)) return readGeometry(kind, o);
  if (o.has('attenuation')) return readDatasheet(o);
  return undefined;
}
