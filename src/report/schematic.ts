// The route as a schematic strip, in inline SVG of our own: the driver (a source behind its resistance),
// each line segment as a long box with its Z0, one-way delay and length, series parts in the signal
// path and shunt parts as branches to ground or to their rail, each element with its own symbol
// (resistor box, inductor coil, capacitor plates), and the receiver's parts (or an open end). A
// branched route is drawn as a tree: the trunk left to right, each branch's side route in a row of its
// own below it, joined to its branch point by a wire down. Widths follow the longest label, so nothing
// overlaps.
import { rlgcAt } from '../../sim/lines/freq-model.js';
import { lineImpedance } from '../../sim/lines/impedance.js';
import type { LineRLGC, Net, Part, RouteItem, Signal } from '../../sim/model.js';
import { allItems, allReceivers, isBranched, mainReceiver } from '../../sim/route-tree.js';
import { formatSI } from '../units.js';
import { attr, esc } from './html.js';

const si = (v: number, unit: string) => formatSI(v, unit, 3);

/** "R 39 Ω + L 12 nH + C 4 pF", and " to 1.25 V" for a part tied to a non-zero rail. */
export function describePart(p: Part, withRail = true): string {
  const bits: string[] = [];
  if (p.r) bits.push(`R ${si(p.r, 'Ω')}`);
  if (p.l) bits.push(`L ${si(p.l, 'H')}`);
  if (p.c !== undefined) bits.push(`C ${si(p.c, 'F')}`);
  const body = bits.length ? bits.join(' + ') : 'short (0 Ω)';
  return withRail && p.rail !== 0 ? `${body} to ${si(p.rail, 'V')}` : body;
}

/**
 * The Z0 and R′ texts of a line, as the `line` command and summary.json give them: the quasi-static Z0
 * and R′ at the description's frequency, and Z0∞, for a line with frequency-dependent loss; Z0 and the
 * constant R′ otherwise.
 */
export function lineFigures(line: LineRLGC): string[] {
  const z = lineImpedance(line);
  const ohm = (v: number) => formatSI(v, 'Ω', 4); // the precision of `line` and the report's tables
  if (z.basis === 'constant') return [`Z0 ${ohm(z.z0)}`, ...(line.r ? [`R′ ${si(line.r, 'Ω/m')}`] : [])];
  if (z.at === null) return [`Z0∞ ${ohm(z.highFrequency)} (high-frequency limit)`];
  const at = si(z.at, 'Hz');
  const r = line.wideband ? rlgcAt(line.wideband, z.at).r : line.r;
  return [`Z0 ${ohm(z.z0)} at ${at} · Z0∞ ${ohm(z.highFrequency)}`, ...(r ? [`R′ ${si(r, 'Ω/m')} at ${at}`] : [])];
}

export function lineDelay(line: LineRLGC, length: number): number {
  return length * Math.sqrt(line.l * line.c);
}

/** One line describing the driver's signal: "bits prbs7, 0 V → 3.3 V, 1 ns per bit". */
export function describeSignal(s: Signal): string {
  switch (s.kind) {
    case 'step':
      return `step ${si(s.from, 'V')} → ${si(s.to, 'V')}, rise ${si(s.rise, 's')}`;
    case 'pulse':
      return `pulse ${si(s.from, 'V')} → ${si(s.to, 'V')}, width ${si(s.width, 's')}`;
    case 'clock':
      return `clock ${si(s.low, 'V')}–${si(s.high, 'V')}, period ${si(s.period, 's')}`;
    case 'bits':
      return `bits ${s.patternName}, ${si(s.low, 'V')}–${si(s.high, 'V')}, ${si(s.bitTime, 's')} per bit`;
    case 'table':
      return `table of ${s.points.length} points`;
  }
}

interface Block {
  width: number;
  /** SVG for the block, drawn with its left edge at x = 0. */
  svg: string;
  /** A branch point: x of its junction inside the block. */
  junction?: number;
}

