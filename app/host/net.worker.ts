/**
 * worker_threads adapter for the network fill: trains the window jobs it is sent (core/nn/train.ts) and posts
 * progress and results back. Cancellation arrives through a shared Int32 flag, read between training steps,
 * so it works even while this thread is busy. Protocol: app/host/net-protocol.ts.
 */
import { parentPort } from 'node:worker_threads';
import { performance } from 'node:perf_hooks';
import { trainNetWindow } from '../../core/nn/train';
import type { NetPoolReply, NetPoolRequest } from './net-protocol';

const port = parentPort;
if (!port) throw new Error('net.worker must run in a worker thread');
let flag: Int32Array | null = null;
const cancel = { get cancelled() { return flag !== null && Atomics.load(flag, 0) !== 0; } };

port.on('message', (msg: NetPoolRequest) => {
  if (msg.type === 'init') {
    flag = new Int32Array(msg.cancelFlag);
    return;
  }
  const { job, options } = msg;
  trainNetWindow(job, options, {
    cancel,
    now: () => performance.now() / 1000,
    progressEvery: 10,
    onStep: (step, totalSteps, terms) => port.postMessage({ type: 'progress', jobIndex: job.index, step, totalSteps, terms } satisfies NetPoolReply),
  }).then(
    (fill) => port.postMessage({ type: 'done', fill } satisfies NetPoolReply, [fill.fill.buffer as ArrayBuffer]),
    (e: unknown) => {
      const err = e instanceof Error ? e : new Error(String(e));
      port.postMessage({ type: 'error', jobIndex: job.index, name: err.name, message: err.message } satisfies NetPoolReply);
    },
  );
});
