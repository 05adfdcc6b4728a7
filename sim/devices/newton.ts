// Newton–Raphson for device nodes. A node equation at a device's die node is
//     f(V) = g·V − j + w·I_dev(V) = 0                                   (amperes)
// where (g, j) is the Norton equivalent of everything linear attached to the node for this time step
// (companion conductances and history currents of capacitors, packages and line half-cells, sources),
// I_dev the device's current into its pin and w the weight of the device current in the node equation
// (1 at Kirchhoff's law at n+1; ½ at a node whose equation is centred at n+½, where the other ½ of the
// device current, at n, is folded into j). Device currents rise with voltage, so f normally has one
// root; the iteration is Newton's method safeguarded by bisection once a sign change brackets the root
// ("rtsafe", Press et al., Numerical Recipes, 3rd ed., §9.4), with each step limited to `maxStep` volts.
// An exponential clamp can therefore not throw the iterate to a voltage where it overflows, and the
// final iterations are plain Newton steps, which converge quadratically.
import type { IvPoint } from './iv-table.js';

export interface NewtonOptions {
  /** Converged when the last step is at most vTol volts… */
  vTol: number;
  /** …and the residual at most iTol amperes plus relTol of the largest current in the equation. */
  iTol: number;
  relTol: number;
  /** Iteration cap. */
  maxIter: number;
  /** Largest step (V) of one iteration. */
  maxStep: number;
}

export const NEWTON_DEFAULTS: Readonly<NewtonOptions> = { vTol: 1e-6, iTol: 1e-9, relTol: 1e-9, maxIter: 60, maxStep: 0.5 };

/** A device's current into its pin and its slope at die voltage v (coefficients already set for the step). */
export type DeviceLaw = (v: number, out: IvPoint) => IvPoint;

/** Where a failing solve happened, for the error message. */
export interface NodeContext {
  time: number;
  node: string;
}

/** A device node's Newton iteration did not converge, or met a non-finite value. */
export class DeviceConvergenceError extends Error {
  constructor(
    readonly time: number,
    readonly node: string,
    readonly residual: number,
    readonly voltage: number,
    readonly iterations: number,
    reason: string,
  ) {
    super(`device node "${node}" at t = ${time.toExponential(4)} s: ${reason} (residual ${residual.toExponential(3)} A at ${voltage.toPrecision(6)} V after ${iterations} iterations)`);
    this.name = 'DeviceConvergenceError';
  }
}

/** Result of one solve: the voltage, the device current and slope there, and the iteration count. */
export interface NodeSolution {
  v: number;
  i: number;
  g: number;
  iterations: number;
}

export function nodeSolution(): NodeSolution {
  return { v: 0, i: 0, g: 0, iterations: 0 };
}

/**
 * Solves g·V − j + w·I(V) = 0 from the guess v0 and writes the result into `out`. `trace`, when given,
 * receives |f| at every iterate (for tests of the convergence order). Throws DeviceConvergenceError.
 */
export function solveDeviceNode(
  law: DeviceLaw,
  g: number,
  j: number,
  w: number,
  v0: number,
  ctx: NodeContext,
  scratch: IvPoint,
  out: NodeSolution,
  opts: NewtonOptions = NEWTON_DEFAULTS,
  trace?: number[],
): NodeSolution {
  if (!Number.isFinite(g) || !Number.isFinite(j) || !Number.isFinite(v0)) {
    throw new DeviceConvergenceError(ctx.time, ctx.node, NaN, v0, 0, `non-finite input to the node equation (g = ${g}, j = ${j}, start ${v0} V)`);
  }
  let lo = -Infinity;
  let hi = Infinity;
  let x = v0;
  let dxLast = Infinity;
  let dxPrev = Infinity;
  for (let it = 1; it <= opts.maxIter; it++) {
    law(x, scratch);
    const f = g * x - j + w * scratch.i;
    const fp = g + w * scratch.g;
    if (!Number.isFinite(f) || !Number.isFinite(fp)) {
      throw new DeviceConvergenceError(ctx.time, ctx.node, f, x, it, 'the device law returned a non-finite current');
    }
    trace?.push(Math.abs(f));
    if (f < 0) lo = Math.max(lo, x);
    else if (f > 0) hi = Math.min(hi, x);
    const newton = fp > 0 ? -f / fp : NaN;
    const tol = opts.iTol + opts.relTol * Math.max(Math.abs(g * x), Math.abs(j), Math.abs(w * scratch.i));
    if (f === 0 || (Math.abs(f) <= tol && Math.abs(newton) <= opts.vTol)) {
      out.v = x;
      out.i = scratch.i;
      out.g = scratch.g;
      out.iterations = it;
      return out;
    }
    let dx = fp > 0 ? newton : f > 0 ? -opts.maxStep : opts.maxStep;
    if (Math.abs(dx) > opts.maxStep) dx = Math.sign(dx) * opts.maxStep;
    let next = x + dx;
    // Once bracketed, bisect when Newton leaves the bracket or shrinks the step less than bisection would.
    if (lo > -Infinity && hi < Infinity && (!(next > lo && next < hi) || Math.abs(dx) > 0.5 * Math.abs(dxPrev))) {
      next = 0.5 * (lo + hi);
    }
    dxPrev = dxLast;
    dxLast = next - x;
    x = next;
  }
  law(x, scratch);
  const f = g * x - j + w * scratch.i;
  throw new DeviceConvergenceError(ctx.time, ctx.node, f, x, opts.maxIter, `Newton–Raphson did not converge within ${opts.maxIter} iterations`);
}
