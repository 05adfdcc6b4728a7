// A behavioural I/O buffer: the open I/O buffer model standard's structure (ANSI/EIA-656, IBIS ver. 5.0
// and later, [Pullup], [Pulldown], [GND Clamp], [POWER Clamp], C_comp), in SI numbers for one corner.
//
// Conventions (those of the standard):
// - every current is positive INTO the pin (from the outside node into the device);
// - the pull-up and power-clamp tables are supply-relative: table voltage x = V_supply − V_pin;
// - the pull-down and ground-clamp tables are ground-relative: x = V_pin − V_ground;
// - the clamps always conduct; the pull-up and pull-down tables hold the transistors' current only
//   (a model maker subtracts the clamp currents from them), and they are scaled by the switching
//   coefficients k_u(t), k_d(t):  I(V, t) = k_u·I_pu(V_s − V) + k_d·I_pd(V − V_g) + I_gc(V − V_g) + I_pc(V_s − V).
import { evalDiode, type Diode } from './diode.js';
import { evalIv, ivPoint, type IvPoint, type IvTable } from './iv-table.js';
import type { Switching } from './switching.js';

/** A clamp's I/V law in its table's frame: a table, or a diode (sign −1 for the ground clamp, +1 for the power clamp). */
export type Curve = { kind: 'table'; table: IvTable } | { kind: 'diode'; diode: Diode; sign: 1 | -1 };

/** Package parasitics between the die pad and the pin: R and L in series, C from the pin to ground. */
export interface PackageRLC {
  r: number;
  l: number;
  c: number;
}

export type BufferKind = 'input' | 'output' | 'io' | '3-state' | 'open-drain';

export interface BufferModel {
  name: string;
  kind: BufferKind;
  /** Rails (V): the reference of the pull-up and power clamp, and of the pull-down and ground clamp. */
  supply: number;
  ground: number;
  pullup?: IvTable;
  pulldown?: IvTable;
  gndClamp?: Curve;
  powerClamp?: Curve;
  /** Die capacitance C_comp (F), from the die pad to ground. */
  cComp: number;
  /** Package between the die pad and the pin; absent = the pin is the die pad. */
  pkg?: PackageRLC;
  /** How the pull-up and pull-down conduct over an edge; absent for inputs. */
  switching?: Switching;
}

/** A clamp curve as a ground-clamp diode (conducts when the pin goes below ground). */
export function groundClampDiode(d: Diode): Curve {
  return { kind: 'diode', diode: d, sign: -1 };
}

/** A clamp curve as a power-clamp diode (conducts when the pin goes above the supply). */
export function powerClampDiode(d: Diode): Curve {
  return { kind: 'diode', diode: d, sign: 1 };
}

/** Current and slope of a curve at its table voltage x. A diode conducts forward at V_d = −x in both clamp frames. */
export function evalCurve(c: Curve, x: number, out: IvPoint): IvPoint {
  if (c.kind === 'table') return evalIv(c.table, x, out);
  evalDiode(c.diode, -x, out);
  out.i *= c.sign;
  out.g *= -c.sign;
  return out;
}

/** Scratch for bufferCurrent, owned by the caller (one per device) so evaluation allocates nothing. */
export interface BufferScratch {
  part: IvPoint;
}

export function bufferScratch(): BufferScratch {
  return { part: ivPoint() };
}

/** Total current into the pin at die voltage v with switching coefficients ku, kd, and its slope dI/dV. */
export function bufferCurrent(m: BufferModel, v: number, ku: number, kd: number, s: BufferScratch, out: IvPoint): IvPoint {
  const p = s.part;
  const up = m.supply - v;
  const down = v - m.ground;
  let i = 0;
  let g = 0;
  if (m.pullup && ku !== 0) {
    evalIv(m.pullup, up, p);
    i += ku * p.i;
    g -= ku * p.g;
  }
  if (m.pulldown && kd !== 0) {
    evalIv(m.pulldown, down, p);
    i += kd * p.i;
    g += kd * p.g;
  }
  if (m.gndClamp) {
    evalCurve(m.gndClamp, down, p);
    i += p.i;
    g += p.g;
  }
  if (m.powerClamp) {
    evalCurve(m.powerClamp, up, p);
    i += p.i;
    g -= p.g;
  }
  out.i = i;
  out.g = g;
  return out;
}

/** The parts of the current at pin voltage v, for printing and plots: each table's own contribution. */
export function currentParts(m: BufferModel, v: number, ku: number, kd: number): { pullup: number; pulldown: number; gndClamp: number; powerClamp: number } {
  const p = ivPoint();
  const up = m.supply - v;
  const down = v - m.ground;
  return {
    pullup: m.pullup ? ku * evalIv(m.pullup, up, p).i : 0,
    pulldown: m.pulldown ? kd * evalIv(m.pulldown, down, p).i : 0,
    gndClamp: m.gndClamp ? evalCurve(m.gndClamp, down, p).i : 0,
    powerClamp: m.powerClamp ? evalCurve(m.powerClamp, up, p).i : 0,
  };
}

/** Whether the model has a driving stage (pull-up or pull-down) that switching coefficients scale. */
export function drives(m: BufferModel): boolean {
  return m.kind !== 'input' && (m.pullup !== undefined || m.pulldown !== undefined);
}
