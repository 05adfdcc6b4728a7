// The explore page of a sweep: sweep.csv's rows, and the waveforms of a stated selection of points
// (every point up to SWEEP_WAVEFORM_POINTS, else that many spread evenly, with the best or worst point
// among them), each simulated again from the plan exactly as the sweep ran it. The page overlays the
// chosen points' waveforms of one probe.
import { simulate } from '../../sim/simulate.js';
import { TRACE_COLORS } from '../render/palette.js';
import { pointAssignments, pointNet, type SweepPlan } from '../sweep/plan.js';
import type { SweepRow } from '../sweep/point.js';
import { toolInfo } from '../output/tool.js';
import { formatSI } from '../units.js';
import { explorePage } from './page.js';
import type { PageData, SweepData, SweepPoint } from './payload.js';
import { FULL_DATA_LIMIT, traceSet } from './traces.js';

/** Points whose waveforms the page holds, at most. */
export const SWEEP_WAVEFORM_POINTS = 24;

/** Points overlaid when the page opens, at most. */
const INITIAL_POINTS = 3;

const UNIT_SYMBOLS: Record<string, string> = { ohm: 'Ω' };

/** "route.rs.series.r = 30 Ω, route[0].length = 12 cm". */
export function pointLabel(plan: SweepPlan, point: number): string {
  return pointAssignments(plan, point)
    .map((a) => `${a.path} = ${a.unit ? formatSI(a.value, UNIT_SYMBOLS[a.unit] ?? a.unit) : String(a.value)}`)
    .join(', ');
}

/**
 * The points with waveforms: all of `points` up to `limit`, else `limit` of them spread evenly from the
 * first to the last, the marked ones always among them (each replacing the nearest spread point other
 * than the first and last). Ascending.
 */
export function waveformPoints(points: readonly number[], marked: readonly number[], limit = SWEEP_WAVEFORM_POINTS): number[] {
  if (points.length <= limit) return [...points];
  const chosen = new Set<number>();
  for (let k = 0; k < limit; k++) chosen.add(points[Math.round((k * (points.length - 1)) / (limit - 1))]!);
  for (const m of marked) {
    if (chosen.has(m) || !points.includes(m)) continue;
    // drop the spread point nearest m that is neither marked nor an end of the sweep
    const ends = [points[0], points[points.length - 1]];
    let drop: number | undefined;
    for (const c of chosen) if (!marked.includes(c) && !ends.includes(c) && (drop === undefined || Math.abs(c - m) < Math.abs(drop - m))) drop = c;
    if (drop !== undefined) chosen.delete(drop);
    chosen.add(m);
  }
  return [...chosen].sort((a, b) => a - b);
}

/** Points overlaid first: the marked ones with the first and last held, else the first, middle and last. */
function initialPoints(held: readonly number[], marked: readonly number[]): number[] {
  if (held.length <= INITIAL_POINTS) return [...held];
  const ends = [held[0]!, ...(marked.length ? [] : [held[Math.floor((held.length - 1) / 2)]!]), held[held.length - 1]!];
  return [...new Set([...marked, ...ends])].sort((a, b) => a - b);
}

/** The table's columns: varied values, the pick's objective and conditions, the plotted metric, the check tally. */
function shownColumns(plan: SweepPlan, varied: number, pick: PickColumns | null): string[] {
  const h = plan.header;
  const cols = [...h.slice(1, 1 + varied)];
  const add = (c: string | undefined) => c && h.includes(c) && !cols.includes(c) && cols.push(c);
  add(pick?.objective);
  pick?.conditions.forEach((c) => add(c.text.split(' ')[0]));
  add(`${plan.defaultProbe}.${plan.metric}`);
  add('checks_failed');
  add('checks_margin');
  return cols;
}

/** What the table needs of the pick (src/sweep/run.ts PickReport). */
export interface PickColumns {
  objective: string;
  conditions: { text: string }[];
}

export interface SweepPageInput {
  plan: SweepPlan;
  /** sweep.csv's rows, in point order. */
  rows: readonly SweepRow[];
  /** The best point of a pick, the worst sample of a Monte Carlo run. */
  marked: { point: number; label: string }[];
  pick?: PickColumns | null;
  force?: boolean;
  limit?: number;
}

export function sweepPageData(input: SweepPageInput): PageData {
  const { plan, rows, marked } = input;
  const points = rows.map((r) => r[0] as number);
  const held = waveformPoints(points, marked.map((m) => m.point), input.limit);
  const perPoint = Math.max(1, Math.floor(FULL_DATA_LIMIT / Math.max(1, held.length)));
  const withWaves: SweepPoint[] = held.map((point) => {
    const result = simulate(pointNet(plan, point), { force: input.force });
    return { point, label: pointLabel(plan, point), traces: traceSet(result.record, { fullLimit: perPoint }) };
  });
  const varied = plan.mode === 'grid' ? plan.axes.length : plan.spreads.length;
  const sweep: SweepData = {
    header: [...plan.header],
    rows: rows.map((r) => [...r]),
    varied,
    probes: [...plan.probes],
    probe: plan.probes.includes(plan.defaultProbe) ? plan.defaultProbe : (plan.probes[0] ?? ''),
    shown: shownColumns(plan, varied, input.pick ?? null),
    points: withWaves,
    initial: initialPoints(held, marked.map((m) => m.point)),
    marked,
  };
  const tool = toolInfo();
  const reduced = withWaves.filter((p) => p.traces.form === 'reduced').length;
  const notes = [
    held.length === points.length
      ? `Waveforms of every point (${held.length}), each simulated again from the sweep's plan after the sweep.`
      : `Waveforms of ${held.length} of the ${points.length} points (spread evenly from the first to the last${marked.length ? ', with the marked ones' : ''}), each simulated again from the sweep's plan after the sweep; every point's numbers are in the table and in sweep.csv.`,
    ...(reduced
      ? [`${reduced} of them hold the samples kept by the PNGs' min/max reduction (more than ${perPoint.toLocaleString('en-US')} samples × probes per point); their values are recorded samples, unchanged.`]
      : []),
  ];
  return {
    format: 1,
    kind: 'sweep',
    title: plan.scenario.title,
    scenarioFile: plan.scenario.file,
    tool: { name: tool.name, version: tool.version },
    notes,
    traceColors: [...TRACE_COLORS],
    sweep,
  };
}

/** The sweep's explore.html. */
export async function buildSweepPage(input: SweepPageInput): Promise<string> {
  return explorePage(sweepPageData(input));
}
