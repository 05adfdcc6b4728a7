// DC operating point of the ladder, the starting state of every run: inductors are shorts,
// capacitors open, the source at its initial value. The chain is solved exactly with two sweeps of
// Thevenin equivalents (one from each end), so ideal sources and zero-ohm parts need no special matrix.
import { OPEN, parallel, type Thevenin } from './thevenin.js';
import type { Ladder } from './ladder.js';

export interface DcState {
  /** Node voltages. */
  v: Float64Array;
  /** Current in branch j, from node j to node j+1. */
  branch: Float64Array;
  /** Current in each lumped branch, from its `p` end to its `q` end. */
  lumped: Float64Array;
}


function series(a: Thevenin, r: number): Thevenin {
  return a.r === Infinity || r === Infinity ? OPEN : { e: a.e, r: a.r + r };
}

export function solveDc(ladder: Ladder, source: number): DcState {
  const m = ladder.nodes;
  const seriesAt = new Int32Array(Math.max(m - 1, 0)).fill(-1);
  ladder.lumped.forEach((b, i) => {
    if (b.role === 'series') seriesAt[b.p] = i;
  });
  const branchR = (j: number): number => {
    if (ladder.isCell[j]) return ladder.cellR[j];
    const part = ladder.lumped[seriesAt[j]].part;
    return part.c !== undefined ? Infinity : part.r;
  };
  const shunt: Thevenin[] = Array.from({ length: m }, (_, k) =>
    ladder.nodeG[k] > 0 ? { e: 0, r: 1 / ladder.nodeG[k] } : OPEN,
  );
  for (const b of ladder.lumped) {
    if (b.role === 'series') continue;
    const node = b.role === 'driver' ? b.q : b.p;
    const e = b.role === 'driver' ? source : b.part.rail;
    const r = b.part.c !== undefined ? Infinity : b.part.r;
    shunt[node] = parallel(shunt[node], { e, r }, b.item);
  }
  const left: Thevenin[] = new Array(m);
  const right: Thevenin[] = new Array(m);
  left[0] = shunt[0];
  for (let k = 1; k < m; k++) left[k] = parallel(shunt[k], series(left[k - 1], branchR(k - 1)), `node ${k}`);
  right[m - 1] = shunt[m - 1];
  for (let k = m - 2; k >= 0; k--) right[k] = parallel(shunt[k], series(right[k + 1], branchR(k)), `node ${k}`);

  const v = new Float64Array(m);
  for (let k = 0; k < m; k++) {
    const seen = k === 0 ? right[0] : parallel(series(left[k - 1], branchR(k - 1)), right[k], `node ${k}`);
    v[k] = seen.r === Infinity ? 0 : seen.e; // a node with no DC path anywhere starts at 0 V
  }
  const branch = new Float64Array(Math.max(m - 1, 0));
  for (let j = 0; j < m - 1; j++) {
    const rTotal = left[j].r + branchR(j) + right[j + 1].r;
    const drive = left[j].e - right[j + 1].e;
    branch[j] = rTotal === Infinity || rTotal === 0 ? 0 : drive / rTotal;
  }
  return { v, branch, lumped: lumpedCurrents(ladder, source, v, branch) };
}

/** Currents in the lumped branches; a zero-ohm branch takes what Kirchhoff's current law leaves over. */
function lumpedCurrents(ladder: Ladder, source: number, v: Float64Array, branch: Float64Array): Float64Array {
  const out = new Float64Array(ladder.lumped.length);
  const m = ladder.nodes;
  // Per node: net known current leaving the node, and the ideal branches still to be given a current.
  const leaving = new Float64Array(m);
  const ideal: number[][] = Array.from({ length: m }, () => []);
  for (let k = 0; k < m; k++) {
    leaving[k] += ladder.nodeG[k] * v[k];
    if (k < m - 1) leaving[k] += branch[k];
    if (k > 0) leaving[k] -= branch[k - 1];
  }
  ladder.lumped.forEach((b, i) => {
    if (b.role === 'series') {
      out[i] = branch[b.p];
      return;
    }
    const node = b.role === 'driver' ? b.q : b.p;
    const sign = b.role === 'driver' ? -1 : 1; // the driver's current flows into its node
    if (b.part.c !== undefined) out[i] = 0;
    else if (b.part.r > 0) {
      out[i] = b.role === 'driver' ? (source - v[node]) / b.part.r : (v[node] - b.part.rail) / b.part.r;
    } else {
      ideal[node].push(i);
      return;
    }
    leaving[node] += sign * out[i];
  });
  for (let k = 0; k < m; k++) {
    const list = ideal[k];
    for (const i of list) {
      const sign = ladder.lumped[i].role === 'driver' ? -1 : 1;
      out[i] = (-sign * leaving[k]) / list.length;
    }
  }
  return out;
}

