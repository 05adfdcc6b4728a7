// Time-domain reflectometry (TDR) of a route: drive it from a matched step source, watch the wave
// that comes back to the driver pin, and read it as impedance along the route.
//
//   incident wave   V_inc(t) = (V_S(t) − V_S(0)) · Z_ref/(R_S + Z_ref) = ΔV_S(t)/2   (R_S = Z_ref)
//   reflection      ρ(t) = (V(t) − V(0) − V_inc(t)) / V_inc,final
//   impedance       Z(t) = Z_ref · (1 + ρ)/(1 − ρ)
// (Γ ↔ Z with Z_ref, e.g. Pozar, Microwave Engineering, ch. 2; the step-TDR reading of it in the
// HP 54753A TDR plug-in user's guide, chapter "TDR Fundamentals".)
//
// Time is the round-trip time τ since the incident step's 50 % point; distance walks the route at
// each segment's own velocity for one-way time τ/2 (lumped parts take no time). Past the receiver the
// reading continues at the last segment's velocity: it then shows how the receiver's load reads.
// Readings behind a discontinuity are first-order: later sections read through the reflections of
// earlier ones (the usual TDR masking; they are not corrected here).
//
// Resolution: two discontinuities closer than half the step's 10–90 % rise time in round-trip time
// merge, i.e. d_min = v·t_r/4 (HP 54753A user's guide, "TDR Fundamentals", rise time and distance
// resolution).
import { NetError } from '../../sim/errors.js';
import { lineImpedance } from '../../sim/lines/impedance.js';
import type { Net } from '../../sim/model.js';
import { probeTrace, type SimResult } from '../../sim/result.js';
import type { RouteItem } from '../../sim/model.js';
import { allReceivers, isBranched, isMultiNet, mainReceiver, routeToReceiver } from '../../sim/route-tree.js';
import { routeDelay } from '../../sim/discretize.js';
import { rampDuration, signalFunction } from '../../sim/signals.js';
import type { Frame } from '../render/frame.js';
import { drawLinePlot } from '../render/lineplot.js';
import type { Marker } from '../render/marks.js';
import { OKABE_ITO, THEME } from '../render/palette.js';
import { encodePng, Surface, type Rect } from '../render/surface.js';
import { formatSi } from '../render/ticks.js';
import { drawTitleBlock, LabelPlacer } from './panels.js';

/** Default reference impedance: 50 Ω, what TDR instruments and their cables use (common practice). */
export const DEFAULT_TDR_Z0 = 50;

export interface TdrOptions {
  /** 10–90 % rise time of the step (s). */
  rise: number;
  /** Reference impedance = source resistance (Ω); default DEFAULT_TDR_Z0 (50 Ω). */
  z0?: number;
  /** Step amplitude (V, default 1). */
  amplitude?: number;
}

/** Name of the probe tdrNet puts at the driver pin. */
export const TDR_PROBE = 'tdr';

function segmentsOf(items: readonly RouteItem[]) {
  const out: { name: string; from: number; to: number; z0: number; delay: number; velocity: number; resistance: number; lossy: boolean }[] = [];
  let x = 0;
  for (const it of items) {
    if (it.kind !== 'line') continue;
    if (it.length > 0) {
      const tpd = Math.sqrt(it.line.l * it.line.c);
      const l = it.line;
      const lossy = l.r > 0 || l.g > 0 || !!(l.wideband || l.series?.length || l.shunt?.length);
      // Z0 as every other place prints it (sim/lines/impedance.ts); the velocity is the wavefront's
      out.push({ name: it.name, from: x, to: x + it.length, z0: lineImpedance(l).z0, delay: it.length * tpd, velocity: 1 / tpd, resistance: l.r, lossy });
    }
    x += it.length;
  }
  return out;
}

/**
 * The TDR set-up of a net: the driver replaced by a step of the given rise time from a source whose
 * resistance matches the reference impedance (50 Ω unless `z0` is given); the route
 * and receiver as they are; one probe at the driver pin; run long enough for the wave to come back
 * from the receiver, plus a margin.
 */
