import { squaredDistanceTransform } from '../geometry/distance-transform';
import type { Ring } from '../geometry/polygon';

/** A shape on the search grid: for each row, the span of cells it blocks (inflated by half the gap). */
export type ShapeMask = {
  rotation: number;
  /** The rotated cut line about the frame centre (mm). */
  ring: Ring;
  /** Bounds of the rotated cut line relative to the centre (mm). */
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
  /** Cell offset of the mask's first row/column from the centre's cell. */
  offsetX: number;
  offsetY: number;
  rows: Array<{ x0: number; x1: number } | null>;
  cells: number;
};

export function rotateRing(ring: Ring, centre: { x: number; y: number }, degrees: number): Ring {
  const a = (degrees * Math.PI) / 180, c = Math.cos(a), s = Math.sin(a);
  return ring.map((p) => {
    const dx = p.x - centre.x, dy = p.y - centre.y;
    return { x: dx * c - dy * s, y: dx * s + dy * c };
  });
}

function inside(ring: Ring, x: number, y: number): boolean {
  let hit = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const a = ring[i], b = ring[j];
    if (a.y > y !== b.y > y && x < ((b.x - a.x) * (y - a.y)) / (b.y - a.y) + a.x) hit = !hit;
  }
  return hit;
}

/**
 * Rasterises a rotated cut line on cells of `cell` mm and grows it by `grow` mm with an exact
 * Euclidean distance transform, so two masks that do not overlap belong to shapes about 2·grow apart.
 * Each row keeps one span (holes between parts of a row are filled: never wrong, only cautious).
 */
export function shapeMask(outline: { points: Ring; widthMm: number; heightMm: number }, rotation: number, cell: number, grow: number): ShapeMask {
  const ring = rotateRing(outline.points, { x: outline.widthMm / 2, y: outline.heightMm / 2 }, rotation);
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const p of ring) {
    minX = Math.min(minX, p.x);
    minY = Math.min(minY, p.y);
    maxX = Math.max(maxX, p.x);
    maxY = Math.max(maxY, p.y);
  }
  const pad = Math.ceil(grow / cell) + 1;
  const x0 = Math.floor(minX / cell) - pad, y0 = Math.floor(minY / cell) - pad;
  const w = Math.ceil(maxX / cell) + pad - x0 + 1, h = Math.ceil(maxY / cell) + pad - y0 + 1;
  const filled = new Uint8Array(w * h);
  for (let j = 0; j < h; j++) {
    for (let i = 0; i < w; i++) {
      // A cell counts when its centre or any corner is inside: thin parts are never missed.
      const cx = (x0 + i) * cell, cy = (y0 + j) * cell;
      if (inside(ring, cx + cell / 2, cy + cell / 2) || inside(ring, cx, cy) || inside(ring, cx + cell, cy) || inside(ring, cx, cy + cell) || inside(ring, cx + cell, cy + cell)) filled[j * w + i] = 1;
    }
  }
  const d2 = squaredDistanceTransform(filled, w, h);
  const limit = (grow / cell + 0.5) ** 2;
  const rows: ShapeMask['rows'] = [];
  let cells = 0;
  for (let j = 0; j < h; j++) {
    let a = -1, b = -1;
    for (let i = 0; i < w; i++) {
      if (d2[j * w + i] <= limit) {
        if (a < 0) a = i;
        b = i;
      }
    }
    rows.push(a < 0 ? null : { x0: a, x1: b });
    if (a >= 0) cells += b - a + 1;
  }
  return { rotation, ring, minX, minY, maxX, maxY, offsetX: x0, offsetY: y0, rows, cells };
}
