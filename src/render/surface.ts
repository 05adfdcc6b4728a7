// A raster surface to draw plots on: pureimage's bitmap and anti-aliased line
// drawing, DejaVu text rasterized through pureimage at 3× and box-filtered down
// (pureimage alone anti-aliases glyph edges horizontally only), crisp
// pixel-aligned rules for grids and axes, direct pixel access for heat maps,
// and PNG encoding with pngjs.
import { PNG } from 'pngjs';
import * as PImage from 'pureimage';
import { fontFamily } from './fonts.js';
import { hexToRgb, THEME, type RGB } from './palette.js';

export interface Rect {
  x: number;
  y: number;
  w: number;
  h: number;
}

export type TextAlign = 'left' | 'center' | 'right';
export type TextBaseline = 'top' | 'middle' | 'alphabetic' | 'bottom';

export interface TextStyle {
  /** Em size in pixels (default 13). */
  size?: number;
  /** Hex colour (default THEME.text). */
  color?: string;
  bold?: boolean;
  align?: TextAlign;
  baseline?: TextBaseline;
  /** −90: reads bottom to top (y-axis titles); 90: top to bottom. */
  rotate?: 0 | 90 | -90;
}

export interface LineStyle {
  /** Hex colour. */
  color: string;
  /** Stroke width in pixels (default 1). */
  width?: number;
  /** Dash pattern in pixels (on, off, …); empty or absent = solid. */
  dash?: readonly number[];
}

export interface TextMetrics {
  width: number;
  /** Distance from baseline up to the font's ascender (positive). */
  ascent: number;
  /** Distance from baseline down to the font's descender (positive). */
  descent: number;
}

/** Text is rasterized at SUPERSAMPLE× and averaged down. */
const SUPERSAMPLE = 3;

type PLine = Parameters<PImage.Context['drawLine_aa']>[0];

export class Surface {
  readonly width: number;
  readonly height: number;
  readonly bitmap: PImage.Bitmap;
  private readonly ctx: PImage.Context;
  /** A context used only to measure text (pureimage measures through a context's font). */
  private readonly measureCtx: PImage.Context;

  constructor(width: number, height: number, background: string = THEME.page) {
    if (!(Number.isInteger(width) && width > 0 && Number.isInteger(height) && height > 0)) {
      throw new RangeError(`surface size must be positive integers, got ${width}×${height}`);
    }
    if (width * height > 64e6) throw new RangeError(`surface ${width}×${height} is too large`);
    this.width = width;
    this.height = height;
    this.bitmap = PImage.make(width, height);
    this.ctx = this.bitmap.getContext('2d');
    this.measureCtx = PImage.make(1, 1).getContext('2d');
    this.fillRect(0, 0, width, height, background);
  }

  // ---------------------------------------------------------------- pixels

  /** Blend colour `c` over pixel (x, y) with coverage `a` in [0, 1]. Out-of-bounds is ignored. */
  blendPixel(x: number, y: number, c: RGB, a: number): void {
    if (x < 0 || y < 0 || x >= this.width || y >= this.height || !(a > 0)) return;
    const d = this.bitmap.data;
    const i = (y * this.width + x) * 4;
    if (a >= 1) {
      d[i] = c[0];
      d[i + 1] = c[1];
      d[i + 2] = c[2];
    } else {
      d[i] = d[i] + (c[0] - d[i]) * a + 0.5;
      d[i + 1] = d[i + 1] + (c[1] - d[i + 1]) * a + 0.5;
      d[i + 2] = d[i + 2] + (c[2] - d[i + 2]) * a + 0.5;
    }
    d[i + 3] = 255;
  }

  /** Pixel colour at (x, y) as [r, g, b]. */
  getPixel(x: number, y: number): RGB {
    const i = (y * this.width + x) * 4;
    const d = this.bitmap.data;
    return [d[i], d[i + 1], d[i + 2]];
  }

