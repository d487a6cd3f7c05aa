// Joins separate islands into one piece: the islands' grown regions are linked by a minimum
// spanning tree (Prim) of short bridges drawn into the art mask between their closest pixels.

type Pixel = { x: number; y: number };

export function boundaryPixels(labels: Int32Array, mask: Uint8Array, width: number, height: number, groups: number): Pixel[][] {
  const out: Pixel[][] = Array.from({ length: groups }, () => []);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const i = y * width + x;
      if (!mask[i] || !labels[i]) continue;
      const edge =
        x === 0 || y === 0 || x === width - 1 || y === height - 1 || !mask[i - 1] || !mask[i + 1] || !mask[i - width] || !mask[i + width];
      if (edge) out[labels[i] - 1].push({ x, y });
    }
  }
  // Bound the pairwise search: every n-th boundary pixel is enough to find a good bridge.
  return out.map((list) => {
    const step = Math.max(1, Math.floor(list.length / 1500));
    return list.filter((_p, k) => k % step === 0);
  });
}

export function closestPair(a: Pixel[], b: Pixel[]): { p: Pixel; q: Pixel; d2: number } {
  let best = { p: a[0], q: b[0], d2: Infinity };
  for (const p of a) {
    for (const q of b) {
      const d2 = (p.x - q.x) ** 2 + (p.y - q.y) ** 2;
      if (d2 < best.d2) best = { p, q, d2 };
    }
  }
  return best;
}

function drawCapsule(mask: Uint8Array, width: number, height: number, p: Pixel, q: Pixel, radius: number) {
  const minX = Math.max(0, Math.floor(Math.min(p.x, q.x) - radius)),
    maxX = Math.min(width - 1, Math.ceil(Math.max(p.x, q.x) + radius));
  const minY = Math.max(0, Math.floor(Math.min(p.y, q.y) - radius)),
    maxY = Math.min(height - 1, Math.ceil(Math.max(p.y, q.y) + radius));
  const dx = q.x - p.x,
    dy = q.y - p.y,
    len2 = dx * dx + dy * dy || 1;
  for (let y = minY; y <= maxY; y++) {
    for (let x = minX; x <= maxX; x++) {
      const t = Math.max(0, Math.min(1, ((x - p.x) * dx + (y - p.y) * dy) / len2));
      if ((x - p.x - t * dx) ** 2 + (y - p.y - t * dy) ** 2 <= radius * radius) mask[y * width + x] = 1;
    }
  }
}

/**
 * `groupLabels` labels art pixels by the island group they belong to (1..groups). Draws bridges of
 * the given radius into `mask` so every group is linked; returns how many bridges were drawn.
 */
export function bridgeIslands(
  mask: Uint8Array,
  groupLabels: Int32Array,
  groups: number,
  width: number,
  height: number,
  radius: number,
): number {
  const boundary = boundaryPixels(groupLabels, mask, width, height, groups);
  const inTree = new Set<number>([0]);
  let bridges = 0;
  while (inTree.size < groups) {
    let best: { p: Pixel; q: Pixel; d2: number; g: number } | null = null;
    for (const t of inTree) {
      for (let g = 0; g < groups; g++) {
        if (inTree.has(g) || boundary[g].length === 0 || boundary[t].length === 0) continue;
        const pair = closestPair(boundary[t], boundary[g]);
        if (!best || pair.d2 < best.d2) best = { ...pair, g };
      }
    }
    if (!best) break;
    drawCapsule(mask, width, height, best.p, best.q, radius);
    inTree.add(best.g);
    bridges++;
  }
  return bridges;
}
