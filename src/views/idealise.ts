// The idealised net a bounce diagram is drawn for, when the scenario's own net is not one the lattice
// method describes exactly (a single step, lossless lines, resistive ends and junctions): the edges of
// the driver's signal as ideal steps whose waves add up (superposition: the net is linear), each line
// lossless at the Z0 it is reported with, and each
// reactive part replaced by what it looks like on the time scale of the waves — a small capacitor or a
// large inductor as an open, a large capacitor or a small inductor as a short. Every replacement is
// listed (it is printed on the picture), and where no replacement is honest the reasons are returned
// instead ("refusals"), so the view draws no lattice and the terminal says why.
//
// Time scales (the usual lumped-versus-distributed comparison, e.g. Johnson & Graham, High-Speed
// Digital Design, ch. 4 on capacitive loads; the thresholds are common practice):
//   a part's time constant   τ_C = C·(R + R_env),  τ_L = L/(R + R_env)
//   R_env                    the lines on either side: Z_left ‖ Z_right for a shunt part,
//                            Z_left + Z_right for a series part (the driver's R_S, or an open, at the ends)
//   "small"                  τ ≤ SMALL·T, T = the route's round trip 2·TD: the part settles within a
//                            fifth of a round trip and only rounds the corners of the steps
//   "large"                  τ ≥ LARGE·W, W = the time the lattice covers: it barely changes in the window
// Loss: a line's amplitude factor over its length is e^(−αℓ); α = R′/(2Z0) + G′Z0/2 for constant R′,
// G′ (low-loss line, Pozar, Microwave Engineering, §2.7), the exact α(f) for frequency-dependent loss,
// taken at f_p = 1/(2π·TD) for the level a plateau reaches (it lasts about TD or more) and at the edge's
// knee frequency 0.35/t_r (Johnson & Graham, ch. 1) for how much its corners round.
import { attenuationDbPerM, losslessZ0 } from '../../sim/lines/freq-model.js';
import { DB_PER_NEPER } from '../../sim/lines/constants.js';
import type { Net, Part, RouteItem, Signal } from '../../sim/model.js';
import { allItems, isBranched, isMultiNet } from '../../sim/route-tree.js';
import { fastestEdge as fastestEdgeOf, rampDuration } from '../../sim/signals.js';
import type { SourceEdge } from './lattice.js';
import { formatSi } from '../render/ticks.js';

/** A part is "small" when its time constant is at most this share of the route's round trip. */
export const SMALL_SHARE = 0.2;
/** A part is "large" when its time constant is at least this many times the lattice's time window. */
export const LARGE_FACTOR = 10;
/** The lattice is refused when the plateaus keep less than this share of their height along the route. */
export const MIN_AMPLITUDE = 0.7;

export interface Idealisation {
  /** The net the lattice is drawn for (equal to the input when nothing had to change). */
  net: Net;
  /** What was idealised, one sentence each (empty: the lattice describes the net exactly). */
  notes: string[];
  /** Why no honest idealisation exists (empty: the lattice can be drawn). */
  refusals: string[];
  /** The source's edges as ideal steps (the first is the idealised net's step signal). */
  edges: SourceEdge[];
  /** The lattice is followed up to this time (s): the run's duration. */
  horizon: number;
}

const s3 = (v: number, unit: string) => formatSi(v, unit, 3);

/**
 * The edges of a signal up to `tEnd` as ideal steps at their 50 % points (a ramp of duration D crosses
 * 50 % after D/2), with the first one as a step signal for the lattice; or a refusal.
 */
