// One sheet (or strip) of the constructive decoder: an occupancy raster of every placed shape's
// mask (each row's runs, prefix sums and longest free run) that finds candidate spots quickly, and
// the placed cut lines themselves, which confirm every spot exactly.
import type { Ring } from '../geometry/polygon';
import { boundingBox } from '../geometry/polygon';
import { overlaps } from '../geometry/overlap';
import { closerThan } from '../sheet/placement';
import type { ShapeMask } from './raster';

export type BoardOptions = { width: number; height: number; gap: number; margin: number; cell: number };

/** One sheet's occupancy: blocked cells with per-row prefix sums, and the placed rings for exact checks. */
export class Board {
  readonly w: number;
  readonly h: number;
  private readonly grid: Uint8Array;
  private readonly prefix: Int32Array;
  /** Longest free run of each row; a run at either edge counts the cells a mask may hang off the board. */
  private readonly freeRun: Int32Array;
  private readonly hang: number;
  readonly rings: Array<{ ring: Ring; box: ReturnType<typeof boundingBox> }> = [];
  usedArea = 0;
  /** Lowest extent of any placed cut line (mm). */
  bottom = 0;

  constructor(readonly opts: BoardOptions) {
    this.w = Math.ceil(opts.width / opts.cell);
    this.h = Math.ceil(opts.height / opts.cell);
    this.grid = new Uint8Array(this.w * this.h);
    this.prefix = new Int32Array((this.w + 1) * this.h);
    this.freeRun = new Int32Array(this.h).fill(1 << 30);
    // A mask's grown rim (see shapeMask's pad) may lie off the board.
    this.hang = Math.ceil(Math.max(0, opts.gap / 2 - 0.25 * opts.cell) / opts.cell) + 2;
  }

  /** Whether every row of the mask finds a free run as long as its own at row offset cy. */
  private rowsCanTake(mask: ShapeMask, cy: number): boolean {
    for (const j of mask.order) {
      const row = cy + mask.offsetY + j;
      if (row >= 0 && row < this.h && this.freeRun[row] < mask.longest[j]) return false;
    }
    return true;
  }

  /** The last blocked cell of row y in [a, b], or -1 (cells off the board count as free). */
  private lastBlocked(y: number, a: number, b: number): number {
    if (y < 0 || y >= this.h) return -1;
    const lo = Math.max(0, a),
      hi = Math.min(this.w - 1, b);
    if (lo > hi) return -1;
    const base = y * (this.w + 1),
      top = this.prefix[base + hi + 1];
    if (top - this.prefix[base + lo] === 0) return -1;
    // The smallest t with prefix[t] = top: every cell from t on is free, so t - 1 is blocked.
    let l = lo,
      r = hi + 1;
    while (l < r) {
      const m = (l + r) >> 1;
      if (this.prefix[base + m] === top) r = m;
      else l = m + 1;
    }
    return l - 1;
  }

  /** 0 when the mask's cells are free at (cx, cy); else how many cells right the mask must move at least. */
  rasterSkip(mask: ShapeMask, cx: number, cy: number): number {
    for (const j of mask.order) {
      const row = cy + mask.offsetY + j;
      for (const [a, b] of mask.rows[j]) {
        const k = this.lastBlocked(row, cx + mask.offsetX + a, cx + mask.offsetX + b);
        if (k >= 0) return k - (cx + mask.offsetX + a) + 1;
      }
    }
    return 0;
  }

  exactFree(ring: Ring, box = boundingBox(ring)): boolean {
    const gap = this.opts.gap;
    for (const placed of this.rings) {
      const b = placed.box;
      if (box.x > b.x + b.width + gap || b.x > box.x + box.width + gap || box.y > b.y + b.height + gap || b.y > box.y + box.height + gap)
        continue;
      if (gap > 0 ? closerThan(ring, placed.ring, gap - 1e-6, box, b) : overlaps(ring, placed.ring)) return false;
    }
    return true;
  }

  place(mask: ShapeMask, x: number, y: number, ring: Ring, areaMm2: number) {
    const cx = Math.round(x / this.opts.cell),
      cy = Math.round(y / this.opts.cell);
    for (let j = 0; j < mask.rows.length; j++) {
      const row = cy + mask.offsetY + j;
      if (row < 0 || row >= this.h || mask.rows[j].length === 0) continue;
      for (const [a, b] of mask.rows[j]) {
        const lo = Math.max(0, cx + mask.offsetX + a),
          hi = Math.min(this.w - 1, cx + mask.offsetX + b);
        if (lo <= hi) this.grid.fill(1, row * this.w + lo, row * this.w + hi + 1);
      }
      const base = row * (this.w + 1);
      for (let i = 0; i < this.w; i++) this.prefix[base + i + 1] = this.prefix[base + i] + this.grid[row * this.w + i];
      let longest = 0,
        run = 0;
      for (let i = 0; i < this.w; i++) {
        run = this.grid[row * this.w + i] ? 0 : run + 1;
        if (run > longest) longest = run;
      }
      // Runs at either edge go on past it for a mask allowed to hang off.
      let lead = 0,
        tail = 0;
      while (lead < this.w && !this.grid[row * this.w + lead]) lead++;
      while (tail < this.w && !this.grid[row * this.w + this.w - 1 - tail]) tail++;
      this.freeRun[row] = Math.max(longest, lead + this.hang, tail + this.hang);
    }
    const box = boundingBox(ring);
    this.rings.push({ ring, box });
    this.usedArea += areaMm2;
    this.bottom = Math.max(this.bottom, box.y + box.height);
  }

