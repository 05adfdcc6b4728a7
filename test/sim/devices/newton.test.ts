import { describe, expect, it } from 'vitest';
import { evalDiode, thermalVoltage } from '../../../sim/devices/diode.js';
import { ivPoint } from '../../../sim/devices/iv-table.js';
import { DeviceConvergenceError, nodeSolution, solveDeviceNode, NEWTON_DEFAULTS, type DeviceLaw } from '../../../sim/devices/newton.js';
import { multiNodeSolver, solveDeviceNodes } from '../../../sim/devices/newton-multi.js';

const vt = thermalVoltage(300);
const diode = { is: 1e-14, n: 1, rs: 0, vt };
const diodeLaw: DeviceLaw = (v, out) => evalDiode(diode, v, out);
const ctx = { time: 1e-9, node: 'rx.die' };

describe('Newton–Raphson at a device node', () => {
  it('solves a diode fed from 5 V through 100 Ω and converges quadratically at the end', () => {
    const trace: number[] = [];
    const sol = solveDeviceNode(diodeLaw, 0.01, 0.05, 1, 0, ctx, ivPoint(), nodeSolution(), NEWTON_DEFAULTS, trace);
    // the root satisfies KCL: (5 − V)/100 = I_s(e^{V/V_T} − 1)
    expect(Math.abs((5 - sol.v) / 100 - sol.i)).toBeLessThan(1e-9); // the stated tolerance
    expect(sol.v).toBeGreaterThan(0.7);
    expect(sol.v).toBeLessThan(0.8);
    // Quadratic convergence (Newton's method near a simple root, e.g. Süli & Mayers, An Introduction to
    // Numerical Analysis, 2003, Thm 1.8): the order estimate ln(r₊/r)/ln(r/r₋) of the residuals tends to 2.
    const r = trace.filter((x) => x > 1e-14);
    const n = r.length;
    expect(n).toBeGreaterThanOrEqual(4);
    const order = Math.log(r[n - 1] / r[n - 2]) / Math.log(r[n - 2] / r[n - 3]);
    expect(order, `residuals (A): ${trace.map((x) => x.toExponential(2)).join(', ')}`).toBeGreaterThan(1.8);
    expect(r[n - 1]).toBeLessThan(20 * r[n - 2] ** 2);
  });

  it('is not thrown to an overflowing voltage by a strong source: 1 kV through 1 Ω into a bare junction', () => {
    const sol = solveDeviceNode(diodeLaw, 1, 1000, 1, 0, ctx, ivPoint(), nodeSolution());
    expect(Number.isFinite(sol.v)).toBe(true);
    expect(Math.abs(1000 - sol.v - sol.i)).toBeLessThan(1e-6);
  });

  it('reports a failure with time, node and residual, never NaN', () => {
    expect(() => solveDeviceNode(diodeLaw, 0.01, 0.05, 1, 0, ctx, ivPoint(), nodeSolution(), { ...NEWTON_DEFAULTS, maxIter: 2 })).toThrowError(
      /device node "rx\.die" at t = 1\.0000e-9 s: Newton–Raphson did not converge within 2 iterations \(residual/,
    );
    const bad: DeviceLaw = (v, out) => ((out.i = NaN), (out.g = 1), out);
    try {
      solveDeviceNode(bad, 1, 1, 1, 0, ctx, ivPoint(), nodeSolution());
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(DeviceConvergenceError);
      expect((e as DeviceConvergenceError).node).toBe('rx.die');
      expect((e as Error).message).toMatch(/non-finite/);
    }
  });

  it('coupled nodes: two diodes joined by 10 Ω, each fed from 3 V through 50 Ω, solve KCL at both', () => {
    // Norton matrix of the linear network: node conductances 1/50 + 1/10 on the diagonal, −1/10 off it.
    const G = Float64Array.of(0.02 + 0.1, -0.1, -0.1, 0.02 + 0.1);
    const J = Float64Array.of(3 / 50, 3 / 50 * 0.5);
    const v = Float64Array.of(0, 0);
    const s = multiNodeSolver(2);
    solveDeviceNodes(s, [diodeLaw, diodeLaw], G, J, Float64Array.of(1, 1), v, 0, ['a', 'b']);
    const p = ivPoint();
    for (let r = 0; r < 2; r++) {
      const kcl = G[r * 2] * v[0] + G[r * 2 + 1] * v[1] - J[r] + evalDiode(diode, v[r], p).i;
      expect(Math.abs(kcl)).toBeLessThan(1e-9);
    }
    expect(s.iterations).toBeLessThan(40);
  });
});
