// Eye diagram of a `bits` or `clock` signal at one probe: the waveform folded into windows of two
// unit intervals, drawn as a density (hits per pixel), with the noise-free eye height and eye width.
//
// Definitions used here (all times in seconds, levels in volts):
// - Unit interval (UI): the bit time of a `bits` signal; half the period of a `clock` (bit k of a clock
//   is high for even k, low for odd k).
// - Bit k starts at the driver at b_k = start + k·UI. Its centre at the driver is
//   c_k = b_k + UI/2 + (D_r + D_f)/4, the midpoint between the 50 % instants of the ramps that open and
//   close it (a ramp of duration D = t_10–90/0.8 crosses 50 % after D/2; with D_r = D_f the midpoint of
//   two 50 % instants one UI apart).
// - Probe delay τ: the median over the signal's transitions of (the probe's nearest crossing of the
//   threshold in the same direction) − (the driver's 50 % instant of that transition). The first
//   transition is found unambiguously (the run starts settled), which gives a first estimate τ₀; every
//   transition is then matched with the crossing nearest to its 50 % instant + τ₀, within ±UI/2.
// - Window of bit k: t ∈ [c_k + τ − UI, c_k + τ + UI], shown as x = t − (c_k + τ) + UI ∈ [0, 2 UI], so
//   the eye of bit k is centred at x = UI and the half eyes of its neighbours are at the sides.
// - Sampling instant: x_s = UI/2 + p·UI, p the sampling phase (default 0.5, the UI centre); in driver
//   terms bit k is sampled at b_k + samplingTime with samplingTime = τ + p·UI + (D_r + D_f)/4.
// - Threshold: the 50 % level between the probe's low and high state levels (IEEE 181 histogram
//   mode, see src/measure), or the band [vil, vih] when logic thresholds are given.
// - Sampling window: the interval of width w·UI centred on the sampling instant (w = 0.2 by default:
//   the central fifth of the UI, common practice), so a ringing peak that happens to fall on the
//   sampling instant does not decide the eye height alone.
// - Eye height (noise-free): the lowest "1" minus the highest "0" anywhere inside the sampling window,
//   where a window is a "1" or a "0" by the bit the driver sent. Negative when the traces cross there.
// - Open: every "1" above vih and every "0" below vil at the sampling instant (and so an eye width > 0).
//   Thresholds the signal cannot reach (vih above its high state level, vil below its low one) are
//   reported as a warning: such an eye is closed at the thresholds whatever its height.
// - Eye width: the open time at the threshold: the longest interval around the sampling instant over
//   which every "1" window stays above the threshold (above vih) and every "0" window below it
//   (below vil); 0 when some window is on the wrong side at the sampling instant.
import { routeDelay } from '../../sim/discretize.js';
import type { Net, Signal } from '../../sim/model.js';
import { probeTrace, type SimResult } from '../../sim/result.js';
import { rampDuration } from '../../sim/signals.js';
import { stateLevels } from '../measure/index.js';

/** Timing of the unit intervals of a `bits` or `clock` signal. */
export interface EyeTiming {
  kind: 'bits' | 'clock';
  /** Unit interval (s). */
  ui: number;
  /** Start of bit 0 at the driver (s). */
  start: number;
  /** Ramp durations (s) of rising and falling edges (10–90 % time / 0.8). */
  rampRise: number;
  rampFall: number;
  /** Bits in one repetition of the pattern (2 for a clock). */
  patternLength: number;
  /** Pattern name (bits) or "clock". */
  patternName: string;
  /** The bit sent in unit interval k (k < 0: the idle state before the signal starts, 0). */
  bit(k: number): 0 | 1;
}

/** Unit intervals of the driver's signal, or null when it is not a `bits` or `clock` signal. */
export function eyeTiming(signal: Signal): EyeTiming | null {
  if (signal.kind === 'bits') {
    const bits = signal.bits;
    const n = bits.length;
    return {
      kind: 'bits',
      ui: signal.bitTime,
      start: signal.start,
      rampRise: rampDuration(signal.rise),
      rampFall: rampDuration(signal.fall),
      patternLength: n,
      patternName: signal.patternName,
      bit: (k) => (k < 0 || n === 0 ? 0 : bits[k % n] ? 1 : 0),
    };
  }
  if (signal.kind === 'clock') {
    return {
      kind: 'clock',
      ui: signal.period / 2,
      start: signal.start,
      rampRise: rampDuration(signal.rise),
      rampFall: rampDuration(signal.fall),
      patternLength: 2,
      patternName: 'clock',
      bit: (k) => (k < 0 ? 0 : k % 2 === 0 ? 1 : 0),
    };
  }
  return null;
}

