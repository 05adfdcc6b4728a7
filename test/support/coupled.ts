// The coupled pairs of the check values (issue 12), built from their defining formulas.
import type { CoupledLine } from '../../sim/coupled/line.js';
import { fromRows, identity, solveMatrix } from '../../sim/coupled/matrix.js';

/** C = (1/(v·Z0))·[[1, −k], [−k, 1]], L = C⁻¹/v²: a homogeneous (TEM) pair, both modes at v. */
export function homogeneousPair(v = 1.5e8, z0 = 50, k = 0.1): CoupledLine {
  const c = fromRows([
    [1, -k],
    [-k, 1],
  ]).map((x) => x / (v * z0));
  const l = solveMatrix(c, identity(2), 2, 2).map((x) => x / (v * v));
  return { k: 2, l, c };
}

/** L = [[300, 45], [45, 300]] nH/m, C = [[120, −12], [−12, 120]] pF/m: a microstrip-like pair. */
export function inhomogeneousPair(): CoupledLine {
  return {
    k: 2,
    l: fromRows([
      [300e-9, 45e-9],
      [45e-9, 300e-9],
    ]),
    c: fromRows([
      [120e-12, -12e-12],
      [-12e-12, 120e-12],
    ]),
  };
}
