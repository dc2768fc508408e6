import { describe, expect, it } from 'vitest';
import { WorkerClient, isCancelled, WorkerCallError } from '../../../../../app/renderer/workers/rpc';
import type { FromWorker, ToWorker } from '../../../../../app/renderer/workers/protocol';

/** A stand-in Worker: records what the page posts and lets the test answer as the worker would. */
class FakeWorker {
  onmessage: ((ev: MessageEvent<FromWorker>) => void) | null = null;
  onerror: ((ev: ErrorEvent) => void) | null = null;
  posted: ToWorker[] = [];
  terminated = false;
  postMessage(msg: ToWorker): void { this.posted.push(msg); }
  terminate(): void { this.terminated = true; }
  reply(msg: FromWorker): void { this.onmessage?.({ data: msg } as MessageEvent<FromWorker>); }
}

function client(readBytes: ((f: string, o: number, l: number) => Promise<Uint8Array>) | null = null) {
  const made: FakeWorker[] = [];
  const c = new WorkerClient(() => { const w = new FakeWorker(); made.push(w); return w as unknown as Worker; }, readBytes);
  return { c, made };
}

describe('WorkerClient', () => {
  it('routes progress to the call and resolves with its result', async () => {
    const { c, made } = client();
    const seen: unknown[] = [];
    const p = c.call('header', { fileTrace: 3 }, { onProgress: (x) => seen.push(x) });
    const id = (made[0].posted[0] as { id: number }).id;
    made[0].reply({ id, type: 'progress', progress: { a: 1 } });
    made[0].reply({ id, type: 'ok', result: [{ name: 'OFFSET', byte: 37, value: 100 }] });
    expect(await p).toEqual([{ name: 'OFFSET', byte: 37, value: 100 }]);
    expect(seen).toEqual([{ a: 1 }]);
  });

  it('input problems keep their code; defects and cancellation are told apart', async () => {
    const { c, made } = client();
    const a = c.call('header', { fileTrace: 1 });
    const b = c.call('header', { fileTrace: 2 });
    const [ida, idb] = made[0].posted.map((m) => (m as { id: number }).id);
    made[0].reply({ id: ida, type: 'error', error: { kind: 'input', message: 'x [segy.truncated]', problem: { code: 'segy.truncated', severity: 'error', message: 'x' } } });
    made[0].reply({ id: idb, type: 'error', error: { kind: 'cancelled', message: 'cancelled' } });
    const ea = await a.catch((e: unknown) => e);
    const eb = await b.catch((e: unknown) => e);
    expect(ea instanceof WorkerCallError && ea.payload.problem?.code).toBe('segy.truncated');
    expect(isCancelled(eb)).toBe(true);
  });

  it('without shared memory, cancel stops the worker and the next call starts a fresh one', async () => {
    const { c, made } = client();
    const run = c.start('header', { fileTrace: 1 });
    run.cancel();
    expect(isCancelled(await run.result.catch((e: unknown) => e))).toBe(true);
    expect(made[0].terminated).toBe(true);
    void c.call('header', { fileTrace: 2 });
    expect(made.length).toBe(2);
  });

  it('serves the worker\'s byte requests for desktop files through the page', async () => {
    const { c, made } = client(async (fileId, o, l) => Uint8Array.from({ length: l }, (_, i) => (o + i + fileId.length) % 256));
    void c.call('header', { fileTrace: 0 });
    made[0].reply({ id: 77, type: 'need-bytes', fileId: 'f1', offsetBytes: 10, lengthBytes: 3 });
    await new Promise((r) => setTimeout(r, 0));
    expect(made[0].posted[1]).toEqual({ type: 'bytes', id: 77, bytes: Uint8Array.from([12, 13, 14]), error: null });
  });

  it('a crashed worker fails every pending call as a defect', async () => {
    const { c, made } = client();
    const p = c.call('header', { fileTrace: 0 });
    made[0].onerror?.({ message: 'boom' } as ErrorEvent);
    const e = await p.catch((x: unknown) => x);
    expect(e instanceof WorkerCallError && e.payload.kind).toBe('bug');
  });
});

describe('WorkerClient that keeps state', () => {
  it('refuses to terminate its worker to cancel when there is no shared memory', () => {
    const made: FakeWorker[] = [];
    const c = new WorkerClient(() => { const w = new FakeWorker(); made.push(w); return w as unknown as Worker; }, null, false);
    const run = c.start('header', { fileTrace: 1 });
    expect(run.cancel()).toBe(false);
    expect(made[0].terminated).toBe(false);
  });
});