/** Why a signal has no eye, or null when it has one. */
export function eyeUnavailableReason(signal: Signal): string | null {
  return signal.kind === 'bits' || signal.kind === 'clock'
    ? null
    : `the driver's signal is a ${signal.kind}; an eye diagram needs a bits or clock signal`;
}

/** Unit intervals an eye run covers at least: PRBS-7 once (127 bits), and 64 UI (32 periods) of a clock. */
export const EYE_MIN_BITS = 127;
export const EYE_MIN_CLOCK_UI = 64;

/**
 * Simulated time for an eye: the whole pattern (repeated until it covers at least EYE_MIN_BITS bits, so
 * PRBS-7 runs at least once; EYE_MIN_CLOCK_UI unit intervals of a clock), two more UI so that the last
 * bit's window is complete, and the route's settle time: the one-way delay plus three round trips
 * (7·TD), so every bit has arrived at the far end and its first reflections are in the record. Never
 * shorter than the scenario's own duration.
 */
export function eyeRunDuration(net: Net): number {
  const t = eyeTiming(net.driver.signal);
  if (!t) throw new RangeError(eyeUnavailableReason(net.driver.signal)!);
  const n = Math.max(1, t.patternLength);
  const uis = t.kind === 'clock' ? EYE_MIN_CLOCK_UI : Math.ceil(EYE_MIN_BITS / n) * n;
  const settle = 7 * routeDelay(net);
  const need = Math.max(0, t.start) + (uis + 2) * t.ui + settle;
  return Math.max(need, net.run.duration ?? 0);
}

/** The probe an eye is drawn for by default: the first one at the receiver, else the last probe. */
export function defaultEyeProbe(net: Net): string | undefined {
  return net.probes.find((p) => p.at === 'receiver' && p.receiver === undefined)?.name ?? net.probes[net.probes.length - 1]?.name;
}

export interface EyeInput {
  signal: Signal;
  /** Probe voltages (V); sample i at t = t0 + i·dt. */
  values: ArrayLike<number>;
  dt: number;
  t0?: number;
  /** Logic thresholds (V); default the 50 % level of the probe's state levels. */
  thresholds?: { vih: number; vil: number };
  /** Sampling phase within the UI, 0..1 from the aligned crossing (default 0.5, the UI centre). */
  samplingPhase?: number;
  /** Width of the sampling window as a share of the UI, 0..1 (default 0.2); the eye height is taken over it. */
  samplingWindow?: number;
  /** Probe delay τ (s) to use instead of measuring it. */
  delay?: number;
}

/** Default width of the sampling window: the central fifth of the unit interval (common practice). */
export const DEFAULT_SAMPLING_WINDOW = 0.2;

/** Fewer folded windows than this make no eye worth drawing in a run (`ladderwave eye` runs long enough). */
export const EYE_MIN_WINDOWS = 10;

export interface EyeMeasurement {
  signal: 'bits' | 'clock';
  pattern: string;
  /** Bits in one repetition of the pattern (2 for a clock). */
  patternLength: number;
  /** Unit interval (s). */
  ui: number;
  /** Number of complete two-UI windows folded. */
  windows: number;
  ones: number;
  zeros: number;
  /** Probe delay τ (s) and how it was found. */
  delay: number;
  delaySource: 'measured' | 'given' | 'none';
  samplingPhase: number;
  /** Bit k is sampled at the probe at (start + k·UI) + samplingTime (s). */
  samplingTime: number;
  /** The sampling instant inside the drawn window, which spans 0..2 UI (s). */
  samplingOffset: number;
  /** The sampling window around it, inside the drawn window (s): the eye height is taken over it. */
  samplingWindow: { from: number; to: number; width: number; share: number };
  /** The probe's state levels (IEEE 181 histogram mode) and their difference. */
  levels: { low: number; high: number; swing: number };
  threshold: { level: number; vil: number; vih: number; source: '50%' | 'vih/vil' };
  /** Lowest "1" minus highest "0" over the sampling window (V); negative = the traces cross; null without both. */
  eyeHeight: number | null;
  lowestOne: number | null;
  highestZero: number | null;
  /** Open time at the threshold (s); 0 when closed; null without windows. */
  eyeWidth: number | null;
  /** Where the opening starts and ends inside the window (s, 0..2 UI); null when closed. */
  openFrom: number | null;
  openTo: number | null;
  open: boolean;
  /** Why a quantity is null or how it was chosen, keyed by field. */
  notes: Record<string, string>;
  /** Things a user must know before trusting the numbers: thresholds the signal's levels do not reach. */
  warnings: string[];
}

