// One chart of the page on top of uPlot: our axes (SI prefixes), zoom by dragging a box (both axes; a
// flat box zooms time only, a narrow one the values only), pan with Shift+drag or the arrow keys,
// the whole view back with a double click or a button, and drawing hooks for marks laid over the
// traces (cursors, the map's instant, route places).
import { formatSI } from './format.js';

export interface AxisSpec {
  label: string;
  unit: string;
}

export interface SeriesSpec {
  label: string;
  color: string;
  dash?: number[];
  width?: number;
}

export type Range = [number, number];

export interface ChartOptions {
  x: AxisSpec;
  y: AxisSpec;
  series: SeriesSpec[];
  data: uPlot.AlignedData;
  height: number;
  /** The whole view; default: the extent of the data (y padded by 5 %). */
  whole?: { x?: Range; y?: Range };
  /** The view the chart opens on (default: the whole view). */
  initial?: { x?: Range; y?: Range };
  /** Time running downward (the map's vertical axis). */
  yDown?: boolean;
  /** Accessible name of the plotting area. */
  name: string;
}

/** Pointer position over the plotting area, in CSS pixels and in data units. */
export interface PlotPoint {
  left: number;
  top: number;
  x: number;
  y: number;
  shift: boolean;
}

export interface Chart {
  readonly u: uPlot;
  /** Current x and y ranges. */
  view(): { x: Range; y: Range };
  /** Sets either range (or both); the other keeps its value. */
  setView(v: { x?: Range; y?: Range }): void;
  /** Back to the whole view. */
  whole(): void;
  /** Moves the x view (keeping its width) so that [t0, t1] is inside it; zooms out when it does not fit. */
  reveal(t0: number, t1?: number): void;
  /** Functions that draw on the canvas after the series (canvas pixels). */
  overlays: ((u: uPlot, ctx: CanvasRenderingContext2D) => void)[];
  /** A press that should not zoom or pan (return true to take it), e.g. grabbing a cursor line. */
  grabbers: ((p: PlotPoint, e: MouseEvent) => boolean)[];
  /** A click (a press without moving) on the plotting area. */
  clicks: ((p: PlotPoint) => void)[];
  /** Called after every change of view. */
  viewListeners: ((v: { x: Range; y: Range }) => void)[];
  redraw(): void;
  resize(width: number): void;
}

const CLICK_SLOP = 3;
const UNI = 16;

function padded([lo, hi]: Range, frac: number): Range {
  if (!(hi > lo)) {
    const d = lo === 0 ? 1 : Math.abs(lo) * 0.1;
    return [lo - d, hi + d];
  }
  const d = (hi - lo) * frac;
  return [lo - d, hi + d];
}

