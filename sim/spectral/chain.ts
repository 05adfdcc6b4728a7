// The route as a chain of two-ports, evaluated at one complex frequency s = σ + jω.
//
// Every route item is a chain (ABCD) matrix relating [V; I] at its input to [V; I] at its output
// (current flowing towards the receiver):
//   line of length ℓ   [cosh γℓ, Zc sinh γℓ; sinh γℓ / Zc, cosh γℓ],  γ = √(Z'Y'), Zc = √(Z'/Y')
//   series part Z      [1, Z; 0, 1]
//   shunt parts Y      [1, 0; Y, 1]   (Y the sum of the parts' admittances)
// (Pozar, Microwave Engineering, ch. 4, ABCD parameters; lines from ch. 2 with jω → s.)
// The line matrix is written as [cosh u, Z'ℓ·shc u; Y'ℓ·shc u, cosh u] with u = γℓ and
// shc u = sinh u / u: both entries are even in u, so the branch of the square root does not matter
// and a line with Z' = 0 or Y' = 0 needs no special case. For |u| large the common factor e^u is
// split off into a running logarithmic scale, so a long lossy line never overflows.
//
// Rails are AC grounds here (superposition: their constant voltages belong to the DC operating point,
// see dc.ts). The receiver node carries its parts' admittance Y_L, so the state there is
// [V; I] = V_L·[1; Y_L]; sweeping back to the driver pin gives [V; I] at every node per unit V_L,
// and the Thevenin driver fixes V_L: Vs = V0 + Rs·I0. A part that is an ideal short (no R, L or C)
// pins its node to 0 V: everything beyond it is 0 and the sweep restarts there from [0; 1].
import { NetError, type NetProblem } from '../errors.js';
import type { LineRLGC, Net, Part } from '../model.js';
import { perLength, type Complex } from './per-length.js';

export type ChainItem =
  | { kind: 'line'; name: string; line: LineRLGC; length: number }
  | { kind: 'series'; name: string; part: Part }
  | { kind: 'shunt'; name: string; parts: Part[] };

/**
 * Where a probe reads. Node positions run from 0 (driver pin) to items.length (receiver); position
 * p lies between item p−1 and item p. A probe inside a line reads `rest` metres before its end.
 */
export type ProbeAnchor = { kind: 'node'; node: number } | { kind: 'inLine'; item: number; position: number; rest: number };

export interface Chain {
  items: ChainItem[];
  names: string[];
  anchors: ProbeAnchor[];
  rs: number;
  receiver: Part[];
}

/** Resolves every probe of the net to a place on the chain; unknown items and positions off a line are errors. */
export function compileChain(net: Net): Chain {
  const items: ChainItem[] = net.route.map((it) => ({ ...it }) as ChainItem);
  const index = new Map<string, number>();
  items.forEach((it, i) => index.set(it.name, i));
  const problems: NetProblem[] = [];
  const anchors: ProbeAnchor[] = net.probes.map((p, n) => {
    const path = `probes[${n}]`;
    if (p.at === 'driver') return { kind: 'node', node: 0 };
    if (p.at === 'receiver') return { kind: 'node', node: items.length };
    const i = index.get(p.item);
    if (i === undefined) {
      problems.push({ path, message: `no route item named '${p.item}'` });
      return { kind: 'node', node: 0 };
    }
    const item = items[i];
    if (p.at === 'line') {
      if (item.kind !== 'line') {
        problems.push({ path, message: `'${p.item}' is not a line` });
        return { kind: 'node', node: 0 };
      }
      if (!(p.position >= 0) || p.position > item.length * (1 + 1e-12)) {
        problems.push({ path, message: `position ${p.position} m lies outside '${p.item}'` });
        return { kind: 'node', node: 0 };
      }
      const position = Math.min(p.position, item.length);
      return { kind: 'inLine', item: i, position, rest: item.length - position };
    }
    if (p.at === 'series') return { kind: 'node', node: p.side === 'in' ? i : i + 1 };
    return { kind: 'node', node: i };
  });
  if (problems.length) throw new NetError(problems);
  return { items, names: net.probes.map((p) => p.name), anchors, rs: net.driver.resistance, receiver: net.receiver };
}

/** True when the part is a plain wire to its rail (no R, L or C): an ideal short in AC, an ideal source at DC. */
export function isIdealShort(p: Part): boolean {
  return p.r === 0 && p.l === 0 && p.c === undefined;
}

/** Z(s) = R + sL + 1/(sC) of a part (C absent = no capacitor term); s must not be 0. */
export function partImpedance(p: Part, sr: number, si: number): Complex {
  let re = p.r + sr * p.l;
  let im = si * p.l;
  if (p.c !== undefined) {
    const d = (sr * sr + si * si) * p.c; // 1/(sC) = conj(s)/(|s|²C)
    re += sr / d;
    im -= si / d;
  }
  return { re, im };
}

