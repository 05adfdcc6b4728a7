// Two-net test scenarios with one coupled section (plain SI, as the validator produces them).
import { selfLine } from '../../sim/circuit.js';
import type { CoupledLine } from '../../sim/coupled/line.js';
import type { Net, Part, Signal } from '../../sim/model.js';
import { line, part } from './nets.js';

export interface PairRunOptions {
  line: CoupledLine;
  length: number;
  /** Aggressor source and resistance; the victim's driver holds `victimLevel` (default 0 V) behind `rsVictim`. */
  signal: Signal;
  rs: number;
  rsVictim?: number;
  victimLevel?: number;
  /** Far-end terminations to ground (ohm) of aggressor and victim; undefined = open. */
  rt?: [number | undefined, number | undefined];
  duration: number;
  cellsPerRise?: number;
}

const held = (v: number): Signal => ({ kind: 'step', from: v, to: v, start: 0, rise: 1e-12 });

/**
 * Aggressor net "agg" (route: coupled item "a") and victim net "vic" (item "b"), one coupled section
 * "pair"; probes at both ends of both nets: aggNear, aggFar, vicNear, vicFar.
 */
export function pairNet(o: PairRunOptions): Net {
  const term = (r: number | undefined): Part[] => (r === undefined ? [] : [part({ r })]);
  return {
    title: 'coupled pair',
    netName: 'agg',
    driver: { signal: o.signal, resistance: o.rs },
    route: [line('a', selfLine(o.line, 0), o.length)],
    receiver: term(o.rt?.[0]),
    receiverName: 'aggFarEnd',
    nets: [{ name: 'vic', driver: { signal: held(o.victimLevel ?? 0), resistance: o.rsVictim ?? o.rs }, route: [line('b', selfLine(o.line, 1), o.length)], receiver: term(o.rt?.[1]), receiverName: 'vicFarEnd' }],
    coupled: [{ name: 'pair', conductors: ['a', 'b'], line: o.line }],
    probes: [
      { name: 'aggNear', at: 'driver' },
      { name: 'aggFar', at: 'receiver', receiver: 'aggFarEnd' },
      { name: 'vicNear', at: 'driver', net: 'vic' },
      { name: 'vicFar', at: 'receiver', receiver: 'vicFarEnd' },
    ],
    run: { duration: o.duration, cellsPerRise: o.cellsPerRise ?? 20 },
  };
}
