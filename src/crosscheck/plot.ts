// crosscheck.png: the time-domain and spectral solutions of every probe on one plot (time domain
// solid, spectral dashed, in the probe's colour), and below it their difference as a percent of
// the swing. Reads only the two records and the comparison.
import { probeTrace, type ProbeRecord } from '../../sim/result.js';
import { alignedColumns, drawLinePlot, encodePng, Surface, traceStyle, type Frame, type LineSeries, type LinePlotSpec } from '../render/index.js';
import type { CrossCheckResult } from './crosscheck.js';

export const CROSSCHECK_FILE = 'crosscheck.png';

export interface CrossCheckPlotSpec {
  title: string;
  timeDomain: ProbeRecord;
  check: CrossCheckResult;
  width?: number;
  height?: number;
}

/** Draws the overlay (top) and the difference (bottom) on one time axis; returns both frames. */
export function drawCrossCheck(surface: Surface, spec: CrossCheckPlotSpec): { upper: Frame; lower: Frame } {
  const { timeDomain: td, check } = spec;
  const sp = check.spectral;
  const { width, height } = surface;
  const overlay: LineSeries[] = [];
  const diffs: LineSeries[] = [];
  td.names.forEach((name, p) => {
    const q = sp.names.indexOf(name);
    if (q < 0) return;
    const base = traceStyle(overlay.length / 2);
    overlay.push({ name: `${name} (time domain)`, values: probeTrace(td, p), dx: td.dtSample, style: { color: base.color, dash: [], width: 2 } });
    overlay.push({ name: `${name} (spectral)`, values: probeTrace(sp, q), dx: sp.dtSample, style: { color: base.color, dash: [7, 5], width: 1.5 } });
    const a = probeTrace(td, p);
    const b = probeTrace(sp, q);
    const n = Math.min(a.length, b.length);
    const d = new Float64Array(n);
    for (let i = 0; i < n; i++) d[i] = (100 * (a[i] - b[i])) / check.swing;
    diffs.push({ name, values: d, dx: td.dtSample, style: { color: base.color, dash: [], width: 1.5 } });
  });
  const worst = check.worst;
  const top = Math.round(height * 0.58);
  const timeDomain: [number, number] = [0, Math.max(1e-15, (td.values.shape[1] - 1) * td.dtSample)];
  // Symmetric difference axis, to a round bound (1, 2 or 5 × 10^k) above the largest difference.
  let peak = 0;
  for (const s of diffs) for (const v of s.values as Float64Array) if (Number.isFinite(v)) peak = Math.max(peak, Math.abs(v));
  const bound = roundUp(peak > 0 ? peak * 1.05 : 0.1);
  const overlaySpec: LinePlotSpec = {
    title: `${spec.title}: time domain vs spectral`,
    subtitle: worst
      ? `largest difference ${worst.percentOfSwing.toFixed(3)} % of the ${check.swing.toPrecision(3)} V swing, at ${worst.name}`
      : undefined,
    x: { label: 'Time', unit: 's', domain: timeDomain },
    y: { label: 'Voltage', unit: 'V' },
    series: overlay,
    legend: 'right',
    legendTitle: 'Probes',
  };
  const diffSpec: LinePlotSpec = {
    title: 'Difference (time domain − spectral)',
    x: { label: 'Time', unit: 's', domain: timeDomain },
    y: { label: '% of swing', domain: [-bound, bound] },
    series: diffs,
    legend: 'right',
    legendTitle: 'Probes',
  };
  // one time axis for both panels, pixel for pixel
  const topArea = { x: 0, y: 0, w: width, h: top };
  const botArea = { x: 0, y: top, w: width, h: height - top };
  const columns = alignedColumns(surface, [
    { area: topArea, spec: overlaySpec },
    { area: botArea, spec: diffSpec },
  ]);
  const upper = drawLinePlot(surface, topArea, { ...overlaySpec, columns });
  const lower = drawLinePlot(surface, botArea, { ...diffSpec, columns });
  return { upper, lower };
}

/** The overlay and difference plot as PNG bytes (default 1200 × 900). */
export async function renderCrossCheck(spec: CrossCheckPlotSpec): Promise<Buffer> {
  const surface = new Surface(spec.width ?? 1200, spec.height ?? 900);
  drawCrossCheck(surface, spec);
  return encodePng(surface);
}

/** The smallest 1, 2 or 5 × 10^k at or above x > 0. */
export function roundUp(x: number): number {
  const e = 10 ** Math.floor(Math.log10(x));
  for (const m of [1, 2, 5, 10]) if (m * e >= x * (1 - 1e-12)) return m * e;
  return 10 * e;
}
