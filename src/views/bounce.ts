// The bounce (lattice) view: the lattice diagram computed from the scenario (distance across, time
// running downward), flanked by the simulated voltage at the driver pin and at the receiver on the
// same time axis, with the lattice's predicted levels dashed over them so the plateaus can be matched
// by eye. A net the lattice method does not describe exactly (reactive or lossy parts, a pulse, clock
// or bits) gets the lattice of an idealised net (idealise.ts), with a note on the picture saying what
// was idealised; where that would mislead, a message panel saying why, and only the simulated waveforms.
import type { Net, ProbeSpec } from '../../sim/model.js';
import { probeTrace, type SimResult } from '../../sim/result.js';
import { buildFrame, drawFrameBackground, drawFrameForeground, fitText, TYPE, type Frame, type FrameSpec } from '../render/frame.js';
import { OKABE_ITO, THEME, type TraceStyle } from '../render/palette.js';
import { encodePng, Surface, type Rect } from '../render/surface.js';
import { formatSi } from '../render/ticks.js';
import { idealiseForLattice, type Idealisation } from './idealise.js';
import { latticeDiagram, type LatticeDiagram, type LatticeResult } from './lattice.js';
import { isBranched, mainReceiver, routeToReceiver } from '../../sim/route-tree.js';
import { unknownPath } from './select.js';
import { treeLatticeDiagram, type TreeLatticeOptions } from './tree-lattice.js';
import {
  drawMessagePanel,
  drawTimeDownPanel,
  drawTitleBlock,
  LabelPlacer,
  lineStep,
  NOTE_BOX,
  formatSiFixed,
  placeBoxedText,
  signed,
  signedVolts,
  timeDownAxis,
  wrapText,
} from './panels.js';

export {
  latticeDiagram,
  latticeLimitations,
  latticeVoltageAt,
  reflectionCoefficient,
  type LatticeArrival,
  type LatticeBoundary,
  type LatticeDiagram,
  type LatticeOptions,
  type LatticeResult,
  type LatticeSegment,
  type LatticeWave,
  type Plateau,
} from './lattice.js';

/** Colours and dashes of the view: simulated traces, the lattice's prediction, waves by direction. */
export const BOUNCE_STYLE = {
  simulated: { color: THEME.text, width: 2, dash: [] } as TraceStyle,
  predicted: { color: OKABE_ITO.vermillion, width: 2, dash: [7, 5] } as TraceStyle,
  forward: { color: OKABE_ITO.blue, width: 2, dash: [] } as TraceStyle,
  backward: { color: OKABE_ITO.bluishGreen, width: 2, dash: [] } as TraceStyle,
  /** A wave entering the drawn path from a branch. */
  fromBranch: { color: OKABE_ITO.orange, width: 2, dash: [] } as TraceStyle,
} as const;

function uniqueName(taken: Set<string>, base: string): string {
  if (!taken.has(base)) return base;
  for (let k = 2; ; k++) if (!taken.has(`${base}_${k}`)) return `${base}_${k}`;
}

/**
 * Index of the first probe at the driver pin and at the receiver (−1 when there is none); `receiver`
 * names the receiver (default the main one).
 */
export function endProbeIndices(net: Net, receiver?: string): { driver: number; receiver: number } {
  const main = mainReceiver(net).name;
  const atReceiver = (p: ProbeSpec) => p.at === 'receiver' && (p.receiver ?? main) === (receiver ?? main);
  return { driver: net.probes.findIndex((p) => p.at === 'driver'), receiver: net.probes.findIndex(atReceiver) };
}

/** The net with a probe at the driver pin and one at the receiver (default the main one) added where it has none. */
export function withEndProbes(net: Net, receiver?: string): Net {
  const ends = endProbeIndices(net, receiver);
  if (ends.driver >= 0 && ends.receiver >= 0) return net;
  const taken = new Set(net.probes.map((p) => p.name));
  const probes: ProbeSpec[] = [...net.probes];
  if (ends.driver < 0) {
    const name = uniqueName(taken, 'driver');
    taken.add(name);
    probes.push({ name, at: 'driver' });
  }
  if (ends.receiver < 0) {
    const main = receiver === undefined || receiver === mainReceiver(net).name;
    probes.push(main ? { name: uniqueName(taken, 'receiver'), at: 'receiver' } : { name: uniqueName(taken, receiver), at: 'receiver', receiver });
  }
  return { ...net, probes };
}

