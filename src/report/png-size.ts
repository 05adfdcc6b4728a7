// Width and height of a PNG from its IHDR chunk (PNG specification, ISO/IEC 15948 §11.2.2): the
// 8-byte signature, then the first chunk, IHDR, whose data starts with width and height as 32-bit
// big-endian integers at byte offsets 16 and 20.

const SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

export function pngSize(png: Uint8Array): { width: number; height: number } {
  if (png.length < 24 || SIGNATURE.some((b, i) => png[i] !== b)) throw new RangeError('not a PNG file');
  const type = String.fromCharCode(png[12], png[13], png[14], png[15]);
  if (type !== 'IHDR') throw new RangeError('PNG without an IHDR chunk first');
  const view = new DataView(png.buffer, png.byteOffset, png.byteLength);
  return { width: view.getUint32(16), height: view.getUint32(20) };
}
