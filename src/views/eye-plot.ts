// eye.png: the folded windows as a density (hits per pixel, sequential colour map) with the eye
// height and eye width marked at the sampling instant and threshold. Measurement: eye.ts.
import {
  drawHeatMap,
  encodePng,
  formatSi,
  OKABE_ITO,
  padDomain,
  Surface,
  THEME,
  type Frame,
  type HeatMapSpec,
  type ImageSize,
  type Marker,
  type Rect,
} from '../render/index.js';
import { eyeDensity, foldEye, foldedExtent, type EyeInput, type EyeMeasurement, type EyeWindows } from './eye.js';
import { drawWarningBox } from './panels.js';

export interface EyePlotSpec extends ImageSize {
  title: string;
  /** Probe name, for the subtitle. */
  probe: string;
  input: EyeInput;
}

const MARK = OKABE_ITO.vermillion;
const si = (v: number, unit: string) => formatSi(v, unit);

/** ±10 % UI → "±10 % UI" (the half-width of the sampling window as a share of the UI). */
function windowText(eye: EyeMeasurement): string {
  return `±${Number(((eye.samplingWindow.share * 100) / 2).toPrecision(3))} % UI`;
}

/** The subtitle of eye.png: what was folded, and the eye height and width, or that the eye is closed. */
export function eyeSubtitle(probe: string, eye: EyeMeasurement): string {
  const what =
    eye.signal === 'clock'
      ? 'clock'
      : /^prbs\d+$/i.test(eye.pattern)
        ? eye.pattern.toUpperCase().replace('PRBS', 'PRBS-')
        : `${eye.patternLength}-bit pattern`;
  const head = `Probe ${probe} · ${what}, UI ${si(eye.ui, 's')} · ${eye.windows} window${eye.windows === 1 ? '' : 's'} of 2 UI`;
  if (eye.eyeHeight === null || eye.eyeWidth === null) return head;
  // never a height beside "closed": a closed eye is closed, whatever the gap between the traces
  return eye.open
    ? `${head} · eye height ${si(eye.eyeHeight, 'V')} over the sampling window (${windowText(eye)}), eye width ${si(eye.eyeWidth, 's')}`
    : `${head} · eye closed at the thresholds`;
}

function thresholdMarkers(eye: EyeMeasurement): Marker[] {
  const th = eye.threshold;
  const m: Marker[] = [{ axis: 'x', at: eye.samplingOffset, label: 'sampling instant', color: THEME.axis }];
  if (th.source === 'vih/vil' && th.vih !== th.vil) {
    m.push({ axis: 'y', at: th.vih, label: `vih ${si(th.vih, 'V')}`, color: THEME.axis });
    m.push({ axis: 'y', at: th.vil, label: `vil ${si(th.vil, 'V')}`, color: THEME.axis });
  } else {
    m.push({ axis: 'y', at: th.level, label: `threshold ${si(th.level, 'V')} (${th.source})`, color: THEME.axis });
  }
  return m;
}

function heatSpec(spec: EyePlotSpec, eye: EyeMeasurement, windows: EyeWindows, yDomain: [number, number], nx: number, ny: number, plotW: number, plotH: number): HeatMapSpec {
  const span = 2 * eye.ui;
  // grid cells centred on pixel centres: the axis maps [0, span] onto pixel centres plot.x … plot.x + w − 1
  const hx = span / Math.max(1, plotW - 1) / 2;
  const hy = (yDomain[1] - yDomain[0]) / Math.max(1, plotH - 1) / 2;
  const xRange: [number, number] = [-hx, span + hx];
  const yRange: [number, number] = [yDomain[0] - hy, yDomain[1] + hy];
  const counts = eyeDensity(spec.input, windows, { nx, ny, xRange, yRange });
  for (let i = 0; i < counts.length; i++) if (counts[i] === 0) counts[i] = NaN; // empty: background
  return {
    title: spec.title,
    subtitle: eyeSubtitle(spec.probe, eye),
    x: { label: 'Time in window', unit: 's', domain: [0, span] },
    y: { label: 'Voltage', unit: 'V', domain: yDomain },
    grid: { values: counts, nx, ny, xRange, yRange },
    // whole counts from 1 (the darkest colour, so a single trace reads on the light background)
    color: { kind: 'sequential', label: 'Windows through the pixel', range: [1, Math.max(2, maxOf(counts))], integer: true },
    markers: thresholdMarkers(eye),
  };
}

function maxOf(a: Float64Array): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) if (a[i] > m) m = a[i];
  return m;
}

/** A bar with end caps between two pixel points, on a light halo so it reads over any colour. */
function bar(s: Surface, x0: number, y0: number, x1: number, y1: number): void {
  const vertical = Math.abs(x1 - x0) < Math.abs(y1 - y0);
  const cap = 6;
  const segs: [number, number, number, number][] = vertical
    ? [[x0, y0, x1, y1], [x0 - cap, y0, x0 + cap, y0], [x1 - cap, y1, x1 + cap, y1]]
    : [[x0, y0, x1, y1], [x0, y0 - cap, x0, y0 + cap], [x1, y1 - cap, x1, y1 + cap]];
  for (const [a, b, c, d] of segs) s.line(a, b, c, d, { color: THEME.page, width: 5 });
  for (const [a, b, c, d] of segs) s.line(a, b, c, d, { color: MARK, width: 2 });
}