/** The texts the view prints for a lattice: one amplitude per wave, one label per boundary, the formula lines. */
export interface BounceLabels {
  waves: string[];
  boundaries: string[];
  formulas: string[];
}

const ohms = (r: number): string => (r === Infinity ? 'open' : formatSi(r, 'Ω', 3));
const volts = (v: number): string => formatSi(v, 'V', 3);

export function bounceLabels(d: LatticeDiagram): BounceLabels {
  const n = d.segments.length;
  const waves = d.waves.map((w) => signedVolts(w.amplitude));
  const boundaries = d.boundaries.map((b) => {
    if (b.kind === 'source') return `driver  Γ = ${signed(b.gammaFromRight!)}`;
    if (b.kind === 'load') return `receiver  Γ = ${signed(b.gammaFromLeft!)}`;
    return `${b.items.length ? b.items.join(', ') : 'junction'}  Γ→ ${signed(b.gammaFromLeft!)}  Γ← ${signed(b.gammaFromRight!)}`;
  });
  const branchNote = (b: (typeof d.boundaries)[number]) =>
    b.branches?.length ? ` (${b.branches.map((x) => `'${x}'`).join(', ')} leave${b.branches.length === 1 ? 's' : ''} here, taken with their Z0 in parallel)` : '';
  const L = d.launch;
  const z0 = d.segments[0].z0;
  const formulas: string[] = [];
  const src = d.boundaries[0];
  const viaItems = src.items.length ? ` (driver ${ohms(L.sourceResistance)} with ${src.items.join(', ')})` : '';
  if (src.items.length) {
    formulas.push(
      `Launched wave: V⁺ = ΔV_th·Z0/(R_th + Z0) = ${volts(L.theveninVoltage)} × ${ohms(z0)} / (${ohms(L.theveninResistance)} + ${ohms(z0)}) = ${signedVolts(L.amplitude)}` +
        ` at ${formatSi(L.time, 's', 3)}; Thevenin equivalent${viaItems} of a ${volts(L.stepVoltage)} step.`,
    );
  } else {
    formulas.push(
      `Launched wave: V⁺ = ΔV_S·Z0/(R_S + Z0) = ${volts(L.stepVoltage)} × ${ohms(z0)} / (${ohms(L.sourceResistance)} + ${ohms(z0)}) = ${signedVolts(L.amplitude)}` +
        ` at ${formatSi(L.time, 's', 3)} (the step's 50 % point).`,
    );
  }
  if (src.branches?.length) formulas.push(`At the driver pin${branchNote(src)}: R is what the first line sees there, with the other lines as their Z0.`);
  formulas.push(
    `Driver end: Γ = (R − Z0)/(R + Z0) = (${ohms(src.zFromRight!)} − ${ohms(z0)}) / (${ohms(src.zFromRight!)} + ${ohms(z0)}) = ${signed(src.gammaFromRight!)}.`,
  );
  for (let k = 1; k < n; k++) {
    const b = d.boundaries[k];
    const zl = d.segments[k - 1].z0, zr = d.segments[k].z0;
    const what = b.items.length ? `'${b.items.join("', '")}'` : `'${d.segments[k - 1].name}' → '${d.segments[k].name}'`;
    formulas.push(
      `Junction ${what}${branchNote(b)} at ${formatSi(b.position, 'm', 3)} (${ohms(zl)} → ${ohms(zr)}): from the left Z = ${ohms(b.zFromLeft!)}, Γ = ${signed(b.gammaFromLeft!)}, ` +
        `τ = ${b.tauLeftToRight!.toFixed(3)}; from the right Z = ${ohms(b.zFromRight!)}, Γ = ${signed(b.gammaFromRight!)}, τ = ${b.tauRightToLeft!.toFixed(3)}.`,
    );
  }
  const ld = d.boundaries[n];
  const zL = d.segments[n - 1].z0;
  formulas.push(
    ld.zFromLeft === Infinity
      ? `Receiver end: open, Γ = +1.`
      : `Receiver end: Γ = (${ohms(ld.zFromLeft!)} − ${ohms(zL)}) / (${ohms(ld.zFromLeft!)} + ${ohms(zL)}) = ${signed(ld.gammaFromLeft!)}.`,
  );
  if (d.sideArrivals?.length) {
    formulas.push(
      `Path to '${d.path!.receiver}' of the receivers ${d.path!.receivers.map((r) => `'${r}'`).join(', ')} (--path to choose another); every line's waves are followed, those on this path drawn; ` +
        `${d.sideArrivals.length} wave${d.sideArrivals.length === 1 ? '' : 's'} enter${d.sideArrivals.length === 1 ? 's' : ''} it from the branches (an orange dot where one sends at least ${100 * SIDE_MARK_SHARE} % of V⁺ into the path, with what it sends).`,
    );
  } else if (d.path) {
    formulas.push(`Path to '${d.path.receiver}' of the receivers ${d.path.receivers.map((r) => `'${r}'`).join(', ')} (--path to choose another); no wave from a branch reaches it in the time shown.`);
  }
  const many = d.edges.length > 1;
  if (many) formulas.push(`Each of the ${d.edges.length} edges launches its own wave, V⁺ in proportion to its step; the waves add up.`);
  formulas.push(
    `DC levels (lines as wires): before the ${many ? 'first edge' : 'step'} ${volts(d.dc.before.pin)} at the pin and ${volts(d.dc.before.receiver)} at the receiver; ` +
      `after ${many ? 'the last' : 'it'} ${volts(d.dc.after.pin)} and ${volts(d.dc.after.receiver)}.` +
      (d.truncated ? ` Waves followed until ${formatSi(d.horizon, 's', 3)} (wave or bounce limit).` : ''),
  );
  return { waves, boundaries, formulas };
}

