import { z } from 'zod';
import '../schemas/messages';

/**
 * The sheet document: a plain, serialisable record shared by the editor, the server, the arrange
 * CLI and the exporters. Lengths in millimetres; x and y are the centre of a piece's finished
 * sticker frame, measured from the print area's top-left corner; rotation in degrees clockwise.
 */
export const SHEET_SCHEMA_VERSION = 1;

export const pieceSchema = z.object({
  id: z.string().min(1).max(40),
  artId: z.string().regex(/^\d{1,18}$/),
  x: z.number().finite(),
  y: z.number().finite(),
  rotation: z.number().finite(),
  /** Printed width of the art's visible part (the border adds to it). */
  width: z.number().min(2).max(1000),
  border: z.number().min(0).max(50),
  borderColour: z.string().regex(/^#[0-9a-f]{6}$/),
  locked: z.boolean(),
  /** How the cutter cuts this piece: through the face only (kiss, the default) or the liner too (die). */
  cut: z.enum(['kiss', 'die']).optional(),
});
export type Piece = z.infer<typeof pieceSchema>;

export const sheetDocumentSchema = z.object({
  schemaVersion: z.literal(SHEET_SCHEMA_VERSION),
  printArea: z.object({ width: z.number().positive().max(2000), height: z.number().positive().max(2000) }),
  safeMargin: z.number().min(0).max(100),
  minGap: z.number().min(0).max(100),
  pieces: z.array(pieceSchema).max(2000),
});
export type SheetDocument = z.infer<typeof sheetDocumentSchema>;

export function emptyDocument(profile: {
  areaWidthMm: number;
  areaHeightMm: number;
  safeMarginMm: number;
  minGapMm: number;
}): SheetDocument {
  return {
    schemaVersion: SHEET_SCHEMA_VERSION,
    printArea: { width: profile.areaWidthMm, height: profile.areaHeightMm },
    safeMargin: profile.safeMarginMm,
    minGap: profile.minGapMm,
    pieces: [],
  };
}

/** Migrations from older schema versions, oldest first; none yet beyond version 1. */
export function migrateDocument(raw: unknown): SheetDocument {
  return sheetDocumentSchema.parse(raw);
}

/**
 * What preflight, the editor and the sheet analysis call a piece: its art's name, numbered in sheet
 * order when the art is on the sheet more than once ("Ghost 2").
 */
export function pieceName(doc: Pick<SheetDocument, 'pieces'>, pieceId: string, artName: (artId: string) => string | undefined): string {
  const piece = doc.pieces.find((p) => p.id === pieceId);
  if (!piece) return 'A piece';
  const art = artName(piece.artId) ?? 'Piece';
  const same = doc.pieces.filter((p) => p.artId === piece.artId);
  return same.length > 1 ? `${art} ${same.indexOf(piece) + 1}` : art;
}
