import sharp from 'sharp';
import type { OverlayOptions } from 'sharp';
import type { ExportSheet } from './types';

/**
 * The print image: each bordered sticker turned and composited with its centre on the piece's
 * position, exactly as the editor draws it; transparent (or white) elsewhere; size
 * round(print area × DPI); pHYs set (PNG spec §11.3.5.3).
 */
export async function renderPrintImage(
  sheet: ExportSheet,
  dpi: number,
  background: 'transparent' | 'white',
  onProgress?: (done: number, total: number) => void,
): Promise<Buffer> {
  const pxPerMm = dpi / 25.4;
  const width = Math.round(sheet.doc.printArea.width * pxPerMm),
    height = Math.round(sheet.doc.printArea.height * pxPerMm);
  const layers: OverlayOptions[] = [];
  for (const [i, p] of sheet.pieces.entries()) {
    const turned =
      p.piece.rotation % 360 === 0
        ? { data: p.raster.png, info: await sharp(p.raster.png).metadata() }
        : await sharp(p.raster.png)
            .rotate(p.piece.rotation, { background: { r: 0, g: 0, b: 0, alpha: 0 } })
            .png({ compressionLevel: 1 })
            .toBuffer({ resolveWithObject: true });
    const w = turned.info.width!,
      h = turned.info.height!;
    layers.push({ input: turned.data, left: Math.round(p.piece.x * pxPerMm - w / 2), top: Math.round(p.piece.y * pxPerMm - h / 2) });
    onProgress?.(i + 1, sheet.pieces.length);
  }
  return sharp({
    create: {
      width,
      height,
      channels: 4,
      background: background === 'white' ? { r: 255, g: 255, b: 255, alpha: 1 } : { r: 0, g: 0, b: 0, alpha: 0 },
    },
  })
    .composite(layers)
    .png({ compressionLevel: 6 })
    .withMetadata({ density: dpi })
    .toBuffer();
}
