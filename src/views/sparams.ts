// sparams.png: the exported two-port against frequency. Top: |S21| and |S11| in dB with the odd
// quarter-wave frequencies (2k + 1)/(4·TD) of the stretch marked, where a mismatched line's |S11|
// peaks (Pozar, Microwave Engineering, 4th ed., §2.5, the quarter-wave transformer: the reflection
// of a uniform mismatched section is largest where it is an odd number of quarter waves long).
// Middle: the phase of S21. Bottom: its group delay −dφ/dω, against the lines' one-way delay TD.
// Reads only the network data.
import { entry, type NetworkData } from '../../sim/sparams/network.js';
import { groupDelay, magnitudeDb, quarterWavePoints, unwrappedPhase } from '../../sim/sparams/measures.js';
import { drawLinePlot } from '../render/lineplot.js';
import type { Marker } from '../render/marks.js';
import { OKABE_ITO, THEME } from '../render/palette.js';
import { encodePng, Surface, type Rect } from '../render/surface.js';
import { formatSi } from '../render/ticks.js';
import { drawTitleBlock } from './panels.js';

export interface SparamsPlotInput {
  title: string;
  /** A two-port's S-parameters. */
  network: NetworkData;
  /** One-way delay of the lines in the stretch (s). */
  delay: number;
  /** Where the ports are, e.g. "port 1 at the driver pin, port 2 at the receiver pin" (the default). */
  portText?: string;
  /** Extra lines for the subtitle. */
  notes?: string[];
  width?: number;
  height?: number;
}

/** Most quarter-wave markers drawn; beyond that only their spacing is stated. */
const MAX_MARKERS = 12;

function wrapDegrees(phi: Float64Array): Float64Array {
  const out = new Float64Array(phi.length);
  for (let k = 0; k < phi.length; k++) {
    const d = (phi[k] * 180) / Math.PI;
    out[k] = d - 360 * Math.round(d / 360);
  }
  return out;
}

/** Draws the three panels into `area` of `s`. */
export function drawSparams(s: Surface, area: Rect, input: SparamsPlotInput): void {
  const net = input.network;
  const f = net.freq;
  const fmax = f[f.length - 1];
  const s21 = entry(net, 1, 0);
  const s11 = entry(net, 0, 0);
  const qw = quarterWavePoints(input.delay, fmax);
  const marked = qw.length <= MAX_MARKERS;
  const markers: Marker[] = marked
    ? qw.map((at, k) => ({ axis: 'x' as const, at, label: k === 0 ? 'λ/4' : `${2 * k + 1}λ/4`, color: THEME.mutedText, dash: [4, 4] }))
    : [];
  const pad = 16;
  const ref = Array.from(net.reference);
  const refText = ref.every((r) => r === ref[0]) ? formatSi(ref[0], 'Ω', 3) : ref.map((r) => formatSi(r, 'Ω', 3)).join(' / ');
  const qwText = qw.length === 0 ? 'the stretch is shorter than a quarter wave at the top frequency' : marked ? 'quarter-wave points (2k + 1)/(4·TD) marked' : `quarter-wave points every ${formatSi(1 / (2 * input.delay), 'Hz', 3)} (too dense to mark)`;
  const titleH =
    pad +
    drawTitleBlock(
      s,
      { x: area.x + pad, y: area.y + pad, w: area.w - 2 * pad, h: area.h },
      input.title,
      [`${capitalize(input.portText ?? 'port 1 at the driver pin, port 2 at the receiver pin')}; reference ${refText}; TD = ${formatSi(input.delay, 's', 4)}; ${qwText}.`, ...(input.notes ?? [])].join(' '),
    );
  const bodyH = area.h - titleH;
  const h1 = Math.round(bodyH * 0.44);
  const h2 = Math.round(bodyH * 0.28);
  const x = { label: 'Frequency', unit: 'Hz', domain: [0, fmax] as [number, number] };
  const xs = f;
  drawLinePlot(s, { x: area.x, y: area.y + titleH, w: area.w, h: h1 }, {
    title: 'Magnitude',
    x,
    y: { label: 'Magnitude', unit: 'dB', si: false },
    series: [
      { name: '|S21|', values: clampDb(magnitudeDb(s21)), xs, style: { color: OKABE_ITO.blue, dash: [], width: 2 } },
      { name: '|S11|', values: clampDb(magnitudeDb(s11)), xs, style: { color: OKABE_ITO.vermillion, dash: [], width: 2 } },
    ],
    markers,
    legend: 'below',
  });
  drawLinePlot(s, { x: area.x, y: area.y + titleH + h1, w: area.w, h: h2 }, phasePanel(f, s21, input.delay, x));
  const tau = groupDelay(f, s21);
  drawLinePlot(s, { x: area.x, y: area.y + titleH + h1 + h2, w: area.w, h: bodyH - h1 - h2 }, {
    title: 'Group delay of S21 (−dφ/dω)',
    x,
    y: { label: 'Group delay', unit: 's', domain: delayDomain(tau, input.delay) },
    series: [{ name: 'τ_g', values: tau, xs, style: { color: OKABE_ITO.blue, dash: [], width: 1.5 } }],
    markers: input.delay > 0 ? [{ axis: 'y', at: input.delay, label: `TD ${formatSi(input.delay, 's', 3)}`, color: THEME.mutedText, dash: [2, 3] }] : [],
    legend: 'none',
  });
}

