/** Messages between app/host/fill-pool.ts and app/host/fill.worker.ts (plain data and typed arrays only). */
import type { FillGatherResult, FillSettings, FillStage } from '../../core/fill/pipeline';
import type { FillPlan } from '../../core/fill/plan';
import type { FileProblem } from '../../core/problems';

export interface FillJobSpec {
  jobId: number;
  /** Regular-grid gather, gridCount × nSamples, trace-major. */
  data: Float32Array;
  nTraces: number;
  nSamples: number;
  plan: FillPlan;
  settings: Partial<FillSettings>;
  /** Given slopes (pair grid); omitted: estimated in the worker. */
  slopePairs?: Float64Array;
}

export type FillPoolRequest =
  | { type: 'init'; cancelFlag: SharedArrayBuffer }
  | ({ type: 'fill' } & FillJobSpec);

export type FillPoolReply =
  | { type: 'progress'; jobId: number; stage: FillStage; fraction: number }
  | { type: 'done'; jobId: number; result: FillGatherResult }
  | { type: 'error'; jobId: number; name: string; message: string; problem?: FileProblem };