export interface BounceInput {
  title: string;
  net: Net;
  result: SimResult;
  width?: number;
  height?: number;
  lattice?: TreeLatticeOptions;
  /** The receiver whose path a branched net's lattice follows (default the main receiver). */
  path?: string;
}

export interface BounceLayout {
  diagram: LatticeResult;
  /** What was idealised (notes), or why no lattice is drawn (refusals). */
  idealisation: Idealisation;
  /** Frames of the three panels (the lattice is absent when it is not supported). */
  driver: Frame;
  lattice?: Frame;
  receiver: Frame;
  /** The message panel shown instead of the lattice. */
  message?: Rect;
}

/**
 * The lattice the bounce view draws for `net` over `duration`: of the net itself when the lattice
 * describes it exactly, else of its idealisation (idealise.ts), or the reasons it is not drawn.
 */
export function bounceLattice(net: Net, duration: number, options: TreeLatticeOptions = {}): { diagram: LatticeResult; idealisation: Idealisation } {
  const idealisation = idealiseForLattice(net, duration);
  const unknown = unknownPath(net, options.path);
  const refusals = [...idealisation.refusals, ...(unknown ? [unknown] : [])];
  if (refusals.length) return { diagram: { supported: false, reasons: refusals }, idealisation };
  const opts = { horizon: idealisation.horizon, edges: idealisation.edges, ...options };
  const diagram = isBranched(net) ? treeLatticeDiagram(idealisation.net, opts) : latticeDiagram(idealisation.net, opts);
  return { diagram, idealisation };
}

