// Small drawing helpers shared by the views (map, bounce, TDR): a title block, wrapped text, a
// message panel for "cannot draw this", a waveform panel with time running downward, and number
// formatting for labels. Built on src/render's Surface and frame; nothing here knows about nets.
import { buildFrame, drawFrameBackground, drawFrameForeground, TYPE, type AxisSpec, type Frame, type FrameSpec } from '../render/frame.js';
import { overlaps } from '../render/layout.js';
import { THEME, type TraceStyle } from '../render/palette.js';
import { reduceTrace } from '../render/reduce.js';
import { extent, padDomain } from '../render/scale.js';
import type { Rect, Surface } from '../render/surface.js';
import { engineeringExponent, formatSi, MINUS, siPrefix } from '../render/ticks.js';

/** Lines of `text` no wider than `maxWidth` pixels, broken at spaces (a long word gets a line of its own). */
export function wrapText(s: Surface, text: string, size: number, maxWidth: number, bold = false): string[] {
  const out: string[] = [];
  for (const para of text.split('\n')) {
    let line = '';
    for (const word of para.split(/ +/)) {
      const next = line ? `${line} ${word}` : word;
      if (line && s.measureText(next, size, bold).width > maxWidth) {
        out.push(line);
        line = word;
      } else line = next;
    }
    out.push(line);
  }
  return out;
}

/** Height of one line of text at `size`, plus `gap`. */
export function lineStep(s: Surface, size: number, gap = 4, bold = false): number {
  const m = s.measureText('Hg', size, bold);
  return Math.ceil(m.ascent + m.descent) + gap;
}

/**
 * Title (bold) and subtitle (muted, wrapped) at the top of `area`; returns the height used,
 * including the gap below.
 */
export function drawTitleBlock(s: Surface, area: Rect, title: string, subtitle?: string): number {
  let y = area.y;
  const titleLines = wrapText(s, title, TYPE.title, area.w, true);
  for (const l of titleLines) {
    s.text(l, area.x, y, { size: TYPE.title, bold: true, baseline: 'top' });
    y += lineStep(s, TYPE.title, 4, true);
  }
  if (subtitle) {
    for (const l of wrapText(s, subtitle, TYPE.subtitle, area.w)) {
      s.text(l, area.x, y, { size: TYPE.subtitle, color: THEME.mutedText, baseline: 'top' });
      y += lineStep(s, TYPE.subtitle, 3);
    }
  }
  return y - area.y + 10;
}

/** A framed panel with a heading and wrapped lines (bullets for `items`), centred in `area`. */
export function drawMessagePanel(s: Surface, area: Rect, heading: string, items: readonly string[], note?: string): Rect {
  const pad = 18;
  const w = Math.min(area.w - 20, 640);
  const textW = w - 2 * pad;
  const head = wrapText(s, heading, 16, textW, true);
  const bullets = items.map((t) => wrapText(s, t, 13, textW - 16));
  const noteLines = note ? wrapText(s, note, 12, textW) : [];
  const hStep = lineStep(s, 16, 5, true), bStep = lineStep(s, 13, 4), nStep = lineStep(s, 12, 3);
  const h =
    2 * pad + head.length * hStep + 8 + bullets.reduce((acc, b) => acc + b.length * bStep + 4, 0) + (noteLines.length ? 8 + noteLines.length * nStep : 0);
  const box: Rect = { x: Math.round(area.x + (area.w - w) / 2), y: Math.round(area.y + Math.max(0, (area.h - h) / 2)), w, h: Math.round(h) };
  s.fillRect(box.x, box.y, box.w, box.h, NOTE_BOX.fill);
  s.strokeRect(box.x, box.y, box.w, box.h, NOTE_BOX.stroke, 2);
  let y = box.y + pad;
  for (const l of head) {
    s.text(l, box.x + pad, y, { size: 16, bold: true, baseline: 'top' });
    y += hStep;
  }
  y += 8;
  for (const b of bullets) {
    b.forEach((l, i) => {
      if (i === 0) s.text('•', box.x + pad, y, { size: 13, baseline: 'top' });
      s.text(l, box.x + pad + 16, y, { size: 13, baseline: 'top' });
      y += bStep;
    });
    y += 4;
  }
  if (noteLines.length) {
    y += 8;
    for (const l of noteLines) {
      s.text(l, box.x + pad, y, { size: 12, color: THEME.mutedText, baseline: 'top' });
      y += nStep;
    }
  }
  return box;
}

