/**
 * The main process's file registry: files opened for reading (by dialog, recent list or demo name only),
 * saves in progress (temporary file beside the target, renamed on finish), and the recent-files list.
 * The renderer only ever holds the ids issued here. No electron import: the dialogs are injected, so
 * this class is tested directly with hostile arguments.
 */
import { constants as fsc } from 'node:fs';
import { open, readFile, readdir, rename, rm, stat, writeFile, realpath, mkdir, type FileHandle } from 'node:fs/promises';
import { basename, dirname, join, resolve } from 'node:path';
import { InputFileError } from '../../core/problems';
import { MAX_CHUNK_BYTES, MAX_READ_BYTES, SAVE_KINDS, type OpenedFile, type RecentFile, type SaveKind, type SavedFile } from '../shared/ipc';
import { badArgument, checkBaseName, checkBytes, checkId, checkInteger, checkOneOf, checkString } from './validate';

export interface HostFilesOptions {
  /** Folder of the bundled demo files (samples/). */
  samplesDir: string;
  /** JSON file that keeps the recent list between sessions. */
  recentStorePath: string;
  /** Shows the open dialog; resolves to a path or null. */
  chooseOpenPath: () => Promise<string | null>;
  /** Shows the save dialog; resolves to a path or null. */
  chooseSavePath: (defaultName: string, kind: SaveKind) => Promise<string | null>;
  maxOpenFiles?: number;
  maxRecent?: number;
}

interface OpenEntry {
  path: string;
  handle: FileHandle;
  info: OpenedFile;
}

interface SaveEntry {
  targetPath: string;
  tempPath: string;
  handle: FileHandle;
  sizeBytes: number;
  /** Calls on one save run one after another (the renderer may send chunks without awaiting each). */
  queue: Promise<unknown>;
}

const MAX_PATH_CHARS = 4096;
const MAX_SAVES = 8;
/** Largest file the renderer may write through one save (1 TiB): a bound, not a quota. */
const MAX_SAVE_BYTES = 2 ** 40;

function fileProblem(code: 'input.file-not-found' | 'input.read-failed' | 'output.write-failed', path: string, err: unknown, hint: string): InputFileError {
  const reason = err instanceof Error ? err.message : String(err);
  return new InputFileError({ code, severity: 'error', message: `The file could not be used (${reason}).`, file: path, hint });
}

export class HostFiles {
  private readonly opts: Required<HostFilesOptions>;
  private readonly files = new Map<string, OpenEntry>();
  private readonly saves = new Map<string, SaveEntry>();
  private nextFile = 1;
  private nextSave = 1;
  private recent: RecentFile[] | null = null;

  constructor(options: HostFilesOptions) {
    this.opts = { maxOpenFiles: 64, maxRecent: 10, ...options };
  }

  async openFileDialog(): Promise<OpenedFile | null> {
    const path = await this.opts.chooseOpenPath();
    if (path === null) return null;
    const file = await this.openPath(path, false);
    await this.addRecent(path);
    return file;
  }

  async listSamples(): Promise<string[]> {
    try {
      return (await readdir(this.opts.samplesDir)).filter((n) => n.toLowerCase().endsWith('.sgy')).sort();
    } catch {
      return [];
    }
  }

  async openSample(name: unknown): Promise<OpenedFile> {
    const n = checkString('name', name, 200);
    const names = await this.listSamples();
    if (!names.includes(n)) throw badArgument('name', name, `one of the bundled demo files: ${names.join(', ') || '(none found)'}`);
    return this.openPath(join(this.opts.samplesDir, n), true);
  }

  async readRange(fileId: unknown, offsetBytes: unknown, lengthBytes: unknown): Promise<Uint8Array> {
    const entry = this.file(fileId);
    const offset = checkInteger('offsetBytes', offsetBytes, 0, Number.MAX_SAFE_INTEGER);
    const length = checkInteger('lengthBytes', lengthBytes, 0, MAX_READ_BYTES);
    if (offset > entry.info.sizeBytes) throw badArgument('offsetBytes', offsetBytes, `at most the file size, ${entry.info.sizeBytes}`);
    const n = Math.min(length, entry.info.sizeBytes - offset);
    const out = new Uint8Array(n);
    let done = 0;
    try {
      while (done < n) {
        const { bytesRead } = await entry.handle.read(out, done, n - done, offset + done);
        if (bytesRead === 0) break; // the file shrank since it was opened
        done += bytesRead;
      }
    } catch (err) {
      throw fileProblem('input.read-failed', entry.info.name, err, 'Check that the file is still there and readable.');
    }
    return done === n ? out : out.subarray(0, done);
  }

