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

const W = inchToMm(6.75), H = inchToMm(9.25);
const IN = 25.4;
let sheet: ExportSheet;
let result: Awaited<ReturnType<typeof exportSheet>>;
const file = (suffix: string) => result.files.find((f) => f.name.endsWith(suffix))!.data;

/** Independent placement: turn the frame-relative cut line about the frame centre, then move it. */
const place = (p: ExportSheet['pieces'][number]) => {
  const a = (p.piece.rotation * Math.PI) / 180;
  return p.cutLine.points.map((q) => {
    const dx = q.x - p.cutLine.widthMm / 2, dy = q.y - p.cutLine.heightMm / 2;
    return { x: p.piece.x + dx * Math.cos(a) - dy * Math.sin(a), y: p.piece.y + dx * Math.sin(a) + dy * Math.cos(a) };
  });
};
const bounds = (pts: Array<{ x: number; y: number }>) => [Math.min(...pts.map((p) => p.x)), Math.min(...pts.map((p) => p.y)), Math.max(...pts.map((p) => p.x)), Math.max(...pts.map((p) => p.y))];

beforeAll(async () => {
  const art = await svgArt(900, 600, '<ellipse cx="450" cy="300" rx="420" ry="270" fill="#c0392b"/><circle cx="450" cy="300" r="80" fill="#f4d03f"/>');
  const placements: Array<[number, number, number]> = [[45, 40, 0], [125, 45, 30], [50, 120, 90], [125, 130, 135], [60, 200, 200]];
  const pieces = [];
  for (const [i, [x, y, rotation]] of placements.entries()) {
    const piece: Piece = { id: `p${i}`, artId: '1', x, y, rotation, width: 45, border: 3, borderColour: '#ffffff', locked: false, cut: i === 4 ? 'die' : 'kiss' };
    pieces.push(await exportPiece(piece, 'ellipse.png', 300, 0, (o) => outline(art, o)));
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
    const { data, info } = await sharp(file('-print.png') as Buffer).ensureAlpha().raw().toBuffer({ resolveWithObject: true });
    const alpha = (xMm: number, yMm: number) => data[(Math.round((yMm / IN) * 300 - 0.5) * info.width + Math.round((xMm / IN) * 300 - 0.5)) * 4 + 3];
    let checked = 0;
    for (const p of sheet.pieces) {
      const ring = place(p);
      for (let i = 0; i < ring.length; i++) {
        const a = ring[i], b = ring[(i + 1) % ring.length];
        const len = Math.hypot(b.x - a.x, b.y - a.y);
        if (len < 0.5) continue;
        // Clockwise on screen (y down): the outward normal of edge a→b is (dy, −dx) / len.
        const nx = (b.y - a.y) / len, ny = -(b.x - a.x) / len, mx = (a.x + b.x) / 2, my = (a.y + b.y) / 2;
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
    const doc = await pdfjs.getDocument({ data: new Uint8Array(file('.pdf') as Buffer), useSystemFonts: false, isEvalSupported: false }).promise;
    expect(doc.numPages).toBe(2); // the sheet and its summary
    const page = await doc.getPage(1);
    expect(page.view).toEqual([0, 0, 612, 792]);
    const ops = await page.getOperatorList();
    // Compose the current transformation matrix as pdf.js reports it (save/restore/transform).
    const multiply = (m: number[], n: number[]) => [m[0] * n[0] + m[1] * n[2], m[0] * n[1] + m[1] * n[3], m[2] * n[0] + m[3] * n[2], m[2] * n[1] + m[3] * n[3], m[4] * n[0] + m[5] * n[2] + n[4], m[4] * n[1] + m[5] * n[3] + n[5]];
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
    const polylines = dxf.entities.filter((e) => e.type === 'POLYLINE') as unknown as Array<{ vertices: Array<{ x: number; y: number }>; shape?: boolean; layer: string }>;
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
      ['reference-sheet-cut.dxf', 'reference-sheet-cut.svg', 'reference-sheet-print-and-cut.svg', 'reference-sheet-print.png', 'reference-sheet-settings.txt', 'reference-sheet.pdf'].sort(),
    );
    expect(await zip.file('reference-sheet-settings.txt')!.async('string')).toMatch(/Print area: 6\.75 in x 9\.25 in/);
  });
});
