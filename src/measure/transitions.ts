// Transitions of a two-level waveform: a state machine over the 10 % / 90 % reference levels (IEEE
// Std 181-2011), which act as hysteresis. A rising transition is a passage from at or below 10 % to at
// or above 90 % (falling: the reverse); an excursion that crosses 50 % and returns to the state it left
// is a runt. Also: the state the waveform starts in.
import type { ReferenceLevels } from './levels.js';
import type { Runt } from './edge-types.js';
import { timeAt, type Dir, type Trace } from './trace.js';

export interface Transition {
  dir: Dir;
  /** Last sample in the origin zone (≤ 10 % rising, ≥ 90 % falling) before the transition. */
  o: number;
  /** First sample in the target zone, or −1 when the record ends first. */
  g: number;
}

/** Zone of a value: −1 at or below 10 %, +1 at or above 90 %, 0 between. */
function zoneOf(x: number, ref: ReferenceLevels): -1 | 0 | 1 {
  return x <= ref.p10 ? -1 : x >= ref.p90 ? 1 : 0;
}

/** Every transition and runt in the record, in time order. */
export function findTransitions(tr: Trace, ref: ReferenceLevels): { transitions: Transition[]; runts: Runt[] } {
  const { v, n } = tr;
  const transitions: Transition[] = [];
  const runts: Runt[] = [];
  let state: -1 | 0 | 1 = 0; // 0: not yet in a state zone
  let lastInState = -1;
  let crossedMid = false;
  let exIdx = -1; // furthest excursion since leaving the state zone
  let firstMid = -1;
  const runt = (unfinished: boolean): Runt => ({
    from: state === -1 ? 'low' : 'high',
    time: timeAt(tr, firstMid),
    peak: v[exIdx]!,
    peakTime: timeAt(tr, exIdx),
    unfinished,
  });
  for (let i = 0; i < n; i++) {
    const x = v[i]!;
    const zone = zoneOf(x, ref);
    if (zone !== 0) {
      if (state !== 0 && zone !== state) transitions.push({ dir: zone, o: lastInState, g: i });
      else if (state !== 0 && crossedMid) runts.push(runt(false));
      state = zone;
      lastInState = i;
      crossedMid = false;
      exIdx = -1;
      firstMid = -1;
    } else if (state !== 0) {
      if (exIdx < 0 || state * (v[exIdx]! - x) > 0) exIdx = i;
      const prev = v[i - 1]!;
      if (!crossedMid && -state * prev < -state * ref.p50 && -state * x >= -state * ref.p50) {
        crossedMid = true;
        firstMid = i - 1 + (ref.p50 - prev) / (x - prev);
      }
    }
  }
  // The record may end between the zones after crossing 50 %: an incomplete transition if it ends
  // past 50 %, otherwise an unfinished runt.
  if (state !== 0 && crossedMid) {
    const endPast = -state * v[n - 1]! >= -state * ref.p50;
    if (endPast) transitions.push({ dir: -state as Dir, o: lastInState, g: -1 });
    else runts.push(runt(true));
  }
  return { transitions, runts };
}

/** The state of the first sample that lies in a state zone, and that sample (−1 and null if none does). */
export function initialState(tr: Trace, ref: ReferenceLevels): { state: 'low' | 'high' | null; first: number } {
  for (let i = 0; i < tr.n; i++) {
    const zone = zoneOf(tr.v[i]!, ref);
    if (zone !== 0) return { state: zone === 1 ? 'high' : 'low', first: i };
  }
  return { state: null, first: -1 };
}
