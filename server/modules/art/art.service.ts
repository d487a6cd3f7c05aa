import { createHash } from 'node:crypto';
import path from 'node:path';
import sharp from 'sharp';
import type { Metadata } from 'sharp';
import type { DataSource } from 'typeorm';
import { IsNull } from 'typeorm';
import { AppError, notFound } from '../../lib/errors';
import type { Storage } from '../../storage/storage';
import { ArtItem } from './art-item.entity';

const ACCEPTED = new Set(['png', 'jpeg', 'webp']);

/** Reads the real type from the bytes (never the file name) and refuses what the engine cannot use. */
export async function sniffArt(data: Buffer, maxPixels: number) {
  let meta: Metadata;
  try {
    meta = await sharp(data, { limitInputPixels: false }).metadata();
  } catch {
    throw new AppError(415, 'unsupported_type', 'This file is not an image Sheetsmith can read. Use PNG, JPEG or WebP.');
  }
  if (meta.format === 'svg') {
    throw new AppError(415, 'unsupported_type', 'SVG files are not supported yet. Export the art as a PNG with transparency.');
  }
  if (!meta.format || !ACCEPTED.has(meta.format)) {
    throw new AppError(415, 'unsupported_type', `${String(meta.format ?? 'This').toUpperCase()} files are not supported. Use PNG, JPEG or WebP.`);
  }
  const width = meta.autoOrient?.width ?? meta.width ?? 0, height = meta.autoOrient?.height ?? meta.height ?? 0;
  if (width * height > maxPixels) {
    throw new AppError(422, 'image_too_large', `The image is ${width} × ${height} px; the limit is ${(maxPixels / 1e6).toFixed(0)} megapixels.`);
  }
  // Transparency needs a pixel scan; the alpha channel's minimum tells it in one pass.
  let hasTransparency = false;
  if (meta.hasAlpha) {
    try {
      const stats = await sharp(data, { limitInputPixels: maxPixels }).stats();
      hasTransparency = (stats.channels[stats.channels.length - 1]?.min ?? 255) < 255;
    } catch {
      throw new AppError(422, 'image_corrupt', 'The image data is damaged or cut short. Export the file again and retry.');
    }
  }
  return { format: meta.format, width, height, hasTransparency };
}

export class ArtService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly storage: Storage,
    private readonly maxPixels: number,
  ) {}

  /** Stores one image; the same bytes already in the team's library are not stored twice. */
  async add(teamId: string, userId: string, file: { originalname: string; buffer: Buffer }) {
    const info = await sniffArt(file.buffer, this.maxPixels);
    const sha256 = createHash('sha256').update(file.buffer).digest('hex');
    const repo = this.dataSource.getRepository(ArtItem);
    const existing = await repo.findOneBy({ teamId, sha256 });
    if (existing && !existing.deletedAt) return { item: existing, duplicate: true };
    const { key } = await this.storage.put(file.buffer);
    if (existing) {
      await repo.update({ id: existing.id }, { deletedAt: null });
      return { item: { ...existing, deletedAt: null }, duplicate: false };
    }
    const name = path.basename(file.originalname).replace(/\.[^.]+$/, '').slice(0, 200) || 'Untitled art';
    const item = await repo.save({
      teamId,
      name,
      sha256,
      storageKey: key,
      format: info.format,
      sizeBytes: file.buffer.length,
      widthPx: info.width,
      heightPx: info.height,
      hasTransparency: info.hasTransparency,
      uploadedBy: userId,
      deletedAt: null,
    });
    return { item, duplicate: false };
  }

  list(teamId: string) {
    return this.dataSource.getRepository(ArtItem).find({ where: { teamId, deletedAt: IsNull() }, order: { createdAt: 'DESC' }, take: 200 });
  }

  async get(teamId: string, artId: string): Promise<ArtItem> {
    const item = await this.dataSource.getRepository(ArtItem).findOneBy({ id: artId, teamId, deletedAt: IsNull() });
    if (!item) throw notFound('That art');
    return item;
  }

  bytes(item: ArtItem): Promise<Buffer> {
    return this.storage.get(item.storageKey);
  }
}

export const artView = (item: ArtItem) => ({
  id: item.id,
  name: item.name,
  format: item.format,
  sizeBytes: item.sizeBytes,
  widthPx: item.widthPx,
  heightPx: item.heightPx,
  hasTransparency: item.hasTransparency,
  sha256: item.sha256,
  createdAt: item.createdAt.toISOString(),
});
