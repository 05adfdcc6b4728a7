// The characteristic impedance a line is reported with, the same figure wherever it is printed (the
// `line` command, summary.json, the report): for a line with frequency-dependent loss, its quasi-static
// Z0 at the frequency its description is given at, and the high-frequency limit Z0∞ beside it; for a
// line of constant R′, L′, G′, C′ the one value √(L′/C′), which holds at every frequency (apart from
// the loss, which the formula leaves out, as the lattice method does).
import type { LineRLGC } from '../model.js';
import { highFrequencyLimit, losslessZ0 } from './freq-model.js';

export interface LineImpedance {
  /** Z0 (ohm): quasi-static at `at` for a frequency-dependent line, √(L′/C′) for a constant one. */
  z0: number;
  /**
   * What `z0` is: 'quasi-static' at `at`; 'constant' (√(L′/C′), every frequency); or 'high-frequency
   * limit' for a frequency-dependent line whose reference frequency is not known.
   */
  basis: 'quasi-static' | 'constant' | 'high-frequency limit';
  /** The frequency (Hz) `z0` holds at; null unless the basis is quasi-static. */
  at: number | null;
  /** The high-frequency limit √(L∞/C∞) (ohm): what the first instant of a fast edge meets. */
  highFrequency: number;
}

export function lineImpedance(line: LineRLGC): LineImpedance {
  const wb = line.wideband;
  if (!wb) {
    const z0 = Math.sqrt(line.l / line.c);
    return { z0, basis: 'constant', at: null, highFrequency: z0 };
  }
  const highFrequency = highFrequencyLimit(wb).z0;
  if (wb.at === undefined) return { z0: highFrequency, basis: 'high-frequency limit', at: null, highFrequency };
  return { z0: losslessZ0(wb, wb.at), basis: 'quasi-static', at: wb.at, highFrequency };
}
