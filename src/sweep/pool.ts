// Sweep points across CPU cores with worker_threads. Points go out one at a time to whichever thread
// is free (the main thread computes points too); each row is stored under its point number, so the
// result does not depend on the number of threads or on which finished first (identical to a serial
// run).
//
// Workers run built JavaScript: from dist/, this module starts dist/src/sweep/worker.js. When this
// module itself runs from TypeScript source (under vitest, or `node --import tsx src/cli/main.ts`),
// a worker cannot inherit tsx through execArgv on Node 20, so it starts from a small evaluated
// bootstrap that registers tsx's loader (tsx/esm/api) and then imports worker.ts.
import { availableParallelism } from 'node:os';
import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import { annotatePointError, evaluatePoint, fromWire, type PointOptions, type SweepRow, type WireError } from './point.js';
import { describeAssignments, pointAssignments, type SweepPlan } from './plan.js';

export interface RunPointsOptions extends PointOptions {
  /**
   * Threads computing points; default os.availableParallelism(). 1 runs in this thread only; N > 1
   * starts N − 1 worker threads and this thread computes points as well.
   */
  jobs?: number;
  /**
   * With jobs > 1, whether this thread computes points too (default true). false: `jobs` worker
   * threads do all the work (tests use it to be sure the workers computed the points).
   */
  useMainThread?: boolean;
  /** Called after each point with the number done so far. */
  onProgress?: (done: number, total: number) => void;
}

export function defaultJobs(): number {
  return Math.max(1, availableParallelism());
}

function label(plan: SweepPlan, i: number): string {
  return `point ${i} (${describeAssignments(pointAssignments(plan, i))})`;
}

function tsxApi(): string {
  const meta = import.meta as ImportMeta & { resolve?: (s: string) => string };
  try {
    if (typeof meta.resolve === 'function') return meta.resolve('tsx/esm/api');
  } catch {
    // fall through
  }
  return pathToFileURL(createRequire(import.meta.url).resolve('tsx/esm/api')).href;
}

/** Starts one worker: the built worker.js, or worker.ts through tsx when running from source. */
export function startWorker(workerData: unknown): Worker {
  const fromSource = import.meta.url.endsWith('.ts');
  const url = new URL(fromSource ? './worker.ts' : './worker.js', import.meta.url);
  if (!fromSource) return new Worker(url, { workerData });
  const code =
    `import(${JSON.stringify(tsxApi())})` +
    `.then((m) => { (m.register ?? m.default.register)(); return import(${JSON.stringify(url.href)}); })` +
    `.catch((e) => { require('node:worker_threads').parentPort.postMessage({ type: 'fatal', message: String((e && e.stack) || e) }); });`;
  return new Worker(code, { eval: true, workerData });
}

/** Evaluates the points `indices` (ascending) and returns their rows in the same order. */
export async function runPoints(plan: SweepPlan, indices: readonly number[], opts: RunPointsOptions = {}): Promise<SweepRow[]> {
  const total = indices.length;
  const jobs = Math.max(1, Math.min(opts.jobs ?? defaultJobs(), total));
  const options: PointOptions = { force: opts.force, limits: opts.limits };
  if (total === 0) return [];
  if (jobs === 1) {
    const rows: SweepRow[] = [];
    for (const i of indices) {
      try {
        rows.push(evaluatePoint(plan, i, options));
      } catch (e) {
        throw annotatePointError(e, label(plan, i));
      }
      opts.onProgress?.(rows.length, total);
    }
    return rows;
  }
  // jobs − 1 worker threads, and this thread computes points too (between points it yields to the
  // event loop so the workers' results are taken in): no core idles while the workers start.
  return new Promise<SweepRow[]>((resolve, reject) => {
    const rows = new Map<number, SweepRow>();
    const workers: Worker[] = [];
    let next = 0;
    let settled = false;
    const stop = () => {
      settled = true;
      for (const w of workers) void w.terminate();
    };
    const fail = (e: Error) => {
      if (settled) return;
      stop();
      reject(e);
    };
    const store = (index: number, row: SweepRow) => {
      rows.set(index, row);
      opts.onProgress?.(rows.size, total);
      if (rows.size === total) {
        stop();
        resolve(indices.map((i) => rows.get(i)!));
      }
    };
    const dispatch = (w: Worker) => {
      if (next < total) w.postMessage({ type: 'point', index: indices[next++] });
    };
    const local = opts.useMainThread ?? true;
    for (let k = 0; k < (local ? jobs - 1 : jobs); k++) {
      const w = startWorker({ plan, options });
      workers.push(w);
      w.on('message', (m: { type: string; index: number; row?: SweepRow; error?: WireError; message?: string }) => {
        if (settled) return;
        // Two points in hand: the worker starts its next point at once instead of waiting for the
        // main thread, which only takes in results between its own points.
        if (m.type === 'ready') {
          dispatch(w);
          dispatch(w);
        }
        else if (m.type === 'row') {
          store(m.index, m.row!);
          if (!settled) dispatch(w);
        } else if (m.type === 'error') fail(annotatePointError(fromWire(m.error!), label(plan, m.index)));
        else if (m.type === 'fatal') fail(new Error(`a sweep worker could not start: ${m.message}`));
      });
      w.on('error', (e) => fail(e instanceof Error ? e : new Error(String(e))));
      w.on('exit', (code) => {
        if (!settled && code !== 0) fail(new Error(`a sweep worker stopped with exit code ${code}`));
      });
    }
    const compute = async () => {
      while (!settled && next < total) {
        const i = indices[next++]!;
        let row: SweepRow;
        try {
          row = evaluatePoint(plan, i, options);
        } catch (e) {
          fail(annotatePointError(e, label(plan, i)));
          return;
        }
        store(i, row);
        await new Promise<void>((r) => setImmediate(r));
      }
    };
    if (local) void compute();
  });
}
