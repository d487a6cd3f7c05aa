import { REG_MARK_LABELS } from '@shared/schemas/sheets';
import { formatLength } from '@shared/units';
import { cutDxf } from './dxf';
import { sheetCutLines } from './geometry';
import { sheetPdf, summaryPdf } from './pdf';
import { pdfImageOf } from './pdf-image';
import { encodePrintPng, renderPrintRaster } from './print-image';
import { combinedSvg, cutSvg } from './svg';
import { zipFiles } from './bundle';
import type { ExportOptions, ExportSheet } from './types';

export class ExportInputError extends Error {}

/**
 * What goes beside every print file: a printer scaling the page ("fit to page", borderless
 * expansion) is the commonest reason cut lines miss the print (common practice, TRADE.md).
 */
const PRINT_CAUTION = (area: string) => [
  'Print at 100 % (actual size): no scaling, no fit-to-page, no borderless expansion.',
  `Check with a ruler: the print area is ${area}; in the PDF the bar under it is 1 in.`,
];

const slug = (name: string) =>
  name
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '')
    .slice(0, 60) || 'sheet';

/**
 * Renders every requested format of one sheet from one set of placed cut lines, and a short text
 * of sizes and settings; returns the files and the zip of them all.
 */
export async function exportSheet(sheet: ExportSheet, options: ExportOptions, onProgress?: (fraction: number, step: string) => void) {
  if (sheet.pieces.length === 0) throw new ExportInputError('The sheet has no pieces to export.');
  if (!(options.dpi >= 150 && options.dpi <= 600)) throw new ExportInputError('Choose a resolution from 150 to 600 DPI.');
  const base = slug(sheet.name);
  const lines = sheetCutLines(sheet, options.sheetCut);
  const files: Array<{ name: string; data: Buffer | string }> = [];
  const wants = new Set(options.formats);
  onProgress?.(0.05, 'Rendering the print image');
  const needsPng = wants.has('png') || wants.has('combined') || wants.has('pdf');
  const raster = needsPng
    ? await renderPrintRaster(sheet, options.dpi, options.background, (d, t) =>
        onProgress?.(0.05 + 0.6 * (d / t), 'Rendering the print image'),
      )
    : null;
  // The PNG and the PDF's image streams are encoded side by side (sharp works off the main thread).
  const [png, pdfImage] = await Promise.all([
    raster ? encodePrintPng(raster) : null,
    raster && wants.has('pdf') ? pdfImageOf(raster) : null,
  ]);
  if (wants.has('png')) files.push({ name: `${base}-print.png`, data: png! });
  onProgress?.(0.7, 'Writing the cut files');
  const marks = options.marks;
  const cutMarks = options.marksInCutFile ? marks : null;
  if (wants.has('svg')) files.push({ name: `${base}-cut.svg`, data: cutSvg(sheet, lines, cutMarks) });
  if (wants.has('combined')) files.push({ name: `${base}-print-and-cut.svg`, data: combinedSvg(sheet, lines, png!, marks) });
  if (wants.has('dxf')) files.push({ name: `${base}-cut.dxf`, data: cutDxf(sheet, lines, options.dxfUnit, cutMarks) });
  const u = sheet.unit;
  const area = `${formatLength(sheet.doc.printArea.width, u)} x ${formatLength(sheet.doc.printArea.height, u)}`;
  const settings = [
    `Sheetsmith export: ${sheet.name}`,
    ...PRINT_CAUTION(area),
    `Print area: ${formatLength(sheet.doc.printArea.width, u)} x ${formatLength(sheet.doc.printArea.height, u)}, placed ${formatLength(sheet.paper.areaXMm, u)} from the left and ${formatLength(sheet.paper.areaYMm, u)} from the top of ${formatLength(sheet.paper.paperWidthMm, u)} x ${formatLength(sheet.paper.paperHeightMm, u)} paper`,
    `Resolution: ${options.dpi} DPI; background ${options.background}; bleed ${formatLength(options.bleedMm, u)}`,
    `Minimum gap ${formatLength(sheet.doc.minGap, u)}; safe margin ${formatLength(sheet.doc.safeMargin, u)}`,
    `Cut lines: ${lines.length} (${lines.filter((l) => l.kind === 'die').length} die cut), PDF spot colour ${options.spotColour}, DXF in ${options.dxfUnit}`,
    marks
      ? `Registration marks: ${REG_MARK_LABELS[marks.shape].toLowerCase()} ${formatLength(marks.sizeMm, u)}, ${formatLength(marks.offsetMm, u)} outside the top-left, top-right and bottom-left corners of the print area; printed on the PDF page and in the print-and-cut SVG (not in the print PNG, which covers the print area only)${options.marksInCutFile ? '; also outlined in the cut SVG, the DXF and the PDF cut layer' : '; not in the cut files'}`
      : 'Registration marks: none (the cutter software adds its own)',
    `Pieces: ${sheet.pieces.length}`,
    ...sheet.pieces.map(
      (p, i) =>
        `  ${i + 1}. ${p.name}: ${formatLength(p.piece.width, u)} wide, border ${formatLength(p.piece.border, u)}, at (${formatLength(p.piece.x, u)}, ${formatLength(p.piece.y, u)}), turned ${Math.round(p.piece.rotation)} deg`,
    ),
    ...(sheet.preflight?.length ? ['Preflight:', ...sheet.preflight.map((f) => `  - ${f}`)] : []),
    '',
    'Cutting: follow your machine instructions; keep fingers away from the carriage while it moves and change blades with the tool the maker provides.',
  ];
  if (wants.has('pdf')) {
    onProgress?.(0.8, 'Writing the PDF');
    files.push({
      name: `${base}.pdf`,
      data: await sheetPdf(sheet, lines, pdfImage!, options.spotColour, {
        checkBar: options.checkBar,
        summary: options.summaryPage ? settings.filter(Boolean) : null,
        marks,
        marksInCutFile: options.marksInCutFile,
      }),
    });
    files.push({
      name: `${base}-summary.pdf`,
      data: await summaryPdf(`${sheet.name}: export summary`, settings, {
        widthMm: sheet.paper.paperWidthMm,
        heightMm: sheet.paper.paperHeightMm,
      }),
    });
  }
  files.push({ name: `${base}-settings.txt`, data: `${settings.join('\n')}\n` });
  onProgress?.(0.95, 'Zipping');
  const zip = await zipFiles(files);
  onProgress?.(1, 'Done');
  return { files, zip, zipName: `${base}.zip` };
}
