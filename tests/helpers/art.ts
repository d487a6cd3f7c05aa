import sharp from 'sharp';

/** Renders SVG markup to a PNG (transparent where nothing is drawn). */
export function svgArt(width: number, height: number, body: string): Promise<Buffer> {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">${body}</svg>`;
  return sharp(Buffer.from(svg)).png().toBuffer();
}

/** A PNG from a per-pixel predicate: opaque `rgb` where `inside(x, y)`, transparent elsewhere. */
export function maskArt(width: number, height: number, inside: (x: number, y: number) => boolean, rgb = [40, 60, 160]): Promise<Buffer> {
  const data = Buffer.alloc(width * height * 4);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      if (!inside(x, y)) continue;
      const i = (y * width + x) * 4;
      data[i] = rgb[0];
      data[i + 1] = rgb[1];
      data[i + 2] = rgb[2];
      data[i + 3] = 255;
    }
  }
  return sharp(data, { raw: { width, height, channels: 4 } })
    .png()
    .toBuffer();
}

/** Decodes a PNG to RGBA pixels. */
export async function pixels(png: Buffer) {
  const { data, info } = await sharp(png).ensureAlpha().raw().toBuffer({ resolveWithObject: true });
  return {
    data,
    width: info.width,
    height: info.height,
    at: (x: number, y: number) => [...data.subarray((y * info.width + x) * 4, (y * info.width + x) * 4 + 4)],
  };
}
