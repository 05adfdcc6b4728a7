// summary.json: what was run, how it was discretized, and per-probe statistics.
//
// The summary is a plain object built in sections. The core sections (tool, scenario,
// discretization, record, probes) are filled here; the optional sections (SummarySections:
// measurements, checks, receivers, crosstalk, eye, crossCheck) are added by the modules that compute them with
// {@link addSummarySection} before it is written.
// Every number is in SI base units (s, V, m, ohm). The file holds nothing that changes from one run
// to the next (no timestamps, no wall time), so the same scenario and tool version give the same
// bytes.
import { createHash } from 'node:crypto';
import { lineImpedance } from '../../sim/lines/impedance.js';
import type { Net } from '../../sim/model.js';
import { probeTraces, type Discretization, type ProbeRecord, type SegmentPlan } from '../../sim/result.js';
import { probeStats, type CrossingLevel, type ProbeStats } from './crossing.js';
import { crossingLevels, netSettledLevels } from './net-levels.js';
import { netItems } from '../../sim/route-tree.js';
import { dtReasonText } from '../engine-text.js';
import { toolInfo, type ToolInfo } from './tool.js';
import { keyedRecord } from '../keyed.js';
import type { ProbeMeasurements } from '../measure/summary.js';
import type { EyeMeasurement } from '../views/eye.js';
import type { CrossCheckSection } from '../crosscheck/crosscheck.js';
import type { ChecksSection } from './measurement-sections.js';
import type { ReceiverEntry } from './receivers.js';
import type { CrosstalkEntry } from './crosstalk.js';

/** Bumped when a core section changes shape incompatibly. */
export const SUMMARY_FORMAT = 1;

export interface ScenarioInfo {
  /** The scenario file as given on the command line or to the library. */
  file: string;
  /** SHA-256 of the file's bytes, hex. */
  sha256: string;
  title: string;
}

export interface RecordInfo {
  samples: number;
  /** Time between samples (s); sample i is at t = i·dtSample. */
  dtSample: number;
  /** Time of the last sample (s). */
  end: number;
}

/**
 * A segment of summary.json: the engine's plan, with Z0 as the `line` command prints it — `z0` quasi-
 * static at `z0At` Hz (`z0Basis` "quasi-static") for a line with frequency-dependent loss, or √(L′/C′)
 * at every frequency (`z0Basis` "constant", `z0At` null) — and the high-frequency limit √(L∞/C∞).
 */
export type SummarySegment = Omit<SegmentPlan, 'z0'> & {
  z0: number;
  z0Basis: 'quasi-static' | 'constant' | 'high-frequency limit';
  z0At: number | null;
  z0HighFrequency: number;
};

/** The discretization as summary.json holds it: the engine's plan, labelled segments, and the Δt rule in words. */
export type SummaryDiscretization = Omit<Discretization, 'segments'> & { segments: SummarySegment[]; dtReason: string };

/** summary.json's optional sections, each added by the module named. */
export interface SummarySections {
  /** Per probe: levels, every edge, delays, noise margins, flags (measurement-sections.ts; docs/measurements.md). */
  measurements?: Record<string, ProbeMeasurements>;
  /** The scenario's check verdicts, when it has checks (measurement-sections.ts). */
  checks?: ChecksSection;
  /** Every receiver of a branched net, main receiver first (receivers.ts). */
  receivers?: Record<string, ReceiverEntry>;
  /** The quiet nets of a multi-net scenario: crosstalk against the aggressors (crosstalk.ts). */
  crosstalk?: Record<string, CrosstalkEntry>;
  /** The eye diagram's measurements (`run --views eye` and the `eye` command). */
  eye?: { probe: string } & EyeMeasurement;
  /** The spectral solution's differences from the time-domain one (`run --cross-check`, crosscheck/). */
  crossCheck?: CrossCheckSection;
}

export interface Summary extends SummarySections {
  format: number;
  tool: ToolInfo;
  scenario: ScenarioInfo;
  discretization: SummaryDiscretization;
  record: RecordInfo;
  /** Keyed by probe name, in probe order. */
  probes: Record<string, ProbeStats>;
}

export interface SummaryInput {
  scenario: ScenarioInfo;
  /** The net as simulated: its lines give each segment's Z0 figures. */
  net: Net;
  discretization: Discretization;
  record: ProbeRecord;
  /** Defaults to this package's name and version. */
  tool?: ToolInfo;
  /**
   * Per probe, the level of its "50 % at" crossing: the source's 50 % level through the probe's DC
   * divider (net-levels.ts). Computed from `net` and `discretization` when absent; a record probe that
   * is not in the net uses the level halfway between its initial and final value.
   */
  crossingLevels?: ReadonlyMap<string, CrossingLevel>;
}

export function sha256Hex(bytes: Uint8Array | string): string {
  return createHash('sha256').update(bytes).digest('hex');
}

export function buildSummary(input: SummaryInput): Summary {
  const { record } = input;
  const samples = record.values.shape[1];
  const rows = probeTraces(record);
  const probes = keyedRecord<ProbeStats>();
  const levels = input.crossingLevels ?? crossingLevels(input.net, netSettledLevels(input.net, input.discretization));
  record.names.forEach((name, p) => {
    if (Object.prototype.hasOwnProperty.call(probes, name)) throw new Error(`duplicate probe name '${name}' in the record`);
    probes[name] = probeStats(rows[p], record.dtSample, levels.get(name));
  });
  return {
    format: SUMMARY_FORMAT,
    tool: input.tool ?? toolInfo(),
    scenario: { ...input.scenario },
    discretization: { ...input.discretization, segments: labelledSegments(input.discretization.segments, input.net), dtReason: dtReasonText(input.discretization.dtRule) },
    record: { samples, dtSample: record.dtSample, end: (samples - 1) * record.dtSample },
    probes,
  };
}

/** The plan's segments with the Z0 figures of their lines (see SummarySegment), keys in a fixed order. */
function labelledSegments(segments: readonly SegmentPlan[], net: Net): SummarySegment[] {
  const lines = new Map(netItems(net).flatMap((it) => (it.kind === 'line' ? [[it.name, it.line] as const] : [])));
  return segments.map((seg) => {
    const line = lines.get(seg.name);
    if (!line) throw new Error(`summary: no line '${seg.name}' in the net`);
    const z = lineImpedance(line);
    const { loss, ...plan } = seg;
    return {
      ...plan,
      z0: z.z0,
      z0Basis: z.basis,
      z0At: z.at,
      z0HighFrequency: z.highFrequency,
      ...(loss ? { loss } : {}),
    };
  });
}

/** Adds one of the optional sections; refuses to replace one that is already there. */
export function addSummarySection<K extends keyof SummarySections>(summary: Summary, key: K, value: NonNullable<SummarySections[K]>): void {
  if (Object.prototype.hasOwnProperty.call(summary, key)) throw new Error(`summary already has a section '${key}'`);
  (summary as SummarySections)[key] = value;
}

/** Pretty JSON with a final newline. Non-finite numbers (which JSON cannot hold) become null. */
export function summaryToJson(summary: Summary): string {
  return JSON.stringify(summary, null, 2) + '\n';
}
