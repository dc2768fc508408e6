/**
 * NPY format version 1.0 (NumPy Enhancement Proposal 1, "A simple file format for NumPy arrays"; numpy's
 * lib/format.py documents the same): magic "\x93NUMPY", version bytes 1 0, a little-endian uint16 header length,
 * then an ASCII Python dict literal {'descr': '<f4', 'fortran_order': False, 'shape': (a, b), } padded with
 * spaces and ended by '\n' so that the data start is a multiple of 64 bytes, then the raw C-order data.
 * Dipweave writes a fixed NPY_HEADER_BYTES-byte preamble so the shape can be patched after streaming the data.
 */

export const NPY_HEADER_BYTES = 128;

/** The preamble for a C-order little-endian float32 array of the given shape. */
export function npyHeaderFloat32(shape: readonly number[]): Uint8Array {
  for (const d of shape) if (!Number.isInteger(d) || d < 0) throw new RangeError(`npy: shape entries must be non-negative integers. Value: ${shape.join(',')}`);
  const shapeText = shape.length === 1 ? `(${shape[0]},)` : `(${shape.join(', ')})`;
  let dict = `{'descr': '<f4', 'fortran_order': False, 'shape': ${shapeText}, }`;
  const room = NPY_HEADER_BYTES - 10 - 1; // magic(6) + version(2) + length(2), and the final '\n'
  if (dict.length > room) throw new RangeError(`npy: shape ${shapeText} does not fit a ${NPY_HEADER_BYTES}-byte header`);
  dict = dict.padEnd(room, ' ') + '\n';
  const out = new Uint8Array(NPY_HEADER_BYTES);
  out.set([0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59, 1, 0], 0); // \x93NUMPY 1.0
  const len = NPY_HEADER_BYTES - 10;
  out[8] = len & 0xff;
  out[9] = len >> 8;
  for (let i = 0; i < dict.length; i++) out[10 + i] = dict.charCodeAt(i);
  return out;
}

/** Little-endian float32 bytes of values. */
export function npyFloat32Bytes(values: ArrayLike<number>): Uint8Array {
  const out = new Uint8Array(values.length * 4);
  const view = new DataView(out.buffer);
  for (let i = 0; i < values.length; i++) view.setFloat32(i * 4, values[i], true);
  return out;
}

/** A whole .npy file in memory (small arrays, tests). */
export function encodeNpyFloat32(values: ArrayLike<number>, shape: readonly number[]): Uint8Array {
  const n = shape.reduce((a, b) => a * b, 1);
  if (n !== values.length) throw new RangeError(`npy: ${values.length} values do not fill shape (${shape.join(', ')})`);
  const h = npyHeaderFloat32(shape);
  const out = new Uint8Array(h.length + n * 4);
  out.set(h, 0);
  out.set(npyFloat32Bytes(values), h.length);
  return out;
}
