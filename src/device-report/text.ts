// The printed form of a device report: the model's numbers, warnings and ignored parts, its I/V tables
// in the pin's frame and its switching waveforms beside the model's reproduction.
import { alignColumns } from '../text/columns.js';
import type { DeviceReport } from './report.js';

const PREFIXES: Array<[number, string]> = [[1e9, 'G'], [1e6, 'M'], [1e3, 'k'], [1, ''], [1e-3, 'm'], [1e-6, 'µ'], [1e-9, 'n'], [1e-12, 'p'], [1e-15, 'f']];

/** 4 significant digits with an SI prefix: 0.0123 A → "12.30 mA". */
export function si(x: number, unit: string): string {
  if (x === 0 || !Number.isFinite(x)) return `${x} ${unit}`;
  const a = Math.abs(x);
  const [scale, p] = PREFIXES.find(([s]) => a >= s * 0.9995) ?? PREFIXES[PREFIXES.length - 1];
  return `${(x / scale).toPrecision(4)} ${p}${unit}`;
}

function header(r: DeviceReport): string[] {
  const b = r.buffer;
  const m = b.model;
  const lines = [
    `${b.data.name}: ${b.data.modelType} model, corner ${b.corner}`,
    `  supply ${si(m.supply, 'V')} (pull-up and POWER clamp tables are relative to it), ground 0 V`,
    `  C_comp ${si(m.cComp, 'F')}${m.pkg ? `; package R ${si(m.pkg.r, 'Ω')}, L ${si(m.pkg.l, 'H')}, C ${si(m.pkg.c, 'F')}` : '; no package parasitics'}`,
  ];
  if (m.switching) lines.push(`  switching coefficients from ${m.switching.source}`);
  lines.push('  currents are positive into the pin; results are engineering estimates');
  return lines;
}

export function formatDeviceReport(r: DeviceReport, ignored = true): string {
  const out = header(r);
  for (const w of r.buffer.warnings) out.push(`warning: ${w}`);
  if (ignored && r.buffer.ignored.length) {
    out.push('', `ignored (outside the subset ladderwave reads):`);
    for (const x of r.buffer.ignored) out.push(`  ${x}`);
  }
  for (const c of r.curves) {
    out.push('', `${c.name} (pin voltage, current into the pin):`);
    const rows = Array.from(c.v, (v, k) => [si(v, 'V'), si(c.i[k], 'A')]);
    out.push(...alignColumns([['V_pin', 'I'], ...rows], ['r', 'r']).map((l) => `  ${l}`));
  }
  for (const w of r.waveforms) {
    const title = `${w.rising ? 'rising' : 'falling'} ${w.from === 'ramp' ? 'ramp (linear edge)' : 'waveform'} (line ${w.line}) into ${si(w.fixture.r, 'Ω')} to ${si(w.fixture.v, 'V')}${w.fixture.c ? ` with ${si(w.fixture.c, 'F')}` : ''}`;
    out.push('', `${title}: model within ${(100 * w.worst).toFixed(2)} % of swing`);
    const step = Math.max(1, Math.floor(w.t.length / 12));
    const rows: string[][] = [];
    for (let k = 0; k < w.t.length; k += step) rows.push([si(w.t[k], 's'), si(w.file[k], 'V'), si(w.model[k], 'V')]);
    out.push(...alignColumns([['t', 'V (file)', 'V (model)'], ...rows], ['r', 'r', 'r']).map((l) => `  ${l}`));
  }
  return out.join('\n') + '\n';
}
