import { afterEach, describe, expect, it, vi } from 'vitest';
import { blobByteSource, remoteByteSource } from '../../../../../app/renderer/io/blob-source';
import { pushRecentName, readRecentNames, saveBytes } from '../../../../../app/renderer/io/host';
import { MAX_CHUNK_BYTES, type DipweaveDesktopApi } from '../../../../../app/shared/ipc';
import { isInputFileError } from '../../../../../core/problems';

afterEach(() => {
  delete (globalThis as { window?: unknown }).window;
});

describe('ByteSources of the renderer', () => {
  const bytes = Uint8Array.from({ length: 5000 }, (_, i) => i % 251);

  it('Blob.slice source returns exactly the requested bytes', async () => {
    const src = blobByteSource('a.sgy', new Blob([bytes]));
    expect(src.sizeBytes).toBe(5000);
    expect(Array.from(await src.read(3600, 7))).toEqual(Array.from(bytes.subarray(3600, 3607)));
  });

  it('reads past the end are coded segy.truncated problems naming the file and offset', async () => {
    const src = blobByteSource('a.sgy', new Blob([bytes]));
    const e = await src.read(4990, 20).catch((x: unknown) => x);
    expect(isInputFileError(e) && e.problem.code).toBe('segy.truncated');
    expect(isInputFileError(e) && e.problem.byteOffset).toBe(4990);
  });

  it('a desktop file read through the page: short answers are refused, not passed on', async () => {
    const src = remoteByteSource('b.sgy', 5000, async (o, l) => bytes.slice(o, o + l - (o === 100 ? 1 : 0)));
    expect((await src.read(0, 10)).length).toBe(10);
    const e = await src.read(100, 10).catch((x: unknown) => x);
    expect(isInputFileError(e) && e.problem.code).toBe('segy.truncated');
  });
});

describe('saving through the desktop shell', () => {
  function fakeApi(failAt = -1) {
    const chunks: number[] = [];
    const calls: string[] = [];
    const api: Partial<DipweaveDesktopApi> = {
      saveDialog: vi.fn(async () => ({ saveId: 's1' })),
      writeChunk: vi.fn(async (_id: string, b: Uint8Array) => {
        if (chunks.length === failAt) throw new Error('disk full [output.write-failed]');
        chunks.push(b.length);
      }),
      finishSave: vi.fn(async () => { calls.push('finish'); return { name: 'out.sgy', sizeBytes: chunks.reduce((a, b) => a + b, 0) }; }),
      abortSave: vi.fn(async () => { calls.push('abort'); }),
    };
    (globalThis as { window?: unknown }).window = { dipweave: api };
    return { chunks, calls, api };
  }

  it('writes in chunks of at most MAX_CHUNK_BYTES and finishes', async () => {
    const f = fakeApi();
    const size = MAX_CHUNK_BYTES + 10;
    const r = await saveBytes('out.sgy', 'segy', new Blob([new Uint8Array(size)]));
    expect(r).toEqual({ saved: true, name: 'out.sgy', sizeBytes: size });
    expect(f.chunks).toEqual([MAX_CHUNK_BYTES, 10]);
    expect(f.calls).toEqual(['finish']);
  });

  it('a failed write aborts the save (the chosen path is left untouched) and reports the error', async () => {
    const f = fakeApi(0);
    await expect(saveBytes('out.sgy', 'segy', new Uint8Array(10))).rejects.toThrow('output.write-failed');
    expect(f.calls).toEqual(['abort']);
  });

  it('a cancelled dialog saves nothing', async () => {
    const f = fakeApi();
    (f.api.saveDialog as ReturnType<typeof vi.fn>).mockResolvedValueOnce(null);
    expect(await saveBytes('out.sgy', 'segy', new Uint8Array(10))).toEqual({ saved: false });
    expect(f.chunks).toEqual([]);
  });
});

describe('recent names in a browser', () => {
  it('keeps the ten latest, newest first, without repeats, and survives junk', () => {
    const m = new Map<string, string>();
    const store = { getItem: (k: string) => m.get(k) ?? null, setItem: (k: string, v: string) => void m.set(k, v) };
    for (let i = 0; i < 12; i++) pushRecentName(store, `f${i}.sgy`);
    pushRecentName(store, 'f5.sgy');
    const names = readRecentNames(store);
    expect(names.length).toBe(10);
    expect(names[0]).toBe('f5.sgy');
    expect(names.filter((n) => n === 'f5.sgy').length).toBe(1);
    m.set('dipweave.recent.v1', '{oops');
    expect(readRecentNames(store)).toEqual([]);
  });
});
