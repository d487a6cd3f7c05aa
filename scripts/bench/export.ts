// npm run bench:export: renders a full sheet of 40 pieces at 300 DPI (every format and the zip),
// and in the same run the floor: one sharp composite of the same rasters with none of our work.
import { DEFAULT_ART_BACKGROUND, pieceOutlineOptions } from '@shared/sheet/outline-request';
import sharp from 'sharp';
import type { Piece } from '@shared/sheet/document';
import { inchToMm } from '@shared/units';
import { exportSheet } from '../../server/engine/export/export';
import { exportPiece } from '../../server/engine/export/prepare';
import { DEFAULT_EXPORT_OPTIONS } from '../../server/engine/export/types';
import type { ExportPiece } from '../../server/engine/export/types';
import { outline } from '../../server/engine/outline/outline';

const W = inchToMm(6.75),
  H = inchToMm(9.25);
const art = await sharp(
  Buffer.from(
    '<svg xmlns="http://www.w3.org/2000/svg" width="800" height="800"><defs><filter id="f"><feGaussianBlur stdDeviation="8"/></filter></defs><g filter="url(#f)"><circle cx="400" cy="400" r="330" fill="#7d3c98"/></g><circle cx="400" cy="400" r="90" fill="none" stroke="#f4d03f" stroke-width="30"/></svg>',
  ),
)
  .png()
  .toBuffer();
const pieces: ExportPiece[] = [];
for (let i = 0; i < 40; i++) {
  const piece: Piece = {
    id: `b${i}`,
    artId: '1',
    x: 14 + (i % 5) * 35,
    y: 14 + Math.floor(i / 5) * 29,
    rotation: (i * 37) % 360,
    width: 22,
    border: 2,
    borderColour: '#ffffff',
    locked: false,
  };
  pieces.push(
    await exportPiece(
      piece,
      'disc.png',
      pieceOutlineOptions(DEFAULT_ART_BACKGROUND, piece, { minFeatureMm: 1, bridgeWidthMm: 3, dpi: 300 }),
      0,
      (o) => outline(art, o),
    ),
  );
}
const sheet = {
  name: 'Bench',
  unit: 'in' as const,
  doc: { schemaVersion: 1 as const, printArea: { width: W, height: H }, safeMargin: 3, minGap: 3, pieces: pieces.map((p) => p.piece) },
  pieces,
  paper: { paperWidthMm: 215.9, paperHeightMm: 279.4, areaXMm: 22.225, areaYMm: 22.225 },
};

const median = async (fn: () => Promise<unknown>, runs = 3) => {
  const times: number[] = [];
  await fn();
  for (let i = 0; i < runs; i++) {
    const t = performance.now();
    await fn();
    times.push(performance.now() - t);
  }
  return times.sort((a, b) => a - b)[runs >> 1];
};

const px = 300 / 25.4;
const floor = await median(() =>
  sharp({ create: { width: Math.round(W * px), height: Math.round(H * px), channels: 4, background: { r: 0, g: 0, b: 0, alpha: 0 } } })
    .composite(
      pieces.map((p) => ({
        input: p.raster.png,
        left: Math.round(p.piece.x * px - (p.raster.widthMm * px) / 2),
        top: Math.round(p.piece.y * px - (p.raster.heightMm * px) / 2),
      })),
    )
    .png()
    .toBuffer(),
);
const full = await median(() => exportSheet(sheet, DEFAULT_EXPORT_OPTIONS));
const pngOnly = await median(() => exportSheet(sheet, { ...DEFAULT_EXPORT_OPTIONS, formats: ['png'] }));
console.log('export benchmark: 40 turned pieces on a 6.75 × 9.25 in sheet at 300 DPI (median of 3)');
console.log(`floor (one sharp composite of the same rasters): ${floor.toFixed(0)} ms`);
console.log(`print image only (turning, compositing, pHYs, zip): ${pngOnly.toFixed(0)} ms, ratio ${(pngOnly / floor).toFixed(2)}`);
console.log(`every format (PNG, SVG, combined SVG, PDF, DXF, zip): ${full.toFixed(0)} ms, ratio ${(full / floor).toFixed(2)}`);
