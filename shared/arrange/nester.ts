// Auto-arrange: packs real cut-line shapes (not their boxes) into the print area with a minimum gap
// between cut lines and a margin to the edge. Collision is tested on a fine raster of each shape
// grown by half the gap, then confirmed by the exact polygon distance; positions are tried top-left
// first (a bottom-left-fill rule, y down). An improvement search reorders pieces within a time or
// iteration budget and keeps the best layout; a seed makes it repeatable.
import type { Ring } from '../geometry/polygon';
import { area, boundingBox } from '../geometry/polygon';
import { cutLineDistance } from '../sheet/placement';
import { overlaps } from '../geometry/overlap';
import { seeded } from './prng';
import type { ShapeMask } from './raster';
import { shapeMask } from './raster';

export type Outline = { points: Ring; widthMm: number; heightMm: number };
export type RotateMode = 'none' | '90' | { step: number };

export type ArrangeItem = { key: string; name?: string; outline: Outline; count: number; priority?: number; rotate?: RotateMode };
export type LockedPiece = { key: string; x: number; y: number; rotation: number; outline: Outline };

export type ArrangeOptions = {
  width: number;
  height: number;
  gap?: number;
  margin?: number;
  rotate?: RotateMode;
  fill?: boolean;
  timeMs?: number;
  maxIterations?: number;
  seed?: number;
  maxSheets?: number;
  /** Search grid cell (mm). */
  cell?: number;
};

export type Placement = { key: string; sheet: number; x: number; y: number; rotation: number };
export type ArrangeProgress = { iteration: number; placed: number; elapsedMs: number };
export type ArrangeResult = {
  placements: Placement[];
  sheets: number;
  requested: number;
  placed: number;
  unplaced: Array<{ key: string; name: string; count: number; reason: string }>;
  /** Sum of cut-line areas / print area, per sheet. */
  areaUsed: number[];
  iterations: number;
  ms: number;
};

export class ArrangeInputError extends Error {}

const rotationsOf = (mode: RotateMode): number[] =>
  mode === 'none' ? [0] : mode === '90' ? [0, 90, 180, 270] : Array.from({ length: Math.max(1, Math.floor(360 / Math.max(1, mode.step))) }, (_, i) => i * Math.max(1, mode.step));

type Shape = { item: ArrangeItem; masks: ShapeMask[]; areaMm2: number };

/** One sheet's occupancy: blocked cells plus per-row prefix sums, and the placed rings for exact checks. */
class Board {
  readonly w: number;
  readonly h: number;
  private readonly grid: Uint8Array;
  private readonly prefix: Int32Array;
  readonly rings: Array<{ ring: Ring; box: ReturnType<typeof boundingBox> }> = [];
  usedArea = 0;

  constructor(readonly opts: Required<Pick<ArrangeOptions, 'width' | 'height' | 'gap' | 'margin' | 'cell'>>) {
    this.w = Math.ceil(opts.width / opts.cell);
    this.h = Math.ceil(opts.height / opts.cell);
    this.grid = new Uint8Array(this.w * this.h);
    this.prefix = new Int32Array((this.w + 1) * this.h);
  }

  private rowBlocked(y: number, a: number, b: number): boolean {
    if (y < 0 || y >= this.h) return false;
    const lo = Math.max(0, a), hi = Math.min(this.w - 1, b);
    if (lo > hi) return false;
    const base = y * (this.w + 1);
    return this.prefix[base + hi + 1] - this.prefix[base + lo] > 0;
  }

  rasterFree(mask: ShapeMask, cx: number, cy: number): boolean {
    const rows = mask.rows;
    // Check the middle row first: in a crowded area it is the likeliest to collide.
    const mid = rows.length >> 1;
    for (let k = 0; k < rows.length; k++) {
      const j = k % 2 === 0 ? mid + k / 2 : mid - (k + 1) / 2;
      const run = rows[j];
      if (run && this.rowBlocked(cy + mask.offsetY + j, cx + mask.offsetX + run.x0, cx + mask.offsetX + run.x1)) return false;
    }
    return true;
  }

  exactFree(ring: Ring): boolean {
    const box = boundingBox(ring);
    const gap = this.opts.gap;
    for (const placed of this.rings) {
      const b = placed.box;
      if (box.x > b.x + b.width + gap || b.x > box.x + box.width + gap || box.y > b.y + b.height + gap || b.y > box.y + box.height + gap) continue;
      if (gap > 0 ? cutLineDistance(ring, placed.ring, gap) < gap - 1e-6 : overlaps(ring, placed.ring)) return false;
    }
    return true;
  }

