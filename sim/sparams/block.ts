// A Touchstone block's time-domain model in one call: its S-parameters fitted by vector fitting with
// the order raised until the fit is within tolerance, and the passivity of the data and of the fit.
import type { NetworkData } from './network.js';
import { toKind } from './network.js';
import { passivityAboveBand, passivityOfData, passivityOfFit, type PassivityReport } from './passivity.js';
import { vectorFit, type FitOptions, type FitResult } from './vector-fit.js';

export interface BlockFitOptions extends FitOptions {
  /** Largest |S − fit| accepted when the order is chosen automatically (default 1e-3). */
  tolerance?: number;
  /** Highest order tried (default 30). */
  maxOrder?: number;
}

export interface BlockFit {
  fit: FitResult;
  /** Passivity of the data at its samples. */
  data: PassivityReport;
  /** Passivity of the fitted model on a fine grid over the data's band. */
  model: PassivityReport;
  /** Passivity of the fitted model above the band, up to twice the top frequency (unconstrained by data). */
  beyondBand: PassivityReport;
  /** Orders tried, with their worst errors. */
  tried: Array<{ order: number; worstError: number }>;
}

/** Fits the S-parameters of `net` (converted to S if given as Y or Z). */
export function fitBlock(net: NetworkData, opts: BlockFitOptions = {}): BlockFit {
  const s = toKind(net, 'S');
  const tolerance = opts.tolerance ?? 1e-3;
  const orders = opts.order !== undefined ? [opts.order] : Array.from({ length: Math.floor((opts.maxOrder ?? 30) / 2) }, (_, k) => 2 * (k + 1));
  const tried: BlockFit['tried'] = [];
  let best: FitResult | undefined;
  for (const order of orders) {
    if (2 * s.freq.length * s.ports * s.ports < order + 1) break;
    const fit = vectorFit(s, { ...opts, order });
    tried.push({ order, worstError: fit.worstError });
    if (!best || fit.worstError < best.worstError) best = fit;
    if (fit.worstError <= tolerance) break;
  }
  if (!best) throw new RangeError(`${s.freq.length} frequencies are too few to fit`);
  const top = s.freq[s.freq.length - 1];
  return { fit: best, data: passivityOfData(s), model: passivityOfFit(best, s.freq), beyondBand: passivityAboveBand(best, top), tried };
}
