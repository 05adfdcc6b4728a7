// Measurements and checks of one simulated scenario: every probe measured with the IEEE 181 library
// (src/measure) against the driver's source waveform (for delays), with the probe's logic thresholds
// and every settling band the checks ask for; then the scenario's checks evaluated.
import type { Net } from '../../sim/model.js';
import { probeTraces, type SimResult } from '../../sim/result.js';
import { nominalLevels, signalFunction } from '../../sim/signals.js';
import {
  evaluateChecks,
  measureProbe,
  requiredSettleBands,
  type BandSpec,
  type CheckResult,
  type CheckSpec,
  type ProbeMeasurements,
} from '../measure/index.js';
import { netChecks, netLevelMethod, netThresholds } from '../scenario/checks.js';
import { netSettledLevels, type NetSettledLevels } from './net-levels.js';
import { measureCrosstalk } from '../measure/crosstalk.js';
import { aggressorSwing, quietProbes } from './crosstalk.js';
import { keyedRecord } from '../keyed.js';

export interface NetMeasurements {
  /** Per probe, in probe order. */
  measurements: Record<string, ProbeMeasurements>;
  /** The scenario's checks, in file order. */
  results: CheckResult[];
}

/** The driver's open-circuit source waveform at the record's sample instants (t = i·dtSample). */
export function sourceWaveform(net: Net, dtSample: number, samples: number): Float64Array {
  const f = signalFunction(net.driver.signal);
  const out = new Float64Array(samples);
  for (let i = 0; i < samples; i++) out[i] = f(i * dtSample);
  return out;
}

function bandKey(b: BandSpec): string {
  return 'fraction' in b ? `f${b.fraction}` : `v${b.volts}`;
}

/**
 * Measures every probe of a result and evaluates the scenario's checks. `extraChecks` are measured
 * for too (their settling bands), but only the scenario's own checks are evaluated into `results`.
 * The state levels are the net's settled levels (`settled`, computed here when not given) unless the
 * scenario asks for "levels": "histogram"; the rails are the driver's low and high level.
 */
export function measureNet(net: Net, result: SimResult, extraChecks: readonly CheckSpec[] = [], settled?: NetSettledLevels): NetMeasurements {
  const { record } = result;
  const rows = probeTraces(record);
  const samples = record.values.shape[1];
  const source = sourceWaveform(net, record.dtSample, samples);
  const sourceNominal = nominalLevels(net.driver.signal);
  const checks = netChecks(net);
  const all = [...checks, ...extraChecks];
  const measurements = keyedRecord<ProbeMeasurements>();
  const levels = netLevelMethod(net) === 'settled' ? (settled ?? netSettledLevels(net, result.discretization)) : undefined;
  const quiet = quietProbes(net);
  const swing = quiet.size ? aggressorSwing(net) : null;
  record.names.forEach((name, p) => {
    const seen = new Set<string>();
    const bands = requiredSettleBands(all, name).filter((b) => !seen.has(bandKey(b)) && seen.add(bandKey(b)));
    const thresholds = netThresholds(net, name);
    const pair = levels?.get(name);
    measurements[name] = measureProbe(rows[p], record.dtSample, {
      source,
      sourceNominal,
      rails: sourceNominal,
      ...(pair ? { settled: pair } : {}),
      settleBands: bands,
      ...(thresholds ? { thresholds } : {}),
    });
    if (quiet.has(name)) measurements[name].crosstalk = measureCrosstalk(rows[p], record.dtSample, swing);
  });
  return { measurements, results: evaluateChecks(checks, measurements) };
}
