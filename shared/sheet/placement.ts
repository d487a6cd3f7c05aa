import type { CutLimits } from './outline-request';
import { pieceSizeOptions } from './outline-request';
import type { Box, Point, Ring } from '../geometry/polygon';
import { boundingBox } from '../geometry/polygon';
import type { Piece } from './document';

/** A piece's outline as the engine returns it: cut line in the sticker frame (mm, origin top-left). */
export type PieceOutline = { points: Ring; widthMm: number; heightMm: number };

/** The cut line in sheet coordinates: the frame centred on (x, y), rotated clockwise by `rotation`. */
export function placeCutLine(piece: Pick<Piece, 'x' | 'y' | 'rotation'>, outline: PieceOutline): Ring {
  const a = (piece.rotation * Math.PI) / 180;
  const cos = Math.cos(a),
    sin = Math.sin(a);
  const cx = outline.widthMm / 2,
    cy = outline.heightMm / 2;
  return outline.points.map((p) => {
    const dx = p.x - cx,
      dy = p.y - cy;
    return { x: piece.x + dx * cos - dy * sin, y: piece.y + dx * sin + dy * cos };
  });
}

/** Half-size of the rotated frame's bounding box. */
export function rotatedHalfSize(widthMm: number, heightMm: number, rotation: number) {
  const a = (rotation * Math.PI) / 180;
  const c = Math.abs(Math.cos(a)),
    s = Math.abs(Math.sin(a));
  return { w: (widthMm * c + heightMm * s) / 2, h: (widthMm * s + heightMm * c) / 2 };
}

// Module-level helpers (not closures): this runs millions of times while arranging.
function pointSegment(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const vx = bx - ax,
    vy = by - ay;
  const len2 = vx * vx + vy * vy;
  let t = len2 === 0 ? 0 : ((px - ax) * vx + (py - ay) * vy) / len2;
  t = t < 0 ? 0 : t > 1 ? 1 : t;
  const dx = px - ax - t * vx,
    dy = py - ay - t * vy;
  return Math.sqrt(dx * dx + dy * dy);
}

function cross(ox: number, oy: number, px: number, py: number, qx: number, qy: number): number {
  return (px - ox) * (qy - oy) - (py - oy) * (qx - ox);
}

function segmentDistance(a: Point, b: Point, c: Point, d: Point): number {
  const d1 = cross(a.x, a.y, b.x, b.y, c.x, c.y),
    d2 = cross(a.x, a.y, b.x, b.y, d.x, d.y);
  const d3 = cross(c.x, c.y, d.x, d.y, a.x, a.y),
    d4 = cross(c.x, c.y, d.x, d.y, b.x, b.y);
  if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) return 0;
  return Math.min(
    pointSegment(a.x, a.y, c.x, c.y, d.x, d.y),
    pointSegment(b.x, b.y, c.x, c.y, d.x, d.y),
    pointSegment(c.x, c.y, a.x, a.y, b.x, b.y),
    pointSegment(d.x, d.y, a.x, a.y, b.x, b.y),
  );
}

