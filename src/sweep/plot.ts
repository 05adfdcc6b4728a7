// sweep.png. A grid: the plotted metric against the first varied value, one line per probe (and per
// combination of the other varied values); the picked point is marked. A Monte Carlo run: the
// distribution of the metric over the samples as a cumulative fraction, one line per probe.
import type { Marker } from '../render/marks.js';
import type { LineSeries } from '../render/lineplot.js';
import { columnName, type MetricColumn } from './columns.js';
import type { SweepPlan } from './plan.js';
import type { SweepRow } from './point.js';

const DISPLAY_UNIT: Record<string, string> = { ohm: 'Ω', 'ohm/m': 'Ω/m' };

function axisUnit(unit: string): { unit?: string; si?: boolean } {
  if (unit === '') return {};
  if (unit === '%') return { unit: '%', si: false };
  if (unit === 'count') return {};
  return { unit: DISPLAY_UNIT[unit] ?? unit };
}

function fmt(v: number, unit: string): string {
  return `${Number(v.toPrecision(4))}${unit ? ` ${DISPLAY_UNIT[unit] ?? unit}` : ''}`;
}

export interface SweepPlotOptions {
  /** Point number of the picked (grid) or worst (Monte Carlo) point, marked on the plot. */
  mark?: { point: number; label: string } | null;
  width?: number;
  height?: number;
}

export async function renderSweepPlot(plan: SweepPlan, rows: readonly SweepRow[], opts: SweepPlotOptions = {}): Promise<Buffer> {
  const { linePlot } = await import('../render/lineplot.js');
  const col = plan.columns.find((c) => c.key === plan.metric) as MetricColumn;
  const yName = `${col.metric}${col.band ? ` (±${col.band.unit === '%' ? `${col.band.value} %` : `${col.band.value} V`} band)` : ''}`;
  const colIdx = (probe: string) => plan.header.indexOf(columnName(probe, col));
  const val = (v: number | null | undefined) => (v === null || v === undefined ? NaN : v);
  if (plan.mode === 'grid') {
    const axis = plan.axes[0]!;
    const n0 = axis.values.length;
    const rest = plan.axes.slice(1);
    const m = rest.reduce((k, a) => k * a.values.length, 1);
    const byPoint = new Map<number, SweepRow>(rows.map((r) => [r[0] as number, r]));
    const series: LineSeries[] = [];
    for (const probe of plan.probes) {
      const ci = colIdx(probe);
      for (let r = 0; r < m; r++) {
        const values = new Float64Array(n0);
        for (let i0 = 0; i0 < n0; i0++) values[i0] = val(byPoint.get(i0 * m + r)?.[ci]);
        let name = probe;
        if (rest.length > 0) {
          // the values of the other axes for combination r
          let q = r;
          const parts: string[] = [];
          for (let k = rest.length - 1; k >= 0; k--) {
            const a = rest[k]!;
            parts.unshift(`${a.path}=${fmt(a.values[q % a.values.length]!, a.unit)}`);
            q = Math.floor(q / a.values.length);
          }
          name += `, ${parts.join(', ')}`;
        }
        series.push({ name, values });
      }
    }
    // linePlot needs non-decreasing x: reorder when the list was given out of order.
    const order = axis.values.map((_, i) => i).sort((a, b) => axis.values[a]! - axis.values[b]!);
    const xs = order.map((i) => axis.values[i]!);
    for (const s of series) {
      const v = s.values as Float64Array;
      s.values = Float64Array.from(order.map((i) => v[i]!));
      s.xs = xs;
    }
    const markers: Marker[] = [];
    if (opts.mark) {
      const at = plan.axes.length > 0 ? axis.values[Math.floor(opts.mark.point / m)]! : 0;
      markers.push({ axis: 'x', at, label: opts.mark.label });
    }
    return linePlot({
      title: `${plan.scenario.title}`,
      subtitle: `${yName} against ${axis.path} (${plan.points} points)`,
      x: { label: axis.path, ...axisUnit(axis.unit) },
      y: { label: yName, ...axisUnit(col.unit) },
      series,
      markers,
      legendTitle: 'Probes',
      width: opts.width,
      height: opts.height,
    });
  }
  // Monte Carlo: cumulative fraction of samples at or below each value.
  const series: LineSeries[] = plan.probes.map((probe) => {
    const ci = colIdx(probe);
    const v = rows.map((r) => r[ci]).filter((x): x is number => x !== null && x !== undefined).sort((a, b) => a - b);
    return { name: probe, xs: Float64Array.from(v), values: Float64Array.from(v.map((_, k) => (k + 1) / v.length)) };
  });
  const markers: Marker[] = [];
  return linePlot({
    title: `${plan.scenario.title}`,
    subtitle: `${yName} over ${plan.points} Monte Carlo samples (${plan.spreads.map((s) => s.text).join(', ')})`,
    x: { label: yName, ...axisUnit(col.unit) },
    y: { label: 'Fraction of samples ≤ x', domain: [0, 1] },
    series,
    markers,
    legendTitle: 'Probes',
    width: opts.width,
    height: opts.height,
  });
}
