// The picture of a failed golden comparison: the new run against the golden waveform of every probe that
// failed (top; golden dashed, shifted by the shift that gave the comparison's value, as compared), and
// their difference with the ±tolerance band (bottom), the largest difference of each probe marked where
// it happened. Both panels share the time axis pixel for pixel.
import { alignedColumns, drawLinePlot, encodePng, formatSi, Surface, THEME, traceStyle, type Frame, type LinePlotSpec, type LineSeries, type Marker } from '../render/index.js';
import { roundUp } from '../crosscheck/plot.js';
import type { GoldenRecord } from './golden.js';

/** One failed probe: its new waveform and the comparison's result. */
export interface GoldenFailure {
  probe: string;
  /** New run samples at t = i·dt. */
  values: ArrayLike<number>;
  /** The golden column of the same probe. */
  golden: Float64Array;
  /** The best shift s (s): the run matched g(t − s); the largest difference and its instant. */
  shift: number;
  maxDiff: number;
  time: number;
}

export interface GoldenPlotSpec {
  title: string;
  dt: number;
  goldenTimes: GoldenRecord['times'];
  failures: readonly GoldenFailure[];
  tolerance: number;
  width?: number;
  height?: number;
}

/** v(t) − g(t − s) at the run's samples, NaN outside the golden record (the comparison's definition). */
export function goldenDifference(values: ArrayLike<number>, dt: number, gt: Float64Array, gv: Float64Array, shift: number): Float64Array {
  const out = new Float64Array(values.length).fill(NaN);
  const g0 = gt[0]!, g1 = gt[gt.length - 1]!;
  const eps = 1e-9 * Math.max(dt, g1 - g0);
  let j = 0;
  for (let i = 0; i < values.length; i++) {
    const u = i * dt - shift;
    if (u < g0 - eps || u > g1 + eps) continue;
    while (j < gt.length - 2 && gt[j + 1]! < u) j++;
    const f = Math.min(1, Math.max(0, (u - gt[j]!) / (gt[j + 1]! - gt[j]!)));
    out[i] = values[i]! - (gv[j]! + f * (gv[j + 1]! - gv[j]!));
  }
  return out;
}

/** Draws the overlay and the difference onto the whole of `surface`; returns both frames and the marks. */
export function drawGoldenOverlay(surface: Surface, spec: GoldenPlotSpec): { upper: Frame; lower: Frame; markers: Marker[] } {
  const { width, height } = surface;
  const overlay: LineSeries[] = [];
  const diffs: LineSeries[] = [];
  const markers: Marker[] = [];
  const end = Math.max(...spec.failures.map((f) => (f.values.length - 1) * spec.dt), spec.goldenTimes[spec.goldenTimes.length - 1]!);
  let peak = spec.tolerance;
  spec.failures.forEach((f, i) => {
    const color = traceStyle(i).color;
    overlay.push({ name: `${f.probe} (new)`, values: f.values, dx: spec.dt, style: { color, dash: [], width: 2 } });
    // golden as compared: g(t − s), i.e. its samples moved right by s
    overlay.push({ name: `${f.probe} (golden${f.shift ? `, shifted ${formatSi(f.shift, 's')}` : ''})`, values: f.golden, xs: spec.goldenTimes.map((t) => t + f.shift), style: { color, dash: [7, 5], width: 1.5 } });
    const d = goldenDifference(f.values, spec.dt, spec.goldenTimes, f.golden, f.shift);
    for (const v of d) if (Number.isFinite(v)) peak = Math.max(peak, Math.abs(v));
    diffs.push({ name: f.probe, values: d, dx: spec.dt, style: { color, dash: [], width: 1.5 } });
    markers.push({ axis: 'x', at: f.time, label: `largest: ${formatSi(f.maxDiff, 'V')} at ${formatSi(f.time, 's')} (${f.probe})`, color, dash: [3, 3] });
  });
  const bound = roundUp(1.05 * peak); // a round bound (1, 2 or 5 × 10^k), so the ticks land on it
  const band: Marker[] = [
    { axis: 'y', at: spec.tolerance, label: `+${formatSi(spec.tolerance, 'V')}`, color: THEME.axis, dash: [6, 4] },
    { axis: 'y', at: -spec.tolerance, label: `−${formatSi(spec.tolerance, 'V')}`, color: THEME.axis, dash: [6, 4] },
  ];
  const top = Math.round(height * 0.55);
  const upperSpec: LinePlotSpec = {
    title: `${spec.title}: golden waveform against this run`,
    subtitle: `${spec.failures.length} probe${spec.failures.length === 1 ? '' : 's'} outside ±${formatSi(spec.tolerance, 'V')}; solid: this run, dashed: the golden file as compared (shifted by the best shift)`,
    x: { label: 'Time', unit: 's', domain: [0, end] },
    y: { label: 'Voltage', unit: 'V' },
    series: overlay,
    legendTitle: 'Probes',
  };
  const lowerSpec: LinePlotSpec = {
    title: 'Difference (this run − golden), with the tolerance band; the largest difference marked',
    x: { label: 'Time', unit: 's', domain: [0, end] },
    y: { label: 'Difference', unit: 'V', domain: [-bound, bound] },
    series: diffs,
    markers: [...band, ...markers],
    legendTitle: 'Probes',
  };
  const topArea = { x: 0, y: 0, w: width, h: top };
  const botArea = { x: 0, y: top, w: width, h: height - top };
  const columns = alignedColumns(surface, [
    { area: topArea, spec: upperSpec },
    { area: botArea, spec: lowerSpec },
  ]);
  const upper = drawLinePlot(surface, topArea, { ...upperSpec, columns });
  const lower = drawLinePlot(surface, botArea, { ...lowerSpec, columns });
  return { upper, lower, markers };
}

/** The overlay as PNG bytes (default 1200 × 800). */
export function renderGoldenOverlay(spec: GoldenPlotSpec): Buffer {
  const surface = new Surface(spec.width ?? 1200, spec.height ?? 800);
  drawGoldenOverlay(surface, spec);
  return encodePng(surface);
}