function label(s: Surface, text: string, x: number, y: number, area: Rect, baseline: 'top' | 'bottom'): void {
  const m = s.measureText(text, 13, true);
  const w = m.width, h = m.ascent + m.descent;
  const left = Math.min(Math.max(x, area.x + 4), area.x + area.w - w - 4);
  const top = baseline === 'top' ? y : y - h;
  s.fillRect(left - 4, top - 2, w + 8, h + 4, THEME.page, 0.9);
  s.text(text, left, top, { size: 13, bold: true, color: MARK, baseline: 'top' });
}

/** The sampling window as a light band over the whole plot height, labelled at its top. */
function drawSamplingWindow(s: Surface, f: Frame, eye: EyeMeasurement): void {
  const { plot } = f;
  const x0 = f.x.map(eye.samplingWindow.from), x1 = f.x.map(eye.samplingWindow.to);
  if (!(x1 - x0 >= 1)) return;
  s.fillRect(x0, plot.y, x1 - x0, plot.h, THEME.page, 0.18);
  s.vline(Math.round(x0), plot.y, plot.y + plot.h, THEME.axis, 1, [2, 3]);
  s.vline(Math.round(x1), plot.y, plot.y + plot.h, THEME.axis, 1, [2, 3]);
  const text = `sampling window ${windowText(eye)}`;
  const w = s.measureText(text, 11).width;
  s.fillRect((x0 + x1) / 2 - w / 2 - 3, plot.y + plot.h - 20, w + 6, 16, THEME.page, 0.9);
  s.text(text, (x0 + x1) / 2, plot.y + plot.h - 12, { size: 11, color: THEME.mutedText, align: 'center', baseline: 'middle' });
}

function drawEyeMarks(s: Surface, f: Frame, eye: EyeMeasurement): void {
  const { plot } = f;
  const xs = Math.floor(f.x.map(eye.samplingOffset)) + 0.5;
  drawSamplingWindow(s, f, eye);
  if (eye.open && eye.lowestOne !== null && eye.highestZero !== null && eye.eyeHeight !== null && eye.eyeHeight > 0) {
    const yTop = f.y.map(eye.lowestOne), yBot = f.y.map(eye.highestZero);
    bar(s, xs, yTop, xs, yBot);
    const yMid = f.y.map((eye.lowestOne + eye.threshold.vih) / 2);
    label(s, `eye height ${si(eye.eyeHeight, 'V')}`, xs + 10, yMid, plot, 'bottom');
  }
  if (eye.open && eye.openFrom !== null && eye.openTo !== null && eye.eyeWidth !== null) {
    const th = eye.threshold;
    if (th.vih > th.vil) {
      // the open region inside the undefined band between vil and vih
      const x0 = f.x.map(eye.openFrom), x1 = f.x.map(eye.openTo);
      const y0 = f.y.map(th.vih), y1 = f.y.map(th.vil);
      s.fillRect(x0, y0, x1 - x0, y1 - y0, MARK, 0.08);
      s.polyline([x0, x1, x1, x0, x0], [y0, y0, y1, y1, y0], { color: MARK, width: 1, dash: [4, 3] });
    }
    const y = f.y.map(th.level) + 0.5;
    bar(s, f.x.map(eye.openFrom), y, f.x.map(eye.openTo), y);
    const yLow = f.y.map((eye.threshold.vil + (eye.highestZero ?? eye.threshold.vil)) / 2);
    label(s, `eye width ${si(eye.eyeWidth, 's')}`, f.x.map(eye.openFrom) + 10, Math.max(y + 12, yLow), plot, 'top');
  }
  if (!eye.open && eye.windows > 0) {
    label(s, 'eye closed at the sampling instant', xs + 10, plot.y + plot.h / 2, plot, 'bottom');
  }
  // warnings where they cannot be missed: thresholds the signal cannot reach, too few windows
  const warnings = [...eye.warnings, ...(eye.notes.windows && eye.windows > 0 ? [eye.notes.windows] : [])];
  if (warnings.length) drawWarningBox(s, plot, ['Read with care:', ...warnings]);
}

/** Draws the eye into `area` of `surface`; returns the frame and the measurement. */
export function drawEye(surface: Surface, area: Rect, spec: EyePlotSpec): { frame: Frame; eye: EyeMeasurement } {
  const { eye, windows } = foldEye(spec.input);
  if (windows.bits.length === 0) throw new RangeError('eye diagram: the record holds no complete two-UI window; run longer');
  const [lo, hi] = foldedExtent(spec.input, windows);
  const yDomain = padDomain(Math.min(lo, eye.threshold.vil), Math.max(hi, eye.threshold.vih), 0.08);
  // Lay out once with a rough grid to learn the plot size, then count hits on a grid of one cell per pixel.
  const scratch = new Surface(surface.width, surface.height);
  let w = Math.max(10, area.w - 260), h = Math.max(10, area.h - 160);
  for (let pass = 0; pass < 3; pass++) {
    const f = drawHeatMap(scratch, area, heatSpec(spec, eye, windows, yDomain, w, h, w, h));
    if (f.plot.w === w && f.plot.h === h) break;
    ({ w, h } = f.plot);
  }
  const frame = drawHeatMap(surface, area, heatSpec(spec, eye, windows, yDomain, w, h, w, h));
  drawEyeMarks(surface, frame, eye);
  return { frame, eye };
}

/** eye.png (default 1200 × 700) and the eye measurement it shows. */
export async function renderEye(spec: EyePlotSpec): Promise<{ png: Buffer; eye: EyeMeasurement }> {
  const surface = new Surface(spec.width ?? 1200, spec.height ?? 700);
  const { eye } = drawEye(surface, { x: 0, y: 0, w: surface.width, h: surface.height }, spec);
  return { png: encodePng(surface), eye };
}
