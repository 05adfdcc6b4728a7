// The whole `run` pipeline as a library function: scenario file → net → simulation → PNG →
// probes.csv, waveforms.png and summary.json in an output folder; optionally further views (map.png,
// bounce.png, eye.png), animation frames (frames/frame-0001.png …) and report.html.
//
// Everything that can fail because of the input (reading and validating the scenario, the output
// folder's place, the size limits, building the network, rendering) happens before anything is
// written, so bad input leaves nothing behind. The files are then written as one folder that
// replaces the previous one as a whole (folder.ts): a reader sees all of one run's files or none.
import { join } from 'node:path';
import type { Net } from '../../sim/model.js';
import ndarray from 'ndarray';
import { probeTrace, probeTraces, type ProbeRecord, type SimResult } from '../../sim/result.js';
import type { SimulateOptions } from '../../sim/simulate.js';
import { simulateSized } from '../size-limits.js';
import type { ViewName } from '../views/select.js';
import type { EyeViewOptions } from '../views/draw.js';
import { readScenario } from '../scenario/load.js';
import type { Pos, Problem } from '../scenario/problems.js';
import { locatePath, type LocatedNetProblem } from '../scenario/locate.js';
import { NetError } from '../../sim/errors.js';
import { checkOutputTarget, writeOutputFolder, type FolderEntry } from './folder.js';
import { OutputError } from './errors.js';
import { writeCsv } from './csv.js';
import { addSummarySection, buildSummary, sha256Hex, summaryToJson, type Summary } from './summary.js';
import { addMeasurementSections } from './measurement-sections.js';
import { measureNet } from './measure-net.js';
import { crossingLevels, netSettledLevels } from './net-levels.js';
import type { CheckResult } from '../measure/index.js';
import { receiversSection, withReceiverProbes } from './receivers.js';
import { crosstalkSection } from './crosstalk.js';

/** File names inside an output folder. */
export const OUTPUT_FILES = { csv: 'probes.csv', png: 'waveforms.png', summary: 'summary.json' } as const;

export { OutputError } from './errors.js';
export { checkOutputTarget, writeOutputFolder, type FolderEntry } from './folder.js';

export interface LoadedScenario {
  /** The path as given. */
  file: string;
  net: Net;
  /** SHA-256 of the file's bytes (hex). */
  sha256: string;
  /** Allowed but probably unintended things in the file. */
  warnings: Problem[];
  /** Where a key path (`route[2]`, `receiver`, an item's name) is in the file, for messages. */
  locate(path: string): Pos | undefined;
}

/**
 * Reads a scenario file once: hashes its bytes and validates its text (JSON or YAML).
 * Throws ScenarioError listing every problem, including an unreadable file.
 */
export async function readScenarioFile(file: string): Promise<LoadedScenario> {
  const { net, bytes, warnings, root } = await readScenario(file);
  return { file, net, sha256: sha256Hex(bytes), warnings, locate: (path) => locatePath(root, path) };
}

/**
 * Runs `work` on a loaded scenario; a NetError it throws (a net the engine cannot simulate) comes
 * out with the line:column of each problem's item in the scenario file.
 */
export async function withPositions<T>(scenario: LoadedScenario, work: () => Promise<T>): Promise<T> {
  try {
    return await work();
  } catch (e) {
    if (!(e instanceof NetError)) throw e;
    throw new NetError(
      e.problems.map((p): LocatedNetProblem => {
        const pos = scenario.locate(p.path);
        return pos ? { ...p, line: pos.line, col: pos.col } : p;
      }),
    );
  }
}

export type RunPhase = 'load' | 'simulate' | 'render' | 'write';

export interface RunOptions extends SimulateOptions {
  /** PNG size in pixels (the renderer's defaults when absent). */
  width?: number;
  height?: number;
  /**
   * Called after the core summary is built and before anything is written: add sections
   * (measurements, checks) with addSummarySection.
   */
  extendSummary?: (ctx: { net: Net; result: SimResult; summary: Summary }) => void | Promise<void>;
  /** Called as each phase starts (the CLI uses 'write' to clean up temporary files on Ctrl-C). */
  onPhase?: (phase: RunPhase) => void;
  /**
   * Views to draw, one PNG each (default ['waveforms']; `ladderwave run` defaults to waveforms and map).
   * A view the scenario cannot have (an eye without a bits or clock signal) is skipped and listed in
   * RunReport.skippedViews.
   */
  views?: readonly ViewName[];
  /** Number of animation frames of the voltage along the route, in frames/ (default 0: none). */
  frames?: number;
  /** Also write report.html, one self-contained page with the views and the numbers. */
  report?: boolean;
  /** Also write explore.html, the interactive page (src/explore, loaded only then). */
  explore?: boolean;
  /** The eye view's probe, thresholds and sampling phase. */
  eye?: EyeViewOptions;
  /** The receiver whose path the bounce view follows on a branched net (default: the main receiver). */
  path?: string;
  /**
   * Further files for the output folder (for example crosscheck.png), asked for after extendSummary
   * and written with the others.
   */
  extraFiles?: () => readonly OutputFile[];
}

