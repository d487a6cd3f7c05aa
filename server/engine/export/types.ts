import type { PieceOutline } from '@shared/sheet/placement';
import type { Piece, SheetDocument } from '@shared/sheet/document';
import type { RegMarks } from './marks';

export type ExportFormat = 'png' | 'svg' | 'combined' | 'pdf' | 'dxf';
export const EXPORT_FORMATS: ExportFormat[] = ['png', 'svg', 'combined', 'pdf', 'dxf'];

/** One piece ready to export: its cut line (sticker frame, mm) and its bordered raster. */
export type ExportPiece = {
  piece: Piece;
  name: string;
  cutLine: PieceOutline;
  /** The bordered raster at the export DPI (grown by the bleed, if any), centred on the piece. */
  raster: { png: Buffer; widthMm: number; heightMm: number };
};

export type PaperPlacement = { paperWidthMm: number; paperHeightMm: number; areaXMm: number; areaYMm: number };

export type ExportOptions = {
  dpi: number;
  background: 'transparent' | 'white';
  bleedMm: number;
  formats: ExportFormat[];
  dxfUnit: 'mm' | 'in';
  /** A cut around the whole sheet: a rounded rectangle this far inside the print area's edge. */
  sheetCut: { marginMm: number; radiusMm: number } | null;
  /** Name of the spot colour the cutter's software looks for on the PDF's cut layer. */
  spotColour: string;
  summaryPage: boolean;
  /** A 1 in scale bar in the PDF's margin, to check on paper that nothing was scaled. */
  checkBar: boolean;
  /** Registration marks printed outside the print area's corners (the profile's; null: none). */
  marks: RegMarks | null;
  /** Also put the marks' outlines in the cut files (cut SVG, DXF, the PDF's cut layer). */
  marksInCutFile: boolean;
};

export type ExportSheet = {
  name: string;
  unit: 'in' | 'mm';
  doc: SheetDocument;
  pieces: ExportPiece[];
  paper: PaperPlacement;
  preflight?: string[];
};

export const DEFAULT_EXPORT_OPTIONS: ExportOptions = {
  dpi: 300,
  background: 'transparent',
  bleedMm: 0,
  formats: EXPORT_FORMATS,
  dxfUnit: 'mm',
  sheetCut: null,
  spotColour: 'CutContour',
  summaryPage: false,
  checkBar: true,
  marks: null,
  marksInCutFile: false,
};
