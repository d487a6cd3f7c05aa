import type { LengthUnit } from '../units';
import { formatLength } from '../units';
import type { Piece, SheetDocument } from './document';

/**
 * What a saved sheet may hold, in physical terms: every piece fits the print area (its finished
 * width, border included, at most the area's long side, since it may be turned), sits on or beside
 * the area (its centre no further out than one area width or height), and turns at most a full
 * turn either way. The editor checks the same rules before it saves, the server refuses a save
 * that breaks them, and analysis and export skip a stored piece that breaks them with a message.
 */
export const MAX_ROTATION_DEG = 360;

type BoundsField = 'x' | 'y' | 'width' | 'rotation';
type BoundsProblem = { index: number; pieceId: string; field: BoundsField; message: (unit: LengthUnit, name?: string) => string };

/** The largest art width a piece with this border may have on this sheet. */
export const maxArtWidthMm = (doc: Pick<SheetDocument, 'printArea'>, border: number) =>
  Math.max(doc.printArea.width, doc.printArea.height) - 2 * border;

/** Clamps a centre to the zone pieces may occupy (the area and one area-size beside it). */
export function clampToZone(doc: Pick<SheetDocument, 'printArea'>, x: number, y: number) {
  const { width, height } = doc.printArea;
  return { x: Math.min(2 * width, Math.max(-width, x)), y: Math.min(2 * height, Math.max(-height, y)) };
}

export function pieceProblems(doc: Pick<SheetDocument, 'printArea'>, piece: Piece, index: number): BoundsProblem[] {
  const problems: BoundsProblem[] = [];
  const label = (name?: string) => name ?? `Piece ${index + 1}`;
  const add = (field: BoundsField, message: BoundsProblem['message']) => problems.push({ index, pieceId: piece.id, field, message });
  const { width, height } = doc.printArea;
  const zone = clampToZone(doc, piece.x, piece.y);
  if (zone.x !== piece.x)
    add(
      'x',
      (unit, name) =>
        `${label(name)} is far outside the print area: keep it within ${formatLength(width, unit)} of the area's left and right edges.`,
    );
  if (zone.y !== piece.y)
    add(
      'y',
      (unit, name) =>
        `${label(name)} is far outside the print area: keep it within ${formatLength(height, unit)} of the area's top and bottom edges.`,
    );
  const longest = Math.max(width, height);
  if (piece.width > maxArtWidthMm(doc, piece.border) + 1e-6) {
    add(
      'width',
      (unit, name) =>
        `${label(name)} is ${formatLength(piece.width, unit)} wide; with its border it must fit the print area, which is at most ${formatLength(longest, unit)} across.`,
    );
  }
  if (Math.abs(piece.rotation) > MAX_ROTATION_DEG)
    add(
      'rotation',
      (_unit, name) =>
        `${label(name)} has a rotation of ${Math.round(piece.rotation)}°; use ${-MAX_ROTATION_DEG}° to ${MAX_ROTATION_DEG}°.`,
    );
  return problems;
}

export function documentProblems(doc: SheetDocument): BoundsProblem[] {
  return doc.pieces.flatMap((piece, index) => pieceProblems(doc, piece, index));
}

/** The field key a problem is reported under, as the API's validation errors name it. */
export const problemField = (problem: BoundsProblem) => `document.pieces.${problem.index}.${problem.field}`;

/** Changes that bring every out-of-bounds piece back within the rules (the nearest allowed value). */
export function fitToBounds(doc: SheetDocument): Map<string, Partial<Piece>> {
  const patches = new Map<string, Partial<Piece>>();
  for (const problem of documentProblems(doc)) {
    const piece = doc.pieces[problem.index];
    const patch = patches.get(piece.id) ?? {};
    if (problem.field === 'x' || problem.field === 'y') Object.assign(patch, clampToZone(doc, piece.x, piece.y));
    if (problem.field === 'width') patch.width = Math.max(2, Math.floor(maxArtWidthMm(doc, piece.border) * 100) / 100);
    if (problem.field === 'rotation') patch.rotation = piece.rotation % 360;
    patches.set(piece.id, patch);
  }
  return patches;
}

/** The pieces an API refusal names (fields like `document.pieces.3.width`). */
export function refusedPieceIds(fields: Record<string, string>, doc: SheetDocument): string[] {
  const ids = new Set<string>();
  for (const key of Object.keys(fields)) {
    const match = /^document\.pieces\.(\d+)\./.exec(key);
    const piece = match ? doc.pieces[Number(match[1])] : undefined;
    if (piece) ids.add(piece.id);
  }
  return [...ids];
}
