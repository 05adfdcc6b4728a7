// From a model file's data to a BufferModel for one corner. Corners (the standard's typ/min/max columns):
// 'typ' reads every typ column; 'min' (slow, weak) the min columns of the tables, waveforms, ramp and
// supply; 'max' (fast, strong) the max columns. NA falls back to typ. C_comp's min and max columns are
// its smallest and largest values, not a slow and a fast corner (the standard's rule; IBIS Open Forum
// reflector, A. Muranyi, "C_comp Max < C_comp Min", Sept. 2010): ladderwave pairs the largest C_comp with
// the slow corner and the smallest with the fast one (common practice: more capacitance, slower edge).
import { ivTable, type IvTable } from '../../sim/devices/iv-table.js';
import type { BufferKind, BufferModel } from '../../sim/devices/buffer.js';
import type { Fixture, VtWaveform } from '../../sim/devices/fixture.js';
import { expectedRampSwing, switchingFromRamp, type Ramp } from '../../sim/devices/ramp.js';
import { coefficientsFromWaveforms } from '../../sim/devices/waveform-fit.js';
import { formatIbisProblem, type IbisFileData, type IbisModelData, type IbisProblem, type IbisRow, type IbisTable, type IbisWaveformData, type Tmm } from './types.js';

export type Corner = 'typ' | 'min' | 'max';

/** Which pin or model of a file to use. */
export type IbisSelection = { component: string; pin: string } | { model: string };

export interface IbisBuffer {
  model: BufferModel;
  /** The file's data for the chosen model (for printing its tables). */
  data: IbisModelData;
  corner: Corner;
  /** Warnings of the file and of this model (ramp consistency, unused fixture parts), formatted. */
  warnings: string[];
  /** Parts of the file that were not used, "line N: what". */
  ignored: string[];
}

export function pick(v: Tmm, corner: Corner): number {
  const x = corner === 'typ' ? v.typ : v[corner];
  return x ?? v.typ;
}

function column(rows: IbisRow[], corner: Corner): IvTable {
  const useTyp = corner !== 'typ' && rows.every((r) => r[corner] === undefined);
  return ivTable(rows.map((r) => [r.x, useTyp ? r.typ : pick(r, corner)] as [number, number]));
}

function cComp(v: Tmm, corner: Corner): number {
  const values = [v.typ, v.min, v.max].filter((x): x is number => x !== undefined);
  return corner === 'typ' ? v.typ : corner === 'min' ? Math.max(...values) : Math.min(...values);
}

const KINDS: Readonly<Record<string, BufferKind>> = { Input: 'input', Output: 'output', 'I/O': 'io', '3-state': '3-state', Open_drain: 'open-drain' };

function waveform(w: IbisWaveformData, corner: Corner): VtWaveform {
  const vFix = corner === 'min' ? (w.vFixtureMin ?? w.vFixture) : corner === 'max' ? (w.vFixtureMax ?? w.vFixture) : w.vFixture;
  const fixture: Fixture = { r: w.rFixture, v: vFix, c: w.cFixture ?? 0 };
  const useTyp = corner !== 'typ' && w.rows.every((r) => r[corner] === undefined);
  return { fixture, t: Float64Array.from(w.rows, (r) => r.x), v: Float64Array.from(w.rows, (r) => (useTyp ? r.typ : pick(r, corner))) };
}

function resolveModel(file: IbisFileData, sel: IbisSelection, corner: Corner): { data: IbisModelData; pkg?: { r: number; l: number; c: number }; pinLine?: number } {
  if ('model' in sel) {
    const data = file.models.get(sel.model);
    if (!data) throw new RangeError(`${file.file}: no model "${sel.model}" — the file defines ${[...file.models.keys()].map((k) => `"${k}"`).join(', ') || 'no models'}`);
    return { data };
  }
  const comp = file.components.get(sel.component);
  if (!comp) throw new RangeError(`${file.file}: no component "${sel.component}" — the file defines ${[...file.components.keys()].map((k) => `"${k}"`).join(', ') || 'no components'}`);
  const pin = comp.pins.get(sel.pin);
  if (!pin) throw new RangeError(`${file.file}: component "${sel.component}" has no pin "${sel.pin}" — its pins are ${[...comp.pins.keys()].slice(0, 20).join(', ')}`);
  const data = file.models.get(pin.model);
  if (!data) throw new RangeError(`${file.file}:${pin.line}: pin "${pin.name}" is a ${pin.model} pin, not a buffer`);
    // a pin's own R/L/C (one column) wins over the component's [Package] at the corner
  const fromPackage = (v: Tmm | undefined) => (v ? pick(v, corner) : 0);
  return { data, pkg: { r: pin.r ?? fromPackage(comp.pkg.r), l: pin.l ?? fromPackage(comp.pkg.l), c: pin.c ?? fromPackage(comp.pkg.c) }, pinLine: pin.line };
}

