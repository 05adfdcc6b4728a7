// Image sizes for the report's <img> tags, read from the PNG header (PNG specification, ISO/IEC 15948,
// IHDR: width and height as 4-byte big-endian integers after the signature and chunk header), checked
// against pngjs's decoder.
import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { pngSize } from '../../../src/report/png-size.js';

describe('pngSize', () => {
  it.each([
    [1, 1],
    [640, 360],
    [1500, 950],
    [70000, 2],
  ])('%i × %i matches the decoder', (width, height) => {
    const png = new PNG({ width, height });
    const bytes = PNG.sync.write(png);
    const decoded = PNG.sync.read(bytes);
    expect(pngSize(bytes)).toEqual({ width: decoded.width, height: decoded.height });
  });

  it('refuses bytes that are not a PNG', () => {
    expect(() => pngSize(Buffer.from('GIF89a……………………………………'))).toThrow(RangeError);
  });
});