export function signalEdges(sig: Signal, tEnd: number): { first: Extract<Signal, { kind: 'step' }>; edges: SourceEdge[]; note?: string } | { refusal: string } {
  const edges: SourceEdge[] = [];
  let first: Extract<Signal, { kind: 'step' }> | undefined;
  const add = (start: number, from: number, to: number, rise: number) => {
    const time = start + rampDuration(rise) / 2;
    if (time > tEnd || to === from) return false;
    first ??= { kind: 'step', from, to, start, rise };
    edges.push({ time, step: to - from });
    return true;
  };
  let what = '';
  switch (sig.kind) {
    case 'step':
      if (sig.to === sig.from) return { refusal: 'the driver’s step has no swing (from = to)' };
      return { first: sig, edges: [{ time: sig.start + rampDuration(sig.rise) / 2, step: sig.to - sig.from }] };
    case 'pulse': {
      add(sig.start, sig.from, sig.to, sig.rise);
      add(sig.start + rampDuration(sig.rise) / 2 + sig.width - rampDuration(sig.fall) / 2, sig.to, sig.from, sig.fall);
      what = 'pulse';
      break;
    }
    case 'clock': {
      const fallOffset = rampDuration(sig.rise) / 2 + sig.duty * sig.period - rampDuration(sig.fall) / 2;
      for (let k = 0; sig.start + k * sig.period <= tEnd; k++) {
        const t = sig.start + k * sig.period;
        add(t, sig.low, sig.high, sig.rise);
        add(t + fallOffset, sig.high, sig.low, sig.fall);
      }
      what = 'clock';
      break;
    }
    case 'bits': {
      const n = sig.bits.length;
      let prev = 0;
      for (let k = 0; n > 0 && sig.start + k * sig.bitTime <= tEnd; k++) {
        const b = sig.bits[k % n] ? 1 : 0;
        if (b !== prev) {
          const up = b === 1;
          add(sig.start + k * sig.bitTime, up ? sig.low : sig.high, up ? sig.high : sig.low, up ? sig.rise : sig.fall);
        }
        prev = b;
      }
      what = 'bit pattern';
      break;
    }
    case 'table':
      return { refusal: 'the driver’s signal is a table of points, which has no edges for the lattice to follow' };
  }
  if (!first) return { refusal: `the driver’s ${what} has no edge within the run` };
  return {
    first,
    edges,
    note:
      `The driver’s ${what} is drawn as ideal steps at the 50 % points of its ${edges.length} edge${edges.length === 1 ? '' : 's'} in the run; ` +
      'their waves add up (superposition, the net is linear).',
  };
}

interface LineView {
  z0: number;
  delay: number;
}

/** Z0 and one-way delay of a line item as the lattice takes it (lossless, at the Z0 it is reported with). */
function losslessLine(item: Extract<RouteItem, { kind: 'line' }>): { l: number; c: number } {
  const wb = item.line.wideband;
  if (!wb) return { l: item.line.l, c: item.line.c };
  const f = wb.at;
  if (f === undefined) return { l: wb.lInf, c: wb.cInf };
  // C′ at the reference frequency: Z0 = √(L∞/C′(f)) is the quasi-static Z0 the line is reported with
  const z0 = losslessZ0(wb, f);
  return { l: wb.lInf, c: wb.lInf / (z0 * z0) };
}

/** Loss (dB) of a line item at frequency f (Hz): the exact α(f) of a frequency-dependent line, R′/2Z0 + G′Z0/2 of a constant one. */
function lineLossDb(item: Extract<RouteItem, { kind: 'line' }>, f: number): number {
  const { line, length } = item;
  if (line.wideband) return attenuationDbPerM(line.wideband, f) * length;
  const z0 = Math.sqrt(line.l / line.c);
  return (line.r / (2 * z0) + (line.g * z0) / 2) * length * DB_PER_NEPER;
}

function lineIsLossy(item: Extract<RouteItem, { kind: 'line' }>): boolean {
  const l = item.line;
  return !!(l.wideband || l.series?.length || l.shunt?.length || l.r > 0 || l.g > 0);
}

/** What a reactive part becomes, or why it cannot be idealised. */
type PartVerdict = { part: Part | null; note?: string } | { refusal: string };

function idealisePart(where: string, p: Part, rEnv: number, roundTrip: number, window: number): PartVerdict {
  let part: Part = { ...p };
  const notes: string[] = [];
  const loop = p.r + rEnv;
  if (p.c !== undefined) {
    const tau = p.c * loop;
    const what = `${where} (C ${s3(p.c, 'F')}; τ ≈ ${s3(tau, 's')} with the lines around it)`;
    if (tau <= SMALL_SHARE * roundTrip) {
      return {
        part: null,
        note: `${what} is taken as an open: it charges within a fifth of the round trip ${s3(roundTrip, 's')}; in the real net it rounds the steps and delays each reflection there by about τ.`,
      };
    }
    if (!(tau >= LARGE_FACTOR * window)) {
      return { refusal: `${what}: comparable to the round trip ${s3(roundTrip, 's')} and the ${s3(window, 's')} the lattice covers, so neither an open nor a short describes it` };
    }
    part = { ...part, c: undefined };
    notes.push(`its capacitor (τ ≈ ${s3(tau, 's')}) is taken as a short: it barely charges in the ${s3(window, 's')} shown`);
  }
  if (p.l > 0) {
    const tau = loop === Infinity ? 0 : p.l / loop;
    const what = `${where} (L ${s3(p.l, 'H')}; τ ≈ ${s3(tau, 's')} with the lines around it)`;
    if (tau <= SMALL_SHARE * roundTrip) {
      part = { ...part, l: 0 };
      notes.push(`its inductor (τ ≈ ${s3(tau, 's')}) is taken as a short: it settles within a fifth of the round trip`);
    } else if (tau >= LARGE_FACTOR * window) {
      return { part: null, note: `${what} is taken as an open: its current barely changes in the ${s3(window, 's')} shown.` };
    } else {
      return { refusal: `${what}: comparable to the round trip ${s3(roundTrip, 's')} and the ${s3(window, 's')} the lattice covers, so neither a short nor an open describes it` };
    }
  }
  return { part, note: notes.length ? `${where}: ${notes.join('; ')}.` : undefined };
}

