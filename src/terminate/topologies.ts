// The termination topologies the advisor tries, as a table. Each entry says where it applies, which
// values it searches (on a log scale, with ranges from the net's Z0 and delays), how those become
// part values (resistances and capacitances, the numbers rounded to the E series), and how the parts
// go into a scenario value. Ranges and rails:
//   series at the driver   Rs ∈ [1 Ω, 2.5·Z0]            (matched: Rs = Z0 − R_out; Johnson & Graham, High-Speed Digital Design, ch. 6, source termination)
//   parallel to ground     R ∈ [Z0/3, 10·Z0] per receiver (matched: R = Z0)
//   parallel to VTT        the same, to the rail VTT = (V_low + V_high)/2 (common practice: half the swing)
//   split pair             R1 to V_high, R2 to V_low, each ∈ [Z0/2, 20·Z0] (R1‖R2 = Z0 matches)
//   RC (AC)                R ∈ [Z0/2, 3·Z0], time constant R·C ∈ [3, 30] round trips (common practice:
//                          R·C of at least a few round-trip delays; we hold 3 as the floor, and rounding
//                          never takes it below)
//   series per star arm    one Rs ∈ [1 Ω, 2.5·Z0_arm] at the start of each arm of a branch item
//   series + weak parallel Rs ∈ [1 Ω, 2.5·Z0] and a parallel R ∈ [4·Z0, 40·Z0] to ground per receiver
// Several values of one kind (one per receiver or arm) are first searched tied together, then each
// on its own near that value (src/terminate/search.ts).
import type { NetFacts } from './net-facts.js';
import { rawBranches, rawPart, rawParts, rawReceivers, rawRoute, rawSeries, type Obj } from './raw.js';
import type { SearchParam } from './search.js';

export type TopologyId = 'none' | 'series' | 'parallel' | 'parallel-vtt' | 'split' | 'rc' | 'series-arms' | 'series-weak-parallel';

export interface Slot {
  kind: 'R' | 'C';
  /** Where the part sits, for reports: "at the driver", "at ram2 to 1.65 V". */
  where: string;
}

/** A part the topology adds, for its DC power: across a series item, or from a receiver to a rail. */
export interface AddedPart {
  r: number;
  c?: number;
  /** Rail of a part from a receiver (V); undefined for a series part. */
  rail?: number;
  /** The receiver's name (shunt) or the series item's name. */
  at: string;
  series: boolean;
  where: string;
}

export interface Topology {
  id: TopologyId;
  title: string;
  /** Why it does not apply to this net (undefined: it applies). */
  skip(f: NetFacts): string | undefined;
  /** The searched values. */
  params(f: NetFacts): (SearchParam & { name: string })[];
  groups?(f: NetFacts): number[][];
  slots(f: NetFacts): Slot[];
  /** Part values (in slot order) from searched values. */
  values(xs: readonly number[], f: NetFacts): number[];
  /** Whether rounded part values still obey the topology's rule (default: always). */
  valid?(pv: readonly number[], f: NetFacts): boolean;
  /** Puts the parts into `root` (a copy of the bare scenario value); returns them for the power figures. */
  edit(root: Obj, pv: readonly number[], f: NetFacts, fresh: (base: string) => string): AddedPart[];
}

/** Common practice: the AC termination's R·C at least this many round-trip delays. */
export const RC_ROUND_TRIPS = 3;

const z0d = (f: NetFacts) => f.z0Driver ?? 50;
const noLine = (f: NetFacts) => (f.z0Driver === null ? 'the route has no line' : undefined);
const vtt = (f: NetFacts) => (f.low + f.high) / 2;
const roundTrip = (f: NetFacts) => 2 * f.maxDelay;
const fmtV = (v: number) => `${Number(v.toPrecision(4))} V`;

