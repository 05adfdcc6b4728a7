// Colours: a colour-blind-safe qualitative palette for traces, a diverging map
// for signed values and a sequential map for densities.

export type RGB = readonly [number, number, number];

/** "#RRGGBB" or "#RGB" → [r, g, b] in 0..255. */
export function hexToRgb(hex: string): RGB {
  const m = /^#([0-9a-f]{3}|[0-9a-f]{6})$/i.exec(hex.trim());
  if (!m) throw new Error(`not a hex colour: ${JSON.stringify(hex)}`);
  let h = m[1];
  if (h.length === 3) h = h[0] + h[0] + h[1] + h[1] + h[2] + h[2];
  const n = parseInt(h, 16);
  return [(n >> 16) & 255, (n >> 8) & 255, n & 255];
}

/** [r, g, b] (0..255, rounded and clamped) → "#rrggbb". */
export function rgbToHex(c: RGB): string {
  return '#' + c.map((v) => Math.max(0, Math.min(255, Math.round(v))).toString(16).padStart(2, '0')).join('');
}

/**
 * Okabe–Ito palette, in its published order (M. Okabe and K. Ito, "Color
 * Universal Design (CUD): how to make figures and presentations that are
 * friendly to colorblind people", 2008).
 */
export const OKABE_ITO = {
  orange: '#E69F00',
  skyBlue: '#56B4E9',
  bluishGreen: '#009E73',
  yellow: '#F0E442',
  blue: '#0072B2',
  vermillion: '#D55E00',
  reddishPurple: '#CC79A7',
  black: '#000000',
} as const;

/**
 * The order traces take their colours in: the strong, dark colours first; yellow
 * (weak on a light background) last.
 */
export const TRACE_COLORS: readonly string[] = [
  OKABE_ITO.blue,
  OKABE_ITO.vermillion,
  OKABE_ITO.bluishGreen,
  OKABE_ITO.reddishPurple,
  OKABE_ITO.orange,
  OKABE_ITO.skyBlue,
  OKABE_ITO.black,
  OKABE_ITO.yellow,
];

/**
 * Dash patterns (on, off, on, off … in pixels) so that traces also differ in
 * grey-scale print. Empty = solid.
 */
export const TRACE_DASHES: readonly (readonly number[])[] = [
  [],
  [12, 5],
  [3, 4],
  [14, 4, 3, 4],
  [22, 6],
  [7, 4],
  [14, 4, 3, 4, 3, 4],
  [2, 3],
];

export interface TraceStyle {
  color: string;
  dash: readonly number[];
  width: number;
}

/** Colour and dash of the i-th trace (cycles after 8; later cycles shift the dash). */
export function traceStyle(i: number, width = 2): TraceStyle {
  const k = ((i % TRACE_COLORS.length) + TRACE_COLORS.length) % TRACE_COLORS.length;
  const cycle = Math.floor(i / TRACE_COLORS.length);
  return { color: TRACE_COLORS[k], dash: TRACE_DASHES[(k + cycle) % TRACE_DASHES.length], width };
}

/** A colour map: t in [0, 1] (clamped) → [r, g, b]. */
export type ColorMap = (t: number) => RGB;

/** Piecewise-linear interpolation in a table of [position, r, g, b] rows (positions increasing 0..1). */
export function tableColorMap(table: readonly (readonly [number, number, number, number])[]): ColorMap {
  if (table.length < 2) throw new Error('a colour table needs at least 2 rows');
  return (t: number): RGB => {
    if (!(t > 0)) t = 0; // also NaN → 0
    if (t > 1) t = 1;
    let hi = 1;
    while (hi < table.length - 1 && table[hi][0] < t) hi++;
    const a = table[hi - 1];
    const b = table[hi];
    const f = b[0] === a[0] ? 0 : (t - a[0]) / (b[0] - a[0]);
    return [a[1] + (b[1] - a[1]) * f, a[2] + (b[2] - a[2]) * f, a[3] + (b[3] - a[3]) * f];
  };
}

