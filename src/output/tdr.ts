// `ladderwave tdr` as a library function: scenario file → TDR net → simulation → impedance profile →
// tdr.png and tdr.csv in an output folder. Everything that can fail because of the input happens
// before the folder is created; the two files are written to temporary names and renamed together
// (tdr.csv last, so a complete CSV means a complete output), and a folder this call created is
// removed again if writing fails.
import type { Net } from '../../sim/model.js';
import type { SimResult } from '../../sim/result.js';
import { RunRefused } from '../../sim/errors.js';
import type { RunLimits } from '../../sim/limits.js';
import { planRun, simulate } from '../../sim/simulate.js';
import { AdvisedRefusal } from '../engine-text.js';
import { formatSI } from '../units.js';
import { routeDelay } from '../../sim/discretize.js';
import { readScenarioFile, writeOutputFolder, type LoadedScenario } from './run.js';
import { unknownPath } from '../views/select.js';
import { UsageError } from '../exit-codes.js';
import { renderTdr, tdrCsv, tdrNet, tdrProfile, type TdrProfile } from '../views/tdr.js';

export const TDR_FILES = { png: 'tdr.png', csv: 'tdr.csv' } as const;

/** Default 10–90 % rise time of the TDR step: 35 ps, a common bench TDR edge (common practice). */
export const DEFAULT_TDR_RISE = 35e-12;

/**
 * The step used when none is given: 35 ps, or the route's one-way delay / 400 on long routes, so a
 * cable of tens of metres is resolved to a few centimetres in seconds instead of refused.
 */
export function defaultTdrRise(net: Net): number {
  return Math.max(DEFAULT_TDR_RISE, routeDelay(net) / 400);
}

export interface TdrRunOptions {
  /** 10–90 % rise time (s); default defaultTdrRise(net). */
  rise?: number;
  /** Reference impedance (Ω); default 50 Ω (DEFAULT_TDR_Z0). */
  z0?: number;
  /** On a branched net, the receiver whose path the distance follows (default: the main receiver). */
  path?: string;
  force?: boolean;
  limits?: Partial<RunLimits>;
  width?: number;
  height?: number;
  onPhase?: (phase: 'load' | 'simulate' | 'render' | 'write') => void;
}

export interface TdrReport {
  scenario: LoadedScenario;
  outDir: string;
  /** The TDR set-up that was simulated. */
  net: Net;
  result: SimResult;
  profile: TdrProfile;
  files: string[];
  wallTime: { simulate: number; total: number };
}

export async function runTdrFile(file: string, outDir: string, options: TdrRunOptions = {}): Promise<TdrReport> {
  const t0 = performance.now();
  options.onPhase?.('load');
  const scenario = await readScenarioFile(file);
  const unknown = unknownPath(scenario.net, options.path);
  if (unknown) throw new UsageError(unknown);
  const rise = options.rise ?? defaultTdrRise(scenario.net);
  const net = tdrNet(scenario.net, { rise, z0: options.z0 });
  if (!options.force) refuseWithAdvice(scenario.net, { rise, z0: options.z0 }, options.limits);

  options.onPhase?.('simulate');
  const t1 = performance.now();
  const result = simulate(net, { force: options.force, limits: options.limits });
  const simSeconds = (performance.now() - t1) / 1000;
  const profile = tdrProfile(net, result, options.path);

  options.onPhase?.('render');
  const png = await renderTdr({ title: net.title, profile, width: options.width, height: options.height });
  const csv = tdrCsv(profile);

  options.onPhase?.('write');
  const files = await writeOutputFolder(outDir, [
    { path: TDR_FILES.png, data: png },
    { path: TDR_FILES.csv, data: csv },
  ]);
  return { scenario, outDir, net, result, profile, files, wallTime: { simulate: simSeconds, total: (performance.now() - t0) / 1000 } };
}

/**
 * Throws a refusal when the TDR run would exceed the size limits, with a slower step that would fit:
 * the work grows about as 1/t_r² (cells ∝ 1/t_r and steps ∝ 1/t_r); the suggestion starts from
 * t_r·√(work/limit) and is checked against the limits itself (the duration and cellsPerRise are the
 * TDR's own choices, so advice about them is left out).
 */
function refuseWithAdvice(original: Net, opts: { rise: number; z0?: number }, limits?: Partial<RunLimits>): void {
  const rise = opts.rise;
  const refused = refusalOf(tdrNet(original, opts), limits);
  if (!refused) return;
  const work = refused.over.find((o) => o.limit === 'cellSteps' || o.limit === 'nodes');
  const ratio = work ? work.needed / work.allowed : 1;
  let suggested = rise * Math.max(1.1, Math.sqrt(ratio) * 1.05);
  let fits = false;
  for (let k = 0; k < 40 && !fits; k++) {
    suggested = niceUp(suggested);
    fits = !refusalOf(tdrNet(original, { ...opts, rise: suggested }), limits);
    if (!fits) suggested *= 1.25;
  }
  const advice = fits ? [`a slower TDR step would fit: --rise ${formatSI(suggested, 's', 3)} or more (the resolution coarsens in proportion)`] : [];
  throw new AdvisedRefusal(refused.over, refused.context, { omit: ['duration', 'cellsPerRise'], advice });
}

function refusalOf(net: Net, limits?: Partial<RunLimits>): RunRefused | undefined {
  try {
    planRun(net, { limits });
    return undefined;
  } catch (e) {
    if (e instanceof RunRefused) return e;
    throw e;
  }
}

/** Rounded up to two significant digits. */
function niceUp(x: number): number {
  const e = Math.floor(Math.log10(x)) - 1;
  return Math.ceil(x / 10 ** e - 1e-9) * 10 ** e;
}
