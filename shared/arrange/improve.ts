// The bridge between the constructive layouts of the nester (placements on boards) and the overlap
// search (a Layout of pieces that may overlap for a while), and the last word on any layout the
// search hands back: every pair measured exactly on the cut lines themselves.
import type { Ring } from '../geometry/polygon';
import { overlaps } from '../geometry/overlap';
import { closerThan } from '../sheet/placement';
import type { Area, LayoutPiece } from './separator';
import { Layout } from './separator';
import type { Variant } from './shapes';

export type Placed = { key: string; x: number; y: number; rotation: number };

/** A layout over the given area from placements, each piece with every rotation it may take. */
export function layoutOf(
  placed: Placed[],
  variantsOf: (key: string) => Variant[],
  area: Area,
  fixed: Placed[] = [],
): { layout: Layout; keys: string[] } {
  const layout = new Layout(area);
  const keys: string[] = [];
  const add = (p: Placed, isFixed: boolean) => {
    const variants = variantsOf(p.key);
    let v = variants.findIndex((s) => Math.abs(s.rotation - p.rotation) < 1e-9);
    if (v < 0) v = 0;
    const piece: LayoutPiece = { variants: isFixed ? [variants[v]] : variants, v: isFixed ? 0 : v, x: p.x, y: p.y, fixed: isFixed };
    layout.add(piece);
    keys.push(p.key);
  };
  for (const p of fixed) add(p, true);
  for (const p of placed) add(p, false);
  return { layout, keys };
}

/** The movable pieces of a layout as placements. */
export function placementsOf(layout: Layout, keys: string[]): Placed[] {
  const out: Placed[] = [];
  layout.pieces.forEach((p, i) => {
    if (!p.fixed) out.push({ key: keys[i], x: p.x, y: p.y, rotation: p.variants[p.v].rotation });
  });
  return out;
}

/**
 * Whether the layout's cut lines keep the gap (at a gap of 0: share no area) and stay inside the
 * area, measured on the cut lines themselves rather than the grown shapes the search moved.
 */
export function exactlyValid(layout: Layout, gap: number): boolean {
  const a = layout.area;
  const rings: Array<{ ring: Ring; x0: number; y0: number; x1: number; y1: number; fixed: boolean }> = layout.pieces.map((p) => {
    const s = p.variants[p.v];
    return {
      ring: s.ring.map((q) => ({ x: q.x + p.x, y: q.y + p.y })),
      x0: s.bx0 + p.x,
      y0: s.by0 + p.y,
      x1: s.bx1 + p.x,
      y1: s.by1 + p.y,
      fixed: !!p.fixed,
    };
  });
  const slack = 1e-7;
  for (const r of rings)
    if (!r.fixed && (r.x0 < a.x0 - slack || r.y0 < a.y0 - slack || r.x1 > a.x1 + slack || r.y1 > a.y1 + slack)) return false;
  for (let i = 0; i < rings.length; i++) {
    for (let j = i + 1; j < rings.length; j++) {
      const p = rings[i],
        q = rings[j];
      if (p.fixed && q.fixed) continue;
      if (p.x0 > q.x1 + gap || q.x0 > p.x1 + gap || p.y0 > q.y1 + gap || q.y0 > p.y1 + gap) continue;
      if (gap > 0 ? closerThan(p.ring, q.ring, gap - 1e-6) : overlaps(p.ring, q.ring)) return false;
    }
  }
  return true;
}

export type { Area };
