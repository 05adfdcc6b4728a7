// The report's tables, built from summary.json (parsed), never from solver state. Each number cell
// carries the JSON path it came from (`data-path`, dot-separated) and the exact value (`data-value`),
// so a reader — or a test — can match the table against summary.json.
import { formatSI } from '../units.js';
import { attr, esc } from './html.js';

type Json = unknown;

/** A summary.json as parsed; only the sections the report reads are typed. */
export interface ReportSummary {
  scenario?: { file?: string; sha256?: string; title?: string };
  tool?: { name?: string; version?: string };
  discretization?: {
    dt: number;
    steps: number;
    duration: number;
    cells: number;
    nodes: number;
    dtReason: string;
    segments: {
      name: string;
      length: number;
      cells: number;
      cellLength: number;
      delay: number;
      z0: number;
      z0Basis?: string;
      z0At?: number | null;
      z0HighFrequency?: number;
      courant: number;
    }[];
  };
  probes?: Record<string, { min: number; max: number; final: number; crossing50: { time: number | null; level: number } }>;
  [section: string]: Json;
}

export interface Cell {
  text: string;
  /** Path into summary.json and its value, for number cells. */
  path?: (string | number)[];
  value?: number | null;
  className?: string;
}

/** The value at `path` in `obj`, or undefined. */
export function at(obj: Json, path: readonly (string | number)[]): Json {
  let o: Json = obj;
  for (const k of path) {
    if (o === null || typeof o !== 'object') return undefined;
    o = (o as Record<string | number, Json>)[k];
  }
  return o;
}

const isNum = (x: Json): x is number => typeof x === 'number' && Number.isFinite(x);

/** How a number is shown in the report (SI prefix, four significant digits; "—" for none). */
export function formatCell(value: number | null | undefined, unit: string): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  if (unit === '%') return `${Number(value.toPrecision(4))} %`;
  if (unit === '' && Number.isInteger(value)) return String(value);
  return formatSI(value, unit, 4);
}

/** A number cell read from the summary at `path`. */
export function numCell(summary: Json, path: (string | number)[], unit: string): Cell {
  const v = at(summary, path);
  const value = isNum(v) ? v : null;
  return { text: formatCell(value, unit), path, value, className: 'num' };
}

const textCell = (text: string, className?: string): Cell => ({ text, className });
const noneCell = (): Cell => ({ text: '—', className: 'num' });

export function renderTable(id: string, head: string[], rows: Cell[][], caption?: string): string {
  const th = head.map((h) => `<th scope="col">${esc(h)}</th>`).join('');
  const body = rows
    .map(
      (r) =>
        '<tr>' +
        r
          .map((c, j) => {
            const cls = c.className ? ` class="${attr(c.className)}"` : '';
            const data = c.path ? ` data-path="${attr(c.path.join('.'))}" data-value="${c.value === null || c.value === undefined ? '' : String(c.value)}"` : '';
            const tag = j === 0 ? 'th scope="row"' : 'td';
            return `<${tag}${cls}${data}>${esc(c.text)}</${tag === 'td' ? 'td' : 'th'}>`;
          })
          .join('') +
        '</tr>',
    )
    .join('');
  return `<table id="${attr(id)}">${caption ? `<caption>${esc(caption)}</caption>` : ''}<thead><tr>${th}</tr></thead><tbody>${body}</tbody></table>`;
}

// ---------------------------------------------------------------- measurements

interface EdgeLike {
  direction?: string;
  [k: string]: Json;
}

/** Index of the edge (of `direction`, or any) with the largest finite `field`, or -1. */
function worstEdge(edges: EdgeLike[], field: string, direction?: string): number {
  let best = -1;
  edges.forEach((e, i) => {
    if (direction && e.direction !== direction) return;
    const v = e[field];
    if (isNum(v) && (best < 0 || v > (edges[best][field] as number))) best = i;
  });
  return best;
}

function edgeCell(summary: Json, base: (string | number)[], edges: EdgeLike[], field: string, unit: string, direction?: string): Cell {
  const i = worstEdge(edges, field, direction);
  return i < 0 ? noneCell() : numCell(summary, [...base, 'edges', i, field], unit);
}

