// What an uploaded file is, read from its bytes: the art types the engine can use, and the name a
// file gives its art.
import path from 'node:path';
import sharp from 'sharp';
import type { ChannelStats, Metadata, Stats } from 'sharp';
import { DEFAULT_ALPHA_THRESHOLD } from '@shared/schemas/outline';
import { AppError } from '../../lib/errors';
import { cleanSvg, isSvg, rasteriseSvg } from './svg-art';

/** Largest spread of a channel (0–255) that still counts as one flat colour (JPEG's noise on a flat fill). */
const FLAT_SPREAD = 2;

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
    throw new AppError(415, 'unsupported_type', 'This SVG could not be read. Save it again as plain SVG, or export the art as a PNG.');
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
  let stats: Stats, thumbnail: Buffer;
  try {
    // Decoding the whole image proves it is not damaged and tells whether any pixel is see-through.
    stats = await sharp(data, { limitInputPixels: maxPixels, failOn: 'error' }).stats();
    thumbnail = await sharp(data, { limitInputPixels: maxPixels })
      .rotate()
      .resize(320, 320, { fit: 'inside', withoutEnlargement: true })
      .webp({ quality: 82 })
      .toBuffer();
  } catch {
    throw new AppError(422, 'image_corrupt', 'The image data is damaged or cut short. Export the file again and retry.');
  }
  const alpha = meta.hasAlpha === true ? stats.channels[stats.channels.length - 1] : null;
  refuseNothingToCut(stats, alpha);
  const hasTransparency = alpha !== null && alpha.min < 255;
  return { format: meta.format, width, height, hasTransparency, thumbnail };
}

/**
 * Art with nothing to cut around is refused here, before it is stored, rather than failing later in
 * the outline: every pixel (nearly) transparent, or one flat colour edge to edge, which is a blank
 * sheet or a background without its art.
 */
function refuseNothingToCut(stats: Stats, alpha: ChannelStats | null) {
  if (alpha && alpha.max < DEFAULT_ALPHA_THRESHOLD)
    throw new AppError(
      422,
      'nothing_to_cut',
      'Nothing to cut: every pixel of this image is transparent or nearly so. Export the art again with its visible parts.',
    );
  const colours = stats.channels.slice(0, Math.min(3, stats.channels.length - (alpha ? 1 : 0)));
  const flat = (!alpha || alpha.min === 255) && colours.every((c) => c.max - c.min <= FLAT_SPREAD);
  if (flat) {
    const grey = colours.length === 1;
    const hex = `#${[0, 1, 2]
      .map((k) =>
        Math.round(colours[grey ? 0 : k].mean)
          .toString(16)
          .padStart(2, '0'),
      )
      .join('')}`;
    throw new AppError(
      422,
      'nothing_to_cut',
      `Nothing to cut: this image is one flat colour (${hex}) from edge to edge, with no art on it. Upload the art itself, ideally a PNG with transparency.`,
    );
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

/** The art's pixels: vector art (SVG) cleaned and drawn at the print DPI, anything else as it came. */
export async function drawnArt(data: Buffer, maxPixels: number): Promise<{ data: Buffer; source: string | null }> {
  if (!isSvg(data)) return { data, source: null };
  const clean = cleanSvg(data);
  return { data: await rasteriseSvg(clean, maxPixels), source: clean.svg };
}

/** An upload's image read and drawn, ready to store: `sha256` is of the file as it came. */
export type ReadyArt = {
  path: string;
  folders: string[];
  data: Buffer;
  source: string | null;
  sha256: string;
  info: Awaited<ReturnType<typeof sniffArt>>;
};
