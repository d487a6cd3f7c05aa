import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { encodePngAt } from './png';

describe('encodePngAt', () => {
  it('writes a pHYs chunk other decoders read as the DPI, with a valid CRC (PNG spec §11.3.5.3)', async () => {
    const rgba = new Uint8Array(7 * 5 * 4).fill(200);
    const png = await encodePngAt(rgba, 7, 5, 300);
    // libvips (through sharp, failing on a bad CRC) reads it back: 11811 px/m is 300 DPI.
    const meta = await sharp(png, { failOn: 'error' }).metadata();
    expect(meta.density).toBe(300);
    expect([meta.width, meta.height]).toEqual([7, 5]);
    const at = png.indexOf('pHYs');
    expect(at).toBeLessThan(png.indexOf('IDAT'));
    // The chunk's CRC by the PNG spec's own sample code (Annex D), over type and data.
    const table = Array.from({ length: 256 }, (_, n) => {
      let c = n;
      for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
      return c >>> 0;
    });
    let crc = 0xffffffff;
    for (const byte of png.subarray(at, at + 13)) crc = table[(crc ^ byte) & 0xff] ^ (crc >>> 8);
    expect(png.readUInt32BE(at + 13)).toBe((crc ^ 0xffffffff) >>> 0);
    const { data } = await sharp(png, { failOn: 'error' }).raw().toBuffer({ resolveWithObject: true });
    expect([...data.subarray(0, 4)]).toEqual([200, 200, 200, 200]);
  });
});
