// Deterministic log-uniform frequencies for checking fits between their grid points.

/** n frequencies in [a, b], log-uniform, from a simple linear congruential generator (no Math.random). */
export function sampleLog(a: number, b: number, n: number, seed: number): number[] {
  let s = seed;
  const out: number[] = [];
  for (let i = 0; i < n; i++) {
    s = (s * 1103515245 + 12345) % 2147483648;
    out.push(a * Math.pow(b / a, s / 2147483648));
  }
  return out;
}