  /**
   * The highest free spot for one mask (its lowest point as high as it can be, then leftmost), or
   * null; `limit` is a score it must beat. Scoring by the shape's lowest point, not its centre, picks
   * among rotations the one that lengthens the layout least.
   */
  private findFor(
    mask: ShapeMask,
    limit: number,
    from = -Infinity,
  ): { spot: { cx: number; cy: number; ring: Ring; score: number } | null; scanned: number } {
    const { cell, margin, width, height } = this.opts;
    const xMin = Math.ceil((margin - mask.minX) / cell),
      xMax = Math.floor((width - margin - mask.maxX) / cell);
    const yMin = Math.ceil((margin - mask.minY) / cell),
      yMax = Math.floor((height - margin - mask.maxY) / cell);
    const scoreOf = (cx: number, cy: number) => (cy * cell + mask.maxY) * 1e6 + cx * cell + mask.minX;
    // The mask's widest row needs that many free cells in the board row it lands on, less what may hang off the board.
    const widest = mask.order[0],
      need = mask.rows[widest].reduce((s, [a, b]) => s + b - a + 1, 0) - 2 * mask.pad;
    // `scanned`: the first row not yet known to be full for this mask.
    for (let cy = Math.max(yMin, from); cy <= yMax; cy++) {
      if (scoreOf(xMin, cy) >= limit) return { spot: null, scanned: cy };
      const row = cy + mask.offsetY + widest;
      if (row >= 0 && row < this.h && this.w - this.prefix[row * (this.w + 1) + this.w] < need) continue;
      if (!this.rowsCanTake(mask, cy)) continue;
      for (let cx = xMin; cx <= xMax;) {
        const skip = this.rasterSkip(mask, cx, cy);
        if (skip > 0) {
          cx += skip;
          continue;
        }
        const ring = mask.ring.map((p) => ({ x: p.x + cx * cell, y: p.y + cy * cell }));
        if (this.exactFree(ring)) return { spot: scoreOf(cx, cy) < limit ? { cx, cy, ring, score: scoreOf(cx, cy) } : null, scanned: cy };
        cx++;
      }
    }
    return { spot: null, scanned: Infinity };
  }

  /**
   * Where each mask's last search on this board found its spot: cells only ever fill up, so no
   * earlier row can take that mask later (copies of one piece skip what their elders scanned).
   */
  private readonly resume = new Map<ShapeMask, number>();

  /** The first free spot (top-left first) over the given masks, compacted, or null. */
  find(masks: ShapeMask[]): { mask: ShapeMask; x: number; y: number; ring: Ring } | null {
    let best: { mask: ShapeMask; cx: number; cy: number; ring: Ring; score: number } | null = null;
    for (const mask of masks) {
      const { spot, scanned } = this.findFor(mask, best ? best.score : Infinity, this.resume.get(mask));
      this.resume.set(mask, scanned);
      if (spot && (!best || spot.score < best.score)) best = { mask, ...spot };
    }
    return best ? this.compact(best) : null;
  }

  /**
   * Slides a found spot up (straight or along a slope) and left in steps finer than the grid while
   * the exact distance and the margin still allow it: the grid finds the place, the geometry tightens it.
   */
  private compact(spot: { mask: ShapeMask; cx: number; cy: number; ring: Ring }) {
    const { cell, margin, width, height } = this.opts;
    let x = spot.cx * cell,
      y = spot.cy * cell;
    const fits = (nx: number, ny: number) =>
      nx + spot.mask.minX >= margin - 1e-9 &&
      ny + spot.mask.minY >= margin - 1e-9 &&
      nx + spot.mask.maxX <= width - margin + 1e-9 &&
      ny + spot.mask.maxY <= height - margin + 1e-9 &&
      this.exactFree(spot.mask.ring.map((p) => ({ x: p.x + nx, y: p.y + ny })));
    for (const step of [cell / 2, cell / 4, cell / 8]) {
      // Up first, then up along either slope (settling into a notch), then left.
      const moves = [
        [0, -step],
        [-step, -step],
        [step, -step],
        [-step, 0],
      ];
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