/** Draw the bounce view into `area` of `s`. */
export function drawBounce(s: Surface, area: Rect, input: BounceInput): BounceLayout {
  const { net, result } = input;
  const duration = result.discretization.duration;
  const { diagram, idealisation } = bounceLattice(net, duration, { ...input.lattice, ...(input.path !== undefined ? { path: input.path } : {}) });
  const pathName = input.path ?? mainReceiver(net).name;
  const branched = isBranched(net);
  const idealised = diagram.supported && idealisation.notes.length > 0;
  const labels = diagram.supported ? bounceLabels(diagram) : undefined;
  const pad = 16;
  const inner: Rect = { x: area.x + pad, y: area.y + pad, w: area.w - 2 * pad, h: area.h - 2 * pad };
  const subtitle = !diagram.supported
    ? 'No lattice for this net (see the panel): the simulated voltage at both ends is shown; time runs downward.'
    : idealised
      ? 'Lattice (bounce) diagram of an IDEALISED net (what was idealised is listed below), beside the simulated voltage of the real net at both ends on the same time axis (time runs downward). ' +
        'Dashed: the idealised lattice’s levels; solid: the simulation of the net as it is.'
      : 'Lattice (bounce) diagram computed from the scenario, beside the simulated voltage at both ends on the same time axis (time runs downward). ' +
        'Dashed: the lattice’s predicted levels; solid: the simulation.';
  const titleH = drawTitleBlock(s, inner, input.title, subtitle);

  // Bottom block: legend, the idealisation note and the formulas.
  const legendH = lineStep(s, 13, 8);
  const formulaLines = labels ? labels.formulas.flatMap((f) => wrapText(s, f, 13, inner.w)) : [];
  const idealLines = idealised
    ? [
        ...wrapText(s, 'Idealised net — the lattice is exact for it, not for the scenario:', 13, inner.w - 24, true),
        ...idealisation.notes.flatMap((n) => wrapText(s, `• ${n}`, 13, inner.w - 24)),
        ...wrapText(s, 'The solid traces beside the lattice are the simulation of the real net.', 13, inner.w - 24, true),
      ]
    : [];
  const noteLines = diagram.supported
    ? []
    : wrapText(
        s,
        'The lattice is drawn for an idealised net (the signal’s edges as ideal steps, lossless lines, reactive parts as opens or shorts) unless the idealisation would mislead, as here.',
        13,
        inner.w,
      );
  const textStep = lineStep(s, 13, 3);
  const idealH = idealLines.length ? idealLines.length * textStep + 16 : 0;
  const bottomH = legendH + (formulaLines.length + noteLines.length) * textStep + idealH + 8;
  const body: Rect = { x: area.x, y: inner.y + titleH, w: area.w, h: inner.y + inner.h - bottomH - (inner.y + titleH) };

  // side panels wide enough for three voltage ticks (the frame asks for one per 90 px)
  const sideW = Math.round(Math.max(260, area.w * 0.25));
  const centreW = area.w - 2 * sideW;
  const topReserve = 2 * lineStep(s, TYPE.marker, 6) + 4;
  const time: [number, number] = [0, diagram.supported ? Math.min(duration, diagram.horizon) : duration];

  const ends = endProbeIndices(net, pathName);
  const sidePanel = (which: 'driver' | 'receiver', x: number): Frame => {
    const idx = ends[which];
    const trace = idx >= 0 ? probeTrace(result.record, idx) : undefined;
    const name = idx >= 0 ? net.probes[idx].name : undefined;
    const levels = diagram.supported ? [{ steps: diagram.plateaus[which], style: BOUNCE_STYLE.predicted }] : [];
    const f = drawTimeDownPanel(s, { x, y: body.y, w: sideW, h: body.h }, {
      title: which === 'driver' ? 'Driver pin' : branched ? `Receiver '${pathName}'` : 'Receiver',
      subtitle: name ? `probe '${name}'` : 'no probe here',
      time,
      traces: trace ? [{ values: trace, dt: result.record.dtSample, style: BOUNCE_STYLE.simulated }] : [],
      levels,
      topReserve,
      emptyText: `The scenario has no probe at the ${which === 'driver' ? 'driver pin' : 'receiver'}; simulate withEndProbes(net${branched ? ', receiver' : ''}) to show it.`,
    });
    if (diagram.supported) labelPlateaus(s, f, diagram.plateaus[which]);
    return f;
  };
  const driver = sidePanel('driver', area.x);
  const receiver = sidePanel('receiver', area.x + sideW + centreW);

  let lattice: Frame | undefined;
  let message: Rect | undefined;
  const centre: Rect = { x: area.x + sideW, y: body.y, w: centreW, h: body.h };
  if (diagram.supported) {
    lattice = drawLattice(s, centre, diagram, labels!, time, topReserve);
  } else {
    const frameSpec: FrameSpec = {
      title: 'Lattice diagram',
      subtitle: 'not drawn for this net',
      x: { label: 'Distance from the driver pin', unit: 'm', domain: [0, routeLength(net, input.path) || 1] },
      y: timeDownAxis(time),
      topReserve,
    };
    const f = buildFrame(s, centre, frameSpec);
    drawFrameBackground(s, f, { grid: false, zeroLine: false });
    message = drawMessagePanel(
      s,
      f.plot,
      'No lattice for this net',
      diagram.reasons,
      'A lattice of an idealised net would mislead here. The simulated waveforms at both ends are still shown beside this panel.',
    );
    drawFrameForeground(s, f, frameSpec);
  }

  // Legend and formulas.
  let y = inner.y + inner.h - bottomH + 8;
  let x = inner.x;
  const legend: [string, TraceStyle][] = [['simulated', BOUNCE_STYLE.simulated]];
  if (diagram.supported) {
    legend.push(['lattice prediction', BOUNCE_STYLE.predicted], ['wave towards the receiver', BOUNCE_STYLE.forward], ['wave towards the driver', BOUNCE_STYLE.backward]);
    if (diagram.sideArrivals?.length) legend.push(['wave arriving from a branch (dot)', BOUNCE_STYLE.fromBranch]);
  }
  for (const [name, st] of legend) {
    const yc = y + legendH / 2 - 4;
    s.polyline([x, x + 30], [yc, yc], st);
    const r = s.text(name, x + 38, yc, { size: 13, baseline: 'middle' });
    x += 38 + r.w + 26;
  }
  y += legendH;
  if (idealLines.length) {
    // a tinted box, so the note cannot be mistaken for the formulas
    s.fillRect(inner.x, y, inner.w, idealH - 6, NOTE_BOX.fill);
    s.strokeRect(inner.x, y, inner.w, idealH - 6, NOTE_BOX.stroke, 2);
    let yi = y + 6;
    idealLines.forEach((l, i) => {
      const bold = i === 0 || i === idealLines.length - 1;
      s.text(l, inner.x + 12, yi, { size: 13, baseline: 'top', bold, color: THEME.text });
      yi += textStep;
    });
    y += idealH;
  }
  for (const l of [...formulaLines, ...noteLines]) {
    s.text(l, inner.x, y, { size: 13, baseline: 'top', color: THEME.text });
    y += textStep;
  }
  return { diagram, idealisation, driver, lattice, receiver, message };
}

