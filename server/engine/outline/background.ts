// Flat-background removal for art without transparency: the colour around the image edge is
// flooded inwards (4-connected) within a tolerance and made transparent.

export type Rgb = { r: number; g: number; b: number };

export function parseHex(hex: string): Rgb {
  const v = Number.parseInt(hex.replace('#', ''), 16);
  return { r: (v >> 16) & 255, g: (v >> 8) & 255, b: v & 255 };
}

const distance = (data: Uint8Array, i: number, c: Rgb) => Math.hypot(data[i] - c.r, data[i + 1] - c.g, data[i + 2] - c.b);

function edgeIndices(width: number, height: number): number[] {
  const out: number[] = [];
  for (let x = 0; x < width; x++) out.push(x, (height - 1) * width + x);
  for (let y = 1; y < height - 1; y++) out.push(y * width, y * width + width - 1);
  return out;
}

/**
 * The edge colour when at least 60 % of edge pixels lie within `tolerance` of the per-channel
 * median; null when the edge is busy (then the whole image is the art).
 */
export function detectBackground(rgba: Uint8Array, width: number, height: number, tolerance: number): Rgb | null {
  const edge = edgeIndices(width, height);
  const median = (channel: number) => {
    const values = edge.map((i) => rgba[i * 4 + channel]).sort((a, b) => a - b);
    return values[values.length >> 1];
  };
  const colour = { r: median(0), g: median(1), b: median(2) };
  const near = edge.filter((i) => distance(rgba, i * 4, colour) <= tolerance).length;
  return near >= 0.6 * edge.length ? colour : null;
}

/** The pixels flooded in from the image edge: those within `tolerance` of `colour` (or already clear) reachable 4-connected from the edge. */
function floodFromEdge(rgba: Uint8Array, width: number, height: number, colour: Rgb, tolerance: number): Uint8Array {
  const region = new Uint8Array(width * height);
  const seen = new Uint8Array(width * height);
  const stack: number[] = [];
  const visit = (p: number) => {
    if (seen[p]) return;
    seen[p] = 1;
    if (rgba[p * 4 + 3] === 0 || distance(rgba, p * 4, colour) <= tolerance) stack.push(p);
  };
  for (const p of edgeIndices(width, height)) visit(p);
  while (stack.length) {
    const p = stack.pop()!;
    region[p] = 1;
    const x = p % width,
      y = (p - x) / width;
    if (x > 0) visit(p - 1);
    if (x < width - 1) visit(p + 1);
    if (y > 0) visit(p - width);
    if (y < height - 1) visit(p + width);
  }
  return region;
}

/** Grows a mask by `r` px in the chessboard metric: a (2r+1)-wide max across, then down. */
function dilate(mask: Uint8Array, width: number, height: number, r: number): Uint8Array {
  const across = new Uint8Array(mask.length);
  for (let y = 0; y < height; y++) {
    const row = y * width;
    for (let x = 0; x < width; x++) {
      if (!mask[row + x]) continue;
      for (let xx = Math.max(0, x - r); xx <= Math.min(width - 1, x + r); xx++) across[row + xx] = 1;
    }
  }
  const out = new Uint8Array(mask.length);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      if (!across[y * width + x]) continue;
      for (let yy = Math.max(0, y - r); yy <= Math.min(height - 1, y + r); yy++) out[yy * width + x] = 1;
    }
  }
  return out;
}

/** What a removal does, per pixel: 0 kept, 1 background, 2 art it takes away (see planRemoval). */
export type RemovalPlan = { map: Uint8Array; removed: number; taken: number; art: number; share: number; reference: number };

/** Edge pixels spread this far from the background colour are its own noise (JPEG, paper grain), not art. */
const FRINGE_PX = 2;

/**
 * Plans removing the background `colour` flooded in from the edges at `tolerance`, and measures what
 * of the art it would take. The reference flood uses only the background's own spread (the 90th
 * percentile of the edge pixels' distance from the colour, at least 6); pixels the chosen tolerance
 * adds beyond it, further than 2 px from that background (anti-aliased edges are 1–2 px), differ
 * from the background and are not joined to the image edge through it: they are art being taken.
 * `share` is their part of the art (everything the reference flood keeps).
 */
export function planRemoval(rgba: Uint8Array, width: number, height: number, colour: Rgb, tolerance: number): RemovalPlan {
  const region = floodFromEdge(rgba, width, height, colour, tolerance);
  const spread = edgeIndices(width, height)
    .map((i) => distance(rgba, i * 4, colour))
    .filter((d) => d <= tolerance)
    .sort((a, b) => a - b);
  const reference = Math.min(tolerance, Math.max(6, spread.length ? spread[Math.floor(0.9 * (spread.length - 1))] + 2 : 6));
  const strict = reference >= tolerance ? region : floodFromEdge(rgba, width, height, colour, reference);
  const near = strict === region ? region : dilate(strict, width, height, FRINGE_PX);
  const map = new Uint8Array(width * height);
  let removed = 0,
    taken = 0,
    art = 0;
  for (let i = 0; i < map.length; i++) {
    if (!strict[i] && rgba[i * 4 + 3] > 0) art++;
    if (!region[i]) continue;
    removed++;
    map[i] = near[i] ? 1 : 2;
    if (!near[i]) taken++;
  }
  return { map, removed, taken, art, share: art > 0 ? taken / art : 0, reference };
}

/** Makes the background flooded in from the edges transparent; returns the plan it carried out. */
export function removeBackground(rgba: Uint8Array, width: number, height: number, colour: Rgb, tolerance: number): RemovalPlan {
  const plan = planRemoval(rgba, width, height, colour, tolerance);
  for (let i = 0; i < plan.map.length; i++) if (plan.map[i]) rgba[i * 4 + 3] = 0;
  return plan;
}
