// The explore page's tables, built from a run's measurements and check results (as summary.json holds
// them): checks; the probes' levels and extremes; and per probe every edge. Each number that was
// measured at an instant carries that instant (src/measure/instants.ts), so the page can put its
// cursors there.
import { bandVolts, type EdgeMeasurement } from '../measure/edge-types.js';
import { checkBand, type CheckResult, type CheckSpec, type MetricName } from '../measure/checks.js';
import { checkAt, delayAt, edgeMetricAt, edgeNumbered, probeMetricAt, type MeasuredAt } from '../measure/instants.js';
import type { ProbeMeasurements } from '../measure/summary.js';
import { formatSI } from '../units.js';
import type { Cell, Table } from './payload.js';

const num = (value: number | null | undefined, unit: string): string => {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  if (unit === '%') return `${Number(value.toPrecision(4))} %`;
  return formatSI(value, unit, 4);
};

const text = (t: string, className?: string): Cell => ({ text: t, ...(className ? { className } : {}) });

/** A number cell; clickable when it has instants. */
function numCell(value: number | null | undefined, unit: string, at: MeasuredAt | null, probe: string, label: string, shown?: string): Cell {
  const v = value === undefined || value === null || !Number.isFinite(value) ? null : value;
  const cell: Cell = { text: shown ?? num(v, unit), value: v, className: 'num' };
  if (v !== null && at) cell.at = { ...at, probe, label: `${label} at ${probe}` };
  return cell;
}

function edgeName(e: EdgeMeasurement): string {
  return `${e.direction} edge ${e.number}`;
}

/** The band index of a settling check among an edge's measured bands, by half-width. */
function bandIndex(spec: CheckSpec | undefined, m: ProbeMeasurements | undefined, edge: number | null): number {
  if (!spec || spec.metric !== 'settling' || !m?.levels || edge === null) return 0;
  const want = bandVolts(checkBand(spec), m.levels.amplitude);
  const i = edgeNumbered(m, edge)?.settling.findIndex((s) => Math.abs(s.bandV - want) <= 1e-9 * Math.max(Math.abs(want), 1e-30)) ?? -1;
  return Math.max(0, i);
}

/** The checks table: the measured value is clickable when it has an instant. */
export function checksTable(results: readonly CheckResult[], specs: readonly CheckSpec[], probes: Readonly<Record<string, ProbeMeasurements>>): Table {
  return {
    id: 'checks',
    title: 'Checks',
    caption: 'Press a measured value to put the cursors where it was measured (its instant, or the span it measures: Δt then reads the value).',
    head: ['Probe', 'Metric', 'Limit', 'Measured', 'Result', 'Note'],
    rows: results.map((r, i) => {
      const at = checkAt(r, probes, bandIndex(specs[i], probes[r.probe], r.edge));
      const measured: Cell = { text: r.measuredText, value: r.measured, className: 'num' };
      if (at && r.measured !== null) measured.at = { ...at, probe: r.probe, label: `the ${r.metric} check at ${r.probe}` };
      return [text(r.probe), text(r.metric), text(r.limit), measured, text(r.pass ? 'PASS' : 'FAIL', r.pass ? 'verdict pass' : 'verdict fail'), text(r.message)];
    }),
  };
}

