// Touchstone writer, version 1.1 or 2.0, for S-, Y- or Z-parameters (IBIS Open Forum, Touchstone
// File Format Specification Rev 1.1 and Version 2.0).
//  - 1.1: `# GHz S RI R 50`, one reference resistance for every port, Y and Z normalized to it;
//    1- and 2-port sets on one line (2-port order 11 21 12 22); larger networks one matrix row per
//    line, wrapped after four pairs.
//  - 2.0: [Version] 2.0, the option line, [Number of Ports], [Two-Port Data Order] 12_21 (2-port),
//    [Number of Frequencies], [Reference] when the ports differ, [Network Data] one matrix row per
//    line, [End]. Y and Z in siemens and ohms, not normalized.
// Both specifications allow only ASCII (codes 0x20–0x7E and tabs): comments are transliterated.
import type { NetworkData } from '../../sim/sparams/network.js';
import { UNIT_SCALE, type FrequencyUnit, type NumberFormat } from './options.js';

export interface WriteOptions {
  version: '1.1' | '2.0';
  /** Number format (default RI). */
  format?: NumberFormat;
  /** Frequency unit (default GHz). */
  unit?: FrequencyUnit;
  /** Comment lines written at the top, without "!". */
  comments?: readonly string[];
}

/** `<base>.s<n>p`, the conventional name for both versions (2.0 also allows others). */
export function touchstoneFileName(base: string, ports: number): string {
  return `${base}.s${ports}p`;
}

const ASCII: Record<string, string> = { 'Ω': 'ohm', 'µ': 'u', 'μ': 'u', '–': '-', '—': '-', '−': '-', '·': '*', '×': 'x', '°': 'deg', '≤': '<=', '≥': '>=', '→': '->', '±': '+/-', '’': "'", '‘': "'", '“': '"', '”': '"', 'ε': 'eps', 'π': 'pi', '√': 'sqrt' };

/** Text with every character outside printable ASCII replaced (Ω → ohm, – → -, others → ?). */
export function asciiOnly(text: string): string {
  let out = '';
  for (const ch of text) {
    const c = ch.codePointAt(0) as number;
    out += c >= 0x20 && c <= 0x7e ? ch : (ASCII[ch] ?? (ch === '\t' ? ' ' : '?'));
  }
  return out;
}

function num(x: number): string {
  return x === 0 ? '0' : x.toExponential(11);
}

function pair(re: number, im: number, format: NumberFormat): string {
  if (format === 'RI') return `${num(re)} ${num(im)}`;
  const mag = Math.hypot(re, im);
  const deg = (Math.atan2(im, re) * 180) / Math.PI;
  const first = format === 'DB' ? (mag === 0 ? -400 : 20 * Math.log10(mag)) : mag;
  return `${num(first)} ${Number(deg.toPrecision(12))}`;
}

/** The network as Touchstone text. Throws RangeError for what the version cannot hold. */
export function formatTouchstone(net: NetworkData, opts: WriteOptions): string {
  const format = opts.format ?? 'RI';
  const unit = opts.unit ?? 'GHz';
  const n = net.ports;
  const r0 = net.reference[0];
  const sameRef = net.reference.every((r) => r === r0);
  if (opts.version === '1.1' && !sameRef) throw new RangeError('Touchstone 1.1 has one reference resistance for all ports; write version 2.0 for per-port references');
  const out: string[] = (opts.comments ?? []).map((c) => `! ${asciiOnly(c)}`);
  const v2 = opts.version === '2.0';
  if (v2) out.push('[Version] 2.0');
  out.push(`# ${unit} ${net.kind} ${format} R ${r0}`);
  if (v2) {
    out.push(`[Number of Ports] ${n}`);
    if (n === 2) out.push('[Two-Port Data Order] 12_21');
    out.push(`[Number of Frequencies] ${net.freq.length}`);
    if (!sameRef) out.push(`[Reference] ${Array.from(net.reference).join(' ')}`);
    out.push('[Network Data]');
  }
  // 1.1 normalizes Y and Z to R (Touchstone 1.1, "Option Line")
  const norm = v2 ? 1 : net.kind === 'Z' ? 1 / r0 : net.kind === 'Y' ? r0 : 1;
  const scale = UNIT_SCALE[unit];
  for (let k = 0; k < net.freq.length; k++) {
    const f = String(Number((net.freq[k] / scale).toPrecision(15)));
    const at = (i: number, j: number) => pair(norm * net.data[2 * ((k * n + i) * n + j)], norm * net.data[2 * ((k * n + i) * n + j) + 1], format);
    if (n === 1) out.push(`${f} ${at(0, 0)}`);
    else if (n === 2) out.push(v2 ? `${f} ${at(0, 0)} ${at(0, 1)} ${at(1, 0)} ${at(1, 1)}` : `${f} ${at(0, 0)} ${at(1, 0)} ${at(0, 1)} ${at(1, 1)}`);
    else
      for (let i = 0; i < n; i++) {
        const row = Array.from({ length: n }, (_, j) => at(i, j));
        const chunks = v2 ? [row] : Array.from({ length: Math.ceil(n / 4) }, (_, c) => row.slice(4 * c, 4 * c + 4));
        chunks.forEach((c, ci) => out.push(`${i === 0 && ci === 0 ? f + ' ' : ''}${c.join(' ')}${ci === 0 ? ` ! row ${i + 1}` : ''}`));
      }
  }
  if (v2) out.push('[End]');
  return out.join('\n') + '\n';
}
