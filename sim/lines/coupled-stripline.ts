// Edge-coupled stripline: two strips of width W, edge-to-edge spacing S, centred between ground planes
// spaced b, in a homogeneous dielectric εr, zero thickness. Exact by conformal mapping:
// S. B. Cohn, "Shielded coupled-strip transmission line", IRE Trans. MTT 3(5), 1955, pp. 29–38:
//   k_e = tanh(πW/2b)·tanh(π(W + S)/2b),   k_o = tanh(πW/2b)·coth(π(W + S)/2b),
//   Z0e,o = (η0/(4√εr))·K(k′)/K(k),  k′ = √(1 − k²)   (η0/4 ≈ 30π, as in the single stripline form).
// Both modes travel at c0/√εr (homogeneous). The inverse is closed-form too: K(k′)/K(k) fixes k through
// the nome q = e^{−π·K(k′)/K(k)}, k = θ2²(q)/θ3²(q) (Jacobi's theta functions; Abramowitz & Stegun
// 16.38 and 17.3.17), and then tanh(πW/2b) = √(k_e·k_o), tanh(π(W + S)/2b) = √(k_e/k_o).
import { C0, ETA0 } from './constants.js';
import { ellipticKRatio } from './elliptic.js';
import { rangeCheck, validity, type Validity } from './validity.js';

export interface CoupledStriplineGeometry {
  /** Strip width W (m), both strips. */
  width: number;
  /** Edge-to-edge spacing S (m). */
  spacing: number;
  /** Ground-plane spacing b (m). */
  planeSpacing: number;
  /** Relative permittivity εr of the homogeneous dielectric. */
  er: number;
}

export interface CoupledStriplineAnalysis {
  zEven: number;
  zOdd: number;
  /** ε_eff of both modes (= εr). */
  epsEff: number;
  /** Delay per metre of both modes, √εr/c0 (s/m). */
  delayPerMeter: number;
  validity: Validity;
}

function checkGeometry(g: CoupledStriplineGeometry): void {
  if (!(g.width > 0) || !(g.spacing > 0) || !(g.planeSpacing > 0) || !(g.er >= 1) || !Number.isFinite(g.er)) {
    throw new RangeError(`coupled stripline: need width > 0, spacing > 0, planeSpacing > 0, er ≥ 1 (got width=${g.width}, spacing=${g.spacing}, planeSpacing=${g.planeSpacing}, er=${g.er})`);
  }
}

/**
 * Cohn's moduli with their complements computed without cancellation, a = πW/2b, c = π(W + S)/2b:
 * 1 ∓ tanh a·tanh c = cosh(a ∓ c)/(cosh a·cosh c), so k_e′ = √(cosh(c − a)·cosh(c + a))/(cosh a·cosh c);
 * 1 ∓ tanh a/tanh c = sinh(c ∓ a)/(cosh a·sinh c), so k_o′ = √(sinh(c − a)·sinh(c + a))/(cosh a·sinh c).
 */
function moduli(g: CoupledStriplineGeometry): { ke: number; kep: number; ko: number; kop: number } {
  const a = (Math.PI * g.width) / (2 * g.planeSpacing);
  const c = (Math.PI * (g.width + g.spacing)) / (2 * g.planeSpacing);
  return {
    ke: Math.tanh(a) * Math.tanh(c),
    kep: Math.sqrt(Math.cosh(c - a) * Math.cosh(c + a)) / (Math.cosh(a) * Math.cosh(c)),
    ko: Math.tanh(a) / Math.tanh(c),
    kop: Math.sqrt(Math.sinh(c - a) * Math.sinh(c + a)) / (Math.cosh(a) * Math.sinh(c)),
  };
}

export function coupledStriplineValidity(g: CoupledStriplineGeometry): Validity {
  // Cohn's result is exact for zero-thickness strips; cosh overflows beyond W/b ≈ 400, far outside practice.
  return validity('coupled stripline', [rangeCheck('(W + S)/b', (g.width + g.spacing) / g.planeSpacing, 0, 100, 'numerical range of this implementation')]);
}

export function analyzeCoupledStripline(g: CoupledStriplineGeometry): CoupledStriplineAnalysis {
  checkGeometry(g);
  const { ke, kep, ko, kop } = moduli(g);
  const z = ETA0 / (4 * Math.sqrt(g.er));
  return {
    zEven: z / ellipticKRatio(ke, kep),
    zOdd: z / ellipticKRatio(ko, kop),
    epsEff: g.er,
    delayPerMeter: Math.sqrt(g.er) / C0,
    validity: coupledStriplineValidity(g),
  };
}

/** Jacobi's θ2, θ3, θ4 at nome q (0 ≤ q ≤ e^{−π}: the series converge in a few terms). */
function thetas(q: number): [number, number, number] {
  let t2 = 0;
  let t3 = 1;
  let t4 = 1;
  for (let n = 0; n < 40; n++) {
    const a = Math.pow(q, n * (n + 1));
    t2 += a;
    if (n > 0) {
      const b = Math.pow(q, n * n);
      t3 += 2 * b;
      t4 += 2 * (n % 2 ? -b : b);
    }
    if (a < 1e-18) break;
  }
  return [2 * Math.pow(q, 0.25) * t2, t3, t4];
}

/** The modulus k and its complement k′ with K(k′)/K(k) = ρ. */
export function modulusForRatio(rho: number): { k: number; kp: number } {
  if (!(rho > 0) || !Number.isFinite(rho)) throw new RangeError(`modulusForRatio: need a ratio > 0 (got ${rho})`);
  // nome of k is e^{−πρ}; when ρ < 1 use the complementary nome e^{−π/ρ}, which is the smaller one
  const q = Math.exp(-Math.PI * Math.max(rho, 1 / rho));
  const [t2, t3, t4] = thetas(q);
  const small = (t2 * t2) / (t3 * t3);
  const large = (t4 * t4) / (t3 * t3);
  return rho >= 1 ? { k: small, kp: large } : { k: large, kp: small };
}

/**
 * The geometry (W and S for a given b and εr) with the given even- and odd-mode impedances, by
 * inverting Cohn's formulas in closed form (see the header). Needs Z_even > Z_odd > 0.
 */
export function synthCoupledStripline(zEven: number, zOdd: number, planeSpacing: number, er: number): { width: number; spacing: number; analysis: CoupledStriplineAnalysis } {
  if (!(zEven > zOdd && zOdd > 0)) throw new RangeError(`coupled stripline: need Z_even > Z_odd > 0 (got ${zEven}, ${zOdd})`);
  const scale = (4 * Math.sqrt(er)) / ETA0;
  const e = modulusForRatio(zEven * scale);
  const o = modulusForRatio(zOdd * scale);
  const atanh = (x: number) => 0.5 * Math.log((1 + x) / (1 - x));
  const w = (2 / Math.PI) * atanh(Math.sqrt(e.k * o.k)) * planeSpacing;
  const total = (2 / Math.PI) * atanh(Math.sqrt(e.k / o.k)) * planeSpacing;
  const geometry = { width: w, spacing: total - w, planeSpacing, er };
  return { width: geometry.width, spacing: geometry.spacing, analysis: analyzeCoupledStripline(geometry) };
}
