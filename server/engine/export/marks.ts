import type { Ring } from '@shared/geometry/polygon';
import type { RegMarkShape } from '@shared/schemas/sheets';

export type RegMarks = { shape: Exclude<RegMarkShape, 'none'>; sizeMm: number; offsetMm: number };

/** One printed mark: its outline (closed, mm, print-area coordinates: may be negative) and its box. */
type RegMark = { corner: 'top-left' | 'top-right' | 'bottom-left'; ring: Ring; box: { x: number; y: number; size: number } };

/**
 * Registration marks in Sheetsmith's own neutral layout: one mark outside each of three corners of
 * the print area (top left, top right, bottom left; the bottom right stays empty, so a sheet fed
 * turned round can be told apart). Each mark fills a square of `sizeMm` whose nearest corner is
 * `offsetMm` from the print area's corner along both edges. Shapes: a filled square, a filled dot
 * (a 48-gon) or a corner bracket whose two arms (a fifth of the size thick, at least 0.5 mm) run
 * along the mark square's outer edges.
 */
export function registrationMarks(area: { width: number; height: number }, marks: RegMarks): RegMark[] {
  const s = marks.sizeMm,
    o = marks.offsetMm;
  const boxes: RegMark['box'][] = [
    { x: -o - s, y: -o - s, size: s },
    { x: area.width + o, y: -o - s, size: s },
    { x: -o - s, y: area.height + o, size: s },
  ];
  const corners: RegMark['corner'][] = ['top-left', 'top-right', 'bottom-left'];
  return boxes.map((box, i) => ({ corner: corners[i], box, ring: markRing(box, marks.shape, corners[i]) }));
}

function markRing(box: RegMark['box'], shape: RegMarks['shape'], corner: RegMark['corner']): Ring {
  const { x, y, size: s } = box;
  if (shape === 'square')
    return [
      { x, y },
      { x: x + s, y },
      { x: x + s, y: y + s },
      { x, y: y + s },
    ];
  if (shape === 'dot') {
    const r = s / 2;
    return Array.from({ length: 48 }, (_, i) => ({
      x: x + r + r * Math.cos((i * Math.PI) / 24),
      y: y + r + r * Math.sin((i * Math.PI) / 24),
    }));
  }
  // A bracket: an L in the mark square's corner away from the print area, arms along its outer edges.
  const t = Math.max(0.5, s / 5);
  const left = corner !== 'top-right',
    top = corner !== 'bottom-left';
  const x0 = left ? x : x + s,
    y0 = top ? y : y + s; // the L's outer corner
  const dx = left ? 1 : -1,
    dy = top ? 1 : -1;
  const ring: Ring = [
    { x: x0, y: y0 },
    { x: x0 + dx * s, y: y0 },
    { x: x0 + dx * s, y: y0 + dy * t },
    { x: x0 + dx * t, y: y0 + dy * t },
    { x: x0 + dx * t, y: y0 + dy * s },
    { x: x0, y: y0 + dy * s },
  ];
  // Clockwise on screen like every other ring (positive shoelace area with y down).
  const area2 = ring.reduce((sum, p, i) => sum + p.x * ring[(i + 1) % ring.length].y - ring[(i + 1) % ring.length].x * p.y, 0);
  return area2 < 0 ? ring.reverse() : ring;
}

/** Where the marks reach beyond the print area (mm): the frame a cut file with marks needs. */
export function marksExtent(area: { width: number; height: number }, marks: RegMarks | null) {
  const reach = marks ? marks.offsetMm + marks.sizeMm : 0;
  return { x: -reach, y: -reach, width: area.width + (marks ? reach * 2 : 0), height: area.height + (marks ? reach * 2 : 0) };
}
