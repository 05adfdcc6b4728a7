// `npm run bench`: nanoseconds per cell-step of the line kernel at several sizes, and the whole-run
// time of every scenario in scenarios/. A benchmark, not a test: it prints numbers and asserts nothing.
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { simulate } from '../../sim/simulate.js';
import type { Net } from '../../sim/model.js';
import { loadScenario } from '../../src/scenario/load.js';
import { advanceCoupledSection, buildCoupledSection, coupledFastestDelay } from '../../sim/coupled/kernel.js';

/** Four R‖L sections and four R–C branches per cell, as a realised lossy line carries (values illustrative). */
const LOSS_TERMS = {
  series: [1e-11, 1e-10, 1e-9, 1e-8].map((tau, k) => ({ value: 2 * (k + 1), tau })),
  shunt: [1e-11, 1e-10, 1e-9, 1e-8].map((tau) => ({ value: 1e-12, tau })),
};

function lineNet(cells: number, lossy = false): Net {
  // 1 m of 50 Ω line at 5 ns/m, edge chosen so the line gets `cells` cells at 20 steps per rise
  const rise = (5e-9 / cells) * 20;
  const line = { r: 0, g: 0, l: 250e-9, c: 100e-12, ...(lossy ? LOSS_TERMS : {}) };
  return {
    title: `bench ${cells}`,
    driver: { signal: { kind: 'step', from: 0, to: 1, start: 0, rise }, resistance: 25 },
    route: [{ kind: 'line', name: 'line', line, length: 1 }],
    receiver: [{ r: 0, l: 0, c: 2e-12, rail: 0 }],
    probes: [{ name: 'rx', at: 'receiver' }],
    run: { cellsPerRise: 20, duration: 0 },
  };
}

function kernelBench(cells: number, lossy = false): { nsPerCellStep: number; steps: number } {
  const target = lossy ? 1e8 : 4e8; // cell-steps per measurement: about a second
  const steps = Math.max(200, Math.round(target / cells));
  const base = lineNet(cells, lossy);
  const dt = 5e-9 / cells;
  const run = (n: number) => simulate({ ...base, run: { ...base.run, duration: n * dt, sample: n * dt } });
  run(Math.min(steps, 2000)); // warm up the JIT
  const t0 = process.hrtime.bigint();
  const res = run(steps);
  const ns = Number(process.hrtime.bigint() - t0);
  return { nsPerCellStep: ns / (res.discretization.steps * res.discretization.nodes), steps: res.discretization.steps };
}

/** The coupled kernel alone (ends held at rest, a disturbance inside), per conductor-cell-step. */
function coupledBench(k: number, cells: number): number {
  const l = new Float64Array(k * k);
  const c = new Float64Array(k * k);
  for (let i = 0; i < k; i++)
    for (let j = 0; j < k; j++) {
      l[i * k + j] = i === j ? 300e-9 : 45e-9;
      c[i * k + j] = i === j ? 120e-12 : -12e-12;
    }
  const line = { k, l, c };
  const dt = coupledFastestDelay(line, 1) / cells;
  const s = buildCoupledSection(line, 1, cells, dt);
  s.v[k * (cells >> 1)] = 1;
  const ends = new Float64Array(2 * k);
  const steps = Math.max(200, Math.round(2e8 / (cells * k)));
  for (let n = 0; n < 2000; n++) advanceCoupledSection(s, ends); // warm up the JIT
  const t0 = process.hrtime.bigint();
  for (let n = 0; n < steps; n++) advanceCoupledSection(s, ends);
  return Number(process.hrtime.bigint() - t0) / (steps * cells * k);
}

async function scenarioBench(dir: string): Promise<void> {
  const files = readdirSync(dir).filter((f) => /\.(json|ya?ml)$/.test(f)).sort();
  for (const f of files) {
    const net = await loadScenario(join(dir, f));
    const t0 = process.hrtime.bigint();
    const res = simulate(net);
    const ms = Number(process.hrtime.bigint() - t0) / 1e6;
    const d = res.discretization;
    console.log(`  ${f.padEnd(36)} ${ms.toFixed(1).padStart(9)} ms   ${String(d.nodes).padStart(7)} nodes × ${String(d.steps).padStart(7)} steps`);
  }
}

console.log('line kernel, lossless, one leapfrog step of every cell (target ≤ 2.0 ns per cell-step at N = 2 000):');
for (const cells of [200, 2000, 20000, 200000]) {
  const r = kernelBench(cells);
  console.log(`  N = ${String(cells).padStart(6)}: ${r.nsPerCellStep.toFixed(2).padStart(6)} ns per cell-step (${r.steps} steps)`);
}
const lossless = kernelBench(2000).nsPerCellStep;
const lossy = kernelBench(2000, true).nsPerCellStep;
console.log('line kernel with 4 conductor + 4 dielectric states per cell (target ≤ 3× the lossless cost):');
console.log(`  N =   2000: ${lossy.toFixed(2).padStart(6)} ns per cell-step, ${(lossy / lossless).toFixed(2)}× lossless`);
console.log('coupled-section kernel, 2 and 3 conductors, lossless (sim/coupled; not yet in runs):');
for (const k of [2, 3]) {
  const r = coupledBench(k, 2000);
  console.log(`  k = ${k}, N =   2000: ${r.toFixed(2).padStart(6)} ns per conductor-cell-step, ${(r / lossless).toFixed(2)}× the single-line figure`);
}
console.log('scenarios (whole run, including set-up):');
await scenarioBench(join(process.cwd(), 'scenarios'));

/**
 * Sweep throughput: points per second for a 200-point sweep of a demo net with 1 thread and with 2
 * (one worker thread plus the main thread), for a short run (motor-clock-series.json, a few ms per
 * point: the workers' start-up shows) and a longer one (greenhouse-sensor-cable.json).
 * Target: 2 threads ≥ 1.7× as fast as 1 on a 2-core machine (for runs where simulation dominates).
 */
async function sweepBench(scenario: string, vary: string): Promise<void> {
  const { planSweep, runPoints } = await import('../../src/sweep/index.js');
  const plan = await planSweep({ file: join(process.cwd(), 'scenarios', scenario), vary: [vary] });
  const points = [...Array(plan.points).keys()];
  await runPoints(plan, points.slice(0, 5), { jobs: 1 }); // warm up the JIT
  const rate: number[] = [];
  console.log(`  ${scenario}, ${vary}:`);
  for (const jobs of [1, 2]) {
    const t0 = process.hrtime.bigint();
    await runPoints(plan, points, { jobs });
    const s = Number(process.hrtime.bigint() - t0) / 1e9;
    rate.push(plan.points / s);
    console.log(`    ${jobs} thread${jobs > 1 ? 's' : ' '}: ${(plan.points / s).toFixed(1).padStart(7)} points/s (${plan.points} points in ${s.toFixed(2)} s)`);
  }
  console.log(`    speed-up with 2 threads: ${(rate[1]! / rate[0]!).toFixed(2)}× (target ≥ 1.7×)`);
}

console.log('sweeps of 200 points:');
await sweepBench('motor-clock-series.json', 'route.rs.series.r=0ohm..60ohm:200');
await sweepBench('greenhouse-sensor-cable.json', 'receiver.parts[0].r=100ohm..2kohm:200');
