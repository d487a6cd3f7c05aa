// Exact overlap of two cut lines, for the gap-0 case where a distance test cannot tell touching from
// crossing: the area their interiors share, by Clipper2's boolean intersection (integer arithmetic,
// so two shapes that only touch along an edge share exactly nothing at the working precision).
import { Clipper, FillRule } from 'clipper2-ts';
import type { Paths64 } from 'clipper2-ts';
import type { Ring } from './polygon';
import { boundingBox } from './polygon';

/** Working precision: 0.1 µm, far below any cutter's and above rounding from turning a shape. */
const SCALE = 10_000;
const toPath = (ring: Ring): Paths64 => [ring.map((p) => ({ x: Math.round(p.x * SCALE), y: Math.round(p.y * SCALE) }))];

/** Shared area (mm²) of two simple rings; 0 when their boxes are apart. */
export function overlapArea(a: Ring, b: Ring): number {
  const ba = boundingBox(a),
    bb = boundingBox(b);
  if (ba.x >= bb.x + bb.width || bb.x >= ba.x + ba.width || ba.y >= bb.y + bb.height || bb.y >= ba.y + ba.height) return 0;
  const shared = Clipper.intersect(toPath(a), toPath(b), FillRule.NonZero);
  return shared.reduce((sum, path) => sum + Math.abs(Clipper.area(path)), 0) / (SCALE * SCALE);
}

/** Overlaps smaller than this (mm²: a 1 mm × 1 µm sliver) are rounding where two cut lines meet, not a collision. */
export const OVERLAP_EPSILON_MM2 = 1e-3;

/** Whether two cut lines cross into each other (touching along an edge or at a point does not count). */
export const overlaps = (a: Ring, b: Ring) => overlapArea(a, b) > OVERLAP_EPSILON_MM2;
