import { contours } from 'd3-contour';
import simplify from 'simplify-js';
import type { Ring } from '@shared/geometry/polygon';
import { area, clockwise, isSimple } from '@shared/geometry/polygon';
import type { RowRuns } from './runs';
import { runsAtLeast } from './runs';

/**
 * Traces the iso-line field = 0 by marching squares (Lorensen & Cline's cell cases in 2-D) with
 * linear interpolation on cell edges, and keeps outer rings only, so holes never become cut lines.
 * Coordinates are in pixel-edge space: pixel (x, y) covers [x, x+1] × [y, y+1], its sample at its
 * centre. Only cells the line crosses are visited after one scan of the grid; each crossing links
 * to the next with the inside on its right, so outer rings come out clockwise on screen and holes
 * the other way. A saddle cell is split by the mean of its corners (Nielson & Hamann's asymptotic
 * decider simplified to the centre value). Returns rings largest first.
 */
export function traceOuterRings(field: Float32Array, width: number, height: number, inside?: RowRuns): Ring[] {
  const W = width,
    H = height;
  if (insideOnBorder(field, W, H)) return traceWithD3(field, W, H);
  const runs = inside ?? runsAtLeast(field, W, H, 0);
  const cells = new Int32Array(4 * W + 8);
  // Crossing ids: 2·i for the edge from sample i to i + 1, 2·i + 1 for i to i + W; next maps each
  // crossing to the following one (a few per crossed cell: a map, not an array over the canvas).
  const next = new Map<number, number>();
  const starts: number[] = [];
  const link = (from: number, to: number) => {
    next.set(from, to);
    starts.push(from);
  };
  for (let y = 0; y < H - 1; y++) {
    const row = y * W;
    const spans = crossedCells(runs, y, cells);
    for (let span = 0; span < spans; span += 2) {
      let left = (field[row + cells[span]] >= 0 ? 1 : 0) | (field[row + cells[span] + W] >= 0 ? 8 : 0);
      for (let x = cells[span]; x <= cells[span + 1]; x++) {
        const i = row + x;
        // Corner bits: 1 top-left, 2 top-right, 4 bottom-right, 8 bottom-left.
        const right = (field[i + 1] >= 0 ? 2 : 0) | (field[i + 1 + W] >= 0 ? 4 : 0);
        const c = left | right;
        left = (right & 2 ? 1 : 0) | (right & 4 ? 8 : 0);
        if (c === 0 || c === 15) continue;
        // The cell's edges as crossing ids: top, right, bottom, left.
        const top = 2 * i,
          rightEdge = 2 * (i + 1) + 1,
          bottom = 2 * (i + W),
          leftEdge = 2 * i + 1;
        switch (c) {
          case 1: link(top, leftEdge); break; // prettier-ignore
          case 2: link(rightEdge, top); break; // prettier-ignore
          case 3: link(rightEdge, leftEdge); break; // prettier-ignore
          case 4: link(bottom, rightEdge); break; // prettier-ignore
          case 6: link(bottom, top); break; // prettier-ignore
          case 7: link(bottom, leftEdge); break; // prettier-ignore
          case 8: link(leftEdge, bottom); break; // prettier-ignore
          case 9: link(top, bottom); break; // prettier-ignore
          case 11: link(rightEdge, bottom); break; // prettier-ignore
          case 12: link(leftEdge, rightEdge); break; // prettier-ignore
          case 13: link(top, rightEdge); break; // prettier-ignore
          case 14: link(leftEdge, top); break; // prettier-ignore
          case 5:
          case 10: {
            // Inside at the centre: the inside corners join through it and the outside corners are
            // cut off one by one (as in cases 13 and 7, or 14 and 11); else the inside corners are
            // cut off one by one (as in cases 1 and 4, or 2 and 8).
            const centre = field[i] + field[i + 1] + field[i + W] + field[i + W + 1] >= 0;
            if (c === 5 && centre) {
              link(top, rightEdge);
              link(bottom, leftEdge);
            } else if (c === 5) {
              link(top, leftEdge);
              link(bottom, rightEdge);
            } else if (centre) {
              link(leftEdge, top);
              link(rightEdge, bottom);
            } else {
              link(rightEdge, top);
              link(leftEdge, bottom);
            }
            break;
          }
        }
      }
    }
  }
  const point = (id: number) => {
    const i = id >> 1;
    const x = i % W,
      y = (i - x) / W;
    // A sample exactly on the level would put two vertices on top of each other: it counts as just inside.
    const v0 = field[i] || 1e-6,
      v1 = (id & 1 ? field[i + W] : field[i + 1]) || 1e-6;
    const t = v0 / (v0 - v1);
    return id & 1 ? { x: x + 0.5, y: y + 0.5 + t } : { x: x + 0.5 + t, y: y + 0.5 };
  };
  const rings: Array<{ ring: Ring; area: number }> = [];
  for (const start of starts) {
    if (!next.has(start)) continue; // already part of a traced ring
    const ring: Ring = [];
    let twice = 0;
    for (let id: number | undefined = start; id !== undefined;) {
      const after: number | undefined = next.get(id);
      if (after === undefined) break;
      const p = point(id);
      const last = ring[ring.length - 1];
      if (!last || Math.abs(last.x - p.x) > 1e-9 || Math.abs(last.y - p.y) > 1e-9) ring.push(p);
      next.delete(id);
      id = after;
    }
    while (ring.length > 1 && Math.abs(ring[0].x - ring[ring.length - 1].x) < 1e-9 && Math.abs(ring[0].y - ring[ring.length - 1].y) < 1e-9)
      ring.pop();
    for (let k = 0; k < ring.length; k++) {
      const a = ring[k],
        b = ring[(k + 1) % ring.length];
      twice += a.x * b.y - b.x * a.y;
    }
    // Clockwise on screen (y down) is a positive shoelace sum: an outer ring; holes run the other way.
    if (twice > 0 && ring.length >= 3) rings.push({ ring, area: twice / 2 });
  }
  return rings.sort((a, b) => b.area - a.area).map((r) => r.ring);
}

