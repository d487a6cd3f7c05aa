import { squaredDistanceTransform } from '../geometry/distance-transform';
import type { Ring } from '../geometry/polygon';

/**
 * A shape on the search grid: for each row, every run of cells it blocks (grown by the raster's
 * share of the gap). All runs are kept, so a notch or the inside of a U stays open for other pieces.
 */
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
  /** Runs per row, [x0, x1] inclusive, relative to offsetX. */
  rows: Array<Array<[number, number]>>;
  /** The rows in the order a collision test should try them: widest first (the likeliest to hit). */
  order: number[];
  /** The longest run of each row (cells): a board row with no free run this long cannot take it. */
  longest: Int32Array;
  cells: number;
  /** Cells the grown mask reaches past the shape on each side (they may hang off the board). */
  pad: number;
};

export function rotateRing(ring: Ring, centre: { x: number; y: number }, degrees: number): Ring {
  const a = (degrees * Math.PI) / 180,
    c = Math.cos(a),
    s = Math.sin(a);
  return ring.map((p) => {
    const dx = p.x - centre.x,
      dy = p.y - centre.y;
    return { x: dx * c - dy * s, y: dx * s + dy * c };
  });
}

/** Scanline fill: the cells (of `cell` mm, from `x0`,`y0` cells) whose centres are inside the ring. */
function fillCentres(ring: Ring, cell: number, x0: number, y0: number, w: number, h: number): Uint8Array {
  const filled = new Uint8Array(w * h);
  const xs: number[] = [];
  for (let j = 0; j < h; j++) {
    const y = (y0 + j + 0.5) * cell;
    xs.length = 0;
    for (let i = 0, k = ring.length - 1; i < ring.length; k = i++) {
      const a = ring[i],
        b = ring[k];
      if (a.y > y !== b.y > y) xs.push(a.x + ((y - a.y) * (b.x - a.x)) / (b.y - a.y));
    }
    xs.sort((p, q) => p - q);
    for (let t = 0; t + 1 < xs.length; t += 2) {
      const from = Math.max(0, Math.ceil(xs[t] / cell - 0.5) - x0),
        to = Math.min(w - 1, Math.floor(xs[t + 1] / cell - 0.5) - x0);
      for (let i = from; i <= to; i++) filled[j * w + i] = 1;
    }
  }
  return filled;
}

/**
 * Rasterises a rotated cut line on cells of `cell` mm (cells whose centre is inside) and grows it by
 * `grow` mm with an exact Euclidean distance transform. The raster is a quick filter: it may miss a
 * sliver narrower than a cell, never a whole cell of the shape; the exact geometry has the last word.
 */
export function shapeMask(
  outline: { points: Ring; widthMm: number; heightMm: number },
  rotation: number,
  cell: number,
  grow: number,
): ShapeMask {
  const ring = rotateRing(outline.points, { x: outline.widthMm / 2, y: outline.heightMm / 2 }, rotation);
  let minX = Infinity,
    minY = Infinity,
    maxX = -Infinity,
    maxY = -Infinity;
  for (const p of ring) {
    minX = Math.min(minX, p.x);
    minY = Math.min(minY, p.y);
    maxX = Math.max(maxX, p.x);
    maxY = Math.max(maxY, p.y);
  }
  const pad = Math.ceil(grow / cell) + 1;
  const x0 = Math.floor(minX / cell) - pad,
    y0 = Math.floor(minY / cell) - pad;
  const w = Math.ceil(maxX / cell) + pad - x0 + 1,
    h = Math.ceil(maxY / cell) + pad - y0 + 1;
  const filled = fillCentres(ring, cell, x0, y0, w, h);
  let blocked = filled;
  if (grow > 0) {
    const d2 = squaredDistanceTransform(filled, w, h);
    const limit = (grow / cell) ** 2;
    blocked = new Uint8Array(w * h);
    for (let i = 0; i < blocked.length; i++) blocked[i] = d2[i] <= limit ? 1 : 0;
  }
  const rows: ShapeMask['rows'] = [];
  let cells = 0;
  for (let j = 0; j < h; j++) {
    const runs: Array<[number, number]> = [];
    for (let i = 0; i < w; i++) {
      if (!blocked[j * w + i]) continue;
      const start = i;
      while (i + 1 < w && blocked[j * w + i + 1]) i++;
      runs.push([start, i]);
      cells += i - start + 1;
    }
    rows.push(runs);
  }
  const widths = rows.map((r) => r.reduce((s, [a, b]) => s + b - a + 1, 0));
  const longest = Int32Array.from(rows, (r) => r.reduce((m, [a, b]) => Math.max(m, b - a + 1), 0));
  const order = rows
    .map((_, j) => j)
    .filter((j) => rows[j].length > 0)
    .sort((a, b) => widths[b] - widths[a]);
  return { rotation, ring, minX, minY, maxX, maxY, offsetX: x0, offsetY: y0, rows, order, longest, cells, pad };
}
