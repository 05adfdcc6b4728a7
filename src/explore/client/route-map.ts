// The route section: per path from the driver pin to a receiver, the space–time map (distance across,
// time running downward, coloured as the PNG map) and below it the voltage along that path at the
// instant the time slider chooses; segment ends dashed, lumped parts solid, receivers named. The play
// button steps through the recorded instants of the map's time view, over and over. A branched net has
// one path per receiver: the Path chooser shows one of them (the main path first) or all, one under
// another, on one time slider.
import type { MapData, MapItem, MapPath } from '../payload.js';
import { createChart, type Chart } from './chart.js';
import { el, innerWidth, replaceChildren, section } from './dom.js';
import { formatSI } from './format.js';
import { unpack } from './packed.js';
import { viewReadout } from './waveforms.js';

export interface RouteView {
  element: HTMLElement;
  mount(): void;
  /** Moves the slider to the recorded instant nearest t. */
  setTime(t: number): void;
}

/** Speeds of the animation: recorded instants per animation frame. */
const SPEEDS: readonly [string, number][] = [
  ['slow', 0.25],
  ['normal', 1],
  ['fast', 4],
];

/** Columns of the map image: the path resampled to equal steps of distance, as the PNG map is. */
const IMAGE_COLUMNS = 720;

interface PathView {
  path: MapPath;
  box: HTMLElement;
  map: Chart;
  profile: Chart;
  table: HTMLElement;
  details: HTMLDetailsElement;
}

/** Column c of row r of the map. */
type Sample = (r: number, c: number) => number;

/** The path's map as an image: rows × IMAGE_COLUMNS pixels, linear interpolation between recorded places. */
function mapImage(path: MapPath, rows: number, at: Sample, colors: MapData['colors']): HTMLCanvasElement {
  const pos = path.positions;
  const n = pos.length;
  const x0 = pos[0]!, L = pos[n - 1]! - x0;
  const W = L > 0 ? IMAGE_COLUMNS : 1;
  const lo = new Int32Array(W), w = new Float64Array(W);
  let k = 0;
  for (let i = 0; i < W; i++) {
    const x = x0 + ((i + 0.5) * L) / W;
    while (k < n - 2 && pos[k + 1]! <= x) k++;
    lo[i] = k;
    const span = n > 1 ? pos[k + 1]! - pos[k]! : 0;
    w[i] = span > 0 ? Math.min(1, Math.max(0, (x - pos[k]!) / span)) : 0;
  }
  const canvas = document.createElement('canvas');
  canvas.width = W;
  canvas.height = rows;
  const ctx = canvas.getContext('2d')!;
  const img = ctx.createImageData(W, rows);
  const rgb = colors.palette.map((h) => [parseInt(h.slice(1, 3), 16), parseInt(h.slice(3, 5), 16), parseInt(h.slice(5, 7), 16)] as const);
  const kf = 255 / (colors.hi - colors.lo);
  for (let r = 0; r < rows; r++) {
    for (let i = 0; i < W; i++) {
      const c = path.columns[lo[i]!]!, c1 = path.columns[Math.min(n - 1, lo[i]! + 1)]!;
      const v = at(r, c) * (1 - w[i]!) + at(r, c1) * w[i]!;
      const q = Math.max(0, Math.min(255, Math.round((v - colors.lo) * kf)));
      const [R, G, B] = rgb[q]!;
      const o = (r * W + i) * 4;
      img.data[o] = R;
      img.data[o + 1] = G;
      img.data[o + 2] = B;
      img.data[o + 3] = 255;
    }
  }
  ctx.putImageData(img, 0, 0);
  return canvas;
}

/** Dashed lines at the ends of line segments, solid ones at lumped parts (canvas pixels). */
function drawPlaces(u: uPlot, ctx: CanvasRenderingContext2D, path: MapPath, light: boolean, labels: boolean): void {
  const items = path.items;
  const { top, height, left, width } = u.bbox;
  const r = devicePixelRatio || 1;
  ctx.save();
  ctx.beginPath();
  ctx.rect(left, top, width, height);
  ctx.clip();
  const ink = light ? 'rgba(31, 36, 48, 0.55)' : '#2b2f38';
  const seen = new Set<number>();
  for (const it of items) {
    const lumped = it.kind !== 'line';
    const xs = lumped ? [it.from] : [it.from, it.to];
    for (const at of xs) {
      if (!lumped && seen.has(at)) continue;
      seen.add(at);
      const x = Math.round(u.valToPos(at, 'x', true)) + 0.5;
      ctx.strokeStyle = ink;
      ctx.lineWidth = (lumped ? 2 : 1) * r;
      ctx.setLineDash(lumped ? [] : [5 * r, 4 * r]);
      ctx.beginPath();
      ctx.moveTo(x, top);
      ctx.lineTo(x, top + height);
      ctx.stroke();
    }
  }
  if (labels) placeLabels(u, ctx, path);
  ctx.restore();
}

