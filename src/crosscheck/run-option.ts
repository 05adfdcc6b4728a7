// `ladderwave run --cross-check`: after the time-domain run, solve the same net spectrally, add a
// "crossCheck" section to summary.json (through the run's extendSummary hook, before anything is
// written) and add crosscheck.png to the run's files (through its extraFiles hook).
import type { Net } from '../../sim/model.js';
import type { SimResult } from '../../sim/result.js';
import type { OutputFile } from '../output/run.js';
import { addSummarySection, type Summary } from '../output/summary.js';
import { crossCheck, crossCheckSummary, type CrossCheckResult } from './crosscheck.js';
import { CROSSCHECK_FILE, renderCrossCheck } from './plot.js';

/** Largest FFT of a forced run (the default limit is sim/spectral's DEFAULT_MAX_POINTS, 2^21). */
const FORCED_MAX_POINTS = 2 ** 24;

export interface CrossCheckRun {
  /** Pass as RunOptions.extendSummary. */
  extendSummary(ctx: { net: Net; result: SimResult; summary: Summary }): Promise<void>;
  /** crosscheck.png, for RunOptions.extraFiles (written with the run's other files). */
  files(): OutputFile[];
  /** The comparison, once extendSummary has run. */
  readonly result: CrossCheckResult | undefined;
}

/** One cross-check per scenario run. `force` lifts the spectral solver's FFT size limit to 2^24 points. */
export function crossCheckRun(options: { force?: boolean; width?: number; height?: number } = {}): CrossCheckRun {
  let result: CrossCheckResult | undefined;
  let png: Buffer | undefined;
  return {
    get result() {
      return result;
    },
    async extendSummary({ net, result: td, summary }) {
      result = crossCheck(net, td, options.force ? { maxPoints: FORCED_MAX_POINTS } : {});
      addSummarySection(summary, 'crossCheck', crossCheckSummary(result));
      png = await renderCrossCheck({ title: net.title, timeDomain: td.record, check: result, width: options.width, height: options.height });
    },
    files() {
      if (!png) throw new Error('crossCheckRun.files before extendSummary');
      return [{ path: CROSSCHECK_FILE, data: png }];
    },
  };
}

/** Lines for the terminal: the largest difference per probe. */
export function formatCrossCheck(c: CrossCheckResult, file?: string): string {
  const probes = c.probes.map((p) => `${p.name} ${p.percentOfSwing.toFixed(3)} %`).join(', ');
  const worst = c.worst ? `largest ${c.worst.percentOfSwing.toFixed(3)} % of the ${+c.swing.toPrecision(4)} V swing at ${c.worst.name}` : 'no probes';
  return `  ${'spectral'.padEnd(9)}  cross-check: ${worst} (${probes})${file ? `\n  ${''.padEnd(9)}  ${file}` : ''}\n`;
}
