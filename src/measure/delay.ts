// Delay from the driver's source waveform to a probe, per matching edge.
import type { EdgeMeasurement, EdgeDirection } from './edge-types.js';
import { formatSI } from './format.js';

export interface DelayMeasurement {
  /** Number (from 1) of the source edge and of the probe edge matched to it (null when none matched). */
  sourceEdge: number;
  probeEdge: number | null;
  direction: EdgeDirection;
  /** 50 % instant of the source edge (s). */
  sourceT50: number;
  /** 50 % instant of the matched probe edge (s). */
  probeT50: number | null;
  /** probe 50 % instant − source 50 % instant (s). */
  delay50: number | null;
  /**
   * Source 50 % instant to the probe's first crossing of the logic threshold in the edge's direction
   * (vih rising, vil falling) — the earliest the receiver can switch. Null without thresholds.
   */
  delayThresholdFirst: number | null;
  /**
   * Source 50 % instant to the probe's last crossing of the threshold in the edge's direction before the
   * state ends — after it the receiver no longer returns to the old state (settled switching).
   */
  delayThresholdLast: number | null;
  /**
   * True for an unmatched source edge after which the probe has no edge at all: its edge most likely
   * arrives after the end of the record (checks skip these as long as some edge did match).
   */
  cutOff: boolean;
  /** Why a field above is null, keyed by the field's name. */
  reasons: DelayReasons;
}

export type DelayReasons = Partial<Record<Exclude<keyof DelayMeasurement, 'reasons'>, string>>;

export interface DelayOptions {
  /** Whether thresholds were given (so threshold crossings in the probe edges are vih/vil crossings). */
  thresholds: boolean;
  /**
   * A probe edge may precede its source edge by at most this much (s) and still match; default 0
   * (a tiny allowance of 1e-6 of the sample interval covers rounding).
   */
  earlyTolerance?: number;
  dt: number;
}

/**
 * Match each source edge to the first probe edge of the same direction whose 50 % instant falls at or
 * after the source's 50 % instant and before the next source edge of that direction, and measure the
 * delays. Each probe edge matches at most one source edge.
 */
export function measureDelays(
  sourceEdges: readonly EdgeMeasurement[],
  probeEdges: readonly EdgeMeasurement[],
  opts: DelayOptions,
): DelayMeasurement[] {
  const early = (opts.earlyTolerance ?? 0) + 1e-6 * opts.dt;
  // Next source edge of the same direction, and a moving pointer per direction into the probe edges
  // (both lists are in time order, so the whole match is linear).
  const nextSame: (EdgeMeasurement | undefined)[] = new Array(sourceEdges.length);
  const seen: Partial<Record<EdgeDirection, EdgeMeasurement>> = {};
  for (let i = sourceEdges.length - 1; i >= 0; i--) {
    const s = sourceEdges[i]!;
    nextSame[i] = seen[s.direction];
    seen[s.direction] = s;
  }
  const byDir: Record<EdgeDirection, EdgeMeasurement[]> = {
    rising: probeEdges.filter((x) => x.direction === 'rising'),
    falling: probeEdges.filter((x) => x.direction === 'falling'),
  };
  const ptr: Record<EdgeDirection, number> = { rising: 0, falling: 0 };
  const out: DelayMeasurement[] = [];
  for (let si = 0; si < sourceEdges.length; si++) {
    const s = sourceEdges[si]!;
    const reasons: DelayReasons = {};
    const lo = s.t50 - early;
    const hi = nextSame[si] ? nextSame[si]!.t50 - early : Infinity;
    const list = byDir[s.direction];
    while (ptr[s.direction] < list.length && list[ptr[s.direction]]!.t50 < lo) ptr[s.direction]++;
    const cand = list[ptr[s.direction]];
    const p = cand !== undefined && cand.t50 < hi ? cand : undefined;
    if (p) ptr[s.direction]++;
    const d: DelayMeasurement = {
      sourceEdge: s.number,
      probeEdge: null,
      direction: s.direction,
      sourceT50: s.t50,
      probeT50: null,
      delay50: null,
      delayThresholdFirst: null,
      delayThresholdLast: null,
      cutOff: false,
      reasons,
    };
    if (!p) {
      d.cutOff = !probeEdges.some((x) => x.t50 >= lo);
      const why =
        `no ${s.direction} probe edge follows the source edge at ${formatSI(s.t50, 's')}` +
        (d.cutOff ? ' before the end of the record' : nextSame[si] ? ' before the next source edge' : '');
      reasons.probeEdge = reasons.probeT50 = reasons.delay50 = reasons.delayThresholdFirst = reasons.delayThresholdLast = why;
      out.push(d);
      continue;
    }
    d.probeEdge = p.number;
    d.probeT50 = p.t50;
    d.delay50 = p.t50 - s.t50;
    if (!opts.thresholds) {
      reasons.delayThresholdFirst = reasons.delayThresholdLast = 'no logic thresholds given';
    } else {
      if (p.thresholdFirst !== null) d.delayThresholdFirst = p.thresholdFirst - s.t50;
      else reasons.delayThresholdFirst = p.reasons.thresholdFirst ?? 'the probe never crossed the threshold';
      if (p.thresholdLast !== null) d.delayThresholdLast = p.thresholdLast - s.t50;
      else reasons.delayThresholdLast = p.reasons.thresholdLast ?? p.reasons.thresholdFirst ?? 'the probe never crossed the threshold';
    }
    out.push(d);
  }
  return out;
}
