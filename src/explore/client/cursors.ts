// Two time cursors on a waveform chart, A and B: a click places A, Shift+click places B (each on the
// nearest recorded instant), a cursor's line can be dragged, a time can be typed, and a measurement
// puts them on the instant it was measured at. The readout gives every shown probe's value at A and
// at B, their difference, and Δt = tB − tA with its reciprocal. At a recorded instant a value is the
// sample itself; between two (a typed time, a measured crossing) it is interpolated linearly, as the
// measurements interpolate their crossings. Reduced data is never interpolated: its cursors sit on
// kept instants.
import type { Chart } from './chart.js';
import { el, replaceChildren } from './dom.js';
import { formatDelta, formatSI, parseTime } from './format.js';

export type CursorName = 'a' | 'b';

/** What the cursors read: instants and, per trace, a value at each (null: none there). */
export interface CursorSource {
  times: ArrayLike<number>;
  names: string[];
  colors: string[];
  values: ArrayLike<number | null>[];
  /** Whether trace i is shown (hidden traces are left out of the readout). */
  shown: (i: number) => boolean;
  /** Whether values between held instants may be interpolated (false: cursors snap to held instants). */
  interpolate: boolean;
}

export interface Cursors {
  /** Places a cursor at t, or at the recorded instant nearest t with `snap` (null removes it). */
  set(which: CursorName, t: number | null, snap?: boolean): void;
  get(): { a: number | null; b: number | null };
  /** Says what the cursors are on (shown above the readout), or clears it. */
  describe(text: string | null): void;
  /** Re-reads the source (after a trace was shown or hidden, or new data). */
  refresh(): void;
  panel: HTMLElement;
}

const GRAB = 6;
const STYLE: Record<CursorName, { color: string; dash: number[] }> = { a: { color: '#1f2430', dash: [] }, b: { color: '#6b3fa0', dash: [6, 4] } };

/** Index of the instant nearest t in ascending `times`. */
export function nearestIndex(times: ArrayLike<number>, t: number): number {
  let lo = 0, hi = times.length - 1;
  if (hi < 0) return -1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (times[mid]! <= t) lo = mid;
    else hi = mid;
  }
  return Math.abs(times[hi]! - t) < Math.abs(times[lo]! - t) ? hi : lo;
}

/**
 * A trace's value at t: the sample at a held instant, linear interpolation between two (when allowed
 * and both have values), else the value at the nearest instant that has one.
 */
export function valueAt(times: ArrayLike<number>, values: ArrayLike<number | null>, t: number, interpolate: boolean): number | null {
  const i = nearestIndex(times, t);
  if (i < 0) return null;
  if (times[i] === t || !interpolate) return valueNear(values, i);
  const j = times[i]! < t ? i : i - 1;
  const v0 = values[j], v1 = values[j + 1];
  if (j < 0 || j + 1 >= times.length || v0 === null || v0 === undefined || v1 === null || v1 === undefined) return valueNear(values, i);
  const w = (t - times[j]!) / (times[j + 1]! - times[j]!);
  return v0 + (v1 - v0) * w;
}

/** The value of a trace at index i, or at the nearest index that has one (traces joined from several runs have gaps). */
export function valueNear(values: ArrayLike<number | null>, i: number): number | null {
  for (let d = 0; d < values.length; d++) {
    const l = values[i - d], r = values[i + d];
    if (l !== null && l !== undefined && i - d >= 0) return l;
    if (r !== null && r !== undefined && i + d < values.length) return r;
    if (i - d < 0 && i + d >= values.length) break;
  }
  return null;
}