/** Length of the lines from the driver pin to the receiver `path` (default the main one). */
function routeLength(net: Net, path?: string): number {
  return (routeToReceiver(net, path) ?? net.route).reduce((acc, it) => acc + (it.kind === 'line' ? it.length : 0), 0);
}

/** Print each plateau's level beside it, where there is room. */
function labelPlateaus(s: Surface, f: Frame, plateaus: readonly { from: number; to: number; value: number }[]): void {
  const { plot } = f;
  const placer = new LabelPlacer({ x: plot.x + 2, y: plot.y + 2, w: plot.w - 4, h: plot.h - 4 });
  for (const p of plateaus) {
    const y0 = f.y.map(p.from), y1 = f.y.map(p.to);
    if (Math.abs(y1 - y0) < 20) continue;
    const ym = (y0 + y1) / 2;
    const px = f.x.map(p.value);
    const text = formatSiFixed(p.value, 'V');
    const right = px + 6, left = px - 6;
    const ok = placeBoxedText(s, placer, text, right, ym, { size: 11, color: BOUNCE_STYLE.predicted.color, align: 'left' });
    if (!ok) placeBoxedText(s, placer, text, left, ym, { size: 11, color: BOUNCE_STYLE.predicted.color, align: 'right' });
  }
}

/** Waves from a branch are marked when they send at least this share of |V⁺| into the path. */
export const SIDE_MARK_SHARE = 0.02;

