// The reference sheet the export-format tests read back with outside parsers.
import { DEFAULT_ART_BACKGROUND, pieceOutlineOptions } from '@shared/sheet/outline-request';
import type { Piece } from '@shared/sheet/document';
import { inchToMm } from '@shared/units';
import { exportSheet } from '../../server/engine/export/export';
import { exportPiece } from '../../server/engine/export/prepare';
import type { ExportSheet } from '../../server/engine/export/types';
import { DEFAULT_EXPORT_OPTIONS } from '../../server/engine/export/types';
import { outline } from '../../server/engine/outline/outline';
import { svgArt } from './art';

export const W = inchToMm(6.75),
  H = inchToMm(9.25);
export const IN = 25.4;

/** Independent placement: turn the frame-relative cut line about the frame centre, then move it. */
export const place = (p: ExportSheet['pieces'][number]) => {
  const a = (p.piece.rotation * Math.PI) / 180;
  return p.cutLine.points.map((q) => {
    const dx = q.x - p.cutLine.widthMm / 2,
      dy = q.y - p.cutLine.heightMm / 2;
    return { x: p.piece.x + dx * Math.cos(a) - dy * Math.sin(a), y: p.piece.y + dx * Math.sin(a) + dy * Math.cos(a) };
  });
};
export const bounds = (pts: Array<{ x: number; y: number }>) => [
  Math.min(...pts.map((p) => p.x)),
  Math.min(...pts.map((p) => p.y)),
  Math.max(...pts.map((p) => p.x)),
  Math.max(...pts.map((p) => p.y)),
];

/** Five pieces of one art on a 6.75 × 9.25 in print area on Letter, exported in every format. */
export async function referenceExport() {
  const art = await svgArt(
    900,
    600,
    '<ellipse cx="450" cy="300" rx="420" ry="270" fill="#c0392b"/><circle cx="450" cy="300" r="80" fill="#f4d03f"/>',
  );
  const placements: Array<[number, number, number]> = [
    [45, 40, 0],
    [125, 45, 30],
    [50, 120, 90],
    [125, 130, 135],
    [60, 200, 200],
  ];
  const pieces = [];
  for (const [i, [x, y, rotation]] of placements.entries()) {
    const piece: Piece = {
      id: `p${i}`,
      artId: '1',
      x,
      y,
      rotation,
      width: 45,
      border: 3,
      borderColour: '#ffffff',
      locked: false,
      cut: i === 4 ? 'die' : 'kiss',
    };
    pieces.push(
      await exportPiece(
        piece,
        'ellipse.png',
        pieceOutlineOptions(DEFAULT_ART_BACKGROUND, piece, { minFeatureMm: 1, bridgeWidthMm: 3, dpi: 300 }),
        0,
        (o) => outline(art, o),
      ),
    );
  }
  const sheet: ExportSheet = {
    name: 'Reference sheet',
    unit: 'in',
    doc: { schemaVersion: 1, printArea: { width: W, height: H }, safeMargin: 3, minGap: 3, pieces: pieces.map((p) => p.piece) },
    pieces,
    paper: { paperWidthMm: 215.9, paperHeightMm: 279.4, areaXMm: (215.9 - W) / 2, areaYMm: (279.4 - H) / 2 },
  };
  const result = await exportSheet(sheet, { ...DEFAULT_EXPORT_OPTIONS, dxfUnit: 'in' });
  return { sheet, result };
}
