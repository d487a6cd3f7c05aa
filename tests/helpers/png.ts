// Reads PNG chunks straight from the bytes, following the PNG specification (ISO/IEC 15948,
// W3C): §5.2 signature, §5.3 chunk layout (length, type, data, CRC), §11.2.2 IHDR, §11.3.5.3 pHYs.

const SIGNATURE = Buffer.from([137, 80, 78, 71, 13, 10, 26, 10]);

function pngChunks(png: Buffer): Array<{ type: string; data: Buffer }> {
  if (!png.subarray(0, 8).equals(SIGNATURE)) throw new Error('not a PNG signature');
  const chunks: Array<{ type: string; data: Buffer }> = [];
  let offset = 8;
  while (offset < png.length) {
    const length = png.readUInt32BE(offset);
    const type = png.toString('latin1', offset + 4, offset + 8);
    chunks.push({ type, data: png.subarray(offset + 8, offset + 8 + length) });
    offset += 12 + length;
    if (type === 'IEND') break;
  }
  return chunks;
}

export function pngSize(png: Buffer) {
  const ihdr = pngChunks(png).find((c) => c.type === 'IHDR')!;
  return { width: ihdr.data.readUInt32BE(0), height: ihdr.data.readUInt32BE(4) };
}

export function pngPhys(png: Buffer) {
  const phys = pngChunks(png).find((c) => c.type === 'pHYs');
  if (!phys) return null;
  return { x: phys.data.readUInt32BE(0), y: phys.data.readUInt32BE(4), unit: phys.data[8] };
}

/** CRC-32 as PNG defines it (§5.5, Annex D), to build hand-made test files. */
function crc32(bytes: Buffer): number {
  let crc = 0xffffffff;
  for (const byte of bytes) {
    crc ^= byte;
    for (let k = 0; k < 8; k++) crc = crc & 1 ? 0xedb88320 ^ (crc >>> 1) : crc >>> 1;
  }
  return (crc ^ 0xffffffff) >>> 0;
}

function chunk(type: string, data: Buffer): Buffer {
  const head = Buffer.alloc(8);
  head.writeUInt32BE(data.length, 0);
  head.write(type, 4, 'latin1');
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(Buffer.concat([Buffer.from(type, 'latin1'), data])), 0);
  return Buffer.concat([head, data, crc]);
}

/** A tiny file whose IHDR claims width × height: a decompression bomb's header. */
export function pngHeaderClaiming(width: number, height: number): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 6; // RGBA
  return Buffer.concat([
    SIGNATURE,
    chunk('IHDR', ihdr),
    chunk('IDAT', Buffer.from([0x78, 0x9c, 0x03, 0x00, 0x00, 0x00, 0x00, 0x01])),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}
