// The sweep section: a table of the sweep's points (sweep.csv's point and varied values, and the check
// tally when the scenario has checks) whose ticked points' waveforms of one probe are overlaid in one
// chart, with zoom, cursors and a legend as for a run. Points differ in their time step when the swept
// value changes the cells (a length, a line): the overlay then runs on the union of their instants,
// each point interpolated linearly between its own samples, and the page says so.
import type { PageData, SweepData, SweepPoint } from '../payload.js';
import { el, replaceChildren, section } from './dom.js';
import { formatSI } from './format.js';
import { decodeTraces, type Traces } from './traces.js';
import { waveformSection, type WaveformView } from './waveforms.js';

/** A point's volts of one probe at its own instants. */
interface Wave {
  point: number;
  times: Float64Array;
  values: Float64Array;
  full: boolean;
}

/** Linear interpolation of (times, values) at t, within the record (NaN outside it). */
function valueAt(w: Wave, t: number, from: number): { v: number; k: number } {
  const { times, values } = w;
  let k = from;
  while (k < times.length - 1 && times[k + 1]! <= t) k++;
  if (t < times[0]! || t > times[times.length - 1]!) return { v: NaN, k };
  if (times[k] === t || k === times.length - 1) return { v: values[k]!, k };
  const f = (t - times[k]!) / (times[k + 1]! - times[k]!);
  return { v: values[k]! + f * (values[k + 1]! - values[k]!), k };
}

/** The chosen points' waves as one set of traces: shared instants when they agree, else their union. */
export function overlayTraces(waves: Wave[]): { traces: Traces; joined: boolean } {
  const names = waves.map((w) => `point ${w.point}`);
  // the same instants, to rounding (i·dt with dt computed from each point's cells may differ in the last bit)
  const t0 = waves[0]?.times;
  const tol = t0 && t0.length ? 1e-9 * Math.abs(t0[t0.length - 1]!) : 0;
  const same = waves.every((w) => w.times.length === t0!.length && w.times.every((t, i) => Math.abs(t - t0![i]!) <= tol));
  const full = waves.every((w) => w.full);
  if (waves.length === 0) return { traces: { names, times: new Float64Array(0), values: [], form: 'full' }, joined: false };
  if (same) return { traces: { names, times: waves[0]!.times, values: waves.map((w) => w.values), form: full ? 'full' : 'reduced' }, joined: false };
  const all = new Float64Array(waves.reduce((n, w) => n + w.times.length, 0));
  waves.reduce((o, w) => (all.set(w.times, o), o + w.times.length), 0);
  all.sort();
  const times = all.filter((t, i) => i === 0 || t !== all[i - 1]);
  const values = waves.map((w) => {
    const out = new Float64Array(times.length);
    let k = 0;
    for (let i = 0; i < times.length; i++) {
      const r = valueAt(w, times[i]!, k);
      out[i] = r.v;
      k = r.k;
    }
    return out;
  });
  return { traces: { names, times, values, form: full ? 'full' : 'reduced' }, joined: true };
}

function waveOf(p: SweepPoint, probe: string): Wave | null {
  const t = decodeTraces(p.traces);
  const i = t.names.indexOf(probe);
  return i < 0 ? null : { point: p.point, times: t.times, values: t.values[i]!, full: t.form === 'full' };
}

/** A cell of sweep.csv's table: the number with the unit its column name ends with. */
function cellText(column: string, v: number | null): string {
  if (v === null) return '—';
  const unit = /_(ohm|V|s|m|F|H|pct|Hz)$/.exec(column)?.[1];
  if (unit === 'pct') return `${Number(v.toPrecision(4))} %`;
  if (unit) return formatSI(v, unit === 'ohm' ? 'Ω' : unit);
  return String(Number(v.toPrecision(6)));
}

/** sweep.csv's column name without its unit suffix ("route.rs.series.r" for "route.rs.series.r_ohm"): the cells carry the unit. */
function columnTitle(c: string): string {
  return c.replace(/_(ohm|V|s|m|F|H|pct|Hz)$/, '');
}

