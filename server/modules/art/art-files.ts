// What an uploaded file is, read from its bytes: the art types the engine can use, and the name a
// file gives its art.
import path from 'node:path';
import sharp from 'sharp';
import type { Metadata } from 'sharp';
import { AppError } from '../../lib/errors';

const ACCEPTED = new Set(['png', 'jpeg', 'webp']);

/** Reads the real type from the bytes (never the file name) and refuses what the engine cannot use. */
export async function sniffArt(data: Buffer, maxPixels: number) {
  let meta: Metadata;
  try {
    meta = await sharp(data, { limitInputPixels: false }).metadata();
  } catch {
    throw new AppError(415, 'unsupported_type', 'This file is not an image Sheetsmith can read. Use PNG, JPEG or WebP.');
  }
  if (meta.format === 'svg')
    throw new AppError(415, 'unsupported_type', 'SVG files are not supported yet. Export the art as a PNG with transparency.');
  if (!meta.format || !ACCEPTED.has(meta.format)) {
    throw new AppError(
      415,
      'unsupported_type',
      `${String(meta.format ?? 'This').toUpperCase()} files are not supported. Use PNG, JPEG or WebP.`,
    );
  }
  const width = meta.autoOrient?.width ?? meta.width ?? 0,
    height = meta.autoOrient?.height ?? meta.height ?? 0;
  if (width * height > maxPixels) {
    throw new AppError(
      422,
      'image_too_large',
      `The image is ${width} × ${height} px; the limit is ${(maxPixels / 1e6).toFixed(0)} megapixels. Scale it down first.`,
    );
  }
  try {
    // Decoding the whole image proves it is not damaged and tells whether any pixel is see-through.
    const stats = await sharp(data, { limitInputPixels: maxPixels, failOn: 'error' }).stats();
    const hasTransparency = meta.hasAlpha === true && (stats.channels[stats.channels.length - 1]?.min ?? 255) < 255;
    const thumbnail = await sharp(data, { limitInputPixels: maxPixels })
      .rotate()
      .resize(320, 320, { fit: 'inside', withoutEnlargement: true })
      .webp({ quality: 82 })
      .toBuffer();
    return { format: meta.format, width, height, hasTransparency, thumbnail };
  } catch {
    throw new AppError(422, 'image_corrupt', 'The image data is damaged or cut short. Export the file again and retry.');
  }
}

export const isZip = (data: Buffer) =>
  data.length >= 4 && data[0] === 0x50 && data[1] === 0x4b && (data[2] === 3 || data[2] === 5) && (data[3] === 4 || data[3] === 6);
export const nameFrom = (file: string) =>
  path
    .basename(file)
    .replace(/\.[^.]+$/, '')
    .replace(/[_]+/g, ' ')
    .trim()
    .slice(0, 200) || 'Untitled art';
