import { describe, expect, it } from 'vitest';
import { coupledLineProblems, coupledLineWarnings, maxwellFromMutual, mutualFromMaxwell, pairFromModes, pairModesProblems, type CoupledLine } from '../../../sim/coupled/line.js';
import { fromRows, matmul, solveMatrix, identity, transpose } from '../../../sim/coupled/matrix.js';
import { fastestVelocity, modalAnalysis, pairMetrics } from '../../../sim/coupled/modes.js';
import { homogeneousPair, inhomogeneousPair } from '../../support/coupled.js';

const C0 = 299_792_458;

describe('coupled pair check values', () => {
  // Homogeneous pair: C = (1/(v·Z0))·[[1, −k], [−k, 1]], L = C⁻¹/v², v = 1.5e8 m/s, Z0 = 50 Ω, k = 0.1.
  // Odd mode: C11 − C12 = (1 + k)/(vZ0) and L11 − L12 = Z0/(v(1 + k)) (L = (Z0/v)·[[1, k], [k, 1]]/(1 − k²)),
  // so Z_odd = √((L11 − L12)/(C11 − C12)) = Z0/(1 + k) = 45.4545 Ω; Z_even = Z0/(1 − k) = 55.5556 Ω; both
  // modes travel at v (L·C = 1/v²). L_m/L = k and C_m/C = k, so K_b = k/2 = 0.05 and K_f = 0 (Paul, MTL
  // equations; the odd/even analysis as in Pozar, Microwave Engineering, coupled lines).
  it('homogeneous pair: Z_even 55.556, Z_odd 45.455, both modes at v, K_b = 0.05, K_f = 0', () => {
    const line = homogeneousPair();
    expect(coupledLineProblems(line)).toEqual([]);
    const modal = modalAnalysis(line);
    const p = pairMetrics(line, modal);
    expect(p.symmetric).toBe(true);
    expect(p.zEven).toBeCloseTo(50 / 0.9, 9);
    expect(p.zOdd).toBeCloseTo(50 / 1.1, 9);
    expect(p.zDiff).toBeCloseTo(100 / 1.1, 9);
    expect(p.zComm).toBeCloseTo(25 / 0.9, 9);
    expect(p.velocityOdd! / 1.5e8).toBeCloseTo(1, 12);
    expect(p.velocityEven! / 1.5e8).toBeCloseTo(1, 12);
    for (const m of modal.modes) expect(m.velocity / 1.5e8).toBeCloseTo(1, 12);
    expect(p.kb).toBeCloseTo(0.05, 12);
    expect(p.kf).toBeCloseTo(0, 12);
  });

  // Inhomogeneous pair L = [[300, 45], [45, 300]] nH/m, C = [[120, −12], [−12, 120]] pF/m:
  // even: L_e = 345 nH/m, C_e = 108 pF/m → Z_e = √(345/108)·√1000 = 56.519 Ω, v_e = 1/√(345e-9·108e-12) = 1.6382e8 m/s;
  // odd:  L_o = 255 nH/m, C_o = 132 pF/m → Z_o = 43.952 Ω, v_o = 1/√(255e-9·132e-12) = 1.7236e8 m/s.
  // L_m/L = 0.15, C_m/C = 0.1: K_b = ¼(0.25) = 0.0625, K_f = ½(0.1 − 0.15) = −0.025.
  // Self velocity 1/√(L11·C11) = 1/√(3.6e-17) = 1.6667e8 m/s is slower than the odd mode: a time step
  // taken from it has odd-mode Courant number 1.7236/1.6667 = 1.0342.
  it('inhomogeneous pair: Z_even 56.519, Z_odd 43.952, v 1.6382e8 / 1.7236e8, fastest mode = odd', () => {
    const line = inhomogeneousPair();
    expect(coupledLineProblems(line)).toEqual([]);
    const modal = modalAnalysis(line);
    const p = pairMetrics(line, modal);
    expect(p.zEven).toBeCloseTo(Math.sqrt(345 / 108) * Math.sqrt(1000), 9);
    expect(p.zEven).toBeCloseTo(56.519, 3);
    expect(p.zOdd).toBeCloseTo(43.952, 3);
    expect(p.velocityEven! / 1e8).toBeCloseTo(1.6382, 4);
    expect(p.velocityOdd! / 1e8).toBeCloseTo(1.7236, 4);
    expect(modal.modes.map((m) => m.velocity / 1e8)).toEqual([expect.closeTo(1.7236, 4), expect.closeTo(1.6382, 4)]);
    // the fastest mode is the odd one: pattern (1, −1), each line sees Z_odd
    expect(Array.from(modal.modes[0].voltage)).toEqual([expect.closeTo(1, 12), expect.closeTo(-1, 12)]);
    expect(modal.modes[0].impedance).toEqual([expect.closeTo(p.zOdd, 9), expect.closeTo(p.zOdd, 9)]);
    expect(modal.modes[1].impedance).toEqual([expect.closeTo(p.zEven, 9), expect.closeTo(p.zEven, 9)]);
    expect(fastestVelocity(line) / p.velocityOdd!).toBeCloseTo(1, 12);
    const self = 1 / Math.sqrt(300e-9 * 120e-12);
    expect(self / 1e8).toBeCloseTo(1.6667, 4);
    expect(fastestVelocity(line) / self).toBeCloseTo(1.0342, 4);
    expect(p.kb).toBeCloseTo(0.0625, 12);
    expect(p.kf).toBeCloseTo(-0.025, 12);
  });

  it('a pair from its odd and even modes gives back the same modes', () => {
    const modes = { zOdd: 43.952453649576626, zEven: 56.5194165260439, delayOdd: 1 / 1.7236256333e8, delayEven: 1 / 1.6382439573e8 };
    const line = pairFromModes(modes);
    const inh = inhomogeneousPair();
    for (let i = 0; i < 4; i++) {
      expect(line.l[i] / 1e-9).toBeCloseTo(inh.l[i] / 1e-9, 6);
      expect(line.c[i] / 1e-12).toBeCloseTo(inh.c[i] / 1e-12, 6);
    }
    expect(pairModesProblems(modes)).toEqual([]);
    expect(pairModesProblems({ ...modes, zOdd: 60 })[0].message).toMatch(/swap/);
    expect(pairModesProblems({ ...modes, delayEven: -1 })[0].path).toBe('delayEven');
  });
});

