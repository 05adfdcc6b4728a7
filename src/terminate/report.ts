// The advisor's words and numbers: one row per option (worst value over the receivers for each
// metric), as an aligned terminal table, a Markdown report for design reviews and a JSON document for
// CI. Every number is an engineering estimate from the simulation, and the reports say so.
import { formatSI } from '../units.js';
import { alignColumns, type Align } from '../text/columns.js';
import type { Advice, OptionResult } from './advise.js';
import type { ReceiverNumbers } from './evaluate.js';

export interface OptionRow {
  rank: number;
  id: string;
  title: string;
  parts: string;
  pass: boolean;
  overshootPct: number | null;
  undershootPct: number | null;
  ringbackMarginV: number | null;
  settlingS: number | null;
  delayS: number | null;
  edgeS: number | null;
  powerLowW: number;
  powerHighW: number;
  worstReceiver: string;
  sims: number;
}

type Pick = (r: ReceiverNumbers) => number | null;

/** The worst over receivers (null when any receiver's value is missing). */
function worst(o: OptionResult, pick: Pick, larger = true): number | null {
  let acc: number | null = null;
  for (const r of o.outcome.receivers) {
    const v = pick(r);
    if (v === null) return null;
    acc = acc === null ? v : larger ? Math.max(acc, v) : Math.min(acc, v);
  }
  return acc;
}

export function partText(o: OptionResult): string {
  if (o.values.length === 0) return '—';
  return o.values.map((v, i) => `${formatSI(v, o.slots[i]?.kind === 'C' ? 'F' : 'Ω', 3)}`).join(', ');
}

export function optionRows(a: Advice): OptionRow[] {
  return a.options.map((o, k) => ({
    rank: k + 1,
    id: o.id,
    title: o.title,
    parts: partText(o),
    pass: o.score.pass,
    overshootPct: worst(o, (r) => r.overshootPct),
    undershootPct: worst(o, (r) => r.undershootPct),
    ringbackMarginV: worst(o, (r) => r.ringbackMarginV, false),
    settlingS: worst(o, (r) => r.settlingS),
    delayS: worst(o, (r) => r.delayS),
    edgeS: worst(o, (r) => (r.riseS === null ? r.fallS : r.fallS === null ? r.riseS : Math.max(r.riseS, r.fallS))),
    powerLowW: o.power.low,
    powerHighW: o.power.high,
    worstReceiver: a.facts.receivers[o.score.worst]?.name ?? '',
    sims: o.sims.search + o.sims.rounding + o.sims.monteCarlo,
  }));
}

const num = (v: number | null, unit: string, digits = 3) => (v === null ? 'n/a' : formatSI(v, unit, digits));
const pct = (v: number | null) => (v === null ? 'n/a' : `${v.toFixed(1)} %`);
const mw = (w: number) => `${(w * 1e3).toFixed(w * 1e3 >= 10 ? 0 : 1)}`;

const HEAD = ['#', 'option', 'parts', 'checks', 'overshoot', 'undershoot', 'ringback margin', 'settling', 'delay to VIH/VIL', 'edge 10–90 %', 'P low mW', 'P high mW', 'worst rx', 'sims'];

function cells(r: OptionRow): string[] {
  return [String(r.rank), r.title, r.parts, r.pass ? 'pass' : 'FAIL', pct(r.overshootPct), pct(r.undershootPct), num(r.ringbackMarginV, 'V'), num(r.settlingS, 's'), num(r.delayS, 's'), num(r.edgeS, 's'), mw(r.powerLowW), mw(r.powerHighW), r.worstReceiver, String(r.sims)];
}

function headerLines(a: Advice): string[] {
  const f = a.facts;
  return [
    `objective: ${a.objective.text}; values rounded to ${a.series}`,
    `driver ${formatSI(f.rOut, 'Ω', 3)}, ${formatSI(f.low, 'V', 3)} → ${formatSI(f.high, 'V', 3)}; Z0 at the driver ${f.z0Driver === null ? 'n/a' : formatSI(f.z0Driver, 'Ω', 3)}; ` +
      f.receivers.map((r) => `${r.name}: Z0 ${formatSI(r.z0, 'Ω', 3)}, ${formatSI(r.delay, 's', 3)}`).join('; '),
    ...(a.removed.length ? [`taken out of the bare net (the scenario's own terminations): ${a.removed.join('; ')}`] : []),
    ...a.notes,
  ];
}

