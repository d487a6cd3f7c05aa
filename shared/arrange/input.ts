// What the nester refuses before it starts: an area, margin or gap that leaves no room (thrown, in
// the maker's words), and single pieces it cannot use (reported by name, the rest still arranged).
import { normaliseDegrees } from '../units';
import { area } from '../geometry/polygon';
import type { Ring } from '../geometry/polygon';
import type { ArrangeItem, ArrangeResult, RotateMode } from './nester';

/** A request the nester cannot work with at all (the message is the maker's). */
export class ArrangeInputError extends Error {}

/** The turns a rotate mode allows, in degrees from 0 to under 360. */
export function rotationsOf(mode: RotateMode): number[] {
  if (mode === 'none') return [0];
  if (mode === '90') return [0, 90, 180, 270];
  if ('set' in mode) return mode.set.length ? [...new Set(mode.set.map(normaliseDegrees))] : [0];
  const step = Math.max(1, mode.step);
  return Array.from({ length: Math.max(1, Math.floor(360 / step)) }, (_, i) => i * step);
}

export function checkInput(
  items: ArrangeItem[],
  o: { width: number; height: number; margin: number; gap: number },
): { usable: ArrangeItem[]; unplaced: ArrangeResult['unplaced'] } {
  if (!(o.width > 0 && o.height > 0)) throw new ArrangeInputError('The print area needs a width and a height.');
  if (2 * o.margin >= Math.min(o.width, o.height))
    throw new ArrangeInputError(`A margin of ${o.margin} mm leaves no room on a ${o.width} × ${o.height} mm print area.`);
  if (!(o.gap >= 0)) throw new ArrangeInputError('The gap between cut lines cannot be negative.');
  if (o.gap >= Math.min(o.width, o.height) - 2 * o.margin)
    throw new ArrangeInputError(`A gap of ${o.gap} mm leaves no room on a ${o.width} × ${o.height} mm print area.`);
  const unplaced: ArrangeResult['unplaced'] = [];
  const usable = items.filter((item) => {
    const name = item.name ?? item.key;
    if (!(item.count > 0) || !Number.isInteger(item.count)) {
      unplaced.push({ key: item.key, name, count: 0, reason: `${name}: the quantity must be a whole number above zero.` });
      return false;
    }
    const pts = item.outline.points;
    if (pts.length < 3 || pts.some((p) => !Number.isFinite(p.x) || !Number.isFinite(p.y))) {
      unplaced.push({ key: item.key, name, count: item.count, reason: `${name}: its cut line is not a closed shape.` });
      return false;
    }
    if (selfIntersects(pts)) {
      unplaced.push({ key: item.key, name, count: item.count, reason: `${name}: its cut line crosses itself, so no blade can follow it.` });
      return false;
    }
    if (area(pts) <= 0) {
      unplaced.push({ key: item.key, name, count: item.count, reason: `${name}: its cut line encloses no area.` });
      return false;
    }
    return true;
  });
  return { usable, unplaced };
}

/** Whether a ring's edges cross (other than neighbours sharing their end point). */
function selfIntersects(ring: Ring): boolean {
  const n = ring.length;
  if (n > 2000) return false; // checked by the outline engine already; not worth O(n²) here
  const cross = (a: Ring[number], b: Ring[number], c: Ring[number]) => (b.x - a.x) * (c.y - a.y) - (b.y - a.y) * (c.x - a.x);
  for (let i = 0; i < n; i++) {
    const a = ring[i],
      b = ring[(i + 1) % n];
    for (let j = i + 2; j < n; j++) {
      if (i === 0 && j === n - 1) continue;
      const c = ring[j],
        d = ring[(j + 1) % n];
      const d1 = cross(a, b, c),
        d2 = cross(a, b, d),
        d3 = cross(c, d, a),
        d4 = cross(c, d, b);
      if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) return true;
    }
  }
  return false;
}
