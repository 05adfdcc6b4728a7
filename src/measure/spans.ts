// The stretch of record each edge's metrics look at: where the edge starts, where it crosses 50 %,
// where the state that follows it ends (before the next transition's departure), and its levels.
import type { ReferenceLevels, StateLevels } from './levels.js';
import type { Transition } from './transitions.js';
import { firstCrossing, type Dir, type Trace } from './trace.js';

export interface EdgeSpan {
  /** Position in the record's list of edges (0-based). */
  k: number;
  dir: Dir;
  /** Last sample in the origin zone before the edge. */
  o: number;
  /** First sample in the target zone; −1 when the record ends first (an incomplete edge). */
  g: number;
  complete: boolean;
  /** Fractional index of the first 50 % crossing in the edge's direction after `o`. */
  c50: number;
  /** The previous edge's `c50` (null for the first edge). */
  prevC50: number | null;
  /** Last sample before the next edge's 50 % crossing (the last sample of the record after the last edge). */
  jEnd: number;
  /** Last sample that counts for crossings: the next edge's `o`, or the end of the new state's zone. */
  crossEnd: number;
  /** Last sample of the state that follows the edge (meaningful for complete edges). */
  stateEnd: number;
  /** Whether another edge follows. */
  hasNext: boolean;
  fromLevel: number;
  toLevel: number;
}

/**
 * End of the state that follows an edge: the last sample before the next transition's departure.
 * Walks back from `j`: when a next transition is known to follow, first over samples outside the
 * state zone (short of `zoneEdge`: whatever the waveform did after it last left the zone belongs to
 * that transition, even when a reflection still arriving from before makes it wobble); then over
 * samples that are short of the state level and no further from it than their predecessor (the
 * departure's monotone start); never before `lo`.
 */
export function stateEndBefore(tr: Trace, j: number, lo: number, dir: Dir, level: number, zoneEdge: number | null): number {
  const v = tr.v;
  let s = j;
  if (zoneEdge !== null) while (s > lo && dir * v[s]! < dir * zoneEdge) s--;
  while (s > lo && dir * v[s]! < dir * level && dir * v[s]! <= dir * v[s - 1]!) s--;
  return s;
}

/** The span of every transition (in order), with the two state levels as the edges' levels. */
export function edgeSpans(tr: Trace, transitions: readonly Transition[], levels: Pick<StateLevels, 'low' | 'high' | 'reference'>): EdgeSpan[] {
  const ref: ReferenceLevels = levels.reference;
  const n = tr.n;
  // Every edge passes the 50 % level by construction, so the crossing is always found.
  const c50s = transitions.map((e) => firstCrossing(tr, e.o, e.g >= 0 ? e.g : n - 1, ref.p50, e.dir));
  return transitions.map((e, k) => {
    const next = transitions[k + 1];
    const rising = e.dir === 1;
    const toLevel = rising ? levels.high : levels.low;
    const endZone = rising ? ref.p90 : ref.p10;
    const jEnd = next ? Math.floor(c50s[k + 1]!) : n - 1;
    // After the last edge, a record that ends outside the new state's zone ends during a departure
    // that never reached 50 %: crossings are counted, and the state ends, before that departure.
    const endsOutside = !next && e.g >= 0 && e.dir * tr.v[n - 1]! < e.dir * endZone;
    let crossEnd = next ? next.o : n - 1;
    if (endsOutside) while (crossEnd > e.g && e.dir * tr.v[crossEnd]! < e.dir * endZone) crossEnd--;
    const stateEnd = next
      ? stateEndBefore(tr, jEnd, Math.min(jEnd, Math.max(e.g, 0)), e.dir, toLevel, endZone)
      : endsOutside
        ? stateEndBefore(tr, n - 1, e.g, e.dir, toLevel, null)
        : n - 1;
    return {
      k,
      dir: e.dir,
      o: e.o,
      g: e.g,
      complete: e.g >= 0,
      c50: c50s[k]!,
      prevC50: k > 0 ? c50s[k - 1]! : null,
      jEnd,
      crossEnd,
      stateEnd,
      hasNext: next !== undefined,
      fromLevel: rising ? levels.low : levels.high,
      toLevel,
    };
  });
}
