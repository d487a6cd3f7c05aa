// One move of the separator: the spot (and allowed turn) where a piece overlaps the others least,
// weighted: random spots over the whole area and near where it is, the best refined by coordinate
// descent (steps along x and y that grow after a gain and halve after none).
import type { Layout } from './separator';

type Spot = { v: number; x: number; y: number; c: number };

export function bestSpot(layout: Layout, i: number, random: () => number, uniform: number, nearby: number): Spot {
  const p = layout.pieces[i];
  let best = { v: p.v, x: p.x, y: p.y, c: layout.cost(i, p.v, p.x, p.y) };
  const consider = (v: number, x: number, y: number) => {
    const c = layout.cost(i, v, x, y, best.c);
    if (c < best.c) best = { v, x, y, c };
  };
  const variants = p.variants.length;
  for (let k = 0; k < uniform && best.c > 0; k++) {
    const v = Math.floor(random() * variants),
      r = layout.range(i, v);
    if (r) consider(v, r.x0 + random() * (r.x1 - r.x0), r.y0 + random() * (r.y1 - r.y0));
  }
  const s = p.variants[p.v],
    w = s.bx1 - s.bx0,
    h = s.by1 - s.by0;
  for (let k = 0; k < nearby && best.c > 0; k++) {
    const v = random() < 0.8 ? p.v : Math.floor(random() * variants),
      r = layout.range(i, v);
    if (!r) continue;
    const x = Math.min(r.x1, Math.max(r.x0, p.x + (random() - 0.5) * w)),
      y = Math.min(r.y1, Math.max(r.y0, p.y + (random() - 0.5) * h));
    consider(v, x, y);
  }
  if (best.c > 0) best = descend(layout, i, best, Math.max(w, h));
  return best;
}

/** Coordinate descent: steps along x and y, larger after a gain, halved after none. */
function descend(layout: Layout, i: number, start: Spot, size: number): Spot {
  const r = layout.range(i, start.v)!;
  let { x, y, c } = start;
  let step = size * 0.1;
  const floor = size * 0.002;
  let guard = 0;
  while (step > floor && c > 0 && guard++ < 200) {
    let gained = false;
    for (const [dx, dy] of [
      [step, 0],
      [-step, 0],
      [0, step],
      [0, -step],
    ]) {
      const nx = Math.min(r.x1, Math.max(r.x0, x + dx)),
        ny = Math.min(r.y1, Math.max(r.y0, y + dy));
      const nc = layout.cost(i, start.v, nx, ny, c);
      if (nc < c) {
        x = nx;
        y = ny;
        c = nc;
        gained = true;
        break;
      }
    }
    step = gained ? step * 1.5 : step / 2;
  }
  return { v: start.v, x, y, c };
}
