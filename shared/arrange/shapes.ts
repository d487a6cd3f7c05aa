// The shapes the overlap search moves about: each cut line grown by half the gap (Clipper2 offset,
// round joins), turned to each allowed rotation, with flat coordinate arrays for fast collision
// tests and a set of inscribed circles ("poles", after the poles of inaccessibility of Garcia-Castellanos
// & Lombardo 2007) that stand in for the shape when measuring how deep two shapes overlap.
import { EndType, JoinType, inflatePathsD } from 'clipper2-ts';
import type { Ring } from '../geometry/polygon';
import { area, signedArea } from '../geometry/polygon';
import { rotateRing } from './raster';

export type Variant = {
  rotation: number;
  /** The cut line itself, turned, relative to the frame centre (mm). */
  ring: Ring;
  /** The grown cut line (half the gap on every side), relative to the frame centre. */
  xs: Float64Array;
  ys: Float64Array;
  /** Box of the grown cut line. */
  gx0: number;
  gy0: number;
  gx1: number;
  gy1: number;
  /** Box of the cut line itself: what must stay inside the print area less the margin. */
  bx0: number;
  by0: number;
  bx1: number;
  by1: number;
  /** Inscribed circles of the grown shape, largest first: x, y, r triples. */
  poles: Float64Array;
  /** 1 % of the shape's size (the diagonal of its upright box): below this depth an overlap is scored by a decaying
   * tail rather than its depth, and every collision counts at least this much (mm). */
  eps: number;
  area: number;
};

/**
 * The cut line grown by `grow` mm with round joins (Clipper2), clockwise with y down. The rounded
 * corners are chords within an arc tolerance of 2 % of the growth (a dozen points per half turn);
 * the growth is that much more than asked, so no chord comes closer than `grow` to the cut line.
 */
function growRing(ring: Ring, grow: number): Ring {
  if (grow <= 0) return ring;
  const tolerance = Math.min(0.1, Math.max(0.002, grow * 0.02));
  const paths = inflatePathsD([ring.map((p) => ({ x: p.x, y: p.y }))], grow + tolerance, JoinType.Round, EndType.Polygon, 2, 4, tolerance);
  // A simple ring grows into one ring; keep the largest should rounding ever split off a sliver.
  let best: Ring = ring,
    bestArea = -1;
  for (const path of paths) {
    const r = path.map((p) => ({ x: p.x, y: p.y }));
    const a = area(r);
    if (a > bestArea) {
      best = signedArea(r) >= 0 ? r : r.reverse();
      bestArea = a;
    }
  }
  return best;
}

function distanceToEdges(px: number, py: number, xs: Float64Array, ys: Float64Array): number {
  let best = Infinity;
  const n = xs.length;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const ax = xs[j],
      ay = ys[j],
      vx = xs[i] - ax,
      vy = ys[i] - ay;
    const len2 = vx * vx + vy * vy;
    let t = len2 === 0 ? 0 : ((px - ax) * vx + (py - ay) * vy) / len2;
    t = t < 0 ? 0 : t > 1 ? 1 : t;
    const dx = px - ax - t * vx,
      dy = py - ay - t * vy;
    const d = dx * dx + dy * dy;
    if (d < best) best = d;
  }
  return Math.sqrt(best);
}

export function insideRing(px: number, py: number, xs: Float64Array, ys: Float64Array): boolean {
  let inside = false;
  const n = xs.length;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    if (ys[i] > py !== ys[j] > py && px < ((xs[j] - xs[i]) * (py - ys[i])) / (ys[j] - ys[i]) + xs[i]) inside = !inside;
  }
  return inside;
}

/** The box of a ring given as coordinate arrays. */
function boxOf(xs: Float64Array, ys: Float64Array) {
  let x0 = Infinity,
    y0 = Infinity,
    x1 = -Infinity,
    y1 = -Infinity;
  for (let i = 0; i < xs.length; i++) {
    x0 = Math.min(x0, xs[i]);
    x1 = Math.max(x1, xs[i]);
    y0 = Math.min(y0, ys[i]);
    y1 = Math.max(y1, ys[i]);
  }
  return { x0, y0, x1, y1 };
}

/**
 * Inscribed circles that do not overlap one another, each the largest that still fits in what the
 * earlier ones left: sampled on a grid, then each centre refined by a shrinking pattern search.
 */
