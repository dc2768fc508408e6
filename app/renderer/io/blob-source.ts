/**
 * ByteSources for the renderer's worker: a browser File/Blob read by Blob.slice (file input, drag-and-drop,
 * fetched demo files), or a file held by the desktop shell and read through the page (window.dipweave
 * exists only on the page, so the worker asks the page for each range).
 */
import { truncatedError, type ByteSource } from '../../../core/segy/byte-source';

export function blobByteSource(name: string, blob: Blob): ByteSource {
  return {
    name,
    sizeBytes: blob.size,
    async read(offsetBytes: number, lengthBytes: number): Promise<Uint8Array> {
      if (!Number.isInteger(offsetBytes) || !Number.isInteger(lengthBytes) || offsetBytes < 0 || lengthBytes < 0)
        throw new RangeError(`read(${offsetBytes}, ${lengthBytes}): offsets must be non-negative integers`);
      if (offsetBytes + lengthBytes > blob.size) throw truncatedError(name, blob.size, offsetBytes, lengthBytes);
      return new Uint8Array(await blob.slice(offsetBytes, offsetBytes + lengthBytes).arrayBuffer());
    },
  };
}

/** Asks someone else (the page) for bytes; `fetchRange` resolves with exactly the requested bytes or fewer at the end. */
export function remoteByteSource(name: string, sizeBytes: number, fetchRange: (offsetBytes: number, lengthBytes: number) => Promise<Uint8Array>): ByteSource {
  return {
    name,
    sizeBytes,
    async read(offsetBytes: number, lengthBytes: number): Promise<Uint8Array> {
      if (!Number.isInteger(offsetBytes) || !Number.isInteger(lengthBytes) || offsetBytes < 0 || lengthBytes < 0)
        throw new RangeError(`read(${offsetBytes}, ${lengthBytes}): offsets must be non-negative integers`);
      if (offsetBytes + lengthBytes > sizeBytes) throw truncatedError(name, sizeBytes, offsetBytes, lengthBytes);
      const bytes = await fetchRange(offsetBytes, lengthBytes);
      if (bytes.length !== lengthBytes) throw truncatedError(name, offsetBytes + bytes.length, offsetBytes, lengthBytes);
      return bytes;
    },
  };
}
