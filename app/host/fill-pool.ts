/**
 * A pool of worker_threads that fill whole gathers (app/host/fill.worker.ts → dist-node/fill.worker.mjs).
 * Jobs queue in submission order and go to whichever worker is free; each job's answer depends only on its
 * own input, so results are identical for any number of workers. Cancellation: the caller's CancelToken is
 * polled every 50 ms and copied into a shared flag the workers' solvers read between iterations.
 */
import { createRequire } from 'node:module';
import { Worker } from 'node:worker_threads';
import type { FillGatherResult, FillStage } from '../../core/fill/pipeline';
import { BugError, CancelledError, InputFileError, type CancelToken } from '../../core/problems';
import type { FillJobSpec, FillPoolReply, FillPoolRequest } from './fill-protocol';

/** The bundled dist-node/fill.worker.mjs when running from the bundle, else the .ts source via tsx. */
function spawnFillWorker(): Worker {
  const here = import.meta.url;
  if (here.endsWith('.mjs')) return new Worker(new URL('./fill.worker.mjs', here));
  // Source run (tsx, vitest): tsx's loader does not reach worker_threads on Node 20 (stack.md §4).
  const tsxApi = createRequire(here).resolve('tsx/esm/api').replace(/\.cjs$/, '.mjs');
  const entry = new URL('./fill.worker.ts', here).href;
  const code = `import(${JSON.stringify(new URL(`file://${tsxApi}`).href)}).then((m) => { m.register(); return import(${JSON.stringify(entry)}); });`;
  return new Worker(code, { eval: true });
}

type Pending = {
  spec: FillJobSpec;
  resolve: (r: FillGatherResult) => void;
  reject: (e: Error) => void;
  onProgress?: (stage: FillStage, fraction: number) => void;
};

export class FillPool {
  private readonly workers: Worker[] = [];
  private readonly idle: Worker[] = [];
  private readonly queue: Pending[] = [];
  private readonly running = new Map<number, Pending>();
  private readonly flag: Int32Array;
  private readonly poll: ReturnType<typeof setInterval>;
  private failure: Error | null = null;
  private nextId = 1;
  private closed = false;

  constructor(threads: number, private readonly cancel?: CancelToken) {
    if (!Number.isInteger(threads) || threads < 1) throw new BugError(`FillPool: threads must be a positive integer, got ${threads}`);
    const buf = new SharedArrayBuffer(4);
    this.flag = new Int32Array(buf);
    for (let i = 0; i < threads; i++) {
      const w = spawnFillWorker();
      w.on('message', (m: FillPoolReply) => this.onMessage(w, m));
      w.on('error', (e) => this.fail(new BugError(`fill worker crashed: ${e.message}`)));
      w.on('exit', (code) => { if (!this.closed) this.fail(new BugError(`fill worker exited early with code ${code}`)); });
      w.postMessage({ type: 'init', cancelFlag: buf } satisfies FillPoolRequest);
      this.workers.push(w);
      this.idle.push(w);
    }
    this.poll = setInterval(() => { if (this.cancel?.cancelled) this.fail(new CancelledError()); }, 50);
  }

  /** Queue one gather; resolves with its result (transferred: the input arrays stay with the caller). */
  run(spec: Omit<FillJobSpec, 'jobId'>, onProgress?: (stage: FillStage, fraction: number) => void): Promise<FillGatherResult> {
    if (this.failure) return Promise.reject(this.failure);
    return new Promise((resolve, reject) => {
      this.queue.push({ spec: { ...spec, jobId: this.nextId++ }, resolve, reject, onProgress });
      this.dispatch();
    });
  }

  private dispatch(): void {
    while (this.idle.length && this.queue.length && !this.failure) {
      const w = this.idle.pop()!;
      const job = this.queue.shift()!;
      this.running.set(job.spec.jobId, job);
      (w as Worker & { jobId?: number }).jobId = job.spec.jobId;
      w.postMessage({ type: 'fill', ...job.spec } satisfies FillPoolRequest);
    }
  }

  private onMessage(w: Worker, m: FillPoolReply): void {
    const job = this.running.get(m.jobId);
    if (!job) return;
    if (m.type === 'progress') {
      job.onProgress?.(m.stage, m.fraction);
      return;
    }
    this.running.delete(m.jobId);
    this.idle.push(w);
    if (m.type === 'done') job.resolve(m.result);
    else if (m.name === 'CancelledError') {
      this.fail(new CancelledError());
      job.reject(new CancelledError());
    } else if (m.problem) job.reject(new InputFileError(m.problem));
    else job.reject(new BugError(`filling a gather failed in a worker: ${m.name}: ${m.message}`));
    this.dispatch();
  }

  private fail(e: Error): void {
    if (this.failure) return;
    this.failure = e;
    Atomics.store(this.flag, 0, 1);
    for (const j of [...this.queue, ...this.running.values()]) j.reject(e);
    this.queue.length = 0;
    this.running.clear();
  }

  /** Stops every worker. Safe to call more than once. */
  async close(): Promise<void> {
    if (this.closed) return;
    this.closed = true;
    clearInterval(this.poll);
    Atomics.store(this.flag, 0, 1);
    await Promise.all(this.workers.map((w) => w.terminate()));
  }
}