/** Sum of the admittances 1/Z(s) of parts in parallel; `short` when one of them is an ideal short. */
function admittance(parts: Part[], sr: number, si: number): { re: number; im: number; short: boolean } {
  let re = 0;
  let im = 0;
  for (const p of parts) {
    if (isIdealShort(p)) return { re: 0, im: 0, short: true };
    const z = partImpedance(p, sr, si);
    const d = z.re * z.re + z.im * z.im;
    re += z.re / d;
    im -= z.im / d;
  }
  return { re, im, short: false };
}

/** Running state of the backward sweep: [V; I] = e^lg·[w0; w1]. */
interface Sweep {
  w0r: number;
  w0i: number;
  w1r: number;
  w1i: number;
  lg: number;
}

/**
 * Applies the chain matrix of a line piece with total series impedance zl = Z'ℓ and total shunt
 * admittance yl = Y'ℓ to the state (from the output side back to the input side).
 */
function applyLine(zlr: number, zli: number, ylr: number, yli: number, st: Sweep): void {
  // u² = Z'Y'ℓ², u its principal square root (Re u ≥ 0)
  const pr = zlr * ylr - zli * yli;
  const pi = zlr * yli + zli * ylr;
  let chr: number;
  let chi: number;
  let scr: number; // shc u = sinh u / u
  let sci: number;
  const mag = Math.sqrt(pr * pr + pi * pi);
  if (mag < 0.0625) {
    // |u| < 0.25: Taylor series in p = u², truncation below 1e-15 relative
    const p2r = pr * pr - pi * pi;
    const p2i = 2 * pr * pi;
    const p3r = p2r * pr - p2i * pi;
    const p3i = p2r * pi + p2i * pr;
    const p4r = p2r * p2r - p2i * p2i;
    const p4i = 2 * p2r * p2i;
    chr = 1 + pr / 2 + p2r / 24 + p3r / 720 + p4r / 40320;
    chi = pi / 2 + p2i / 24 + p3i / 720 + p4i / 40320;
    scr = 1 + pr / 6 + p2r / 120 + p3r / 5040 + p4r / 362880;
    sci = pi / 6 + p2i / 120 + p3i / 5040 + p4i / 362880;
  } else {
    // principal sqrt without cancellation
    let ur: number;
    let ui: number;
    if (pr >= 0) {
      ur = Math.sqrt(0.5 * (mag + pr));
      ui = pi / (2 * ur);
    } else {
      ui = Math.sqrt(0.5 * (mag - pr));
      if (pi < 0) ui = -ui;
      ur = pi / (2 * ui);
    }
    // cosh u = e^u (1 + e^{−2u})/2, sinh u = e^u (1 − e^{−2u})/2; e^{Re u} goes to the log scale,
    // e^{j Im u} stays in the entries.
    const ea = Math.exp(-2 * ur);
    const er = ea * Math.cos(2 * ui);
    const ei = -ea * Math.sin(2 * ui);
    const phr = Math.cos(ui);
    const phi = Math.sin(ui);
    const ar = (1 + er) / 2;
    const ai = ei / 2;
    const br = (1 - er) / 2;
    const bi = -ei / 2;
    chr = ar * phr - ai * phi;
    chi = ar * phi + ai * phr;
    const shr = br * phr - bi * phi;
    const shi = br * phi + bi * phr;
    const ud = ur * ur + ui * ui;
    scr = (shr * ur + shi * ui) / ud;
    sci = (shi * ur - shr * ui) / ud;
    st.lg += ur;
  }
  const br = zlr * scr - zli * sci; // B = Z'ℓ·shc u
  const bi = zlr * sci + zli * scr;
  const cr = ylr * scr - yli * sci; // C = Y'ℓ·shc u
  const ci = ylr * sci + yli * scr;
  const { w0r, w0i, w1r, w1i } = st;
  st.w0r = chr * w0r - chi * w0i + (br * w1r - bi * w1i);
  st.w0i = chr * w0i + chi * w0r + (br * w1i + bi * w1r);
  st.w1r = cr * w0r - ci * w0i + (chr * w1r - chi * w1i);
  st.w1i = cr * w0i + ci * w0r + (chr * w1i + chi * w1r);
}

function normalize(st: Sweep): void {
  const m = Math.abs(st.w0r) + Math.abs(st.w0i) + Math.abs(st.w1r) + Math.abs(st.w1i);
  if (m > 0 && m < Infinity && (m > 1e50 || m < 1e-50)) {
    st.w0r /= m;
    st.w0i /= m;
    st.w1r /= m;
    st.w1i /= m;
    st.lg += Math.log(m);
  }
}

/** Reusable work arrays for evaluating one chain at many frequencies. */
export interface ChainEvaluator {
  chain: Chain;
  /**
   * Transfer functions V_probe(s)/Vs(s) with rails grounded, written to out[2p] (re), out[2p+1] (im).
   */
  transfer(sr: number, si: number, out: Float64Array): void;
}

