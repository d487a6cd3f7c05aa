// A label sheet (planner stickers, name labels): copies of one sticker on an exact grid that fills
// the print area inside its safe margin. The pitch is the sticker's frame plus the gap, both ways,
// and the grid is centred, so every label sits the same distance from its neighbours.
import type { Command } from './commands';
import { newPieceId } from './commands';
import type { Piece, SheetDocument } from './document';

/**
 * Added to the gap: a traced cut line may reach a fraction of a pixel past its frame, and preflight
 * measures the lines themselves. 0.05 mm (0.002 in) keeps every pair at least the gap apart.
 */
export const LABEL_GRID_ALLOWANCE_MM = 0.05;

type LabelGrid = { columns: number; rows: number; pitchX: number; pitchY: number; command: Command };

/**
 * The grid for `template` (its frame `frameW` × `frameH` mm as drawn, turned with it) at the sheet's
 * gap (plus the allowance) between frames; null when not even one fits. The template moves to the first cell and the copies
 * fill the rest, as one undoable step; other pieces stay where they are.
 */
export function labelGrid(doc: SheetDocument, template: Piece, frameW: number, frameH: number, sheetGapMm: number): LabelGrid | null {
  const gapMm = sheetGapMm + LABEL_GRID_ALLOWANCE_MM;
  const usableW = doc.printArea.width - 2 * doc.safeMargin,
    usableH = doc.printArea.height - 2 * doc.safeMargin;
  const columns = Math.floor((usableW + gapMm + 1e-9) / (frameW + gapMm)),
    rows = Math.floor((usableH + gapMm + 1e-9) / (frameH + gapMm));
  if (columns < 1 || rows < 1) return null;
  const pitchX = frameW + gapMm,
    pitchY = frameH + gapMm;
  const left = doc.safeMargin + (usableW - (columns * frameW + (columns - 1) * gapMm)) / 2,
    top = doc.safeMargin + (usableH - (rows * frameH + (rows - 1) * gapMm)) / 2;
  const centre = (i: number, j: number) => ({ x: left + frameW / 2 + i * pitchX, y: top + frameH / 2 + j * pitchY });
  const added: Piece[] = [];
  for (let j = 0; j < rows; j++)
    for (let i = 0; i < columns; i++) if (i > 0 || j > 0) added.push({ ...template, id: newPieceId(), locked: false, ...centre(i, j) });
  const moved = { ...template, ...centre(0, 0) };
  return {
    columns,
    rows,
    pitchX,
    pitchY,
    command: { name: 'Label grid', diff: { added, updated: [{ from: template, to: moved }], removed: [] } },
  };
}

/** The grid for the one selected piece at the sheet's gap, or null (none or several selected, or it does not fit). */
export function labelGridForSelection(
  doc: SheetDocument,
  selection: ReadonlySet<string>,
  halfSize: (piece: Piece) => { w: number; h: number },
): LabelGrid | null {
  if (selection.size !== 1) return null;
  const piece = doc.pieces.find((p) => selection.has(p.id));
  if (!piece) return null;
  const half = halfSize(piece);
  return labelGrid(doc, piece, 2 * half.w, 2 * half.h, doc.minGap);
}
