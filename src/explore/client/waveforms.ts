// The waveforms section: every probe against time, a legend that shows and hides probes, the view's
// range, and the two cursors with their readout.
import type { Instants } from '../payload.js';
import { createChart, type Chart } from './chart.js';
import { attachCursors, type Cursors } from './cursors.js';
import { el, innerWidth, replaceChildren, section } from './dom.js';
import { formatSI } from './format.js';
import type { Traces } from './traces.js';

export interface WaveformView {
  element: HTMLElement;
  chart: Chart;
  cursors: Cursors;
  /** Puts the cursors on a measured instant (A, and B for a span) and brings it into view. */
  showInstants(at: Instants): void;
  /** A marked instant (the map's time), or none. */
  setMarker(t: number | null): void;
  /** Called once the section is in the document (the chart needs its width). */
  mount(): void;
}

export const CHART_HELP =
  'Drag a box to zoom (a flat box zooms time only, a narrow one volts only) · Shift+drag or ←/→ to pan · double-click or “Whole run” to see everything · ' +
  'click to place cursor A, Shift+click for cursor B, drag a cursor’s line to move it.';

/** "Showing 1.2 ns … 3.4 ns, 0 V … 3.3 V" with the exact ranges as data attributes. */
export function viewReadout(id: string, xUnit: string, yUnit: string): { element: HTMLElement; update(v: { x: [number, number]; y: [number, number] }): void } {
  const element = el('p', { class: 'view-range', id });
  return {
    element,
    update(v) {
      element.dataset.xMin = String(v.x[0]);
      element.dataset.xMax = String(v.x[1]);
      element.dataset.yMin = String(v.y[0]);
      element.dataset.yMax = String(v.y[1]);
      element.textContent = `Showing ${formatSI(v.x[0], xUnit)} … ${formatSI(v.x[1], xUnit)} and ${formatSI(v.y[0], yUnit)} … ${formatSI(v.y[1], yUnit)}`;
    },
  };
}

export function waveformSection(traces: Traces, colors: string[]): WaveformView {
  const host = el('div', { class: 'chart', id: 'waveform-chart' });
  const legend = el('div', { class: 'legend', role: 'group', 'aria-label': 'probes shown' });
  const wholeBtn = el('button', { type: 'button', id: 'waveform-whole' }, 'Whole run');
  const readout = viewReadout('waveform-view', 's', 'V');
  const element = section(
    'waveforms',
    'Waveforms',
    el('p', { class: 'help' }, CHART_HELP),
    el('div', { class: 'toolbar' }, legend, wholeBtn),
    host,
    readout.element,
  );
  const shown = traces.names.map(() => true);
  let marker: number | null = null;
  let view: WaveformView;
  let chart: Chart | undefined;
  let cursors: Cursors | undefined;

  const chip = (name: string, i: number): HTMLButtonElement => {
    const b = el('button', { type: 'button', class: 'chip', 'aria-pressed': 'true', 'data-probe': name }, el('span', { class: 'swatch', style: `background:${colors[i % colors.length]}` }), name);
    b.addEventListener('click', () => setShown(i, !shown[i]));
    return b;
  };
  const chips = traces.names.map(chip);
  replaceChildren(legend, ...chips);
  function setShown(i: number, on: boolean): void {
    shown[i] = on;
    chips[i]!.setAttribute('aria-pressed', String(on));
    chart?.u.setSeries(i + 1, { show: on });
    cursors?.refresh();
  }

  function mount(): void {
    chart = createChart(host, innerWidth(element), {
      name: 'probe waveforms',
      x: { label: 'Time', unit: 's' },
      y: { label: 'Voltage', unit: 'V' },
      height: 380,
      series: traces.names.map((name, i) => ({ label: name, color: colors[i % colors.length]! })),
      data: [traces.times, ...traces.values] as unknown as uPlot.AlignedData,
    });
    chart.viewListeners.push(readout.update);
    readout.update(chart.view());
    chart.overlays.push((u, ctx) => {
      if (marker === null) return;
      const x = Math.round(u.valToPos(marker, 'x', true)) + 0.5;
      const { top, height, left, width } = u.bbox;
      if (x < left || x > left + width) return;
      ctx.save();
      ctx.strokeStyle = '#b84a00';
      ctx.setLineDash([2, 3].map((d) => d * (devicePixelRatio || 1)));
      ctx.beginPath();
      ctx.moveTo(x, top);
      ctx.lineTo(x, top + height);
      ctx.stroke();
      ctx.restore();
    });
    cursors = attachCursors(chart, () => ({ times: traces.times, names: traces.names, colors, values: traces.values, shown: (i) => shown[i]!, interpolate: traces.form === 'full' }));
    element.appendChild(cursors.panel);
    view.chart = chart;
    view.cursors = cursors;
    wholeBtn.addEventListener('click', () => chart!.whole());
    window.addEventListener('resize', () => chart!.resize(innerWidth(element)));
  }

  view = {
    element,
    chart: undefined as unknown as Chart,
    cursors: undefined as unknown as Cursors,
    showInstants(at) {
      if (!chart || !cursors) return;
      const p = at.probe === undefined ? -1 : traces.names.indexOf(at.probe);
      if (p >= 0 && !shown[p]) setShown(p, true);
      cursors.set('a', at.a);
      cursors.set('b', at.b ?? null);
      cursors.describe(`Cursors on: ${at.label}`);
      chart.reveal(at.a, at.b);
      element.scrollIntoView({ block: 'nearest' });
    },
    setMarker(t) {
      marker = t;
      chart?.redraw();
    },
    mount,
  };
  return view;
}
