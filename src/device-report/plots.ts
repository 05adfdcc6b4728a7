// The device command's pictures: an I/V plot of the pull-up, pull-down and clamps in the pin's frame
// with the rails marked, and the switching waveforms into their fixtures with the model's reproduction
// overlaid (rising above, falling below).
import { drawLinePlot, encodePng, Surface, TRACE_COLORS, type LineSeries, type Marker } from '../render/index.js';
import type { DeviceReport } from './report.js';
import { si } from './text.js';

function rails(r: DeviceReport): Marker[] {
  return [
    { axis: 'x', at: r.buffer.model.ground, label: 'ground' },
    { axis: 'x', at: r.buffer.model.supply, label: 'supply' },
  ];
}

export async function ivPlot(r: DeviceReport): Promise<Buffer> {
  const s = new Surface(1200, 700);
  const series: LineSeries[] = r.curves.map((c) => ({ name: c.name, values: c.i, xs: c.v }));
  drawLinePlot(s, { x: 0, y: 0, w: s.width, h: s.height }, {
    title: `${r.buffer.data.name}: I/V tables (${r.buffer.corner})`,
    subtitle: 'current into the pin against pin voltage; pull-up and pull-down fully on; clamps always present',
    x: { label: 'Pin voltage', unit: 'V' },
    y: { label: 'Current into the pin', unit: 'A' },
    series,
    markers: rails(r),
  });
  return encodePng(s);
}

function edgeSeries(r: DeviceReport, rising: boolean): LineSeries[] {
  const out: LineSeries[] = [];
  r.waveforms
    .filter((w) => w.rising === rising)
    .forEach((w, k) => {
      const name = `${si(w.fixture.r, 'Ω')} to ${si(w.fixture.v, 'V')}`;
      const color = TRACE_COLORS[k % TRACE_COLORS.length];
      out.push({ name: `${w.from === 'ramp' ? 'ramp' : 'file'}, ${name}`, values: w.file, xs: w.t, style: { color, width: 4, dash: [] } });
      out.push({ name: `model, ${name} (worst ${(100 * w.worst).toFixed(2)} % of swing)`, values: w.model, xs: w.t, style: { color: '#000000', width: 1.5, dash: [6, 4] } });
    });
  return out;
}

export async function waveformPlot(r: DeviceReport): Promise<Buffer> {
  const s = new Surface(1200, 1000);
  const half = s.height / 2;
  for (const rising of [true, false]) {
    drawLinePlot(s, { x: 0, y: rising ? 0 : half, w: s.width, h: half }, {
      title: `${r.buffer.data.name}: ${rising ? 'rising' : 'falling'} edge into its fixtures (${r.buffer.corner})`,
      subtitle: 'solid: the model file; dashed: the model run into the same fixture',
      x: { label: 'Time', unit: 's' },
      y: { label: 'Pin voltage', unit: 'V' },
      series: edgeSeries(r, rising),
    });
  }
  return encodePng(s);
}