function polesOf(xs: Float64Array, ys: Float64Array, maxPoles = 8): Float64Array {
  const { x0, y0, x1, y1 } = boxOf(xs, ys);
  const step = Math.max(x1 - x0, y1 - y0) / 40;
  const sx: number[] = [],
    sy: number[] = [],
    sd: number[] = [];
  for (let y = y0 + step / 2; y < y1; y += step) {
    for (let x = x0 + step / 2; x < x1; x += step) {
      if (!insideRing(x, y, xs, ys)) continue;
      sx.push(x);
      sy.push(y);
      sd.push(distanceToEdges(x, y, xs, ys));
    }
  }
  const poles: number[] = [];
  const room = (x: number, y: number) => {
    if (!insideRing(x, y, xs, ys)) return -1;
    let r = distanceToEdges(x, y, xs, ys);
    for (let k = 0; k < poles.length; k += 3) r = Math.min(r, Math.hypot(x - poles[k], y - poles[k + 1]) - poles[k + 2]);
    return r;
  };
  const free = sd.slice();
  let first = 0;
  while (poles.length / 3 < maxPoles) {
    let at = -1;
    for (let i = 0; i < free.length; i++) if (at < 0 || free[i] > free[at]) at = i;
    if (at < 0 || free[at] <= 0) break;
    let x = sx[at],
      y = sy[at],
      r = room(x, y);
    for (let s = step / 2; s > step / 64; s /= 2) {
      for (let moved = true; moved;) {
        moved = false;
        for (const [dx, dy] of [
          [s, 0],
          [-s, 0],
          [0, s],
          [0, -s],
        ]) {
          const v = room(x + dx, y + dy);
          if (v > r) {
            x += dx;
            y += dy;
            r = v;
            moved = true;
          }
        }
      }
    }
    if (first === 0) first = r;
    // Circles much smaller than the first add little but cost time in every overlap measure.
    if (r < first * 0.12 || r < step / 4) break;
    poles.push(x, y, r);
    for (let i = 0; i < free.length; i++) free[i] = Math.min(free[i], Math.hypot(sx[i] - x, sy[i] - y) - r);
  }
  if (poles.length === 0) {
    // A sliver thinner than the sampling grid: its centroid of vertices with a tiny radius.
    let cx = 0,
      cy = 0;
    for (let i = 0; i < xs.length; i++) {
      cx += xs[i] / xs.length;
      cy += ys[i] / ys.length;
    }
    poles.push(cx, cy, step / 8);
  }
  return Float64Array.from(poles);
}

/** Every allowed rotation of one outline, grown by `grow` mm, about its frame centre. */
export function variantsOf(outline: { points: Ring; widthMm: number; heightMm: number }, rotations: number[], grow: number): Variant[] {
  const centre = { x: outline.widthMm / 2, y: outline.heightMm / 2 };
  const grown = growRing(outline.points, grow).map((p) => ({ x: p.x - centre.x, y: p.y - centre.y }));
  const baseXs = Float64Array.from(grown, (p) => p.x),
    baseYs = Float64Array.from(grown, (p) => p.y);
  const basePoles = polesOf(baseXs, baseYs);
  const itemArea = area(outline.points);
  // The upright box's diagonal, so that ε is the same in every turn.
  const upright = boxOf(baseXs, baseYs);
  const eps = Math.max(Math.hypot(upright.x1 - upright.x0, upright.y1 - upright.y0) * 0.01, 1e-3);
  return rotations.map((rotation) => {
    const ring = rotateRing(outline.points, centre, rotation);
    const g = rotateRing(grown, { x: 0, y: 0 }, rotation);
    const xs = Float64Array.from(g, (p) => p.x),
      ys = Float64Array.from(g, (p) => p.y);
    const a = (rotation * Math.PI) / 180,
      c = Math.cos(a),
      s = Math.sin(a);
    const poles = new Float64Array(basePoles.length);
    for (let k = 0; k < basePoles.length; k += 3) {
      poles[k] = basePoles[k] * c - basePoles[k + 1] * s;
      poles[k + 1] = basePoles[k] * s + basePoles[k + 1] * c;
      poles[k + 2] = basePoles[k + 2];
    }
    const { x0: gx0, y0: gy0, x1: gx1, y1: gy1 } = boxOf(xs, ys);
    let bx0 = Infinity,
      by0 = Infinity,
      bx1 = -Infinity,
      by1 = -Infinity;
    for (const p of ring) {
      bx0 = Math.min(bx0, p.x);
      bx1 = Math.max(bx1, p.x);
      by0 = Math.min(by0, p.y);
      by1 = Math.max(by1, p.y);
    }
    return {
      rotation,
      ring,
      xs,
      ys,
      gx0,
      gy0,
      gx1,
      gy1,
      bx0,
      by0,
      bx1,
      by1,
      poles,
      eps,
      area: itemArea,
    };
  });
}
