// The `eye` pipeline as a library function: scenario file → a run long enough for the whole pattern
// (eyeRunDuration) → eye.png and summary.json (with an `eye` section) in an output folder, written
// atomically like the run's outputs. Bad input, an eye-less signal or an unknown probe fail before the
// folder is created.
import type { Net } from '../../sim/model.js';
import type { SimResult } from '../../sim/result.js';
import type { SimulateOptions } from '../../sim/simulate.js';
import { simulateSized } from '../size-limits.js';
import type { EyeMeasurement } from '../views/eye.js';
import { scenarioThresholds } from '../views/draw.js';
import { defaultEyeProbe, eyeInputOf, eyeRunDuration, eyeUnavailableReason } from '../views/eye.js';
import { RequestError } from './errors.js';
import { checkOutputTarget, OutputError, readScenarioFile, withPositions, writeRunFiles, type LoadedScenario } from './run.js';
import { addSummarySection, buildSummary, summaryToJson, type Summary } from './summary.js';

/** File names the eye command writes. */
export const EYE_FILES = { png: 'eye.png', summary: 'summary.json' } as const;

/** A request the scenario cannot satisfy (no bits or clock signal, no such probe). */
export class EyeRequestError extends RequestError {
  constructor(message: string) {
    super(message);
    this.name = 'EyeRequestError';
  }
}

export interface EyeRunOptions extends SimulateOptions {
  /** Probe to fold (default: the first probe at the receiver, else the last probe). */
  probe?: string;
  /** Logic thresholds (default: the scenario's for the probe, else the 50 % level). */
  thresholds?: { vih: number; vil: number };
  /** Sampling phase within the UI, 0..1 (default 0.5). */
  samplingPhase?: number;
  /** Width of the sampling window as a share of the UI, 0..1 (default 0.2). */
  samplingWindow?: number;
  width?: number;
  height?: number;
}

export interface EyeRunReport {
  scenario: LoadedScenario;
  /** The net as simulated (duration extended). */
  net: Net;
  outDir: string;
  probe: string;
  eye: EyeMeasurement;
  result: SimResult;
  summary: Summary;
  files: string[];
}

/** The net with its duration extended for an eye, and the probe to fold; throws EyeRequestError. */
export function eyeNet(net: Net, probe?: string): { net: Net; probe: string } {
  const why = eyeUnavailableReason(net.driver.signal);
  if (why) throw new EyeRequestError(why);
  const names = net.probes.map((p) => p.name);
  const chosen = probe ?? defaultEyeProbe(net);
  if (chosen === undefined) throw new EyeRequestError('the scenario has no probes; add one at the receiver');
  if (!names.includes(chosen)) throw new EyeRequestError(`no probe named '${chosen}' (probes: ${names.join(', ')})`);
  return { net: { ...net, run: { ...net.run, duration: eyeRunDuration(net) } }, probe: chosen };
}

export async function eyeScenarioFile(file: string, outDir: string, options: EyeRunOptions = {}): Promise<EyeRunReport> {
  const scenario = await readScenarioFile(file);
  const { net, probe } = eyeNet(scenario.net, options.probe);
  await checkOutputTarget(outDir);
  return withPositions(scenario, () => eyeLoaded(scenario, net, probe, outDir, options));
}

async function eyeLoaded(scenario: LoadedScenario, net: Net, probe: string, outDir: string, options: EyeRunOptions): Promise<EyeRunReport> {
  const { file } = scenario;
  const result = simulateSized(net, { force: options.force, limits: options.limits });
  const summary = buildSummary({
    scenario: { file, sha256: scenario.sha256, title: net.title },
    net,
    discretization: result.discretization,
    record: result.record,
  });
  const { renderEye } = await import('../views/eye-plot.js');
  const thresholds = options.thresholds ?? scenarioThresholds(net, probe);
  const input = eyeInputOf(net, result, probe, { thresholds, samplingPhase: options.samplingPhase, samplingWindow: options.samplingWindow });
  const { png, eye } = await renderEye({ title: net.title, probe, input, width: options.width, height: options.height });
  addSummarySection(summary, 'eye', { probe, ...eye });
  let json: string;
  try {
    json = summaryToJson(summary);
  } catch (e) {
    throw new OutputError(`cannot write the outputs in ${outDir}: ${EYE_FILES.summary}: ${(e as Error).message}`, e);
  }

  const files = await writeRunFiles(outDir, { title: net.title, result, summary }, [{ path: EYE_FILES.png, data: png }], json, { csv: false });
  return { scenario, net, outDir, probe, eye, result, summary, files };
}
