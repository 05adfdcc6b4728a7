// Ringback and the level a state actually held. After an edge has crossed a level, the worst level
// of the new state is the lowest value that came after a higher one (a dip), or the value where the
// state ends, whichever is lower (mirrored for a falling edge). Measured from the far reference level
// (90 % rising, 10 % falling) it gives the ringback depth below the settled level; measured from the
// logic threshold (vih rising, vil falling) it gives the ringback margin, the edge's noise margin.
import type { LogicLevels, EdgeMeasurement, EdgeReasons } from './edge-types.js';
import type { EdgeSpan } from './spans.js';
import { timeAt, type Dir, type Trace } from './trace.js';
import { formatSI } from './format.js';
import { aberration } from './aberrations.js';

/**
 * Over samples [from, to]: the lowest value more than `tol` below the running maximum (a dip; null
 * when the stretch never turns back by more than that), and the worst level held — the lowest value that is not a new maximum
 * (a dip or a flat stretch), or the value at `to`, whichever is lower — with their samples (mirrored
 * for dir −1).
 */
export function heldExtreme(tr: Trace, from: number, to: number, dir: Dir, tol = 0): { dip: number | null; dipIndex: number; value: number; index: number } {
  let runMax = -Infinity;
  let dip = Infinity;
  let dipIndex = -1;
  let worst = dir * tr.v[to]!;
  let index = to;
  for (let i = Math.min(from, to); i <= to; i++) {
    const u = dir * tr.v[i]!;
    if (u > runMax) {
      runMax = u;
      continue;
    }
    if (u < runMax - tol && u < dip) {
      dip = u;
      dipIndex = i;
    }
    if (u < worst) {
      worst = u;
      index = i;
    }
  }
  return { dip: dipIndex < 0 ? null : dir * dip, dipIndex, value: dir * worst, index };
}

type Depth = Pick<EdgeMeasurement, 'ringbackV' | 'ringbackPct' | 'ringbackTime' | 'ringbackLevel'>;

/**
 * Ringback depth of a complete edge: after it first reached the far reference level (its first
 * sample in the target zone), how far the waveform came back below the final state level,
 * max(0, final level − lowest dip) (mirrored for falling), in volts and % of the amplitude. A
 * waveform that only approaches its level, without turning back, has no ringback (a staircase of
 * ledges below the level is an unsettled edge, not ringback).
 */
export function ringbackDepth(tr: Trace, s: EdgeSpan, amplitude: number): Depth & { reasons: EdgeReasons } {
  // A turn back by less than 1 ppm of the amplitude is rounding on a plateau, not ringback.
  const held = heldExtreme(tr, s.g, s.stateEnd, s.dir, 1e-6 * amplitude);
  const depth = held.dip === null ? 0 : aberration(s.dir * (s.toLevel - held.dip), amplitude);
  const reasons: EdgeReasons = depth > 0 ? {} : { ringbackTime: 'no ringback', ringbackLevel: 'no ringback' };
  return {
    ringbackV: depth,
    ringbackPct: (100 * depth) / amplitude,
    ringbackTime: depth > 0 ? timeAt(tr, held.dipIndex) : null,
    ringbackLevel: depth > 0 ? held.dip : null,
    reasons,
  };
}

type Margin = Pick<EdgeMeasurement, 'stateExtreme' | 'stateExtremeTime' | 'noiseMargin' | 'ringbackMarginV' | 'reentersUndefinedBand' | 'reachesOppositeLevel'>;

/** The name of an edge's threshold for messages: "vih (2 V)", or "the 50 % level". */
export function thresholdName(dir: Dir, threshold: number, thresholds: LogicLevels | undefined): string {
  return thresholds ? `${dir === 1 ? 'vih' : 'vil'} (${formatSI(threshold, 'V')})` : 'the 50 % level';
}

/**
 * The held extreme of a complete edge's new state from its first threshold crossing `first` (from
 * the 50 % crossing when it never crossed), and with thresholds the noise margin, the ringback margin
 * and whether the state fell back into the undefined band or past the opposite threshold.
 */
export function ringbackMargin(tr: Trace, s: EdgeSpan, thresholds: LogicLevels | undefined, first: number): Margin & { reasons: EdgeReasons } {
  const reasons: EdgeReasons = {};
  const crossed = first >= 0;
  const held = heldExtreme(tr, crossed ? Math.ceil(first) : Math.floor(s.c50) + 1, s.stateEnd, s.dir);
  const out: Margin = {
    stateExtreme: held.value,
    stateExtremeTime: timeAt(tr, held.index),
    noiseMargin: null,
    ringbackMarginV: null,
    reentersUndefinedBand: null,
    reachesOppositeLevel: null,
  };
  if (!thresholds) {
    reasons.noiseMargin = reasons.ringbackMarginV = reasons.reentersUndefinedBand = reasons.reachesOppositeLevel = 'no logic thresholds given';
    return { ...out, reasons };
  }
  const { vih, vil } = thresholds;
  const rising = s.dir === 1;
  out.noiseMargin = rising ? held.value - vih : vil - held.value;
  if (crossed) {
    out.ringbackMarginV = out.noiseMargin;
    out.reentersUndefinedBand = rising ? held.value < vih : held.value > vil;
    out.reachesOppositeLevel = rising ? held.value <= vil : held.value >= vih;
  } else {
    const why = `never crossed ${thresholdName(s.dir, rising ? vih : vil, thresholds)}`;
    reasons.ringbackMarginV = reasons.reentersUndefinedBand = reasons.reachesOppositeLevel = why;
  }
  return { ...out, reasons };
}