/** The longest settling time over the edges, or which edges never settled before the next edge or the end of the run. */
function settlingCell(summary: Json, base: (string | number)[], edges: EdgeLike[]): Cell {
  const unsettled = edges.filter((e) => e.complete !== false && (e.settling as { time?: Json }[] | undefined)?.[0]?.time === null);
  if (unsettled.length > 0) {
    const numbers = unsettled.map((e, i) => (isNum(e.number) ? e.number : i + 1));
    return textCell(`not settled (edge${numbers.length > 1 ? 's' : ''} ${numbers.join(', ')})`, 'num');
  }
  let best: { i: number; v: number } | null = null;
  edges.forEach((e, i) => {
    const s = (e.settling as { time?: Json }[] | undefined)?.[0]?.time;
    if (isNum(s) && (!best || s > best.v)) best = { i, v: s };
  });
  return best ? numCell(summary, [...base, 'edges', (best as { i: number }).i, 'settling', 0, 'time'], 's') : noneCell();
}

function delayCell(summary: Json, base: (string | number)[], delays: Json): Cell {
  if (!Array.isArray(delays)) return noneCell();
  let best = -1;
  delays.forEach((d, i) => {
    const v = (d as { delay50?: Json }).delay50;
    if (isNum(v) && (best < 0 || v > ((delays[best] as { delay50: number }).delay50))) best = i;
  });
  return best < 0 ? noneCell() : numCell(summary, [...base, 'delays', best, 'delay50'], 's');
}

/** The per-probe measurements in summary.json, keyed by probe, when the section has the expected shape. */
export function measurementSection(summary: ReportSummary): { key: string; probes: Record<string, Record<string, Json>> } | null {
  for (const key of ['measurements', 'measure']) {
    const m = summary[key];
    if (!m || typeof m !== 'object' || Array.isArray(m)) continue;
    // either { probe: measurements } or { probes: { probe: measurements } }
    const inner = (m as Record<string, Json>).probes;
    const probes = (inner && typeof inner === 'object' && !Array.isArray(inner) ? inner : m) as Record<string, Json>;
    const entries = Object.entries(probes);
    if (entries.length && entries.every(([, v]) => v !== null && typeof v === 'object' && Array.isArray((v as Record<string, Json>).edges))) {
      return { key: inner === probes ? `${key}.probes` : key, probes: probes as Record<string, Record<string, Json>> };
    }
  }
  return null;
}

/** The measurement table: from the measurement section when present, else min/max/final/50 % time. */
export function measurementTable(summary: ReportSummary): { html: string; source: 'measurements' | 'probes' } {
  const section = measurementSection(summary);
  if (section) {
    const prefix = section.key.split('.');
    const head = ['Probe', 'Low', 'High', 'Rise', 'Fall', 'Overshoot', 'Undershoot', 'Ringback', 'Below low rail', 'Settling', 'Delay', 'Min', 'Max', 'Final'];
    const rows = Object.entries(section.probes).map(([name, m]) => {
      const base = [...prefix, name];
      const edges = (m.edges as EdgeLike[]) ?? [];
      return [
        textCell(name),
        numCell(summary, [...base, 'levels', 'low'], 'V'),
        numCell(summary, [...base, 'levels', 'high'], 'V'),
        edgeCell(summary, base, edges, 'duration1090', 's', 'rising'),
        edgeCell(summary, base, edges, 'duration1090', 's', 'falling'),
        edgeCell(summary, base, edges, 'overshootPct', '%'),
        edgeCell(summary, base, edges, 'undershootPct', '%'),
        edgeCell(summary, base, edges, 'ringbackPct', '%'),
        numCell(summary, [...base, 'rails', 'belowLowRailV'], 'V'),
        settlingCell(summary, base, edges),
        delayCell(summary, base, m.delays),
        numCell(summary, [...base, 'min'], 'V'),
        numCell(summary, [...base, 'max'], 'V'),
        numCell(summary, [...base, 'final'], 'V'),
      ];
    });
    return {
      html: renderTable(
        'measurements',
        head,
        rows,
        'Worst value over all edges of each probe. Low and high: state levels (the levels the net settles to, unless the scenario asks for histogram levels); ' +
          'rise and fall: 10–90 % times; overshoot and undershoot (IEEE 181, beyond and back past the settled level): % of the swing; ' +
          'ringback: return below the settled level after first reaching 90 % (10 % falling), % of the swing; below low rail: lowest excursion below the driver’s low level; ' +
          'settling: from the 50 % instant into ±5 %; delay: driver 50 % to probe 50 % (see docs/measurements.md).',
      ),
      source: 'measurements',
    };
  }
  const probes = summary.probes ?? {};
  const rows = Object.keys(probes).map((name) => [
    textCell(name),
    numCell(summary, ['probes', name, 'min'], 'V'),
    numCell(summary, ['probes', name, 'max'], 'V'),
    numCell(summary, ['probes', name, 'final'], 'V'),
    numCell(summary, ['probes', name, 'crossing50', 'time'], 's'),
  ]);
  return {
    html: renderTable('measurements', ['Probe', 'Min', 'Max', 'Final', '50 % crossing'], rows, 'The 50 % level lies halfway between the probe’s initial and final value.'),
    source: 'probes',
  };
}

