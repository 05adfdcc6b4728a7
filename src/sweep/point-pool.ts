// A long-lived pool of sweep threads for searches that decide their next point from the last ones
// (the termination advisor's golden-section steps): jobs are (plan, point) pairs submitted one at a
// time from anywhere, each answered by a promise. The threads are the sweep's own: the same worker
// script and evaluatePoint as runPoints, so a row does not depend on where it was computed.
//
// jobs − 1 worker threads each hold up to two jobs (one running, one waiting, so a worker never idles
// while the main thread is busy); the main thread computes queued jobs itself between the workers'
// replies. With jobs = 1 every job runs in the main thread.
import type { Worker } from 'node:worker_threads';
import { annotatePointError, evaluatePoint, fromWire, type PointOptions, type SweepRow, type WireError } from './point.js';
import { defaultJobs, startWorker } from './pool.js';
import type { SweepPlan } from './plan.js';

export interface PointPoolOptions extends PointOptions {
  /** Threads computing points, the main thread included (default os.availableParallelism()). */
  jobs?: number;
  /** Whether the main thread computes jobs too (default true; tests set false to be sure the workers did). */
  useMainThread?: boolean;
}

interface Job {
  id: number;
  plan: SweepPlan;
  index: number;
  label: string;
  resolve: (row: SweepRow) => void;
  reject: (e: Error) => void;
}

interface Slot {
  worker: Worker;
  ready: boolean;
  held: Map<number, Job>;
}

export class PointPool {
  private readonly queue: Job[] = [];
  private readonly slots: Slot[] = [];
  private readonly options: PointOptions;
  private readonly jobs: number;
  private readonly local: boolean;
  private nextId = 0;
  private computing = false;
  private closed = false;
  private started = false;
  /** Points evaluated so far (by any thread). */
  evaluated = 0;

  constructor(opts: PointPoolOptions = {}) {
    this.jobs = Math.max(1, opts.jobs ?? defaultJobs());
    this.options = { force: opts.force, limits: opts.limits };
    this.local = this.jobs === 1 || (opts.useMainThread ?? true);
  }

  /** Evaluates point `index` of `plan`; `label` names it in error messages. */
  evaluate(plan: SweepPlan, index = 0, label = `point ${index}`): Promise<SweepRow> {
    if (this.closed) return Promise.reject(new Error('PointPool: already closed'));
    return new Promise<SweepRow>((resolve, reject) => {
      this.queue.push({ id: this.nextId++, plan, index, label, resolve, reject });
      this.start();
      this.pump();
    });
  }

  /** Stops the worker threads; jobs still waiting are rejected. */
  async close(): Promise<void> {
    this.closed = true;
    const left = [...this.queue.splice(0), ...this.slots.flatMap((s) => [...s.held.values()])];
    for (const j of left) j.reject(new Error('PointPool: closed before the point was computed'));
    await Promise.all(this.slots.map((s) => s.worker.terminate()));
    this.slots.length = 0;
  }

  private start(): void {
    if (this.started) return;
    this.started = true;
    const workers = this.local ? this.jobs - 1 : this.jobs;
    for (let k = 0; k < workers; k++) this.slots.push(this.startSlot());
  }

  private startSlot(): Slot {
    const slot: Slot = { worker: startWorker({ plan: null, options: this.options }), ready: false, held: new Map() };
    slot.worker.on('message', (m: { type: string; job?: number; row?: SweepRow; error?: WireError; message?: string }) => {
      if (m.type === 'ready') {
        slot.ready = true;
        this.pump();
        return;
      }
      if (m.type === 'fatal') {
        this.failSlot(slot, new Error(`a sweep worker could not start: ${m.message}`));
        return;
      }
      const job = slot.held.get(m.job!);
      if (!job) return;
      slot.held.delete(job.id);
      this.evaluated++;
      if (m.type === 'row') job.resolve(m.row!);
      else job.reject(annotatePointError(fromWire(m.error!), job.label));
      this.pump();
    });
    slot.worker.on('error', (e) => this.failSlot(slot, e instanceof Error ? e : new Error(String(e))));
    slot.worker.on('exit', (code) => {
      if (!this.closed && code !== 0) this.failSlot(slot, new Error(`a sweep worker stopped with exit code ${code}`));
    });
    return slot;
  }

  /** A worker died: its jobs fail, the slot is dropped, the rest carry on. */
  private failSlot(slot: Slot, e: Error): void {
    for (const j of slot.held.values()) j.reject(e);
    slot.held.clear();
    const k = this.slots.indexOf(slot);
    if (k >= 0) this.slots.splice(k, 1);
    void slot.worker.terminate();
    this.pump();
  }

  /** Hands queued jobs to ready workers, then lets the main thread take one if any are left. */
  private pump(): void {
    for (const slot of this.slots) {
      while (slot.ready && slot.held.size < 2 && this.queue.length > 0) {
        const job = this.queue.shift()!;
        slot.held.set(job.id, job);
        slot.worker.postMessage({ type: 'point', index: job.index, plan: job.plan, job: job.id });
      }
    }
    const mainOnly = this.slots.length === 0;
    if ((this.local || mainOnly) && !this.computing && this.queue.length > 0) {
      this.computing = true;
      // Yield first, so replies already waiting are taken in and more jobs can be queued.
      setImmediate(() => this.computeOne());
    }
  }

  private computeOne(): void {
    this.computing = false;
    const job = this.queue.shift();
    if (!job) return;
    try {
      const row = evaluatePoint(job.plan, job.index, this.options);
      this.evaluated++;
      job.resolve(row);
    } catch (e) {
      job.reject(annotatePointError(e, job.label));
    }
    this.pump();
  }
}