function pointsTable(sweep: SweepData, held: Map<number, SweepPoint>, chosen: Set<number>, onToggle: (point: number, on: boolean) => void): HTMLElement {
  const cols = sweep.shown;
  const marks = new Map(sweep.marked.map((m) => [m.point, m.label]));
  const head = el('tr', {}, el('th', { scope: 'col' }, 'Overlay'), el('th', { scope: 'col', class: 'num' }, 'Point'), ...cols.map((c) => el('th', { scope: 'col', class: 'num', 'data-column': c }, columnTitle(c))), el('th', { scope: 'col' }, ''));
  const body = sweep.rows.map((row) => {
    const point = row[0] as number;
    const has = held.has(point);
    const box = el('input', { type: 'checkbox', id: `point-${point}`, 'data-point': point, checked: chosen.has(point), disabled: !has, 'aria-label': `overlay point ${point}`, title: has ? undefined : 'no waveform in this page (see the note at the foot)' });
    box.addEventListener('change', () => onToggle(point, box.checked));
    const cells = cols.map((c) => {
      const v = row[sweep.header.indexOf(c)] ?? null;
      return el('td', { class: 'num', 'data-value': v === null ? '' : v }, cellText(c, v));
    });
    return el('tr', { 'data-point': point }, el('td', {}, box), el('th', { scope: 'row', class: 'num' }, String(point)), ...cells, el('td', { class: 'mark' }, marks.get(point) ?? ''));
  });
  return el('div', { class: 'wide points' }, el('table', { id: 'sweep-points' }, el('thead', {}, head), el('tbody', {}, ...body)));
}

export function sweepSection(sweep: SweepData, data: PageData, main: HTMLElement): void {
  const held = new Map(sweep.points.map((p) => [p.point, p]));
  const heldOrder = sweep.points.map((p) => p.point);
  const chosen = new Set(sweep.initial.filter((p) => held.has(p)));
  let probe = sweep.probe;
  const probeSel = el('select', { id: 'sweep-probe', 'aria-label': 'probe overlaid' }, ...sweep.probes.map((p) => el('option', { value: p, selected: p === probe }, p)));
  const about = el('p', { class: 'caption', id: 'sweep-overlay-about' });
  const slot = el('div', { id: 'sweep-overlay' });
  let view: WaveformView | null = null;

  function draw(): void {
    const prior = view?.chart?.view();
    const points = heldOrder.filter((p) => chosen.has(p));
    const waves = points.map((p) => waveOf(held.get(p)!, probe)).filter((w): w is Wave => w !== null);
    // a point keeps its colour whichever others are shown
    const colors = waves.map((w) => data.traceColors[heldOrder.indexOf(w.point) % data.traceColors.length]!);
    const { traces, joined } = overlayTraces(waves);
    slot.dataset.points = points.join(',');
    slot.dataset.probe = probe;
    if (!waves.length) {
      view = null;
      replaceChildren(slot, el('p', { class: 'caption' }, 'Tick points in the table to overlay their waveforms.'));
      about.textContent = '';
      return;
    }
    view = waveformSection(traces, colors);
    view.element.querySelector('h2')!.textContent = `Waveforms at ${probe}`;
    replaceChildren(slot, view.element);
    view.mount();
    if (prior) view.chart.setView({ x: prior.x });
    about.textContent =
      points.map((p) => `point ${p}: ${held.get(p)!.label}`).join(' · ') +
      (joined ? ' — these points have different time steps: shown on the union of their instants, each interpolated linearly between its own samples.' : '');
  }

  probeSel.addEventListener('change', () => {
    probe = probeSel.value;
    draw();
  });
  const table = pointsTable(sweep, held, chosen, (point, on) => {
    if (on) chosen.add(point);
    else chosen.delete(point);
    draw();
  });
  main.appendChild(
    section(
      'sweep',
      'Sweep points',
      el('p', { class: 'help' }, `${sweep.rows.length} points; ${held.size === sweep.rows.length ? 'every point' : `${held.size} of them`} with waveforms. Tick points to overlay their waveforms at the chosen probe; every column of each point is in sweep.csv.`),
      el('div', { class: 'toolbar' }, el('label', {}, 'Probe ', probeSel)),
      slot,
      about,
      table,
    ),
  );
  draw();
}
