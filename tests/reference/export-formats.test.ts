import { DEFAULT_ART_BACKGROUND, pieceOutlineOptions } from '../../shared/sheet/outline-request';
import { createRequire } from 'node:module';
import path from 'node:path';
import DxfParser from 'dxf-parser';
import JSZip from 'jszip';
import sharp from 'sharp';
import { svgPathBbox } from 'svg-path-bbox';
import { XMLParser } from 'fast-xml-parser';
import { beforeAll, describe, expect, it } from 'vitest';
import type { Piece } from '../../shared/sheet/document';
import { inchToMm } from '../../shared/units';
import { exportSheet } from '../../server/engine/export/export';
import { exportPiece } from '../../server/engine/export/prepare';
import type { ExportSheet } from '../../server/engine/export/types';
import { DEFAULT_EXPORT_OPTIONS } from '../../server/engine/export/types';
import { outline } from '../../server/engine/outline/outline';
import { svgArt } from '../helpers/art';
import { pngPhys, pngSize } from '../helpers/png';

const W = inchToMm(6.75),
  H = inchToMm(9.25);
const IN = 25.4;
let sheet: ExportSheet;
let result: Awaited<ReturnType<typeof exportSheet>>;
const file = (suffix: string) => result.files.find((f) => f.name.endsWith(suffix))!.data;

/** Independent placement: turn the frame-relative cut line about the frame centre, then move it. */
const place = (p: ExportSheet['pieces'][number]) => {
  const a = (p.piece.rotation * Math.PI) / 180;
  return p.cutLine.points.map((q) => {
    const dx = q.x - p.cutLine.widthMm / 2,
      dy = q.y - p.cutLine.heightMm / 2;
    return { x: p.piece.x + dx * Math.cos(a) - dy * Math.sin(a), y: p.piece.y + dx * Math.sin(a) + dy * Math.cos(a) };
  });
};
const bounds = (pts: Array<{ x: number; y: number }>) => [
  Math.min(...pts.map((p) => p.x)),
  Math.min(...pts.map((p) => p.y)),
  Math.max(...pts.map((p) => p.x)),
  Math.max(...pts.map((p) => p.y)),
];