/** The longest one-way delay along the tree from its start to a receiver (s). */
function longestDelay(route: readonly RouteItem[], lines: ReadonlyMap<string, LineView>): number {
  let td = 0;
  let longest = 0;
  for (const it of route) {
    if (it.kind === 'line') td += lines.get(it.name)?.delay ?? 0;
    else if (it.kind === 'branch') for (const b of it.branches) longest = Math.max(longest, td + longestDelay(b.route, lines));
  }
  return Math.max(longest, td);
}

type Verdict = (where: string, p: Part, rEnv: number) => Part | null | undefined;

/**
 * The route with each reactive part idealised, lines made lossless; a branch's side routes likewise,
 * their receivers' parts too. `zBefore` is what lies before the route's first line (the driver's
 * resistance, or at a branch point the line before it); returns the Z0 of the route's last line.
 */
function idealRoute(
  items: readonly RouteItem[],
  zBefore: number,
  lines: ReadonlyMap<string, LineView>,
  verdict: Verdict,
  refusals: string[],
  receiverParts: (parts: readonly Part[], zLast: number, name: string) => Part[],
): { route: RouteItem[]; zEnd: number } {
  const zLeftOf = (i: number): number => {
    for (let k = i - 1; k >= 0; k--) {
      const it = items[k];
      if (it.kind === 'line' && lines.has(it.name)) return lines.get(it.name)!.z0;
    }
    return zBefore;
  };
  const zRightOf = (i: number): number => {
    for (let k = i + 1; k < items.length; k++) {
      const it = items[k];
      if (it.kind === 'line' && lines.has(it.name)) return lines.get(it.name)!.z0;
    }
    return Infinity;
  };
  const route: RouteItem[] = [];
  items.forEach((it, i) => {
    if (it.kind === 'line') {
      const view = lines.get(it.name);
      if (!view || !lineIsLossy(it)) route.push(it);
      else {
        const { l, c } = losslessLine(it);
        route.push({ kind: 'line', name: it.name, length: it.length, line: { r: 0, g: 0, l, c } });
      }
    } else if (it.kind === 'series') {
      const p = verdict(`series part '${it.name}'`, it.part, zLeftOf(i) + zRightOf(i));
      // an open series part would cut the route: the lattice then has nothing to show past it
      if (p === null) refusals.push(`series part '${it.name}' looks like an open on this time scale: no wave passes it`);
      else if (p) route.push({ ...it, part: p });
    } else if (it.kind === 'shunt') {
      const env = parallel(zLeftOf(i), zRightOf(i));
      const parts: Part[] = [];
      it.parts.forEach((p, k) => {
        const q = verdict(it.parts.length > 1 ? `part ${k + 1} of shunt '${it.name}'` : `shunt '${it.name}'`, p, env);
        if (q) parts.push(q);
      });
      if (parts.length) route.push({ ...it, parts });
    } else {
      const branches = it.branches.map((b) => {
        const side = idealRoute(b.route, zLeftOf(i), lines, verdict, refusals, receiverParts);
        return { route: side.route, receiver: { name: b.receiver.name, parts: receiverParts(b.receiver.parts, side.zEnd, b.receiver.name) } };
      });
      route.push({ ...it, branches });
    }
  });
  return { route, zEnd: zLeftOf(items.length) };
}

const parallel = (a: number, b: number) => (a === Infinity ? b : b === Infinity ? a : (a * b) / (a + b));

/**
 * The idealised net for a bounce diagram of `net` over a run of `duration` seconds (see the file
 * header). `refusals` is non-empty when the lattice of any idealisation would mislead.
 */
