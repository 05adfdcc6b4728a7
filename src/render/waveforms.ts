// waveforms.png: every probe on one plot against time.
import type { Frame } from './frame.js';
import { drawLinePlot, type ImageSize } from './lineplot.js';
import type { Marker } from './marks.js';
import { encodePng, Surface, type Rect } from './surface.js';

export interface WaveformsSpec extends ImageSize {
  title: string;
  subtitle?: string;
  /** Time between samples (s); sample i is at t = t0 + i·dtSample. */
  dtSample: number;
  /** Time of sample 0 (s, default 0). */
  t0?: number;
  /** Probe names, one per entry of `values`. */
  names: readonly string[];
  /** Probe voltages (V), one array per probe. */
  values: readonly Float64Array[];
  /** Optional time markers (axis 'x', seconds) or voltage thresholds (axis 'y', volts). */
  markers?: readonly Marker[];
}

function check(spec: WaveformsSpec): void {
  if (!(spec.dtSample > 0) || !Number.isFinite(spec.dtSample)) {
    throw new RangeError(`renderWaveforms: dtSample must be a positive number of seconds, got ${spec.dtSample}`);
  }
  if (spec.names.length !== spec.values.length) {
    throw new RangeError(`renderWaveforms: ${spec.names.length} names for ${spec.values.length} value arrays`);
  }
}

/** Draw the waveform plot into `area` of an existing surface (for composite figures). */
export function drawWaveforms(surface: Surface, area: Rect, spec: WaveformsSpec): Frame {
  check(spec);
  return drawLinePlot(surface, area, {
    title: spec.title,
    subtitle: spec.subtitle,
    x: { label: 'Time', unit: 's' },
    y: { label: 'Voltage', unit: 'V' },
    series: spec.values.map((v, i) => ({ name: spec.names[i], values: v, x0: spec.t0 ?? 0, dx: spec.dtSample })),
    markers: spec.markers,
    legend: 'right',
    legendTitle: 'Probes',
  });
}

/**
 * All probes on one plot: time axis with SI-prefixed ticks, volts, grid, legend
 * with the probe names, title. Returns PNG bytes (default 1200 × 700).
 */
export async function renderWaveforms(spec: WaveformsSpec): Promise<Buffer> {
  check(spec);
  const surface = new Surface(spec.width ?? 1200, spec.height ?? 700);
  drawWaveforms(surface, { x: 0, y: 0, w: surface.width, h: surface.height }, spec);
  return encodePng(surface);
}