export function tdrNet(net: Net, opts: TdrOptions): Net {
  if (!(opts.rise > 0) || !Number.isFinite(opts.rise)) throw new RangeError(`tdrNet: rise must be a positive time, got ${opts.rise}`);
  if (isMultiNet(net)) {
    throw new NetError([{ path: 'nets', message: 'the TDR profile is drawn along one net; this scenario has several (a TDR of a coupled pair — differential and common-mode profiles — is not done yet)' }]);
  }
  const z0 = opts.z0 ?? DEFAULT_TDR_Z0;
  if (!(z0 > 0) || !Number.isFinite(z0)) throw new RangeError(`tdrNet: z0 must be a positive resistance, got ${z0}`);
  const ramp = rampDuration(opts.rise);
  const start = ramp;
  // every path's reflections come back within twice the longest delay to a receiver
  const roundTrip = 2 * routeDelay(net);
  const margin = Math.max(10 * opts.rise, 0.25 * roundTrip);
  return {
    ...net,
    title: `TDR: ${net.title}`,
    driver: { signal: { kind: 'step', from: 0, to: opts.amplitude ?? 1, start, rise: opts.rise }, resistance: z0 },
    probes: [{ name: TDR_PROBE, at: 'driver' }],
    run: { ...net.run, duration: start + ramp + roundTrip + margin, sample: undefined },
  };
}

export interface TdrSegment {
  name: string;
  from: number;
  to: number;
  z0: number;
  velocity: number;
  /** Round-trip times (s) at which the reading enters and leaves the segment. */
  timeFrom: number;
  timeTo: number;
  /** v·t_r/4 in this segment (m). */
  resolution: number;
  /** R′ (Ω/m; the DC value of a frequency-dependent line), and whether the line has any loss. */
  resistance: number;
  lossy: boolean;
}

export interface TdrPlace {
  name: string;
  /** 'branch': a branch point where other paths leave the one read (`label` names their first lines). */
  kind: 'series' | 'shunt' | 'junction' | 'receiver' | 'branch';
  /** The marker's text when it is not `name`. */
  label?: string;
  distance: number;
  /** Round-trip time (s). */
  time: number;
}

export interface TdrProfile {
  /** Round-trip time since the incident step's 50 % point (s). */
  time: Float64Array;
  /** Distance from the driver pin (m), at the local velocity. */
  distance: Float64Array;
  /** Z = Z_ref(1 + ρ)/(1 − ρ) (Ω); Infinity where ρ ≥ 1. */
  impedance: Float64Array;
  rho: Float64Array;
  /** Reference impedance = source resistance (Ω). */
  zRef: number;
  /** 10–90 % rise time of the step (s). */
  rise: number;
  /** v·t_r/4 in the first segment (m): closer discontinuities merge. */
  resolution: number;
  segments: TdrSegment[];
  /** Lumped parts, junctions between segments and the receiver, where the reading finds them. */
  places: TdrPlace[];
  routeLength: number;
  /** Round-trip time to the receiver (s). */
  routeTime: number;
  /** A branched net: the receiver whose path the distance follows, and every receiver (main first). */
  path?: { receiver: string; receivers: string[] };
}

/** The lines (or receivers) that leave a path at branch item `at` when the path goes on to `next`. */
function leavingAt(net: Net, at: RouteItem, next: RouteItem | undefined): string[] {
  const first = (route: readonly RouteItem[], receiver: string) => route.find((r) => r.kind === 'line')?.name ?? receiver;
  const out: string[] = [];
  const walk = (route: readonly RouteItem[], receiver: string): void => {
    route.forEach((it, i) => {
      if (it === at && route[i + 1] !== next) out.push(first(route.slice(i + 1), receiver));
      if (it.kind === 'branch') for (const b of it.branches) walk(b.route, b.receiver.name);
    });
  };
  walk(net.route, mainReceiver(net).name);
  if (at.kind === 'branch') for (const b of at.branches) if (b.route[0] !== next) out.push(first(b.route, b.receiver.name));
  return out;
}

/**
 * The impedance profile of a TDR run (`net` as made by tdrNet, or any net driven by a step whose
 * source resistance is the reference, with a probe at the driver pin).
 */