export interface RunReport {
  scenario: LoadedScenario;
  outDir: string;
  result: SimResult;
  summary: Summary;
  /** Paths of the files written, in the order they were renamed into place (frames apart). */
  files: string[];
  /** Paths of the animation frames written (empty without --frames). */
  frameFiles: string[];
  /** Views that were asked for but that this scenario cannot have, and why. */
  skippedViews: { view: ViewName; reason: string }[];
  /** Views drawn without part of their content (the bounce view without a lattice), and why. */
  partialViews: { view: ViewName; reason: string }[];
  /** Why the frames asked for were not drawn (null when they were, or none were asked for). */
  framesSkipped: string | null;
  /** The verdicts of the scenario's checks, in file order (empty when it has none). */
  checks: CheckResult[];
  /** Wall-clock seconds spent in the simulation proper, and in the whole call. */
  wallTime: { simulate: number; total: number };
  /** The explore page's data (with `explore`): a watch server serves it again with its own additions. */
  exploreData?: import('../explore/payload.js').PageData;
}

export interface RunOutputs {
  title: string;
  result: SimResult;
  summary: Summary;
}

/**
 * Renders the waveforms PNG of a result (in memory). The renderer (fonts, rasterizer) is loaded on
 * first use, so importing the library for simulation alone stays light.
 */
export async function renderResult(title: string, result: SimResult, options: { width?: number; height?: number } = {}): Promise<Buffer> {
  const { renderWaveforms } = await import('../render/waveforms.js');
  const { record } = result;
  return renderWaveforms({
    title,
    dtSample: record.dtSample,
    names: record.names,
    values: probeTraces(record),
    width: options.width,
    height: options.height,
  });
}

/** A file of a run's output other than probes.csv and summary.json: a path relative to the output folder, and its bytes. */
export interface OutputFile {
  path: string;
  data: string | Uint8Array;
}

/**
 * Writes probes.csv, waveforms.png (from `png`) and summary.json as the content of `outDir`
 * (writeOutputFolder: all or nothing, replacing a previous run's folder as a whole). Returns the
 * paths written.
 */
export async function writeRunOutputs(outDir: string, outputs: RunOutputs, png: Uint8Array): Promise<string[]> {
  return writeRunFiles(outDir, outputs, [{ path: OUTPUT_FILES.png, data: png }]);
}

/**
 * The entries of a run's folder: probes.csv (unless `csv` is false), then `files` (relative paths;
 * subfolders such as frames/ are created), then summary.json (`summaryJson` when given, else
 * serialized from `outputs.summary`).
 */
export function runFolderEntries(outputs: RunOutputs, files: readonly OutputFile[], summaryJson?: string, opts: { csv?: boolean } = {}): FolderEntry[] {
  const entries: FolderEntry[] = [];
  if (opts.csv ?? true) entries.push({ path: OUTPUT_FILES.csv, data: (sink) => writeCsv(outputs.result.record, sink) });
  entries.push(...files);
  entries.push({ path: OUTPUT_FILES.summary, data: summaryJson ?? summaryToJson(outputs.summary) });
  return entries;
}

/** Writes runFolderEntries as the content of `outDir` (all or nothing, as writeRunOutputs). Returns the paths written, in order. */
export async function writeRunFiles(
  outDir: string,
  outputs: RunOutputs,
  files: readonly OutputFile[],
  summaryJson?: string,
  opts: { csv?: boolean } = {},
): Promise<string[]> {
  return writeOutputFolder(outDir, runFolderEntries(outputs, files, summaryJson, opts));
}

/** The record restricted to the named probes, in that order (the views may have simulated extra ones). */
export function selectProbes(record: ProbeRecord, names: readonly string[]): ProbeRecord {
  if (names.length === record.names.length && names.every((n, i) => record.names[i] === n)) return record;
  const n = record.values.shape[1];
  const data = new Float64Array(names.length * n);
  names.forEach((name, i) => data.set(probeTrace(record, name), i * n));
  return { names: [...names], dtSample: record.dtSample, values: ndarray(data, [names.length, n]) };
}

/**
 * Load → simulate → render → write. Throws ScenarioError (bad file), NetError (a net that cannot
 * be simulated), RunRefused (over a size limit, unless `force`), or OutputError (cannot write);
 * in all of these cases nothing is left in `outDir`.
 */
export async function runScenarioFile(file: string, outDir: string, options: RunOptions = {}): Promise<RunReport> {
  const t0 = performance.now();
  options.onPhase?.('load');
  const scenario = await readScenarioFile(file);
  // Before any work: an output folder that cannot be written fails now, not after the simulation.
  await checkOutputTarget(outDir);
  return withPositions(scenario, () => runLoaded(scenario, outDir, options, t0));
}

