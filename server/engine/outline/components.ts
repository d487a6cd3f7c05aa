// Connected components of a binary mask (8-connected), by two-pass union-find labelling.

export type Component = { label: number; area: number; minX: number; minY: number; maxX: number; maxY: number };

export function labelComponents(mask: Uint8Array, width: number, height: number): { labels: Int32Array; components: Component[] } {
  const labels = new Int32Array(width * height);
  const parent: number[] = [0];
  const find = (a: number) => {
    while (parent[a] !== a) {
      parent[a] = parent[parent[a]];
      a = parent[a];
    }
    return a;
  };
  const union = (a: number, b: number) => {
    const ra = find(a), rb = find(b);
    if (ra !== rb) parent[Math.max(ra, rb)] = Math.min(ra, rb);
  };
  for (let y = 0; y < height; y++) {
    const row = y * width;
    for (let x = 0; x < width; x++) {
      const i = row + x;
      if (!mask[i]) continue;
      // Already-visited neighbours: W, NW, N, NE.
      const w = x > 0 ? labels[i - 1] : 0;
      const nw = x > 0 && y > 0 ? labels[i - width - 1] : 0;
      const n = y > 0 ? labels[i - width] : 0;
      const ne = x < width - 1 && y > 0 ? labels[i - width + 1] : 0;
      let label = w || nw || n || ne;
      if (!label) {
        label = parent.length;
        parent.push(label);
      } else {
        if (w) union(label, w);
        if (nw) union(label, nw);
        if (n) union(label, n);
        if (ne) union(label, ne);
      }
      labels[i] = label;
    }
  }
  const byRoot = new Map<number, Component>();
  const compact = new Int32Array(parent.length);
  for (let l = 1; l < parent.length; l++) {
    const root = find(l);
    if (!byRoot.has(root)) byRoot.set(root, { label: byRoot.size + 1, area: 0, minX: Infinity, minY: Infinity, maxX: -1, maxY: -1 });
    compact[l] = byRoot.get(root)!.label;
  }
  const components = [...byRoot.values()];
  for (let y = 0; y < height; y++) {
    const row = y * width;
    for (let x = 0; x < width; x++) {
      const i = row + x;
      if (!labels[i]) continue;
      const label = compact[labels[i]];
      labels[i] = label;
      const c = components[label - 1];
      c.area++;
      if (x < c.minX) c.minX = x;
      if (x > c.maxX) c.maxX = x;
      if (y < c.minY) c.minY = y;
      if (y > c.maxY) c.maxY = y;
    }
  }
  return { labels, components };
}

/** Marks pixels not reachable from the image edge through zeros (the holes) as filled. */
export function fillHoles(mask: Uint8Array, width: number, height: number): Uint8Array {
  const outside = new Uint8Array(width * height);
  const stack: number[] = [];
  const push = (i: number) => {
    if (!mask[i] && !outside[i]) {
      outside[i] = 1;
      stack.push(i);
    }
  };
  for (let x = 0; x < width; x++) {
    push(x);
    push((height - 1) * width + x);
  }
  for (let y = 0; y < height; y++) {
    push(y * width);
    push(y * width + width - 1);
  }
  while (stack.length) {
    const i = stack.pop()!;
    const x = i % width, y = (i - x) / width;
    if (x > 0) push(i - 1);
    if (x < width - 1) push(i + 1);
    if (y > 0) push(i - width);
    if (y < height - 1) push(i + width);
  }
  const filled = new Uint8Array(width * height);
  for (let i = 0; i < filled.length; i++) filled[i] = outside[i] ? 0 : 1;
  return filled;
}