export function tdrProfile(net: Net, result: SimResult, path?: string): TdrProfile {
  const items = routeToReceiver(net, path);
  if (!items) throw new NetError([{ path: 'route', message: `no receiver named '${path}' (receivers: ${allReceivers(net).map((r) => r.name).join(', ')})` }]);
  const sig = net.driver.signal;
  if (sig.kind !== 'step') throw new Error(`tdrProfile: the net must be driven by a step (see tdrNet), not a ${sig.kind}`);
  const probe = net.probes.findIndex((p) => p.at === 'driver');
  if (probe < 0) throw new Error('tdrProfile: the net needs a probe at the driver pin (see tdrNet)');
  const zRef = net.driver.resistance;
  const rec = result.record;
  const v = probeTrace(rec, probe);
  const n = v.length;
  const dt = rec.dtSample;
  const source = signalFunction(sig);
  const t50 = sig.start + rampDuration(sig.rise) / 2;
  const incFinal = (sig.to - sig.from) / 2;

  // route geometry: segments with their round-trip times, and the places between them
  const segs = segmentsOf(items);
  const segments: TdrSegment[] = [];
  const places: TdrPlace[] = [];
  let rt = 0;
  let x = 0;
  for (const it of items) {
    if (it.kind === 'line') {
      const s = segs.find((q) => q.name === it.name);
      if (s) {
        if (segments.length > 0 && places[places.length - 1]?.distance !== s.from) {
          places.push({ name: `${segments[segments.length - 1].name}|${s.name}`, kind: 'junction', distance: s.from, time: rt });
        }
        segments.push({ ...s, timeFrom: rt, timeTo: rt + 2 * s.delay, resolution: (s.velocity * sig.rise) / 4 });
        rt += 2 * s.delay;
      }
      x += it.length;
    } else if (it.kind === 'branch') {
      // the side routes that leave the path here, by their first line (or their receiver)
      const side = leavingAt(net, it, items[items.indexOf(it) + 1]);
      if (side.length) places.push({ name: it.name, kind: 'branch', label: `${it.name} ∥ ${side.join(', ')}`, distance: x, time: rt });
    } else {
      places.push({ name: it.name, kind: it.kind, distance: x, time: rt });
    }
  }
  const branched = isBranched(net);
  const receiver = path ?? mainReceiver(net).name;
  places.push({ name: branched ? receiver : 'receiver', kind: 'receiver', distance: x, time: rt });

  const i0 = Math.max(0, Math.ceil(t50 / dt - 1e-9));
  const m = Math.max(0, n - i0);
  const time = new Float64Array(m), distance = new Float64Array(m), impedance = new Float64Array(m), rho = new Float64Array(m);
  const v0 = v[0];
  const s0 = source(0);
  let k = 0;
  for (let j = 0; j < m; j++) {
    const i = i0 + j;
    const t = i * dt;
    const tau = t - t50;
    time[j] = tau;
    const inc = (source(t) - s0) / 2;
    const r = (v[i] - v0 - inc) / incFinal;
    rho[j] = r;
    impedance[j] = r >= 1 ? Infinity : (zRef * (1 + r)) / (1 - r);
    // distance: walk the segments (times increase with j, so the index only moves forward)
    while (k < segments.length - 1 && tau >= segments[k].timeTo) k++;
    if (segments.length === 0) distance[j] = 0;
    else {
      const s = segments[k];
      distance[j] = tau < s.timeFrom ? s.from : s.from + ((tau - s.timeFrom) / 2) * s.velocity;
    }
  }
  return {
    time,
    distance,
    impedance,
    rho,
    zRef,
    rise: sig.rise,
    resolution: segments.length ? segments[0].resolution : 0,
    segments,
    places,
    routeLength: x,
    routeTime: rt,
    ...(branched ? { path: { receiver, receivers: allReceivers(net).map((r) => r.name) } } : {}),
  };
}

/**
 * What the profile reads in the middle of each segment: the median impedance over its middle half,
 * and at least one resolution away from its ends (NaN when no sample falls there).
 */