/** Names of segments (mid-span) and parts (at their place) above the plot, on up to three rows, none overlapping. */
function placeLabels(u: uPlot, ctx: CanvasRenderingContext2D, path: MapPath): void {
  const items = path.items;
  const n = path.positions.length;
  const { top, left, width } = u.bbox;
  const r = devicePixelRatio || 1;
  const rowH = 14 * r;
  const taken: [number, number][][] = [[], [], []];
  ctx.save();
  ctx.setLineDash([]);
  ctx.fillStyle = '#1f2430';
  ctx.textBaseline = 'top';
  ctx.textAlign = 'left';
  // parts first: they are the narrow marks a reader looks for
  // the path's ends, then parts (the narrow marks a reader looks for), then segments
  type Label = { text: string; at: number; bold: boolean; align: 'left' | 'center' | 'right' };
  const ordered: Label[] = [
    { text: 'driver pin', at: path.positions[0]!, bold: false, align: 'left' },
    { text: path.receiver, at: path.positions[n - 1]!, bold: true, align: 'right' },
    ...items.filter((it) => it.kind !== 'line').map((it): Label => ({ text: partLabel(path, it), at: it.from, bold: true, align: 'center' })),
    ...items.filter((it) => it.kind === 'line').map((it): Label => ({ text: it.name, at: (it.from + it.to) / 2, bold: false, align: 'center' })),
  ];
  for (const it of ordered) {
    ctx.font = `${it.bold ? 'bold ' : ''}${11 * r}px system-ui, sans-serif`;
    const w = ctx.measureText(it.text).width + 6 * r;
    const px = u.valToPos(it.at, 'x', true);
    const want = it.align === 'left' ? px : it.align === 'right' ? px - w : px - w / 2;
    const x0 = Math.max(left + 2 * r, Math.min(left + width - w - 2 * r, want));
    const row = taken.findIndex((spans) => spans.every(([a, b]) => x0 + w <= a || x0 >= b));
    if (row < 0) continue;
    taken[row]!.push([x0, x0 + w]);
    ctx.fillStyle = 'rgba(255, 255, 255, 0.85)';
    ctx.fillRect(x0, top + (2 + row * 14) * r, w, rowH - r);
    ctx.fillStyle = '#1f2430';
    ctx.fillText(it.text, x0 + 3 * r, top + (3 + row * 14) * r);
  }
  ctx.restore();
}

/** A horizontal line across the map at the slider's instant. */
function drawNow(u: uPlot, ctx: CanvasRenderingContext2D, t: number): void {
  const y = Math.round(u.valToPos(t, 'y', true)) + 0.5;
  const { top, height, left, width } = u.bbox;
  if (y < top || y > top + height) return;
  ctx.save();
  ctx.strokeStyle = '#111111';
  ctx.lineWidth = 2 * (devicePixelRatio || 1);
  ctx.beginPath();
  ctx.moveTo(left, y);
  ctx.lineTo(left + width, y);
  ctx.stroke();
  ctx.restore();
}

/** A part's name; a branch point's also says where the other paths leaving there go ("tee1 ⤷ adcA"). */
function partLabel(path: MapPath, it: MapItem): string {
  if (it.kind !== 'branch') return it.name;
  const leaving = path.junctions.filter((j) => j.item === it.name).flatMap((j) => j.receivers);
  return leaving.length ? `${it.name} ⤷ ${leaving.join(', ')}` : it.name;
}

function pathTitle(path: MapPath, index: number, many: boolean): string {
  if (!many) return 'Driver pin to receiver';
  return `${index === 0 ? 'Main path' : 'Branch'}: driver pin to ${path.receiver}`;
}

/** The chooser of a branched net's paths: each one alone, or every path one under another. */
function pathChooser(paths: MapPath[]): HTMLSelectElement {
  return el(
    'select',
    { id: 'map-path', 'aria-label': 'path shown along the route' },
    ...paths.map((p, k) => el('option', { value: k, selected: k === 0 }, `${k === 0 ? 'main path' : 'branch'} to ${p.receiver}`)),
    el('option', { value: 'all' }, `every path (${paths.length}), one under another`),
  );
}