const Y = 56; // the signal line
const FONT = 12;
const CHAR = 7.2; // generous average advance of a 12 px sans-serif character
const textWidth = (s: string) => s.length * CHAR;
const STROKE = '#3d4656';

function text(x: number, y: number, s: string, opts: { bold?: boolean; anchor?: 'start' | 'middle' | 'end'; muted?: boolean } = {}): string {
  return `<text x="${x}" y="${y}" text-anchor="${opts.anchor ?? 'middle'}"${opts.bold ? ' font-weight="600"' : ''}${
    opts.muted ? ' class="muted"' : ''
  }>${esc(s)}</text>`;
}

function wire(x0: number, x1: number): string {
  return `<line x1="${x0}" y1="${Y}" x2="${x1}" y2="${Y}" stroke="${STROKE}" stroke-width="2"/>`;
}

function labels(cx: number, y: number, lines: string[]): string {
  return lines.map((l, i) => text(cx, y + i * (FONT + 4), l, { muted: i > 0 })).join('');
}

function widthFor(lines: string[], min: number): number {
  return Math.ceil(Math.max(min, ...lines.map(textWidth)) + 24);
}

/** A ground symbol with its top at (x, y), or a rail label when the part goes to a non-zero rail. */
function railEnd(x: number, y: number, rail: number): string {
  if (rail !== 0) {
    return `<line x1="${x - 8}" y1="${y}" x2="${x + 8}" y2="${y}" stroke="${STROKE}" stroke-width="2"/>` + text(x, y + 14, si(rail, 'V'), { muted: true });
  }
  return [0, 1, 2]
    .map((k) => `<line x1="${x - 9 + 3 * k}" y1="${y + 4 * k}" x2="${x + 9 - 3 * k}" y2="${y + 4 * k}" stroke="${STROKE}" stroke-width="2"/>`)
    .join('');
}

// ---------------------------------------------------------------- element symbols
// A part is R, L and C in series; each is drawn with its own symbol (resistor box, inductor coil,
// capacitor plates) along the wire, in that order. Each symbol is a <g class="el el-r|el-l|el-c">.

type ElementKind = 'r' | 'l' | 'c';

/** The elements a part has, in the order they are drawn: R, L, C (none: a short, a plain wire). */
export function partElements(p: Part): ElementKind[] {
  const out: ElementKind[] = [];
  if (p.r) out.push('r');
  if (p.l) out.push('l');
  if (p.c !== undefined) out.push('c');
  return out;
}

/** Length along the wire each symbol takes (px). */
const SYMBOL_LENGTH: Readonly<Record<ElementKind, number>> = { r: 24, l: 24, c: 8 };
const SYMBOL_GAP = 6;

/** Length of a part's symbols along its wire, gaps included. */
function symbolsLength(kinds: readonly ElementKind[]): number {
  return kinds.reduce((a, k) => a + SYMBOL_LENGTH[k], 0) + SYMBOL_GAP * Math.max(0, kinds.length - 1);
}

const line = (x1: number, y1: number, x2: number, y2: number) => `<line x1="${x1}" y1="${y1}" x2="${x2}" y2="${y2}" stroke="${STROKE}" stroke-width="2"/>`;

/**
 * One symbol with its start at `at` along an axis: horizontal (the wire at y = `across`, running from
 * x = at to at + length) or vertical (the wire at x = `across`, running down from y = at).
 */
