import type { Ring } from '../geometry/polygon';
import { boundingBox } from '../geometry/polygon';
import type { Piece, SheetDocument } from './document';
import type { PieceOutline } from './placement';
import { cutLineDistance, placeCutLine } from './placement';

export type Guard =
  | { kind: 'too-close'; severity: 'warning'; pieceIds: [string, string]; distanceMm: number }
  | { kind: 'outside-print-area'; severity: 'error'; pieceIds: [string] }
  | { kind: 'outside-safe-margin'; severity: 'warning'; pieceIds: [string] }
  | { kind: 'low-resolution'; severity: 'notice' | 'warning'; pieceIds: [string]; dpi: number };

/**
 * The live checks of a sheet: cut lines closer than the minimum gap (on the real polygons), pieces
 * past the print area or its safe margin, and art printed below 300 (notice) or 150 DPI (warning).
 */
export function sheetGuards(doc: SheetDocument, outlines: Map<string, PieceOutline>, artPixelWidth: (p: Piece) => number | undefined): Guard[] {
  const guards: Guard[] = [];
  const placed: Array<{ piece: Piece; ring: Ring }> = [];
  for (const piece of doc.pieces) {
    const outline = outlines.get(piece.id);
    if (outline) placed.push({ piece, ring: placeCutLine(piece, outline) });
    const px = artPixelWidth(piece);
    if (px) {
      const dpi = px / (piece.width / 25.4);
      if (dpi < 150) guards.push({ kind: 'low-resolution', severity: 'warning', pieceIds: [piece.id], dpi });
      else if (dpi < 300) guards.push({ kind: 'low-resolution', severity: 'notice', pieceIds: [piece.id], dpi });
    }
  }
  const { width, height } = doc.printArea;
  for (const { piece, ring } of placed) {
    const box = boundingBox(ring);
    if (box.x < 0 || box.y < 0 || box.x + box.width > width || box.y + box.height > height) {
      guards.push({ kind: 'outside-print-area', severity: 'error', pieceIds: [piece.id] });
    } else {
      const m = doc.safeMargin;
      if (box.x < m || box.y < m || box.x + box.width > width - m || box.y + box.height > height - m) {
        guards.push({ kind: 'outside-safe-margin', severity: 'warning', pieceIds: [piece.id] });
      }
    }
  }
  for (let i = 0; i < placed.length; i++) {
    for (let j = i + 1; j < placed.length; j++) {
      const d = cutLineDistance(placed[i].ring, placed[j].ring, doc.minGap);
      if (d < doc.minGap - 1e-6) {
        guards.push({ kind: 'too-close', severity: 'warning', pieceIds: [placed[i].piece.id, placed[j].piece.id], distanceMm: d });
      }
    }
  }
  return guards;
}