/** Linear interpolation of a sampled waveform at time t (clamped to the record). */
function valueAt(v: ArrayLike<number>, t0: number, dt: number, t: number): number {
  const n = v.length;
  const f = (t - t0) / dt;
  if (f <= 0) return v[0];
  if (f >= n - 1) return v[n - 1];
  const i = Math.floor(f);
  const a = f - i;
  return a === 0 ? v[i] : v[i] + (v[i + 1] - v[i]) * a;
}

interface Crossing {
  t: number;
  rising: boolean;
}

/** Every crossing of `level` (linear interpolation between samples), in time order. */
export function levelCrossings(v: ArrayLike<number>, t0: number, dt: number, level: number): Crossing[] {
  const out: Crossing[] = [];
  let side = 0; // −1 below, +1 above, 0 not yet known
  let lastIndex = -1;
  for (let i = 0; i < v.length; i++) {
    const s = v[i] > level ? 1 : v[i] < level ? -1 : 0;
    if (s === 0) continue;
    if (side !== 0 && s !== side) {
      // crossed between lastIndex (strictly on the old side) and i (strictly on the new side)
      let j = lastIndex;
      while (j + 1 < i && v[j + 1] !== level) j++;
      let t: number;
      if (j + 1 < i) t = t0 + (j + 1) * dt; // touched the level exactly
      else {
        const a = v[lastIndex], b = v[i];
        t = t0 + (lastIndex + (level - a) / (b - a) * (i - lastIndex)) * dt;
      }
      out.push({ t, rising: s > 0 });
    }
    side = s;
    lastIndex = i;
  }
  return out;
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** The window geometry of an eye: which bits are folded and where each window starts. */
export interface EyeWindows {
  timing: EyeTiming;
  /** Bit index k of each complete window. */
  bits: number[];
  /** Time (s) at which each window's x = 0 lies: c_k + τ − UI. */
  starts: number[];
}

/** Transition instants (driver 50 %) of the signal within [0, tEnd]: k, time, direction. */
function transitions(t: EyeTiming, tEnd: number): { k: number; t: number; rising: boolean }[] {
  const out: { k: number; t: number; rising: boolean }[] = [];
  for (let k = 0; t.start + k * t.ui <= tEnd; k++) {
    const b = t.bit(k), p = t.bit(k - 1);
    if (b === p) continue;
    const rising = b === 1;
    out.push({ k, t: t.start + k * t.ui + (rising ? t.rampRise : t.rampFall) / 2, rising });
  }
  return out;
}

/** Measures the probe delay τ (see the file header). */
function probeDelay(t: EyeTiming, v: ArrayLike<number>, t0: number, dt: number, level: number): number | null {
  const tEnd = t0 + (v.length - 1) * dt;
  const edges = transitions(t, tEnd);
  const crossings = levelCrossings(v, t0, dt, level);
  if (edges.length === 0 || crossings.length === 0) return null;
  const first = edges[0];
  const rampStart = t.start + first.k * t.ui;
  const c0 = crossings.find((c) => c.rising === first.rising && c.t >= rampStart);
  if (!c0) return null;
  const tau0 = c0.t - first.t;
  const d: number[] = [];
  let j = 0;
  for (const e of edges) {
    const target = e.t + tau0;
    while (j < crossings.length && crossings[j].t < target - t.ui / 2) j++;
    let best: number | null = null;
    for (let m = j; m < crossings.length && crossings[m].t <= target + t.ui / 2; m++) {
      if (crossings[m].rising !== e.rising) continue;
      if (best === null || Math.abs(crossings[m].t - target) < Math.abs(best - target)) best = crossings[m].t;
    }
    if (best !== null) d.push(best - e.t);
  }
  return d.length ? median(d) : tau0;
}

function windowsFor(t: EyeTiming, tau: number, t0: number, tEnd: number): EyeWindows {
  const bits: number[] = [];
  const starts: number[] = [];
  const centreOffset = t.ui / 2 + (t.rampRise + t.rampFall) / 4;
  const eps = 1e-9 * t.ui;
  for (let k = 0; ; k++) {
    const c = t.start + k * t.ui + centreOffset + tau;
    if (c + t.ui > tEnd + eps) break;
    if (c - t.ui < t0 - eps) continue;
    bits.push(k);
    starts.push(c - t.ui);
  }
  return { timing: t, bits, starts };
}

/** The eye's measurement, and the windows it folded (for drawing). */
export function foldEye(input: EyeInput): { eye: EyeMeasurement; windows: EyeWindows } {
  const timing = eyeTiming(input.signal);
  if (!timing) throw new RangeError(eyeUnavailableReason(input.signal)!);
  const { values: v, dt } = input;
  const t0 = input.t0 ?? 0;
  if (!(dt > 0) || !Number.isFinite(dt)) throw new RangeError(`measureEye: dt must be a positive number, got ${dt}`);
  if (v.length < 2) throw new RangeError('measureEye: the waveform needs at least two samples');
  const p = input.samplingPhase ?? 0.5;
  if (!(p >= 0 && p <= 1)) throw new RangeError(`measureEye: samplingPhase must lie in 0..1, got ${p}`);
  const wShare = input.samplingWindow ?? DEFAULT_SAMPLING_WINDOW;
  if (!(wShare >= 0 && wShare <= 1)) throw new RangeError(`measureEye: samplingWindow must lie in 0..1, got ${wShare}`);
  const { ui } = timing;
  const notes: Record<string, string> = {};

  const lv = stateLevels(v);
  const levels = { low: lv.low, high: lv.high, swing: lv.high - lv.low };
  const th = input.thresholds;
  if (th && !(th.vih >= th.vil)) throw new RangeError(`measureEye: vih (${th.vih} V) must not be below vil (${th.vil} V)`);
  const threshold = th
    ? { level: (th.vih + th.vil) / 2, vil: th.vil, vih: th.vih, source: 'vih/vil' as const }
    : { level: lv.reference.p50, vil: lv.reference.p50, vih: lv.reference.p50, source: '50%' as const };

  let delay = 0;
  let delaySource: EyeMeasurement['delaySource'] = 'none';
  if (input.delay !== undefined) {
    delay = input.delay;
    delaySource = 'given';
  } else {
    const d = probeDelay(timing, v, t0, dt, threshold.level);
    if (d === null) notes.delay = 'the probe never crosses the threshold after the first transition; no delay applied';
    else {
      delay = d;
      delaySource = 'measured';
    }
  }

  const tEnd = t0 + (v.length - 1) * dt;
  const windows = windowsFor(timing, delay, t0, tEnd);
  const xs = ui / 2 + p * ui; // sampling instant inside the window
  const halfWindow = (wShare * ui) / 2;
  let lowestOne = Infinity, highestZero = -Infinity, ones = 0, zeros = 0;
  let left = 0, right = 2 * ui, closed = false;
  windows.bits.forEach((k, w) => {
    const start = windows.starts[w];
    const b = timing.bit(k);
    const ts = start + xs;
    const vs = valueAt(v, t0, dt, ts);
    const [lo, hi] = rangeOver(v, t0, dt, ts - halfWindow, ts + halfWindow);
    if (b) {
      ones++;
      lowestOne = Math.min(lowestOne, lo);
    } else {
      zeros++;
      highestZero = Math.max(highestZero, hi);
    }
    // open interval of this window around the sampling instant
    const ok = b ? (x: number) => x > threshold.vih : (x: number) => x < threshold.vil;
    const bound = b ? threshold.vih : threshold.vil;
    if (!ok(vs)) {
      closed = true;
      return;
    }
    // rightwards from the sampling instant
    const iFirst = Math.floor((ts - t0) / dt) + 1;
    let r = start + 2 * ui;
    let prevT = ts, prevV = vs;
    for (let i = iFirst; i < v.length; i++) {
      const ti = t0 + i * dt;
      if (ti > start + 2 * ui) break;
      if (!ok(v[i])) {
        r = prevT + ((bound - prevV) / (v[i] - prevV)) * (ti - prevT);
        break;
      }
      prevT = ti;
      prevV = v[i];
    }
    // leftwards
    const iLast = Math.ceil((ts - t0) / dt) - 1;
    let l = start;
    prevT = ts;
    prevV = vs;
    for (let i = iLast; i >= 0; i--) {
      const ti = t0 + i * dt;
      if (ti < start) break;
      if (!ok(v[i])) {
        l = prevT + ((bound - prevV) / (v[i] - prevV)) * (ti - prevT);
        break;
      }
      prevT = ti;
      prevV = v[i];
    }
    left = Math.max(left, l - start);
    right = Math.min(right, r - start);
  });

  const n = windows.bits.length;
  if (n === 0) notes.windows = 'the record holds no complete two-UI window; run longer';
  if (n > 0 && n < EYE_MIN_WINDOWS) notes.windows = fewWindowsNote(n);
  const warnings = eyeWarnings(threshold, levels);
  const eyeHeight = ones && zeros ? lowestOne - highestZero : null;
  if (eyeHeight === null && n > 0) notes.eyeHeight = `the folded bits hold no ${ones ? '"0"' : '"1"'}`;
  const open = n > 0 && !closed && right > left;
  const eyeWidth = n === 0 ? null : open ? right - left : 0;
  if (n > 0 && !open) notes.eyeWidth = 'closed: some window is on the wrong side of the threshold at the sampling instant';
  return {
    eye: {
      signal: timing.kind,
      pattern: timing.patternName,
      patternLength: timing.patternLength,
      ui,
      windows: n,
      ones,
      zeros,
      delay,
      delaySource,
      samplingPhase: p,
      samplingTime: delay + p * ui + (timing.rampRise + timing.rampFall) / 4,
      samplingOffset: xs,
      samplingWindow: { from: xs - halfWindow, to: xs + halfWindow, width: 2 * halfWindow, share: wShare },
      levels,
      threshold,
      eyeHeight,
      lowestOne: ones ? lowestOne : null,
      highestZero: zeros ? highestZero : null,
      eyeWidth,
      openFrom: open ? left : null,
      openTo: open ? right : null,
      open,
      notes,
      warnings,
    },
    windows,
  };
}

/** Why an eye of `n` (< EYE_MIN_WINDOWS) windows is not to be trusted. */
export function fewWindowsNote(n: number): string {
  return `only ${n} window${n === 1 ? '' : 's'} of 2 UI folded (fewer than ${EYE_MIN_WINDOWS}): too few for an eye to trust; \`ladderwave eye\` runs the whole pattern`;
}

/** Lowest and highest value of a sampled waveform over [ta, tb] (interpolated at both ends). */
function rangeOver(v: ArrayLike<number>, t0: number, dt: number, ta: number, tb: number): [number, number] {
  const a = valueAt(v, t0, dt, ta), b = valueAt(v, t0, dt, tb);
  let lo = Math.min(a, b), hi = Math.max(a, b);
  for (let i = Math.max(0, Math.ceil((ta - t0) / dt)); i < v.length && t0 + i * dt <= tb; i++) {
    if (v[i] < lo) lo = v[i];
    if (v[i] > hi) hi = v[i];
  }
  return [lo, hi];
}

/** Warnings for an eye: thresholds the signal's state levels do not reach. */
function eyeWarnings(th: EyeMeasurement['threshold'], levels: EyeMeasurement['levels']): string[] {
  const out: string[] = [];
  const v = (x: number) => `${Number(x.toPrecision(3))} V`;
  if (th.source === 'vih/vil') {
    if (th.vih > levels.high) out.push(`vih ${v(th.vih)} is above the signal's high level ${v(levels.high)}: a "1" is not read as high, so the eye is closed at these thresholds`);
    if (th.vil < levels.low) out.push(`vil ${v(th.vil)} is below the signal's low level ${v(levels.low)}: a "0" is not read as low, so the eye is closed at these thresholds`);
  }
  return out;
}

/**
 * A note when an eye folds too little of the signal to be trusted: fewer windows than one pass of the
 * bit pattern, or than 16 unit intervals of a clock; null when the coverage is enough.
 */
export function eyeCoverageNote(eye: Pick<EyeMeasurement, 'windows' | 'signal' | 'patternLength' | 'pattern'>): string | null {
  const need = eye.signal === 'clock' ? 16 : eye.patternLength;
  if (eye.windows >= need) return null;
  const what = eye.signal === 'clock' ? '16 unit intervals of the clock' : `one pass of ${eye.pattern} (${eye.patternLength} bits)`;
  return `the eye folds only ${eye.windows} window${eye.windows === 1 ? '' : 's'}, less than ${what}; \`ladderwave eye\` runs long enough`;
}

/** Eye height, eye width and how they were found (see the file header for the definitions). */
export function measureEye(input: EyeInput): EyeMeasurement {
  return foldEye(input).eye;
}

/** The EyeInput for one probe of a simulation result. */
export function eyeInputOf(net: Net, result: SimResult, probe: string, opts: Partial<Pick<EyeInput, 'thresholds' | 'samplingPhase' | 'samplingWindow' | 'delay'>> = {}): EyeInput {
  const { record } = result;
  return {
    signal: net.driver.signal,
    values: probeTrace(record, probe),
    dt: record.dtSample,
    ...opts,
  };
}

export interface EyeGridSpec {
  nx: number;
  ny: number;
  /** Window-time range of the grid's outer edges (s); default [0, 2 UI]. */
  xRange?: readonly [number, number];
  /** Voltage range of the grid's outer edges (V). */
  yRange: readonly [number, number];
}

/**
 * Hit counts of the folded windows on an nx × ny grid over xRange × yRange (row 0 at the bottom). Consecutive samples are joined by straight lines, and every grid cell a line passes
 * through counts one hit, so sparse sampling still draws continuous traces. Each window is drawn
 * from its exact start to its exact end (values interpolated there).
 */
export function eyeDensity(input: EyeInput, windows: EyeWindows, grid: EyeGridSpec): Float64Array {
  const { nx, ny } = grid;
  const [y0, y1] = grid.yRange;
  const counts = new Float64Array(nx * ny);
  const { values: v, dt } = input;
  const t0 = input.t0 ?? 0;
  const span = 2 * windows.timing.ui;
  const [x0, x1] = grid.xRange ?? [0, span];
  const kx = nx / (x1 - x0), ky = ny / (y1 - y0);
  // a trace counts once per cell it passes through: consecutive points in the same cell are one hit
  let last = -1;
  const hit = (fx: number, fy: number) => {
    const ix = Math.floor(fx), iy = Math.floor(fy);
    if (ix < 0 || ix >= nx || iy < 0 || iy >= ny) {
      last = -1;
      return;
    }
    const cell = iy * nx + ix;
    if (cell !== last) counts[cell]++;
    last = cell;
  };
  const segment = (ax: number, ay: number, bx: number, by: number) => {
    const steps = Math.max(1, Math.ceil(Math.max(Math.abs(bx - ax), Math.abs(by - ay))));
    for (let s = 0; s < steps; s++) {
      const a = s / steps;
      hit(ax + (bx - ax) * a, ay + (by - ay) * a);
    }
  };
  for (const start of windows.starts) {
    last = -1;
    const end = start + span;
    let px = -x0 * kx, py = (valueAt(v, t0, dt, start) - y0) * ky;
    const iFirst = Math.floor((start - t0) / dt) + 1;
    for (let i = iFirst; i < v.length; i++) {
      const t = t0 + i * dt;
      if (t >= end) break;
      const qx = (t - start - x0) * kx, qy = (v[i] - y0) * ky;
      segment(px, py, qx, qy);
      px = qx;
      py = qy;
    }
    const qx = (span - x0) * kx, qy = (valueAt(v, t0, dt, end) - y0) * ky;
    segment(px, py, qx, qy);
    hit(qx, qy);
  }
  return counts;
}

/** Lowest and highest voltage inside the folded windows (V). */
export function foldedExtent(input: EyeInput, windows: EyeWindows): [number, number] {
  const { values: v, dt } = input;
  const t0 = input.t0 ?? 0;
  const span = 2 * windows.timing.ui;
  let lo = Infinity, hi = -Infinity;
  for (const start of windows.starts) {
    const i0 = Math.max(0, Math.floor((start - t0) / dt));
    const i1 = Math.min(v.length - 1, Math.ceil((start + span - t0) / dt));
    for (let i = i0; i <= i1; i++) {
      if (v[i] < lo) lo = v[i];
      if (v[i] > hi) hi = v[i];
    }
  }
  return lo <= hi ? [lo, hi] : [0, 1];
}