function symbol(kind: ElementKind, at: number, across: number, vertical: boolean): string {
  const len = SYMBOL_LENGTH[kind];
  const P = (along: number, side: number): [number, number] => (vertical ? [across + side, at + along] : [at + along, across + side]);
  let body = '';
  if (kind === 'r') {
    const [x, y] = P(0, -6);
    body = vertical
      ? `<rect x="${across - 6}" y="${at}" width="12" height="${len}" fill="#ffffff" stroke="${STROKE}" stroke-width="2"/>`
      : `<rect x="${x}" y="${y}" width="${len}" height="12" fill="#ffffff" stroke="${STROKE}" stroke-width="2"/>`;
  } else if (kind === 'c') {
    // two plates across the wire, a gap between them
    const [a1, a2] = [P(0, -9), P(0, 9)];
    const [b1, b2] = [P(len, -9), P(len, 9)];
    body = line(a1[0], a1[1], a2[0], a2[1]) + line(b1[0], b1[1], b2[0], b2[1]);
  } else {
    // four half-turns of a coil on one side of the wire
    const turns = 4;
    const step = len / turns;
    const [x0, y0] = P(0, 0);
    const arcs = Array.from({ length: turns }, () => (vertical ? `a ${step / 2} ${step / 2} 0 0 1 0 ${step}` : `a ${step / 2} ${step / 2} 0 0 1 ${step} 0`)).join(' ');
    body = `<path d="M ${x0} ${y0} ${arcs}" fill="none" stroke="${STROKE}" stroke-width="2"/>`;
  }
  return `<g class="el el-${kind}">${body}</g>`;
}

/**
 * A part's symbols along a wire from `from` to `to` (horizontal at y = `across`, or vertical at
 * x = `across`), centred, joined by wire; a part without elements is a plain wire (a short).
 */
function partAlong(p: Part, from: number, to: number, across: number, vertical: boolean): string {
  const kinds = partElements(p);
  const wireAlong = (a: number, b: number) => (b > a ? (vertical ? line(across, a, across, b) : line(a, across, b, across)) : '');
  if (kinds.length === 0) return wireAlong(from, to);
  let at = (from + to) / 2 - symbolsLength(kinds) / 2;
  let svg = wireAlong(from, at);
  kinds.forEach((k, i) => {
    if (i > 0) {
      svg += wireAlong(at, at + SYMBOL_GAP);
      at += SYMBOL_GAP;
    }
    svg += symbol(k, at, across, vertical);
    at += SYMBOL_LENGTH[k];
  });
  return svg + wireAlong(at, to);
}

/** Parallel branches from the signal line down through each part's symbols to its rail, centred on cx. */
function branches(cx: number, parts: Part[]): { svg: string; width: number } {
  const n = Math.max(1, parts.length);
  const pitch = 30;
  const x0 = cx - ((n - 1) * pitch) / 2;
  let svg = '';
  parts.forEach((p, i) => {
    const x = x0 + i * pitch;
    svg += partAlong(p, Y, Y + 70, x, true);
    svg += railEnd(x, Y + 70, p.rail);
  });
  if (parts.length > 1) svg += `<line x1="${x0}" y1="${Y}" x2="${x0 + (n - 1) * pitch}" y2="${Y}" stroke="${STROKE}" stroke-width="2"/>`;
  svg += `<circle cx="${cx}" cy="${Y}" r="3.5" fill="${STROKE}"/>`;
  return { svg, width: (n - 1) * pitch + 20 };
}

function driverBlock(net: Net): Block {
  const lines = ['driver', `Rs ${si(net.driver.resistance, 'Ω')}`, describeSignal(net.driver.signal)];
  const w = widthFor(lines, 130);
  const cx = 26;
  const svg =
    `<circle cx="${cx}" cy="${Y}" r="15" fill="#ffffff" stroke="${STROKE}" stroke-width="2"/>` +
    `<polyline points="${cx - 8},${Y + 5} ${cx - 2},${Y + 5} ${cx + 2},${Y - 5} ${cx + 8},${Y - 5}" fill="none" stroke="${STROKE}" stroke-width="1.6"/>` +
    `<line x1="${cx}" y1="${Y + 15}" x2="${cx}" y2="${Y + 30}" stroke="${STROKE}" stroke-width="2"/>` +
    railEnd(cx, Y + 30, 0) +
    wire(cx + 15, cx + 30) +
    `<rect x="${cx + 30}" y="${Y - 7}" width="30" height="14" fill="#ffffff" stroke="${STROKE}" stroke-width="2"/>` +
    wire(cx + 60, w) +
    lines.map((l, i) => text(4, Y + 58 + i * (FONT + 4), l, { anchor: 'start', muted: i > 0 })).join('');
  return { width: w, svg };
}

