// The explore page of one run: the waveforms, the map, and the tables, from the run's result and its
// summary (parsed from summary.json's text, so the page shows exactly the numbers the file holds).
import type { Net } from '../../sim/model.js';
import type { SimResult } from '../../sim/result.js';
import type { CheckResult } from '../measure/checks.js';
import type { ProbeMeasurements } from '../measure/summary.js';
import { TRACE_COLORS } from '../render/palette.js';
import { netChecks } from '../scenario/checks.js';
import { mapData, mapNote } from './map-data.js';
import { explorePage } from './page.js';
import type { LiveData, PageData, RunData, Table } from './payload.js';
import { checksTable, edgeTables, probesTable } from './tables.js';
import { traceSet, tracesNote, type TraceOptions } from './traces.js';

export interface RunPageInput {
  net: Net;
  /** The run's result with the user's probes (and the route map when recorded). */
  result: SimResult;
  /** summary.json as written, parsed. */
  summary: { scenario?: { file?: string }; tool?: { name?: string; version?: string }; measurements?: unknown; checks?: unknown };
  traces?: TraceOptions;
  live?: LiveData;
}

function runTables(net: Net, summary: RunPageInput['summary']): { tables: Table[]; checks: RunData['checks'] } {
  const probes = (summary.measurements ?? {}) as Record<string, ProbeMeasurements>;
  const section = summary.checks as { passed: number; failed: number; results: CheckResult[] } | undefined;
  const tables: Table[] = [];
  if (section?.results?.length) tables.push(checksTable(section.results, netChecks(net), probes));
  if (Object.keys(probes).length) tables.push(probesTable(probes), ...edgeTables(probes));
  return { tables, checks: section ? { passed: section.passed, failed: section.failed } : null };
}

export function runPageData(input: RunPageInput): PageData {
  const { net, result, summary } = input;
  const traces = traceSet(result.record, input.traces);
  const map = result.routeMap ? mapData(result.routeMap) : null;
  const { tables, checks } = runTables(net, summary);
  return {
    format: 1,
    kind: 'run',
    title: net.title,
    scenarioFile: summary.scenario?.file ?? '',
    tool: { name: summary.tool?.name ?? 'ladderwave', version: summary.tool?.version ?? '' },
    notes: [tracesNote(traces), ...(map ? [mapNote(map)] : [])],
    traceColors: [...TRACE_COLORS],
    run: { traces, map, tables, checks },
    ...(input.live ? { live: input.live } : {}),
  };
}

/** The page's HTML for one run. */
export async function buildRunPage(input: RunPageInput): Promise<string> {
  return explorePage(runPageData(input));
}