describe('capacitance conventions', () => {
  // Maxwell C_ii = C_g + ΣC_m, C_ij = −C_m (Paul, the per-unit-length capacitance matrix): capacitors of
  // 108 pF/m to the return and 12 pF/m between the lines give [[120, −12], [−12, 120]] pF/m.
  it('converts mutual capacitances to the Maxwell matrix and back', () => {
    const maxwell = maxwellFromMutual([108e-12, 108e-12], fromRows([[0, 12e-12], [12e-12, 0]]));
    expect(Array.from(maxwell)).toEqual([120e-12, -12e-12, -12e-12, 120e-12].map((x) => expect.closeTo(x, 24)));
    const back = mutualFromMaxwell(maxwell, 2);
    expect(Array.from(back.toReturn)).toEqual([expect.closeTo(108e-12, 24), expect.closeTo(108e-12, 24)]);
    expect(back.mutual[1]).toBeCloseTo(12e-12, 24);
  });
});

describe('validation', () => {
  const base = inhomogeneousPair();
  const paths = (line: CoupledLine) => coupledLineProblems(line).map((p) => p.path);

  it('refuses an asymmetric L, an L that is not positive definite, and a wrong size', () => {
    expect(paths({ ...base, l: fromRows([[300e-9, 45e-9], [40e-9, 300e-9]]) })).toEqual(['l[0][1]']);
    expect(paths({ ...base, l: fromRows([[300e-9, 310e-9], [310e-9, 300e-9]]) })).toEqual(['l']);
    expect(paths({ ...base, c: new Float64Array(3) })).toEqual(['c']);
  });

  it('explains a positive off-diagonal C as the other convention', () => {
    const problems = coupledLineProblems({ ...base, c: fromRows([[120e-12, 12e-12], [12e-12, 120e-12]]) });
    expect(problems.map((p) => p.path)).toEqual(['c[0][1]']);
    expect(problems[0].message).toMatch(/Maxwell matrix.*−C_m off the diagonal/);
  });

  // L_o = (300 − 290) nH/m with C_o = 132 pF/m: v_odd = 1/√(10e-9·132e-12) = 8.7e8 m/s > c.
  it('refuses a coupling that makes a mode faster than light', () => {
    const problems = coupledLineProblems({ ...base, l: fromRows([[300e-9, 290e-9], [290e-9, 300e-9]]) });
    expect(problems).toHaveLength(1);
    expect(problems[0].message).toMatch(/fastest mode travels at 2\.9\d*c — faster than light/);
  });

  it('refuses R and G that would create energy, and warns on a negative capacitance to the return', () => {
    expect(paths({ ...base, r: fromRows([[1, 2], [2, 1]]) })).toEqual(['r']);
    expect(paths({ ...base, g: fromRows([[1e-3, 1e-3], [1e-3, 1e-3]]) })).toEqual(['g[0][1]']);
    expect(coupledLineWarnings(base)).toEqual([]);
    expect(coupledLineWarnings({ ...base, c: fromRows([[100e-12, -110e-12], [-110e-12, 200e-12]]) })[0]).toMatch(/row 0 sums to/);
  });
});