  place(mask: ShapeMask, x: number, y: number, ring: Ring, areaMm2: number) {
    const cx = Math.round(x / this.opts.cell), cy = Math.round(y / this.opts.cell);
    for (let j = 0; j < mask.rows.length; j++) {
      const run = mask.rows[j];
      const row = cy + mask.offsetY + j;
      if (!run || row < 0 || row >= this.h) continue;
      const lo = Math.max(0, cx + mask.offsetX + run.x0), hi = Math.min(this.w - 1, cx + mask.offsetX + run.x1);
      if (lo > hi) continue;
      this.grid.fill(1, row * this.w + lo, row * this.w + hi + 1);
      const base = row * (this.w + 1);
      for (let i = 0; i < this.w; i++) this.prefix[base + i + 1] = this.prefix[base + i] + this.grid[row * this.w + i];
    }
    this.rings.push({ ring, box: boundingBox(ring) });
    this.usedArea += areaMm2;
  }

  /** The first free spot (top-left first) for the shape over its rotations, or null. */
  find(shape: Shape): { mask: ShapeMask; x: number; y: number; ring: Ring } | null {
    const { cell, margin, width, height } = this.opts;
    let best: { mask: ShapeMask; cx: number; cy: number; ring: Ring; score: number } | null = null;
    for (const mask of shape.masks) {
      const xMin = Math.ceil((margin - mask.minX) / cell), xMax = Math.floor((width - margin - mask.maxX) / cell);
      const yMin = Math.ceil((margin - mask.minY) / cell), yMax = Math.floor((height - margin - mask.maxY) / cell);
      const yStop = best ? Math.min(yMax, Math.floor(best.score / (this.w + 1))) : yMax;
      search: for (let cy = yMin; cy <= yStop; cy++) {
        for (let cx = xMin; cx <= xMax; cx++) {
          const score = cy * (this.w + 1) + cx;
          if (best && score >= best.score) break search;
          if (!this.rasterFree(mask, cx, cy)) continue;
          const ring = mask.ring.map((p) => ({ x: p.x + cx * cell, y: p.y + cy * cell }));
          if (!this.exactFree(ring)) continue;
          best = { mask, cx, cy, ring, score };
          break search;
        }
      }
    }
    return best ? this.compact(best) : null;
  }

  /**
   * Slides a found spot up (straight or along a slope) and left in steps finer than the grid while the exact distance and
   * the margin still allow it: the grid finds the place, the exact geometry tightens it.
   */
  private compact(spot: { mask: ShapeMask; cx: number; cy: number; ring: Ring }) {
    const { cell, margin, width, height } = this.opts;
    let x = spot.cx * cell, y = spot.cy * cell;
    const fits = (nx: number, ny: number) =>
      nx + spot.mask.minX >= margin - 1e-9 && ny + spot.mask.minY >= margin - 1e-9 && nx + spot.mask.maxX <= width - margin + 1e-9 && ny + spot.mask.maxY <= height - margin + 1e-9 &&
      this.exactFree(spot.mask.ring.map((p) => ({ x: p.x + nx, y: p.y + ny })));
    for (const step of [cell / 2, cell / 4, cell / 8]) {
      // Up first, then up along either slope (settling into a notch), then left.
      const moves = [[0, -step], [-step, -step], [step, -step], [-step, 0]];
      for (let moved = true, guard = 0; moved && guard < 96; guard++) {
        moved = false;
        for (const [dx, dy] of moves) {
          if (fits(x + dx, y + dy)) {
            x += dx;
            y += dy;
            moved = true;
            break;
          }
        }
      }
    }
    return { mask: spot.mask, x, y, ring: spot.mask.ring.map((p) => ({ x: p.x + x, y: p.y + y })) };
  }
}

function prepare(items: ArrangeItem[], opts: Required<Pick<ArrangeOptions, 'gap' | 'cell' | 'rotate'>>): Map<string, Shape> {
  const shapes = new Map<string, Shape>();
  for (const item of items) {
    // The raster is only a quick filter, so it errs on the optimistic side (grown a little less than
    // half the gap); the exact polygon distance has the last word on every spot.
    const masks = rotationsOf(item.rotate ?? opts.rotate).map((r) => shapeMask(item.outline, r, opts.cell, Math.max(0, opts.gap / 2 - 0.75 * opts.cell)));
    shapes.set(item.key, { item, masks, areaMm2: area(item.outline.points) });
  }
  return shapes;
}

