/**
 * Writing an output file safely: bytes stream into a temporary file in the output's folder, which is
 * renamed over the output name only when everything succeeded. On error or cancellation the temporary
 * file is removed. The output may never be one of the inputs (compared by real path, which sees through
 * symbolic links, and by device + inode, which sees hard links).
 */
import { randomBytes } from 'node:crypto';
import { open, realpath, rename, stat, unlink, type FileHandle } from 'node:fs/promises';
import { basename, dirname, join, resolve } from 'node:path';
import { InputFileError, throwIfCancelled, type CancelToken } from '../../core/problems';

export interface OutputSink {
  /** Append bytes. */
  write(bytes: Uint8Array): Promise<void>;
  /** Overwrite bytes already written (header patches). */
  writeAt(offsetBytes: number, bytes: Uint8Array): Promise<void>;
  readonly bytesWritten: number;
  /** The temporary path (for tests and messages). */
  readonly tempPath: string;
}

async function identity(path: string): Promise<{ real: string; dev?: number; ino?: number }> {
  try {
    const real = await realpath(path);
    const s = await stat(real);
    return { real, dev: s.dev, ino: s.ino };
  } catch {
    // A path that does not exist yet: resolve its folder, which must exist.
    let folder: string;
    try {
      folder = await realpath(dirname(resolve(path)));
    } catch {
      throw new InputFileError({ code: 'input.file-not-found', severity: 'error', file: path, message: 'the output folder does not exist.', hint: 'Create the folder first.' });
    }
    return { real: join(folder, basename(path)) };
  }
}

/** Throws input.would-overwrite when `outputPath` names the same file as any of `inputPaths`. */
export async function assertNotAnInput(outputPath: string, inputPaths: readonly string[]): Promise<void> {
  const out = await identity(outputPath);
  for (const p of inputPaths) {
    const inp = await identity(p);
    const sameInode = out.ino !== undefined && inp.ino !== undefined && out.ino === inp.ino && out.dev === inp.dev;
    if (out.real === inp.real || sameInode)
      throw new InputFileError({
        code: 'input.would-overwrite', severity: 'error', file: outputPath,
        message: 'the output file is the input file (same path, link or hard link); Dipweave never writes over its input.',
        found: out.real, expected: 'a new file name', hint: 'Choose another output name.',
      });
  }
}

/**
 * Run `produce` against a temporary file next to `outputPath`, then rename it to `outputPath`.
 * Returns the number of bytes written.
 */
export async function writeFileAtomically(
  outputPath: string, inputPaths: readonly string[], produce: (sink: OutputSink) => Promise<void>, cancel?: CancelToken,
): Promise<number> {
  await assertNotAnInput(outputPath, inputPaths);
  const target = resolve(outputPath);
  const tempPath = join(dirname(target), `.${basename(target)}.${process.pid}.${randomBytes(4).toString('hex')}.partial`);
  let handle: FileHandle | undefined;
  let bytesWritten = 0;
  try {
    handle = await open(tempPath, 'wx');
    const h = handle;
    const sink: OutputSink = {
      tempPath,
      get bytesWritten() { return bytesWritten; },
      async write(bytes: Uint8Array) {
        throwIfCancelled(cancel);
        let done = 0;
        while (done < bytes.length) {
          const { bytesWritten: n } = await h.write(bytes, done, bytes.length - done, bytesWritten + done);
          done += n;
        }
        bytesWritten += bytes.length;
      },
      async writeAt(offsetBytes: number, bytes: Uint8Array) {
        if (offsetBytes < 0 || offsetBytes + bytes.length > bytesWritten) throw new RangeError(`writeAt(${offsetBytes}, ${bytes.length}) outside the ${bytesWritten} bytes written`);
        let done = 0;
        while (done < bytes.length) {
          const { bytesWritten: n } = await h.write(bytes, done, bytes.length - done, offsetBytes + done);
          done += n;
        }
      },
    };
    await produce(sink);
    throwIfCancelled(cancel);
    await h.sync();
    await h.close();
    handle = undefined;
    await assertNotAnInput(outputPath, inputPaths); // the name could have been linked to an input meanwhile
    await rename(tempPath, target);
    return bytesWritten;
  } catch (e) {
    if (handle) await handle.close().catch(() => undefined);
    await unlink(tempPath).catch(() => undefined);
    throw e;
  }
}