function lineBlock(item: Extract<RouteItem, { kind: 'line' }>): Block {
  const { line } = item;
  const [z0, ...rest] = lineFigures(line);
  const details = [z0, `TD ${si(lineDelay(line, item.length), 's')} · ${si(item.length, 'm')}`, ...rest];
  if (line.series?.length || line.shunt?.length || line.wideband) details.push('frequency-dependent loss');
  const w = widthFor([item.name, ...details], 150);
  const svg =
    wire(0, 10) +
    `<rect x="10" y="${Y - 9}" width="${w - 20}" height="18" rx="9" fill="#e8f1f8" stroke="#0072B2" stroke-width="2"/>` +
    wire(w - 10, w) +
    text(w / 2, Y - 16, item.name, { bold: true }) +
    labels(w / 2, Y + 28, details);
  return { width: w, svg };
}

function seriesBlock(item: Extract<RouteItem, { kind: 'series' }>): Block {
  const detail = describePart(item.part, false);
  const w = Math.max(widthFor([item.name, detail], 80), symbolsLength(partElements(item.part)) + 24);
  const svg = partAlong(item.part, 0, w, Y, false) + text(w / 2, Y - 16, item.name, { bold: true }) + labels(w / 2, Y + 28, ['series', detail]);
  return { width: w, svg };
}

function shuntBlock(item: Extract<RouteItem, { kind: 'shunt' }>): Block {
  const details = item.parts.map((p) => describePart(p));
  const b = branches(0, item.parts);
  const w = Math.max(widthFor([item.name, ...details], 70), b.width + 24);
  const svg =
    wire(0, w) +
    `<g transform="translate(${w / 2},0)">${b.svg}</g>` +
    text(w / 2, Y - 16, item.name, { bold: true }) +
    labels(w / 2, Y + 104, ['shunt', ...details]);
  return { width: w, svg };
}

/**
 * A branch point: a junction dot on the wire, the wire down to the side routes drawn below the row
 * (routeSvg lays them out), and the receivers they lead to, beside that wire.
 */
function branchBlock(item: Extract<RouteItem, { kind: 'branch' }>): Block {
  const details = ['branch', ...item.branches.map((b) => `→ ${b.receiver.name}`)];
  const cx = Math.ceil(Math.max(20, textWidth(item.name) / 2 + 8));
  const w = Math.ceil(cx + 10 + Math.max(...details.map(textWidth)) + 12);
  const svg =
    wire(0, w) +
    `<circle cx="${cx}" cy="${Y}" r="4.5" fill="${STROKE}"/>` +
    text(cx, Y - 16, item.name, { bold: true }) +
    details.map((l, i) => text(cx + 10, Y + 28 + i * (FONT + 4), l, { anchor: 'start', muted: i > 0 })).join('');
  return { width: w, svg, junction: cx };
}

function receiverBlock(parts: Part[], name = 'receiver'): Block {
  if (parts.length === 0) {
    const w = widthFor([name, 'open end'], 70);
    return {
      width: w,
      svg: wire(0, 24) + `<circle cx="28" cy="${Y}" r="4" fill="#ffffff" stroke="${STROKE}" stroke-width="2"/>` + labels(w / 2, Y + 28, [name, 'open end']),
    };
  }
  const details = parts.map((p) => describePart(p));
  const b = branches(0, parts);
  const w = Math.max(widthFor([name, ...details], 80), b.width + 24);
  const svg = wire(0, w / 2) + `<g transform="translate(${w / 2},0)">${b.svg}</g>` + labels(w / 2, Y + 104, [name, ...details]);
  return { width: w, svg };
}