export function chainEvaluator(chain: Chain): ChainEvaluator {
  const n = chain.items.length;
  const W0r = new Float64Array(n + 1);
  const W0i = new Float64Array(n + 1);
  const W1r = new Float64Array(n + 1);
  const W1i = new Float64Array(n + 1);
  const LG = new Float64Array(n + 1);
  // Z'(s), Y'(s) of each line at the current s, kept for probes inside the line.
  const Zr = new Float64Array(n);
  const Zi = new Float64Array(n);
  const Yr = new Float64Array(n);
  const Yi = new Float64Array(n);
  const st: Sweep = { w0r: 0, w0i: 0, w1r: 0, w1i: 0, lg: 0 };
  const probe: Sweep = { w0r: 0, w0i: 0, w1r: 0, w1i: 0, lg: 0 };
  const save = (k: number) => {
    W0r[k] = st.w0r;
    W0i[k] = st.w0i;
    W1r[k] = st.w1r;
    W1i[k] = st.w1i;
    LG[k] = st.lg;
  };
  const restart = (k: number) => {
    // an ideal short at node k: every node beyond it is at 0 V
    for (let j = k + 1; j <= n; j++) LG[j] = -Infinity;
    st.w0r = 0;
    st.w0i = 0;
    st.w1r = 1;
    st.w1i = 0;
    st.lg = 0;
  };

  function transfer(sr: number, si: number, out: Float64Array): void {
    const load = admittance(chain.receiver, sr, si);
    if (load.short) restart(n);
    else {
      st.w0r = 1;
      st.w0i = 0;
      st.w1r = load.re;
      st.w1i = load.im;
      st.lg = 0;
    }
    save(n);
    const s: Complex = { re: sr, im: si };
    for (let i = n - 1; i >= 0; i--) {
      const item = chain.items[i];
      if (item.kind === 'line') {
        const pl = perLength(item.line, s);
        Zr[i] = pl.z.re;
        Zi[i] = pl.z.im;
        Yr[i] = pl.y.re;
        Yi[i] = pl.y.im;
        const len = item.length;
        applyLine(pl.z.re * len, pl.z.im * len, pl.y.re * len, pl.y.im * len, st);
      } else if (item.kind === 'series') {
        if (!isIdealShort(item.part)) {
          const z = partImpedance(item.part, sr, si);
          st.w0r += z.re * st.w1r - z.im * st.w1i;
          st.w0i += z.re * st.w1i + z.im * st.w1r;
        }
      } else {
        const y = admittance(item.parts, sr, si);
        if (y.short) restart(i);
        else {
          st.w1r += y.re * st.w0r - y.im * st.w0i;
          st.w1i += y.re * st.w0i + y.im * st.w0r;
        }
      }
      normalize(st);
      save(i);
    }
    // Vs = V0 + Rs·I0 at the driver pin
    const dr = W0r[0] + chain.rs * W1r[0];
    const di = W0i[0] + chain.rs * W1i[0];
    const dd = dr * dr + di * di;
    if (!(dd > 0)) {
      throw new NetError([{ path: 'driver', message: 'the driver is an ideal source (0 ohm) into a short circuit' }]);
    }
    const lg0 = LG[0];
    chain.anchors.forEach((a, p) => {
      let vr: number;
      let vi: number;
      let lg: number;
      if (a.kind === 'node') {
        vr = W0r[a.node];
        vi = W0i[a.node];
        lg = LG[a.node];
      } else {
        const k = a.item + 1;
        probe.w0r = W0r[k];
        probe.w0i = W0i[k];
        probe.w1r = W1r[k];
        probe.w1i = W1i[k];
        probe.lg = LG[k];
        if (a.rest > 0 && probe.lg > -Infinity) {
          const i = a.item;
          applyLine(Zr[i] * a.rest, Zi[i] * a.rest, Yr[i] * a.rest, Yi[i] * a.rest, probe);
        }
        vr = probe.w0r;
        vi = probe.w0i;
        lg = probe.lg;
      }
      const scale = lg === -Infinity ? 0 : Math.exp(lg - lg0);
      // H = V/(V0 + Rs I0)
      out[2 * p] = (scale * (vr * dr + vi * di)) / dd;
      out[2 * p + 1] = (scale * (vi * dr - vr * di)) / dd;
    });
  }

  return { chain, transfer };
}

/** Transfer functions from the source voltage to every probe at each complex frequency in `s`. */
export function transferFunctions(net: Net, s: Complex[]): Complex[][] {
  const ev = chainEvaluator(compileChain(net));
  const out = new Float64Array(2 * net.probes.length);
  const h: Complex[][] = net.probes.map(() => []);
  for (const sk of s) {
    ev.transfer(sk.re, sk.im, out);
    h.forEach((row, p) => row.push({ re: out[2 * p], im: out[2 * p + 1] }));
  }
  return h;
}
