// The `line` report as text (one block per line, quantities down, frequencies across, aligned) and
// as JSON (the same numbers in SI units).
import { INCH } from '../../sim/lines/constants.js';
import { formatSI } from '../units.js';
import { alignColumns as alignRows, type Align } from '../text/columns.js';
import type { CoupledReport } from './coupled.js';
import type { FrequencyRow, LineReport } from './evaluate.js';

export { alignColumns as alignRows } from '../text/columns.js';

const si = (v: number, unit: string, digits = 4) => (Number.isFinite(v) ? formatSI(v, unit, digits) : `${v > 0 ? '' : '−'}∞ ${unit}`);
const num = (v: number, digits = 4) => (v === 0 ? '0' : Math.abs(v) >= 1e-3 && Math.abs(v) < 1e6 ? String(Number(v.toPrecision(digits))) : v.toExponential(digits - 1));
const dash = '—';

function complexOhm(z: FrequencyRow['z0']): string {
  if (!z) return '∞';
  const re = num(z.re);
  if (Math.abs(z.im) < 5e-5 * Math.abs(z.re)) return `${re} ohm`;
  return `${re} ${z.im < 0 ? '−' : '+'} j${num(Math.abs(z.im), 3)} ohm`;
}

function frequencyLabel(f: number): string {
  return f === 0 ? 'DC' : si(f, 'Hz');
}

function lengthLabel(m: number): string {
  const inches = m / INCH;
  return `${si(m, 'm')} (${num(inches, 4)} in)`;
}

/** Text block for one line. */
export function formatLineReport(r: LineReport): string {
  const out: string[] = [];
  const head = [r.form === 'constant' ? 'constant R′ L′ G′ C′' : r.form, r.origin];
  if (r.lineName && r.lineName !== r.name) head.push(`line "${r.lineName}"`);
  if (r.length !== null) head.push(lengthLabel(r.length));
  out.push(`${r.name} — ${head.join(', ')}`);

  const where = r.at === null ? '' : r.form === 'datasheet' ? ` (as given, at ${si(r.at, 'Hz')})` : ` (quasi-static, at ${si(r.at, 'Hz')})`;
  out.push(`  Z0 ${num(r.z0)} ohm, ε_eff ${num(r.epsEff)}, delay ${si(r.delayPerMeter, 's')}/m = ${si(r.delayPerInch, 's')}/in${where}`);
  const hf = r.highFrequency;
  if (r.form !== 'constant') {
    out.push(`  high-frequency limit: Z0∞ ${num(hf.z0)} ohm, v∞ ${num(hf.velocity / 299_792_458, 4)}c, ${si(hf.delayPerMeter, 's')}/m — no part of an edge travels faster`);
  }
  if (r.inputs) {
    const shown = Object.entries(r.inputs)
      .filter(([k]) => k !== 'conductor' && k !== 'conductivity')
      .map(([k, v]) => `${k} ${typeof v === 'string' ? v : inputValue(k, v)}`);
    out.push(`  inputs: ${shown.join(', ')}`);
  }
  if (r.conductor !== null) {
    out.push(`  conductor: ${r.conductor}${r.conductivity !== null ? ` (${si(r.conductivity, 'S/m')})` : ' (no conductor loss)'}${r.maxFrequency !== null ? `; quasi-TEM model up to about ${si(r.maxFrequency, 'Hz', 3)}` : ''}`);
  }
  if (r.fit) {
    const f = r.fit;
    out.push(
      `  datasheet fit: R_dc ${si(f.rdc, 'ohm/m')}, skin coefficient ${num(f.skinK, 4)} ohm/(m·√(rad/s)), tanδ ${num(f.lossTangent, 4)}; fitted ${f.fitted.join(', ') || 'nothing'}; error max ${num(f.maxRelError * 100, 3)} %, rms ${num(f.rmsRelError * 100, 3)} %`,
    );
    const pts = f.points.map((p) => [`    ${si(p.at, 'Hz')}`, `given ${num(p.given, 4)} dB/m`, `model ${num(p.model, 4)} dB/m`, `${p.relError >= 0 ? '+' : '−'}${num(Math.abs(p.relError) * 100, 3)} %`]);
    out.push(...alignRows(pts, ['l', 'r', 'r', 'r']));
  }

  const rows: string[][] = [['', ...r.rows.map((x) => frequencyLabel(x.f))]];
  const add = (label: string, cell: (x: FrequencyRow) => string) => rows.push([`  ${label}`, ...r.rows.map(cell)]);
  add('R′', (x) => si(x.r, 'ohm/m'));
  add('L′', (x) => si(x.l, 'H/m'));
  add('G′', (x) => si(x.g, 'S/m'));
  add('C′', (x) => si(x.c, 'F/m'));
  add('Z0 √(Z′/Y′)', (x) => complexOhm(x.z0));
  add('ε_eff (from β)', (x) => (x.epsEff === null ? dash : num(x.epsEff)));
  add('attenuation', (x) => `${num(x.attenuationDbPerM)} dB/m`);
  add('', (x) => `${num(x.attenuationDbPerIn)} dB/in`);
  if (r.length !== null) add(`over ${si(r.length, 'm')}`, (x) => `${num(x.lossDb ?? 0)} dB`);
  add('skin depth', (x) => (x.skinDepth === null ? dash : si(x.skinDepth, 'm')));
  rows[0][0] = '';
  out.push(...alignRows(rows, ['l', ...r.rows.map((): Align => 'r')]));
  // Out-of-range warnings are printed once per line model, by the caller, with their place in the file.
  return out.join('\n') + '\n';
}

function inputValue(key: string, v: number): string {
  if (key === 'er' || key === 'lossTangent') return num(v);
  if (key === 'at') return si(v, 'Hz');
  if (key === 'z0') return `${num(v)} ohm`;
  if (key === 'velocity') return `${num(v / 299_792_458)}c`;
  if (key === 'delay') return `${si(v, 's')}/m`;
  if (key === 'rdc') return si(v, 'ohm/m');
  return si(v, 'm');
}

/** Several line reports, separated by blank lines. */
export function formatLineReports(reports: readonly LineReport[]): string {
  return reports.map(formatLineReport).join('\n');
}

/** JSON for the reports: SI numbers; values JSON cannot hold (∞) become null. Coupled sections under "coupled", when there are any. */
export function lineReportsToJson(reports: readonly LineReport[], frequencies: readonly number[], coupled: readonly CoupledReport[] = []): string {
  const body = coupled.length ? { frequencies: [0, ...frequencies], lines: reports, coupled } : { frequencies: [0, ...frequencies], lines: reports };
  return JSON.stringify(body, (_k, v: unknown) => (typeof v === 'number' && !Number.isFinite(v) ? null : v), 2) + '\n';
}
