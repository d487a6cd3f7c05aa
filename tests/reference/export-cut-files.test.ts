import DxfParser from 'dxf-parser';
import JSZip from 'jszip';
import { svgPathBbox } from 'svg-path-bbox';
import { XMLParser } from 'fast-xml-parser';
import { beforeAll, describe, expect, it } from 'vitest';
import { exportSheet } from '../../server/engine/export/export';
import type { ExportSheet } from '../../server/engine/export/types';
import { DEFAULT_EXPORT_OPTIONS } from '../../server/engine/export/types';
import { bounds, H, IN, place, referenceExport, W } from '../helpers/export-fixture';
import { renderPage } from '../helpers/pdf';

let sheet: ExportSheet;
let result: Awaited<ReturnType<typeof referenceExport>>['result'];
const file = (suffix: string) => result.files.find((f) => f.name.endsWith(suffix))!.data;

beforeAll(async () => {
  ({ sheet, result } = await referenceExport());
}, 60_000);

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
