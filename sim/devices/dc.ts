// DC operating point of a device pin: capacitors open, package inductance shorted, the switching
// coefficients at their settled value (a quiet-high driver has its pull-up on and idles at its supply
// when nothing loads it), the outside network as a Norton equivalent at the pin (current from the pin
// into the network g·V_pin − j).
import { bufferScratch, drives, type BufferModel } from './buffer.js';
import { ivPoint } from './iv-table.js';
import { nodeSolution, solveDeviceNode, NEWTON_DEFAULTS, type NewtonOptions } from './newton.js';
import { deviceLaw } from './stepper.js';
import { steadyCoefficients, type Coefficients } from './switching.js';

/** A driver's logic state, or 'input' for a model whose driving stage is off (coefficients 0). */
export type DeviceState = 'high' | 'low' | 'off';

export function settledCoefficients(model: BufferModel, state: DeviceState): Coefficients {
  if (state === 'off' || !drives(model)) return { ku: 0, kd: 0 };
  if (model.switching) return steadyCoefficients(model.switching, state === 'high');
  return state === 'high' ? { ku: 1, kd: 0 } : { ku: 0, kd: 1 };
}

export interface DcPoint {
  vPin: number;
  vDie: number;
  /** Current into the pin (A). */
  iPin: number;
  iterations: number;
}

/** The pin's DC voltage and current with the outside network (g, j) attached. */
export function deviceDcPoint(model: BufferModel, state: DeviceState, g: number, j: number, name = 'device', opts: NewtonOptions = NEWTON_DEFAULTS): DcPoint {
  const coeff = settledCoefficients(model, state);
  const law = deviceLaw(model, coeff, bufferScratch());
  const r = model.pkg?.r ?? 0;
  const den = r * g + 1;
  const guess = state === 'high' && drives(model) ? model.supply : state === 'low' && drives(model) ? model.ground : g > 0 ? j / g : model.ground;
  const sol = solveDeviceNode(law, g / den, j / den, 1, guess, { time: 0, node: name }, ivPoint(), nodeSolution(), opts);
  return { vDie: sol.v, vPin: sol.v + r * sol.i, iPin: sol.i, iterations: sol.iterations };
}
