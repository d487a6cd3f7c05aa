import sharp from 'sharp';
import { drawTurned, snapCentre } from './turn';
import type { ExportSheet } from './types';
import { encodePngAt } from '../png';

/** The composited print area as 8-bit RGBA, row by row, before any encoding. */
export type PrintRaster = { rgba: Buffer; width: number; height: number; dpi: number; opaque: boolean };

/** Decodes this many stickers ahead of the one being drawn (sharp decodes off the main thread). */
const DECODE_AHEAD = 8;

/**
 * The print area drawn: each bordered sticker turned about its centre and laid with that centre on
 * the piece's position, exactly as the editor draws it; transparent (or white) elsewhere; size
 * round(print area × DPI). Stickers are decoded by sharp a few ahead while earlier ones are drawn.
 */
export async function renderPrintRaster(
  sheet: ExportSheet,
  dpi: number,
  background: 'transparent' | 'white',
  onProgress?: (done: number, total: number) => void,
): Promise<PrintRaster> {
  const pxPerMm = dpi / 25.4;
  const width = Math.round(sheet.doc.printArea.width * pxPerMm),
    height = Math.round(sheet.doc.printArea.height * pxPerMm);
  const rgba = Buffer.alloc(width * height * 4, background === 'white' ? 255 : 0);
  const dst = { data: rgba, width, height };
  const decode = (png: Buffer) =>
    sharp(png)
      .toColourspace('srgb')
      .ensureAlpha()
      .raw()
      .toBuffer({ resolveWithObject: true })
      .then(({ data, info }) => ({ data, width: info.width, height: info.height }));
  const pieces = sheet.pieces;
  const pending = pieces.slice(0, DECODE_AHEAD).map((p) => decode(p.raster.png));
  for (const [i, p] of pieces.entries()) {
    const src = await pending[i];
    if (i + DECODE_AHEAD < pieces.length) pending.push(decode(pieces[i + DECODE_AHEAD].raster.png));
    pending[i] = null as never; // let the decoded sticker go once drawn
    const at = snapCentre(p.piece.x * pxPerMm, p.piece.y * pxPerMm, src.width, src.height, p.piece.rotation);
    drawTurned(dst, src, at.cx, at.cy, p.piece.rotation);
    onProgress?.(i + 1, pieces.length);
  }
  return { rgba, width, height, dpi, opaque: background === 'white' };
}

/** The print raster as a PNG with pHYs set (PNG spec §11.3.5.3). */
export function encodePrintPng(raster: PrintRaster): Promise<Buffer> {
  return encodePngAt(raster.rgba, raster.width, raster.height, raster.dpi);
}

/** The print image as a PNG: the raster of renderPrintRaster, encoded. */
export async function renderPrintImage(
  sheet: ExportSheet,
  dpi: number,
  background: 'transparent' | 'white',
  onProgress?: (done: number, total: number) => void,
): Promise<Buffer> {
  return encodePrintPng(await renderPrintRaster(sheet, dpi, background, onProgress));
}
