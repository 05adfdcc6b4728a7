// The engine's entry point: net → discretization → ladder → DC start → leapfrog time loop → probe records.
import ndarray from 'ndarray';
import { solveDc } from './dc.js';
import { defaultDuration, discretize } from './discretize.js';
import { buildLadder } from './ladder.js';
import { checkLimits, DEFAULT_LIMITS, estimateRun, type RunLimits } from './limits.js';
import { advanceLineCells, buildLineKernel } from './line-kernel.js';
import { advanceLumped, buildLumped } from './lumped.js';
import type { Net } from './model.js';
import { recordProbes, resolveProbes } from './probes.js';
import { realizeNet, runBand } from './realize.js';
import { finishRouteMap, planRouteMap, recordRouteMap, type RouteMapOptions } from './route-map.js';
import type { Discretization, SimResult } from './result.js';
import { signalFunction } from './signals.js';

export interface SimulateOptions {
  /** Run even when a size limit would be exceeded. */
  force?: boolean;
  limits?: Partial<RunLimits>;
  /** Also record the voltage along the whole route, decimated to at most columns × rows values. */
  routeMap?: RouteMapOptions;
}

/**
 * Lines with frequency-dependent loss realised for the band this run needs, and the discretization of
 * the result (the realised lines' high-frequency L′ and C′ set the Courant limit).
 */
export function prepareRun(net: Net): { net: Net; plan: Discretization } {
  const band = runBand(net, net.run.duration ?? defaultDuration(net));
  const { net: realized, fits } = realizeNet(net, band);
  const plan = discretize(realized);
  for (const seg of plan.segments) {
    const fit = fits.get(seg.name);
    if (fit) {
      seg.loss = {
        fmin: band.fmin,
        fmax: band.fmax,
        seriesTerms: fit.series.sections.length,
        shuntTerms: fit.shunt.branches.length,
        maxRelErrorZ: fit.maxRelErrorZ,
        maxRelErrorY: fit.maxRelErrorY,
        maxResistanceRelError: fit.skin.maxResistanceRelError,
        maxDielectricLossRelError: fit.debye?.maxLossRelError ?? 0,
      };
    }
  }
  return { net: realized, plan };
}

/** The discretization a run would use, and whether it fits the limits, without allocating the solver. */
export function planRun(net: Net, options: SimulateOptions = {}): { plan: Discretization; refusal?: string } {
  const { plan } = prepareRun(net);
  try {
    checkLimits(plan, estimateRun(plan, net.probes.length, net.run.sample), { ...DEFAULT_LIMITS, ...options.limits });
    return { plan };
  } catch (e) {
    return { plan, refusal: (e as Error).message };
  }
}

export function simulate(input: Net, options: SimulateOptions = {}): SimResult {
  const { net, plan } = prepareRun(input);
  const est = estimateRun(plan, net.probes.length, net.run.sample);
  if (!options.force) checkLimits(plan, est, { ...DEFAULT_LIMITS, ...options.limits });

  const source = signalFunction(net.driver.signal);
  const ladder = buildLadder(net, plan);
  const taps = resolveProbes(net.probes, ladder);
  const dc = solveDc(ladder, source(0));
  const lumped = buildLumped(ladder, plan.dt, dc, source(0));
  const cells = buildLineKernel(ladder, plan.dt, dc, lumped.isLumpedNode);

  const { samples, stride } = est;
  const values = new Float64Array(net.probes.length * samples);
  const map = options.routeMap ? planRouteMap(ladder, plan.steps, options.routeMap) : undefined;
  const mapStride = map ? map.stepStride : plan.steps + 1;
  recordProbes(taps, cells.v, values, samples, 0);
  if (map) recordRouteMap(map, cells.v, 0);
  const dt = plan.dt;
  for (let n = 1; n <= plan.steps; n++) {
    advanceLineCells(cells);
    advanceLumped(lumped, cells.i, cells.v, source(n * dt));
    if (n % stride === 0) recordProbes(taps, cells.v, values, samples, n / stride);
    if (n % mapStride === 0) recordRouteMap(map!, cells.v, n / mapStride);
  }
  return {
    discretization: plan,
    record: {
      names: net.probes.map((p) => p.name),
      dtSample: stride * dt,
      values: ndarray(values, [net.probes.length, samples]),
    },
    routeMap: map ? finishRouteMap(map, ladder, dt) : undefined,
  };
}
