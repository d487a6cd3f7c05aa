import sharp from 'sharp';
import type { Metadata } from 'sharp';
import { OutlineInputError } from './errors';

type DecodedArt = {
  rgba: Buffer;
  width: number;
  height: number;
  format: string;
  /** True when any pixel of the source is less than fully opaque. */
  hasTransparency: boolean;
};

const FORMATS = new Set(['png', 'jpeg', 'webp']);
const MIN_SIDE_PX = 4;

/**
 * Decodes PNG, JPEG or WebP to 8-bit sRGB RGBA: EXIF orientation applied (EXIF 2.32 tag 0x0112),
 * 16-bit, grey, palette-with-transparency and CMYK inputs all converted. The pixel limit is checked
 * from the header before any pixel is decoded, so a decompression bomb costs nothing.
 */
export async function decodeArt(input: Buffer, maxPixels: number): Promise<DecodedArt> {
  let meta: Metadata;
  try {
    meta = await sharp(input, { limitInputPixels: false }).metadata();
  } catch {
    throw new OutlineInputError('not-an-image', 'This file is not an image Sheetsmith can read. Use PNG, JPEG or WebP.');
  }
  if (!meta.format || !FORMATS.has(meta.format)) {
    throw new OutlineInputError(
      'unsupported-format',
      `${(meta.format ?? 'This').toUpperCase()} files are not supported. Use PNG, JPEG or WebP.`,
    );
  }
  const width = meta.width ?? 0,
    height = meta.height ?? 0;
  if (width * height > maxPixels) {
    const mp = (n: number) => (n / 1e6).toFixed(n >= 1e7 ? 0 : 1);
    throw new OutlineInputError(
      'too-many-pixels',
      `The image is ${width} × ${height} px (${mp(width * height)} megapixels); the limit is ${mp(maxPixels)} megapixels. Scale it down first.`,
    );
  }
  if (width < MIN_SIDE_PX || height < MIN_SIDE_PX) {
    throw new OutlineInputError('too-small', `The image is ${width} × ${height} px; it needs at least ${MIN_SIDE_PX} px on each side.`);
  }
  try {
    const { data, info } = await sharp(input, { limitInputPixels: maxPixels, failOn: 'error' })
      .rotate()
      .toColourspace('srgb')
      .ensureAlpha()
      .raw()
      .toBuffer({ resolveWithObject: true });
    let hasTransparency = false;
    for (let i = 3; i < data.length; i += 4) {
      if (data[i] !== 255) {
        hasTransparency = true;
        break;
      }
    }
    return { rgba: data, width: info.width, height: info.height, format: meta.format, hasTransparency };
  } catch {
    throw new OutlineInputError('corrupt', 'The image data is damaged or cut short. Export the file again and retry.');
  }
}
