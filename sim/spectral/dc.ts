// DC operating point of the net, computed on the compiled circuit itself (not on the time-domain
// ladder): the source at a given value, every rail on, inductors shorts, capacitors open, each line its
// exact DC two-port. One nodal solve (dc-network.ts): ideal sources and zero-ohm paths are handled
// exactly, and a node with no DC path to any source or rail is put at 0 V, the same convention as the
// time-domain engine (any such value is an equilibrium: only capacitors see it).
//
// A line at DC has Z' = R', Y' = G' (per-length.ts at s = 0), so u = ℓ√(R'G') and, with
// Zc = √(R'/G'), its admittance parameters are y11 = y22 = 1/(Zc tanh u), y12 = −1/(Zc sinh u): a π of
// 1/(Zc sinh u) in series and tanh(u/2)/Zc from each end to ground (Pozar, Microwave Engineering, ch. 2
// and Table 4.2, jω → 0). R' = 0 makes the line a wire (its leakage G'ℓ all at one voltage), G' = 0 a
// resistor R'ℓ. Inside a line, V(x) = [V1 sinh(γ(ℓ − x)) + V2 sinh(γx)] / sinh(γℓ).
import { compileNet, RAIL, type Circuit } from '../circuit.js';
import { DcNetwork } from '../dc-network.js';
import type { Net } from '../model.js';
import { signalFunction } from '../signals.js';
import { perLength } from './per-length.js';

/** R′ and G′ of a segment at DC. */
function dcPerLength(c: Circuit, k: number): { r: number; g: number } {
  const pl = perLength(c.segments[k].line, { re: 0, im: 0 });
  return { r: pl.z.re, g: pl.y.re };
}

/** sinh(a)/sinh(c) for 0 ≤ a ≤ c, without overflow. */
function sinhRatio(a: number, c: number): number {
  if (c === 0) return 0;
  if (c < 20) return Math.sinh(a) / Math.sinh(c);
  return (Math.exp(a - c) * (1 - Math.exp(-2 * a))) / (1 - Math.exp(-2 * c));
}

/** DC voltage of every probe of a compiled circuit, with source k at sources[k] volts and every rail on. */
export function dcProbeVoltages(c: Circuit, sources: readonly number[]): Float64Array {
  const net = new DcNetwork(c.nodes.length);
  c.segments.forEach((seg, k) => {
    const { r, g } = dcPerLength(c, k);
    const len = seg.length;
    if (r === 0 || len === 0) {
      net.short(seg.from, seg.to);
      net.toRail(seg.from, g * len, 0);
    } else if (g === 0) net.conductance(seg.from, seg.to, 1 / (r * len));
    else {
      const zc = Math.sqrt(r / g);
      const u = len * Math.sqrt(r * g);
      net.conductance(seg.from, seg.to, 1 / (zc * Math.sinh(u)));
      net.toRail(seg.from, Math.tanh(u / 2) / zc, 0);
      net.toRail(seg.to, Math.tanh(u / 2) / zc, 0);
    }
  });
  for (const p of c.parts) {
    if (p.part.c !== undefined) continue; // a capacitor: open
    const where = p.item;
    if (p.q === RAIL) {
      if (p.part.r > 0) net.toRail(p.p, 1 / p.part.r, p.part.rail);
      else net.ideal(p.p, p.part.rail, where);
    } else if (p.part.r > 0) net.conductance(p.p, p.q, 1 / p.part.r);
    else net.short(p.p, p.q);
  }
  c.sources.forEach((s, k) => {
    if (s.resistance > 0) net.toRail(s.node, 1 / s.resistance, sources[k]);
    else net.ideal(s.node, sources[k], s.name);
  });
  const v = net.solve();
  return Float64Array.from(c.probes, ({ place }) => {
    if (place.kind === 'node') return v[place.node];
    const seg = c.segments[place.segment];
    const v1 = v[seg.from];
    const v2 = v[seg.to];
    const { r, g } = dcPerLength(c, place.segment);
    if (r === 0 || seg.length === 0) return v1;
    const x = place.position;
    if (g === 0) return v1 + ((v2 - v1) * x) / seg.length;
    const gamma = Math.sqrt(r * g);
    const cl = gamma * seg.length;
    return v1 * sinhRatio(gamma * (seg.length - x), cl) + v2 * sinhRatio(gamma * x, cl);
  });
}

/**
 * DC operating point at every probe of the net: the driver held at `source` volts (default: the
 * signal's value at t = 0), every rail on.
 */
export function dcOperatingPoint(net: Net, source = signalFunction(net.driver.signal)(0)): Float64Array {
  return dcProbeVoltages(compileNet(net), [source]);
}