  /** Fill the pixels whose centres lie inside the rectangle (crisp edges). */
  fillRect(x: number, y: number, w: number, h: number, color: string | RGB, alpha = 1): void {
    const c = typeof color === 'string' ? hexToRgb(color) : color;
    const x0 = Math.max(0, Math.round(x));
    const y0 = Math.max(0, Math.round(y));
    const x1 = Math.min(this.width, Math.round(x + w));
    const y1 = Math.min(this.height, Math.round(y + h));
    for (let j = y0; j < y1; j++) for (let i = x0; i < x1; i++) this.blendPixel(i, j, c, alpha);
  }

  /** Anti-aliased filled disc centred at (cx, cy) (pixel-centre coordinates: pixel i spans [i, i+1)). */
  fillCircle(cx: number, cy: number, r: number, color: string | RGB): void {
    const c = typeof color === 'string' ? hexToRgb(color) : color;
    for (let j = Math.floor(cy - r - 1); j <= Math.ceil(cy + r + 1); j++) {
      for (let i = Math.floor(cx - r - 1); i <= Math.ceil(cx + r + 1); i++) {
        const d = Math.hypot(i + 0.5 - cx, j + 0.5 - cy);
        this.blendPixel(i, j, c, Math.min(1, Math.max(0, r + 0.5 - d)));
      }
    }
  }

  /** Crisp rectangle outline, `width` pixels inside the rectangle's edge. */
  strokeRect(x: number, y: number, w: number, h: number, color: string, width = 1): void {
    this.fillRect(x, y, w, width, color);
    this.fillRect(x, y + h - width, w, width, color);
    this.fillRect(x, y, width, h, color);
    this.fillRect(x + w - width, y, width, h, color);
  }

  /** Crisp horizontal rule through row floor(y), from x0 to x1, optionally dashed. */
  hline(x0: number, x1: number, y: number, color: string, width = 1, dash: readonly number[] = []): void {
    if (x1 < x0) [x0, x1] = [x1, x0];
    const row = Math.floor(y) - Math.floor((width - 1) / 2);
    for (const [a, b] of dashRuns(x1 - x0, dash)) this.fillRect(x0 + a, row, b - a, width, color);
  }

  /** Crisp vertical rule through column floor(x), from y0 to y1, optionally dashed. */
  vline(x: number, y0: number, y1: number, color: string, width = 1, dash: readonly number[] = []): void {
    if (y1 < y0) [y0, y1] = [y1, y0];
    const col = Math.floor(x) - Math.floor((width - 1) / 2);
    for (const [a, b] of dashRuns(y1 - y0, dash)) this.fillRect(col, y0 + a, width, b - a, color);
  }

  // ---------------------------------------------------------------- lines

  /** One anti-aliased segment (pureimage's thick-line Bresenham); endpoints snap to pixels. */
  line(x0: number, y0: number, x1: number, y1: number, style: LineStyle): void {
    if (![x0, y0, x1, y1].every(Number.isFinite)) return;
    // keep far-off coordinates from walking millions of pixels outside the image
    const clipped = clipSegment(x0, y0, x1, y1, { x: -8, y: -8, w: this.width + 16, h: this.height + 16 });
    if (!clipped) return;
    [x0, y0, x1, y1] = clipped;
    this.ctx.strokeStyle = style.color;
    this.ctx.lineWidth = style.width ?? 1;
    const seg = { start: { x: Math.floor(x0), y: Math.floor(y0) }, end: { x: Math.floor(x1), y: Math.floor(y1) } };
    this.ctx.drawLine_aa(seg as unknown as PLine);
  }