/** One row per probe: state levels, extremes, final value, noise margins. */
export function probesTable(probes: Readonly<Record<string, ProbeMeasurements>>): Table {
  const rows = Object.entries(probes).map(([name, m]): Cell[] => [
    text(name),
    numCell(m.levels?.low, 'V', null, name, 'low level'),
    numCell(m.levels?.high, 'V', null, name, 'high level'),
    numCell(m.min, 'V', probeMetricAt('min', m), name, 'the minimum'),
    numCell(m.max, 'V', probeMetricAt('max', m), name, 'the maximum'),
    numCell(m.final, 'V', probeMetricAt('final', m), name, 'the last sample'),
    numCell(m.noiseMargins?.high, 'V', probeMetricAt('noiseMarginHigh', m), name, 'the worst high-state level'),
    numCell(m.noiseMargins?.low, 'V', probeMetricAt('noiseMarginLow', m), name, 'the worst low-state level'),
    text(`${m.edgeCount.rising} rising, ${m.edgeCount.falling} falling`),
  ]);
  return {
    id: 'probes',
    title: 'Probes',
    caption: 'Low and high: state levels (IEEE 181). Noise margins: the worst level held in each state against vih / vil (only with logic thresholds). Press a number to put cursor A where it was measured.',
    head: ['Probe', 'Low', 'High', 'Min', 'Max', 'Final', 'Margin high', 'Margin low', 'Edges'],
    rows,
  };
}

function edgeRow(name: string, m: ProbeMeasurements, e: EdgeMeasurement): Cell[] {
  const what = edgeName(e);
  const at = (metric: MetricName) => edgeMetricAt(metric, e);
  const d = m.delays?.find((x) => x.probeEdge === e.number);
  const s = e.settling[0];
  const pct = (v: number | null, p: number | null) => (v === null ? undefined : `${num(v, 'V')} (${num(p, '%')})`);
  return [
    text(`${e.number} ${e.direction}`),
    numCell(e.t50, 's', { a: e.t50 }, name, `the 50 % instant of ${what}`),
    numCell(e.duration1090, 's', at('rise'), name, `10–90 % of ${what}`),
    numCell(e.overshootV, 'V', at('overshoot'), name, `the overshoot of ${what}`, pct(e.overshootV, e.overshootPct)),
    numCell(e.undershootV, 'V', at('undershoot'), name, `the undershoot of ${what}`, pct(e.undershootV, e.undershootPct)),
    numCell(e.ringbackV, 'V', at('ringback'), name, `the ringback of ${what}`, pct(e.ringbackV, e.ringbackPct)),
    ...(m.thresholds ? [numCell(e.ringbackMarginV, 'V', at('ringbackMargin'), name, `the ringback margin of ${what}`)] : []),
    numCell(s?.time ?? null, 's', at('settling'), name, `settling of ${what} (±${num(s?.bandPct ?? null, '%')})`),
    numCell(e.thresholdFirst, 's', at('crossings'), name, `the threshold crossings of ${what}`),
    numCell(d?.delay50 ?? null, 's', d ? delayAt(d, e) : null, name, `the delay of ${what} from the driver's source`),
  ];
}

/** Per probe, one row per edge. */
export function edgeTables(probes: Readonly<Record<string, ProbeMeasurements>>): Table[] {
  return Object.entries(probes)
    .filter(([, m]) => m.edges.length > 0)
    .map(([name, m]) => ({
      id: `edges-${name}`,
      title: `Edges at ${name}`,
      caption:
        'IEEE 181 definitions (docs/measurements.md). Overshoot, undershoot and ringback (depth below the settled level) in volts and % of the swing' +
        (m.thresholds ? '; ringback margin: the closest approach back toward vih (rising) / vil (falling) after crossing it, negative inside the undefined band' : '') +
        '; settling from the 50 % instant into the ' +
        `±${num(m.settleBands.length ? m.edges[0]?.settling[0]?.bandPct ?? null : null, '%')} band; threshold: first crossing of vih (rising) / vil (falling), or of 50 % without thresholds; ` +
        'delay: from the driver source’s 50 % instant. Press a number: spans (10–90 %, settling, threshold crossings, delay) put cursor A at their start and B at their end.',
      head: ['Edge', '50 % at', '10–90 %', 'Overshoot', 'Undershoot', 'Ringback', ...(m.thresholds ? ['Ringback margin'] : []), 'Settling', 'Threshold at', 'Delay'],
      rows: m.edges.map((e) => edgeRow(name, m, e)),
    }));
}