const capitalize = (t: string) => t.charAt(0).toUpperCase() + t.slice(1);

/** Most turns of the wrapped phase drawn; beyond that the phase is drawn with the delay TD removed. */
const MAX_TURNS = 20;

/**
 * The phase of S21 wrapped to ±180°, or, when it turns more than MAX_TURNS times over the band (a long
 * line: the wrapped curve would be a solid band), unwrapped with the delay's part −ω·TD added back, which
 * leaves the dispersion and the mismatch ripple.
 */
function phasePanel(f: Float64Array, s21: Float64Array, td: number, x: { label: string; unit: string; domain: [number, number] }) {
  const phi = unwrappedPhase(s21);
  const turns = Math.abs(phi[phi.length - 1] - phi[0]) / (2 * Math.PI);
  const style = { color: OKABE_ITO.blue, dash: [] as number[], width: 1.5 };
  if (turns <= MAX_TURNS || !(td > 0)) {
    return {
      title: 'Phase of S21',
      x,
      y: { label: 'Phase', unit: '°', si: false, domain: [-200, 200] as [number, number] }, // wrapped to ±180°; the margin lets the ticks fall on ±100°
      series: [{ name: 'arg S21', values: wrapDegrees(phi), xs: f, style }],
      legend: 'none' as const,
    };
  }
  const excess = phi.map((p, k) => ((p + 2 * Math.PI * f[k] * td) * 180) / Math.PI);
  return {
    title: `Phase of S21 + ω·TD (the delay TD removed; the wrapped phase turns ${Math.round(turns)} times)`,
    x,
    y: { label: 'Phase', unit: '°', si: false },
    series: [{ name: 'arg S21 + ω·TD', values: excess, xs: f, style }],
    legend: 'none' as const,
  };
}

/** dB values below −120 dB shown at −120 dB (a plot floor; the file keeps the values). */
function clampDb(v: Float64Array): Float64Array {
  return v.map((x) => (x < -120 ? -120 : x));
}

/** A y-domain for the group delay: around the data, including TD, ignoring the spikes at sharp notches. */
function delayDomain(tau: Float64Array, td: number): [number, number] {
  const sorted = Array.from(tau).filter(Number.isFinite).sort((a, b) => a - b);
  if (sorted.length === 0) return [0, Math.max(td * 2, 1e-12)];
  const lo = Math.min(sorted[Math.floor(0.02 * (sorted.length - 1))], td);
  const hi = Math.max(sorted[Math.ceil(0.98 * (sorted.length - 1))], td);
  const span = hi - lo || Math.max(Math.abs(hi), 1e-12);
  return [lo - 0.08 * span, hi + 0.12 * span];
}

/** sparams.png as PNG bytes (default 1200 × 1100). */
export async function renderSparams(input: SparamsPlotInput): Promise<Buffer> {
  const s = new Surface(input.width ?? 1200, input.height ?? 1100);
  drawSparams(s, { x: 0, y: 0, w: s.width, h: s.height }, input);
  return encodePng(s);
}
