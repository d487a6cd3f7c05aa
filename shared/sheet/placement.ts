import type { Box, Point, Ring } from '../geometry/polygon';
import { boundingBox } from '../geometry/polygon';
import type { Piece } from './document';

/** A piece's outline as the engine returns it: cut line in the sticker frame (mm, origin top-left). */
export type PieceOutline = { points: Ring; widthMm: number; heightMm: number };

/** The cut line in sheet coordinates: the frame centred on (x, y), rotated clockwise by `rotation`. */
export function placeCutLine(piece: Pick<Piece, 'x' | 'y' | 'rotation'>, outline: PieceOutline): Ring {
  const a = (piece.rotation * Math.PI) / 180;
  const cos = Math.cos(a), sin = Math.sin(a);
  const cx = outline.widthMm / 2, cy = outline.heightMm / 2;
  return outline.points.map((p) => {
    const dx = p.x - cx, dy = p.y - cy;
    return { x: piece.x + dx * cos - dy * sin, y: piece.y + dx * sin + dy * cos };
  });
}

/** Half-size of the rotated frame's bounding box. */
export function rotatedHalfSize(widthMm: number, heightMm: number, rotation: number) {
  const a = (rotation * Math.PI) / 180;
  const c = Math.abs(Math.cos(a)), s = Math.abs(Math.sin(a));
  return { w: (widthMm * c + heightMm * s) / 2, h: (widthMm * s + heightMm * c) / 2 };
}

function segmentDistance(a: Point, b: Point, c: Point, d: Point): number {
  const pointSeg = (p: Point, s0: Point, s1: Point) => {
    const vx = s1.x - s0.x, vy = s1.y - s0.y;
    const len2 = vx * vx + vy * vy;
    const t = len2 === 0 ? 0 : Math.max(0, Math.min(1, ((p.x - s0.x) * vx + (p.y - s0.y) * vy) / len2));
    return Math.hypot(p.x - s0.x - t * vx, p.y - s0.y - t * vy);
  };
  const cross = (o: Point, p: Point, q: Point) => (p.x - o.x) * (q.y - o.y) - (p.y - o.y) * (q.x - o.x);
  const d1 = cross(a, b, c), d2 = cross(a, b, d), d3 = cross(c, d, a), d4 = cross(c, d, b);
  if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) return 0;
  return Math.min(pointSeg(a, c, d), pointSeg(b, c, d), pointSeg(c, a, b), pointSeg(d, a, b));
}

export function pointInRing(p: Point, ring: Ring): boolean {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const a = ring[i], b = ring[j];
    if (a.y > p.y !== b.y > p.y && p.x < ((b.x - a.x) * (p.y - a.y)) / (b.y - a.y) + a.x) inside = !inside;
  }
  return inside;
}

const boxGap = (a: Box, b: Box) =>
  Math.hypot(Math.max(0, a.x - (b.x + b.width), b.x - (a.x + a.width)), Math.max(0, a.y - (b.y + b.height), b.y - (a.y + a.height)));

/**
 * The clear distance between two cut lines (mm), 0 when they touch, cross or one holds the other.
 * Measured on the real polygons, edge against edge; `stopBelow` lets a caller skip far pairs early.
 */
export function cutLineDistance(a: Ring, b: Ring, stopBelow = Infinity): number {
  const boxA = boundingBox(a), boxB = boundingBox(b);
  const far = boxGap(boxA, boxB);
  if (far >= stopBelow) return far;
  if (pointInRing(a[0], b) || pointInRing(b[0], a)) return 0;
  let best = Infinity;
  for (let i = 0; i < a.length; i++) {
    const a0 = a[i], a1 = a[(i + 1) % a.length];
    for (let j = 0; j < b.length; j++) {
      const d = segmentDistance(a0, a1, b[j], b[(j + 1) % b.length]);
      if (d < best) {
        best = d;
        if (best === 0) return 0;
      }
    }
  }
  return best;
}
