// Junction diodes for input clamps: the Shockley equation with an emission coefficient and a series
// resistance, I = I_s·(exp((V − I·R_s)/(n·V_T)) − 1), V_T = kT/q (Sedra & Smith, Microelectronic
// Circuits, 7th ed., §4.2). With R_s > 0 the equation is solved in closed form with the Lambert W function
// (Banwell & Jayakumar, "Exact analytical solution for current flow through diode with series
// resistance", Electronics Letters 36(4), 2000), so no value ever overflows. Without R_s the exponential is
// continued linearly above x = 40 (about 1 V at n = 1), where the current is already thousands of amperes.
import type { IvPoint } from './iv-table.js';

/** Boltzmann constant (J/K) and elementary charge (C), exact in the SI since 2019. */
export const BOLTZMANN = 1.380649e-23;
export const ELEMENTARY_CHARGE = 1.602176634e-19;

/** Thermal voltage kT/q (V) at `kelvin`; 25.852 mV at 300 K. */
export function thermalVoltage(kelvin: number): number {
  return (BOLTZMANN * kelvin) / ELEMENTARY_CHARGE;
}

export interface Diode {
  /** Saturation current I_s (A). */
  is: number;
  /** Emission coefficient n (1 for an ideal junction). */
  n: number;
  /** Series resistance R_s (Ω), 0 allowed. */
  rs: number;
  /** Thermal voltage kT/q (V). */
  vt: number;
}

/**
 * Typical values for a CMOS input's ESD clamp diode (common practice, not from a datasheet): I_s = 1e-15 A,
 * n = 1.1, R_s = 5 Ω at 300 K. Such a clamp conducts about 1 mA at 0.8 V and is limited by R_s beyond.
 */
export function typicalCmosClamp(): Diode {
  return { is: 1e-15, n: 1.1, rs: 5, vt: thermalVoltage(300) };
}

const X_LINEAR = 40;

/** W(e^y), the principal branch of Lambert's W at e^y, for any real y, by Newton's method on w + ln w = y. */
export function lambertWOfExp(y: number): number {
  if (y < -700) return Math.exp(y);
  let w = y < 1 ? Math.exp(y) / (1 + Math.exp(y)) : y - Math.log(y);
  for (let k = 0; k < 60; k++) {
    const next = (w * (1 + y - Math.log(w))) / (1 + w);
    if (Math.abs(next - w) <= 1e-15 * Math.max(1, next)) return next;
    w = next;
  }
  return w;
}

/** Forward current and conductance at diode voltage vd (anode − cathode). */
export function evalDiode(d: Diode, vd: number, out: IvPoint): IvPoint {
  const a = d.n * d.vt;
  if (d.rs > 0) {
    // I + I_s = (a/R_s)·W((I_s·R_s/a)·exp((V + I_s·R_s)/a))
    const y = Math.log((d.is * d.rs) / a) + (vd + d.is * d.rs) / a;
    const total = (a / d.rs) * lambertWOfExp(y);
    out.i = total - d.is;
    out.g = total / (a + d.rs * total);
    return out;
  }
  const x = vd / a;
  if (x <= X_LINEAR) {
    const e = Math.exp(x);
    out.i = d.is * (e - 1);
    out.g = (d.is * e) / a;
  } else {
    const e = Math.exp(X_LINEAR);
    out.i = d.is * (e * (1 + x - X_LINEAR) - 1);
    out.g = (d.is * e) / a;
  }
  return out;
}

/** Voltage across the diode at forward current i (> −I_s): V = n·V_T·ln(1 + I/I_s) + I·R_s. */
export function diodeVoltage(d: Diode, i: number): number {
  return d.n * d.vt * Math.log1p(i / d.is) + i * d.rs;
}
