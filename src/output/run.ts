// The whole `run` pipeline as a library function: scenario file → net → simulation → PNG →
// probes.csv, waveforms.png and summary.json in an output folder.
//
// Everything that can fail because of the input (reading and validating the scenario, the size
// limits, building the network, rendering) happens before the output folder is created, so bad
// input leaves nothing behind. The three files are then written to temporary names and renamed
// together, summary.json last; if writing fails, the temporary files (and a folder this run
// created) are removed.
import { readFile, mkdir, rmdir } from 'node:fs/promises';
import { dirname, join, resolve, sep } from 'node:path';
import type { Net } from '../../sim/model.js';
import type { SimResult } from '../../sim/result.js';
import { simulate, type SimulateOptions } from '../../sim/simulate.js';
import { checkScenario } from '../scenario/load.js';
import { ScenarioError, type Problem } from '../scenario/problems.js';
import { AtomicBatch } from './atomic.js';
import { probeRows, writeCsv } from './csv.js';
import { buildSummary, sha256Hex, summaryToJson, type Summary } from './summary.js';
import { addMeasurementSections } from '../checks/summary.js';

/** File names inside an output folder. */
export const OUTPUT_FILES = { csv: 'probes.csv', png: 'waveforms.png', summary: 'summary.json' } as const;

/** The outputs could not be written (folder not creatable, disk full, permissions). */
export class OutputError extends Error {
  constructor(message: string, cause?: unknown) {
    super(message, { cause });
    this.name = 'OutputError';
  }
}

export interface LoadedScenario {
  /** The path as given. */
  file: string;
  net: Net;
  /** SHA-256 of the file's bytes (hex). */
  sha256: string;
  /** Allowed but probably unintended things in the file. */
  warnings: Problem[];
}

/**
 * Reads a scenario file once: hashes its bytes and validates its text (JSON or YAML).
 * Throws ScenarioError listing every problem, including an unreadable file.
 */
export async function readScenarioFile(file: string): Promise<LoadedScenario> {
  let bytes: Buffer;
  try {
    bytes = await readFile(file);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'a directory' : (code ?? String(e));
    throw new ScenarioError([{ file, path: '', value: file, expected: `a readable scenario file (${why})` }]);
  }
  let text = bytes.toString('utf8');
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1); // byte-order mark
  const checked = checkScenario(text, file);
  if (!checked.net) throw new ScenarioError(checked.problems, checked.warnings);
  return { file, net: checked.net, sha256: sha256Hex(bytes), warnings: checked.warnings };
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
}

export interface RunReport {
  scenario: LoadedScenario;
  outDir: string;
  result: SimResult;
  summary: Summary;
  /** Paths of the files written, in the order they were renamed into place. */
  files: string[];
  /** Wall-clock seconds spent in the simulation proper, and in the whole call. */
  wallTime: { simulate: number; total: number };
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
    values: probeRows(record),
    width: options.width,
    height: options.height,
  });
}

/**
 * Writes probes.csv, waveforms.png (from `png`) and summary.json into `outDir`, creating it if
 * needed. All or nothing: on failure no new file appears under a final name, and a folder this call
 * created is removed again. Returns the paths written.
 */
export async function writeRunOutputs(outDir: string, outputs: RunOutputs, png: Uint8Array): Promise<string[]> {
  let created: string | undefined;
  try {
    created = await mkdir(outDir, { recursive: true });
  } catch (e) {
    throw new OutputError(`cannot create the output folder ${outDir}: ${(e as Error).message}`, e);
  }
  const batch = new AtomicBatch();
  try {
    await batch.stage(join(outDir, OUTPUT_FILES.csv), (sink) => writeCsv(outputs.result.record, sink));
    await batch.stage(join(outDir, OUTPUT_FILES.png), png);
    await batch.stage(join(outDir, OUTPUT_FILES.summary), summaryToJson(outputs.summary));
    return await batch.commit();
  } catch (e) {
    await batch.abort();
    if (created) await removeCreatedFolders(created, outDir);
    throw new OutputError(`cannot write the outputs in ${outDir}: ${(e as Error).message}`, e);
  }
}

/** Removes the empty folders from `leaf` up to and including `top` (what mkdir -p created). */
async function removeCreatedFolders(top: string, leaf: string): Promise<void> {
  const topAbs = resolve(top);
  let dir = resolve(leaf);
  while (dir === topAbs || dir.startsWith(topAbs + sep)) {
    try {
      await rmdir(dir); // only succeeds on an empty folder
    } catch {
      return;
    }
    dir = dirname(dir);
  }
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
  const { net } = scenario;

  options.onPhase?.('simulate');
  const t1 = performance.now();
  const result = simulate(net, { force: options.force, limits: options.limits });
  const simSeconds = (performance.now() - t1) / 1000;

  const summary = buildSummary({
    scenario: { file, sha256: scenario.sha256, title: net.title },
    discretization: result.discretization,
    record: result.record,
  });
  // Per-probe measurements and the scenario's checks (src/checks/summary.ts).
  addMeasurementSections(summary, net, result);
  await options.extendSummary?.({ net, result, summary });

  options.onPhase?.('render');
  const png = await renderResult(net.title, result, options);

  options.onPhase?.('write');
  const files = await writeRunOutputs(outDir, { title: net.title, result, summary }, png);
  return { scenario, outDir, result, summary, files, wallTime: { simulate: simSeconds, total: (performance.now() - t0) / 1000 } };
}
