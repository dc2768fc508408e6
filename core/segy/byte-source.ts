/**
 * Random-access, asynchronous bytes: the only way core/segy/ sees a file. A file is never loaded whole;
 * the reader asks for the header block, batches of traces, or one gather at a time.
 * Node's fs implementation is app/host/file-source.ts; the renderer wraps a browser File (Blob.slice).
 */
import { InputFileError } from '../problems';

export interface ByteSource {
  /** Shown in messages (file name or path). */
  readonly name: string;
  readonly sizeBytes: number;
  /**
   * Exactly `lengthBytes` bytes starting at `offsetBytes`. A range past the end rejects with an
   * InputFileError (segy.truncated). Callers must not modify the returned array (a memory source returns a view of its bytes).
   */
  read(offsetBytes: number, lengthBytes: number): Promise<Uint8Array>;
}

export function truncatedError(name: string, sizeBytes: number, offsetBytes: number, lengthBytes: number): InputFileError {
  return new InputFileError({
    code: 'segy.truncated',
    severity: 'error',
    message: `the file ends before the data it announces (needed bytes ${offsetBytes}..${offsetBytes + lengthBytes - 1}).`,
    file: name,
    byteOffset: offsetBytes,
    found: `${sizeBytes} bytes in the file`,
    expected: `at least ${offsetBytes + lengthBytes} bytes`,
    hint: 'The file was probably cut short while copying or downloading; fetch it again.',
  });
}

/** A ByteSource over bytes already in memory (tests, small files, fuzzing). Reads copy nothing. */
export function memoryByteSource(name: string, bytes: Uint8Array): ByteSource {
  return {
    name,
    sizeBytes: bytes.length,
    read(offsetBytes: number, lengthBytes: number): Promise<Uint8Array> {
      if (!Number.isInteger(offsetBytes) || !Number.isInteger(lengthBytes) || offsetBytes < 0 || lengthBytes < 0)
        return Promise.reject(new RangeError(`read(${offsetBytes}, ${lengthBytes}): offsets must be non-negative integers`));
      if (offsetBytes + lengthBytes > bytes.length)
        return Promise.reject(truncatedError(name, bytes.length, offsetBytes, lengthBytes));
      return Promise.resolve(bytes.subarray(offsetBytes, offsetBytes + lengthBytes));
    },
  };
}