function dataExtent(data: uPlot.AlignedData, from: number, to: number): Range {
  let lo = Infinity, hi = -Infinity;
  for (let s = from; s < to; s++) {
    const col = data[s] as ArrayLike<number | null | undefined>;
    for (let i = 0; i < col.length; i++) {
      const v = col[i];
      if (v === null || v === undefined || !Number.isFinite(v)) continue;
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  }
  return lo <= hi ? [lo, hi] : [0, 1];
}

function axis(spec: AxisSpec, side: 'x' | 'y'): uPlot.Axis {
  return {
    label: `${spec.label} (${spec.unit})`,
    labelSize: 22,
    labelFont: '13px system-ui, sans-serif',
    font: '12px system-ui, sans-serif',
    stroke: '#3b4250',
    size: side === 'y' ? 78 : 42,
    gap: 4,
    grid: { stroke: '#e4e7ec', width: 1 },
    ticks: { stroke: '#c9ced6', width: 1, size: 4 },
    values: (_u: uPlot, splits: number[]) => splits.map((v) => formatSI(Math.abs(v) < 1e-18 * Math.max(1, ...splits.map(Math.abs)) ? 0 : v, spec.unit, 4)),
  };
}

/** Creates a chart in `host` with the page's interaction. */
export function createChart(host: HTMLElement, width: number, opts: ChartOptions): Chart {
  const wholeX: Range = opts.whole?.x ?? dataExtent(opts.data, 0, 1);
  const wholeY: Range = opts.whole?.y ?? padded(dataExtent(opts.data, 1, opts.data.length), 0.05);
  let yFixed: Range | null = opts.initial?.y ?? opts.whole?.y ?? null;
  const overlays: Chart['overlays'] = [];
  const grabbers: Chart['grabbers'] = [];
  const clicks: Chart['clicks'] = [];
  const viewListeners: Chart['viewListeners'] = [];
  let u: uPlot;

  const point = (e: MouseEvent): PlotPoint => {
    const r = u.over.getBoundingClientRect();
    const left = e.clientX - r.left, top = e.clientY - r.top;
    return { left, top, x: u.posToVal(left, 'x'), y: u.posToVal(top, 'y'), shift: e.shiftKey };
  };

  const view = (): { x: Range; y: Range } => ({ x: [u.scales.x!.min!, u.scales.x!.max!], y: [u.scales.y!.min!, u.scales.y!.max!] });
  const setView = (v: { x?: Range; y?: Range }): void => {
    if (v.y) yFixed = [Math.min(...v.y), Math.max(...v.y)];
    u.batch(() => {
      if (v.x) u.setScale('x', { min: Math.min(...v.x), max: Math.max(...v.x) });
      if (v.y) u.setScale('y', { min: yFixed![0], max: yFixed![1] });
    });
  };

  // Shift+drag pans; a press without moving is a click. Both handled here, outside uPlot's zoom.
  const press = (e: MouseEvent): void => {
    const p0 = point(e);
    const v0 = view();
    const pw = u.over.clientWidth, ph = u.over.clientHeight;
    let moved = false;
    const move = (ev: MouseEvent): void => {
      const dx = ev.clientX - e.clientX, dy = ev.clientY - e.clientY;
      if (!moved && Math.hypot(dx, dy) < CLICK_SLOP) return;
      moved = true;
      const kx = (v0.x[1] - v0.x[0]) / pw, ky = (v0.y[1] - v0.y[0]) / ph;
      const sy = opts.yDown ? -1 : 1;
      setView({ x: [v0.x[0] - dx * kx, v0.x[1] - dx * kx], y: [v0.y[0] + sy * dy * ky, v0.y[1] + sy * dy * ky] });
    };
    const up = (): void => {
      window.removeEventListener('mousemove', move);
      window.removeEventListener('mouseup', up);
      if (!moved) clicks.forEach((f) => f(p0));
    };
    window.addEventListener('mousemove', move);
    window.addEventListener('mouseup', up);
  };

  const options: uPlot.Options = {
    width,
    height: opts.height,
    legend: { show: false },
    padding: [12, 18, 4, 4],
    scales: {
      x: { time: false, range: (_u, lo, hi) => (lo === null || hi === null || !(hi > lo) ? wholeX : [lo, hi]) },
      y: { auto: true, dir: 1, ori: 1, range: (_u, lo, hi) => yFixed ?? (lo === null || hi === null ? wholeY : padded([lo, hi], 0.05)) },
    },
    axes: [axis(opts.x, 'x'), axis(opts.y, 'y')],
    series: [{}, ...opts.series.map((s): uPlot.Series => ({ label: s.label, stroke: s.color, width: s.width ?? 1.5, dash: s.dash, points: { show: false }, spanGaps: true }))],
    cursor: {
      x: true,
      y: false,
      points: { show: false },
      drag: { x: true, y: true, uni: UNI, dist: CLICK_SLOP, setScale: false },
      bind: {
        mousedown: (_u, _t, handler) => (e: MouseEvent) => {
          if (e.button !== 0) return null;
          const p = point(e);
          if (grabbers.some((g) => g(p, e))) return null;
          if (e.shiftKey) {
            press(e);
            return null;
          }
          return handler(e);
        },
        dblclick: () => () => {
          chart.whole();
          return null;
        },
      },
    },
    hooks: {
      draw: [(self) => overlays.forEach((f) => f(self, self.ctx))],
      setSelect: [
        (self) => {
          const s = self.select;
          if (s.width < CLICK_SLOP && s.height < CLICK_SLOP) return;
          const pw = self.over.clientWidth, ph = self.over.clientHeight;
          const next: { x?: Range; y?: Range } = {};
          if (s.width < pw - 1) next.x = [self.posToVal(s.left, 'x'), self.posToVal(s.left + s.width, 'x')];
          if (s.height < ph - 1) next.y = [self.posToVal(s.top + s.height, 'y'), self.posToVal(s.top, 'y')];
          self.setSelect({ left: 0, top: 0, width: 0, height: 0 }, false);
          setView(next);
        },
      ],
      setScale: [
        (_self, key) => {
          if (key === 'x' || key === 'y') viewListeners.forEach((f) => f(view()));
        },
      ],
    },
  };
  if (opts.yDown) options.scales!.y!.dir = -1;
  u = new uPlot(options, opts.data, host);
  u.over.setAttribute('role', 'img');
  u.over.setAttribute('aria-label', opts.name);
  u.over.tabIndex = 0;
  u.over.addEventListener('click', (e) => {
    if (!e.shiftKey) clicks.forEach((f) => f(point(e)));
  });
  u.over.addEventListener('keydown', (e) => {
    const v = view();
    const w = v.x[1] - v.x[0];
    if (e.key === 'ArrowLeft' || e.key === 'ArrowRight') {
      const d = (e.key === 'ArrowLeft' ? -0.1 : 0.1) * w;
      setView({ x: [v.x[0] + d, v.x[1] + d] });
      e.preventDefault();
    } else if (e.key === 'Home' || e.key === 'Escape') {
      chart.whole();
      e.preventDefault();
    }
  });

  const chart: Chart = {
    u,
    view,
    setView,
    whole() {
      yFixed = opts.whole?.y ?? null;
      u.batch(() => {
        u.setScale('x', { min: wholeX[0], max: wholeX[1] });
        if (yFixed) u.setScale('y', { min: yFixed[0], max: yFixed[1] });
      });
    },
    reveal(t0, t1 = t0) {
      const v = view();
      const w = v.x[1] - v.x[0];
      const lo = Math.min(t0, t1), hi = Math.max(t0, t1);
      if (lo >= v.x[0] && hi <= v.x[1]) return;
      if (hi - lo > 0.8 * w) {
        const m = (hi - lo) * 0.15 || w * 0.1;
        setView({ x: [lo - m, hi + m] });
        return;
      }
      const c = (lo + hi) / 2;
      setView({ x: [c - w / 2, c + w / 2] });
    },
    overlays,
    grabbers,
    clicks,
    viewListeners,
    redraw: () => u.redraw(false, false),
    resize: (w) => u.setSize({ width: w, height: opts.height }),
  };
  if (opts.initial?.x || opts.initial?.y) setView(opts.initial);
  return chart;
}
