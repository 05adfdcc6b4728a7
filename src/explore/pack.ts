// Sample arrays for the explore page: little-endian IEEE 754 bytes in base64 (the byte order of every
// platform Node and the browsers run on), decoded in the page straight into typed arrays.
import type { Packed } from './payload.js';

/** Packs numbers exactly (double precision). */
export function packF64(values: ArrayLike<number>): Packed {
  const a = values instanceof Float64Array ? values : Float64Array.from(values);
  return { type: 'f64', length: a.length, base64: Buffer.from(a.buffer, a.byteOffset, a.byteLength).toString('base64') };
}

/** Packs numbers in single precision (about 7 significant digits): half the bytes. */
export function packF32(values: ArrayLike<number>): Packed {
  const a = values instanceof Float32Array ? values : Float32Array.from(values);
  return { type: 'f32', length: a.length, base64: Buffer.from(a.buffer, a.byteOffset, a.byteLength).toString('base64') };
}

/** The numbers of a Packed, as the page decodes them (for tests and tools). */
export function unpack(p: Packed): Float64Array {
  const bytes = Buffer.from(p.base64, 'base64');
  const copy = new Uint8Array(bytes.length);
  copy.set(bytes);
  const view = p.type === 'f64' ? new Float64Array(copy.buffer) : new Float32Array(copy.buffer);
  if (view.length !== p.length) throw new RangeError(`packed array holds ${view.length} numbers, says ${p.length}`);
  return Float64Array.from(view);
}
