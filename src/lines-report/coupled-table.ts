// The coupled-section report as text: the matrices side by side, the modes, and the pair's numbers.
import { C0, INCH } from '../../sim/lines/constants.js';
import { alignColumns, type Align } from '../text/columns.js';
import { formatSI } from '../units.js';
import type { CoupledReport } from './coupled.js';

const si = (v: number, unit: string, digits = 4) => formatSI(v, unit, digits);
const num = (v: number, digits = 4) => (v === 0 ? '0' : Math.abs(v) >= 1e-3 && Math.abs(v) < 1e6 ? String(Number(v.toPrecision(digits))) : v.toExponential(digits - 1));
const signed = (v: number) => (v < 0 ? `−${num(-v, 3)}` : `+${num(v, 3)}`);

function inputLabel(key: string, v: number): string {
  if (key === 'er') return `er ${num(v)}`;
  if (key.startsWith('z')) return `${key} ${num(v)} ohm`;
  if (key.startsWith('delay')) return `${key} ${si(v, 's')}/m (${si(v * INCH, 's')}/in)`;
  return `${key} ${si(v, 'm')}`;
}

/** Rows of k×k matrices side by side, each titled on its first row, each entry with its unit. */
function matrixRows(titles: string[], mats: number[][][], units: string[]): string[][] {
  const k = mats[0].length;
  const rows: string[][] = [];
  for (let r = 0; r < k; r++) {
    rows.push(['  ', ...mats.flatMap((m, n) => [r === 0 ? titles[n] : '', ...m[r].map((x) => (x === 0 ? '0' : si(x, units[n])))])]);
  }
  return rows;
}

export function formatCoupledReport(r: CoupledReport): string {
  const out: string[] = [];
  const form = r.form.replace(/^coupled-/, 'coupled ');
  out.push(`${r.name} — ${form}, ${r.k} conductors, ${r.origin}`);
  const shown = Object.entries(r.inputs).map(([k, v]) => inputLabel(k, v));
  if (shown.length) out.push(`  inputs: ${shown.join(', ')}`);
  const mats = [r.l, r.c];
  const titles = ['L′ per metre', '   C′ per metre (Maxwell)'];
  const units = ['H', 'F'];
  if (r.r) {
    mats.push(r.r);
    titles.push('   R′ per metre');
    units.push('ohm');
  }
  if (r.g) {
    mats.push(r.g);
    titles.push('   G′ per metre');
    units.push('S');
  }
  const align: Align[] = ['l', ...titles.flatMap((): Align[] => ['l', ...Array<Align>(r.k).fill('r')])];
  out.push(...alignColumns(matrixRows(titles, mats, units), align));
  const between: string[] = [];
  for (let i = 0; i < r.k; i++) for (let j = i + 1; j < r.k; j++) between.push(`${i + 1}–${j + 1} ${si(r.capacitanceBetween[i][j], 'F')}/m`);
  out.push(`  as capacitors: to the return ${r.capacitanceToReturn.map((x) => `${si(x, 'F')}/m`).join(', ')}; between ${between.join(', ')}`);
  out.push('  modes, fastest first:');
  const modeRows = r.modes.map((m) => [
    `    ${m.label}`,
    `(${m.pattern.map(signed).join(', ')})`,
    `v ${num(m.velocity / C0)}c`,
    `${si(m.delayPerMeter * INCH, 's')}/in`,
    `ε_eff ${num(m.epsEff)}`,
    `sees ${m.impedance.map((z) => (z === null ? '—' : `${num(z)} ohm`)).join(' / ')}`,
  ]);
  out.push(...alignColumns(modeRows, ['l', 'l', 'r', 'r', 'r', 'l']));
  if (r.k > 2) out.push(`  Z_C: ${r.zc.map((row) => `[${row.map((z) => num(z)).join(', ')}]`).join(' ')} ohm`);
  for (const p of r.pairs) {
    const who = r.k > 2 ? ` (conductors ${p.i + 1}, ${p.j + 1}; others carrying no current)` : '';
    out.push(`  Z_odd ${num(p.zOdd)} ohm, Z_even ${num(p.zEven)} ohm, Z_diff ${num(p.zDiff)} ohm, Z_comm ${num(p.zComm)} ohm${who}${p.symmetric || r.k > 2 ? '' : ' (not a symmetric pair: odd and even are not its modes; Z_odd = Z_diff/2, Z_even = 2·Z_comm)'}`);
    // a homogeneous pair has L_m/L = C_m/C exactly; print its K_f as 0, not as round-off
    const kf = Math.abs(p.kf) <= 1e-9 * (Math.abs(p.inductiveRatio) + Math.abs(p.capacitiveRatio)) ? 0 : p.kf;
    const far = kf === 0 ? 'homogeneous: no far-end crosstalk' : 'far end ≈ K_f·TD·dV/dt';
    out.push(`  K_b ${num(p.kb)} (near end ≈ ${num(p.kb * 100, 3)} % of the aggressor's step), K_f ${num(kf)} (${far}); L_m/L ${num(p.inductiveRatio)}, C_m/C ${num(p.capacitiveRatio)}`);
  }
  out.push(`  fastest mode ${num(r.fastestVelocity / C0)}c (${si(r.fastestVelocity, 'm/s')}): it sets the time step of a run (Courant)${r.maxFrequency !== null ? `; quasi-TEM model up to about ${si(r.maxFrequency, 'Hz', 3)}` : ''}`);
  out.push('  weak-coupling estimates for matched lines; engineering estimates, not measurements');
  // Warnings are printed once, by the caller (on stderr), as for single lines.
  return out.join('\n') + '\n';
}
