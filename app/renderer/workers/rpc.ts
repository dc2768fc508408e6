/**
 * Request/response plumbing between the page and a Web Worker: one typed protocol (workers/protocol.ts),
 * numbered requests, progress messages, transfer lists and cancellation.
 *
 * Cancellation: when the page is cross-origin isolated (vite preview/dev and the app:// protocol send
 * COOP/COEP), each request carries a SharedArrayBuffer flag that the core polls through its CancelToken, so
 * the worker stops cleanly and stays alive. Without SharedArrayBuffer the only way to stop a synchronous
 * computation is to terminate the worker; the client then starts a fresh one on the next call.
 */
import type { Api, ApiName, BytesReply, ErrorPayload, FromWorker, ToWorker } from './protocol';

export class WorkerCallError extends Error {
  readonly payload: ErrorPayload;
  constructor(payload: ErrorPayload) {
    super(payload.message);
    this.name = payload.kind === 'cancelled' ? 'CancelledError' : payload.kind === 'input' ? 'InputFileError' : 'BugError';
    this.payload = payload;
  }
}

export interface CallOptions<P> {
  transfer?: Transferable[];
  onProgress?: (p: P) => void;
}

export interface RunningCall<R> {
  readonly result: Promise<R>;
  /** Asks the worker to stop; false when it cannot be stopped (no shared memory and the worker keeps state). */
  cancel(): boolean;
}

interface Pending {
  resolve: (v: unknown) => void;
  reject: (e: unknown) => void;
  onProgress?: (p: unknown) => void;
}

export class WorkerClient {
  #make: () => Worker;
  #worker: Worker | null = null;
  #nextId = 1;
  #pending = new Map<number, Pending>();
  #readBytes: ((fileId: string, offsetBytes: number, lengthBytes: number) => Promise<Uint8Array>) | null;

  #mayTerminate: boolean;

  /**
   * `readBytes` serves the worker's reads of desktop files (window.dipweave.readRange). `mayTerminate`: whether
   * a cancel without shared memory may stop the worker (false for a worker that keeps the open file).
   */
  constructor(make: () => Worker, readBytes: ((fileId: string, offsetBytes: number, lengthBytes: number) => Promise<Uint8Array>) | null = null, mayTerminate = true) {
    this.#make = make;
    this.#readBytes = readBytes;
    this.#mayTerminate = mayTerminate;
  }

  get #w(): Worker {
    if (!this.#worker) {
      const w = this.#make();
      w.onmessage = (ev: MessageEvent<FromWorker>) => this.#receive(ev.data);
      w.onerror = (ev: ErrorEvent) => this.#failAll({ kind: 'bug', message: `worker failed: ${ev.message || 'unknown error'}` });
      this.#worker = w;
    }
    return this.#worker;
  }

  #receive(msg: FromWorker): void {
    if (msg.type === 'need-bytes') {
      void this.#serveBytes(msg.id, msg.fileId, msg.offsetBytes, msg.lengthBytes);
      return;
    }
    const p = this.#pending.get(msg.id);
    if (!p) return;
    if (msg.type === 'progress') {
      p.onProgress?.(msg.progress);
      return;
    }
    this.#pending.delete(msg.id);
    if (msg.type === 'ok') p.resolve(msg.result);
    else p.reject(new WorkerCallError(msg.error));
  }

  #failAll(error: ErrorPayload): void {
    for (const p of this.#pending.values()) p.reject(new WorkerCallError(error));
    this.#pending.clear();
    this.#worker?.terminate();
    this.#worker = null;
  }

  async #serveBytes(id: number, fileId: string, offsetBytes: number, lengthBytes: number): Promise<void> {
    let reply: BytesReply;
    try {
      if (!this.#readBytes) throw new Error('no desktop file access in this window');
      reply = { type: 'bytes', id, bytes: await this.#readBytes(fileId, offsetBytes, lengthBytes), error: null };
    } catch (e) {
      reply = { type: 'bytes', id, bytes: null, error: e instanceof Error ? e.message : String(e) };
    }
    this.#worker?.postMessage(reply);
  }

  /** Starts a call that can be cancelled. */
  start<K extends ApiName>(type: K, payload: Api[K]['req'], options: CallOptions<Api[K]['progress']> = {}): RunningCall<Api[K]['res']> {
    const id = this.#nextId++;
    const shared = typeof SharedArrayBuffer !== 'undefined' && globalThis.crossOriginIsolated === true;
    const flag = shared ? new Int32Array(new SharedArrayBuffer(4)) : null;
    const result = new Promise<Api[K]['res']>((resolve, reject) => {
      this.#pending.set(id, { resolve: resolve as (v: unknown) => void, reject, onProgress: options.onProgress as ((p: unknown) => void) | undefined });
    });
    const msg = { id, type, payload, cancelFlag: flag } as ToWorker;
    this.#w.postMessage(msg, options.transfer ?? []);
    return {
      result,
      cancel: () => {
        if (!this.#pending.has(id)) return true;
        if (flag) {
          Atomics.store(flag, 0, 1);
        } else {
          if (!this.#mayTerminate) return false;
          // No shared memory: stop the worker outright; it restarts on the next call.
          const p = this.#pending.get(id)!;
          this.#pending.delete(id);
          p.reject(new WorkerCallError({ kind: 'cancelled', message: 'cancelled' }));
          this.#failAll({ kind: 'bug', message: 'worker stopped to cancel another job' });
        }
        return true;
      },
    };
  }

  call<K extends ApiName>(type: K, payload: Api[K]['req'], options: CallOptions<Api[K]['progress']> = {}): Promise<Api[K]['res']> {
    return this.start(type, payload, options).result;
  }

  dispose(): void {
    this.#failAll({ kind: 'cancelled', message: 'closed' });
  }
}

export function isCancelled(e: unknown): boolean {
  return e instanceof Error && e.name === 'CancelledError';
}
