// Network data of an N-port sampled at a list of frequencies: what a Touchstone file holds once its
// number format and normalization are undone, and what the exporter produces.
import { convertMatrix, type ParamKind } from './convert.js';
import { largestSingularValue, type CMatrix } from './cmatrix.js';

export interface NetworkData {
  ports: number;
  /** Frequencies (Hz), strictly increasing. */
  freq: Float64Array;
  kind: ParamKind;
  /**
   * One n×n matrix per frequency: entry (i, j) at frequency k is data[2((k·n + i)·n + j)] (re) and
   * the next element (im). S dimensionless, Y in siemens, Z in ohms.
   */
  data: Float64Array;
  /** Reference resistance of each port (Ω): the S-parameters are normalized to these. */
  reference: Float64Array;
}

/** The matrix at frequency index k (a copy). */
export function matrixAt(net: NetworkData, k: number): CMatrix {
  const m = 2 * net.ports * net.ports;
  return { n: net.ports, d: net.data.slice(k * m, (k + 1) * m) };
}

/** The same network as S, Y or Z (reference resistances unchanged). */
export function toKind(net: NetworkData, kind: ParamKind): NetworkData {
  if (net.kind === kind) return net;
  const m = 2 * net.ports * net.ports;
  const data = new Float64Array(net.data.length);
  for (let k = 0; k < net.freq.length; k++) data.set(convertMatrix(matrixAt(net, k), net.kind, kind, net.reference).d, k * m);
  return { ...net, kind, data };
}

/** S-parameters renormalized to new reference resistances (through Z when possible, else through Y). */
export function renormalize(net: NetworkData, reference: ArrayLike<number>): NetworkData {
  const ref = Float64Array.from(reference);
  if (ref.length !== net.ports) throw new RangeError(`${ref.length} reference resistances for ${net.ports} ports`);
  const s = toKind(net, 'S');
  if (s.reference.every((r, i) => r === ref[i])) return s;
  const m = 2 * net.ports * net.ports;
  const data = new Float64Array(s.data.length);
  for (let k = 0; k < s.freq.length; k++) {
    const sk = matrixAt(s, k);
    let out: CMatrix;
    try {
      out = convertMatrix(convertMatrix(sk, 'S', 'Z', s.reference), 'Z', 'S', ref);
    } catch {
      out = convertMatrix(convertMatrix(sk, 'S', 'Y', s.reference), 'Y', 'S', ref);
    }
    data.set(out.d, k * m);
  }
  return { ...s, data, reference: ref };
}

/** Entry (i, j) (0-based) at every frequency, as interleaved re/im. */
export function entry(net: NetworkData, i: number, j: number): Float64Array {
  const n = net.ports;
  const out = new Float64Array(2 * net.freq.length);
  for (let k = 0; k < net.freq.length; k++) {
    const at = 2 * ((k * n + i) * n + j);
    out[2 * k] = net.data[at];
    out[2 * k + 1] = net.data[at + 1];
  }
  return out;
}

/** Largest singular value of S at every frequency (passivity needs ≤ 1). */
export function singularValueTrace(net: NetworkData): Float64Array {
  const s = toKind(net, 'S');
  const out = new Float64Array(s.freq.length);
  for (let k = 0; k < s.freq.length; k++) out[k] = largestSingularValue(matrixAt(s, k));
  return out;
}
