// A rational model of an N-port with common poles: H(s) = D + Σ_k R_k/(s − a_k), each R_k an n×n
// complex residue matrix. Complex poles come in conjugate pairs with conjugate residues (so that h(t)
// is real); a pair is stored once, by its member with Im a > 0.

export interface RationalModel {
  ports: number;
  /** Poles, re/im interleaved: real poles with im = 0, a complex pair by its member with im > 0. */
  poles: Float64Array;
  /** Residue matrices, one n×n complex matrix per stored pole (re/im interleaved, row-major). */
  residues: Float64Array;
  /** Direct term D (real n×n, row-major). */
  d: Float64Array;
}

/** True when the stored pole k stands for a conjugate pair. */
export function isPair(m: RationalModel, k: number): boolean {
  return m.poles[2 * k + 1] !== 0;
}

/** Number of stored poles. */
export function poleCount(m: RationalModel): number {
  return m.poles.length / 2;
}

/** Order of the model: real poles count once, pairs twice. */
export function modelOrder(m: RationalModel): number {
  let n = 0;
  for (let k = 0; k < poleCount(m); k++) n += isPair(m, k) ? 2 : 1;
  return n;
}

/** H(jω) entry by entry into `out` (n×n complex, re/im interleaved). */
export function evaluateModel(m: RationalModel, omega: number, out: Float64Array = new Float64Array(2 * m.ports * m.ports)): Float64Array {
  const nn = m.ports * m.ports;
  for (let e = 0; e < nn; e++) {
    out[2 * e] = m.d[e];
    out[2 * e + 1] = 0;
  }
  for (let k = 0; k < poleCount(m); k++) {
    const ar = m.poles[2 * k];
    const ai = m.poles[2 * k + 1];
    // 1/(jω − a) and, for a pair, 1/(jω − ā)
    const d1r = -ar;
    const d1i = omega - ai;
    const q1 = d1r * d1r + d1i * d1i;
    const d2i = omega + ai;
    const q2 = d1r * d1r + d2i * d2i;
    const pair = ai !== 0;
    for (let e = 0; e < nn; e++) {
      const rr = m.residues[2 * (k * nn + e)];
      const ri = m.residues[2 * (k * nn + e) + 1];
      // r/(jω − a) = r·conj(d1)/|d1|²
      out[2 * e] += (rr * d1r + ri * d1i) / q1;
      out[2 * e + 1] += (ri * d1r - rr * d1i) / q1;
      if (pair) {
        // conj(r)/(jω − ā)
        out[2 * e] += (rr * d1r - ri * d2i) / q2;
        out[2 * e + 1] += (-ri * d1r - rr * d2i) / q2;
      }
    }
  }
  return out;
}