export function segmentReadings(p: TdrProfile): { name: string; z0: number; reading: number }[] {
  return p.segments.map((sg) => {
    const len = sg.to - sg.from;
    const a = sg.from + Math.max(0.25 * len, sg.resolution), b = sg.to - Math.max(0.25 * len, sg.resolution);
    const zs: number[] = [];
    for (let i = 0; i < p.time.length; i++) {
      // the first pass only: round-trip times inside this segment's span
      if (p.time[i] < sg.timeFrom || p.time[i] > sg.timeTo) continue;
      if (p.distance[i] >= a && p.distance[i] <= b) zs.push(p.impedance[i]);
    }
    zs.sort((x, y) => x - y);
    const reading = zs.length === 0 ? NaN : zs.length % 2 ? zs[(zs.length - 1) / 2] : (zs[zs.length / 2 - 1] + zs[zs.length / 2]) / 2;
    return { name: sg.name, z0: sg.z0, reading };
  });
}

/**
 * The profile as CSV, in chunks of about 64 kB: `time_s,distance_m,impedance_ohm`, full precision,
 * `inf` for an open reading. A slow step on a long route has millions of rows: write it chunk by chunk.
 */
export function* tdrCsvChunks(p: TdrProfile): Generator<string> {
  yield 'time_s,distance_m,impedance_ohm\n';
  const num = (v: number) => (v === Infinity ? 'inf' : v === -Infinity ? '-inf' : String(v));
  let chunk = '';
  for (let i = 0; i < p.time.length; i++) {
    chunk += `${num(p.time[i])},${num(p.distance[i])},${num(p.impedance[i])}\n`;
    if (chunk.length > 1 << 16) {
      yield chunk;
      chunk = '';
    }
  }
  if (chunk) yield chunk;
}

/** The whole CSV as one string (short profiles, tests); use tdrCsvChunks for files. */
export function tdrCsv(p: TdrProfile): string {
  return [...tdrCsvChunks(p)].join('');
}

/** The impedance range to show: the readings along the route (and a little past it), capped at 4·Z_ref. */
export function tdrImpedanceDomain(p: TdrProfile): [number, number] {
  let lo = p.zRef, hi = p.zRef;
  const tMax = p.routeTime + 0.1 * Math.max(p.routeTime, 8 * p.rise);
  for (let i = 0; i < p.time.length && p.time[i] <= tMax; i++) {
    const z = p.impedance[i];
    if (!Number.isFinite(z)) continue;
    if (z < lo) lo = z;
    if (z > hi) hi = z;
  }
  lo = Math.max(0, lo);
  hi = Math.min(hi, 4 * p.zRef);
  const span = Math.max(hi - lo, 0.2 * p.zRef);
  return [Math.max(0, lo - 0.12 * span), hi + 0.12 * span];
}

export interface TdrRenderInput {
  title: string;
  profile: TdrProfile;
  /** Pixels (default 1200 × 900). */
  width?: number;
  height?: number;
}

const TRACE = { color: OKABE_ITO.blue, width: 2, dash: [] as number[] };

/**
 * The reading at the first sample at or past distance `x` inside segment `sg`'s first pass (NaN when
 * none): what the profile shows there before later reflections arrive.
 */
function readingAt(p: TdrProfile, sg: TdrSegment, x: number): number {
  for (let i = 0; i < p.time.length; i++) {
    if (p.time[i] < sg.timeFrom) continue;
    if (p.time[i] > sg.timeTo) break;
    if (p.distance[i] >= x) return p.impedance[i];
  }
  return NaN;
}

/**
 * The note a lossy route gets on the plot and in the terminal. A line with series loss reads higher the
 * farther the step has gone: to first order in R′x/Z0 the reading at distance x is Z0 + R′·x for a
 * constant R′ (from the low-loss expansion Z0(s) = √((R′ + sL′)/(sC′)) ≈ Z0·(1 + R′/(2sL′)), Pozar,
 * Microwave Engineering, §2.7), more where skin effect raises R′ at the step's frequencies. The note
 * gives each lossy segment's reading near its two ends, read from the profile itself.
 */
