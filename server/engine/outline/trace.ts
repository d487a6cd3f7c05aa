import { contours } from 'd3-contour';
import simplify from 'simplify-js';
import type { Ring } from '@shared/geometry/polygon';
import { area, clockwise, isSimple } from '@shared/geometry/polygon';

/**
 * Traces the iso-line field = 0 with marching squares (d3-contour, linear interpolation) and keeps
 * outer rings only, so holes never become cut lines. Coordinates are in pixel-edge space: pixel
 * (x, y) covers [x, x+1] × [y, y+1]. Returns rings largest first.
 */
export function traceOuterRings(field: Float32Array, width: number, height: number): Ring[] {
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
