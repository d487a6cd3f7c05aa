import sharp from 'sharp';
import { beforeAll, describe, expect, it } from 'vitest';
import { exportSheet } from '../../server/engine/export/export';
import type { ExportSheet } from '../../server/engine/export/types';
import { DEFAULT_EXPORT_OPTIONS } from '../../server/engine/export/types';
import { pngPhys, pngSize } from '../helpers/png';
import { IN, place, referenceExport } from '../helpers/export-fixture';
import { loadPdf, renderPage } from '../helpers/pdf';

let sheet: ExportSheet;
let result: Awaited<ReturnType<typeof referenceExport>>['result'];
const file = (suffix: string) => result.files.find((f) => f.name.endsWith(suffix))!.data;

beforeAll(async () => {
  ({ sheet, result } = await referenceExport());
}, 60_000);

describe('export: the print image', () => {
  it('is 2025 × 2775 px for 6.75 × 9.25 in at 300 DPI, with pHYs 11811 px/m (PNG spec §11.3.5.3)', () => {
    const png = file('-print.png') as Buffer;
    expect(pngSize(png)).toEqual({ width: 2025, height: 2775 });
    expect(pngPhys(png)).toEqual({ x: 11811, y: 11811, unit: 1 });
  });

  it('is opaque just inside every cut line and transparent just outside, on rotated pieces', async () => {
    const { data, info } = await sharp(file('-print.png') as Buffer)
      .ensureAlpha()
      .raw()
      .toBuffer({ resolveWithObject: true });
    const alpha = (xMm: number, yMm: number) =>
      data[(Math.round((yMm / IN) * 300 - 0.5) * info.width + Math.round((xMm / IN) * 300 - 0.5)) * 4 + 3];
    let checked = 0;
    for (const p of sheet.pieces) {
      const ring = place(p);
      for (let i = 0; i < ring.length; i++) {
        const a = ring[i],
          b = ring[(i + 1) % ring.length];
        const len = Math.hypot(b.x - a.x, b.y - a.y);
        if (len < 0.5) continue;
        // Clockwise on screen (y down): the outward normal of edge a→b is (dy, −dx) / len.
        const nx = (b.y - a.y) / len,
          ny = -(b.x - a.x) / len,
          mx = (a.x + b.x) / 2,
          my = (a.y + b.y) / 2;
        expect(alpha(mx - nx * 0.35, my - ny * 0.35)).toBeGreaterThan(200);
        expect(alpha(mx + nx * 0.35, my + ny * 0.35)).toBeLessThan(40);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(50);
  });
});

describe('export: the PDF, read back with pdf.js (pdfjs-dist, Mozilla)', () => {
  it('has a Letter MediaBox of 612 × 792 pt (ISO 32000-1 §8.3.2.3) and the art at the print area within 0.01 in', async () => {
    const pdfjs = await import('pdfjs-dist/legacy/build/pdf.mjs');
    const doc = await pdfjs.getDocument({
      data: new Uint8Array(file('.pdf') as Buffer),
      useSystemFonts: false,
      isEvalSupported: false,
      verbosity: 0,
    }).promise;
    expect(doc.numPages).toBe(1); // the print page alone: "print all pages" prints one sheet
    const page = await doc.getPage(1);
    expect(page.view).toEqual([0, 0, 612, 792]);
    const ops = await page.getOperatorList();
    // Compose the current transformation matrix as pdf.js reports it (save/restore/transform).
    const multiply = (m: number[], n: number[]) => [
      m[0] * n[0] + m[1] * n[2],
      m[0] * n[1] + m[1] * n[3],
      m[2] * n[0] + m[3] * n[2],
      m[2] * n[1] + m[3] * n[3],
      m[4] * n[0] + m[5] * n[2] + n[4],
      m[4] * n[1] + m[5] * n[3] + n[5],
    ];
    let ctm = [1, 0, 0, 1, 0, 0];
    const stack: number[][] = [];
    for (let i = 0; i < ops.fnArray.length; i++) {
      const fn = ops.fnArray[i];
      if (fn === pdfjs.OPS.save) stack.push(ctm);
      if (fn === pdfjs.OPS.restore) ctm = stack.pop() ?? [1, 0, 0, 1, 0, 0];
      if (fn === pdfjs.OPS.transform) ctm = multiply(ops.argsArray[i] as number[], ctm);
      if (fn === pdfjs.OPS.paintImageXObject) break;
    }
    const [w, , , h, x, y] = ctm;
    const pt = 72; // per inch
    expect(Math.abs(w / pt - 6.75)).toBeLessThan(0.01);
    expect(Math.abs(h / pt - 9.25)).toBeLessThan(0.01);
    expect(Math.abs(x / pt - 0.875)).toBeLessThan(0.01); // (8.5 − 6.75) / 2
    expect(Math.abs(y / pt - 0.875)).toBeLessThan(0.01); // (11 − 9.25) / 2, from the bottom
    const raw = (file('.pdf') as Buffer).toString('latin1');
    expect(raw).toMatch(/\/Separation\s*\/CutContour\s*\/DeviceCMYK/);
    expect(raw).toMatch(/\/OCProperties/);
  });
});

describe('export: the PDF prints no cut lines (pdf.js, rendered with @napi-rs/canvas)', () => {
  const load = loadPdf;
  /** Counts magenta (the cut layer's tint) pixels on page 1 rendered for the given intent. */
  const magentaPixels = async (data: Buffer, intent: 'display' | 'print') => {
    const { pixels } = await renderPage(data, intent);
    let n = 0;
    for (let i = 0; i < pixels.length; i += 4) if (pixels[i] > 180 && pixels[i + 1] < 120 && pixels[i + 2] > 120) n++;
    return n;
  };

  it('the cut layer is an optional content group with print usage OFF and view usage ON (ISO 32000-1 §8.11.4.4)', async () => {
    const doc = await load(file('.pdf') as Buffer);
    const print = await doc.getOptionalContentConfig({ intent: 'print' });
    const groups = Object.entries(print.getGroups() ?? {}) as Array<[string, { name: string; visible: boolean }]>;
    expect(groups.map(([, g]) => g.name)).toEqual(['Cut lines (not printed)']);
    expect(groups[0][1].visible).toBe(false);
    const view = await doc.getOptionalContentConfig({ intent: 'display' });
    expect((view.getGroup(groups[0][0]) as { visible: boolean }).visible).toBe(true);
  });

  it('rendered for print, page 1 has no cut-line pixels; on screen it has them (the check can fail)', async () => {
    const pdf = file('.pdf') as Buffer;
    expect(await magentaPixels(pdf, 'display')).toBeGreaterThan(200);
    expect(await magentaPixels(pdf, 'print')).toBe(0);
  }, 30_000);

  it('shows the print image as pdf.js reads it: the art where the PNG has it, paper where the PNG is transparent (ISO 32000-1 §11.6.5.3 soft mask)', async () => {
    // The image stream is PNG IDAT data read with /Predictor 15 and its alpha a soft mask: a broken
    // predictor garbles the colours, a missing mask paints the transparent parts black.
    const png = await sharp(file('-print.png') as Buffer)
      .raw()
      .toBuffer({ resolveWithObject: true });
    const pngAt = (xMm: number, yMm: number) => {
      const i = (Math.round((yMm / IN) * 300) * png.info.width + Math.round((xMm / IN) * 300)) * 4;
      return [...png.data.subarray(i, i + 4)];
    };
    const { pixels, width } = await renderPage(file('.pdf') as Buffer, 'print');
    const pdfAt = (xMm: number, yMm: number) => {
      // The print area sits 0.875 in from the page's left and top edges; the render is 50 DPI.
      const i = (Math.round((0.875 + yMm / IN) * 50) * width + Math.round((0.875 + xMm / IN) * 50)) * 4;
      return [...pixels.subarray(i, i + 3)];
    };
    for (const p of sheet.pieces) {
      const [r, g, b, a] = pngAt(p.piece.x, p.piece.y);
      expect(a).toBe(255);
      const seen = pdfAt(p.piece.x, p.piece.y);
      for (const [k, v] of [r, g, b].entries()) expect(Math.abs(seen[k] - v), `${p.piece.id} channel ${k}`).toBeLessThan(12);
    }
    expect(pngAt(90, 85)[3]).toBe(0);
    expect(Math.min(...pdfAt(90, 85))).toBeGreaterThan(250);
  }, 30_000);

  it('the summary is a file of its own whose every line stays inside its page; as an opt-in page it does too', async () => {
    const summary = await load(file('-summary.pdf') as Buffer);
    const pageWithin = async (doc: Awaited<ReturnType<typeof load>>, n: number) => {
      const page = await doc.getPage(n);
      const [, , width, height] = page.view;
      const text = await page.getTextContent();
      const items = text.items as Array<{ str: string; transform: number[]; width: number }>;
      for (const item of items) {
        const [x, y] = [item.transform[4], item.transform[5]];
        expect(x, item.str).toBeGreaterThanOrEqual(0);
        expect(x + item.width, item.str).toBeLessThanOrEqual(width);
        expect(y, item.str).toBeGreaterThanOrEqual(0);
        expect(y, item.str).toBeLessThanOrEqual(height);
      }
      return items.map((i) => i.str).join(' ');
    };
    let all = '';
    for (let n = 1; n <= summary.numPages; n++) all += await pageWithin(summary, n);
    expect(all).toContain('Print at 100 % (actual size): no scaling, no fit-to-page, no borderless expansion.');
    // A long piece name and many pieces: wrapped and paginated, never cut off.
    const long = {
      ...sheet,
      pieces: Array.from({ length: 60 }, (_, i) => ({
        ...sheet.pieces[i % 5],
        name: `A watercolour piece with a very long descriptive file name number ${i} that runs on and on past any page edge`,
      })),
    };
    const withPage = await exportSheet(long, { ...DEFAULT_EXPORT_OPTIONS, formats: ['pdf'], summaryPage: true, dpi: 150 });
    const doc = await load(withPage.files.find((f) => f.name.endsWith('sheet.pdf'))!.data as Buffer);
    expect(doc.numPages).toBeGreaterThan(2);
    for (let n = 2; n <= doc.numPages; n++) await pageWithin(doc, n);
  }, 60_000);
});