export function tdrLossNote(p: TdrProfile): string | null {
  const lossy = p.segments.filter((sg) => sg.lossy);
  if (!lossy.length) return null;
  const ohm = (z: number) => formatSi(z, 'Ω', 3);
  const parts = lossy.map((sg) => {
    const len = sg.to - sg.from;
    const inset = Math.min(0.45 * len, Math.max(0.05 * len, 2 * sg.resolution));
    const a = readingAt(p, sg, sg.from + inset), b = readingAt(p, sg, sg.to - inset);
    const read = Number.isFinite(a) && Number.isFinite(b) ? ` reads ${ohm(a)} near its start and ${ohm(b)} near its end` : '';
    return `'${sg.name}'${read} (R′ℓ = ${ohm(sg.resistance * len)} at DC)`;
  });
  return (
    `Loss tilts the reading: a line with series loss reads higher the farther the step has gone — about Z0 + R′·x at distance x, ` +
    `more where skin effect raises R′ — so a slope along a lossy line is the loss, not a change of the line: ${parts.join('; ')}.`
  );
}

/** Pixel rectangles a drawn curve passes through, per column: for keeping labels off the curve. */
class CurveMask {
  /** The labels placed clear of the curve. */
  readonly labels: { text: string; rect: Rect }[] = [];
  private readonly lo: Float64Array;
  private readonly hi: Float64Array;
  constructor(private readonly f: Frame, xs: ArrayLike<number>, ys: ArrayLike<number>) {
    const { plot } = f;
    this.lo = new Float64Array(plot.w).fill(Infinity);
    this.hi = new Float64Array(plot.w).fill(-Infinity);
    let prev: [number, number] | null = null;
    for (let i = 0; i < xs.length; i++) {
      const y = ys[i];
      if (!Number.isFinite(y)) {
        prev = null;
        continue;
      }
      const px = f.x.map(xs[i]) - plot.x;
      const py = Math.min(plot.y + plot.h, Math.max(plot.y, f.y.map(y)));
      // join consecutive points so steep edges mark every row they cross
      const [ax, ay] = prev ?? [px, py];
      for (let c = Math.max(0, Math.floor(Math.min(ax, px)) - 1); c <= Math.min(plot.w - 1, Math.ceil(Math.max(ax, px)) + 1); c++) {
        this.lo[c] = Math.min(this.lo[c], ay, py);
        this.hi[c] = Math.max(this.hi[c], ay, py);
      }
      prev = [px, py];
    }
  }
  /** True when the rectangle (surface pixels, with a margin) stays clear of the curve. */
  clear(r: Rect, margin = 3): boolean {
    const { plot } = this.f;
    for (let x = Math.floor(r.x - margin); x <= Math.ceil(r.x + r.w + margin); x++) {
      const c = x - plot.x;
      if (c < 0 || c >= plot.w) continue;
      if (this.hi[c] >= r.y - margin && this.lo[c] <= r.y + r.h + margin) return false;
    }
    return true;
  }
}

/** Draws `text` in a light box at the first candidate position (top-left corners) clear of the curve and of earlier labels. */
function placeLabel(s: Surface, mask: CurveMask, placer: LabelPlacer, text: string, candidates: readonly [number, number][], color: string = THEME.mutedText): Rect | null {
  const m = s.measureText(text, 11);
  const w = m.width + 6, h = m.ascent + m.descent + 2;
  for (const [x, y] of candidates) {
    const r: Rect = { x, y, w, h };
    if (!mask.clear(r) || !placer.tryPlace(r)) continue;
    s.fillRect(r.x, r.y, r.w, r.h, THEME.panel, 0.85);
    s.text(text, r.x + 3, r.y + 1, { size: 11, color, align: 'left', baseline: 'top' });
    mask.labels.push({ text, rect: r });
    return r;
  }
  return null;
}

/**
 * The note a branched net's profile gets: which path the distance follows, and how to read a branch
 * point. A step meeting lines in parallel reads their parallel Z0 (ρ = Γ of the junction, Pozar,
 * Microwave Engineering, ch. 2) until the branch's own reflections return, mixed in with the path's.
 */
