// DC operating point of the net, computed on the chain itself (not on the time-domain ladder): the
// source at a given value, every rail on, inductors shorts, capacitors open, each line its exact DC
// two-port. Two sweeps of Thevenin equivalents, one from the driver and one from the receiver; a
// node's voltage is the open-circuit voltage of the two equivalents in parallel. Ideal sources and
// zero-ohm parts are handled exactly. A node with no DC path to any source or rail is put at 0 V, the
// same convention as the time-domain engine (any such value is an equilibrium: only capacitors see it).
//
// A line at DC has Z' = R', Y' = G' (per-length.ts at s = 0), so u = ℓ√(R'G') and its chain matrix
// is [cosh u, R'ℓ·sinh u/u; G'ℓ·sinh u/u, cosh u] (Pozar, Microwave Engineering, ch. 2, jω → 0).
// A Thevenin source (E, R) seen through a two-port [A B; C D] becomes
//   E' = E/(A + R·C),  R' = (B + R·D)/(A + R·C),
// and an open end (R = ∞) becomes (0, D/C). Lines are symmetric, so the same map serves both sweeps.
import { OPEN, parallel, type Thevenin } from '../thevenin.js';
import type { Net, Part } from '../model.js';
import { signalFunction } from '../signals.js';
import { compileChain, type Chain, type ChainItem } from './chain.js';
import { perLength } from './per-length.js';


/** tanh(u)/u, with its series near 0. */
function tanhc(u: number): number {
  if (u < 1e-4) return 1 - (u * u) / 3;
  return Math.tanh(u) / u;
}

/** The Thevenin equivalent seen through a line piece of length `len` at DC. */
function throughLine(t: Thevenin, item: Extract<ChainItem, { kind: 'line' }>, len: number): Thevenin {
  const pl = perLength(item.line, { re: 0, im: 0 });
  const r = pl.z.re;
  const g = pl.y.re;
  const u = len * Math.sqrt(r * g);
  const bt = len * tanhc(u); // (sinh u / u)·ℓ / cosh u
  if (t.r === Infinity) return g * bt > 0 ? { e: 0, r: 1 / (g * bt) } : OPEN;
  const den = 1 + t.r * g * bt;
  return { e: t.e / (Math.cosh(u) * den), r: (r * bt + t.r) / den };
}

/** DC equivalent of one part to its rail: open if it has a capacitor. */
function partThevenin(p: Part): Thevenin {
  return p.c !== undefined ? OPEN : { e: p.rail, r: p.r };
}

function partsThevenin(parts: Part[], where: string): Thevenin {
  let t = OPEN;
  for (const p of parts) t = parallel(t, partThevenin(p), where);
  return t;
}

/** The equivalent seen through a whole item (either direction: every item is symmetric at DC). */
function throughItem(t: Thevenin, item: ChainItem, where: string): Thevenin {
  switch (item.kind) {
    case 'line':
      return throughLine(t, item, item.length);
    case 'series': {
      const p = item.part;
      if (p.c !== undefined || t.r === Infinity) return OPEN;
      return { e: t.e, r: t.r + p.r };
    }
    case 'shunt':
      return parallel(t, partsThevenin(item.parts, where), where);
  }
}

/** Voltage of the node joining two equivalents; a node with no DC path anywhere is at 0 V. */
function join(a: Thevenin, b: Thevenin, where: string): number {
  const t = parallel(a, b, where);
  return t.r === Infinity ? 0 : t.e;
}

/** DC voltage of every probe of a compiled chain with the source at `source` volts and every rail on. */
export function dcProbeVoltages(chain: Chain, source: number): Float64Array {
  const n = chain.items.length;
  const left: Thevenin[] = new Array(n + 1);
  const right: Thevenin[] = new Array(n + 1);
  left[0] = { e: source, r: chain.rs };
  for (let i = 0; i < n; i++) left[i + 1] = throughItem(left[i], chain.items[i], `route[${i}]`);
  right[n] = partsThevenin(chain.receiver, 'receiver');
  for (let i = n - 1; i >= 0; i--) right[i] = throughItem(right[i + 1], chain.items[i], `route[${i}]`);
  const out = new Float64Array(chain.anchors.length);
  chain.anchors.forEach((a, p) => {
    if (a.kind === 'node') {
      out[p] = join(left[a.node], right[a.node], `probes[${p}]`);
      return;
    }
    const item = chain.items[a.item] as Extract<ChainItem, { kind: 'line' }>;
    const l = throughLine(left[a.item], item, a.position);
    const r = throughLine(right[a.item + 1], item, a.rest);
    out[p] = join(l, r, `probes[${p}]`);
  });
  return out;
}

/**
 * DC operating point at every probe of the net: the source held at `source` volts (default: the
 * signal's value at t = 0), every rail on.
 */
export function dcOperatingPoint(net: Net, source = signalFunction(net.driver.signal)(0)): Float64Array {
  return dcProbeVoltages(compileChain(net), source);
}