// ---------------------------------------------------------------- eye

export function eyeTable(summary: ReportSummary): string | null {
  const eye = summary.eye;
  if (!eye || typeof eye !== 'object') return null;
  const row = (label: string, path: (string | number)[], unit: string): Cell[] => [textCell(label), numCell(summary, path, unit)];
  const rows: Cell[][] = [
    row('Eye height (over the sampling window)', ['eye', 'eyeHeight'], 'V'),
    row('Sampling window around the sampling instant', ['eye', 'samplingWindow', 'width'], 's'),
    row('Eye width', ['eye', 'eyeWidth'], 's'),
    row('Unit interval', ['eye', 'ui'], 's'),
    row('Threshold', ['eye', 'threshold', 'level'], 'V'),
    row('Sampling instant after the bit starts at the driver', ['eye', 'samplingTime'], 's'),
    row('Probe delay used for alignment', ['eye', 'delay'], 's'),
    row('Windows folded', ['eye', 'windows'], ''),
  ];
  const probe = at(summary, ['eye', 'probe']);
  const windows = at(summary, ['eye', 'windows']);
  const short = windows === 0 ? ' The run is shorter than one two-UI window at the probe; `ladderwave eye` runs the whole pattern.' : '';
  const closed = at(summary, ['eye', 'open']) === false && typeof windows === 'number' && windows > 0 ? ' The eye is closed at the thresholds: the height is the gap between the traces, not an opening a receiver sees.' : '';
  const warn = at(summary, ['eye', 'warnings']);
  const warnings = Array.isArray(warn) && warn.length ? ` Warning: ${warn.filter((w) => typeof w === 'string').join('; ')}.` : '';
  return renderTable('eye', ['Eye', 'Value'], rows, `At probe ${typeof probe === 'string' ? probe : '?'}; noise-free definitions (see the eye view).${short}${closed}${eyeNotes(summary, windows)}${warnings}`);
}

/**
 * The eye's notes in summary.json that the caption does not already say (too few windows to trust, no
 * delay found, no "0" or "1" folded), each as a sentence.
 */
function eyeNotes(summary: ReportSummary, windows: Json | undefined): string {
  const notes = at(summary, ['eye', 'notes']);
  if (!notes || typeof notes !== 'object' || Array.isArray(notes)) return '';
  const said = new Set(['eyeWidth', ...(windows === 0 ? ['windows'] : [])]);
  const texts = Object.entries(notes).filter(([k, v]) => !said.has(k) && typeof v === 'string').map(([, v]) => v as string);
  return texts.map((t) => ` Note: ${t}.`).join('');
}

// ---------------------------------------------------------------- checks

interface CheckLike {
  probe?: Json;
  metric?: Json;
  limit?: Json;
  measuredText?: Json;
  measured?: Json;
  pass?: Json;
  message?: Json;
}

/** The check results in summary.json: an array, or { results: [...] }. */
export function checkResults(summary: ReportSummary): { path: string[]; items: CheckLike[] } | null {
  const c = summary.checks;
  if (Array.isArray(c)) return { path: ['checks'], items: c as CheckLike[] };
  if (c && typeof c === 'object' && Array.isArray((c as { results?: Json }).results)) {
    return { path: ['checks', 'results'], items: (c as { results: CheckLike[] }).results };
  }
  return null;
}