/** Scratch for crossedCells, grown as needed: run ends of two rows, toggles, spans. */
let endsScratch = new Int32Array(64),
  togglesScratch = new Int32Array(64);

/**
 * The cells (x from 0 to width − 2) between rows y and y + 1 whose corners are not all inside or all
 * outside, as closed spans [from, to] in `out` (pairs); answers how many numbers it wrote. A cell is
 * crossed only next to a run's end in either row or over a column where the two rows differ.
 */
function crossedCells(runs: RowRuns, y: number, out: Int32Array): number {
  const last = runs.width - 2;
  const a0 = runs.rowStart[y],
    a1 = runs.rowStart[y + 1],
    b1 = runs.rowStart[y + 2];
  const count = 2 * (b1 - a0);
  if (count === 0) return 0;
  if (endsScratch.length < count) {
    endsScratch = new Int32Array(2 * count);
    togglesScratch = new Int32Array(2 * count);
  }
  // Each row's ends in order (its runs are sorted and apart), the two rows merged.
  const ends = endsScratch,
    starts = runs.starts,
    stops = runs.ends;
  for (let i = 2 * a0, j = 2 * a1, n = 0; n < count; n++) {
    const ei = i < 2 * a1 ? ((i & 1) === 0 ? starts[i >> 1] : stops[i >> 1]) : Infinity,
      ej = j < 2 * b1 ? ((j & 1) === 0 ? starts[j >> 1] : stops[j >> 1]) : Infinity;
    if (ei <= ej) {
      ends[n] = ei;
      i++;
    } else {
      ends[n] = ej;
      j++;
    }
  }
  // The columns where the rows differ lie between the 1st and 2nd, 3rd and 4th … of the ends taken
  // as toggles (an end in both rows cancels).
  const toggles = togglesScratch;
  let t = 0;
  for (let n = 0; n < count; n++) {
    if (t > 0 && toggles[t - 1] === ends[n]) t--;
    else toggles[t++] = ends[n];
  }
  // Spans of cells: around every run end, and across those columns; both lists are sorted by start,
  // so taking them in order joins overlapping and adjacent spans.
  let n = 0;
  for (let i = 0, k = 0; i < count || k + 1 < t;) {
    let from: number, to: number;
    if (k + 1 >= t || (i < count && ends[i] <= toggles[k])) {
      from = to = ends[i++] - 1;
    } else {
      from = toggles[k] - 1;
      to = toggles[k + 1] - 1;
      k += 2;
    }
    if (from < 0) from = 0;
    if (to > last) to = last;
    if (from > to) continue;
    if (n > 0 && from <= out[n - 1] + 1) {
      if (to > out[n - 1]) out[n - 1] = to;
    } else {
      out[n++] = from;
      out[n++] = to;
    }
  }
  return n;
}

function insideOnBorder(field: Float32Array, W: number, H: number): boolean {
  for (let x = 0; x < W; x++) if (field[x] >= 0 || field[(H - 1) * W + x] >= 0) return true;
  for (let y = 0; y < H; y++) if (field[y * W] >= 0 || field[y * W + W - 1] >= 0) return true;
  return false;
}

/** The general case (a shape touching the grid's edge, which the outline's padded canvas never has): d3-contour. */
function traceWithD3(field: Float32Array, width: number, height: number): Ring[] {
  // A sample exactly on the level would put contour vertices on top of each other; nudge it inside.
  for (let i = 0; i < field.length; i++) if (field[i] === 0) field[i] = 1e-6;
  const [layer] = contours().size([width, height]).thresholds([0])(field as unknown as number[]);
  const rings: Ring[] = [];
  for (const polygon of layer.coordinates) {
    const ring: Ring = [];
    // d3 repeats the first point at the end; a ring here does not, nor any repeated vertex.
    for (const [x, y] of polygon[0]) {
      const last = ring[ring.length - 1];
      if (!last || Math.abs(last.x - x) > 1e-9 || Math.abs(last.y - y) > 1e-9) ring.push({ x, y });
    }
    while (ring.length > 1 && Math.abs(ring[0].x - ring[ring.length - 1].x) < 1e-9 && Math.abs(ring[0].y - ring[ring.length - 1].y) < 1e-9)
      ring.pop();
    rings.push(ring);
  }
  return rings.sort((a, b) => area(b) - area(a));
}

/**
 * Ramer–Douglas–Peucker simplification (via simplify-js) within `tolerance` px, halving the
 * tolerance until the result is a simple polygon; returned clockwise on screen (y down).
 */
export function simplifyRing(ring: Ring, tolerance: number): Ring {
  for (let t = tolerance; t >= tolerance / 16 && t > 0; t /= 2) {
    const candidate = simplify(ring, t, true);
    if (candidate.length >= 3 && isSimple(candidate)) return clockwise(candidate);
  }
  return clockwise(ring);
}