export function formatAdviceTable(a: Advice): string {
  const rows = optionRows(a);
  const align: Align[] = ['r', 'l', 'l', 'l', 'r', 'r', 'r', 'r', 'r', 'r', 'r', 'r', 'l', 'r'];
  const lines = [`${a.title} (${a.file})`, ...headerLines(a).map((l) => `  ${l}`), '', ...alignColumns([HEAD, ...rows.map(cells)], align)];
  const first = a.options[0];
  if (first && a.options[1]) lines.push(`  ranked first: ${first.title} (${first.ahead}, ahead of ${a.options[1].title})`);
  for (const s of a.skipped) lines.push(`  not tried: ${s.title} (${s.reason})`);
  for (const o of a.options) if (o.monteCarlo) lines.push(`  ${o.title}: ±${(o.monteCarlo.tolerance * 100).toFixed(0)} % parts, ${o.monteCarlo.samples} samples: ${(o.monteCarlo.yield * 100).toFixed(0)} % pass the checks`);
  lines.push(`${a.totalSims} simulations. Worst value over the receivers per column; engineering estimates from the simulated net.`);
  return lines.join('\n') + '\n';
}

function mdEscape(s: string): string {
  return s.replace(/\|/g, '\\|');
}

export function adviceMarkdown(a: Advice, files: { png?: string; scenario?: string } = {}): string {
  const rows = optionRows(a);
  const out = [`# Termination options: ${mdEscape(a.title)}`, '', `Scenario \`${a.file}\`.`, '', ...headerLines(a).map((l) => `- ${l}`), ''];
  out.push(`| ${HEAD.join(' | ')} |`, `| ${HEAD.map((_, i) => (i === 1 || i === 2 || i === 12 ? '---' : '---:')).join(' | ')} |`);
  for (const r of rows) out.push(`| ${cells(r).map(mdEscape).join(' | ')} |`);
  out.push('', '## Options', '');
  for (const o of a.options) {
    out.push(`### ${a.options.indexOf(o) + 1}. ${mdEscape(o.title)}`, '');
    if (o.ahead) out.push(`- ahead of the next option: ${o.ahead}`);
    o.slots.forEach((s, i) => out.push(`- ${formatSI(o.values[i]!, s.kind === 'C' ? 'F' : 'Ω', 3)} ${s.where}${o.continuous[i] !== undefined ? ` (searched optimum ${formatSI(o.continuous[i]!, s.kind === 'C' ? 'F' : 'Ω', 4)})` : ''}`));
    if (o.rounding === 'neighbour') out.push(`- the nearest ${a.series} values broke a check; a neighbouring set was taken`);
    if (o.rounding === 'best failing') out.push(`- no ${a.series} set near the optimum passes every check`);
    if (o.atEdge.length) out.push(`- at the end of its searched range: ${o.atEdge.join(', ')} (the optimum may lie beyond)`);
    out.push(`- DC power in the termination: ${mw(o.power.low)} mW with the driver low, ${mw(o.power.high)} mW high`);
    out.push(`- simulations: ${o.sims.search} searching, ${o.sims.rounding} at rounded values, ${o.sims.monteCarlo} Monte Carlo`);
    if (o.monteCarlo) out.push(`- parts ±${(o.monteCarlo.tolerance * 100).toFixed(1)} % (uniform), ${o.monteCarlo.samples} samples, seed ${o.monteCarlo.seed}: ${(o.monteCarlo.yield * 100).toFixed(0)} % pass every check`);
    if (a.facts.receivers.length > 1) {
      for (const [i, r] of o.outcome.receivers.entries()) out.push(`- ${a.facts.receivers[i]!.name}: overshoot ${pct(r.overshootPct)}, ringback margin ${num(r.ringbackMarginV, 'V')}, settling ${num(r.settlingS, 's')}, delay ${num(r.delayS, 's')}`);
    }
    out.push('');
  }
  if (a.skipped.length) out.push('## Not tried', '', ...a.skipped.map((s) => `- ${s.title}: ${s.reason}`), '');
  if (files.png) out.push(`![receiver waveforms of the top options](${files.png})`, '');
  if (files.scenario) out.push(`The winning option is written to \`${files.scenario}\`; run \`ladderwave check\` on it.`, '');
  out.push(`${a.totalSims} simulations in all. The numbers are engineering estimates from the simulated net, not measurements.`, '');
  return out.join('\n');
}

export function adviceJson(a: Advice, files: { png?: string; scenario?: string } = {}): string {
  const rows = optionRows(a);
  return (
    JSON.stringify(
      {
        scenario: a.file,
        title: a.title,
        objective: a.objective.name,
        series: a.series,
        facts: a.facts,
        removed: a.removed,
        notes: a.notes,
        skipped: a.skipped,
        options: a.options.map((o, k) => ({
          ...rows[k],
          parts: o.slots.map((s, i) => ({ kind: s.kind, value: o.values[i], searched: o.continuous[i] ?? null, where: s.where })),
          rounding: o.rounding,
          ahead: o.ahead ?? null,
          atEdge: o.atEdge,
          simulations: o.sims,
          monteCarlo: o.monteCarlo ?? null,
          receivers: o.outcome.receivers.map((r, i) => ({ name: a.facts.receivers[i]!.name, ...r })),
          checksFailed: o.outcome.failed,
          checksMargin: o.outcome.margin,
        })),
        totalSimulations: a.totalSims,
        files,
      },
      (_k, v) => (typeof v === 'number' && !Number.isFinite(v) ? null : v),
      2,
    ) + '\n'
  );
}
