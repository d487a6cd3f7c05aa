// The PNG's physical size: a pHYs chunk (PNG spec §11.3.5.3: pixels per metre on each axis, unit 1
// = metre) put right after IHDR, where the spec wants it (before IDAT). Written here rather than
// through sharp's metadata option, which also embeds an ICC profile and costs a quarter of the encode.
import sharp from 'sharp';
import { crc32 } from 'node:zlib';

function withPhys(png: Buffer, dpi: number): Buffer {
  const perMetre = Math.round(dpi / 0.0254);
  const chunk = Buffer.alloc(21);
  chunk.writeUInt32BE(9, 0);
  chunk.write('pHYs', 4, 'latin1');
  chunk.writeUInt32BE(perMetre, 8);
  chunk.writeUInt32BE(perMetre, 12);
  chunk.writeUInt8(1, 16);
  chunk.writeUInt32BE(crc32(chunk.subarray(4, 17)), 17);
  const afterHeader = 8 + 8 + png.readUInt32BE(8) + 4; // signature, then IHDR's length, type, data and CRC
  return Buffer.concat([png.subarray(0, afterHeader), chunk, png.subarray(afterHeader)]);
}

/** RGBA pixels as a PNG with its physical size. */
export async function encodePngAt(rgba: Uint8Array, width: number, height: number, dpi: number, compressionLevel = 6): Promise<Buffer> {
  const png = await sharp(rgba, { raw: { width, height, channels: 4 } })
    .png({ compressionLevel, adaptiveFiltering: false })
    .toBuffer();
  return withPhys(png, dpi);
}
