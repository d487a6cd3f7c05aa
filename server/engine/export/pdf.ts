import {
  PDFDocument,
  PDFName,
  PDFNumber,
  PDFOperator,
  PDFString,
  StandardFonts,
  concatTransformationMatrix,
  drawObject,
  popGraphicsState,
  pushGraphicsState,
  rgb,
} from 'pdf-lib';
import type { PDFDict, PDFPage, PDFRef } from 'pdf-lib';
import type { Ring } from '@shared/geometry/polygon';
import type { RegMarks } from './marks';
import type { PdfImage, PdfImageStream } from './pdf-image';
import { registrationMarks } from './marks';
import type { ExportSheet } from './types';

const PT_PER_MM = 72 / 25.4; // PDF user space: 1/72 in (ISO 32000-1 §8.3.2.3)

function resourceDict(page: PDFPage, key: string): PDFDict {
  const resources = page.node.Resources()!;
  const existing = resources.lookupMaybe(PDFName.of(key), Object.getPrototypeOf(resources).constructor) as PDFDict | undefined;
  if (existing) return existing;
  const dict = page.doc.context.obj({}) as PDFDict;
  resources.set(PDFName.of(key), dict);
  return dict;
}

type PdfExtras = {
  /** A 1 in scale bar in the margin below the print area, to check the printout with a ruler. */
  checkBar: boolean;
  /** The summary as extra pages (off by default: "print all pages" would waste a sheet). */
  summary: string[] | null;
  /** Registration marks, printed in black outside the print area's corners. */
  marks?: RegMarks | null;
  /** Also outline the marks on the cut layer. */
  marksInCutFile?: boolean;
};

/**
 * A PDF for printing: one page at the paper's size, the print image at exact physical size where the
 * profile puts the print area, and the cut lines on their own layer (an optional content group)
 * stroked in a Separation spot colour named by the profile, so the cutter's software can find them.
 * The layer shows on screen and never prints: its usage dictionary says PrintState OFF and the
 * default configuration applies usage on print (ISO 32000-1 §8.11.4.4, §8.11.4.3 /AS).
 */
