// Sample arrays packed by the page's builder (src/explore/pack.ts): little-endian IEEE 754 in base64.
import type { Packed } from '../payload.js';

/** The numbers of a Packed array as a typed array over its decoded bytes. */
export function unpack(p: Packed): Float64Array | Float32Array {
  const text = atob(p.base64);
  const bytes = new Uint8Array(text.length);
  for (let i = 0; i < text.length; i++) bytes[i] = text.charCodeAt(i);
  const out = p.type === 'f64' ? new Float64Array(bytes.buffer) : new Float32Array(bytes.buffer);
  if (out.length !== p.length) throw new Error(`a packed array holds ${out.length} numbers, expected ${p.length}`);
  return out;
}
