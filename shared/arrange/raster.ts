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

/** Scanline fill: per row (of `cell` mm, from `x0`,`y0` cells), the runs of cells whose centres are inside the ring. */
function centreRuns(ring: Ring, cell: number, x0: number, y0: number, w: number, h: number): ShapeMask['rows'] {
  const rows: ShapeMask['rows'] = [];
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
    const runs: Array<[number, number]> = [];
    for (let t = 0; t + 1 < xs.length; t += 2) {
      const from = Math.max(0, Math.ceil(xs[t] / cell - 0.5) - x0),
        to = Math.min(w - 1, Math.floor(xs[t + 1] / cell - 0.5) - x0);
      if (from > to) continue;
      const last = runs[runs.length - 1];
      // Pairs come in order; one that starts at or next to the previous run's end joins it.
      if (last && from <= last[1] + 1) last[1] = Math.max(last[1], to);
      else runs.push([from, to]);
    }
    rows.push(runs);
  }
  return rows;
}

/**
 * Grows runs by a disk: a cell is set when some set cell's centre is within √limit cells of its own.
 * Row j takes the runs of each row j + dy widened by ⌊√(limit − dy²)⌋, merged (the same cells as an
 * exact Euclidean distance transform thresholded at √limit, without visiting the empty ones).
 */
function dilateRows(rows: ShapeMask['rows'], w: number, limit: number): ShapeMask['rows'] {
  const reach = Math.floor(Math.sqrt(limit));
  const widen = Array.from({ length: reach + 1 }, (_, dy) => Math.floor(Math.sqrt(limit - dy * dy) + 1e-9));
  let from = new Int32Array(64),
    to = new Int32Array(64);
  const out: ShapeMask['rows'] = new Array(rows.length);
  for (let j = 0; j < rows.length; j++) {
    // The widened runs of the rows around, kept sorted by start as they come (a handful each).
    let n = 0;
    for (let dy = -reach; dy <= reach; dy++) {
      const source = rows[j + dy];
      if (!source) continue;
      const r = widen[dy < 0 ? -dy : dy];
      for (let k = 0; k < source.length; k++) {
        if (n === from.length) {
          const f = new Int32Array(2 * n),
            t = new Int32Array(2 * n);
          f.set(from);
          t.set(to);
          from = f;
          to = t;
        }
        const a = Math.max(0, source[k][0] - r),
          b = Math.min(w - 1, source[k][1] + r);
        let i = n++;
        while (i > 0 && from[i - 1] > a) {
          from[i] = from[i - 1];
          to[i] = to[i - 1];
          i--;
        }
        from[i] = a;
        to[i] = b;
      }
    }
    // Overlapping or touching widened runs join, as cells set side by side would.
    const merged: Array<[number, number]> = [];
    for (let i = 0; i < n; i++) {
      const last = merged.length ? merged[merged.length - 1] : null;
      if (last && from[i] <= last[1] + 1) {
        if (to[i] > last[1]) last[1] = to[i];
      } else merged.push([from[i], to[i]]);
    }
    out[j] = merged;
  }
  return out;
}

/**
 * The rows in the order a collision test tries them: the widest first (the likeliest to hit), then
 * each time the row farthest from those already tried (wider on a tie). Neighbouring rows mostly
 * hit or miss together, so spreading the probes finds a blocked spot in fewer of them.
 */
function probeOrder(rows: ShapeMask['rows'], widths: number[]): number[] {
  const left = rows.map((_, j) => j).filter((j) => rows[j].length > 0);
  if (left.length === 0) return [];
  const first = left.reduce((m, j) => (widths[j] > widths[m] ? j : m), left[0]);
  const order = [first];
  // Distance of each row not yet tried to the nearest tried one (−1 once tried), rows ascending.
  const distance = Float64Array.from(left, (j) => Math.abs(j - first));
  distance[left.indexOf(first)] = -1;
  for (let picked = 1; picked < left.length; picked++) {
    let pick = -1;
    for (let k = 0; k < left.length; k++) {
      const d = distance[k];
      if (d < 0) continue;
      if (pick < 0 || d > distance[pick] || (d === distance[pick] && widths[left[k]] > widths[left[pick]])) pick = k;
    }
    const row = left[pick];
    order.push(row);
    distance[pick] = -1;
    for (let k = 0; k < left.length; k++) if (distance[k] > 0) distance[k] = Math.min(distance[k], Math.abs(left[k] - row));
  }
  return order;
}

/**
 * Rasterises a rotated cut line on cells of `cell` mm (cells whose centre is inside) and grows it by
 * `grow` mm (a disk, exactly). The raster is a quick filter: it may miss a
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
  const inside = centreRuns(ring, cell, x0, y0, w, h);
  const rows = grow > 0 ? dilateRows(inside, w, (grow / cell) ** 2) : inside;
  let cells = 0;
  const widths: number[] = new Array(rows.length);
  const longest = new Int32Array(rows.length);
  for (let j = 0; j < rows.length; j++) {
    let width = 0,
      most = 0;
    for (const [a, b] of rows[j]) {
      width += b - a + 1;
      if (b - a + 1 > most) most = b - a + 1;
    }
    widths[j] = width;
    longest[j] = most;
    cells += width;
  }
  const order = probeOrder(rows, widths);
  return { rotation, ring, minX, minY, maxX, maxY, offsetX: x0, offsetY: y0, rows, order, longest, cells, pad };
}
