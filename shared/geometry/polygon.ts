// Plain polygon helpers shared by the outline engine, the editor and the exporters.
// A ring is a closed list of points without the first point repeated at the end.

export type Point = { x: number; y: number };
export type Ring = Point[];
export type Box = { x: number; y: number; width: number; height: number };

/** Shoelace area. Positive when the ring runs clockwise on screen (y axis pointing down). */
export function signedArea(ring: Ring): number {
  let sum = 0;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    sum += ring[j].x * ring[i].y - ring[i].x * ring[j].y;
  }
  return sum / 2;
}

export const area = (ring: Ring) => Math.abs(signedArea(ring));

export function perimeter(ring: Ring): number {
  let sum = 0;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    sum += Math.hypot(ring[i].x - ring[j].x, ring[i].y - ring[j].y);
  }
  return sum;
}

export function boundingBox(ring: Ring): Box {
  let minX = Infinity,
    minY = Infinity,
    maxX = -Infinity,
    maxY = -Infinity;
  for (const p of ring) {
    if (p.x < minX) minX = p.x;
    if (p.y < minY) minY = p.y;
    if (p.x > maxX) maxX = p.x;
    if (p.y > maxY) maxY = p.y;
  }
  return { x: minX, y: minY, width: maxX - minX, height: maxY - minY };
}

/** Returns the ring running clockwise on screen (y down), the winding Sheetsmith stores. */
export function clockwise(ring: Ring): Ring {
  return signedArea(ring) >= 0 ? ring : [...ring].reverse();
}

function orientation(a: Point, b: Point, c: Point): number {
  const v = (b.x - a.x) * (c.y - a.y) - (b.y - a.y) * (c.x - a.x);
  return v > 1e-12 ? 1 : v < -1e-12 ? -1 : 0;
}

function onSegment(a: Point, b: Point, p: Point): boolean {
  return (
    Math.min(a.x, b.x) - 1e-12 <= p.x &&
    p.x <= Math.max(a.x, b.x) + 1e-12 &&
    Math.min(a.y, b.y) - 1e-12 <= p.y &&
    p.y <= Math.max(a.y, b.y) + 1e-12
  );
}

function segmentsIntersect(a: Point, b: Point, c: Point, d: Point): boolean {
  // Disjoint boxes never meet; this also keeps nearly collinear, far-apart edges from being
  // misjudged by rounding in the orientation tests.
  if (
    Math.max(a.x, b.x) < Math.min(c.x, d.x) - 1e-12 ||
    Math.max(c.x, d.x) < Math.min(a.x, b.x) - 1e-12 ||
    Math.max(a.y, b.y) < Math.min(c.y, d.y) - 1e-12 ||
    Math.max(c.y, d.y) < Math.min(a.y, b.y) - 1e-12
  ) {
    return false;
  }
  const o1 = orientation(a, b, c),
    o2 = orientation(a, b, d),
    o3 = orientation(c, d, a),
    o4 = orientation(c, d, b);
  if (o1 !== o2 && o3 !== o4) return true;
  return (
    (o1 === 0 && onSegment(a, b, c)) ||
    (o2 === 0 && onSegment(a, b, d)) ||
    (o3 === 0 && onSegment(c, d, a)) ||
    (o4 === 0 && onSegment(c, d, b))
  );
}

/**
 * True when no two non-adjacent edges of the ring touch or cross. Edges are bucketed on a grid so
 * the check stays near-linear for the few thousand vertices a cut line has.
 */
export function isSimple(ring: Ring): boolean {
  const n = ring.length;
  if (n < 3) return false;
  const box = boundingBox(ring);
  const cells = Math.max(1, Math.ceil(Math.sqrt(n)));
  const cw = box.width / cells || 1,
    ch = box.height / cells || 1;
  const grid = new Map<number, number[]>();
  const cell = (v: number, min: number, size: number) => Math.min(cells - 1, Math.max(0, Math.floor((v - min) / size)));
  for (let i = 0; i < n; i++) {
    const a = ring[i],
      b = ring[(i + 1) % n];
    const x0 = cell(Math.min(a.x, b.x), box.x, cw),
      x1 = cell(Math.max(a.x, b.x), box.x, cw);
    const y0 = cell(Math.min(a.y, b.y), box.y, ch),
      y1 = cell(Math.max(a.y, b.y), box.y, ch);
    for (let gx = x0; gx <= x1; gx++) {
      for (let gy = y0; gy <= y1; gy++) {
        const key = gy * cells + gx;
        const list = grid.get(key);
        if (list) list.push(i);
        else grid.set(key, [i]);
      }
    }
  }
  const checked = new Set<number>();
  for (const list of grid.values()) {
    for (let s = 0; s < list.length; s++) {
      for (let t = s + 1; t < list.length; t++) {
        const i = Math.min(list[s], list[t]),
          j = Math.max(list[s], list[t]);
        if (j - i <= 1 || (i === 0 && j === n - 1)) continue; // neighbours share a vertex
        const key = i * n + j;
        if (checked.has(key)) continue;
        checked.add(key);
        if (segmentsIntersect(ring[i], ring[(i + 1) % n], ring[j], ring[(j + 1) % n])) return false;
      }
    }
  }
  return true;
}

/** SVG path data for a closed ring, e.g. "M1 2L3 4L5 6Z", with `digits` decimals. */
export function ringToSvgPath(ring: Ring, digits = 3): string {
  const f = (v: number) => Number(v.toFixed(digits)).toString();
  return ring.map((p, i) => `${i === 0 ? 'M' : 'L'}${f(p.x)} ${f(p.y)}`).join('') + 'Z';
}

export function translate(ring: Ring, dx: number, dy: number): Ring {
  return ring.map((p) => ({ x: p.x + dx, y: p.y + dy }));
}

export function scale(ring: Ring, factor: number): Ring {
  return ring.map((p) => ({ x: p.x * factor, y: p.y * factor }));
}
