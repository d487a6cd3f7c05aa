import { PDFDocument, PDFName, PDFNumber, PDFOperator, PDFString, StandardFonts, rgb } from 'pdf-lib';
import type { PDFDict, PDFPage, PDFRef } from 'pdf-lib';
import type { Ring } from '../../../shared/geometry/polygon';
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

/**
 * A PDF with the paper's page size, the print image at exact physical size where the profile puts
 * the print area, and the cut lines on their own layer (an optional content group) stroked in a
 * Separation spot colour named by the profile, so the cutter's software can find them.
 */
export async function sheetPdf(
  sheet: ExportSheet,
  lines: Array<{ id: string; name: string; ring: Ring; kind: 'kiss' | 'die' }>,
  printPng: Buffer,
  spotColour: string,
  summary: string[] | null,
): Promise<Buffer> {
  const pdf = await PDFDocument.create();
  pdf.setTitle(sheet.name);
  pdf.setCreator('Sheetsmith');
  const { paperWidthMm, paperHeightMm, areaXMm, areaYMm } = sheet.paper;
  const pt = (mm: number) => Math.round(mm * PT_PER_MM * 1000) / 1000;
  const page = pdf.addPage([pt(paperWidthMm), pt(paperHeightMm)]);
  const image = await pdf.embedPng(printPng);
  const area = sheet.doc.printArea;
  // PDF y runs up from the bottom of the page; the print area is placed from the top.
  page.drawImage(image, { x: areaXMm * PT_PER_MM, y: (paperHeightMm - areaYMm - area.height) * PT_PER_MM, width: area.width * PT_PER_MM, height: area.height * PT_PER_MM });

  const context = pdf.context;
  const tint = context.obj({ FunctionType: 2, Domain: [0, 1], C0: [0, 0, 0, 0], C1: [0, 1, 0, 0], N: 1 });
  const separation = context.obj([PDFName.of('Separation'), PDFName.of(spotColour.replace(/[^A-Za-z0-9_-]/g, '')), PDFName.of('DeviceCMYK'), tint]);
  const layer: PDFRef = context.register(context.obj({ Type: 'OCG', Name: PDFString.of('Cut lines') }));
  pdf.catalog.set(PDFName.of('OCProperties'), context.obj({ OCGs: [layer], D: { Order: [layer], ON: [layer] } }));
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
  for (const line of lines) {
    line.ring.forEach((p, i) => ops.push(PDFOperator.of((i === 0 ? 'm' : 'l') as never, [x(p.x), y(p.y)])));
    ops.push(PDFOperator.of('h' as never), PDFOperator.of('S' as never));
  }
  ops.push(PDFOperator.of('Q' as never), PDFOperator.of('EMC' as never));
  page.pushOperators(...ops);

  if (summary) {
    const info = pdf.addPage([pt(paperWidthMm), pt(paperHeightMm)]);
    const font = await pdf.embedFont(StandardFonts.Helvetica);
    let cursor = info.getHeight() - 60;
    for (const [i, text] of summary.entries()) {
      // Standard fonts cover WinAnsi only; anything else is replaced so the page always renders.
      const safe = text.replace(/[^\x20-\x7e\xa0-\xff]/g, '?');
      info.drawText(safe, { x: 50, y: cursor, size: i === 0 ? 16 : 10, font, color: rgb(0.12, 0.23, 0.24) });
      cursor -= i === 0 ? 26 : 14;
      if (cursor < 40) break;
    }
  }
  // Plain (not compressed) object streams: older RIP and cutter software reads them more reliably.
  return Buffer.from(await pdf.save({ useObjectStreams: false }));
}
