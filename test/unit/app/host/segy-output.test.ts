import { copyFileSync, existsSync, linkSync, mkdtempSync, readdirSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { assertNotAnInput, writeFileAtomically } from '../../../../app/host/atomic-output';
import { openFileByteSource } from '../../../../app/host/file-source';
import { writeFilledSegy } from '../../../../app/host/segy-output';
import { isInputFileError } from '../../../../core/problems';
import { gatherGeometry } from '../../../../core/segy/geometry';
import { indexGathers, parseGatherKey, readGather } from '../../../../core/segy/gathers';
import { openSegy } from '../../../../core/segy/open';

const FIXTURES = new URL('../../../fixtures/segy/', import.meta.url).pathname;
const dir = mkdtempSync(join(tmpdir(), 'dipweave-out-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function code(p: Promise<unknown>): Promise<string | undefined> {
  try { await p; } catch (e) { return isInputFileError(e) ? e.problem.code : `not an input error: ${String(e)}`; }
  return undefined;
}

describe('atomic output', () => {
  const input = join(dir, 'in.sgy');
  copyFileSync(join(FIXTURES, 'good.sgy'), input);

  it('refuses the input itself, a symbolic link to it and a hard link to it', async () => {
    symlinkSync(input, join(dir, 'sym.sgy'));
    linkSync(input, join(dir, 'hard.sgy'));
    for (const out of [input, join(dir, 'sym.sgy'), join(dir, 'hard.sgy'), join(dir, '.', 'in.sgy')])
      expect(await code(assertNotAnInput(out, [input]))).toBe('input.would-overwrite');
    expect(await code(assertNotAnInput(join(dir, 'new.sgy'), [input]))).toBeUndefined();
    expect(await code(assertNotAnInput(join(dir, 'no-such-folder', 'x.sgy'), [input]))).toBe('input.file-not-found');
  });

  it('leaves no file behind on error or cancellation, and renames only on success', async () => {
    const out = join(dir, 'atomic.bin');
    await expect(writeFileAtomically(out, [input], async (s) => { await s.write(new Uint8Array(10)); throw new Error('boom'); })).rejects.toThrow('boom');
    const cancel = { cancelled: false };
    await expect(writeFileAtomically(out, [input], async (s) => { await s.write(new Uint8Array(10)); cancel.cancelled = true; await s.write(new Uint8Array(1)); }, cancel)).rejects.toThrow('cancelled');
    expect(existsSync(out)).toBe(false);
    expect(readdirSync(dir).filter((f) => f.includes('partial'))).toEqual([]);
    const n = await writeFileAtomically(out, [input], async (s) => { await s.write(new Uint8Array([1, 2, 3, 4])); await s.writeAt(1, new Uint8Array([9])); });
    expect(n).toBe(4);
    expect(Array.from(readFileSync(out))).toEqual([1, 9, 3, 4]);
    const before = readFileSync(input);
    expect(await code(writeFileAtomically(input, [input], async () => undefined))).toBe('input.would-overwrite');
    expect(readFileSync(input).equals(before)).toBe(true);
  });

  it('writes a filled SEG-Y file through a temporary file and leaves the input untouched', async () => {
    const inPath = join(dir, 'two.sgy');
    copyFileSync(join(FIXTURES, 'two-gathers.sgy'), inPath);
    const before = readFileSync(inPath);
    const outPath = join(dir, 'two-filled.sgy');
    writeFileSync(outPath, 'an older output, replaced on success');
    const src = await openFileByteSource(inPath);
    const f = await openSegy(src);
    const idx = await indexGathers(f, parseGatherKey('record'));
    const summary = await writeFilledSegy(outPath, inPath, f, { method: 'test' }, async (sink) => {
      for (let i = 0; i < idx.gathers.length; i++) {
        const g = await readGather(f, idx, i);
        const geo = gatherGeometry(g.headers, g.data, g.nSamples);
        const filled = new Uint8Array(geo.gridCount);
        for (const k of geo.missingGrid) filled[k] = 1;
        await sink.writeGather({ gather: g, geometry: geo, gridData: new Float32Array(geo.gridCount * g.nSamples), filled });
      }
    });
    await src.close();
    expect(summary.filledTraces).toBe(10);
    expect(readFileSync(inPath).equals(before)).toBe(true);
    const out = await openFileByteSource(outPath);
    const back = await openSegy(out);
    expect(back.traceCount).toBe(32);
    expect(back.textCards.join('')).toContain('FILLED: 10 OF 32 TRACES');
    await out.close();
  });
});

describe('file byte source', () => {
  it('reads ranges, refuses reads past the end with segy.truncated, and names missing files', async () => {
    const src = await openFileByteSource(join(FIXTURES, 'good.sgy'));
    expect(src.sizeBytes).toBe(8880);
    expect(Array.from(await src.read(3224, 2))).toEqual([0, 5]); // format code 5, big-endian
    expect(await code(src.read(8870, 20))).toBe('segy.truncated');
    await src.close();
    expect(await code(openFileByteSource(join(dir, 'absent.sgy')))).toBe('input.file-not-found');
    expect(await code(openFileByteSource(dir))).toBe('input.file-not-found');
  });
});

describe('large files', () => {
  it('opens a 10 GB file (sparse, on disk) and reads its last trace without loading it', async () => {
    const { openSync, ftruncateSync, writeSync, closeSync, statSync } = await import('node:fs');
    const path = join(dir, 'ten-gb.sgy');
    const nSamples = 1000;
    const traceBytes = 240 + 4 * nSamples;
    const nTraces = Math.ceil(10.1e9 / traceBytes);
    const size = 3600 + nTraces * traceBytes;
    const head = new Uint8Array(3600);
    const hv = new DataView(head.buffer);
    head.fill(0x40, 0, 3200);
    hv.setInt16(3216, 4000);
    hv.setUint16(3220, nSamples);
    hv.setInt16(3224, 5);
    const last = new Uint8Array(traceBytes);
    const lv = new DataView(last.buffer);
    lv.setInt32(8, 77);
    for (let s = 0; s < nSamples; s++) lv.setFloat32(240 + 4 * s, s - 0.5);
    const fd = openSync(path, 'w');
    try {
      writeSync(fd, head, 0, 3600, 0);
      ftruncateSync(fd, size);
      writeSync(fd, last, 0, traceBytes, size - traceBytes);
    } finally {
      closeSync(fd);
    }
    expect(statSync(path).size).toBeGreaterThan(10e9);
    const src = await openFileByteSource(path);
    try {
      const { readTraces } = await import('../../../../core/segy/gathers');
      const f = await openSegy(src);
      expect(f.traceCount).toBe(nTraces);
      const g = await readTraces(f, 77, Int32Array.of(nTraces - 1));
      expect(g.headers[0].fields.FIELD_RECORD).toBe(77);
      expect(g.data[999]).toBe(998.5);
    } finally {
      await src.close();
      rmSync(path, { force: true });
    }
  });
});