/**
 * Moreland's "cool to warm" diverging map, the 33-entry 8-bit table published
 * with K. Moreland, "Diverging Color Maps for Scientific Visualization", ISVC
 * 2009 (blue (59,76,192) — grey (221,221,221) at the midpoint — red (180,4,38)).
 */
export const COOL_WARM_TABLE: readonly (readonly [number, number, number, number])[] = [
  [0.0, 59, 76, 192],
  [0.03125, 68, 90, 204],
  [0.0625, 77, 104, 215],
  [0.09375, 87, 117, 225],
  [0.125, 98, 130, 234],
  [0.15625, 108, 142, 241],
  [0.1875, 119, 154, 247],
  [0.21875, 130, 165, 251],
  [0.25, 141, 176, 254],
  [0.28125, 152, 185, 255],
  [0.3125, 163, 194, 255],
  [0.34375, 174, 201, 253],
  [0.375, 184, 208, 249],
  [0.40625, 194, 213, 244],
  [0.4375, 204, 217, 238],
  [0.46875, 213, 219, 230],
  [0.5, 221, 221, 221],
  [0.53125, 229, 216, 209],
  [0.5625, 236, 211, 197],
  [0.59375, 241, 204, 185],
  [0.625, 245, 196, 173],
  [0.65625, 247, 187, 160],
  [0.6875, 247, 177, 148],
  [0.71875, 247, 166, 135],
  [0.75, 244, 154, 123],
  [0.78125, 241, 141, 111],
  [0.8125, 236, 127, 99],
  [0.84375, 229, 112, 88],
  [0.875, 222, 96, 77],
  [0.90625, 213, 80, 66],
  [0.9375, 203, 62, 56],
  [0.96875, 192, 40, 47],
  [1.0, 180, 4, 38],
];

/** Diverging map for signed values: 0 → blue (negative end), 0.5 → neutral grey, 1 → red. */
export const coolWarm: ColorMap = tableColorMap(COOL_WARM_TABLE);

/**
 * Viridis (S. van der Walt, N. Smith and E. Firing, matplotlib, 2015; CC0),
 * every 16th entry of the 256-entry table plus the last, interpolated linearly
 * (the error against the full table is below one 8-bit step).
 */
export const VIRIDIS_TABLE: readonly (readonly [number, number, number, number])[] = (
  [
    [0, 0.267004, 0.004874, 0.329415],
    [16, 0.282327, 0.094955, 0.417331],
    [32, 0.278826, 0.17549, 0.483397],
    [48, 0.258965, 0.251537, 0.524736],
    [64, 0.229739, 0.322361, 0.545706],
    [80, 0.19943, 0.387607, 0.554642],
    [96, 0.172719, 0.448791, 0.557885],
    [112, 0.149039, 0.508051, 0.55725],
    [128, 0.127568, 0.566949, 0.550556],
    [144, 0.120638, 0.625828, 0.533488],
    [160, 0.157851, 0.683765, 0.501686],
    [176, 0.24607, 0.73891, 0.452024],
    [192, 0.369214, 0.788888, 0.382914],
    [208, 0.515992, 0.831158, 0.294279],
    [224, 0.678489, 0.863742, 0.189503],
    [240, 0.845561, 0.887322, 0.099702],
    [255, 0.993248, 0.906157, 0.143936],
  ] as const
).map(([i, r, g, b]) => [i / 255, r * 255, g * 255, b * 255] as const);

/** Sequential map for densities and magnitudes: dark purple (0) → yellow (1). */
export const viridis: ColorMap = tableColorMap(VIRIDIS_TABLE);

/** Colours of the chrome (page, grid, text) — one place to keep the look consistent. */
export const THEME = {
  page: '#ffffff',
  panel: '#ffffff',
  grid: '#e4e7ec',
  gridStrong: '#c9ced6',
  axis: '#5b6472',
  text: '#1f2430',
  mutedText: '#5b6472',
  marker: '#7a8290',
  missing: '#f2f3f5',
} as const;
