import type { Ring } from '@shared/geometry/polygon';
import { placeCutLine } from '@shared/sheet/placement';
import type { ExportSheet } from './types';

/**
 * The one source of every exported cut line: each piece's cut line placed on the sheet (mm, origin
 * at the print area's top-left, y down), plus the optional whole-sheet cut. SVG, DXF and PDF all
 * draw exactly these points.
 */
export function sheetCutLines(
  sheet: ExportSheet,
  sheetCut: { marginMm: number; radiusMm: number } | null,
): Array<{ id: string; name: string; ring: Ring; kind: 'kiss' | 'die' }> {
  const lines = sheet.pieces.map((p) => ({
    id: p.piece.id,
    name: p.name,
    ring: placeCutLine(p.piece, p.cutLine),
    kind: p.piece.cut ?? ('kiss' as const),
  }));
  if (sheetCut)
    lines.push({
      id: 'sheet',
      name: 'Sheet edge',
      ring: roundedRect(sheet.doc.printArea.width, sheet.doc.printArea.height, sheetCut.marginMm, sheetCut.radiusMm),
      kind: 'die',
    });
  return lines;
}

/** A rounded rectangle inset by `inset`, corners as 16-segment arcs (clockwise on screen). */
function roundedRect(width: number, height: number, inset: number, radius: number): Ring {
  const r = Math.max(0, Math.min(radius, (width - 2 * inset) / 2, (height - 2 * inset) / 2));
  const x0 = inset,
    y0 = inset,
    x1 = width - inset,
    y1 = height - inset;
  const corners = [
    { cx: x1 - r, cy: y0 + r, a: -90 },
    { cx: x1 - r, cy: y1 - r, a: 0 },
    { cx: x0 + r, cy: y1 - r, a: 90 },
    { cx: x0 + r, cy: y0 + r, a: 180 },
  ];
  const ring: Ring = [];
  for (const c of corners) {
    for (let i = 0; i <= 16; i++) {
      const t = ((c.a + (90 * i) / 16) * Math.PI) / 180;
      ring.push({ x: c.cx + r * Math.cos(t), y: c.cy + r * Math.sin(t) });
    }
  }
  return ring;
}
