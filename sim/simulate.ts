// The engine's entry point: net → circuit → discretization → ladder → DC start → leapfrog time loop
// → probe records.
import ndarray from 'ndarray';
import { compileNet, type Circuit } from './circuit.js';
import { solveDc } from './dc.js';
import { defaultDuration, discretize } from './discretize.js';
import { buildLadder, type Ladder } from './ladder.js';
import { checkLimits, DEFAULT_LIMITS, estimateRun, lumpedSizes, type RunEstimate, type RunLimits } from './limits.js';
import { advanceLineCells, buildLineKernel } from './line-kernel.js';
import { buildLumped } from './lumped.js';
import type { Net } from './model.js';
import { recordProbes, resolveProbes } from './probes.js';
import { realizeNet, runBand } from './realize.js';
import { finishRouteMap, planRouteMap, recordRouteMap, type RouteMapOptions } from './route-map.js';
import type { Discretization, SimResult } from './result.js';
import { signalFunction } from './signals.js';
import { createWatch } from './watch.js';

export interface SimulateOptions {
  /** Run even when a size limit would be exceeded. */
  force?: boolean;
  limits?: Partial<RunLimits>;
  /** Also record the voltage along the whole net, decimated to about columns × rows values. */
  routeMap?: RouteMapOptions;
}

export interface PreparedRun {
  /** The net with frequency-dependent lines realised for the run's band. */
  net: Net;
  circuit: Circuit;
  plan: Discretization;
}

/**
 * Lines with frequency-dependent loss realised for the band this run needs, compiled to a circuit,
 * and the discretization of the result (the realised lines' high-frequency L′ and C′ set the Courant
 * limit).
 */
export function prepareRun(net: Net): PreparedRun {
  const band = runBand(net, net.run.duration ?? defaultDuration(compileNet(net)));
  const { net: realized, fits } = realizeNet(net, band);
  const circuit = compileNet(realized);
  const plan = discretize(circuit);
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
  return { net: realized, circuit, plan };
}

function estimateFor(run: PreparedRun, plan: Discretization): RunEstimate {
  return estimateRun(plan, run.circuit.probes.length, run.net.run.sample, lumpedSizes(run.circuit, plan));
}

/** Throws RunRefused (with values that would run) when the run exceeds a limit. */
function refuseOverLimits(run: PreparedRun, options: SimulateOptions): RunEstimate {
  const est = estimateFor(run, run.plan);
  if (options.force) return est;
  const replan = (cpr: number) => {
    const plan = discretize({ ...run.circuit, run: { ...run.circuit.run, cellsPerRise: cpr } });
    return { plan, est: estimateFor(run, plan) };
  };
  checkLimits(run.plan, est, { ...DEFAULT_LIMITS, ...options.limits }, run.circuit.probes.length, run.net.run.cellsPerRise, replan);
  return est;
}

/** The discretization a run would use; throws RunRefused when it does not fit the limits, without allocating the solver. */
export function planRun(net: Net, options: SimulateOptions = {}): Discretization {
  const run = prepareRun(net);
  refuseOverLimits(run, { ...options, force: false });
  return run.plan;
}

/** The ladder of a prepared run and its DC start with every source at its value at t = 0. */
export function ladderAtRest(run: PreparedRun): { ladder: Ladder; sources: Float64Array; dc: ReturnType<typeof solveDc> } {
  const ladder = buildLadder(run.circuit, run.plan);
  const sources = Float64Array.from(run.circuit.sources, (s) => signalFunction(s.signal)(0));
  return { ladder, sources, dc: solveDc(ladder, sources) };
}

export function simulate(input: Net, options: SimulateOptions = {}): SimResult {
  const run = prepareRun(input);
  const { circuit, plan } = run;
  const est = refuseOverLimits(run, options);

  const sourceFns = circuit.sources.map((s) => signalFunction(s.signal));
  const { ladder, sources, dc } = ladderAtRest(run);
  const taps = resolveProbes(circuit.probes, ladder);
  const lumped = buildLumped(ladder, plan.dt, dc);
  const cells = buildLineKernel(ladder, plan.dt, dc, lumped.isLumpedNode);
  const watch = createWatch(ladder, taps, circuit.probes.map((p) => p.name), lumped, sources);

  const { samples, stride } = est;
  const values = new Float64Array(circuit.probes.length * samples);
  const map = options.routeMap ? planRouteMap(ladder, plan.steps, options.routeMap) : undefined;
  const mapStride = map ? map.stepStride : plan.steps + 1;
  recordProbes(taps, cells.v, values, samples, 0);
  if (map) recordRouteMap(map, cells.v, 0);
  const dt = plan.dt;
  const { clusters } = lumped;
  for (let n = 1; n <= plan.steps; n++) {
    const t = n * dt;
    for (let s = 0; s < sources.length; s++) sources[s] = sourceFns[s](t);
    advanceLineCells(cells);
    for (let c = 0; c < clusters.length; c++) clusters[c].advance(cells.v, cells.i, sources);
    if (n % stride === 0) recordProbes(taps, cells.v, values, samples, n / stride);
    if (n % mapStride === 0) recordRouteMap(map!, cells.v, n / mapStride);
    if ((n & watch.mask) === 0) watch.check(cells.v, t);
  }
  watch.check(cells.v, plan.steps * dt);
  return {
    discretization: plan,
    record: {
      names: circuit.probes.map((p) => p.name),
      dtSample: stride * dt,
      values: ndarray(values, [circuit.probes.length, samples]),
    },
    routeMap: map ? finishRouteMap(map, ladder, dt) : undefined,
  };
}
