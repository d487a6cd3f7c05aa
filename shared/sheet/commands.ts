import { normaliseDegrees } from '../units';
import type { Piece, SheetDocument } from './document';

/**
 * Every change to a sheet is a named command that produces a diff: pieces added, updated
 * (from → to) and removed. Undo applies the inverted diff, so each command knows how to undo itself.
 */
export type Diff = {
  added: Piece[];
  updated: Array<{ from: Piece; to: Piece }>;
  removed: Piece[];
};

/**
 * `merge`: commands with the same key in a row (typing "135" into Rotation, dragging the colour
 * picker) become one undo step, until the history is marked (a field left, a gesture ended).
 */
export type Command = { name: string; diff: Diff; merge?: string };

const emptyDiff = (): Diff => ({ added: [], updated: [], removed: [] });

export function applyDiff(doc: SheetDocument, diff: Diff): SheetDocument {
  const removed = new Set(diff.removed.map((p) => p.id));
  const updated = new Map(diff.updated.map((u) => [u.to.id, u.to]));
  const pieces = doc.pieces.filter((p) => !removed.has(p.id)).map((p) => updated.get(p.id) ?? p);
  return { ...doc, pieces: [...pieces, ...diff.added] };
}

export function invertDiff(diff: Diff): Diff {
  return {
    added: diff.removed,
    removed: diff.added,
    updated: diff.updated.map(({ from, to }) => ({ from: to, to: from })),
  };
}

const withMerge = (command: Command, field: string, ids: Iterable<string>): Command => ({
  ...command,
  merge: `${field}:${[...ids].sort().join(',')}`,
});

/** Two update-only diffs as one: each piece from its first state to its last. */
export function composeDiffs(first: Diff, second: Diff): Diff | null {
  if (first.added.length || first.removed.length || second.added.length || second.removed.length) return null;
  const byPiece = new Map(first.updated.map((u) => [u.to.id, { ...u }]));
  for (const u of second.updated) {
    const earlier = byPiece.get(u.to.id);
    byPiece.set(u.to.id, earlier ? { from: earlier.from, to: u.to } : { ...u });
  }
  return { added: [], removed: [], updated: [...byPiece.values()] };
}

const byId = (doc: SheetDocument, ids: Iterable<string>) => {
  const wanted = new Set(ids);
  return doc.pieces.filter((p) => wanted.has(p.id));
};

function update(
  doc: SheetDocument,
  name: string,
  ids: Iterable<string>,
  change: (p: Piece) => Partial<Piece>,
  includeLocked = false,
): Command {
  const updates = byId(doc, ids)
    .filter((p) => includeLocked || !p.locked)
    .map((from) => ({ from, to: { ...from, ...change(from) } }))
    .filter(({ from, to }) => JSON.stringify(from) !== JSON.stringify(to));
  return { name, diff: { added: [], removed: [], updated: updates } };
}

let counter = 0;
export const newPieceId = () => `p${Date.now().toString(36)}${(counter++).toString(36)}${Math.random().toString(36).slice(2, 6)}`;

