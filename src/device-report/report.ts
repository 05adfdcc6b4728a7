// What `ladderwave device` shows of a buffer model: its I/V tables at the chosen corner in the pin's
// frame (current into the pin against pin voltage), and each switching waveform into its fixture with
// the model's own reproduction (the device run into that fixture) and the largest difference.
import { currentParts, type BufferModel } from '../../sim/devices/buffer.js';
import { runIntoFixture, waveformAt, type Fixture } from '../../sim/devices/fixture.js';
import { rampWaveform } from '../../sim/devices/ramp.js';
import { pick, type IbisBuffer } from '../ibis/buffer.js';
import type { IbisWaveformData } from '../ibis/types.js';

export interface IvCurveReport {
  name: 'pull-up' | 'pull-down' | 'GND clamp' | 'POWER clamp';
  /** Pin voltage (V) and current into the pin (A), pull-up and pull-down fully on. */
  v: Float64Array;
  i: Float64Array;
}

export interface WaveformReport {
  rising: boolean;
  fixture: Fixture;
  /** Where the waveform comes from: the file's waveform table, or the ramp turned into a linear edge. */
  from: 'waveform' | 'ramp';
  line: number;
  t: Float64Array;
  file: Float64Array;
  model: Float64Array;
  /** Largest |model − file| as a fraction of the waveform's swing. */
  worst: number;
}

export interface DeviceReport {
  buffer: IbisBuffer;
  curves: IvCurveReport[];
  waveforms: WaveformReport[];
}

/** Every table voltage of a curve, mapped to the pin's frame and sorted. */
function curve(m: BufferModel, name: IvCurveReport['name'], xs: Float64Array | undefined, supplyRelative: boolean): IvCurveReport | undefined {
  if (!xs) return undefined;
  const v = Float64Array.from(xs, (x) => (supplyRelative ? m.supply - x : x + m.ground)).sort();
  const i = v.map((p) => {
    const parts = currentParts(m, p, 1, 1);
    return name === 'pull-up' ? parts.pullup : name === 'pull-down' ? parts.pulldown : name === 'GND clamp' ? parts.gndClamp : parts.powerClamp;
  });
  return { name, v, i };
}

function tableVoltages(c: BufferModel['gndClamp']): Float64Array | undefined {
  return c?.kind === 'table' ? c.table.v : undefined;
}

function compare(m: BufferModel, rising: boolean, fixture: Fixture, t: Float64Array, v: Float64Array, from: WaveformReport['from'], line: number): WaveformReport {
  const end = t[t.length - 1];
  const run = runIntoFixture(m, rising, fixture, end, Math.min(end / 2000, 2e-12));
  const model = t.map((x) => waveformAt(run, x));
  const swing = Math.abs(v[v.length - 1] - v[0]) || 1;
  let worst = 0;
  for (let k = 0; k < t.length; k++) worst = Math.max(worst, Math.abs(model[k] - v[k]) / swing);
  return { rising, fixture, from, line, t, file: v, model, worst };
}

function fileWaveform(b: IbisBuffer, w: IbisWaveformData, rising: boolean): WaveformReport {
  const c = b.corner;
  const vFix = c === 'min' ? (w.vFixtureMin ?? w.vFixture) : c === 'max' ? (w.vFixtureMax ?? w.vFixture) : w.vFixture;
  const t = Float64Array.from(w.rows, (r) => r.x);
  const v = Float64Array.from(w.rows, (r) => pick(r, c));
  return compare(b.model, rising, { r: w.rFixture, v: vFix, c: w.cFixture ?? 0 }, t, v, 'waveform', w.line);
}

export function deviceReport(b: IbisBuffer): DeviceReport {
  const m = b.model;
  const curves = [
    curve(m, 'pull-up', m.pullup?.v, true),
    curve(m, 'pull-down', m.pulldown?.v, false),
    curve(m, 'GND clamp', tableVoltages(m.gndClamp), false),
    curve(m, 'POWER clamp', tableVoltages(m.powerClamp), true),
  ].filter((c): c is IvCurveReport => c !== undefined);
  const waveforms: WaveformReport[] = [];
  if (m.kind !== 'input') {
    if (b.data.rising.length > 0 && b.data.falling.length > 0) {
      for (const w of b.data.rising) waveforms.push(fileWaveform(b, w, true));
      for (const w of b.data.falling) waveforms.push(fileWaveform(b, w, false));
    } else if (b.data.ramp?.rising && b.data.ramp.falling) {
      const r = b.data.ramp;
      const col = (e: NonNullable<typeof r.rising>) => (b.corner === 'typ' ? e.typ : (e[b.corner] ?? e.typ));
      const ramp = { rising: { dv: col(r.rising!)[0], dt: col(r.rising!)[1] }, falling: { dv: col(r.falling!)[0], dt: col(r.falling!)[1] }, rLoad: r.rLoad };
      for (const rising of [true, false]) {
        const w = rampWaveform(m, rising, ramp);
        const n = 61;
        const t = Float64Array.from({ length: n }, (_, k) => (k * w.t[w.t.length - 1]) / (n - 1));
        waveforms.push(compare(m, rising, w.fixture, t, t.map((x) => waveformAt(w, x)), 'ramp', (rising ? r.rising! : r.falling!).line));
      }
    }
  }
  return { buffer: b, curves, waveforms };
}
