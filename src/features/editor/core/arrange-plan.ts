// Turns a sheet and arrange options into the nester's input, and its result back into one command.
import type { ArrangeItem, ArrangeResult, LockedPiece, RotateMode } from '@shared/arrange/nester';
import { arrange } from '@shared/arrange/nester';
import type { Command } from '@shared/sheet/commands';
import { newPieceId } from '@shared/sheet/commands';
import type { Piece, SheetDocument } from '@shared/sheet/document';
import type { PieceOutline } from '@shared/sheet/placement';
import { outlineKey } from '@shared/sheet/placement';

export type ArrangeChoice = {
  scope: 'sheet' | 'selection';
  rotate: RotateMode;
  fill: boolean;
  seconds: number;
  seed: number;
  /** How many of each shape (group key) to lay out; a group not named keeps the copies it has. */
  quantities?: Record<string, number>;
};

/** The most copies of one shape a single arrange run takes (over all the sheets it needs). */
export const MAX_QUANTITY = 500;
/** The most sheets one run may spread a quantity over. */
const MAX_SHEETS = 20;

/**
 * The turning a run starts with: die-cut singles may turn a quarter (each is sold on its own), but a
 * kiss-cut sheet is sold whole, so its stickers stay upright unless the maker says otherwise.
 */
export function defaultTurning(pieces: readonly Piece[]): RotateMode {
  return pieces.length > 0 && pieces.every((p) => p.cut === 'die') ? '90' : 'none';
}

/** The pieces a run moves, grouped by shape (equal art, width and border): one quantity per group. */
export function arrangeGroups(doc: SheetDocument, selection: ReadonlySet<string>, scope: ArrangeChoice['scope']): Map<string, Piece[]> {
  const groups = new Map<string, Piece[]>();
  for (const p of doc.pieces) {
    if (p.locked || (scope === 'selection' && !selection.has(p.id))) continue;
    // Only groups equal shapes: any fixed cut limits give the same grouping.
    const key = outlineKey(p, { minFeatureMm: 0, bridgeWidthMm: 0 });
    groups.set(key, [...(groups.get(key) ?? []), p]);
  }
  return groups;
}

/** A quantity as typed, or the reason it cannot be used (in the maker's words, naming the art). */
export function parseQuantity(text: string, name: string): { value: number } | { error: string } {
  const value = Number(text.trim());
  if (text.trim() === '' || !Number.isInteger(value) || value < 1 || value > MAX_QUANTITY)
    return { error: `${name}: give a whole number of stickers from 1 to ${MAX_QUANTITY}.` };
  return { value };
}

export function planArrange(
  doc: SheetDocument,
  selection: ReadonlySet<string>,
  outlines: Map<string, { outline: PieceOutline | undefined }>,
  choice: ArrangeChoice,
  nameOf: (artId: string) => string = () => 'Piece',
) {
  const groups = arrangeGroups(doc, selection, choice.scope);
  const moving = new Set([...groups.values()].flat().map((p) => p.id));
  const fixed = doc.pieces.filter((p) => !moving.has(p.id));
  const items: ArrangeItem[] = [];
  for (const [key, pieces] of groups) {
    const o = outlines.get(pieces[0].id)?.outline;
    if (!o) {
      groups.delete(key); // not measured yet: left where it is
      continue;
    }
    items.push({
      key,
      name: nameOf(pieces[0].artId),
      outline: { points: o.points, widthMm: o.widthMm, heightMm: o.heightMm },
      count: choice.quantities?.[key] ?? pieces.length,
    });
  }
  const locked: LockedPiece[] = fixed.flatMap((p) => {
    const o = outlines.get(p.id)?.outline;
    return o
      ? [{ key: p.id, x: p.x, y: p.y, rotation: p.rotation, outline: { points: o.points, widthMm: o.widthMm, heightMm: o.heightMm } }]
      : [];
  });
  return {
    items,
    locked,
    groups,
    // Filling stays on this sheet; a quantity spreads over as few sheets as it needs.
    options: {
      width: doc.printArea.width,
      height: doc.printArea.height,
      gap: doc.minGap,
      margin: doc.safeMargin,
      rotate: choice.rotate,
      fill: choice.fill,
      timeMs: choice.seconds * 1000,
      seed: choice.seed,
      maxSheets: choice.fill ? 1 : MAX_SHEETS,
    },
  };
}