export const commands = {
  addPieces: (pieces: Piece[]): Command => ({ name: 'Add pieces', diff: { added: pieces, updated: [], removed: [] } }),

  removePieces: (doc: SheetDocument, ids: Iterable<string>): Command => ({
    name: 'Delete',
    diff: { added: [], updated: [], removed: byId(doc, ids).filter((p) => !p.locked) },
  }),

  duplicatePieces: (doc: SheetDocument, ids: Iterable<string>, offset: number): Command => ({
    name: 'Duplicate',
    diff: {
      added: byId(doc, ids).map((p) => ({ ...p, id: newPieceId(), x: p.x + offset, y: p.y + offset, locked: false })),
      updated: [],
      removed: [],
    },
  }),

  movePieces: (doc: SheetDocument, ids: Iterable<string>, dx: number, dy: number): Command =>
    update(doc, 'Move', ids, (p) => ({ x: p.x + dx, y: p.y + dy })),

  /** Any per-piece changes as one named step (e.g. a transform that rotates and resizes). */
  patchPieces: (doc: SheetDocument, name: string, patches: Map<string, Partial<Omit<Piece, 'id'>>>): Command =>
    update(doc, name, patches.keys(), (p) => patches.get(p.id)!),

  /** Sets absolute positions (after a drag), one per piece. */
  placePieces: (doc: SheetDocument, positions: Map<string, { x: number; y: number; rotation?: number }>): Command =>
    update(doc, 'Move', positions.keys(), (p) => positions.get(p.id)!),

  rotatePieces: (doc: SheetDocument, ids: Iterable<string>, by: number): Command =>
    update(doc, 'Rotate', ids, (p) => ({ rotation: normaliseDegrees(p.rotation + by) })),

  setRotation: (doc: SheetDocument, ids: Iterable<string>, rotation: number): Command =>
    withMerge(
      update(doc, 'Rotate', ids, () => ({ rotation: normaliseDegrees(rotation) })),
      'rotation',
      ids,
    ),

  resizePieces: (doc: SheetDocument, ids: Iterable<string>, width: number): Command => update(doc, 'Resize', ids, () => ({ width })),

  /** The border's width only: each piece keeps its own colour. */
  setBorder: (doc: SheetDocument, ids: Iterable<string>, border: number): Command => update(doc, 'Border', ids, () => ({ border })),

  /** The border's colour only: each piece keeps its own width. */
  setBorderColour: (doc: SheetDocument, ids: Iterable<string>, borderColour: string): Command =>
    withMerge(
      update(doc, 'Border colour', ids, () => ({ borderColour })),
      'border-colour',
      ids,
    ),

  setLocked: (doc: SheetDocument, ids: Iterable<string>, locked: boolean): Command =>
    update(doc, locked ? 'Lock' : 'Unlock', ids, () => ({ locked }), true),

  /** Align selected pieces' frames (given their current half sizes) to a common edge or centre. */
  align: (
    doc: SheetDocument,
    ids: string[],
    edge: 'left' | 'centre' | 'right' | 'top' | 'middle' | 'bottom',
    halfSize: (p: Piece) => { w: number; h: number },
  ): Command => {
    const pieces = byId(doc, ids).filter((p) => !p.locked);
    if (pieces.length < 2) return { name: 'Align', diff: emptyDiff() };
    const lefts = pieces.map((p) => p.x - halfSize(p).w),
      rights = pieces.map((p) => p.x + halfSize(p).w);
    const tops = pieces.map((p) => p.y - halfSize(p).h),
      bottoms = pieces.map((p) => p.y + halfSize(p).h);
    const target = {
      left: Math.min(...lefts),
      right: Math.max(...rights),
      centre: (Math.min(...lefts) + Math.max(...rights)) / 2,
      top: Math.min(...tops),
      bottom: Math.max(...bottoms),
      middle: (Math.min(...tops) + Math.max(...bottoms)) / 2,
    }[edge];
    return update(doc, 'Align', ids, (p) => {
      const { w, h } = halfSize(p);
      if (edge === 'left') return { x: target + w };
      if (edge === 'right') return { x: target - w };
      if (edge === 'centre') return { x: target };
      if (edge === 'top') return { y: target + h };
      if (edge === 'bottom') return { y: target - h };
      return { y: target };
    });
  },

  /** Equal gaps between selected pieces along one axis, keeping the outermost two in place. */
  distribute: (doc: SheetDocument, ids: string[], axis: 'x' | 'y', halfSize: (p: Piece) => { w: number; h: number }): Command => {
    const pieces = byId(doc, ids)
      .filter((p) => !p.locked)
      .sort((a, b) => a[axis] - b[axis]);
    if (pieces.length < 3) return { name: 'Distribute', diff: emptyDiff() };
    const half = (p: Piece) => (axis === 'x' ? halfSize(p).w : halfSize(p).h);
    const start = pieces[0][axis] - half(pieces[0]);
    const end = pieces[pieces.length - 1][axis] + half(pieces[pieces.length - 1]);
    const total = pieces.reduce((s, p) => s + 2 * half(p), 0);
    const gap = (end - start - total) / (pieces.length - 1);
    const positions = new Map<string, number>();
    let cursor = start;
    for (const p of pieces) {
      positions.set(p.id, cursor + half(p));
      cursor += 2 * half(p) + gap;
    }
    return update(doc, 'Distribute', positions.keys(), (p) => ({ [axis]: positions.get(p.id)! }));
  },
};