function tableOf(t: IbisTable | undefined, corner: Corner): IvTable | undefined {
  return t ? column(t.rows, corner) : undefined;
}

/** The BufferModel of a pin or model of a parsed file at a corner, with its switching coefficients. */
export function ibisBuffer(file: IbisFileData, sel: IbisSelection, corner: Corner = 'typ'): IbisBuffer {
  const { data, pkg } = resolveModel(file, sel, corner);
  const warnings: IbisProblem[] = [...file.warnings];
  const model: BufferModel = {
    name: data.name,
    kind: KINDS[data.modelType!],
    supply: pick(data.voltageRange!, corner),
    ground: 0,
    pullup: data.modelType === 'Open_drain' || data.modelType === 'Input' ? undefined : tableOf(data.pullup, corner),
    pulldown: data.modelType === 'Input' ? undefined : tableOf(data.pulldown, corner),
    gndClamp: data.gndClamp ? { kind: 'table', table: column(data.gndClamp.rows, corner) } : undefined,
    powerClamp: data.powerClamp ? { kind: 'table', table: column(data.powerClamp.rows, corner) } : undefined,
    cComp: cComp(data.cComp!, corner),
    pkg: pkg && (pkg.r > 0 || pkg.l > 0 || pkg.c > 0) ? pkg : undefined,
  };
  if (data.cComp && data.cComp.min !== undefined && data.cComp.max !== undefined && !(data.cComp.min <= data.cComp.typ && data.cComp.typ <= data.cComp.max)) {
    warnings.push({ file: file.file, line: data.cCompLine ?? data.line, keyword: 'Model', message: `C_comp of "${data.name}": the min column should hold the smallest value and max the largest; ladderwave used the smallest and largest of the three` });
  }
  if (model.kind !== 'input') {
    model.switching = switchingFor(file, data, model, corner, warnings);
  }
  return {
    model,
    data,
    corner,
    warnings: warnings.map(formatIbisProblem),
    ignored: file.ignored.map((x) => `line ${x.line}: ${x.what}`),
  };
}

function switchingFor(file: IbisFileData, data: IbisModelData, model: BufferModel, corner: Corner, warnings: IbisProblem[]): BufferModel['switching'] {
  if (data.ramp) checkRamp(file, data, model, corner, warnings);
  for (const w of [...data.rising, ...data.falling]) {
    const unused = (['lFixture', 'rDut', 'lDut', 'cDut'] as const).filter((k) => w[k] !== undefined && w[k] !== 0);
    if (unused.length) warnings.push({ file: file.file, line: w.line, keyword: 'Waveform', message: `${unused.map((k) => k.replace(/([A-Z])/, '_$1').replace(/^./, (c) => c.toUpperCase())).join(', ')} not used: the fixture is read as R_fixture to V_fixture with C_fixture` });
  }
  if (data.rising.length > 0 && data.falling.length > 0) {
    const rising = coefficientsFromWaveforms(model, data.rising.map((w) => waveform(w, corner)));
    const falling = coefficientsFromWaveforms(model, data.falling.map((w) => waveform(w, corner)));
    return { rising: rising.curve, falling: falling.curve, source: `[Rising Waveform] ×${data.rising.length}, [Falling Waveform] ×${data.falling.length} (${rising.method})` };
  }
  const ramp = data.ramp!;
  const col = (c: NonNullable<typeof ramp.rising>) => (corner === 'typ' ? c.typ : (c[corner] ?? c.typ));
  const r: Ramp = { rising: { dv: col(ramp.rising!)[0], dt: col(ramp.rising!)[1] }, falling: { dv: col(ramp.falling!)[0], dt: col(ramp.falling!)[1] }, rLoad: ramp.rLoad };
  return switchingFromRamp(model, r);
}

/**
 * The IBIS Quality Specification's check that a ramp agrees with the I/V tables: the ramp's 20–80 % dV
 * into R_load should be 0.6 × the settled swing the tables give into the same load, within 5 %.
 */
function checkRamp(file: IbisFileData, data: IbisModelData, model: BufferModel, corner: Corner, warnings: IbisProblem[]): void {
  const ramp = data.ramp!;
  for (const [edge, rising] of [[ramp.rising, true], [ramp.falling, false]] as const) {
    if (!edge) continue;
    const dv = (corner === 'typ' ? edge.typ : (edge[corner] ?? edge.typ))[0];
    const expected = expectedRampSwing(model, rising, ramp.rLoad);
    if (Math.abs(dv - expected) > 0.05 * expected) {
      warnings.push({
        file: file.file,
        line: edge.line,
        keyword: 'Ramp',
        message: `dV/dt_${rising ? 'r' : 'f'} (${corner}): dV = ${dv.toFixed(4)} V, but the I/V tables give ${expected.toFixed(4)} V (0.6 × the swing into R_load = ${ramp.rLoad} Ω) — more than the 5 % the quality checklist allows`,
      });
    }
  }
}
