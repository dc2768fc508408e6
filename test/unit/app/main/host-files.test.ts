// HostFiles with hostile arguments: every call from the renderer is checked (issue 6, "the IPC validation
// tested with hostile arguments"). Real files in a temporary folder; the dialogs are injected.
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { mkdtemp, mkdir, readFile, readdir, rm, symlink, writeFile, link } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { HostFiles } from '../../../../app/main/host-files';
import { MAX_CHUNK_BYTES, MAX_READ_BYTES, type SaveKind } from '../../../../app/shared/ipc';
import { isInputFileError } from '../../../../core/problems';

let dir: string;
let nextOpen: string | null;
let nextSave: string | null;
let files: HostFiles;
const payload = Uint8Array.from({ length: 1000 }, (_, i) => (i * 7) & 255);

async function codeOf(p: Promise<unknown>): Promise<string> {
  try {
    await p;
  } catch (e) {
    if (isInputFileError(e)) return e.problem.code;
    throw e;
  }
  return 'resolved';
}

beforeEach(async () => {
  dir = await mkdtemp(join(tmpdir(), 'dipweave-host-'));
  await mkdir(join(dir, 'samples'));
  await writeFile(join(dir, 'samples', 'demo-a.sgy'), payload);
  await writeFile(join(dir, 'samples', 'notes.txt'), 'not a sample');
  await writeFile(join(dir, 'input.sgy'), payload);
  await writeFile(join(dir, 'secret.txt'), 'secret');
  nextOpen = join(dir, 'input.sgy');
  nextSave = join(dir, 'out.sgy');
  files = new HostFiles({
    samplesDir: join(dir, 'samples'),
    recentStorePath: join(dir, 'state', 'recent.json'),
    chooseOpenPath: async () => nextOpen,
    chooseSavePath: async (_name: string, _kind: SaveKind) => nextSave,
  });
});

afterEach(async () => {
  await files.dispose();
  await rm(dir, { recursive: true, force: true });
});