export function idealiseForLattice(net: Net, duration: number): Idealisation {
  const notes: string[] = [];
  const refusals: string[] = [];
  const sig = signalEdges(net.driver.signal, duration);
  if ('refusal' in sig) return { net, notes, refusals: [sig.refusal], edges: [], horizon: duration };
  if (sig.note) notes.push(sig.note);
  if (isMultiNet(net)) {
    return { net, notes, refusals: ['the scenario has several nets: the lattice is drawn along one net without coupled sections (crosstalk is not drawn as a lattice)'], edges: sig.edges, horizon: duration };
  }
  const rise = fastestEdgeOf(net.driver.signal);
  const window = Math.max(0, duration - sig.edges[0].time);

  // Lines: lossless, and the longest delay to a receiver.
  const lines = new Map<string, LineView>();
  const lossy: Extract<RouteItem, { kind: 'line' }>[] = [];
  for (const it of allItems(net.route)) {
    if (it.kind !== 'line' || !(it.length > 0)) continue;
    const { l, c } = losslessLine(it);
    lines.set(it.name, { z0: Math.sqrt(l / c), delay: it.length * Math.sqrt(l * c) });
    if (lineIsLossy(it)) lossy.push(it);
  }
  // the longest one-way delay from the driver pin to a receiver (the whole route without branches)
  const td = longestDelay(net.route, lines);
  if (lines.size === 0) return { net, notes, refusals: ['the route has no line segment: there is nothing for waves to travel on'], edges: sig.edges, horizon: duration };
  const roundTrip = 2 * td;
  if (lossy.length) {
    // A plateau lasts about a one-way delay or more: the level it reaches is set by the loss near
    // f_p = 1/(2π·TD); the rounding of the step's corners by the loss near the knee 0.35/t_r.
    const fp = 1 / (2 * Math.PI * td);
    const fk = 0.35 / rise;
    const dbP = lossy.reduce((a, it) => a + lineLossDb(it, fp), 0);
    const dbK = lossy.reduce((a, it) => a + lineLossDb(it, fk), 0);
    const kept = Math.pow(10, -dbP / 20);
    const pct = 100 * (1 - kept);
    const share = pct < 1 ? 'less than 1 %' : `about ${Math.round(pct)} %`;
    const where = `${lossy.map((it) => `'${it.name}'`).join(', ')}: ${dbP.toFixed(2)} dB at 1/(2π·TD) = ${s3(fp, 'Hz')}`;
    if (kept < MIN_AMPLITUDE) {
      refusals.push(`the lines take ${share} off the first edge’s plateaus on the way to the receiver (${where}): a lossless lattice would show levels the real net never reaches`);
    } else {
      const rounds = lossy.some((it) => it.line.wideband) ? ` and rounds the steps (${dbK.toFixed(2)} dB at the edge’s knee frequency 0.35/t_r = ${s3(fk, 'Hz')})` : '';
      notes.push(`Lines drawn lossless at the Z0 they are reported with. The loss left out takes ${share} off the plateaus on the way to the receiver (${where})${rounds}.`);
    }
  }

  // Parts: each reactive one replaced by an open or a short.
  const verdict = (where: string, p: Part, rEnv: number): Part | null | undefined => {
    if (p.c === undefined && !(p.l > 0)) return p;
    const v = idealisePart(where, p, rEnv, roundTrip, window);
    if ('refusal' in v) {
      refusals.push(v.refusal);
      return undefined;
    }
    if (v.note) notes.push(v.note);
    return v.part;
  };
  const receiverParts = (parts: readonly Part[], zLast: number, name: string | undefined): Part[] => {
    const out: Part[] = [];
    const who = name === undefined ? 'the receiver' : `receiver '${name}'`;
    parts.forEach((p, k) => {
      const q = verdict(parts.length > 1 ? `${who}'s part ${k + 1}` : who, p, zLast);
      if (q) out.push(q);
    });
    return out;
  };
  const { route, zEnd } = idealRoute(net.route, net.driver.resistance, lines, verdict, refusals, receiverParts);
  const receiver = receiverParts(net.receiver, zEnd, isBranched(net) ? (net.receiverName ?? 'receiver') : undefined);

  const changed = net.driver.signal.kind !== 'step' || notes.length > 0;
  const ideal: Net = changed ? { ...net, driver: { ...net.driver, signal: sig.first }, route, receiver } : net;
  return { net: ideal, notes, refusals, edges: sig.edges, horizon: duration };
}