function drawLattice(s: Surface, area: Rect, d: LatticeDiagram, labels: BounceLabels, time: [number, number], topReserve: number): Frame {
  const L = d.segments[d.segments.length - 1].to;
  const frameSpec: FrameSpec = {
    title: 'Lattice diagram',
    subtitle: `${d.waves.length} waves; amplitudes of each wave printed on it`,
    x: { label: d.path ? `Distance from the driver pin along the path to '${d.path.receiver}'` : 'Distance from the driver pin', unit: 'm', domain: [0, L] },
    y: timeDownAxis(time),
    topReserve,
  };
  const f = buildFrame(s, area, frameSpec);
  drawFrameBackground(s, f, { grid: true, zeroLine: false });
  const { plot } = f;
  const clip: Rect = { x: plot.x + 1, y: plot.y + 1, w: plot.w - 2, h: plot.h - 2 };
  // ends and junctions
  for (const b of d.boundaries) {
    const px = Math.min(plot.x + plot.w - 1, Math.floor(f.x.map(b.position)));
    if (b.kind === 'junction') s.vline(px, plot.y, plot.y + plot.h, THEME.axis, 1, [5, 4]);
    else s.vline(px, plot.y, plot.y + plot.h, THEME.axis, 2);
  }
  // waves
  for (const w of d.waves) {
    s.polyline([f.x.map(w.x0), f.x.map(w.x1)], [f.y.map(w.t0), f.y.map(w.t1)], w.direction > 0 ? BOUNCE_STYLE.forward : BOUNCE_STYLE.backward, clip);
  }
  // amplitudes at the middle of each wave, earliest first, where they do not collide
  const placer = new LabelPlacer({ x: plot.x + 2, y: plot.y + 2, w: plot.w - 4, h: plot.h - 4 });
  d.waves.forEach((w, i) => {
    const xm = f.x.map((w.x0 + w.x1) / 2), ym = f.y.map((w.t0 + w.t1) / 2);
    placeBoxedText(s, placer, labels.waves[i], xm, ym, {
      size: 11,
      color: w.direction > 0 ? BOUNCE_STYLE.forward.color : BOUNCE_STYLE.backward.color,
      align: 'center',
      baseline: 'middle',
      alpha: 0.92,
    });
  });
  // waves entering the path from a branch: a dot where they arrive, with what they send into the path
  for (const a of d.sideArrivals ?? []) {
    if (a.time > time[1] || Math.max(Math.abs(a.towardsDriver), Math.abs(a.towardsReceiver)) < SIDE_MARK_SHARE * Math.abs(d.launch.amplitude)) continue;
    const xa = f.x.map(a.position), ya = f.y.map(a.time);
    s.fillCircle(xa, ya, 4, BOUNCE_STYLE.fromBranch.color);
    const align = a.position >= (d.segments[d.segments.length - 1].to * 2) / 3 ? 'right' : 'left';
    const { towardsDriver: back, towardsReceiver: on } = a;
    const sent = back === 0 ? `${signedVolts(on)} →` : on === 0 ? `← ${signedVolts(back)}` : Math.abs(back - on) <= 1e-9 * Math.abs(on) ? `${signedVolts(on)} each way` : `← ${signedVolts(back)}, ${signedVolts(on)} →`;
    placeBoxedText(s, placer, `${sent} from '${a.from}'`, xa + (align === 'left' ? 7 : -7), ya, {
      size: 11,
      color: BOUNCE_STYLE.fromBranch.color,
      align,
      baseline: 'middle',
      alpha: 0.92,
    });
  }
  drawFrameForeground(s, f, frameSpec);

  // The band above the plot: segments (name, Z0, delay) nearest the plot, boundaries above them.
  const row = lineStep(s, TYPE.marker, 6);
  const segY = plot.y - 6;
  const bandPlacer = new LabelPlacer();
  d.segments.forEach((seg) => {
    const x0 = f.x.map(seg.from), x1 = f.x.map(seg.to);
    const full = `${seg.name} · ${formatSi(seg.z0, 'Ω', 3)} · ${formatSi(seg.delay, 's', 3)}`;
    const text = fitText(s, full, TYPE.marker, Math.max(10, x1 - x0 - 8));
    if (text === '…') return;
    const m = s.measureText(text, TYPE.marker);
    const r = { x: (x0 + x1) / 2 - m.width / 2, y: segY - m.ascent - m.descent, w: m.width, h: m.ascent + m.descent };
    if (!bandPlacer.tryPlace(r)) return;
    s.text(text, (x0 + x1) / 2, segY, { size: TYPE.marker, color: THEME.mutedText, align: 'center', baseline: 'bottom' });
  });
  d.boundaries.forEach((b, i) => {
    const px = f.x.map(b.position);
    const text = labels.boundaries[i];
    const m = s.measureText(text, TYPE.marker, true);
    const align = b.kind === 'source' ? 'left' : b.kind === 'load' ? 'right' : 'center';
    const left = align === 'left' ? px : align === 'right' ? px - m.width : px - m.width / 2;
    for (let k = 1; k <= 2; k++) {
      const yb = segY - k * row;
      const r = { x: left, y: yb - m.ascent - m.descent, w: m.width, h: m.ascent + m.descent };
      if (!bandPlacer.tryPlace(r)) continue;
      s.text(text, left, yb, { size: TYPE.marker, bold: true, color: THEME.text, baseline: 'bottom' });
      break;
    }
  });
  return f;
}

/** The bounce view as PNG bytes (default 1600 × 950). */
export async function renderBounce(input: BounceInput): Promise<Buffer> {
  const s = new Surface(input.width ?? 1600, input.height ?? 950);
  drawBounce(s, { x: 0, y: 0, w: s.width, h: s.height }, input);
  return encodePng(s);
}
