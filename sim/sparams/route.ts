// S-parameters of a route (today's chain: driver pin → line segments and parts → receiver pin) from
// the spectral solver's exact line models. Port 1 is the driver pin and port 2 the receiver pin; the
// driver's resistance and the receiver's own parts are not part of the two-port (they are what gets
// connected to its ports).
//
// The two-port is driven through the spectral solver's public transfer function (sim/spectral): with
// a source of resistance r1 at port 1 and a resistor r2 at port 2, the voltages per volt of source
// are h1 = V1/Vs and h2 = V2/Vs, and with real references (Pozar, Microwave Engineering, 4th ed.,
// §4.3, incident and reflected waves a = (V + rI)/(2√r), b = (V − rI)/(2√r)):
//   S11 = 2·h1 − 1,  S21 = 2·h2·√(r1/r2)
// (port 1: V1 + r1·I1 = Vs, so a1 = Vs/(2√r1) and b1 = (2V1 − Vs)/(2√r1); port 2 matched, a2 = 0,
// b2 = V2/√r2). The route reversed gives S22 and S12 the same way: every item (uniform line, series
// part, shunt parts) is the same seen from either end.
import type { Net, Part, RouteItem } from '../model.js';
import { transferFunctions } from '../spectral/chain.js';
import type { NetworkData } from './network.js';

export interface RouteSelection {
  /** First route item of the stretch (default: the first). */
  from?: string;
  /** Last route item of the stretch, inclusive (default: the last). */
  to?: string;
}

/** The route items from `from` to `to` (inclusive), or a RangeError naming the valid items. */
export function selectRoute(net: Net, sel: RouteSelection = {}): RouteItem[] {
  const names = net.route.map((r) => r.name);
  const find = (name: string | undefined, fallback: number) => {
    if (name === undefined) return fallback;
    const i = names.indexOf(name);
    if (i < 0) throw new RangeError(`no route item named '${name}'; the route has ${names.map((n) => `'${n}'`).join(', ')}`);
    return i;
  };
  const a = find(sel.from, 0);
  const b = find(sel.to, net.route.length - 1);
  if (b < a) throw new RangeError(`'${names[b]}' comes before '${names[a]}' in the route`);
  return net.route.slice(a, b + 1);
}

/** A net that drives `route` from a source of resistance r1 into a resistor r2, probing both ends. */
function portNet(net: Net, route: RouteItem[], r1: number, r2: number): Net {
  const load: Part = { r: r2, l: 0, rail: 0 };
  return {
    ...net,
    driver: { ...net.driver, resistance: r1 },
    route,
    receiver: [load],
    probes: [
      { name: 'port1', at: 'driver' },
      { name: 'port2', at: 'receiver' },
    ],
  };
}

/**
 * S-parameters of the route (or the stretch `sel`) at the frequencies `freq` (Hz, all > 0), with
 * reference resistances r1 at the driver pin and r2 at the receiver pin.
 */
export function routeSParameters(net: Net, freq: ArrayLike<number>, r1 = 50, r2 = r1, sel: RouteSelection = {}): NetworkData {
  for (let k = 0; k < freq.length; k++) {
    if (!(freq[k] > 0) || (k > 0 && !(freq[k] > freq[k - 1]))) throw new RangeError(`frequencies must be > 0 and increasing (at index ${k}: ${freq[k]})`);
  }
  if (!(r1 > 0 && r2 > 0)) throw new RangeError('reference resistances must be > 0');
  const route = selectRoute(net, sel);
  const s = Array.from(freq, (f) => ({ re: 0, im: 2 * Math.PI * f }));
  const [h11, h21] = transferFunctions(portNet(net, route, r1, r2), s);
  const [h22, h12] = transferFunctions(portNet(net, [...route].reverse(), r2, r1), s);
  const data = new Float64Array(8 * freq.length);
  const k21 = 2 * Math.sqrt(r1 / r2);
  const k12 = 2 * Math.sqrt(r2 / r1);
  for (let k = 0; k < freq.length; k++) {
    const o = 8 * k;
    data[o] = 2 * h11[k].re - 1;
    data[o + 1] = 2 * h11[k].im;
    data[o + 2] = k12 * h12[k].re;
    data[o + 3] = k12 * h12[k].im;
    data[o + 4] = k21 * h21[k].re;
    data[o + 5] = k21 * h21[k].im;
    data[o + 6] = 2 * h22[k].re - 1;
    data[o + 7] = 2 * h22[k].im;
  }
  return { ports: 2, freq: Float64Array.from(freq), kind: 'S', data, reference: Float64Array.of(r1, r2) };
}
