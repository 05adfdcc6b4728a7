// The spectral cross-check of a run: the same net solved a second, independent way (chain matrices
// of every line from its exact Z′(jω), Y′(jω), and a numerical Laplace transform; sim/spectral),
// compared sample by sample with the time-domain result. Reported per probe: the largest difference,
// as a percent of the signal's swing, and when it occurs.
//
// The two solvers share only the net description and the source waveform. A difference measures
// the time-domain solver's discretization plus the fit of its auxiliary loss states (sim/realize.ts)
// against the exact frequency-dependent model; for lossless and constant-loss lines it is the
// discretization alone.
import type { Net } from '../../sim/model.js';
import type { ProbeRecord, SimResult } from '../../sim/result.js';
import { nominalLevels } from '../../sim/signals.js';
import { compareRecords, spectralRun, type SpectralOptions, type SpectralPlan } from '../../sim/spectral/index.js';
import { keyedRecord } from '../keyed.js';

export interface CrossCheckProbe {
  name: string;
  /** Largest |time domain − spectral| (V). */
  maxAbs: number;
  /** maxAbs as a percent of the swing. */
  percentOfSwing: number;
  /** When the largest difference occurs (s). */
  time: number;
}

export interface CrossCheckResult {
  /** The swing differences are measured against (V): the signal's high − low level. */
  swing: number;
  /** Where the swing came from: the signal's levels, or (for a flat signal) the probes' range. */
  swingFrom: 'signal' | 'probes' | 'unit';
  probes: CrossCheckProbe[];
  /** The probe with the largest difference (undefined when there are no probes). */
  worst?: CrossCheckProbe;
  /** The spectral solution on the time-domain record's sample grid. */
  spectral: ProbeRecord;
  /** FFT grid, window and damping the spectral solver used. */
  plan: SpectralPlan;
}

/** The swing for percentages: high − low of the driver's signal (IEEE 181 nominal levels). */
export function signalSwing(net: Net, record?: ProbeRecord): { swing: number; from: CrossCheckResult['swingFrom'] } {
  const { low, high } = nominalLevels(net.driver.signal);
  if (high - low > 0) return { swing: high - low, from: 'signal' };
  if (record) {
    let lo = Infinity;
    let hi = -Infinity;
    for (const v of record.values.data) {
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
    if (hi - lo > 0) return { swing: hi - lo, from: 'probes' };
  }
  return { swing: 1, from: 'unit' };
}

/**
 * Solves `net` with the spectral solver on the sample grid of `result` (a time-domain run of the
 * same net) and compares every probe. `options` tunes the spectral solver (FFT steps per edge,
 * padding, wrap-around bound, size limit); it throws RunRefused when the FFT would be too large.
 */
export function crossCheck(net: Net, result: Pick<SimResult, 'record'>, options: Partial<Omit<SpectralOptions, 'dtSample' | 'samples'>> = {}): CrossCheckResult {
  const { record } = result;
  const samples = record.values.shape[1];
  const run = spectralRun(net, { ...options, dtSample: record.dtSample, samples });
  const { swing, from } = signalSwing(net, record);
  const probes = compareRecords(record, run.record, swing).map((d) => ({ name: d.name, maxAbs: d.maxAbs, percentOfSwing: d.percentOfSwing, time: d.time }));
  const worst = probes.reduce<CrossCheckProbe | undefined>((w, p) => (!w || p.percentOfSwing > w.percentOfSwing ? p : w), undefined);
  return { swing, swingFrom: from, probes, worst, spectral: run.record, plan: run.plan };
}

/** The `crossCheck` section of summary.json (SI units; nothing that changes between runs). */
export interface CrossCheckSection {
  method: string;
  swing: number;
  swingFrom: CrossCheckResult['swingFrom'];
  largestPercentOfSwing: number;
  largestAt: string | null;
  probes: Record<string, { maxAbs: number; percentOfSwing: number; time: number }>;
  spectral: { fftPoints: number; step: number; window: number; sigma: number; wrapBound: number };
}

export function crossCheckSummary(c: CrossCheckResult): CrossCheckSection {
  const probes = keyedRecord<{ maxAbs: number; percentOfSwing: number; time: number }>();
  for (const p of c.probes) probes[p.name] = { maxAbs: p.maxAbs, percentOfSwing: p.percentOfSwing, time: p.time };
  return {
    method: 'spectral: chain (ABCD) matrices of the exact per-length models, numerical Laplace transform (damped FFT)',
    swing: c.swing,
    swingFrom: c.swingFrom,
    largestPercentOfSwing: c.worst?.percentOfSwing ?? 0,
    largestAt: c.worst?.name ?? null,
    probes,
    spectral: { fftPoints: c.plan.points, step: c.plan.step, window: c.plan.window, sigma: c.plan.sigma, wrapBound: c.plan.wrapBound },
  };
}