  async closeFile(fileId: unknown): Promise<void> {
    const id = checkId('fileId', fileId, 'f');
    const entry = this.files.get(id);
    if (!entry) return;
    this.files.delete(id);
    await entry.handle.close();
  }

  async recentFiles(): Promise<RecentFile[]> {
    return (await this.loadRecent()).map((r) => ({ ...r }));
  }

  /** Opens a path from the recent list (and only from it); null when the file has gone (it leaves the list). */
  async openRecent(path: unknown): Promise<OpenedFile | null> {
    const p = checkString('path', path, MAX_PATH_CHARS);
    const list = await this.loadRecent();
    if (!list.some((r) => r.path === p)) throw badArgument('path', path, 'a path from the recent-files list');
    try {
      const file = await this.openPath(p, false);
      await this.addRecent(p);
      return file;
    } catch (err) {
      if (err instanceof InputFileError && err.problem.code === 'input.file-not-found') {
        this.recent = list.filter((r) => r.path !== p);
        await this.storeRecent();
        return null;
      }
      throw err;
    }
  }

  async saveDialog(defaultName: unknown, kind: unknown): Promise<{ saveId: string } | null> {
    const name = checkBaseName('defaultName', defaultName);
    const k = checkOneOf('kind', kind, SAVE_KINDS);
    if (this.saves.size >= MAX_SAVES) throw badArgument('saveDialog', this.saves.size, `at most ${MAX_SAVES} saves in progress`);
    const chosen = await this.opts.chooseSavePath(name, k);
    if (chosen === null) return null;
    const target = resolve(chosen);
    await this.refuseInputPath(target);
    const id = `s${this.nextSave++}`;
    const tempPath = join(dirname(target), `.${basename(target)}.${process.pid}-${id}.part`);
    let handle: FileHandle;
    try {
      handle = await open(tempPath, fsc.O_WRONLY | fsc.O_CREAT | fsc.O_EXCL, 0o644);
    } catch (err) {
      throw fileProblem('output.write-failed', target, err, 'Choose a folder you can write to.');
    }
    this.saves.set(id, { targetPath: target, tempPath, handle, sizeBytes: 0, queue: Promise.resolve() });
    return { saveId: id };
  }

  async writeChunk(saveId: unknown, bytes: unknown): Promise<void> {
    const [id, entry] = this.save(saveId);
    const b = checkBytes('bytes', bytes, MAX_CHUNK_BYTES);
    return this.enqueue(entry, async () => {
      if (this.saves.get(id) !== entry) throw badArgument('saveId', saveId, 'the id of a save in progress');
      if (entry.sizeBytes + b.length > MAX_SAVE_BYTES) throw badArgument('bytes', bytes, `a file of at most ${MAX_SAVE_BYTES} bytes in all`);
      try {
        let done = 0;
        while (done < b.length) {
          const { bytesWritten } = await entry.handle.write(b, done, b.length - done, entry.sizeBytes + done);
          done += bytesWritten;
        }
        entry.sizeBytes += b.length;
      } catch (err) {
        await this.dropSave(id, entry);
        throw fileProblem('output.write-failed', entry.targetPath, err, 'The disk may be full; nothing was written at the chosen path.');
      }
    });
  }

  async finishSave(saveId: unknown): Promise<SavedFile> {
    const [id, entry] = this.save(saveId);
    return this.enqueue(entry, async () => {
      if (this.saves.get(id) !== entry) throw badArgument('saveId', saveId, 'the id of a save in progress');
      try {
        await this.refuseInputPath(entry.targetPath);
        await entry.handle.sync();
        await entry.handle.close();
        this.saves.delete(id);
        await rename(entry.tempPath, entry.targetPath);
      } catch (err) {
        await this.dropSave(id, entry);
        if (err instanceof InputFileError) throw err;
        throw fileProblem('output.write-failed', entry.targetPath, err, 'Nothing was written at the chosen path.');
      }
      return { name: basename(entry.targetPath), sizeBytes: entry.sizeBytes };
    });
  }

  private enqueue<T>(entry: SaveEntry, step: () => Promise<T>): Promise<T> {
    const run = entry.queue.then(step, step);
    entry.queue = run.catch(() => undefined);
    return run;
  }

  async abortSave(saveId: unknown): Promise<void> {
    const id = checkId('saveId', saveId, 's');
    const entry = this.saves.get(id);
    if (entry) await this.enqueue(entry, () => this.dropSave(id, entry));
  }

  /** Closes every handle and removes unfinished temporary files (on quit). */
  async dispose(): Promise<void> {
    for (const [id, e] of [...this.saves]) await this.dropSave(id, e);
    for (const [id, e] of [...this.files]) {
      this.files.delete(id);
      await e.handle.close().catch(() => undefined);
    }
  }

