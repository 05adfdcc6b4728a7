// Newton–Raphson for several coupled device nodes: f(V) = G·V − J + diag(w)·I(V) = 0, with G the
// (small, dense) Norton matrix of the linear network seen at the device nodes. Used for the DC
// operating point of a net with several devices and for a cluster holding more than one device node.
// Each step solves the Jacobian G + diag(w·dI/dV) by Gaussian elimination with partial pivoting, is
// limited to `maxStep` volts on its largest component, and is halved until ‖f‖₂ decreases (a backtracking
// line search, Dennis & Schnabel, Numerical Methods for Unconstrained Optimization and Nonlinear
// Equations, SIAM 1996, §6.3), so an exponential clamp cannot throw an iterate to an overflowing voltage.
import { ivPoint, type IvPoint } from './iv-table.js';
import { DeviceConvergenceError, NEWTON_DEFAULTS, type DeviceLaw, type NewtonOptions } from './newton.js';

export interface MultiNodeSolver {
  k: number;
  jac: Float64Array;
  f: Float64Array;
  dx: Float64Array;
  trial: Float64Array;
  fTrial: Float64Array;
  i: Float64Array;
  g: Float64Array;
  point: IvPoint;
  /** Iterations of the last solve. */
  iterations: number;
}

/** Scratch for k coupled nodes, allocated once. */
export function multiNodeSolver(k: number): MultiNodeSolver {
  const a = () => new Float64Array(k);
  return { k, jac: new Float64Array(k * k), f: a(), dx: a(), trial: a(), fTrial: a(), i: a(), g: a(), point: ivPoint(), iterations: 0 };
}

function residual(s: MultiNodeSolver, laws: readonly DeviceLaw[], G: Float64Array, J: Float64Array, w: Float64Array, v: Float64Array, f: Float64Array): number {
  const k = s.k;
  let norm = 0;
  for (let r = 0; r < k; r++) {
    laws[r](v[r], s.point);
    s.i[r] = s.point.i;
    s.g[r] = s.point.g;
    let acc = -J[r] + w[r] * s.point.i;
    for (let c = 0; c < k; c++) acc += G[r * k + c] * v[c];
    f[r] = acc;
    norm += acc * acc;
  }
  return norm;
}

/** Solves a·x = b in place (a is destroyed, x returned in b); false when singular. */
function gaussSolve(a: Float64Array, b: Float64Array, k: number): boolean {
  for (let col = 0; col < k; col++) {
    let piv = col;
    for (let r = col + 1; r < k; r++) if (Math.abs(a[r * k + col]) > Math.abs(a[piv * k + col])) piv = r;
    if (!(Math.abs(a[piv * k + col]) > 0)) return false;
    if (piv !== col) {
      for (let c = 0; c < k; c++) [a[col * k + c], a[piv * k + c]] = [a[piv * k + c], a[col * k + c]];
      [b[col], b[piv]] = [b[piv], b[col]];
    }
    for (let r = col + 1; r < k; r++) {
      const m = a[r * k + col] / a[col * k + col];
      if (m === 0) continue;
      for (let c = col; c < k; c++) a[r * k + c] -= m * a[col * k + c];
      b[r] -= m * b[col];
    }
  }
  for (let r = k - 1; r >= 0; r--) {
    let acc = b[r];
    for (let c = r + 1; c < k; c++) acc -= a[r * k + c] * b[c];
    b[r] = acc / a[r * k + r];
  }
  return true;
}

/**
 * Solves G·V − J + diag(w)·I(V) = 0 for V, starting from and writing into `v`. `nodes` name the device
 * nodes for error messages. Throws DeviceConvergenceError naming the node with the largest residual.
 */
export function solveDeviceNodes(
  s: MultiNodeSolver,
  laws: readonly DeviceLaw[],
  G: Float64Array,
  J: Float64Array,
  w: Float64Array,
  v: Float64Array,
  time: number,
  nodes: readonly string[],
  opts: NewtonOptions = NEWTON_DEFAULTS,
): Float64Array {
  const k = s.k;
  const fail = (it: number, reason: string): never => {
    let worst = 0;
    for (let r = 1; r < k; r++) if (!(Math.abs(s.f[r]) <= Math.abs(s.f[worst]))) worst = r;
    throw new DeviceConvergenceError(time, nodes[worst], s.f[worst], v[worst], it, reason);
  };
  let norm = residual(s, laws, G, J, w, v, s.f);
  for (let it = 1; it <= opts.maxIter; it++) {
    if (!Number.isFinite(norm)) fail(it, 'a device law returned a non-finite current');
    s.jac.set(G);
    for (let r = 0; r < k; r++) {
      s.jac[r * k + r] += w[r] * s.g[r];
      s.dx[r] = -s.f[r];
    }
    if (!gaussSolve(s.jac, s.dx, k)) fail(it, 'the Jacobian is singular (a device node with nothing defining its voltage)');
    let big = 0;
    let converged = true;
    for (let r = 0; r < k; r++) {
      big = Math.max(big, Math.abs(s.dx[r]));
      const tol = opts.iTol + opts.relTol * Math.max(Math.abs(J[r]), Math.abs(w[r] * s.i[r]));
      if (!(Math.abs(s.f[r]) <= tol)) converged = false;
    }
    if (converged && big <= opts.vTol) {
      s.iterations = it;
      return v;
    }
    let lambda = big > opts.maxStep ? opts.maxStep / big : 1;
    let trialNorm = Infinity;
    for (let halvings = 0; halvings < 40; halvings++, lambda /= 2) {
      for (let r = 0; r < k; r++) s.trial[r] = v[r] + lambda * s.dx[r];
      trialNorm = residual(s, laws, G, J, w, s.trial, s.fTrial);
      if (trialNorm <= (1 - 1e-4 * lambda) * norm) break;
    }
    v.set(s.trial);
    norm = residual(s, laws, G, J, w, v, s.f);
  }
  return fail(opts.maxIter, `Newton–Raphson did not converge within ${opts.maxIter} iterations`);
}