describe('modal decomposition, three conductors', () => {
  // Paul: T_V diagonalises L·C (L·C·T_V = T_V·Λ²), T_Iᵀ·T_V = 1, Z_C = T_V·Λ·T_Vᵀ is symmetric; in a
  // homogeneous medium (L·C = 1/v²) Z_C = v·L.
  const c = fromRows([
    [110e-12, -15e-12, -3e-12],
    [-15e-12, 120e-12, -14e-12],
    [-3e-12, -14e-12, 105e-12],
  ]);
  it('homogeneous: every mode at v and Z_C = v·L', () => {
    const v = 1.8e8;
    const l = solveMatrix(c, identity(3), 3, 3).map((x) => x / (v * v));
    const modal = modalAnalysis({ k: 3, l, c });
    for (const m of modal.modes) expect(m.velocity / v).toBeCloseTo(1, 10);
    for (let i = 0; i < 9; i++) expect(modal.zc[i]).toBeCloseTo(v * l[i], 8);
  });

  it('inhomogeneous: L·C·T_V = T_V·Λ², T_Iᵀ·T_V = 1, Z_C symmetric, velocities below c', () => {
    const l = fromRows([
      [320e-9, 60e-9, 20e-9],
      [60e-9, 300e-9, 55e-9],
      [20e-9, 55e-9, 330e-9],
    ]);
    const modal = modalAnalysis({ k: 3, l, c });
    const lc = matmul(l, c, 3);
    const left = matmul(lc, modal.tv, 3);
    const scale = Math.max(...modal.tv.map(Math.abs)) * modal.modes[2].delay ** 2;
    for (let i = 0; i < 3; i++)
      for (let m = 0; m < 3; m++) expect(Math.abs(left[i * 3 + m] - modal.tv[i * 3 + m] * modal.modes[m].delay ** 2) / scale).toBeLessThan(1e-12);
    const tiTv = matmul(transpose(modal.ti, 3), modal.tv, 3);
    for (let i = 0; i < 9; i++) expect(tiTv[i]).toBeCloseTo(i % 4 === 0 ? 1 : 0, 12);
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expect(modal.zc[i * 3 + j]).toBeCloseTo(modal.zc[j * 3 + i], 10);
    expect(modal.modes[0].velocity).toBeGreaterThanOrEqual(modal.modes[1].velocity);
    expect(modal.modes[0].velocity).toBeLessThan(C0);
  });
});