export function tdrPathNote(p: TdrProfile): string {
  if (!p.path) return '';
  const others = p.path.receivers.filter((r) => r !== p.path!.receiver);
  return (
    `Distance along the path to '${p.path.receiver}' (--path to follow ${others.length === 1 ? `'${others[0]}'` : `one of ${others.map((r) => `'${r}'`).join(', ')}`}). ` +
    'At a branch point (marked "∥") the step meets the lines there in parallel and reads their parallel Z0; past it the reading mixes the branch\'s reflections with the path\'s.'
  );
}

/** Two panels: impedance against distance (top) and against round-trip time (bottom), places marked. */
export function drawTdr(
  s: Surface,
  area: Rect,
  input: TdrRenderInput,
): { distance: Frame; time: Frame; lossNote: string | null; labels: { panel: 'distance' | 'time'; text: string; rect: Rect }[] } {
  const p = input.profile;
  const pad = 16;
  const first = p.segments[0];
  const resText = first
    ? `Resolution ≈ v·t_r/4 = ${formatSi(p.resolution, 'm', 2)} in '${first.name}' (discontinuities closer than this merge).`
    : '';
  const lossNote = tdrLossNote(p);
  const titleH =
    pad +
    drawTitleBlock(
      s,
      { x: area.x + pad, y: area.y + pad, w: area.w - 2 * pad, h: area.h },
      input.title,
      `Matched step source: ${formatSi(p.rise, 's', 3)} (10–90 %), R_S = Z_ref = ${formatSi(p.zRef, 'Ω', 3)}. ` +
        `Z = Z_ref·(1 + ρ)/(1 − ρ), ρ = reflected / incident wave at the driver pin; distance from the round-trip time at each segment's own velocity; later readings include multiple reflections of earlier places. ` +
        resText +
        (p.path ? `\n${tdrPathNote(p)}` : '') +
        (lossNote ? `\n${lossNote}` : ''),
    );
  const yDomain = tdrImpedanceDomain(p);
  const shownTime = Math.min(p.time.length ? p.time[p.time.length - 1] : 0, p.routeTime + Math.max(0.12 * p.routeTime, 10 * p.rise));
  const last = p.segments[p.segments.length - 1];
  const shownDist = last ? last.to + ((shownTime - p.routeTime) / 2) * last.velocity : 1;

  const placeMarkers = (at: (pl: TdrPlace) => number): Marker[] =>
    p.places.map((pl) => ({
      axis: 'x' as const,
      at: at(pl),
      label: pl.kind === 'junction' ? undefined : (pl.label ?? pl.name),
      color: pl.kind === 'junction' ? '#5b6472' : '#2b2f38',
      dash: pl.kind === 'junction' ? [5, 4] : [],
    }));
  const refMarker: Marker = { axis: 'y', at: p.zRef, color: THEME.mutedText, dash: [2, 3] };
  const bodyH = area.h - titleH;
  const topArea: Rect = { x: area.x, y: area.y + titleH, w: area.w, h: Math.round(bodyH * 0.56) };
  const botArea: Rect = { x: area.x, y: topArea.y + topArea.h, w: area.w, h: bodyH - topArea.h };
  const labels: { panel: 'distance' | 'time'; text: string; rect: Rect }[] = [];
  const panel = (a: Rect, title: string, x: { label: string; unit: string; domain: [number, number] }, xs: Float64Array, at: (pl: TdrPlace) => number, span: (sg: TdrSegment) => [number, number], end: number): Frame => {
    const f = drawLinePlot(s, a, {
      title,
      x,
      y: { label: 'Impedance', unit: 'Ω', domain: yDomain },
      series: [{ name: 'Z', values: p.impedance, xs, style: TRACE, hideInLegend: true }],
      markers: [...placeMarkers(at), refMarker],
      legend: 'none',
    });
    const mask = new CurveMask(f, xs, p.impedance);
    const placer = new LabelPlacer({ x: f.plot.x + 1, y: f.plot.y + 1, w: f.plot.w - 2, h: f.plot.h - 2 });
    shadeBeyond(s, f, end, mask, placer);
    labelReference(s, f, p.zRef, mask, placer);
    labelSegments(s, f, p.segments, span, mask, placer);
    labels.push(...mask.labels.map((l) => ({ panel: xs === p.distance ? ('distance' as const) : ('time' as const), ...l })));
    return f;
  };
  const distance = panel(topArea, p.path ? `Impedance along the path to '${p.path.receiver}'` : 'Impedance along the route', { label: 'Distance from the driver pin', unit: 'm', domain: [0, shownDist] }, p.distance, (pl) => pl.distance, (sg) => [sg.from, sg.to], p.routeLength);
  const time = panel(botArea, 'Against round-trip time', { label: 'Round-trip time', unit: 's', domain: [0, shownTime] }, p.time, (pl) => pl.time, (sg) => [sg.timeFrom, sg.timeTo], p.routeTime);
  return { distance, time, lossNote, labels };
}