function blockFor(item: RouteItem): Block {
  switch (item.kind) {
    case 'line':
      return lineBlock(item);
    case 'series':
      return seriesBlock(item);
    case 'shunt':
      return shuntBlock(item);
    case 'branch':
      return branchBlock(item);
  }
}

/** Text rows a row of the drawing needs below its wire. */
function rowsOf(items: readonly RouteItem[], receiver: readonly Part[]): number {
  return Math.max(
    3,
    ...items.map((i) => (i.kind === 'shunt' ? 1 + i.parts.length : i.kind === 'branch' ? 1 + i.branches.length : i.kind === 'line' ? 3 : 2)),
    1 + receiver.length,
  );
}

/** A drawn part of the tree: its SVG, its right edge and its bottom (px). */
interface Laid {
  svg: string;
  right: number;
  bottom: number;
}

/**
 * One row — `lead` blocks, the items, the receiver — with its left edge at x0 and top at y0, then the
 * side routes of its branch items below it: those of the rightmost branch point first, so that the
 * wire down from a branch point further left passes to the left of everything drawn before it.
 */
function layRow(lead: readonly Block[], items: readonly RouteItem[], receiver: Block, receiverParts: readonly Part[], x0: number, y0: number): Laid {
  const blocks = [...lead, ...items.map(blockFor), receiver];
  const height = Y + 104 + rowsOf(items, receiverParts) * (FONT + 4) + 8;
  let x = x0;
  let svg = '';
  const junctions: { item: Extract<RouteItem, { kind: 'branch' }>; x: number }[] = [];
  blocks.forEach((b, k) => {
    svg += `<g transform="translate(${x},${y0})">${b.svg}</g>`;
    const item = items[k - lead.length];
    if (item?.kind === 'branch' && b.junction !== undefined) junctions.push({ item, x: x + b.junction });
    x += b.width;
  });
  let right = x;
  let bottom = y0 + height;
  for (const j of junctions.reverse()) {
    let from = y0 + Y;
    for (const br of j.item.branches) {
      const sub = layRow([leadIn()], br.route, receiverBlock([...br.receiver.parts], br.receiver.name), br.receiver.parts, j.x, bottom);
      svg += `<line x1="${j.x}" y1="${from}" x2="${j.x}" y2="${bottom + Y}" stroke="${STROKE}" stroke-width="2"/>`;
      from = bottom + Y;
      right = Math.max(right, sub.right);
      bottom = sub.bottom;
      svg += sub.svg;
    }
  }
  return { svg, right, bottom };
}

/** The short wire a side route starts with, from the wire coming down from its branch point. */
function leadIn(): Block {
  return { width: 20, svg: `<circle cx="0" cy="${Y}" r="3.5" fill="${STROKE}"/>` + wire(0, 20) };
}

/**
 * The route as an <svg> element (natural size; the page scrolls it sideways when it is wide): the
 * driver and the main route left to right, each branch's side route in a row of its own below, starting
 * under its branch point, to any depth.
 */
export function routeSvg(net: Net): string {
  const branched = isBranched(net);
  const main = receiverBlock(net.receiver, branched ? mainReceiver(net).name : 'receiver');
  const laid = layRow([driverBlock(net)], net.route, main, net.receiver, 8, 0);
  const width = Math.ceil(laid.right + 8);
  const height = Math.ceil(laid.bottom);
  const receivers = allReceivers(net).length;
  const title = branched
    ? `Route of ${net.title || 'the scenario'} as a tree: driver, ${allItems(net.route).length} route items, ${receivers} receivers; side routes drawn below their branch points`
    : `Route of ${net.title || 'the scenario'}: driver, ${net.route.length} route item${net.route.length === 1 ? '' : 's'}, receiver`;
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" class="route" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" role="img" aria-label="${attr(title)}">` +
    `<title>${esc(title)}</title>${laid.svg}</svg>`
  );
}