/** Arranges the pieces; problems with single pieces are reported in `unplaced`, naming the piece. */
export function arrange(items: ArrangeItem[], options: ArrangeOptions, locked: LockedPiece[] = [], onProgress?: (p: ArrangeProgress) => void): ArrangeResult {
  const started = Date.now();
  const o = { gap: 3.175, margin: 0, rotate: '90' as RotateMode, fill: false, timeMs: 2000, seed: 1, maxSheets: 10, cell: 1, ...options };
  if (!(o.width > 0 && o.height > 0)) throw new ArrangeInputError('The print area needs a width and a height.');
  if (2 * o.margin >= Math.min(o.width, o.height)) throw new ArrangeInputError(`A margin of ${o.margin} mm leaves no room on a ${o.width} × ${o.height} mm print area.`);
  const unplaced: ArrangeResult['unplaced'] = [];
  const usable = items.filter((item) => {
    const name = item.name ?? item.key;
    if (!(item.count > 0) || !Number.isInteger(item.count)) {
      unplaced.push({ key: item.key, name, count: 0, reason: `${name}: the quantity must be a whole number above zero.` });
      return false;
    }
    return true;
  });
  const shapes = prepare(usable, o);
  for (const [key, shape] of shapes) {
    // Too large for the usable area in every allowed rotation: say so and leave it out.
    const fits = shape.masks.some((m) => m.maxX - m.minX <= o.width - 2 * o.margin && m.maxY - m.minY <= o.height - 2 * o.margin);
    if (!fits) {
      const name = shape.item.name ?? key;
      unplaced.push({ key, name, count: shape.item.count, reason: `${name} (${shape.item.outline.widthMm.toFixed(1)} × ${shape.item.outline.heightMm.toFixed(1)} mm with its border) is larger than the print area less the margin.` });
      shapes.delete(key);
    }
  }
  const requested = usable.reduce((s, i) => s + i.count, 0);
  const instances: string[] = [];
  for (const [key, shape] of shapes) for (let i = 0; i < shape.item.count; i++) instances.push(key);
  const baseOrder = [...instances].sort((a, b) => (shapes.get(b)!.item.priority ?? 0) - (shapes.get(a)!.item.priority ?? 0) || shapes.get(b)!.areaMm2 - shapes.get(a)!.areaMm2);
  const random = seeded(o.seed);

  const run = (order: string[]) => {
    const boards: Board[] = [];
    const newBoard = () => {
      const board = new Board(o);
      if (boards.length === 0) {
        for (const l of locked) {
          const turned = shapeMask(l.outline, l.rotation, o.cell, o.gap / 2);
          const ring = turned.ring.map((p) => ({ x: p.x + l.x, y: p.y + l.y }));
          board.place(turned, l.x, l.y, ring, area(l.outline.points));
        }
      }
      boards.push(board);
      return board;
    };
    newBoard();
    const placements: Placement[] = [];
    const left: string[] = [];
    for (const key of order) {
      const shape = shapes.get(key)!;
      let done = false;
      for (let s = 0; s < (o.fill ? 1 : o.maxSheets) && !done; s++) {
        const board = boards[s] ?? newBoard();
        const spot = board.find(shape);
        if (spot) {
          board.place(spot.mask, spot.x, spot.y, spot.ring, shape.areaMm2);
          placements.push({ key, sheet: s, x: spot.x, y: spot.y, rotation: spot.mask.rotation });
          done = true;
        }
      }
      if (!done) left.push(key);
    }
    if (o.fill) {
      // Fill the sheet: repeat the set round-robin, keeping the mix balanced, until nothing more fits.
      let active = [...new Set(order)];
      while (active.length) {
        const still: string[] = [];
        for (const key of active) {
          const shape = shapes.get(key)!;
          const spot = boards[0].find(shape);
          if (!spot) continue;
          boards[0].place(spot.mask, spot.x, spot.y, spot.ring, shape.areaMm2);
          placements.push({ key, sheet: 0, x: spot.x, y: spot.y, rotation: spot.mask.rotation });
          still.push(key);
        }
        active = still;
      }
    }
    const used = boards.filter((b, i) => i === 0 || placements.some((p) => p.sheet === i));
    return { placements, left, boards: used };
  };

  const score = (r: ReturnType<typeof run>) => r.placements.length * 1e6 - r.boards.length * 1e4 + r.boards[0].usedArea / 1e3;
  let best = run(baseOrder);
  let iterations = 1;
  onProgress?.({ iteration: iterations, placed: best.placements.length, elapsedMs: Date.now() - started });
  const maxIterations = o.maxIterations ?? Infinity;
  while (iterations < maxIterations && Date.now() - started < o.timeMs && baseOrder.length > 1) {
    const order = [...baseOrder];
    // Perturb: a few random swaps, biased toward neighbours, so big pieces still tend to go first.
    const swaps = 1 + Math.floor(random() * 3);
    for (let k = 0; k < swaps; k++) {
      const i = Math.floor(random() * order.length);
      const j = Math.min(order.length - 1, Math.max(0, i + Math.floor((random() - 0.5) * 8)));
      [order[i], order[j]] = [order[j], order[i]];
    }
    const candidate = run(order);
    iterations++;
    if (score(candidate) > score(best)) best = candidate;
    onProgress?.({ iteration: iterations, placed: best.placements.length, elapsedMs: Date.now() - started });
  }
  const counts = new Map<string, number>();
  for (const key of best.left) counts.set(key, (counts.get(key) ?? 0) + 1);
  for (const [key, count] of counts) {
    const name = shapes.get(key)!.item.name ?? key;
    unplaced.push({ key, name, count, reason: `${count} × ${name} did not fit on ${o.fill ? 'the sheet' : `${o.maxSheets} sheets`}.` });
  }
  return {
    placements: best.placements,
    sheets: best.boards.length,
    requested,
    placed: best.placements.length,
    unplaced,
    areaUsed: best.boards.map((b) => b.usedArea / (o.width * o.height)),
    iterations,
    ms: Date.now() - started,
  };
}