/**
 * The arranged layout as one command on this sheet: pieces moved, copies added for a larger quantity
 * or a fill, and pieces taken off that a smaller quantity drops or that go on a further sheet. A
 * piece that fitted nowhere stays where it was (the panel says so).
 */
export function arrangeCommand(groups: Map<string, Piece[]>, result: ArrangeResult): Command {
  const updated: Command['diff']['updated'] = [];
  const added: Piece[] = [];
  const removed: Piece[] = [];
  for (const [key, pieces] of groups) {
    const here = result.placements.filter((pl) => pl.sheet === 0 && pl.key === key);
    here.forEach((p, i) => {
      const existing = pieces[i];
      if (existing) updated.push({ from: existing, to: { ...existing, x: p.x, y: p.y, rotation: p.rotation } });
      else added.push({ ...pieces[0], id: newPieceId(), x: p.x, y: p.y, rotation: p.rotation, locked: false });
    });
    const nowhere = result.unplaced.filter((u) => u.key === key).reduce((n, u) => n + u.count, 0);
    removed.push(...pieces.slice(here.length + nowhere));
  }
  return { name: 'Arrange', diff: { added, updated, removed } };
}

/** The sheets after this one that a run needs, each a document of its own (same print area and rules). */
export function furtherSheets(doc: SheetDocument, groups: Map<string, Piece[]>, result: ArrangeResult): SheetDocument[] {
  const sheets: SheetDocument[] = [];
  for (let s = 1; s < result.sheets; s++) {
    const pieces = result.placements
      .filter((pl) => pl.sheet === s)
      .map((pl) => ({ ...groups.get(pl.key)![0], id: newPieceId(), x: pl.x, y: pl.y, rotation: pl.rotation, locked: false }));
    if (pieces.length) sheets.push({ ...doc, pieces });
  }
  return sheets;
}

/**
 * Where "Add" puts a new piece: the first free spot (top-left first) for a box the size of the new
 * sticker (art plus border, a little over its real outline, so the spot is safe), clear of every
 * piece whose outline is known by the sheet's gap and inside its margin; the centre when the sheet
 * is full.
 */
export function firstFreeSpot(
  doc: SheetDocument,
  outlines: Map<string, { outline: PieceOutline | undefined }>,
  size: { widthMm: number; heightMm: number },
): { x: number; y: number } {
  const centre = { x: doc.printArea.width / 2, y: doc.printArea.height / 2 };
  const rect = (w: number, h: number) => ({
    points: [
      { x: 0, y: 0 },
      { x: w, y: 0 },
      { x: w, y: h },
      { x: 0, y: h },
    ],
    widthMm: w,
    heightMm: h,
  });
  const locked: LockedPiece[] = doc.pieces.map((p) => {
    const o = outlines.get(p.id)?.outline;
    // A piece whose outline has not arrived yet stands in as the square of its width and border.
    const outline = o
      ? { points: o.points, widthMm: o.widthMm, heightMm: o.heightMm }
      : rect(p.width + 2 * p.border, p.width + 2 * p.border);
    return { key: p.id, x: p.x, y: p.y, rotation: p.rotation, outline };
  });
  const box = rect(size.widthMm, size.heightMm);
  try {
    const result = arrange(
      [{ key: 'new', outline: box, count: 1 }],
      {
        width: doc.printArea.width,
        height: doc.printArea.height,
        gap: doc.minGap,
        margin: doc.safeMargin,
        rotate: 'none',
        maxIterations: 1,
        maxSheets: 1,
      },
      locked,
    );
    const spot = result.placements.find((p) => p.sheet === 0);
    return spot ? { x: spot.x, y: spot.y } : centre;
  } catch {
    return centre;
  }
}
