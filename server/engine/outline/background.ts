// Flat-background removal for art without transparency: the colour around the image edge is
// flooded inwards (4-connected) within a tolerance and made transparent.

export type Rgb = { r: number; g: number; b: number };

export function parseHex(hex: string): Rgb {
  const v = Number.parseInt(hex.replace('#', ''), 16);
  return { r: (v >> 16) & 255, g: (v >> 8) & 255, b: v & 255 };
}

const distance = (data: Uint8Array, i: number, c: Rgb) =>
  Math.hypot(data[i] - c.r, data[i + 1] - c.g, data[i + 2] - c.b);

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

/** Makes the background flooded in from the edges transparent; returns how many pixels it cleared. */
export function removeBackground(rgba: Uint8Array, width: number, height: number, colour: Rgb, tolerance: number): number {
  const seen = new Uint8Array(width * height);
  const stack: number[] = [];
  const visit = (p: number) => {
    if (seen[p]) return;
    seen[p] = 1;
    if (rgba[p * 4 + 3] === 0 || distance(rgba, p * 4, colour) <= tolerance) stack.push(p);
  };
  for (const p of edgeIndices(width, height)) visit(p);
  let cleared = 0;
  while (stack.length) {
    const p = stack.pop()!;
    rgba[p * 4 + 3] = 0;
    cleared++;
    const x = p % width, y = (p - x) / width;
    if (x > 0) visit(p - 1);
    if (x < width - 1) visit(p + 1);
    if (y > 0) visit(p - width);
    if (y < height - 1) visit(p + width);
  }
  return cleared;
}
