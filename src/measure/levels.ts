// State levels of a two-level waveform, IEEE Std 181-2011 (transitions, pulses and related waveforms),
// histogram-mode method: the histogram of all sample values between the waveform's minimum and maximum
// is split at its midpoint into a lower and an upper half; the low state level is the mode of the lower
// half, the high state level the mode of the upper half. Specified levels override it (IEEE 181
// allows specified reference levels): nominal ones, or the levels the net settles to (its DC
// operating point for the source's two levels, computed by the engine).

export type Samples = ArrayLike<number>;

export interface LevelOptions {
  /** Nominal low state level (V); overrides the histogram estimate of the low level. */
  low?: number;
  /** Nominal high state level (V); overrides the histogram estimate of the high level. */
  high?: number;
  /** The levels the net settles to (V); override both the histogram and the nominal levels. */
  settled?: { low: number; high: number };
  /** Number of histogram bins across [min, max]; default 100 (even numbers split cleanly). */
  bins?: number;
  /**
   * Smallest amplitude (V) treated as a two-level signal. Below it the waveform is "flat" and has no
   * edges. Default 1e-9 V + 1e-9 · max(|min|, |max|).
   */
  minAmplitude?: number;
}

export interface ReferenceLevels {
  /** Volts at 10, 20, 50, 80 and 90 % of the amplitude above the low state level. */
  p10: number;
  p20: number;
  p50: number;
  p80: number;
  p90: number;
}

/** How a state level was found: histogram mode, given nominal value, or the net's settled (DC) level. */
export type LevelSource = 'histogram' | 'nominal' | 'settled';

export interface StateLevels {
  low: number;
  high: number;
  /** high − low (V), the waveform amplitude of IEEE 181. */
  amplitude: number;
  /** Where each level came from. */
  lowSource: LevelSource;
  highSource: LevelSource;
  /** Number of histogram bins used (0 when both levels are nominal). */
  bins: number;
  /** True when the amplitude is below `minAmplitude`: no transitions can be measured. */
  flat: boolean;
  reference: ReferenceLevels;
}

export const DEFAULT_BINS = 100;

export function referenceLevels(low: number, high: number): ReferenceLevels {
  const a = high - low;
  return {
    p10: low + 0.1 * a,
    p20: low + 0.2 * a,
    p50: low + 0.5 * a,
    p80: low + 0.8 * a,
    p90: low + 0.9 * a,
  };
}

/** Minimum and maximum with their sample indices; throws on an empty array. */
export function extremes(values: Samples): { min: number; max: number; iMin: number; iMax: number } {
  const n = values.length;
  if (n === 0) throw new RangeError('empty waveform');
  let min = values[0]!;
  let max = min;
  let iMin = 0;
  let iMax = 0;
  for (let i = 1; i < n; i++) {
    const v = values[i]!;
    if (v < min) {
      min = v;
      iMin = i;
    } else if (v > max) {
      max = v;
      iMax = i;
    }
  }
  return { min, max, iMin, iMax };
}

function median(xs: Float64Array): number {
  xs.sort();
  const m = xs.length >> 1;
  return xs.length % 2 === 1 ? xs[m]! : 0.5 * (xs[m - 1]! + xs[m]!);
}

/**
 * Histogram-mode state levels of IEEE 181-2011. The level reported for each half is the median of
 * the samples that fall in its modal bin — a refinement of the bin centre that is exact for a flat
 * state and stays within half a bin width of it otherwise. Ties between bins of equal count go to
 * the outermost bin (lowest for the low level, highest for the high level).
 */
export function histogramLevels(values: Samples, bins = DEFAULT_BINS): { low: number; high: number } {
  const { min, max } = extremes(values);
  const range = max - min;
  if (!(range > 0)) return { low: min, high: max };
  const nb = Math.max(2, Math.floor(bins));
  const width = range / nb;
  const counts = new Int32Array(nb);
  const n = values.length;
  const binOf = (v: number): number => {
    const b = Math.floor((v - min) / width);
    return b < 0 ? 0 : b >= nb ? nb - 1 : b;
  };
  for (let i = 0; i < n; i++) counts[binOf(values[i]!)]!++;
  // Split at the midpoint of [min, max]: bins whose centre lies below it form the lower half.
  const half = nb >> 1;
  let lowBin = 0;
  for (let b = 1; b < half; b++) if (counts[b]! > counts[lowBin]!) lowBin = b;
  let highBin = nb - 1;
  for (let b = nb - 2; b >= half; b--) if (counts[b]! > counts[highBin]!) highBin = b;
  const inLow = new Float64Array(counts[lowBin]!);
  const inHigh = new Float64Array(counts[highBin]!);
  let nl = 0;
  let nh = 0;
  for (let i = 0; i < n; i++) {
    const v = values[i]!;
    const b = binOf(v);
    if (b === lowBin) inLow[nl++] = v;
    else if (b === highBin) inHigh[nh++] = v;
  }
  return { low: median(inLow), high: median(inHigh) };
}

/** State levels (low, high, amplitude) per IEEE 181 histogram-mode, with nominal overrides. */
export function stateLevels(values: Samples, opts: LevelOptions = {}): StateLevels {
  if (values.length === 0) throw new RangeError('empty waveform');
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i]!)) throw new RangeError(`sample ${i} is not a finite number`);
  }
  const bins = opts.bins ?? DEFAULT_BINS;
  const given = { low: opts.settled?.low ?? opts.low, high: opts.settled?.high ?? opts.high };
  const givenSource: LevelSource = opts.settled ? 'settled' : 'nominal';
  const needHist = given.low === undefined || given.high === undefined;
  const hist = needHist ? histogramLevels(values, bins) : undefined;
  const low = given.low ?? hist!.low;
  const high = given.high ?? hist!.high;
  if (!Number.isFinite(low) || !Number.isFinite(high)) throw new RangeError('state levels must be finite');
  const { min, max } = extremes(values);
  const minAmplitude = opts.minAmplitude ?? 1e-9 + 1e-9 * Math.max(Math.abs(min), Math.abs(max));
  const amplitude = high - low;
  return {
    low,
    high,
    amplitude,
    lowSource: given.low === undefined ? 'histogram' : givenSource,
    highSource: given.high === undefined ? 'histogram' : givenSource,
    bins: needHist ? Math.max(2, Math.floor(bins)) : 0,
    flat: !(amplitude > minAmplitude),
    reference: referenceLevels(low, high),
  };
}