describe('reading', () => {
  it('opens through the dialog and reads exact ranges, shorter only at the end', async () => {
    const f = await files.openFileDialog();
    expect(f).toEqual({ fileId: 'f1', name: 'input.sgy', sizeBytes: 1000, demo: false });
    expect(Array.from(await files.readRange('f1', 10, 5))).toEqual(Array.from(payload.subarray(10, 15)));
    expect((await files.readRange('f1', 990, 100)).length).toBe(10);
    expect((await files.readRange('f1', 1000, 100)).length).toBe(0);
  });

  it('returns null when the dialog is cancelled', async () => {
    nextOpen = null;
    expect(await files.openFileDialog()).toBeNull();
  });

  it.each([
    ['negative offset', 'f1', -1, 10],
    ['fractional offset', 'f1', 1.5, 10],
    ['NaN offset', 'f1', Number.NaN, 10],
    ['Infinity offset', 'f1', Number.POSITIVE_INFINITY, 10],
    ['string offset', 'f1', '0', 10],
    ['offset past the end', 'f1', 1001, 1],
    ['huge offset', 'f1', 2 ** 60, 1],
    ['negative length', 'f1', 0, -5],
    ['oversized length', 'f1', 0, MAX_READ_BYTES + 1],
    ['object length', 'f1', 0, { valueOf: (): number => 4 }],
    ['unknown id', 'f99', 0, 1],
    ['id of another kind', 's1', 0, 1],
    ['traversal id', '../input.sgy', 0, 1],
    ['non-string id', 1, 0, 1],
    ['prototype id', '__proto__', 0, 1],
  ])('refuses %s', async (_label, id, offset, length) => {
    await files.openFileDialog();
    expect(await codeOf(files.readRange(id, offset, length))).toBe('input.bad-argument');
  });

  it('opens demo files by listed name only', async () => {
    expect(await files.listSamples()).toEqual(['demo-a.sgy']);
    const f = await files.openSample('demo-a.sgy');
    expect(f.demo).toBe(true);
    for (const bad of ['../input.sgy', '../secret.txt', 'notes.txt', '/etc/passwd', 'demo-a.sgy/..', '', 42, null])
      expect(await codeOf(files.openSample(bad))).toBe('input.bad-argument');
  });

  it('opens recent files only from the recent list, and keeps the list across sessions', async () => {
    await files.openFileDialog();
    const recent = await files.recentFiles();
    expect(recent.map((r) => r.name)).toEqual(['input.sgy']);
    for (const bad of [join(dir, 'secret.txt'), `${recent[0].path}/../secret.txt`, '', 7, ['x']])
      expect(await codeOf(files.openRecent(bad))).toBe('input.bad-argument');
    const again = new HostFiles({ samplesDir: dir, recentStorePath: join(dir, 'state', 'recent.json'), chooseOpenPath: async () => null, chooseSavePath: async () => null });
    expect((await again.recentFiles()).map((r) => r.path)).toEqual([recent[0].path]);
    const f = await again.openRecent(recent[0].path);
    expect(f?.name).toBe('input.sgy');
    await again.dispose();
  });

  it('drops a recent file that has gone and survives a damaged store', async () => {
    await files.openFileDialog();
    const [r] = await files.recentFiles();
    await rm(join(dir, 'input.sgy'));
    expect(await files.openRecent(r.path)).toBeNull();
    expect(await files.recentFiles()).toEqual([]);
    await writeFile(join(dir, 'state', 'recent.json'), '{not json');
    const fresh = new HostFiles({ samplesDir: dir, recentStorePath: join(dir, 'state', 'recent.json'), chooseOpenPath: async () => null, chooseSavePath: async () => null });
    expect(await fresh.recentFiles()).toEqual([]);
  });

  it('closes files; a closed id is refused', async () => {
    await files.openFileDialog();
    await files.closeFile('f1');
    expect(await codeOf(files.readRange('f1', 0, 1))).toBe('input.bad-argument');
  });
});

