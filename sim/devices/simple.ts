// Device models for users without a model file: a resistive push–pull, a push–pull of a stated drive
// strength, and a receiver input with clamp diodes.
import { groundClampDiode, powerClampDiode, type BufferModel, type Curve } from './buffer.js';
import type { Diode } from './diode.js';
import { ivTable, type IvTable } from './iv-table.js';
import { linearSwitching } from './switching.js';

/** Pull-up (supply-relative, I = −x/R) and pull-down (I = x/R) tables of resistors over ±span volts. */
export function resistivePullup(r: number, span: number): IvTable {
  return ivTable([
    [-span, span / r],
    [span, -span / r],
  ]);
}

export function resistivePulldown(r: number, span: number): IvTable {
  return ivTable([
    [-span, -span / r],
    [span, span / r],
  ]);
}

export interface PushPullSpec {
  name: string;
  supply: number;
  /** Output resistance while driving high and while driving low (Ω). */
  rUp: number;
  rDown: number;
  /** Durations of the coefficient ramps (s, 0–100 %). */
  rise: number;
  fall: number;
  cComp?: number;
}

/** A push–pull of two resistors switched by complementary linear ramps (today's driver when rUp = rDown). */
export function pushPullModel(s: PushPullSpec): BufferModel {
  const span = 3 * Math.max(1, Math.abs(s.supply));
  return {
    name: s.name,
    kind: 'output',
    supply: s.supply,
    ground: 0,
    pullup: resistivePullup(s.rUp, span),
    pulldown: resistivePulldown(s.rDown, span),
    cComp: s.cComp ?? 0,
    switching: linearSwitching(s.rise, s.fall),
  };
}

export interface DriveStrengthSpec {
  name: string;
  supply: number;
  /** The stated drive current (A), reached at `atVoltage` from the rail (JEDEC's V_OL = 0.4 V by default). */
  current: number;
  atVoltage?: number;
  /** Transistor threshold (V); 0.2 × supply by default (common practice). */
  threshold?: number;
  rise: number;
  fall: number;
  cComp?: number;
}

/**
 * Square-law transistor current with the gate at the supply (Shichman & Hodges, "Modeling and simulation
 * of insulated-gate field-effect transistor switching circuits", IEEE JSSC SC-3(3), 1968):
 * I = k·[(V_ov)·V − V²/2] for 0 ≤ V ≤ V_ov, k·V_ov²/2 beyond (saturation), V_ov = V_supply − V_th; below
 * 0 V the channel is taken as its small-signal resistance 1/(k·V_ov). k is set so that I(atVoltage) = current.
 */
export function squareLawTable(supply: number, current: number, atVoltage: number, threshold: number): IvTable {
  const vov = supply - threshold;
  if (!(vov > atVoltage)) throw new RangeError(`drive strength: the threshold (${threshold} V) leaves no headroom above ${atVoltage} V`);
  const k = current / (vov * atVoltage - (atVoltage * atVoltage) / 2);
  const law = (v: number) => (v < 0 ? k * vov * v : v < vov ? k * (vov * v - (v * v) / 2) : (k * vov * vov) / 2);
  const points: Array<[number, number]> = [];
  // −V_s … 2·V_s in steps of V_s/14, so 0 V is a table point (the transistor carries nothing at its rail)
  const n = 42;
  for (let m = 0; m <= n; m++) {
    const v = (supply * (m - 14)) / 14;
    points.push([v, law(v)]);
  }
  return ivTable(points);
}

/** A push–pull whose pull-up and pull-down follow the square law with the stated drive current. */
export function driveStrengthModel(s: DriveStrengthSpec): BufferModel {
  const table = squareLawTable(s.supply, s.current, s.atVoltage ?? 0.4, s.threshold ?? 0.2 * s.supply);
  return {
    name: s.name,
    kind: 'output',
    supply: s.supply,
    ground: 0,
    pullup: { v: table.v, i: table.i.map((x) => -x) },
    pulldown: table,
    cComp: s.cComp ?? 0,
    switching: linearSwitching(s.rise, s.fall),
  };
}

export interface ReceiverSpec {
  name: string;
  supply: number;
  c: number;
  gndClamp?: Diode | IvTable;
  powerClamp?: Diode | IvTable;
}

function clampCurve(c: Diode | IvTable, ground: boolean): Curve {
  if ('v' in c) return { kind: 'table', table: c };
  return ground ? groundClampDiode(c) : powerClampDiode(c);
}

/** A receiver input: its capacitance and optional clamps (tables in the standard's frames, or diodes). */
export function receiverModel(s: ReceiverSpec): BufferModel {
  return {
    name: s.name,
    kind: 'input',
    supply: s.supply,
    ground: 0,
    gndClamp: s.gndClamp ? clampCurve(s.gndClamp, true) : undefined,
    powerClamp: s.powerClamp ? clampCurve(s.powerClamp, false) : undefined,
    cComp: s.c,
  };
}