export async function sheetPdf(
  sheet: ExportSheet,
  lines: Array<{ id: string; name: string; ring: Ring; kind: 'kiss' | 'die' }>,
  printImage: PdfImage,
  spotColour: string,
  extras: PdfExtras,
): Promise<Buffer> {
  const pdf = await PDFDocument.create();
  pdf.setTitle(sheet.name);
  pdf.setCreator('Sheetsmith');
  const { paperWidthMm, paperHeightMm, areaXMm, areaYMm } = sheet.paper;
  const pt = (mm: number) => Math.round(mm * PT_PER_MM * 1000) / 1000;
  const page = pdf.addPage([pt(paperWidthMm), pt(paperHeightMm)]);
  const area = sheet.doc.printArea;
  // The print image at its physical size; PDF y runs up from the bottom of the page and the print
  // area is placed from the top. An image is drawn into the unit square, scaled by the matrix.
  const image = pdf.context.register(imageStream(pdf, printImage.colour, printImage.alpha));
  const imageName = page.node.newXObject('Print', image);
  page.pushOperators(
    pushGraphicsState(),
    concatTransformationMatrix(
      area.width * PT_PER_MM,
      0,
      0,
      area.height * PT_PER_MM,
      areaXMm * PT_PER_MM,
      (paperHeightMm - areaYMm - area.height) * PT_PER_MM,
    ),
    drawObject(imageName),
    popGraphicsState(),
  );

  const context = pdf.context;
  const tint = context.obj({ FunctionType: 2, Domain: [0, 1], C0: [0, 0, 0, 0], C1: [0, 1, 0, 0], N: 1 });
  const separation = context.obj([
    PDFName.of('Separation'),
    PDFName.of(spotColour.replace(/[^A-Za-z0-9_-]/g, '')),
    PDFName.of('DeviceCMYK'),
    tint,
  ]);
  const layer: PDFRef = context.register(
    context.obj({
      Type: 'OCG',
      Name: PDFString.of('Cut lines (not printed)'),
      Intent: [PDFName.of('View'), PDFName.of('Design')],
      Usage: { Print: { PrintState: PDFName.of('OFF') }, View: { ViewState: PDFName.of('ON') } },
    }),
  );
  pdf.catalog.set(
    PDFName.of('OCProperties'),
    context.obj({
      OCGs: [layer],
      D: {
        Order: [layer],
        ON: [layer],
        AS: [
          { Event: PDFName.of('Print'), OCGs: [layer], Category: [PDFName.of('Print')] },
          { Event: PDFName.of('View'), OCGs: [layer], Category: [PDFName.of('View')] },
        ],
      },
    }),
  );
  resourceDict(page, 'ColorSpace').set(PDFName.of('CSCut'), separation);
  resourceDict(page, 'Properties').set(PDFName.of('OCCut'), layer);

  const x = (mm: number) => PDFNumber.of(Number(((areaXMm + mm) * PT_PER_MM).toFixed(4)));
  const y = (mm: number) => PDFNumber.of(Number(((paperHeightMm - areaYMm - mm) * PT_PER_MM).toFixed(4)));
  const ops: PDFOperator[] = [
    PDFOperator.of('BDC' as never, [PDFName.of('OC'), PDFName.of('OCCut')]),
    PDFOperator.of('q' as never),
    PDFOperator.of('CS' as never, [PDFName.of('CSCut')]),
    PDFOperator.of('SCN' as never, [PDFNumber.of(1)]),
    PDFOperator.of('w' as never, [PDFNumber.of(0.25)]),
  ];
  const marks = extras.marks ? registrationMarks(area, extras.marks) : [];
  const cutRings = [...lines.map((l) => l.ring), ...(extras.marksInCutFile ? marks.map((m) => m.ring) : [])];
  for (const ring of cutRings) {
    ring.forEach((p, i) => ops.push(PDFOperator.of((i === 0 ? 'm' : 'l') as never, [x(p.x), y(p.y)])));
    ops.push(PDFOperator.of('h' as never), PDFOperator.of('S' as never));
  }
  ops.push(PDFOperator.of('Q' as never), PDFOperator.of('EMC' as never));
  if (marks.length) {
    // Printed marks: solid black (DeviceGray 0), outside any optional content, so they always print.
    ops.push(PDFOperator.of('q' as never), PDFOperator.of('g' as never, [PDFNumber.of(0)]));
    for (const mark of marks) {
      mark.ring.forEach((p, i) => ops.push(PDFOperator.of((i === 0 ? 'm' : 'l') as never, [x(p.x), y(p.y)])));
      ops.push(PDFOperator.of('h' as never), PDFOperator.of('f' as never));
    }
    ops.push(PDFOperator.of('Q' as never));
  }
  page.pushOperators(...ops);

  const bottomMargin = (paperHeightMm - areaYMm - area.height) * PT_PER_MM;
  // Only where the margin has room for it (22 pt, about 8 mm): never over the print area.
  if (extras.checkBar && bottomMargin >= 22) {
    // 1 in long with quarter-inch ticks, centred under the print area in the bottom margin.
    const font = await pdf.embedFont(StandardFonts.Helvetica);
    const y0 = Math.max(6, bottomMargin / 2 - 4);
    const x0 = (areaXMm + area.width / 2) * PT_PER_MM - 36;
    const ink = rgb(0.2, 0.2, 0.2);
    page.drawRectangle({ x: x0, y: y0, width: 72, height: 6, color: ink });
    for (let i = 0; i <= 4; i++)
      page.drawLine({
        start: { x: x0 + i * 18, y: y0 + 6 },
        end: { x: x0 + i * 18, y: y0 + (i % 4 === 0 ? 12 : 9) },
        thickness: 0.5,
        color: ink,
      });
    const label = 'This bar is 1 in (25.4 mm) at 100 %: if not, the print was scaled.';
    const size = 6.5;
    page.drawText(label, { x: x0 + 36 - font.widthOfTextAtSize(label, size) / 2, y: y0 - 9, size, font, color: ink });
  }
  if (extras.summary) await addTextPages(pdf, extras.summary, [pt(paperWidthMm), pt(paperHeightMm)]);
  // Plain (not compressed) object streams: older RIP and cutter software reads them more reliably.
  return Buffer.from(await pdf.save({ useObjectStreams: false }));
}