describe('saving', () => {
  it('writes to a temporary file and renames it on finish', async () => {
    const s = await files.saveDialog('out.sgy', 'segy');
    expect(s).toEqual({ saveId: 's1' });
    await files.writeChunk('s1', payload.subarray(0, 600));
    await files.writeChunk('s1', payload.subarray(600));
    expect(await readdir(dir)).not.toContain('out.sgy');
    expect(await files.finishSave('s1')).toEqual({ name: 'out.sgy', sizeBytes: 1000 });
    expect(new Uint8Array(await readFile(join(dir, 'out.sgy')))).toEqual(payload);
    expect((await readdir(dir)).filter((n) => n.endsWith('.part'))).toEqual([]);
    expect(await codeOf(files.writeChunk('s1', payload))).toBe('input.bad-argument');
  });

  it('keeps chunks in call order when the renderer does not await each one', async () => {
    await files.saveDialog('out.sgy', 'segy');
    const chunks = Array.from({ length: 50 }, (_, i) => payload.subarray(i * 20, (i + 1) * 20));
    await Promise.all(chunks.map((c) => files.writeChunk('s1', c)));
    expect(await files.finishSave('s1')).toEqual({ name: 'out.sgy', sizeBytes: 1000 });
    expect(new Uint8Array(await readFile(join(dir, 'out.sgy')))).toEqual(payload);
  });

  it('abort leaves an existing target untouched and removes the temporary file', async () => {
    await writeFile(join(dir, 'out.sgy'), 'keep me');
    await files.saveDialog('out.sgy', 'segy');
    await files.writeChunk('s1', payload);
    await files.abortSave('s1');
    expect(await readFile(join(dir, 'out.sgy'), 'utf8')).toBe('keep me');
    expect((await readdir(dir)).filter((n) => n.endsWith('.part'))).toEqual([]);
  });

  it('refuses to write over an opened input file, also through a symbolic or hard link', async () => {
    await files.openFileDialog();
    await symlink(join(dir, 'input.sgy'), join(dir, 'alias.sgy'));
    await link(join(dir, 'input.sgy'), join(dir, 'hard.sgy'));
    for (const target of [join(dir, 'input.sgy'), join(dir, 'alias.sgy'), join(dir, 'hard.sgy'), join(dir, 'sub', '..', 'input.sgy')]) {
      nextSave = target;
      expect(await codeOf(files.saveDialog('x.sgy', 'segy'))).toBe('input.would-overwrite');
    }
    expect(new Uint8Array(await readFile(join(dir, 'input.sgy')))).toEqual(payload);
  });

  it('refuses to write into the folder of the bundled demo files, open or not', async () => {
    nextSave = join(dir, 'samples', 'demo-a.sgy');
    expect(await codeOf(files.saveDialog('x.sgy', 'segy'))).toBe('input.would-overwrite');
    nextSave = join(dir, 'samples', 'new.sgy');
    expect(await codeOf(files.saveDialog('x.sgy', 'segy'))).toBe('input.would-overwrite');
    expect(new Uint8Array(await readFile(join(dir, 'samples', 'demo-a.sgy')))).toEqual(payload);
  });

  it('re-checks the target at finish (an input opened after the dialog)', async () => {
    nextSave = join(dir, 'input.sgy');
    await files.saveDialog('x.sgy', 'segy');
    await files.writeChunk('s1', Uint8Array.of(1, 2, 3));
    await files.openFileDialog();
    expect(await codeOf(files.finishSave('s1'))).toBe('input.would-overwrite');
    expect(new Uint8Array(await readFile(join(dir, 'input.sgy')))).toEqual(payload);
    expect((await readdir(dir)).filter((n) => n.endsWith('.part'))).toEqual([]);
  });

  it.each([
    ['a traversal name', '../evil.sgy', 'segy'],
    ['an absolute name', '/tmp/evil.sgy', 'segy'],
    ['a Windows path', 'C:\\evil.sgy', 'segy'],
    ['a hidden name', '.bashrc', 'segy'],
    ['an empty name', '', 'segy'],
    ['a NUL byte', 'a\0.sgy', 'segy'],
    ['an unknown kind', 'out.exe', 'exe'],
    ['a non-string kind', 'out.sgy', 3],
    ['a very long name', 'a'.repeat(5000), 'segy'],
  ])('saveDialog refuses %s', async (_label, name, kind) => {
    expect(await codeOf(files.saveDialog(name, kind))).toBe('input.bad-argument');
  });

  it.each([
    ['a plain array', [1, 2, 3]],
    ['a string', 'abc'],
    ['an ArrayBuffer', new ArrayBuffer(4)],
    ['a Float32Array', new Float32Array(2)],
    ['null', null],
  ])('writeChunk refuses %s', async (_label, bytes) => {
    await files.saveDialog('out.sgy', 'segy');
    expect(await codeOf(files.writeChunk('s1', bytes))).toBe('input.bad-argument');
  });

  it('writeChunk refuses an oversized buffer and unknown save ids', async () => {
    await files.saveDialog('out.sgy', 'segy');
    expect(await codeOf(files.writeChunk('s1', new Uint8Array(MAX_CHUNK_BYTES + 1)))).toBe('input.bad-argument');
    expect(await codeOf(files.writeChunk('s2', payload))).toBe('input.bad-argument');
    expect(await codeOf(files.finishSave('f1'))).toBe('input.bad-argument');
    expect(await codeOf(files.abortSave({}))).toBe('input.bad-argument');
  });

  it('returns null when the save dialog is cancelled', async () => {
    nextSave = null;
    expect(await files.saveDialog('out.sgy', 'png')).toBeNull();
  });
});