/** The smallest and largest voltage anywhere on the map, padded by 5 %: the profile's fixed scale. */
function valueRange(values: ArrayLike<number>): [number, number] {
  let lo = Infinity, hi = -Infinity;
  for (let i = 0; i < values.length; i++) {
    const v = values[i]!;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (!(hi > lo)) return [lo - 1, hi + 1];
  const pad = 0.05 * (hi - lo);
  return [lo - pad, hi + pad];
}

export function routeSection(map: MapData, onTime: (t: number) => void): RouteView {
  const data = unpack(map.values);
  const at: Sample = (r, c) => data[r * map.columns + c]!;
  const tEnd = (map.rows - 1) * map.dtRow;
  const profileRange = valueRange(data);
  let row = Math.max(0, Math.min(map.rows - 1, Math.round(map.start / map.dtRow)));
  let playing = false;
  let speed = 1;
  let phase = row;

  const slider = el('input', { type: 'range', id: 'map-time', min: 0, max: map.rows - 1, step: 1, value: row, 'aria-label': 'instant shown along the route' });
  const timeText = el('output', { id: 'map-time-text', for: 'map-time' });
  const play = el('button', { type: 'button', id: 'map-play', 'aria-pressed': 'false' }, 'Play');
  const speedSel = el('select', { id: 'map-speed', 'aria-label': 'animation speed' }, ...SPEEDS.map(([name, v]) => el('option', { value: v, selected: v === 1 }, name)));
  const wholeBtn = el('button', { type: 'button' }, 'Whole run');
  const holder = el('div', { class: 'paths' });
  const many = map.paths.length > 1;
  const chooser = many ? pathChooser(map.paths) : null;
  const element = section(
    'route',
    'Along the route',
    el(
      'p',
      { class: 'help' },
      'Top: voltage along the route over time (distance from the driver pin across, time running downward; warm above ' +
        `${formatSI(map.colors.center, 'V')}, cool below; dashed: ends of line segments, solid: lumped parts). Click the map or move the slider to choose an instant; ` +
        'below, the voltage along the route at that instant. Play steps through the instants of the map’s time view; zoom the map like the waveforms.',
    ),
    many ? el('p', { class: 'help' }, `This net branches: ${map.paths.length} paths from the driver pin, one per receiver, on one time axis and one colour scale. Choose the path to show; ⤷ marks where other paths leave.`) : null,
    el('div', { class: 'toolbar' }, chooser ? el('label', {}, 'Path ', chooser) : null, play, el('label', {}, 'Speed ', speedSel), el('label', { class: 'slider' }, 'Instant ', slider), timeText, wholeBtn),
    holder,
  );
  const views: PathView[] = [];

  function showRow(r: number, fromSlider = false): void {
    row = Math.max(0, Math.min(map.rows - 1, r));
    if (!fromSlider) slider.value = String(row);
    const t = row * map.dtRow;
    timeText.textContent = `t = ${formatSI(t, 's', 5)} (recorded instant ${row + 1} of ${map.rows})`;
    timeText.dataset.time = String(t);
    timeText.dataset.row = String(row);
    for (const v of views) {
      const ys = Float64Array.from(v.path.columns, (c) => at(row, c));
      v.profile.u.setData([Float64Array.from(v.path.positions), ys] as unknown as uPlot.AlignedData, false);
      v.map.redraw();
      if (v.details.open) fillTable(v, ys);
    }
    onTime(t);
  }

  function fillTable(v: PathView, ys: Float64Array): void {
    const rows = v.path.positions.map((x, j) =>
      el('tr', {}, el('td', { class: 'num', 'data-value': x }, formatSI(x, 'm', 5)), el('td', { class: 'num', 'data-column': v.path.columns[j]!, 'data-value': ys[j]! }, formatSI(ys[j]!, 'V', 5))),
    );
    replaceChildren(v.table, el('thead', {}, el('tr', {}, el('th', { scope: 'col' }, 'Distance'), el('th', { scope: 'col' }, 'Voltage'))), el('tbody', {}, ...rows));
    v.table.dataset.row = String(row);
  }

  function mount(): void {
    const width = innerWidth(element);
    map.paths.forEach((path, p) => {
      const mapHost = el('div', { class: 'chart map', id: `map-${p}` });
      const profileHost = el('div', { class: 'chart profile', id: `profile-${p}` });
      const table = el('table', { class: 'profile-table', id: `profile-table-${p}` });
      const details = el('details', {}, el('summary', {}, 'Values along the route at this instant'), table);
      const readout = viewReadout(`map-view-${p}`, 'm', 's');
      const box = el('div', { class: 'path', id: `path-${p}`, 'data-receiver': path.receiver, hidden: p > 0 }, el('h3', {}, pathTitle(path, p, many)), mapHost, readout.element, profileHost, details);
      holder.appendChild(box);
      const xWhole: [number, number] = [path.positions[0]!, path.positions[path.positions.length - 1]!];
      const image = mapImage(path, map.rows, at, map.colors);
      const mapChart = createChart(mapHost, width, {
        name: `space–time map, ${pathTitle(path, p, many)}`,
        x: { label: 'Distance from the driver pin', unit: 'm' },
        y: { label: 'Time', unit: 's' },
        height: 420,
        series: [],
        data: [Float64Array.from(xWhole)] as unknown as uPlot.AlignedData,
        whole: { x: xWhole, y: [0, tEnd] },
        initial: { y: map.window },
        yDown: true,
      });
      const L = xWhole[1] - xWhole[0];
      mapChart.overlays.push((u, ctx) => {
        const { top, height, left, width: w } = u.bbox;
        const half = L > 0 ? 0 : 5e-4;
        const x0 = u.valToPos(xWhole[0] - half, 'x', true), x1 = u.valToPos(xWhole[1] + half, 'x', true);
        const y0 = u.valToPos(-map.dtRow / 2, 'y', true), y1 = u.valToPos((map.rows - 0.5) * map.dtRow, 'y', true);
        ctx.save();
        ctx.beginPath();
        ctx.rect(left, top, w, height);
        ctx.clip();
        ctx.imageSmoothingEnabled = true;
        ctx.drawImage(image, 0, 0, image.width, image.height, x0, y0, x1 - x0, y1 - y0);
        ctx.restore();
      });
      mapChart.overlays.push((u, ctx) => drawPlaces(u, ctx, path, true, false));
      mapChart.overlays.push((u, ctx) => drawNow(u, ctx, row * map.dtRow));
      mapChart.clicks.push((pt) => showRow(Math.round(pt.y / map.dtRow)));
      mapChart.viewListeners.push(readout.update);
      readout.update(mapChart.view());
      mapChart.redraw();

      const profile = createChart(profileHost, width, {
        name: `voltage along the route at the chosen instant, ${pathTitle(path, p, many)}`,
        x: { label: 'Distance from the driver pin', unit: 'm' },
        y: { label: 'Voltage', unit: 'V' },
        height: 260,
        series: [{ label: 'voltage', color: '#0072B2', width: 2 }],
        data: [Float64Array.from(path.positions), Float64Array.from(path.columns, (c) => at(row, c))] as unknown as uPlot.AlignedData,
        whole: { x: xWhole, y: profileRange },
      });
      profile.overlays.push((u, ctx) => drawPlaces(u, ctx, path, false, true));
      profile.redraw();
      const v: PathView = { path, box, map: mapChart, profile, table, details };
      details.addEventListener('toggle', () => details.open && fillTable(v, Float64Array.from(path.columns, (c) => at(row, c))));
      views.push(v);
      window.addEventListener('resize', () => {
        const w = innerWidth(element);
        mapChart.resize(w);
        profile.resize(w);
      });
    });
    choosePath(chooser?.value ?? '0');
    showRow(row);
  }

  function choosePath(choice: string): void {
    views.forEach((v, k) => (v.box.hidden = choice !== 'all' && String(k) !== choice));
    holder.dataset.shown = choice;
  }

  // the animation: through the instants of the first shown path's map view, looping
  function frame(): void {
    if (!playing) return;
    const v = (views.find((w) => !w.box.hidden) ?? views[0])?.map.view();
    const r0 = v ? Math.max(0, Math.ceil(v.y[0] / map.dtRow)) : 0;
    const r1 = v ? Math.min(map.rows - 1, Math.floor(v.y[1] / map.dtRow)) : map.rows - 1;
    phase += speed;
    if (phase > r1 || phase < r0) phase = r0;
    showRow(Math.floor(phase));
    requestAnimationFrame(frame);
  }
  play.addEventListener('click', () => {
    playing = !playing;
    play.textContent = playing ? 'Pause' : 'Play';
    play.setAttribute('aria-pressed', String(playing));
    phase = row;
    if (playing) requestAnimationFrame(frame);
  });
  chooser?.addEventListener('change', () => choosePath(chooser.value));
  speedSel.addEventListener('change', () => (speed = Number(speedSel.value)));
  slider.addEventListener('input', () => {
    showRow(Number(slider.value), true);
    phase = row;
  });
  wholeBtn.addEventListener('click', () => views.forEach((v) => v.map.whole()));

  return {
    element,
    mount,
    setTime: (t) => showRow(Math.round(t / map.dtRow)),
  };
}