beforeAll(async () => {
  const art = await svgArt(
    900,
    600,
    '<ellipse cx="450" cy="300" rx="420" ry="270" fill="#c0392b"/><circle cx="450" cy="300" r="80" fill="#f4d03f"/>',
  );
  const placements: Array<[number, number, number]> = [
    [45, 40, 0],
    [125, 45, 30],
    [50, 120, 90],
    [125, 130, 135],
    [60, 200, 200],
  ];
  const pieces = [];
  for (const [i, [x, y, rotation]] of placements.entries()) {
    const piece: Piece = {
      id: `p${i}`,
      artId: '1',
      x,
      y,
      rotation,
      width: 45,
      border: 3,
      borderColour: '#ffffff',
      locked: false,
      cut: i === 4 ? 'die' : 'kiss',
    };
    pieces.push(
      await exportPiece(
        piece,
        'ellipse.png',
        pieceOutlineOptions(DEFAULT_ART_BACKGROUND, piece, { minFeatureMm: 1, bridgeWidthMm: 3, dpi: 300 }),
        0,
        (o) => outline(art, o),
      ),
    );
  }
  sheet = {
    name: 'Reference sheet',
    unit: 'in',
    doc: { schemaVersion: 1, printArea: { width: W, height: H }, safeMargin: 3, minGap: 3, pieces: pieces.map((p) => p.piece) },
    pieces,
    paper: { paperWidthMm: 215.9, paperHeightMm: 279.4, areaXMm: (215.9 - W) / 2, areaYMm: (279.4 - H) / 2 },
  };
  result = await exportSheet(sheet, { ...DEFAULT_EXPORT_OPTIONS, dxfUnit: 'in' });
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

/** pdf.js (pdfjs-dist, test-only) with the standard 14 fonts' data it needs to draw the check bar's label. */
const loadPdf = async (data: Buffer) => {
  const pdfjs = await import('pdfjs-dist/legacy/build/pdf.mjs');
  const standardFontDataUrl = `${path.dirname(createRequire(import.meta.url).resolve('pdfjs-dist/package.json'))}/standard_fonts/`;
  return pdfjs.getDocument({ data: new Uint8Array(data), useSystemFonts: false, isEvalSupported: false, standardFontDataUrl }).promise;
};

/** Page 1 rendered at 50 DPI on white with @napi-rs/canvas, with the optional content of `intent`. */
async function renderPage(data: Buffer, intent: 'display' | 'print') {
  const { createCanvas } = await import('@napi-rs/canvas');
  const doc = await loadPdf(data);
  const page = await doc.getPage(1);
  const viewport = page.getViewport({ scale: 50 / 72 });
  const canvas = createCanvas(Math.ceil(viewport.width), Math.ceil(viewport.height));
  const ctx = canvas.getContext('2d');
  ctx.fillStyle = '#fff';
  ctx.fillRect(0, 0, canvas.width, canvas.height);
  await page.render({
    canvasContext: ctx as never,
    viewport,
    intent,
    optionalContentConfigPromise: doc.getOptionalContentConfig({ intent }),
  }).promise;
  return { pixels: ctx.getImageData(0, 0, canvas.width, canvas.height).data, width: canvas.width };
}

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

describe('export: registration marks (a layout of our own; off by default)', () => {
  const marks = { shape: 'square' as const, sizeMm: 5, offsetMm: 5 };
  /** Page 1 rendered for print: whether a paper point (mm) is near black. */
  const printedDark = async (data: Buffer) => {
    const { pixels, width } = await renderPage(data, 'print');
    return (xMm: number, yMm: number) => {
      const i = (Math.round((yMm / IN) * 50) * width + Math.round((xMm / IN) * 50)) * 4;
      return pixels[i] < 60 && pixels[i + 1] < 60 && pixels[i + 2] < 60;
    };
  };

  it('print black outside three corners of the print area on the PDF page, and never on it by default', async () => {
    const { areaXMm: ax, areaYMm: ay } = sheet.paper;
    const plain = await printedDark(file('.pdf') as Buffer);
    expect(plain(ax - 7.5, ay - 7.5)).toBe(false); // the check can fail: nothing there by default
    const withMarks = await exportSheet(sheet, { ...DEFAULT_EXPORT_OPTIONS, dpi: 150, formats: ['pdf', 'svg', 'dxf'], marks });
    const dark = await printedDark(withMarks.files.find((f) => f.name.endsWith('.pdf'))!.data as Buffer);
    // Each mark's centre: 5 mm off the corner plus half of 5 mm, outside both edges.
    expect(dark(ax - 7.5, ay - 7.5)).toBe(true);
    expect(dark(ax + W + 7.5, ay - 7.5)).toBe(true);
    expect(dark(ax - 7.5, ay + H + 7.5)).toBe(true);
    expect(dark(ax + W + 7.5, ay + H + 7.5)).toBe(false); // the fourth corner stays empty
    expect(dark(ax - 2.5, ay - 2.5)).toBe(false); // the offset is paper, not mark
    // Not asked into the cut files: the cut SVG and DXF are as before.
    const cut = withMarks.files.find((f) => f.name.endsWith('-cut.svg'))!.data as string;
    expect(cut).toBe(file('-cut.svg'));
    expect(
      new DxfParser()
        .parseSync(withMarks.files.find((f) => f.name.endsWith('-cut.dxf'))!.data as string)!
        .entities.some((e) => e.layer === 'REGISTRATION'),
    ).toBe(false);
    const settings = withMarks.files.find((f) => f.name.endsWith('-settings.txt'))!.data as string;
    expect(settings).toMatch(
      /Registration marks: filled squares 0\.197 in, 0\.197 in outside the top-left, top-right and bottom-left corners .*not in the cut files/,
    );
  }, 60_000);

  it('go into the cut SVG and DXF only when asked, without moving a cut line', async () => {
    const asked = await exportSheet(sheet, {
      ...DEFAULT_EXPORT_OPTIONS,
      dpi: 150,
      formats: ['svg', 'dxf'],
      dxfUnit: 'in',
      marks,
      marksInCutFile: true,
    });
    const svg = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '' }).parse(
      asked.files.find((f) => f.name.endsWith('-cut.svg'))!.data as string,
    ).svg;
    // The view widens by offset + size (10 mm) on every side; user space keeps its origin at the print area.
    const [vx, vy, vw, vh] = (svg.viewBox as string).split(' ').map(Number);
    expect(vx).toBeCloseTo(-10 / IN, 4);
    expect(vy).toBeCloseTo(-10 / IN, 4);
    expect(vw).toBeCloseTo((W + 20) / IN, 4);
    expect(vh).toBeCloseTo((H + 20) / IN, 4);
    expect(parseFloat(svg.width)).toBeCloseTo(vw, 3);
    const groups = (Array.isArray(svg.g) ? svg.g : [svg.g]) as Array<{
      id: string;
      path: Array<{ id: string; d: string }> | { id: string; d: string };
    }>;
    const markPaths = groups.find((g) => g.id === 'registration-marks')!.path as Array<{ id: string; d: string }>;
    expect(markPaths.map((p) => p.id)).toEqual(['mark-top-left', 'mark-top-right', 'mark-bottom-left']);
    expect(svgPathBbox(markPaths[0].d).map((v) => v * IN)).toEqual([-10, -10, -5, -5].map((v) => expect.closeTo(v, 2)));
    const before = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '' }).parse(file('-cut.svg') as string).svg;
    expect(groups.filter((g) => g.id !== 'registration-marks')).toEqual(Array.isArray(before.g) ? before.g : [before.g]);
    const dxf = new DxfParser().parseSync(asked.files.find((f) => f.name.endsWith('-cut.dxf'))!.data as string)!;
    const registration = dxf.entities.filter((e) => e.layer === 'REGISTRATION') as unknown as Array<{
      vertices: Array<{ x: number; y: number }>;
    }>;
    expect(registration).toHaveLength(3);
    // DXF y runs up from the print area's bottom edge: the top-left mark sits above its top.
    const xs = registration[0].vertices.map((v) => v.x),
      ys = registration[0].vertices.map((v) => v.y);
    expect(Math.min(...xs)).toBeCloseTo(-10 / IN, 4);
    expect(Math.max(...ys)).toBeCloseTo((H + 10) / IN, 4);
  }, 60_000);
});

