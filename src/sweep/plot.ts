// sweep.png. A grid: the plotted metric against the first varied value, one line per probe (and per
// combination of the other varied values); the picked point is marked. A Monte Carlo run: the
// distribution of the metric over the samples as a cumulative fraction, one line per probe, with the
// scenario's check limit on that metric drawn and the yield printed. Points where the metric cannot be
// measured are gaps in a line: they are marked with a cross at the foot of the plot and listed below it.
import type { CheckSpec } from '../measure/index.js';
import { formatSI } from '../measure/index.js';
import { drawLinePlot, type LineSeries } from '../render/lineplot.js';
import type { Marker } from '../render/marks.js';
import { THEME, TRACE_DASHES, type TraceStyle } from '../render/palette.js';
import { encodePng, Surface } from '../render/surface.js';
import { netChecks } from '../scenario/checks.js';
import { columnName, type MetricColumn } from './columns.js';
import { pointNet, type SweepPlan } from './plan.js';
import type { SweepRow } from './point.js';
import { lineStep, wrapText } from '../views/panels.js';
import type { YieldReport } from './run.js';

const DISPLAY_UNIT: Record<string, string> = { ohm: 'Ω', 'ohm/m': 'Ω/m' };

function axisUnit(unit: string): { unit?: string; si?: boolean } {
  if (unit === '') return {};
  if (unit === '%') return { unit: '%', si: false };
  if (unit === 'count') return {};
  return { unit: DISPLAY_UNIT[unit] ?? unit };
}

/** A varied value for a legend: "2 pF", "39 Ω", "12 %", "0.5". */
export function formatSweepValue(v: number, unit: string): string {
  if (unit === '' || unit === 'count') return String(Number(v.toPrecision(4)));
  if (unit === '%') return `${Number(v.toPrecision(4))} %`;
  return formatSI(v, DISPLAY_UNIT[unit] ?? unit, 4);
}

/**
 * Eight line colours of our own for sweep series: eight hues, each with at least 3:1 contrast against
 * the white plot (WCAG 2.1, success criterion 1.4.11, non-text contrast; the palette's orange, sky blue
 * and yellow fall below it), paired with a different dash pattern each, so two series never differ by
 * colour alone and stay apart in grey-scale print.
 */
export const SERIES_COLORS: readonly string[] = ['#0072B2', '#D55E00', '#009E73', '#CC79A7', '#1f2430', '#A66B00', '#6A51A3', '#7F4F24'];

/**
 * The style of series `i` of `n`. Up to 8 series: colour and dash both by index. More (probes ×
 * combinations of the other varied values): colour by the combination, dash by the probe.
 */
export function sweepSeriesStyle(i: number, combos: number, n: number): TraceStyle {
  const k = SERIES_COLORS.length;
  if (n <= k) return { color: SERIES_COLORS[i % k]!, dash: TRACE_DASHES[i % TRACE_DASHES.length]!, width: 2 };
  const probe = Math.floor(i / combos), combo = i % combos;
  return { color: SERIES_COLORS[combo % k]!, dash: TRACE_DASHES[probe % TRACE_DASHES.length]!, width: 2 };
}

export interface SweepPlotOptions {
  /** Point number of the picked (grid) or worst (Monte Carlo) point, marked on the plot. */
  mark?: { point: number; label: string } | null;
  /** A Monte Carlo run's yield, printed on the plot. */
  yield?: YieldReport | null;
  width?: number;
  height?: number;
}

/** The scenario's checks on the plotted column's metric and unit (and settling band), per probe. */
function columnLimits(plan: SweepPlan, col: MetricColumn): { probe: string; value: number; kind: 'max' | 'min' }[] {
  let checks: CheckSpec[];
  try {
    checks = netChecks(pointNet(plan, 0));
  } catch {
    return [];
  }
  const sameBand = (c: CheckSpec) => (c.band ? !!col.band && c.band.unit === col.band.unit && c.band.value === col.band.value : !col.band);
  const out: { probe: string; value: number; kind: 'max' | 'min' }[] = [];
  for (const c of checks) {
    if (c.metric !== col.metric || !sameBand(c) || !plan.probes.includes(c.probe)) continue;
    if (c.max && c.max.unit === col.unit) out.push({ probe: c.probe, value: c.max.value, kind: 'max' });
    if (c.min && c.min.unit === col.unit) out.push({ probe: c.probe, value: c.min.value, kind: 'min' });
  }
  return out;
}

