// More pieces on a sheet than the constructive pass found room for: one more piece goes where it
// overlaps least, and the separator tries to make room for it by moving the others; if it cannot
// within its budget, the sheet goes back to how it was. The same move empties a last sheet into the
// earlier ones, so a quantity spreads over fewer sheets.
import type { Layout } from './separator';
import type { Variant } from './shapes';

type InsertOptions = { deadline: number; random: () => number; shouldStop?: () => boolean };

/** Adds one piece with the given rotations; true when the layout is without overlap again. */
export function insertPiece(layout: Layout, variants: Variant[], o: InsertOptions): boolean {
  const before = layout.snapshot();
  let v = 0;
  while (v < variants.length && !layout.range(layout.length, v, variants)) v++;
  if (v === variants.length) return false;
  const r = layout.range(layout.length, v, variants)!;
  const i = layout.add({ variants, v, x: (r.x0 + r.x1) / 2, y: (r.y0 + r.y1) / 2 });
  layout.resetWeights();
  // Many spots over the whole sheet: the hole it fits in may be anywhere.
  layout.relocate(i, o.random, 400);
  if (layout.overlapOf(i) === 0) return true;
  if (layout.separate({ strikes: 2, roundsWithoutGain: 25, deadline: o.deadline, random: o.random, shouldStop: o.shouldStop })) return true;
  layout.pop();
  layout.restore(before);
  return false;
}