/** "Z_ref 50 Ω" beside its dotted line, at the right end or the left, above or below, where the curve is not. */
function labelReference(s: Surface, f: Frame, zRef: number, mask: CurveMask, placer: LabelPlacer): void {
  const { plot } = f;
  const y = f.y.map(zRef);
  if (y < plot.y || y > plot.y + plot.h) return;
  const text = `Z_ref ${formatSi(zRef, 'Ω', 3)}`;
  const m = s.measureText(text, 11);
  const w = m.width + 6, h = m.ascent + m.descent + 2;
  const right = plot.x + plot.w - w - 4, left = plot.x + 4;
  const candidates: [number, number][] = [];
  for (const x of [right, left, plot.x + plot.w / 2 - w / 2]) candidates.push([x, y - h - 2], [x, y + 3]);
  placeLabel(s, mask, placer, text, candidates);
}

/** Each segment's name and Z0 inside its span, at the bottom of the plot or the top, where the curve is not. */
function labelSegments(s: Surface, f: Frame, segs: readonly TdrSegment[], span: (sg: TdrSegment) => [number, number], mask: CurveMask, placer: LabelPlacer): void {
  const { plot } = f;
  for (const sg of segs) {
    const [a, b] = span(sg);
    const x0 = Math.max(plot.x, f.x.map(a)), x1 = Math.min(plot.x + plot.w - 1, f.x.map(b));
    for (const text of [`${sg.name} · ${formatSi(sg.z0, 'Ω', 3)}`, sg.name]) {
      const m = s.measureText(text, 11);
      const w = m.width + 6, h = m.ascent + m.descent + 2;
      if (w + 4 > x1 - x0) continue;
      const xs = [(x0 + x1) / 2 - w / 2, x0 + 2, x1 - w - 2];
      const candidates: [number, number][] = [];
      for (const y of [plot.y + plot.h - h - 4, plot.y + 4, plot.y + plot.h / 2 - h / 2]) for (const x of xs) candidates.push([x, y]);
      if (placeLabel(s, mask, placer, text, candidates)) break;
    }
  }
}

/** Grey veil over the part of a plot past the receiver, with a note where the curve leaves room. */
function shadeBeyond(s: Surface, f: Frame, at: number, mask: CurveMask, placer: LabelPlacer): void {
  const { plot } = f;
  const x0 = Math.ceil(f.x.map(at)) + 1;
  const x1 = plot.x + plot.w - 1;
  if (x1 - x0 < 4) return;
  s.fillRect(x0, plot.y + 1, x1 - x0, plot.h - 2, '#8a93a3', 0.14);
  const text = 'past the receiver';
  const m = s.measureText(text, 11);
  const w = m.width + 6, h = m.ascent + m.descent + 2;
  if (x1 - x0 < w + 6) return;
  const candidates: [number, number][] = [];
  for (const y of [plot.y + 4, plot.y + plot.h - h - 4, plot.y + plot.h / 2 - h / 2]) candidates.push([x0 + 4, y], [x1 - w - 4, y]);
  placeLabel(s, mask, placer, text, candidates);
}

/** The TDR view as PNG bytes (default 1200 × 900). */
export async function renderTdr(input: TdrRenderInput): Promise<Buffer> {
  const s = new Surface(input.width ?? 1200, input.height ?? 900);
  drawTdr(s, { x: 0, y: 0, w: s.width, h: s.height }, input);
  return encodePng(s);
}
