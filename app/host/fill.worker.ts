/**
 * worker_threads adapter for filling whole gathers: runs core/fill/pipeline.ts on the gathers it is sent and
 * posts progress and results back. Cancellation arrives through a shared Int32 flag, read by the solvers
 * between iterations, so it works while this thread is busy. Protocol: app/host/fill-protocol.ts.
 */
import { parentPort } from 'node:worker_threads';
import { fillGather } from '../../core/fill/pipeline';
import { isInputFileError } from '../../core/problems';
import type { FillPoolReply, FillPoolRequest } from './fill-protocol';

const port = parentPort;
if (!port) throw new Error('fill.worker must run in a worker thread');
let flag: Int32Array | null = null;
const cancel = { get cancelled() { return flag !== null && Atomics.load(flag, 0) !== 0; } };

port.on('message', (msg: FillPoolRequest) => {
  if (msg.type === 'init') {
    flag = new Int32Array(msg.cancelFlag);
    return;
  }
  const { jobId } = msg;
  let lastPost = 0;
  fillGather({ data: msg.data, nTraces: msg.nTraces, nSamples: msg.nSamples, plan: msg.plan, slopePairs: msg.slopePairs }, msg.settings, {
    cancel,
    onProgress: (p) => {
      const now = Date.now();
      if (now - lastPost < 200 && p.fraction < 1) return;
      lastPost = now;
      port.postMessage({ type: 'progress', jobId, stage: p.stage, fraction: p.fraction } satisfies FillPoolReply);
    },
  }).then(
    (result) => port.postMessage({ type: 'done', jobId, result } satisfies FillPoolReply, [result.filled.buffer as ArrayBuffer, result.slopePairs.buffer as ArrayBuffer]),
    (e: unknown) => {
      const err = e instanceof Error ? e : new Error(String(e));
      port.postMessage({ type: 'error', jobId, name: err.name, message: err.stack ?? err.message, problem: isInputFileError(e) ? e.problem : undefined } satisfies FillPoolReply);
    },
  );
});
