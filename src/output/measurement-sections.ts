// The "measurements" and "checks" sections of summary.json (written by `ladderwave run`).
import type { Net } from '../../sim/model.js';
import type { SimResult } from '../../sim/result.js';
import type { CheckResult } from '../measure/index.js';
import { addSummarySection, type Summary } from './summary.js';
import { netChecks } from '../scenario/checks.js';
import { measureNet, type NetMeasurements } from './measure-net.js';

export interface ChecksSection {
  passed: number;
  failed: number;
  results: CheckResult[];
}

/**
 * Adds "measurements" (per probe: levels, every edge, delays, noise margins, flags; see
 * docs/measurements.md) and, when the scenario has checks, "checks" to a run's summary.
 */
export function addMeasurementSections(summary: Summary, net: Net, result: SimResult, measured?: NetMeasurements): NetMeasurements {
  const m = measured ?? measureNet(net, result);
  addSummarySection(summary, 'measurements', m.measurements);
  if (netChecks(net).length > 0) {
    const passed = m.results.filter((r) => r.pass).length;
    const section: ChecksSection = { passed, failed: m.results.length - passed, results: m.results };
    addSummarySection(summary, 'checks', section);
  }
  return m;
}