  /**
   * An anti-aliased polyline in pixel coordinates. NaN points break the line.
   * Dashes run continuously along the whole line; `clip` limits drawing to a rectangle.
   */
  polyline(xs: ArrayLike<number>, ys: ArrayLike<number>, style: LineStyle, clip?: Rect): void {
    const dash = style.dash && style.dash.length > 0 && style.dash.some((d) => d > 0) ? style.dash : null;
    let phase = 0; // distance along the dash pattern
    const period = dash ? dash.reduce((s, d) => s + d, 0) : 0;
    const n = Math.min(xs.length, ys.length);
    for (let i = 1; i < n; i++) {
      const ax = xs[i - 1], ay = ys[i - 1], bx = xs[i], by = ys[i];
      if (!(Number.isFinite(ax) && Number.isFinite(ay) && Number.isFinite(bx) && Number.isFinite(by))) continue;
      const len = Math.hypot(bx - ax, by - ay);
      if (!dash) {
        this.clippedLine(ax, ay, bx, by, style, clip);
        continue;
      }
      // walk the dash pattern along this segment
      let s = 0;
      while (s < len) {
        let k = 0;
        let acc = 0;
        const p = phase % period;
        while (acc + dash[k] <= p) {
          acc += dash[k];
          k = (k + 1) % dash.length;
        }
        const left = acc + dash[k] - p; // rest of the current dash or gap
        const e = Math.min(len, s + left);
        if (k % 2 === 0 && e > s) {
          const t0 = s / len, t1 = e / len;
          this.clippedLine(ax + (bx - ax) * t0, ay + (by - ay) * t0, ax + (bx - ax) * t1, ay + (by - ay) * t1, style, clip);
        }
        phase += e - s;
        s = e;
      }
    }
  }

  private clippedLine(x0: number, y0: number, x1: number, y1: number, style: LineStyle, clip?: Rect): void {
    if (clip) {
      const c = clipSegment(x0, y0, x1, y1, clip);
      if (!c) return;
      [x0, y0, x1, y1] = c;
    }
    this.line(x0, y0, x1, y1, style);
  }

  // ---------------------------------------------------------------- text

  measureText(text: string, size = 13, bold = false): TextMetrics {
    const ctx = this.measureCtx;
    ctx.font = `${size}px ${fontFamily(bold ? 'bold' : 'regular')}`;
    const m = ctx.measureText(text);
    // pureimage truncates the size to an integer; scale to the exact size asked for
    const k = size / Math.max(1, Math.trunc(size));
    return { width: m.width * k, ascent: m.emHeightAscent * k, descent: -m.emHeightDescent * k };
  }

  /**
   * Draw `text` anchored at (x, y) per `align`/`baseline` (before rotation).
   * Returns the bounding box of the drawn text in surface pixels.
   */
  text(text: string, x: number, y: number, style: TextStyle = {}): Rect {
    const size = style.size ?? 13;
    const bold = style.bold ?? false;
    const color = hexToRgb(style.color ?? THEME.text);
    const rotate = style.rotate ?? 0;
    if (text.length === 0) return { x, y, w: 0, h: 0 };
    const m = this.measureText(text, size, bold);
    const du = -m.width * ({ left: 0, center: 0.5, right: 1 } as const)[style.align ?? 'left'];
    const dv = ({ top: m.ascent, middle: (m.ascent - m.descent) / 2, alphabetic: 0, bottom: -m.descent } as const)[
      style.baseline ?? 'alphabetic'
    ];
    if (rotate === 0) {
      // baseline-left of the text in surface pixels; keep its sub-pixel offset
      const ox = x + du, oy = y + dv;
      const X0 = Math.floor(ox) - 1, Y0 = Math.floor(oy - m.ascent) - 1;
      const mask = this.rasterize(text, size, bold, m, ox - X0, oy - Y0);
      for (let j = 0; j < mask.h; j++) {
        for (let i = 0; i < mask.w; i++) this.blendPixel(X0 + i, Y0 + j, color, mask.cov[j * mask.w + i]);
      }
      return { x: ox, y: oy - m.ascent, w: m.width, h: m.ascent + m.descent };
    }
    // rotated by ±90°: render upright on whole pixels, then transpose into place
    const mask = this.rasterize(text, size, bold, m, 1, Math.ceil(m.ascent) + 1);
    const bx = 1, by = Math.ceil(m.ascent) + 1;
    if (rotate === -90) {
      // local u (along the text) → −y, local v (down) → +x
      const ox = x + dv, oy = y - du;
      const X0 = Math.round(ox - by), Y0 = Math.round(oy + bx);
      for (let j = 0; j < mask.h; j++) {
        for (let i = 0; i < mask.w; i++) this.blendPixel(X0 + j, Y0 - i, color, mask.cov[j * mask.w + i]);
      }
      return { x: ox - m.ascent, y: oy - m.width, w: m.ascent + m.descent, h: m.width };
    }
    // +90: u → +y, v → −x
    const ox = x - dv, oy = y + du;
    const X0 = Math.round(ox + by), Y0 = Math.round(oy - bx);
    for (let j = 0; j < mask.h; j++) {
      for (let i = 0; i < mask.w; i++) this.blendPixel(X0 - j, Y0 + i, color, mask.cov[j * mask.w + i]);
    }
    return { x: ox - m.descent, y: oy, w: m.ascent + m.descent, h: m.width };
  }