export function pointInRing(p: Point, ring: Ring): boolean {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const a = ring[i],
      b = ring[j];
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
  const boxA = boundingBox(a),
    boxB = boundingBox(b);
  const far = boxGap(boxA, boxB);
  if (far >= stopBelow) return far;
  if (pointInRing(a[0], b) || pointInRing(b[0], a)) return 0;
  let best = Infinity;
  for (let i = 0; i < a.length; i++) {
    const a0 = a[i],
      a1 = a[(i + 1) % a.length];
    // Segments of `a` farther than the best so far from b's box cannot improve it.
    const sx0 = Math.min(a0.x, a1.x),
      sx1 = Math.max(a0.x, a1.x),
      sy0 = Math.min(a0.y, a1.y),
      sy1 = Math.max(a0.y, a1.y);
    const gx = Math.max(0, boxB.x - sx1, sx0 - (boxB.x + boxB.width)),
      gy = Math.max(0, boxB.y - sy1, sy0 - (boxB.y + boxB.height));
    if (gx * gx + gy * gy >= best * best || Math.max(gx, gy) >= stopBelow) continue;
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

// Scratch edge lists for closerThan (grown when a ring has more edges).
let nearA = new Int32Array(256),
  nearB = new Int32Array(256);

/**
 * Whether two cut lines come closer than `gap` (touching or crossing included): the yes/no form of
 * cutLineDistance, which stops at the first pair of edges that close, and compares only the edges of
 * each ring that lie within `gap` of the other ring's box.
 */
export function closerThan(a: Ring, b: Ring, gap: number, boxA = boundingBox(a), boxB = boundingBox(b)): boolean {
  if (boxGap(boxA, boxB) >= gap) return false;
  if (pointInRing(a[0], b) || pointInRing(b[0], a)) return true;
  // The edges near the other ring's box, into scratch lists reused across calls (this runs in the nester's inner loop).
  const near = (ring: Ring, box: Box, out: Int32Array) => {
    let n = 0;
    for (let i = 0; i < ring.length; i++) {
      const p = ring[i],
        q = ring[(i + 1) % ring.length];
      const gx = Math.max(0, box.x - Math.max(p.x, q.x), Math.min(p.x, q.x) - (box.x + box.width));
      const gy = Math.max(0, box.y - Math.max(p.y, q.y), Math.min(p.y, q.y) - (box.y + box.height));
      if (gx < gap && gy < gap) out[n++] = i;
    }
    return n;
  };
  if (nearA.length < a.length) nearA = new Int32Array(2 * a.length);
  if (nearB.length < b.length) nearB = new Int32Array(2 * b.length);
  const na = near(a, boxB, nearA),
    nb = near(b, boxA, nearB);
  for (let s = 0; s < na; s++) {
    const i = nearA[s];
    const a0 = a[i],
      a1 = a[(i + 1) % a.length];
    const ax0 = Math.min(a0.x, a1.x) - gap,
      ax1 = Math.max(a0.x, a1.x) + gap,
      ay0 = Math.min(a0.y, a1.y) - gap,
      ay1 = Math.max(a0.y, a1.y) + gap;
    for (let t = 0; t < nb; t++) {
      const j = nearB[t];
      const b0 = b[j],
        b1 = b[(j + 1) % b.length];
      if (Math.max(b0.x, b1.x) < ax0 || Math.min(b0.x, b1.x) > ax1 || Math.max(b0.y, b1.y) < ay0 || Math.min(b0.y, b1.y) > ay1) continue;
      if (segmentDistance(a0, a1, b0, b1) < gap) return true;
    }
  }
  return false;
}

/**
 * The outline request for a piece, as query text: the editor sends it and the server builds the same
 * options from it, so both hit one cached outline. 150 DPI is plenty on screen and for preflight; the
 * cut line itself is exact in millimetres at any DPI.
 */
export function pieceOutlineQuery(p: Pick<Piece, 'width' | 'border' | 'borderColour'>, limits: CutLimits): Record<string, string> {
  // The editor's URL form of pieceOutlineOptions() (the server adds the art's saved setting).
  const o = pieceSizeOptions(p, limits);
  return {
    width: `${o.width.toFixed(2)}mm`,
    border: `${o.border.toFixed(3)}mm`,
    borderColour: o.borderColour,
    dpi: String(o.dpi),
    minFeature: `${o.minFeature.toFixed(2)}mm`,
    bridgeWidth: `${o.bridgeWidth.toFixed(2)}mm`,
  };
}

/** The outline a piece needs: same art, printed width, border and border colour share one request. */
export const outlineKey = (p: Pick<Piece, 'artId' | 'width' | 'border' | 'borderColour'>, limits: CutLimits) =>
  `${p.artId}?${new URLSearchParams(pieceOutlineQuery(p, limits))}`;