function addAtReceivers(root: Obj, f: NetFacts, part: (i: number) => { r: number; c?: number; to?: number }, where: (name: string) => string): AddedPart[] {
  const raws = rawReceivers(root);
  return f.receivers.map((rx, i) => {
    const p = part(i);
    rawParts(raws[i]!.holder).push(rawPart(p.r, { c: p.c, to: p.to }));
    return { r: p.r, c: p.c, rail: p.c === undefined ? (p.to ?? 0) : undefined, at: rx.name, series: false, where: where(rx.name) };
  });
}

function seriesAtDriver(root: Obj, r: number, fresh: (b: string) => string): AddedPart {
  const name = fresh('term_rs');
  rawRoute(root).unshift(rawSeries(name, r));
  return { r, at: name, series: true, where: 'at the driver' };
}

const perReceiver = (f: NetFacts, lo: number, hi: number, start: number, name: string) =>
  f.receivers.map((rx) => ({ name: `${name} at ${rx.name}`, lo: lo * rx.z0, hi: hi * rx.z0, start: start * rx.z0 }));
const allTied = (n: number, from = 0) => [Array.from({ length: n }, (_, k) => from + k)];

export const TOPOLOGIES: readonly Topology[] = [
  {
    id: 'none',
    title: 'no termination',
    skip: () => undefined,
    params: () => [],
    slots: () => [],
    values: () => [],
    edit: () => [],
  },
  {
    id: 'series',
    title: 'series R at the driver',
    skip: noLine,
    params: (f) => [{ name: 'Rs', lo: 1, hi: 2.5 * z0d(f), start: Math.max(1, z0d(f) - f.rOut) }],
    slots: () => [{ kind: 'R', where: 'in series at the driver' }],
    values: (xs) => [...xs],
    edit: (root, pv, _f, fresh) => [seriesAtDriver(root, pv[0]!, fresh)],
  },
  {
    id: 'parallel',
    title: 'parallel R to ground',
    skip: noLine,
    params: (f) => perReceiver(f, 1 / 3, 10, 1, 'R'),
    groups: (f) => allTied(f.receivers.length),
    slots: (f) => f.receivers.map((rx) => ({ kind: 'R', where: `at ${rx.name} to 0 V` })),
    values: (xs) => [...xs],
    edit: (root, pv, f) => addAtReceivers(root, f, (i) => ({ r: pv[i]! }), (n) => `at ${n} to 0 V`),
  },
  {
    id: 'parallel-vtt',
    title: 'parallel R to VTT',
    skip: (f) => noLine(f) ?? (vtt(f) === 0 ? 'VTT would be 0 V (the same as to ground)' : undefined),
    params: (f) => perReceiver(f, 1 / 3, 10, 1, 'R'),
    groups: (f) => allTied(f.receivers.length),
    slots: (f) => f.receivers.map((rx) => ({ kind: 'R', where: `at ${rx.name} to ${fmtV(vtt(f))}` })),
    values: (xs) => [...xs],
    edit: (root, pv, f) => addAtReceivers(root, f, (i) => ({ r: pv[i]!, to: vtt(f) }), (n) => `at ${n} to ${fmtV(vtt(f))}`),
  },
  {
    id: 'split',
    title: 'split (Thevenin) pair',
    skip: noLine,
    // R1 (to V_high) of every receiver, then R2 (to V_low) of every receiver
    params: (f) => [...perReceiver(f, 0.5, 20, 2, 'R1'), ...perReceiver(f, 0.5, 20, 2, 'R2')],
    groups: (f) => allTied(2 * f.receivers.length),
    slots: (f) => [...f.receivers.map((rx) => ({ kind: 'R' as const, where: `at ${rx.name} to ${fmtV(f.high)}` })), ...f.receivers.map((rx) => ({ kind: 'R' as const, where: `at ${rx.name} to ${fmtV(f.low)}` }))],
    values: (xs) => [...xs],
    edit: (root, pv, f) => {
      const n = f.receivers.length;
      return [
        ...addAtReceivers(root, f, (i) => ({ r: pv[i]!, to: f.high }), (x) => `at ${x} to ${fmtV(f.high)}`),
        ...addAtReceivers(root, f, (i) => ({ r: pv[n + i]!, to: f.low }), (x) => `at ${x} to ${fmtV(f.low)}`),
      ];
    },
  },
  {
    id: 'rc',
    title: 'RC (AC) termination',
    skip: (f) => noLine(f) ?? (f.maxDelay > 0 ? undefined : 'the lines have no delay'),
    // R of every receiver, then the time constant R·C of every receiver
    params: (f) => [
      ...perReceiver(f, 0.5, 3, 1, 'R'),
      ...f.receivers.map((rx) => ({ name: `R·C at ${rx.name}`, lo: RC_ROUND_TRIPS * roundTrip(f), hi: 30 * roundTrip(f), start: 2 * RC_ROUND_TRIPS * roundTrip(f) })),
    ],
    groups: (f) => [...allTied(f.receivers.length), ...allTied(f.receivers.length, f.receivers.length)],
    slots: (f) => [...f.receivers.map((rx) => ({ kind: 'R' as const, where: `at ${rx.name}, with C to 0 V` })), ...f.receivers.map((rx) => ({ kind: 'C' as const, where: `at ${rx.name}, with R to 0 V` }))],
    values: (xs, f) => {
      const n = f.receivers.length;
      return [...xs.slice(0, n), ...xs.slice(n).map((tau, i) => tau / xs[i]!)];
    },
    valid: (pv, f) => {
      const n = f.receivers.length;
      return pv.slice(0, n).every((r, i) => r * pv[n + i]! >= RC_ROUND_TRIPS * roundTrip(f) * (1 - 1e-9));
    },
    edit: (root, pv, f) => {
      const n = f.receivers.length;
      return addAtReceivers(root, f, (i) => ({ r: pv[i]!, c: pv[n + i]! }), (x) => `at ${x} (R + C to 0 V)`);
    },
  },
  {
    id: 'series-arms',
    title: 'series R per star arm',
    skip: (f) => (f.arms.length < 2 ? 'the main route has no branch item with two or more arms' : undefined),
    params: (f) => f.arms.map((a) => ({ name: `Rs ${a.label}`, lo: 1, hi: 2.5 * a.z0, start: a.z0 / 2 })),
    groups: (f) => allTied(f.arms.length),
    slots: (f) => f.arms.map((a) => ({ kind: 'R', where: `in series at the start of ${a.label}` })),
    values: (xs) => [...xs],
    edit: (root, pv, f, fresh) => {
      const route = rawRoute(root);
      const added: AddedPart[] = f.arms.map((a, k) => ({ r: pv[k]!, at: fresh(`term_arm${k + 1}`), series: true, where: `at the start of ${a.label}` }));
      // insert from the last arm back, so the route's indices stay valid
      for (let k = f.arms.length - 1; k >= 0; k--) {
        const a = f.arms[k]!;
        const item = rawSeries(added[k]!.at, pv[k]!);
        if (a.branch < 0) route.splice(a.item + 1, 0, item);
        else {
          const b = rawBranches(route[a.item]!)[a.branch]!;
          (b.route as Obj[]).unshift(item);
        }
      }
      return added;
    },
  },
  {
    id: 'series-weak-parallel',
    title: 'series R + weak parallel R',
    skip: noLine,
    params: (f) => [{ name: 'Rs', lo: 1, hi: 2.5 * z0d(f), start: Math.max(1, z0d(f) - f.rOut) }, ...perReceiver(f, 4, 40, 10, 'Rp')],
    groups: (f) => [[0], ...allTied(f.receivers.length, 1)],
    slots: (f) => [{ kind: 'R', where: 'in series at the driver' }, ...f.receivers.map((rx) => ({ kind: 'R' as const, where: `at ${rx.name} to 0 V` }))],
    values: (xs) => [...xs],
    edit: (root, pv, f, fresh) => [seriesAtDriver(root, pv[0]!, fresh), ...addAtReceivers(root, f, (i) => ({ r: pv[1 + i]! }), (n) => `at ${n} to 0 V`)],
  },
];

export function topologyById(id: string): Topology | undefined {
  return TOPOLOGIES.find((t) => t.id === id);
}
