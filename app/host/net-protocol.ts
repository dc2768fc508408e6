/** Messages between app/host/net-pool.ts and app/host/net.worker.ts (plain data only). */
import type { NetTrainOptions } from '../../core/nn/train';
import type { NetWindowFill, NetWindowJob } from '../../core/nn/window';

export type NetPoolRequest =
  | { type: 'init'; cancelFlag: SharedArrayBuffer }
  | { type: 'run'; job: NetWindowJob; options: NetTrainOptions };

export type NetPoolReply =
  | { type: 'progress'; jobIndex: number; step: number; totalSteps: number; terms: Record<string, number> }
  | { type: 'done'; fill: NetWindowFill }
  | { type: 'error'; jobIndex: number; name: string; message: string };
