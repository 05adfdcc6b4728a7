// One device in time: its current law at the die pad, C_comp from the die to ground, and the package
// (R and L in series to the pin, C from the pin to ground), advanced with trapezoidal companion models
// (Dommel, IEEE Trans. PAS-88, 1969) and solved by Newton–Raphson at the die node each step. Whatever
// the pin is connected to is given per step as a Norton equivalent: the current flowing from the pin
// into the outside network is g_ext·V_pin − j_ext. The package and C_comp are eliminated exactly, so the
// Newton iteration is scalar: (g_c + g_b)·V_die − (h_c + j_b) + I_dev(V_die, t) = 0.
import { bufferCurrent, bufferScratch, drives, type BufferModel, type BufferScratch } from './buffer.js';
import { ivPoint, type IvPoint } from './iv-table.js';
import { nodeSolution, solveDeviceNode, NEWTON_DEFAULTS, type DeviceLaw, type NewtonOptions, type NodeSolution } from './newton.js';
import { coefficientsAt, type EdgeSchedule } from './schedule.js';
import type { Coefficients } from './switching.js';

export interface DeviceStepper {
  readonly model: BufferModel;
  readonly name: string;
  readonly dt: number;
  readonly schedule?: EdgeSchedule;
  /** Companion constants: 2·C_comp/Δt, 2·C_pkg/Δt, 2·L_pkg/Δt, R_pkg + 2·L_pkg/Δt. */
  readonly gc: number;
  readonly gp: number;
  readonly kl: number;
  readonly z: number;
  /** State at the last step: die and pin voltages, package current (die → pin), inductor voltage, capacitor currents. */
  vDie: number;
  vPin: number;
  iPkg: number;
  vL: number;
  iComp: number;
  iCpkg: number;
  /** Current into the device's pin from the outside node at the last step (A). */
  iPin: number;
  /** Device current into the die (pull-up, pull-down and clamps) at the last step (A). */
  iDevice: number;
  /** Newton statistics: steps solved, total and largest iteration count. */
  steps: number;
  iterations: number;
  maxIterations: number;
  readonly coeff: Coefficients;
  readonly law: DeviceLaw;
  readonly scratch: IvPoint;
  readonly solution: NodeSolution;
  readonly options: NewtonOptions;
}

/** The device's current law with its coefficients held in `coeff` (set per step by the caller). */
export function deviceLaw(model: BufferModel, coeff: Coefficients, s: BufferScratch = bufferScratch()): DeviceLaw {
  return (v, out) => bufferCurrent(model, v, coeff.ku, coeff.kd, s, out);
}

/**
 * A stepper for `model` at time step dt. A driver needs `schedule` (when its edges start); an input or a
 * driver without one is held in its initial state (an input's coefficients are 0).
 */
export function deviceStepper(model: BufferModel, dt: number, name: string, schedule?: EdgeSchedule, options: NewtonOptions = NEWTON_DEFAULTS): DeviceStepper {
  if (drives(model) && !model.switching) throw new RangeError(`device "${name}": a driving model needs switching coefficients`);
  const pkg = model.pkg ?? { r: 0, l: 0, c: 0 };
  const coeff: Coefficients = { ku: 0, kd: 0 };
  const st: DeviceStepper = {
    model,
    name,
    dt,
    schedule,
    gc: (2 * model.cComp) / dt,
    gp: (2 * pkg.c) / dt,
    kl: (2 * pkg.l) / dt,
    z: pkg.r + (2 * pkg.l) / dt,
    vDie: 0,
    vPin: 0,
    iPkg: 0,
    vL: 0,
    iComp: 0,
    iCpkg: 0,
    iPin: 0,
    iDevice: 0,
    steps: 0,
    iterations: 0,
    maxIterations: 0,
    coeff,
    law: deviceLaw(model, coeff),
    scratch: ivPoint(),
    solution: nodeSolution(),
    options,
  };
  setCoefficients(st, 0);
  return st;
}

/** Sets the switching coefficients for time t (inputs and three-stated drivers: 0, 0). */
export function setCoefficients(st: DeviceStepper, t: number): void {
  if (drives(st.model) && st.model.switching && st.schedule) coefficientsAt(st.model.switching, st.schedule, t, st.coeff);
  else {
    st.coeff.ku = 0;
    st.coeff.kd = 0;
  }
}

/** Starts from a DC state: the pin at vPin with DC current iPin into the device (capacitors charged, inductor at rest). */
export function startDevice(st: DeviceStepper, vPin: number, iPin: number): void {
  st.vPin = vPin;
  st.iPkg = -iPin;
  st.vDie = vPin + (st.model.pkg?.r ?? 0) * st.iPkg;
  st.vL = 0;
  st.iComp = 0;
  st.iCpkg = 0;
  st.iPin = iPin;
  st.iDevice = iPin;
}

/**
 * Advances to t = n·Δt (n given by the caller, so time is never accumulated) with the outside network's
 * Norton equivalent (g_ext, j_ext) at the pin for this step. Returns the pin voltage.
 */
export function stepDevice(st: DeviceStepper, n: number, gExt: number, jExt: number): number {
  const t = n * st.dt;
  setCoefficients(st, t);
  const hc = st.gc * st.vDie + st.iComp;
  const hp = st.gp * st.vPin + st.iCpkg;
  const eh = st.kl * st.iPkg + st.vL;
  const Gp = st.gp + gExt;
  const Jp = hp + jExt;
  const den = st.z * Gp + 1;
  const gb = Gp / den;
  const jb = (Jp - eh * Gp) / den;
  const sol = solveDeviceNode(st.law, st.gc + gb, hc + jb, 1, st.vDie, { time: t, node: st.name }, st.scratch, st.solution, st.options);
  const vd = sol.v;
  const i = gb * vd - jb;
  const vp = vd - st.z * i + eh;
  st.vL = st.kl * (i - st.iPkg) - st.vL;
  st.iComp = st.gc * vd - hc;
  st.iCpkg = st.gp * vp - hp;
  st.iPkg = i;
  st.vDie = vd;
  st.vPin = vp;
  st.iPin = jExt - gExt * vp;
  st.iDevice = sol.i;
  st.steps++;
  st.iterations += sol.iterations;
  if (sol.iterations > st.maxIterations) st.maxIterations = sol.iterations;
  return vp;
}