async function runLoaded(scenario: LoadedScenario, outDir: string, options: RunOptions, t0: number): Promise<RunReport> {
  const { net, file } = scenario;
  const { planViews } = await import('../views/select.js');
  const plan = planViews(net, options.views ?? ['waveforms'], options.frames ?? 0, options.path);
  const frames = plan.framesSkipped === null ? (options.frames ?? 0) : 0;

  options.onPhase?.('simulate');
  const t1 = performance.now();
  // The bounce view shows the driver pin and the receiver: simulate them even when no probe is there.
  const views = plan.views.includes('bounce') ? await import('../views/bounce.js') : undefined;
  // Every receiver is measured: a branched net gets a probe at each receiver that has none.
  const simNet = withReceiverProbes(views ? views.withEndProbes(net, options.path) : net);
  const result = simulateSized(simNet, { force: options.force, limits: options.limits, routeMap: plan.routeMap || options.explore ? {} : undefined });
  const simSeconds = (performance.now() - t1) / 1000;
  const record = selectProbes(result.record, net.probes.map((p) => p.name));
  const userResult: SimResult = { ...result, record };

  const settled = netSettledLevels(net, result.discretization);
  const summary = buildSummary({
    scenario: { file, sha256: scenario.sha256, title: net.title },
    net,
    discretization: result.discretization,
    record,
    crossingLevels: crossingLevels(net, settled),
  });
  // Per-probe measurements and the scenario's checks (src/output/measurement-sections.ts).
  const measured = addMeasurementSections(summary, net, userResult, measureNet(net, userResult, [], settled));
  const receivers = receiversSection(net, simNet, result);
  if (receivers) addSummarySection(summary, 'receivers', receivers);
  const crosstalk = crosstalkSection(net, measured.measurements);
  if (crosstalk) addSummarySection(summary, 'crosstalk', crosstalk);
  if (plan.views.includes('eye')) {
    const { eyeInputFor } = await import('../views/draw.js');
    const { measureEye, EYE_MIN_WINDOWS, fewWindowsNote } = await import('../views/eye.js');
    const { probe, input } = eyeInputFor(net, userResult, options.eye);
    const eye = measureEye(input);
    addSummarySection(summary, 'eye', { probe, ...eye });
    if (eye.windows < EYE_MIN_WINDOWS) {
      plan.views = plan.views.filter((v) => v !== 'eye');
      plan.skipped.push({
        view: 'eye',
        reason: eye.windows === 0 ? 'the run is shorter than two unit intervals at the probe; `ladderwave eye` runs long enough' : fewWindowsNote(eye.windows),
      });
    }
  }
  await options.extendSummary?.({ net, result: userResult, summary });

  options.onPhase?.('render');
  const { drawViews } = await import('../views/draw.js');
  const drawn = await drawViews({ net: simNet, result, record, views: plan.views, width: options.width, height: options.height, eye: options.eye, path: options.path });
  const files: OutputFile[] = drawn.map((d) => ({ path: d.file, data: d.png }));
  const frameFiles: OutputFile[] = [];
  let framesDir: string | undefined;
  if (frames > 0 && result.routeMap) {
    const { renderFrames, frameFileName, FRAMES_DIR } = await import('../views/frames.js');
    framesDir = FRAMES_DIR;
    const pngs = await renderFrames({ title: net.title, routeMap: result.routeMap, count: frames });
    pngs.forEach((png, i) => frameFiles.push({ path: join(FRAMES_DIR, frameFileName(i, frames)), data: png }));
  }
  let summaryJson: string;
  try {
    summaryJson = summaryToJson(summary);
  } catch (e) {
    throw new OutputError(`cannot write the outputs in ${outDir}: ${OUTPUT_FILES.summary}: ${(e as Error).message}`, e);
  }
  const reportFiles: OutputFile[] = [];
  if (options.report) {
    const { buildReport, REPORT_FILE } = await import('../report/index.js');
    const html = buildReport({
      net,
      summary: JSON.parse(summaryJson),
      images: drawn.map((d) => ({ title: d.title, file: d.file, png: d.png })),
      frames: framesDir ? { count: frames, folder: framesDir } : undefined,
    });
    reportFiles.push({ path: REPORT_FILE, data: html });
  }
  let exploreData: RunReport['exploreData'];
  if (options.explore) {
    const { runPageData, explorePage, EXPLORE_FILE } = await import('../explore/index.js');
    exploreData = runPageData({ net, result: { ...userResult, routeMap: result.routeMap }, summary: JSON.parse(summaryJson) });
    reportFiles.push({ path: EXPLORE_FILE, data: await explorePage(exploreData) });
  }

  options.onPhase?.('write');
  const extra = options.extraFiles?.() ?? [];
  const written = await writeRunFiles(outDir, { title: net.title, result: userResult, summary }, [...files, ...frameFiles, ...reportFiles, ...extra], summaryJson);
  const frameSet = new Set(frameFiles.map((f) => join(outDir, f.path)));
  return {
    scenario,
    outDir,
    result: userResult,
    summary,
    files: written.filter((f) => !frameSet.has(f)),
    frameFiles: written.filter((f) => frameSet.has(f)),
    skippedViews: plan.skipped,
    partialViews: plan.partial,
    framesSkipped: plan.framesSkipped,
    checks: measured.results,
    wallTime: { simulate: simSeconds, total: (performance.now() - t0) / 1000 },
    ...(exploreData ? { exploreData } : {}),
  };
}
