// Coupled sections from geometry: the even/odd-mode formulas of sim/lines (Kirschning–Jansen coupled
// microstrip, Cohn coupled stripline) turned into L and C matrices of a symmetric pair (line.ts,
// pairFromModes: L11 ± L12 = Z·τ, C11 ± C12 = τ/Z per mode). Quasi-static and lossless: strip thickness,
// conductor and dielectric loss and dispersion are not modelled for coupled sections (docs/coupled-lines.md).
import { analyzeCoupledMicrostrip, type CoupledMicrostripAnalysis, type CoupledMicrostripGeometry } from '../lines/coupled-microstrip.js';
import { analyzeCoupledStripline, type CoupledStriplineAnalysis, type CoupledStriplineGeometry } from '../lines/coupled-stripline.js';
import { pairFromModes, type CoupledLine } from './line.js';

export function coupledFromMicrostrip(g: CoupledMicrostripGeometry): { line: CoupledLine; analysis: CoupledMicrostripAnalysis } {
  const analysis = analyzeCoupledMicrostrip(g);
  const line = pairFromModes({ zOdd: analysis.zOdd, zEven: analysis.zEven, delayOdd: analysis.delayOdd, delayEven: analysis.delayEven });
  return { line, analysis };
}

export function coupledFromStripline(g: CoupledStriplineGeometry): { line: CoupledLine; analysis: CoupledStriplineAnalysis } {
  const analysis = analyzeCoupledStripline(g);
  const d = analysis.delayPerMeter;
  return { line: pairFromModes({ zOdd: analysis.zOdd, zEven: analysis.zEven, delayOdd: d, delayEven: d }), analysis };
}
