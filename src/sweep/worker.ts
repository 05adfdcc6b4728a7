// A sweep worker thread: evaluates the points the pool sends, one at a time. The plan arrives as
// workerData, or with each point (a PointPool serving many small plans); every point is computed by
// evaluatePoint, exactly as in the main thread.
import { parentPort, workerData } from 'node:worker_threads';
import { evaluatePoint, toWire, type PointOptions } from './point.js';
import type { SweepPlan } from './plan.js';

const port = parentPort;
if (!port) throw new Error('src/sweep/worker: run as a worker thread by src/sweep/pool');
const { plan, options } = workerData as { plan: SweepPlan | null; options: PointOptions };
port.on('message', (m: { type: 'point'; index: number; plan?: SweepPlan; job?: number }) => {
  try {
    const p = m.plan ?? plan;
    if (!p) throw new Error('src/sweep/worker: a point arrived without a plan');
    port.postMessage({ type: 'row', index: m.index, job: m.job, row: evaluatePoint(p, m.index, options) });
  } catch (e) {
    port.postMessage({ type: 'error', index: m.index, job: m.job, error: toWire(e) });
  }
});
port.postMessage({ type: 'ready' });
