// `ladderwave tdr` as a library function: scenario file → TDR net → simulation → impedance profile →
// tdr.png and tdr.csv in an output folder. Everything that can fail because of the input happens
// before the folder is created; the two files are written to temporary names and renamed together
// (tdr.csv last, so a complete CSV means a complete output), and a folder this call created is
// removed again if writing fails.
import type { Net } from '../../sim/model.js';
import type { SimResult } from '../../sim/result.js';
import { RunRefused } from '../../sim/errors.js';
import type { RunLimits } from '../../sim/limits.js';
import { planRun } from '../../sim/simulate.js';
import { AdvisedRefusal } from '../engine-text.js';
import { simulateSized } from '../size-limits.js';
import { formatSI } from '../units.js';
import { routeDelay } from '../../sim/discretize.js';
import { checkOutputTarget, readScenarioFile, withPositions, writeOutputFolder, type LoadedScenario } from './run.js';
import { unknownPath } from '../views/select.js';
import { UsageError } from '../exit-codes.js';
import { renderTdr, tdrCsvChunks, tdrNet, tdrProfile, type TdrProfile } from '../views/tdr.js';
import { RequestError } from './errors.js';

export const TDR_FILES = { png: 'tdr.png', csv: 'tdr.csv' } as const;

/** `x` rounded down to `digits` significant digits (a limit stays a limit when printed). */
function roundDown(x: number, digits: number): number {
  const e = 10 ** (Math.floor(Math.log10(x)) - digits + 1);
  return Math.floor(x / e) * e;
}

/** A step slower than this many round trips of the route reads nothing of it (common practice: keep t_r well below the round trip). */
export const MAX_RISE_PER_ROUND_TRIP = 10;

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
  await checkOutputTarget(outDir);
  return withPositions(scenario, () => tdrLoaded(scenario, outDir, options, t0));
}

async function tdrLoaded(scenario: LoadedScenario, outDir: string, options: TdrRunOptions, t0: number): Promise<TdrReport> {
  const rise = options.rise ?? defaultTdrRise(scenario.net);
  const slowest = MAX_RISE_PER_ROUND_TRIP * 2 * routeDelay(scenario.net);
  if (slowest > 0 && rise > slowest) {
    throw new RequestError(
      `a TDR step of ${formatSI(rise, 's')} is slower than ${MAX_RISE_PER_ROUND_TRIP} round trips of the route (${formatSI(slowest, 's')}), and would read nothing of its impedances; ` +
        `give --rise ${formatSI(roundDown(slowest, 2), 's', 2, { ascii: true }).replace(' ', '')} or faster`,
    );
  }
  const net = tdrNet(scenario.net, { rise, z0: options.z0 });
  if (!options.force) refuseWithAdvice(scenario.net, { rise, z0: options.z0 }, options.limits);

  options.onPhase?.('simulate');
  const t1 = performance.now();
  const result = simulateSized(net, { force: options.force, limits: options.limits });
  const simSeconds = (performance.now() - t1) / 1000;
  const profile = tdrProfile(net, result, options.path);

  options.onPhase?.('render');
  const png = await renderTdr({ title: net.title, profile, width: options.width, height: options.height });

  options.onPhase?.('write');
  const files = await writeOutputFolder(outDir, [
    { path: TDR_FILES.png, data: png },
    { path: TDR_FILES.csv, data: async (sink) => {
      for (const chunk of tdrCsvChunks(profile)) await sink.write(chunk);
    } },
  ]);
  return { scenario, outDir, net, result, profile, files, wallTime: { simulate: simSeconds, total: (performance.now() - t0) / 1000 } };
}

/**
 * Throws a refusal when the TDR run would exceed the size limits, with a step that does fit: the
 * work is not monotonic in the rise time (a slower step runs longer, while a short segment keeps Δt
 * small), so candidate steps are planned, not estimated, and the one closest to the asked-for step
 * is suggested. The engine's advice about the duration and cellsPerRise is left out: the TDR chooses
 * its own duration and has no cellsPerRise option.
 */
function refuseWithAdvice(original: Net, opts: { rise: number; z0?: number }, limits?: Partial<RunLimits>): void {
  const refused = refusalOf(tdrNet(original, opts), limits);
  if (!refused) return;
  const fitting = fittingRise(opts.rise, (r) => !refusalOf(tdrNet(original, { ...opts, rise: r }), limits));
  const advice =
    fitting === undefined
      ? ['no TDR step from 1 fs to 1 s fits within the size limits on this route']
      : [`a TDR step of ${formatSI(fitting, 's', 3)} would fit: --rise ${formatSI(fitting, 's', 3, { ascii: true }).replace(' ', '')} (the resolution is v·t_r/4)`];
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

/**
 * The rise time closest to `rise` (on a log scale) for which `fits` holds, rounded to three
 * significant digits and checked again; undefined when no step from 1 fs to 1 s fits.
 */
export function fittingRise(rise: number, fits: (rise: number) => boolean): number | undefined {
  const candidates: number[] = [];
  for (let e = -15; e <= 0; e += 0.25) candidates.push(10 ** e);
  candidates.sort((a, b) => Math.abs(Math.log(a / rise)) - Math.abs(Math.log(b / rise)));
  for (const c of candidates) {
    if (!fits(c)) continue;
    const round = Number(c.toPrecision(3));
    return fits(round) ? round : c;
  }
  return undefined;
}
