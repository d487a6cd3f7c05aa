// Turns a sheet and arrange options into the nester's input, and its result back into one command.
import type { ArrangeItem, ArrangeResult, LockedPiece, RotateMode } from '../../../../shared/arrange/nester';
import { arrange } from '../../../../shared/arrange/nester';
import type { Command } from '../../../../shared/sheet/commands';
import { newPieceId } from '../../../../shared/sheet/commands';
import type { Piece, SheetDocument } from '../../../../shared/sheet/document';
import type { PieceOutline } from '../api/outlines';
import { outlineKey } from '../api/outlines';

export type ArrangeChoice = { scope: 'sheet' | 'selection'; rotate: RotateMode; fill: boolean; seconds: number; seed: number };

export function planArrange(doc: SheetDocument, selection: ReadonlySet<string>, outlines: Map<string, { outline: PieceOutline | undefined }>, choice: ArrangeChoice) {
  const movable = doc.pieces.filter((p) => !p.locked && (choice.scope === 'sheet' || selection.has(p.id)));
  const fixed = doc.pieces.filter((p) => !movable.includes(p));
  const groups = new Map<string, Piece[]>();
  for (const p of movable) {
    // Only groups equal shapes: any fixed cut limits give the same grouping.
    const key = outlineKey(p, { minFeatureMm: 0, bridgeWidthMm: 0 });
    groups.set(key, [...(groups.get(key) ?? []), p]);
  }
  const items: ArrangeItem[] = [];
  for (const [key, pieces] of groups) {
    const o = outlines.get(pieces[0].id)?.outline;
    if (!o) continue;
    items.push({ key, outline: { points: o.points, widthMm: o.widthMm, heightMm: o.heightMm }, count: pieces.length });
  }
  const locked: LockedPiece[] = fixed.flatMap((p) => {
    const o = outlines.get(p.id)?.outline;
    return o ? [{ key: p.id, x: p.x, y: p.y, rotation: p.rotation, outline: { points: o.points, widthMm: o.widthMm, heightMm: o.heightMm } }] : [];
  });
  return {
    items,
    locked,
    groups,
    options: { width: doc.printArea.width, height: doc.printArea.height, gap: doc.minGap, margin: doc.safeMargin, rotate: choice.rotate, fill: choice.fill, timeMs: choice.seconds * 1000, seed: choice.seed, maxSheets: 1 },
  };
}

/** The arranged layout as one command: moved pieces, new copies (fill) and nothing else. */
export function arrangeCommand(groups: Map<string, Piece[]>, result: ArrangeResult): Command {
  const queue = new Map([...groups].map(([key, pieces]) => [key, [...pieces]]));
  const updated: Command['diff']['updated'] = [];
  const added: Piece[] = [];
  for (const p of result.placements.filter((pl) => pl.sheet === 0)) {
    const existing = queue.get(p.key)?.shift();
    if (existing) updated.push({ from: existing, to: { ...existing, x: p.x, y: p.y, rotation: p.rotation } });
    else {
      const template = groups.get(p.key)![0];
      added.push({ ...template, id: newPieceId(), x: p.x, y: p.y, rotation: p.rotation, locked: false });
    }
  }
  return { name: 'Arrange', diff: { added, updated, removed: [] } };
}

/**
 * Where "Add" puts a new piece: the first free spot (top-left first) for a box the size of the new
 * sticker (art plus border, a little over its real outline, so the spot is safe), clear of every
 * piece whose outline is known by the sheet's gap and inside its margin; the centre when the sheet
 * is full.
 */
export function firstFreeSpot(doc: SheetDocument, outlines: Map<string, { outline: PieceOutline | undefined }>, size: { widthMm: number; heightMm: number }): { x: number; y: number } {
  const centre = { x: doc.printArea.width / 2, y: doc.printArea.height / 2 };
  const rect = (w: number, h: number) => ({ points: [{ x: 0, y: 0 }, { x: w, y: 0 }, { x: w, y: h }, { x: 0, y: h }], widthMm: w, heightMm: h });
  const locked: LockedPiece[] = doc.pieces.map((p) => {
    const o = outlines.get(p.id)?.outline;
    // A piece whose outline has not arrived yet stands in as the square of its width and border.
    const outline = o ? { points: o.points, widthMm: o.widthMm, heightMm: o.heightMm } : rect(p.width + 2 * p.border, p.width + 2 * p.border);
    return { key: p.id, x: p.x, y: p.y, rotation: p.rotation, outline };
  });
  const box = rect(size.widthMm, size.heightMm);
  try {
    const result = arrange([{ key: 'new', outline: box, count: 1 }], { width: doc.printArea.width, height: doc.printArea.height, gap: doc.minGap, margin: doc.safeMargin, rotate: 'none', maxIterations: 1, maxSheets: 1 }, locked);
    const spot = result.placements.find((p) => p.sheet === 0);
    return spot ? { x: spot.x, y: spot.y } : centre;
  } catch {
    return centre;
  }
}