/** An image XObject over zlib data of PNG-filtered rows, with its soft mask when it has one. */
function imageStream(pdf: PDFDocument, colour: PdfImageStream, alpha: PdfImageStream | null) {
  const dict = (s: PdfImageStream) => ({
    Type: 'XObject',
    Subtype: 'Image',
    Width: s.width,
    Height: s.height,
    ColorSpace: s.colours === 3 ? 'DeviceRGB' : 'DeviceGray',
    BitsPerComponent: 8,
    Filter: 'FlateDecode',
    DecodeParms: { Predictor: 15, Colors: s.colours, BitsPerComponent: 8, Columns: s.width },
  });
  const mask = alpha ? pdf.context.register(pdf.context.stream(alpha.data, dict(alpha))) : null;
  return pdf.context.stream(colour.data, mask ? { ...dict(colour), SMask: mask } : dict(colour));
}

/** Lines of text on as many pages as they need, every line wrapped to fit its page. */
async function addTextPages(pdf: PDFDocument, lines: string[], size: [number, number]) {
  const font = await pdf.embedFont(StandardFonts.Helvetica);
  const margin = 50;
  const width = size[0] - 2 * margin;
  let page = pdf.addPage(size);
  let cursor = size[1] - margin - 10;
  for (const [i, text] of lines.entries()) {
    const fontSize = i === 0 ? 16 : 10;
    const lead = i === 0 ? 26 : 14;
    // Standard fonts cover WinAnsi only; anything else is replaced so the page always renders.
    const safe = text.replace(/[^\x20-\x7e\xa0-\xff]/g, '?');
    const indent = /^\s*/.exec(safe)![0].length * 3;
    for (const part of wrap(safe.trimStart(), (t) => font.widthOfTextAtSize(t, fontSize), width - indent)) {
      if (cursor < margin) {
        page = pdf.addPage(size);
        cursor = size[1] - margin - 10;
      }
      page.drawText(part, { x: margin + indent, y: cursor, size: fontSize, font, color: rgb(0.12, 0.23, 0.24) });
      cursor -= lead;
    }
  }
}

/** Greedy word wrap; a word longer than the line is cut. */
function wrap(text: string, measure: (t: string) => number, width: number): string[] {
  if (text === '') return [''];
  const out: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/)) {
    const next = line ? `${line} ${word}` : word;
    if (measure(next) <= width) {
      line = next;
      continue;
    }
    if (line) out.push(line);
    line = word;
    while (measure(line) > width && line.length > 1) {
      let cut = line.length - 1;
      while (cut > 1 && measure(line.slice(0, cut)) > width) cut--;
      out.push(line.slice(0, cut));
      line = line.slice(cut);
    }
  }
  if (line) out.push(line);
  return out;
}

/** The summary of an export as a PDF of its own, wrapped and paginated. */
export async function summaryPdf(title: string, lines: string[], size: { widthMm: number; heightMm: number }): Promise<Buffer> {
  const pdf = await PDFDocument.create();
  pdf.setTitle(title);
  pdf.setCreator('Sheetsmith');
  await addTextPages(pdf, lines, [size.widthMm * PT_PER_MM, size.heightMm * PT_PER_MM]);
  return Buffer.from(await pdf.save({ useObjectStreams: false }));
}