/** The tint and border of a warning or note box (also the message panel's). */
export const NOTE_BOX = { fill: '#fff8e6', stroke: '#c98a00' } as const;

/**
 * A tinted box of wrapped lines (the first bold) at the top-left of `area`, no wider than `maxWidth`;
 * returns its rectangle. For warnings drawn on a plot, where they cannot be missed.
 */
export function drawWarningBox(s: Surface, area: Rect, lines: readonly string[], maxWidth = 560): Rect {
  const pad = 10;
  const w = Math.min(area.w - 2 * pad, maxWidth);
  const wrapped = lines.map((l, i) => ({ bold: i === 0, parts: wrapText(s, l, 13, w - 2 * pad, i === 0) }));
  const step = lineStep(s, 13, 3);
  const h = 2 * pad + wrapped.reduce((a, l) => a + l.parts.length, 0) * step;
  const box: Rect = { x: area.x + pad, y: area.y + pad, w, h };
  s.fillRect(box.x, box.y, box.w, box.h, NOTE_BOX.fill, 0.95);
  s.strokeRect(box.x, box.y, box.w, box.h, NOTE_BOX.stroke, 2);
  let y = box.y + pad;
  for (const l of wrapped) {
    for (const part of l.parts) {
      s.text(part, box.x + pad, y, { size: 13, bold: l.bold, baseline: 'top', color: THEME.text });
      y += step;
    }
  }
  return box;
}

/** A signed number with a typographic minus (or plus) and `decimals` decimals: "+0.310", "−0.667". */
export function signed(v: number, decimals = 3): string {
  const s = Math.abs(v).toFixed(decimals);
  if (Number(s) === 0) return s;
  return (v < 0 ? MINUS : '+') + s;
}

/** A value with an SI prefix and exactly `digits` significant digits, trailing zeros kept: "1.10 V", "−250 mV". */
export function formatSiFixed(v: number, unit: string, digits = 3): string {
  if (v === 0 || !Number.isFinite(v)) return formatSi(v, unit, digits);
  let e = engineeringExponent(v);
  let m = v / Math.pow(10, e);
  if (Math.abs(Number(m.toPrecision(digits))) >= 1000 && e < 12) {
    e += 3;
    m = v / Math.pow(10, e);
  }
  return `${m.toPrecision(digits).replace('-', MINUS)} ${siPrefix(e)}${unit}`;
}

/** A voltage with its sign and 3 significant digits: "+833 mV", "−1.25 V", "+1.10 V". */
export function signedVolts(v: number, digits = 3): string {
  const t = formatSiFixed(v, 'V', digits);
  return v > 0 ? '+' + t : t;
}

/** Labels placed one by one, each skipped if it would overlap one already placed or leave `bounds`. */
export class LabelPlacer {
  private readonly placed: Rect[] = [];
  constructor(private readonly bounds?: Rect) {}
  /** Reserve an area (a label drawn elsewhere, a legend) so nothing is placed over it. */
  block(r: Rect): void {
    this.placed.push(r);
  }
  /** True (and reserved) when `r` is free. */
  tryPlace(r: Rect, margin = 2): boolean {
    const g: Rect = { x: r.x - margin, y: r.y - margin, w: r.w + 2 * margin, h: r.h + 2 * margin };
    if (this.bounds) {
      const b = this.bounds;
      if (r.x < b.x || r.y < b.y || r.x + r.w > b.x + b.w || r.y + r.h > b.y + b.h) return false;
    }
    if (this.placed.some((p) => overlaps(p, g))) return false;
    this.placed.push(g);
    return true;
  }
}

/** Text on a light box at (x, y) with the given alignment, if it fits; returns whether it was drawn. */
export function placeBoxedText(
  s: Surface,
  placer: LabelPlacer,
  text: string,
  x: number,
  y: number,
  opts: { size?: number; color?: string; align?: 'left' | 'center' | 'right'; baseline?: 'top' | 'middle' | 'bottom'; bold?: boolean; alpha?: number },
): boolean {
  const size = opts.size ?? TYPE.annotation;
  const m = s.measureText(text, size, opts.bold);
  const w = m.width + 6, h = m.ascent + m.descent + 2;
  const left = x - ({ left: 0, center: w / 2, right: w } as const)[opts.align ?? 'left'];
  const top = y - ({ top: 0, middle: h / 2, bottom: h } as const)[opts.baseline ?? 'middle'];
  const box = { x: left, y: top, w, h };
  if (!placer.tryPlace(box)) return false;
  s.fillRect(box.x, box.y, box.w, box.h, THEME.panel, opts.alpha ?? 0.9);
  s.text(text, box.x + 3, box.y + 1, { size, color: opts.color ?? THEME.text, baseline: 'top', bold: opts.bold });
  return true;
}

