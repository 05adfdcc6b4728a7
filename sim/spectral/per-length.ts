// Per-unit-length series impedance Z'(s) and shunt admittance Y'(s) of a line item, evaluated at a
// complex frequency s = σ + jω (the Laplace variable; s = jω on the frequency axis). The spectral
// solver evaluates every line here and nowhere else, so a new line model only has to be added in
// this one function.
//
// Constant model (LineRLGC): Z'(s) = R' + s·L', Y'(s) = G' + s·C' — the telegrapher equations'
// per-unit-length impedance and admittance (Pozar, Microwave Engineering, ch. 2, with jω → s).
import type { LineRLGC } from '../model.js';

export interface Complex {
  re: number;
  im: number;
}

export interface PerLength {
  /** Series impedance per metre Z'(s) (ohm/m). */
  z: Complex;
  /** Shunt admittance per metre Y'(s) (S/m). */
  y: Complex;
}

/**
 * Z'(s) and Y'(s) of `line` at the complex frequency `s` (rad/s; `{ re: 0, im: ω }` on the jω axis).
 * The spectral solver calls it at s = σ + jω with a small damping σ > 0 (numerical Laplace transform).
 */
export function perLength(line: LineRLGC, s: Complex): PerLength {
  return {
    z: { re: line.r + s.re * line.l, im: s.im * line.l },
    y: { re: line.g + s.re * line.c, im: s.im * line.c },
  };
}
