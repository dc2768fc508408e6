/** A ByteSource over a file on disk (Node fs, positional reads; the file is never loaded whole). */
import { open, type FileHandle } from 'node:fs/promises';
import { basename } from 'node:path';
import { InputFileError } from '../../core/problems';
import { truncatedError, type ByteSource } from '../../core/segy/byte-source';

export interface FileByteSource extends ByteSource {
  readonly path: string;
  close(): Promise<void>;
}

export async function openFileByteSource(path: string): Promise<FileByteSource> {
  let handle: FileHandle;
  try {
    handle = await open(path, 'r');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    throw new InputFileError({
      code: 'input.file-not-found', severity: 'error', file: path,
      message: code === 'ENOENT' ? 'the file does not exist.' : code === 'EISDIR' ? 'this is a folder, not a file.' : `the file cannot be opened (${code ?? String(e)}).`,
      hint: code === 'EACCES' ? 'Check the file permissions.' : 'Check the path.',
    });
  }
  const stat = await handle.stat();
  if (!stat.isFile()) {
    await handle.close();
    throw new InputFileError({ code: 'input.file-not-found', severity: 'error', file: path, message: 'this is not a regular file.' });
  }
  const sizeBytes = stat.size;
  const name = basename(path);
  let closed = false;
  return {
    name,
    path,
    sizeBytes,
    async read(offsetBytes: number, lengthBytes: number): Promise<Uint8Array> {
      if (closed) throw new Error(`read from ${name} after close()`);
      if (!Number.isInteger(offsetBytes) || !Number.isInteger(lengthBytes) || offsetBytes < 0 || lengthBytes < 0)
        throw new RangeError(`read(${offsetBytes}, ${lengthBytes}): offsets must be non-negative integers`);
      if (offsetBytes + lengthBytes > sizeBytes) throw truncatedError(name, sizeBytes, offsetBytes, lengthBytes);
      // Unpooled and not zero-filled (every byte is read below); a plain Uint8Array view, so slice() copies.
      const raw = Buffer.allocUnsafeSlow(lengthBytes);
      const out = new Uint8Array(raw.buffer, raw.byteOffset, lengthBytes);
      let done = 0;
      while (done < lengthBytes) {
        const { bytesRead } = await handle.read(out, done, lengthBytes - done, offsetBytes + done);
        if (bytesRead === 0) throw truncatedError(name, offsetBytes + done, offsetBytes, lengthBytes); // file shrank under us
        done += bytesRead;
      }
      return out;
    },
    async close(): Promise<void> {
      if (closed) return;
      closed = true;
      await handle.close();
    },
  };
}