export interface TimeDownTrace {
  /** Samples at t = t0 + i·dt. */
  values: ArrayLike<number>;
  t0?: number;
  dt: number;
  style: TraceStyle;
}

export interface TimeDownStep {
  /** A piecewise-constant level: value on [from, to). */
  steps: readonly { from: number; to: number; value: number }[];
  style: TraceStyle;
}

export interface TimeDownSpec {
  title: string;
  subtitle?: string;
  /** Time interval shown (s); time runs downward. */
  time: readonly [number, number];
  voltageLabel?: string;
  traces: readonly TimeDownTrace[];
  levels?: readonly TimeDownStep[];
  topReserve?: number;
  /** Shown in the middle of the plot when there is no trace. */
  emptyText?: string;
}

/** Time-axis spec shared by panels that stack time downward. */
export function timeDownAxis(time: readonly [number, number]): AxisSpec & { domain: readonly [number, number] } {
  return { label: 'Time', unit: 's', domain: [time[1], time[0]] };
}

/**
 * A waveform panel turned on its side: voltage across, time running downward, so that it lines up
 * with a space–time or lattice panel beside it that shares the time axis.
 */
export function drawTimeDownPanel(s: Surface, area: Rect, spec: TimeDownSpec): Frame {
  const [t0, t1] = spec.time;
  const ranges: number[][] = [];
  for (const tr of spec.traces) {
    // only what is in view decides the voltage range
    const i0 = Math.max(0, Math.floor((t0 - (tr.t0 ?? 0)) / tr.dt));
    const i1 = Math.min(tr.values.length - 1, Math.ceil((t1 - (tr.t0 ?? 0)) / tr.dt));
    let lo = Infinity, hi = -Infinity;
    for (let i = i0; i <= i1; i++) {
      const x = tr.values[i];
      if (x < lo) lo = x;
      if (x > hi) hi = x;
    }
    if (hi >= lo) ranges.push([lo, hi]);
  }
  for (const l of spec.levels ?? []) ranges.push(l.steps.map((p) => p.value));
  const e = extent(ranges) ?? [0, 1];
  const v = padDomain(Math.min(e[0], 0), e[1], 0.08);
  const frameSpec: FrameSpec = {
    title: spec.title,
    subtitle: spec.subtitle,
    x: { label: spec.voltageLabel ?? 'Voltage', unit: 'V', domain: v },
    y: timeDownAxis(spec.time),
    topReserve: spec.topReserve,
  };
  const f = buildFrame(s, area, frameSpec);
  drawFrameBackground(s, f, { grid: true, zeroLine: false });
  const { plot } = f;
  const clip: Rect = { x: plot.x + 1, y: plot.y + 1, w: plot.w - 2, h: plot.h - 2 };
  // a strong line at 0 V (vertical here)
  if (v[0] < 0 && v[1] > 0) s.vline(Math.floor(f.x.map(0)), plot.y, plot.y + plot.h, THEME.gridStrong);
  for (const l of spec.levels ?? []) {
    const xs: number[] = [], ys: number[] = [];
    for (const p of l.steps) {
      const a = Math.max(p.from, t0), b = Math.min(p.to, t1);
      if (b < a) continue;
      xs.push(f.x.map(p.value), f.x.map(p.value));
      ys.push(f.y.map(a), f.y.map(b));
    }
    s.polyline(xs, ys, l.style, clip);
  }
  for (const tr of spec.traces) {
    const line = reduceTrace(tr.values, { x0: tr.t0 ?? 0, dx: tr.dt }, [Math.min(t0, t1), Math.max(t0, t1)], plot.h);
    const px = new Float64Array(line.xs.length), py = new Float64Array(line.xs.length);
    for (let k = 0; k < px.length; k++) {
      px[k] = f.x.map(line.ys[k]);
      py[k] = f.y.map(line.xs[k]);
    }
    s.polyline(px, py, tr.style, clip);
  }
  if (spec.emptyText && spec.traces.length === 0) {
    for (const [k, l] of wrapText(s, spec.emptyText, 12, plot.w - 20).entries()) {
      s.text(l, plot.x + plot.w / 2, plot.y + plot.h / 2 + k * 16, { size: 12, color: THEME.mutedText, align: 'center', baseline: 'middle' });
    }
  }
  drawFrameForeground(s, f, frameSpec);
  return f;
}