export function attachCursors(chart: Chart, source: () => CursorSource): Cursors {
  const at: Record<CursorName, number | null> = { a: null, b: null };
  const inputs: Record<CursorName, HTMLInputElement> = {
    a: el('input', { type: 'text', id: 'cursor-a', 'aria-label': 'time of cursor A', placeholder: 'click the chart', size: 14 }),
    b: el('input', { type: 'text', id: 'cursor-b', 'aria-label': 'time of cursor B', placeholder: 'Shift+click', size: 14 }),
  };
  const about = el('p', { class: 'cursor-about', hidden: true });
  const note = el('p', { class: 'cursor-about', id: 'cursor-note', hidden: true });
  const table = el('table', { class: 'readout', id: 'cursor-readout' });
  const clear = el('button', { type: 'button' }, 'Clear cursors');
  const panel = el(
    'div',
    { class: 'cursors' },
    el('div', { class: 'cursor-fields' }, el('label', {}, 'Cursor A ', inputs.a), el('label', {}, 'Cursor B ', inputs.b), clear),
    about,
    table,
    note,
  );

  const snap = (t: number): number => {
    const s = source();
    const i = nearestIndex(s.times, t);
    return i < 0 ? t : s.times[i]!;
  };
  const set = (which: CursorName, t: number | null, snapTo = false): void => {
    at[which] = t === null || !Number.isFinite(t) ? null : snapTo || !source().interpolate ? snap(t) : t;
    render();
    chart.redraw();
  };

  const valueCell = (v: number | null, cls: string, cursor: string, probe: string): HTMLElement =>
    el('td', { class: `num ${cls}`, 'data-cursor': cursor, 'data-probe': probe, 'data-value': v === null ? '' : String(v) }, formatSI(v, 'V', 4));

  function render(): void {
    const s = source();
    for (const k of ['a', 'b'] as const) if (document.activeElement !== inputs[k]) inputs[k].value = at[k] === null ? '' : formatSI(at[k], 's', 6);
    const read = (i: number, t: number | null) => (t === null ? null : valueAt(s.times, s.values[i]!, t, s.interpolate));
    const between = (['a', 'b'] as const).filter((k) => at[k] !== null && s.times[nearestIndex(s.times, at[k]!)] !== at[k]);
    note.hidden = between.length === 0;
    note.textContent = between.length ? `${between.map((k) => k.toUpperCase()).join(' and ')} between recorded samples: values interpolated linearly.` : '';
    const head = el('tr', {}, el('th', { scope: 'col' }, 'Probe'), el('th', { scope: 'col' }, 'at A'), el('th', { scope: 'col' }, 'at B'), el('th', { scope: 'col' }, 'B − A'));
    const rows: HTMLElement[] = [];
    s.names.forEach((name, i) => {
      if (!s.shown(i)) return;
      const va = read(i, at.a);
      const vb = read(i, at.b);
      const d = va !== null && vb !== null ? vb - va : null;
      rows.push(
        el(
          'tr',
          {},
          el('th', { scope: 'row' }, el('span', { class: 'swatch', style: `background:${s.colors[i]}` }), name),
          valueCell(va, 'at-a', 'a', name),
          valueCell(vb, 'at-b', 'b', name),
          el('td', { class: 'num delta', 'data-cursor': 'delta', 'data-probe': name, 'data-value': d === null ? '' : String(d) }, formatDelta(d, 'V')),
        ),
      );
    });
    const dt = at.a !== null && at.b !== null ? at.b - at.a : null;
    const time = el(
      'tr',
      { class: 'time-row' },
      el('th', { scope: 'row' }, 'Time'),
      el('td', { class: 'num', 'data-cursor': 'a', 'data-value': at.a ?? '' }, formatSI(at.a, 's', 6)),
      el('td', { class: 'num', 'data-cursor': 'b', 'data-value': at.b ?? '' }, formatSI(at.b, 's', 6)),
      el('td', { class: 'num', id: 'cursor-dt', 'data-value': dt ?? '' }, dt === null ? '—' : `Δt ${formatDelta(dt, 's', 6)}` + (dt !== 0 ? ` (1/Δt ${formatSI(1 / Math.abs(dt), 'Hz', 4)})` : '')),
    );
    replaceChildren(table, el('thead', {}, head), el('tbody', {}, time, ...rows));
  }

  // the two lines, their labels, and the span between them
  chart.overlays.push((u, ctx) => {
    const { top, height, left, width } = u.bbox;
    const px = (t: number) => u.valToPos(t, 'x', true);
    const r = devicePixelRatio || 1;
    ctx.save();
    if (at.a !== null && at.b !== null) {
      const x0 = Math.max(left, Math.min(px(at.a), px(at.b))), x1 = Math.min(left + width, Math.max(px(at.a), px(at.b)));
      if (x1 > x0) {
        ctx.fillStyle = 'rgba(107, 63, 160, 0.06)';
        ctx.fillRect(x0, top, x1 - x0, height);
      }
    }
    for (const k of ['a', 'b'] as const) {
      const t = at[k];
      if (t === null) continue;
      const x = Math.round(px(t)) + 0.5;
      if (x < left - 1 || x > left + width + 1) continue;
      ctx.strokeStyle = STYLE[k].color;
      ctx.lineWidth = 1.5 * r;
      ctx.setLineDash(STYLE[k].dash.map((d) => d * r));
      ctx.beginPath();
      ctx.moveTo(x, top);
      ctx.lineTo(x, top + height);
      ctx.stroke();
      ctx.setLineDash([]);
      ctx.fillStyle = STYLE[k].color;
      const w = 16 * r, h = 16 * r;
      ctx.fillRect(x - w / 2, top, w, h);
      ctx.fillStyle = '#ffffff';
      ctx.font = `bold ${11 * r}px system-ui, sans-serif`;
      ctx.textAlign = 'center';
      ctx.textBaseline = 'middle';
      ctx.fillText(k.toUpperCase(), x, top + h / 2 + 0.5);
    }
    ctx.restore();
  });

  // dragging a cursor's line
  chart.grabbers.push((p) => {
    const near = (['a', 'b'] as const).find((k) => at[k] !== null && Math.abs(chart.u.valToPos(at[k]!, 'x') - p.left) <= GRAB);
    if (!near) return false;
    const r = chart.u.over.getBoundingClientRect();
    const move = (e: MouseEvent) => set(near, chart.u.posToVal(e.clientX - r.left, 'x'), true);
    const up = () => {
      window.removeEventListener('mousemove', move);
      window.removeEventListener('mouseup', up);
    };
    window.addEventListener('mousemove', move);
    window.addEventListener('mouseup', up);
    return true;
  });
  chart.clicks.push((p) => set(p.shift ? 'b' : 'a', p.x, true));

  for (const k of ['a', 'b'] as const) {
    inputs[k].addEventListener('change', () => {
      const text = inputs[k].value.trim();
      if (text === '') return set(k, null);
      const t = parseTime(text);
      inputs[k].classList.toggle('invalid', t === null);
      if (t !== null) {
        set(k, t);
        chart.reveal(at[k]!);
      }
    });
  }
  clear.addEventListener('click', () => {
    at.a = at.b = null;
    about.hidden = true;
    render();
    chart.redraw();
  });
  render();

  return {
    set,
    get: () => ({ ...at }),
    describe(text) {
      about.hidden = text === null;
      about.textContent = text ?? '';
    },
    refresh: render,
    panel,
  };
}