  /** Opened input paths (for tests and the overwrite guard). */
  openPaths(): string[] {
    return [...this.files.values()].map((e) => e.path);
  }

  private file(fileId: unknown): OpenEntry {
    const id = checkId('fileId', fileId, 'f');
    const entry = this.files.get(id);
    if (!entry) throw badArgument('fileId', fileId, 'the id of a file that is open');
    return entry;
  }

  private save(saveId: unknown): [string, SaveEntry] {
    const id = checkId('saveId', saveId, 's');
    const entry = this.saves.get(id);
    if (!entry) throw badArgument('saveId', saveId, 'the id of a save in progress');
    return [id, entry];
  }

  private async dropSave(id: string, entry: SaveEntry): Promise<void> {
    this.saves.delete(id);
    await entry.handle.close().catch(() => undefined);
    await rm(entry.tempPath, { force: true }).catch(() => undefined);
  }

  private async openPath(path: string, demo: boolean): Promise<OpenedFile> {
    if (this.files.size >= this.opts.maxOpenFiles)
      throw badArgument('open', this.files.size, `at most ${this.opts.maxOpenFiles} open files; close one first`);
    let canonical: string;
    let handle: FileHandle;
    try {
      canonical = await realpath(path);
      handle = await open(canonical, 'r');
    } catch (err) {
      const code = (err as NodeJS.ErrnoException).code === 'ENOENT' ? 'input.file-not-found' : 'input.read-failed';
      throw fileProblem(code, path, err, 'Check the path and the file permissions.');
    }
    const st = await handle.stat();
    if (!st.isFile()) {
      await handle.close();
      throw fileProblem('input.read-failed', path, new Error('not a regular file'), 'Choose a SEG-Y file.');
    }
    const id = `f${this.nextFile++}`;
    const info: OpenedFile = { fileId: id, name: basename(canonical), sizeBytes: st.size, demo };
    this.files.set(id, { path: canonical, handle, info });
    return { ...info };
  }

  /** Refuses a save target that is (or resolves to) an opened input file. */
  private async refuseInputPath(target: string): Promise<void> {
    let canonical = target;
    try {
      canonical = join(await realpath(dirname(target)), basename(target));
      canonical = await realpath(canonical);
    } catch {
      // the target does not exist yet: its folder's real path is enough
    }
    const inputs = new Set(this.openPaths());
    let same = inputs.has(canonical) || inputs.has(target);
    // The bundled demo files are inputs too, open or not.
    const samples = await realpath(this.opts.samplesDir).catch(() => resolve(this.opts.samplesDir));
    if (dirname(canonical) === samples) same = true;
    if (!same) {
      // hard links and other aliases: compare device and inode
      try {
        const t = await stat(canonical);
        for (const p of inputs) {
          const s = await stat(p);
          if (s.ino === t.ino && s.dev === t.dev) same = true;
        }
      } catch {
        // target absent: no alias possible
      }
    }
    if (same)
      throw new InputFileError({
        code: 'input.would-overwrite',
        severity: 'error',
        message: 'Dipweave never writes over a file it has open as input.',
        file: basename(target),
        hint: 'Choose another name; the input file stays unchanged.',
      });
  }

  private async loadRecent(): Promise<RecentFile[]> {
    if (this.recent) return this.recent;
    let list: RecentFile[] = [];
    try {
      const raw: unknown = JSON.parse(await readFile(this.opts.recentStorePath, 'utf8'));
      if (Array.isArray(raw))
        list = raw
          .filter((p): p is string => typeof p === 'string' && p.length > 0 && p.length <= MAX_PATH_CHARS)
          .slice(0, this.opts.maxRecent)
          .map((p) => ({ path: p, name: basename(p) }));
    } catch {
      // absent or damaged store: start with an empty list
    }
    this.recent = list;
    return list;
  }

  private async addRecent(path: string): Promise<void> {
    const list = await this.loadRecent();
    const canonical = await realpath(path).catch(() => path);
    this.recent = [{ path: canonical, name: basename(canonical) }, ...list.filter((r) => r.path !== canonical)].slice(0, this.opts.maxRecent);
    await this.storeRecent();
  }

  private async storeRecent(): Promise<void> {
    try {
      await mkdir(dirname(this.opts.recentStorePath), { recursive: true });
      await writeFile(this.opts.recentStorePath, JSON.stringify((this.recent ?? []).map((r) => r.path), null, 1));
    } catch {
      // the list is a convenience; failing to store it must not fail the open
    }
  }
}
