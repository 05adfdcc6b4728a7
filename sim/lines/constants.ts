// Physical constants and material values used by the line models. Plain SI numbers.

/** Speed of light in vacuum (m/s). Exact by definition of the metre (SI, 1983; CODATA 2018). */
export const C0 = 299_792_458;

/**
 * Vacuum permeability µ0 (H/m), CODATA 2018 recommended value 1.256 637 062 12 × 10⁻⁶.
 * (Since the 2019 SI revision it is measured, not exactly 4π × 10⁻⁷; the two differ by 5 × 10⁻¹⁰.)
 */
export const MU0 = 1.25663706212e-6;

/** Vacuum permittivity ε0 = 1/(µ0 c0²) (F/m), ≈ 8.8541878128 × 10⁻¹² (CODATA 2018). */
export const EPS0 = 1 / (MU0 * C0 * C0);

/** Wave impedance of free space η0 = µ0 c0 ≈ 376.730 Ω. */
export const ETA0 = MU0 * C0;

/**
 * Conductivity of copper, 5.8 × 10⁷ S/m: the International Annealed Copper Standard (IACS, 1913),
 * 100 % IACS = resistivity 1.7241 µΩ·cm at 20 °C, i.e. 58.0 MS/m. The value used by Pozar,
 * *Microwave Engineering* (appendix, 5.813 × 10⁷) and by most line calculators rounds to the same.
 */
export const COPPER_CONDUCTIVITY = 5.8e7;

/** Nepers to decibels: 20·log10(e) ≈ 8.685 889 638. */
export const DB_PER_NEPER = 20 / Math.LN10;

/** One inch in metres (exact). */
export const INCH = 0.0254;