  /**
   * Coverage mask of `text` with its baseline-left at mask coordinates (bx, by):
   * drawn white on black at SUPERSAMPLE× with pureimage, then box-averaged.
   */
  private rasterize(
    text: string,
    size: number,
    bold: boolean,
    m: TextMetrics,
    bx: number,
    by: number,
  ): { w: number; h: number; cov: Float32Array } {
    const S = SUPERSAMPLE;
    const w = Math.ceil(bx + m.width) + 2;
    const h = Math.ceil(by + m.descent) + 2;
    const img = PImage.make(w * S, h * S); // starts opaque black
    const ctx = img.getContext('2d');
    ctx.fillStyle = '#ffffff';
    ctx.font = `${Math.round(size * S)}px ${fontFamily(bold ? 'bold' : 'regular')}`;
    ctx.fillText(text, bx * S, by * S);
    const cov = new Float32Array(w * h);
    const src = img.data;
    const W = w * S;
    const norm = 1 / (255 * S * S);
    for (let j = 0; j < h; j++) {
      for (let i = 0; i < w; i++) {
        let sum = 0;
        for (let b = 0; b < S; b++) {
          let k = ((j * S + b) * W + i * S) * 4;
          for (let a = 0; a < S; a++, k += 4) sum += src[k];
        }
        cov[j * w + i] = sum * norm;
      }
    }
    return { w, h, cov };
  }

  // ---------------------------------------------------------------- output

  /** Encode as an 8-bit RGB PNG. */
  toPng(): Buffer {
    return encodePng(this);
  }
}

/** PNG bytes of a surface (8-bit RGB, no alpha). Callers decide where to write them. */
export function encodePng(surface: Surface): Buffer {
  const png = new PNG({ width: surface.width, height: surface.height });
  png.data = Buffer.from(surface.bitmap.data.buffer, surface.bitmap.data.byteOffset, surface.bitmap.data.byteLength);
  return PNG.sync.write(png, { colorType: 2, inputColorType: 6, inputHasAlpha: true, deflateLevel: 6 });
}

/** [start, end) runs of the "on" parts of a dash pattern over a length (whole length if solid). */
export function dashRuns(length: number, dash: readonly number[]): [number, number][] {
  if (dash.length === 0 || !dash.some((d) => d > 0)) return [[0, length]];
  const out: [number, number][] = [];
  let s = 0;
  let k = 0;
  while (s < length) {
    const e = Math.min(length, s + dash[k]);
    if (k % 2 === 0 && e > s) out.push([s, e]);
    s = e;
    k = (k + 1) % dash.length;
  }
  return out;
}

/**
 * Liang–Barsky: the part of segment (x0,y0)–(x1,y1) inside `r`, or null.
 */
export function clipSegment(
  x0: number,
  y0: number,
  x1: number,
  y1: number,
  r: Rect,
): [number, number, number, number] | null {
  const dx = x1 - x0, dy = y1 - y0;
  let t0 = 0, t1 = 1;
  const p = [-dx, dx, -dy, dy];
  const q = [x0 - r.x, r.x + r.w - x0, y0 - r.y, r.y + r.h - y0];
  for (let k = 0; k < 4; k++) {
    if (p[k] === 0) {
      if (q[k] < 0) return null;
    } else {
      const t = q[k] / p[k];
      if (p[k] < 0) {
        if (t > t1) return null;
        if (t > t0) t0 = t;
      } else {
        if (t < t0) return null;
        if (t < t1) t1 = t;
      }
    }
  }
  return [x0 + t0 * dx, y0 + t0 * dy, x0 + t1 * dx, y0 + t1 * dy];
}
