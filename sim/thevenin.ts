// Thevenin equivalents for the DC sweeps along a chain (sim/dc.ts and the spectral solver's own DC).
import { NetError } from './errors.js';

/** A Thevenin equivalent; r = Infinity is an open circuit (e is then 0), r = 0 an ideal source. */
export interface Thevenin {
  e: number;
  r: number;
}

export const OPEN: Thevenin = { e: 0, r: Infinity };

/** Two equivalents in parallel; two ideal sources of different voltage tied together are a net error at `where`. */
export function parallel(a: Thevenin, b: Thevenin, where: string): Thevenin {
  if (a.r === Infinity) return b;
  if (b.r === Infinity) return a;
  if (a.r === 0 && b.r === 0) {
    if (Math.abs(a.e - b.e) > 1e-12 * (1 + Math.abs(a.e) + Math.abs(b.e))) {
      throw new NetError([{ path: where, message: `two ideal sources or rails (${a.e} V and ${b.e} V) are tied together by zero-ohm paths` }]);
    }
    return a;
  }
  if (a.r === 0) return a;
  if (b.r === 0) return b;
  const s = a.r + b.r;
  return { e: (a.e * b.r + b.e * a.r) / s, r: (a.r * b.r) / s };
}
