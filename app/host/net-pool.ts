/**
 * Runs the network fill's window jobs on worker_threads (Node side: CLI and Electron main). Each job is trained
 * by one worker from its own seed, so the result is the same, bit for bit, for any number of workers.
 * Cancellation: the caller's CancelToken is polled every 50 ms and copied into a shared flag that the workers
 * read between training steps.
 */
import { availableParallelism } from 'node:os';
import { createRequire } from 'node:module';
import { Worker } from 'node:worker_threads';
import type { GapSolverFn, GapSolverInput, GapSolverResult } from '../../core/fill/solver';
import { BugError, CancelledError } from '../../core/problems';
import { solveGapsNet, type NetJobRunner, type NetSolverOptions } from '../../core/nn/solver';
import type { NetWindowFill } from '../../core/nn/window';
import type { NetPoolReply, NetPoolRequest } from './net-protocol';

/** Starts one worker: the bundled dist-node/net.worker.mjs when running from the bundle, else the .ts source via tsx. */
function spawnNetWorker(): Worker {
  const here = import.meta.url;
  if (here.endsWith('.mjs')) return new Worker(new URL('./net.worker.mjs', here));
  // Source run (tsx, vitest): tsx's loader does not reach worker_threads on Node 20 (stack.md §4), so register it
  // inside the worker before importing the TypeScript entry.
  // require.resolve picks the CommonJS build; the worker needs the ESM one beside it (package "exports" map).
  const tsxApi = createRequire(here).resolve('tsx/esm/api').replace(/\.cjs$/, '.mjs');
  const entry = new URL('./net.worker.ts', here).href;
  const code = `import(${JSON.stringify(new URL(`file://${tsxApi}`).href)}).then((m) => { m.register(); return import(${JSON.stringify(entry)}); });`;
  return new Worker(code, { eval: true });
}

export function defaultNetJobs(): number {
  return Math.max(1, availableParallelism());
}

/** A NetJobRunner over `threads` worker threads. */
export function createNetThreadRunner(threads: number): NetJobRunner {
  if (!Number.isInteger(threads) || threads < 1) throw new BugError(`createNetThreadRunner: threads must be a positive integer, got ${threads}`);
  return (jobs, options, cancel, onJobProgress) =>
    new Promise<NetWindowFill[]>((resolve, reject) => {
      const flagBuffer = new SharedArrayBuffer(4);
      const flag = new Int32Array(flagBuffer);
      const nWorkers = Math.min(threads, jobs.length);
      const workers: Worker[] = [];
      const fills: NetWindowFill[] = [];
      let next = 0;
      let finished = false;
      const finish = (err: Error | null) => {
        if (finished) return;
        finished = true;
        clearInterval(poll);
        Atomics.store(flag, 0, 1);
        for (const w of workers) void w.terminate();
        if (err) reject(err);
        else resolve(fills);
      };
      const poll = setInterval(() => {
        if (cancel?.cancelled) finish(new CancelledError());
      }, 50);
      const feed = (w: Worker) => {
        if (next < jobs.length) {
          const job = jobs[next++];
          w.postMessage({ type: 'run', job, options } satisfies NetPoolRequest);
        }
      };
      for (let i = 0; i < nWorkers; i++) {
        const w = spawnNetWorker();
        workers.push(w);
        w.on('message', (m: NetPoolReply) => {
          if (m.type === 'progress') onJobProgress(m);
          else if (m.type === 'done') {
            fills.push(m.fill);
            if (fills.length === jobs.length) finish(null);
            else feed(w);
          } else if (m.name === 'CancelledError') finish(new CancelledError());
          else finish(new BugError(`network training of window ${m.jobIndex} failed in a worker: ${m.name}: ${m.message}`));
        });
        w.on('error', (e) => finish(new BugError(`network worker crashed: ${e.message}`)));
        w.on('exit', (code) => {
          if (!finished) finish(new BugError(`network worker exited early with code ${code}`));
        });
        w.postMessage({ type: 'init', cancelFlag: flagBuffer } satisfies NetPoolRequest);
        feed(w);
      }
      if (jobs.length === 0) finish(null);
    });
}

/**
 * The network gap solver on worker threads: the entry point for the CLI and the Electron main process.
 * @param threads worker threads (default: all cores)
 */
export function solveGapsNetThreads(input: GapSolverInput, options: NetSolverOptions = {}, threads = defaultNetJobs()): Promise<GapSolverResult> {
  return solveGapsNet(input, options, createNetThreadRunner(threads), threads);
}

/** The network solver on worker threads in the shape core/fill/pipeline.ts expects. */
export function netGapSolverThreads(threads = defaultNetJobs()): GapSolverFn {
  return (input, settings) => solveGapsNetThreads(input, settings as NetSolverOptions, threads);
}