describe('export: the cut SVG, read with fast-xml-parser and svg-path-bbox', () => {
  it('has width/height in inches matching its viewBox and each path where its piece is, within 0.01 in', () => {
    const svg = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '' }).parse(file('-cut.svg') as string).svg;
    // CSS/SVG absolute units: 1in = 96px = 25.4mm.
    expect(svg.width).toBe('6.75in');
    expect(svg.height).toBe('9.25in');
    expect(svg.viewBox).toBe('0 0 6.75 9.25');
    const groups = Array.isArray(svg.g) ? svg.g : [svg.g];
    const paths = groups.flatMap((g: { path: unknown }) => (Array.isArray(g.path) ? g.path : [g.path])) as Array<{ id: string; d: string }>;
    expect(paths).toHaveLength(5);
    expect(groups.map((g: { id: string }) => g.id)).toEqual(['kiss-cut', 'die-cut']);
    for (const p of sheet.pieces) {
      const path = paths.find((q) => q.id === `cut-${p.piece.id}`)!;
      const got = svgPathBbox(path.d);
      const want = bounds(place(p)).map((v) => v / IN);
      got.forEach((v, i) => expect(Math.abs(v - want[i])).toBeLessThan(0.01));
    }
  });
});

describe('export: the DXF, read back with dxf-parser', () => {
  it('gives the same vertices within 0.001 in (y up from the bottom edge)', () => {
    const dxf = new DxfParser().parseSync(file('-cut.dxf') as string)!;
    const polylines = dxf.entities.filter((e) => e.type === 'POLYLINE') as unknown as Array<{
      vertices: Array<{ x: number; y: number }>;
      shape?: boolean;
      layer: string;
    }>;
    expect(polylines).toHaveLength(5);
    for (const [i, p] of sheet.pieces.entries()) {
      const expected = place(p).map((q) => ({ x: q.x / IN, y: (H - q.y) / IN }));
      const got = polylines[i].vertices;
      expect(got).toHaveLength(expected.length);
      got.forEach((v, j) => {
        expect(Math.abs(v.x - expected[j].x)).toBeLessThan(0.001);
        expect(Math.abs(v.y - expected[j].y)).toBeLessThan(0.001);
      });
      expect(polylines[i].layer).toBe(i === 4 ? 'CUT-DIE' : 'CUT');
    }
  });
});

describe('export: the bundle, read with JSZip', () => {
  it('lists every promised file', async () => {
    const zip = await JSZip.loadAsync(result.zip);
    expect(Object.keys(zip.files).sort()).toEqual(
      [
        'reference-sheet-cut.dxf',
        'reference-sheet-cut.svg',
        'reference-sheet-print-and-cut.svg',
        'reference-sheet-print.png',
        'reference-sheet-settings.txt',
        'reference-sheet.pdf',
        'reference-sheet-summary.pdf',
      ].sort(),
    );
    const settings = await zip.file('reference-sheet-settings.txt')!.async('string');
    expect(settings).toMatch(/Print area: 6\.75 in x 9\.25 in/);
    // The commonest cause of cut lines missing the print (common practice).
    expect(settings).toContain('Print at 100 % (actual size): no scaling, no fit-to-page, no borderless expansion.');
    expect(settings).toContain('Check with a ruler: the print area is 6.75 in x 9.25 in');
  });
});
