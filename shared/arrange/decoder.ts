// The nester's constructive side: each item's raster masks in every allowed turn, and the decoder
// that turns a sequence of pieces into boards of placed pieces (bottom-left fill, Jakobs 1996).
import { area } from '../geometry/polygon';
import { Board } from './board';
import type { BoardOptions } from './board';
import { rotationsOf } from './input';
import type { ArrangeItem, LockedPiece, Placement, RotateMode } from './nester';
import type { ShapeMask } from './raster';
import { shapeMask } from './raster';

type DecodeOptions = BoardOptions & { fill: boolean; strip: boolean; maxSheets: number };

export type Shape = { item: ArrangeItem; masks: ShapeMask[]; areaMm2: number };

export function prepare(items: ArrangeItem[], opts: { gap: number; cell: number; rotate: RotateMode }): Map<string, Shape> {
  const shapes = new Map<string, Shape>();
  for (const item of items) {
    // The raster is only a quick filter and never refuses a spot the exact test would take: a mask
    // cell is marked only when its centre lies within half the gap of the cut line, so two masks
    // share a cell only when their cut lines are within the gap of each other (triangle inequality).
    // It may take spots that are a little too close; the exact polygon test has the last word.
    const masks = rotationsOf(item.rotate ?? opts.rotate).map((r) => shapeMask(item.outline, r, opts.cell, opts.gap / 2));
    shapes.set(item.key, { item, masks, areaMm2: area(item.outline.points) });
  }
  return shapes;
}

/** One piece of the sequence: which item, and which of its rotations to try first (-1: all, best spot). */
export type Gene = { key: string; turn: number };

function lockedBoard(board: Board, locked: LockedPiece[], o: DecodeOptions) {
  for (const l of locked) {
    const turned = shapeMask(l.outline, l.rotation, o.cell, o.gap / 2);
    const ring = turned.ring.map((p) => ({ x: p.x + l.x, y: p.y + l.y }));
    board.place(turned, l.x, l.y, ring, area(l.outline.points));
  }
}

/**
 * The constructive decoder: each piece of the sequence at the lowest, then leftmost free spot of
 * its rotation (any other when it does not fit), on the first sheet with room; then, to fill the
 * sheet, the set round-robin until nothing more fits.
 */
export function decode(genes: Gene[], shapes: Map<string, Shape>, o: DecodeOptions, locked: LockedPiece[]) {
  const boards: Board[] = [];
  const newBoard = () => {
    const board = new Board(o);
    if (boards.length === 0) lockedBoard(board, locked, o);
    boards.push(board);
    return board;
  };
  newBoard();
  const placements: Placement[] = [];
  const left: string[] = [];
  const chosen: number[] = [];
  for (const gene of genes) {
    const shape = shapes.get(gene.key)!;
    const masks = gene.turn < 0 || gene.turn >= shape.masks.length ? shape.masks : [shape.masks[gene.turn]];
    let done = false;
    for (let s = 0; s < (o.fill || o.strip ? 1 : o.maxSheets) && !done; s++) {
      const board = boards[s] ?? newBoard();
      // The gene's rotation first; any other if it does not fit there.
      const spot = board.find(masks) ?? (masks.length < shape.masks.length ? board.find(shape.masks) : null);
      if (spot) {
        board.place(spot.mask, spot.x, spot.y, spot.ring, shape.areaMm2);
        placements.push({ key: gene.key, sheet: s, x: spot.x, y: spot.y, rotation: spot.mask.rotation });
        chosen.push(shape.masks.indexOf(spot.mask));
        done = true;
      }
    }
    if (!done) {
      left.push(gene.key);
      chosen.push(gene.turn);
    }
  }
  if (o.fill) {
    // Fill the sheet: repeat the set round-robin, keeping the mix balanced, until nothing more fits.
    let active = [...new Set(genes.map((g) => g.key))];
    while (active.length) {
      const still: string[] = [];
      for (const key of active) {
        const shape = shapes.get(key)!;
        const spot = boards[0].find(shape.masks);
        if (!spot) continue;
        boards[0].place(spot.mask, spot.x, spot.y, spot.ring, shape.areaMm2);
        placements.push({ key, sheet: 0, x: spot.x, y: spot.y, rotation: spot.mask.rotation });
        still.push(key);
      }
      active = still;
    }
  }
  const used = boards.filter((b, i) => i === 0 || placements.some((p) => p.sheet === i));
  // The rotations the decoder settled on become the genes' own, so the search builds on them.
  const settled = genes.map((g, i) => ({ key: g.key, turn: chosen[i] }));
  return { placements, left, boards: used, genes: settled };
}
