// Connected components of a binary mask (8-connected), by two-pass union-find labelling.
import type { RowRuns } from './runs';
import { complementRuns, runsOfMask, selectRuns } from './runs';

export type Component = { label: number; area: number; minX: number; minY: number; maxX: number; maxY: number };

/**
 * Labels runs of set pixels row by row and joins runs that touch the previous row's runs
 * (8-connected) with union-find, then paints the labels. Working on runs instead of pixels keeps
 * it fast on large solid art.
 */
type Runs = { count: number; x0: Int32Array; x1: Int32Array; y: Int32Array; label: Int32Array };

export function labelComponents(
  mask: Uint8Array,
  width: number,
  height: number,
): { labels: Int32Array; components: Component[]; runs: Runs } {
  const { components, runs } = labelRuns(mask, width, height);
  const labels = new Int32Array(width * height);
  for (let i = 0; i < runs.count; i++) labels.fill(runs.label[i], runs.y[i] * width + runs.x0[i], runs.y[i] * width + runs.x1[i] + 1);
  return { labels, components, runs };
}

/** Clears (sets to 0) every pixel of the components whose label is in `labels`. */
export function clearComponents(runs: Runs, labels: Set<number>, clear: (start: number, end: number, y: number) => void) {
  for (let i = 0; i < runs.count; i++) if (labels.has(runs.label[i])) clear(runs.x0[i], runs.x1[i] + 1, runs.y[i]);
}

/** The components of a mask and its runs of set pixels, each run with its component label. */
function labelRuns(mask: Uint8Array, width: number, height: number): { components: Component[]; runs: Runs } {
  return labelRowRuns(runsOfMask(mask, width, height));
}

/** The components of a set given as runs (8-connected), each run with its component label. */
export function labelRowRuns(rr: RowRuns, connectivity: 4 | 8 = 8): { components: Component[]; runs: Runs } {
  const reach = connectivity === 8 ? 1 : 0;
  const { height, rowStart } = rr;
  const count = rowStart[height];
  const runX0 = rr.starts.slice(0, count),
    runX1 = new Int32Array(count),
    runY = new Int32Array(count);
  for (let y = 0; y < height; y++) {
    for (let k = rowStart[y]; k < rowStart[y + 1]; k++) {
      runX1[k] = rr.ends[k] - 1;
      runY[k] = y;
    }
  }

  const parent = new Int32Array(count);
  for (let i = 0; i < count; i++) parent[i] = i;
  const find = (a: number) => {
    while (parent[a] !== a) {
      parent[a] = parent[parent[a]];
      a = parent[a];
    }
    return a;
  };
  for (let y = 1; y < height; y++) {
    let p = rowStart[y - 1];
    const pEnd = rowStart[y];
    for (let c = rowStart[y]; c < rowStart[y + 1]; c++) {
      // Skip previous-row runs that end before this run's reach (x0 − 1).
      while (p < pEnd && runX1[p] < runX0[c] - reach) p++;
      for (let q = p; q < pEnd && runX0[q] <= runX1[c] + reach; q++) {
        const a = find(q),
          b = find(c);
        if (a !== b) parent[Math.max(a, b)] = Math.min(a, b);
      }
    }
  }

  const compact = new Int32Array(count);
  const components: Component[] = [];
  for (let i = 0; i < count; i++) {
    const root = find(i);
    if (root === i) {
      components.push({ label: components.length + 1, area: 0, minX: Infinity, minY: Infinity, maxX: -1, maxY: -1 });
      compact[i] = components.length;
    } else {
      compact[i] = compact[root];
    }
    const label = compact[i];
    const c = components[label - 1];
    const x0 = runX0[i],
      x1 = runX1[i],
      y = runY[i];
    c.area += x1 - x0 + 1;
    if (x0 < c.minX) c.minX = x0;
    if (x1 > c.maxX) c.maxX = x1;
    if (y < c.minY) c.minY = y;
    if (y > c.maxY) c.maxY = y;
  }
  return { components, runs: { count, x0: runX0, x1: runX1, y: runY, label: compact } };
}

/** Marks pixels not reachable from the image edge through zeros (the holes) as filled. */
export function fillHoles(mask: Uint8Array, width: number, height: number): Uint8Array {
  const outside = new Uint8Array(width * height);
  const stack = new Int32Array(width * height);
  let top = 0;
  const push = (i: number) => {
    if (!mask[i] && !outside[i]) {
      outside[i] = 1;
      stack[top++] = i;
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
  while (top > 0) {
    const i = stack[--top];
    const x = i % width;
    if (x > 0) push(i - 1);
    if (x < width - 1) push(i + 1);
    if (i >= width) push(i - width);
    if (i < width * (height - 1)) push(i + width);
  }
  const filled = outside; // reuse: flip in place
  for (let i = 0; i < filled.length; i++) filled[i] = outside[i] ? 0 : 1;
  return filled;
}

/**
 * A set with its holes filled, as runs: the holes are the components of the outside (4-connected
 * to the set's 8) that do not reach the canvas edge. Returns the filled set and the holes alone.
 */
export function fillHoleRuns(set: RowRuns): { filled: RowRuns; holes: RowRuns } {
  const outside = complementRuns(set);
  const { components, runs } = labelRowRuns(outside, 4);
  const { width, height } = set;
  const open = new Set(
    components.filter((c) => c.minX === 0 || c.minY === 0 || c.maxX === width - 1 || c.maxY === height - 1).map((c) => c.label),
  );
  const reachesEdge = selectRuns(outside, (k) => open.has(runs.label[k]));
  return { filled: complementRuns(reachesEdge), holes: selectRuns(outside, (k) => !open.has(runs.label[k])) };
}