export function checksTable(summary: ReportSummary): { html: string; passed: number; failed: number } | null {
  const found = checkResults(summary);
  if (!found || found.items.length === 0) return null;
  let passed = 0, failed = 0;
  const rows = found.items.map((c): Cell[] => {
    const ok = c.pass === true;
    if (ok) passed++;
    else failed++;
    return [
      textCell(String(c.probe ?? '')),
      textCell(String(c.metric ?? '')),
      textCell(String(c.limit ?? '')),
      textCell(String(c.measuredText ?? (isNum(c.measured) ? String(c.measured) : '—')), 'num'),
      textCell(ok ? 'PASS' : 'FAIL', ok ? 'verdict pass' : 'verdict fail'),
      textCell(String(c.message ?? '')),
    ];
  });
  return { html: renderTable('checks', ['Probe', 'Metric', 'Limit', 'Measured', 'Result', 'Note'], rows), passed, failed };
}

// ---------------------------------------------------------------- discretization

export function discretizationTables(summary: ReportSummary): string {
  const d = summary.discretization;
  if (!d) return '<p class="muted">No discretization in the summary.</p>';
  const row = (label: string, path: (string | number)[], unit: string): Cell[] => [textCell(label), numCell(summary, path, unit)];
  const overview = renderTable('discretization', ['Quantity', 'Value'], [
    row('Time step Δt', ['discretization', 'dt'], 's'),
    row('Steps', ['discretization', 'steps'], ''),
    row('Simulated time', ['discretization', 'duration'], 's'),
    row('Line cells', ['discretization', 'cells'], ''),
    row('Nodes', ['discretization', 'nodes'], ''),
  ]);
  const reason = `<p class="muted">Δt is set by: ${esc(d.dtReason)}.</p>`;
  if (!d.segments?.length) return overview + reason;
  const seg = renderTable(
    'segments',
    ['Segment', 'Length', 'Z0', 'Z0 holds at', 'Z0∞', 'Delay', 'Cells', 'Cell length', 'Courant'],
    d.segments.map((s, i) => [
      textCell(s.name),
      numCell(summary, ['discretization', 'segments', i, 'length'], 'm'),
      numCell(summary, ['discretization', 'segments', i, 'z0'], 'Ω'),
      isNum(s.z0At) ? numCell(summary, ['discretization', 'segments', i, 'z0At'], 'Hz') : textCell(s.z0Basis === 'constant' ? 'every frequency' : (s.z0Basis ?? '—')),
      numCell(summary, ['discretization', 'segments', i, 'z0HighFrequency'], 'Ω'),
      numCell(summary, ['discretization', 'segments', i, 'delay'], 's'),
      numCell(summary, ['discretization', 'segments', i, 'cells'], ''),
      numCell(summary, ['discretization', 'segments', i, 'cellLength'], 'm'),
      { text: isNum(s.courant) ? s.courant.toFixed(4) : '—', path: ['discretization', 'segments', i, 'courant'], value: isNum(s.courant) ? s.courant : null, className: 'num' },
    ]),
    'Z0: quasi-static at the frequency shown for a line with frequency-dependent loss, √(L′/C′) at every frequency for a constant line; Z0∞: the high-frequency limit. ' +
      'Courant number v·Δt/Δz per segment: at most 1 for stability; exactly 1 is free of numerical dispersion on a lossless line.',
  );
  return overview + reason + seg;
}

// ---------------------------------------------------------------- receivers

/**
 * Every receiver of a branched net with the probe that watches it and its extremes and final value
 * (summary.json "receivers"); null for a net with one receiver.
 */
export function receiversTable(summary: ReportSummary): string | null {
  const rx = at(summary, ['receivers']);
  if (rx === null || typeof rx !== 'object' || Array.isArray(rx)) return null;
  const rows: Cell[][] = Object.keys(rx).map((name) => {
    const probe = at(summary, ['receivers', name, 'probe']);
    const recorded = at(summary, ['receivers', name, 'recorded']) === true;
    return [
      textCell(name),
      textCell(`${typeof probe === 'string' ? probe : '—'}${recorded ? '' : ' (added for the run)'}`),
      numCell(summary, ['receivers', name, 'min'], 'V'),
      numCell(summary, ['receivers', name, 'max'], 'V'),
      numCell(summary, ['receivers', name, 'final'], 'V'),
    ];
  });
  return renderTable('receivers', ['Receiver', 'Probe', 'Min', 'Max', 'Final'], rows, 'Every receiver of the net, main receiver first');
}