interface Drawn {
  title: string;
  subtitle: string;
  x: { label: string; unit?: string; si?: boolean; domain?: [number, number] };
  y: { label: string; unit?: string; si?: boolean; domain?: [number, number] };
  series: LineSeries[];
  markers: Marker[];
  legendTitle: string;
  /** Gaps: per series, the x positions without a value. */
  gaps: { series: number; xs: number[] }[];
  /** Lines printed under the plot. */
  notes: string[];
}

function gridPlot(plan: SweepPlan, rows: readonly SweepRow[], col: MetricColumn, yName: string, opts: SweepPlotOptions): Drawn {
  const axis = plan.axes[0]!;
  const n0 = axis.values.length;
  const rest = plan.axes.slice(1);
  const m = rest.reduce((k, a) => k * a.values.length, 1);
  const byPoint = new Map<number, SweepRow>(rows.map((r) => [r[0] as number, r]));
  const series: LineSeries[] = [];
  const names: string[] = [];
  const total = plan.probes.length * m;
  for (const probe of plan.probes) {
    const ci = plan.header.indexOf(columnName(probe, col));
    for (let r = 0; r < m; r++) {
      const values = new Float64Array(n0);
      for (let i0 = 0; i0 < n0; i0++) {
        const v = byPoint.get(i0 * m + r)?.[ci];
        values[i0] = v === null || v === undefined ? NaN : v;
      }
      let q = r;
      const parts: string[] = [];
      for (let k = rest.length - 1; k >= 0; k--) {
        const a = rest[k]!;
        parts.unshift(`${a.path} = ${formatSweepValue(a.values[q % a.values.length]!, a.unit)}`);
        q = Math.floor(q / a.values.length);
      }
      const name = parts.length ? `${probe}, ${parts.join(', ')}` : probe;
      names.push(name);
      series.push({ name, values, style: sweepSeriesStyle(series.length, m, total) });
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
  if (opts.mark) markers.push({ axis: 'x', at: axis.values[Math.floor(opts.mark.point / m)]!, label: opts.mark.label });
  for (const l of columnLimits(plan, col)) {
    markers.push({ axis: 'y', at: l.value, label: `${l.kind} ${formatSweepValue(l.value, col.unit)} (${l.probe})`, color: THEME.axis, dash: [6, 4] });
  }
  const gaps = series
    .map((s, i) => ({ series: i, xs: xs.filter((_, k) => !Number.isFinite((s.values as Float64Array)[k]!)) }))
    .filter((g) => g.xs.length > 0);
  const notes = gaps.length
    ? [
        `× at the foot of the plot: no ${yName} there (it cannot be measured at that point: an empty cell in sweep.csv).`,
        ...gaps.map((g) => `${names[g.series]}: no value at ${axis.path} = ${g.xs.map((x) => formatSweepValue(x, axis.unit)).join(', ')}`),
      ]
    : [];
  return {
    title: plan.scenario.title,
    subtitle: `${yName} against ${axis.path} (${plan.points} points)`,
    x: { label: axis.path, ...axisUnit(axis.unit) },
    y: { label: yName, ...axisUnit(col.unit) },
    series,
    markers,
    legendTitle: rest.length ? 'Probe and varied values' : 'Probes',
    gaps,
    notes,
  };
}

function monteCarloPlot(plan: SweepPlan, rows: readonly SweepRow[], col: MetricColumn, yName: string, opts: SweepPlotOptions): Drawn {
  const notes: string[] = [];
  const series: LineSeries[] = plan.probes.map((probe, i) => {
    const ci = plan.header.indexOf(columnName(probe, col));
    const v = rows.map((r) => r[ci]).filter((x): x is number => x !== null && x !== undefined).sort((a, b) => a - b);
    if (v.length < rows.length) notes.push(`${probe}: ${rows.length - v.length} of ${rows.length} samples have no ${yName} (it cannot be measured there); its curve counts only the others.`);
    return { name: probe, xs: Float64Array.from(v), values: Float64Array.from(v.map((_, k) => (k + 1) / v.length)), style: sweepSeriesStyle(i, 1, plan.probes.length) };
  });
  const markers: Marker[] = columnLimits(plan, col).map((l) => ({
    axis: 'x' as const,
    at: l.value,
    label: `check: ${l.kind} ${formatSweepValue(l.value, col.unit)} (${l.probe})`,
    color: THEME.text,
    dash: [6, 4],
  }));
  const y = opts.yield;
  const yieldText = y ? ` · yield ${Number((100 * y.fraction).toPrecision(4))} % (${y.passed} of ${y.samples} samples pass every check)` : '';
  return {
    title: plan.scenario.title,
    subtitle: `${yName} over ${plan.points} Monte Carlo samples (${plan.spreads.map((s) => s.text).join(', ')})${yieldText}`,
    x: { label: yName, ...axisUnit(col.unit) },
    y: { label: 'Fraction of samples ≤ x', domain: [0, 1] },
    series,
    markers,
    legendTitle: 'Probes',
    gaps: [],
    notes,
  };
}

/** What drawSweepPlot drew: the frame, and the gaps, limits and notes it marked (for tests and callers). */
export interface SweepPlotDrawn {
  frame: ReturnType<typeof drawLinePlot>;
  subtitle: string;
  series: LineSeries[];
  markers: Marker[];
  gaps: { series: number; xs: number[] }[];
  /** Where each gap's cross was drawn (surface pixels), in the order of `gaps`. */
  crosses: { series: number; x: number; y: number }[];
  notes: string[];
}

/** Draws the sweep plot onto `surface` (the whole of it). */
export function drawSweepPlot(surface: Surface, plan: SweepPlan, rows: readonly SweepRow[], opts: SweepPlotOptions = {}): SweepPlotDrawn {
  const col = plan.columns.find((c) => c.key === plan.metric) as MetricColumn;
  const yName = `${col.metric}${col.band ? ` (±${col.band.unit === '%' ? `${col.band.value} %` : `${col.band.value} V`} band)` : ''}`;
  const d = plan.mode === 'grid' ? gridPlot(plan, rows, col, yName, opts) : monteCarloPlot(plan, rows, col, yName, opts);
  const lines = d.notes.flatMap((n) => wrapText(surface, n, 12, surface.width - 32));
  const step = lineStep(surface, 12, 3);
  const noteH = lines.length ? lines.length * step + 10 : 0;
  const frame = drawLinePlot(surface, { x: 0, y: 0, w: surface.width, h: surface.height - noteH }, {
    title: d.title,
    subtitle: d.subtitle,
    x: d.x,
    y: d.y,
    series: d.series,
    markers: d.markers,
    legendTitle: d.legendTitle,
  });
  // a cross per missing point, in its series' colour, stacked upward from the foot of the plot
  const { plot } = frame;
  const stack = new Map<number, number>();
  const crosses: SweepPlotDrawn['crosses'] = [];
  for (const g of d.gaps) {
    const color = (d.series[g.series]!.style?.color as string) ?? THEME.text;
    for (const x of g.xs) {
      const px = Math.min(plot.x + plot.w - 6, Math.max(plot.x + 6, Math.round(frame.x.map(x))));
      const k = stack.get(px) ?? 0;
      stack.set(px, k + 1);
      const py = plot.y + plot.h - 8 - 11 * k;
      surface.line(px - 4, py - 4, px + 4, py + 4, { color, width: 2 });
      surface.line(px - 4, py + 4, px + 4, py - 4, { color, width: 2 });
      crosses.push({ series: g.series, x: px, y: py });
    }
  }
  let y = surface.height - noteH + 4;
  for (const l of lines) {
    surface.text(l, 16, y, { size: 12, color: THEME.mutedText, baseline: 'top' });
    y += step;
  }
  return { frame, subtitle: d.subtitle, series: d.series, markers: d.markers, gaps: d.gaps, crosses, notes: d.notes };
}

export async function renderSweepPlot(plan: SweepPlan, rows: readonly SweepRow[], opts: SweepPlotOptions = {}): Promise<Buffer> {
  const surface = new Surface(opts.width ?? 1200, opts.height ?? 700);
  drawSweepPlot(surface, plan, rows, opts);
  return encodePng(surface);
}
