// Settling: from the 50 % instant to the instant after which the waveform stays within ±band of the
// final state level, up to the end of the state (the next transition's departure) or of the record.
// Also whether the waveform had settled before an edge began.
import { bandVolts, type BandSpec, type SettlingResult } from './edge-types.js';
import { stateEndBefore, type EdgeSpan } from './spans.js';
import { crossIndex, timeAt, type Dir, type Trace } from './trace.js';

function pct(p: number): string {
  return `${Number(p.toPrecision(4))} %`;
}

/** Settling time into one band, for a complete edge. */
export function settlingTime(tr: Trace, s: EdgeSpan, band: BandSpec, amplitude: number): SettlingResult {
  const v = tr.v;
  const bandV = bandVolts(band, amplitude);
  const bandPct = (100 * bandV) / amplitude;
  const inBand = (i: number): boolean => Math.abs(v[i]! - s.toLevel) <= bandV;
  if (!inBand(s.stateEnd)) {
    const when = s.hasNext ? 'when the next transition began' : 'at the end of the record';
    return { bandV, bandPct, time: null, settledAt: null, reason: `still outside the ±${pct(bandPct)} band ${when}` };
  }
  let q = -1;
  for (let i = s.stateEnd - 1; i >= s.o && q < 0; i--) if (!inBand(i)) q = i;
  const t50 = timeAt(tr, s.c50);
  if (q < 0) return { bandV, bandPct, time: 0, settledAt: t50 };
  const boundary = v[q]! > s.toLevel ? s.toLevel + bandV : s.toLevel - bandV;
  const at = timeAt(tr, crossIndex(v, q, boundary));
  return { bandV, bandPct, time: Math.max(0, at - t50), settledAt: at };
}

/** Settling of an edge the record cut off: nothing can be measured. */
export function settlingCutOff(band: BandSpec, amplitude: number): SettlingResult {
  const bandV = bandVolts(band, amplitude);
  return { bandV, bandPct: (100 * bandV) / amplitude, time: null, settledAt: null, reason: 'the record ends during this transition' };
}

/**
 * Whether every sample from the record's start to where the first edge departs (its monotone
 * departure from the initial level left out) lies within ±band of that level.
 */
export function settledFromStart(tr: Trace, s: EdgeSpan, band: BandSpec, amplitude: number): boolean {
  const bandV = bandVolts(band, amplitude);
  const end = stateEndBefore(tr, s.o, 0, -s.dir as Dir, s.fromLevel, null);
  for (let i = 0; i <= end; i++) if (Math.abs(tr.v[i]! - s.fromLevel) > bandV) return false;
  return true;
}
