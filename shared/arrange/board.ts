// One sheet (or strip) of the constructive decoder: an occupancy raster of every placed shape's
// mask (each row's free intervals, free cells and longest free run) that finds candidate spots quickly, and
// the placed cut lines themselves, which confirm every spot exactly.
import type { Box, Ring } from '../geometry/polygon';
import { boundingBox } from '../geometry/polygon';
import { PlacedLines } from './placed-lines';
import type { ShapeMask } from './raster';

/** A free interval's end beyond either edge of the board: masks may hang off it (see `hang`). */
const OPEN = 1 << 29;

export type BoardOptions = { width: number; height: number; gap: number; margin: number; cell: number };

/** One sheet's occupancy: blocked cells with each row's free intervals, and the placed rings for exact checks. */
export class Board {
  readonly w: number;
  readonly h: number;
  private readonly grid: Uint8Array;
  /** Free cells of each row. */
  private readonly freeCells: Int32Array;
  /** Longest free run of each row; a run at either edge counts the cells a mask may hang off the board. */
  private readonly freeRun: Int32Array;
  private readonly hang: number;
  /** Free intervals of each row, [start, end] inclusive pairs; the first and last run on past the edges. */
  private readonly free: Int32Array[];
  /** Two scratch interval lists the row search intersects into (no allocation per spot). */
  private scratch = [new Int32Array(64), new Int32Array(64)];
  /** The placed cut lines, for the exact checks. */
  private readonly placed: PlacedLines;
  usedArea = 0;
  /** Lowest extent of any placed cut line (mm). */
  bottom = 0;

  constructor(readonly opts: BoardOptions) {
    this.w = Math.ceil(opts.width / opts.cell);
    this.h = Math.ceil(opts.height / opts.cell);
    this.grid = new Uint8Array(this.w * this.h);
    this.freeCells = new Int32Array(this.h).fill(this.w);
    this.freeRun = new Int32Array(this.h).fill(1 << 30);
    // A mask's grown rim (see shapeMask's pad) may lie off the board.
    this.hang = Math.ceil(Math.max(0, opts.gap / 2 - 0.25 * opts.cell) / opts.cell) + 2;
    this.free = Array.from({ length: this.h }, () => Int32Array.of(-OPEN, OPEN));
    this.placed = new PlacedLines(opts.gap);
  }

  /** Whether every row of the mask finds a free run as long as its own at row offset cy. */
  private rowsCanTake(mask: ShapeMask, cy: number): boolean {
    for (const j of mask.order) {
      const row = cy + mask.offsetY + j;
      if (row >= 0 && row < this.h && this.freeRun[row] < mask.longest[j]) return false;
    }
    return true;
  }

  private freeIntervals(row: number): Int32Array {
    const grid = this.grid,
      base = row * this.w;
    // Counted first, then written: one exact-size list per row, nothing else made.
    let count = 1;
    for (let i = 0, start = -OPEN; i < this.w; i++) {
      if (grid[base + i]) {
        if (start <= i - 1) count++;
        start = i + 1;
      }
    }
    const out = new Int32Array(2 * count);
    let n = 0,
      start = -OPEN;
    for (let i = 0; i < this.w; i++) {
      if (grid[base + i]) {
        if (start <= i - 1) {
          out[n++] = start;
          out[n++] = i - 1;
        }
        start = i + 1;
      }
    }
    out[n++] = start;
    out[n] = OPEN;
    return out;
  }

  /**
   * The offsets cx in [lo, hi] at which every run of the mask lies on free cells of row offset cy:
   * the intersection over the mask's runs of the board rows' free intervals, each shrunk by the run.
   * Rows go widest first, so most rows end empty after one or two runs. Returns the length of the
   * list, which it leaves in `offsets` (scratch: read it before the next call).
   */
  private offsets = new Int32Array(0);
  private freeOffsets(mask: ShapeMask, cy: number, lo: number, hi: number): number {
    let cur = this.scratch[0],
      n = 2;
    cur[0] = lo;
    cur[1] = hi;
    for (const j of mask.order) {
      const row = cy + mask.offsetY + j;
      if (row < 0 || row >= this.h) continue;
      const free = this.free[row];
      if (free.length === 2) continue;
      for (const [a, b] of mask.rows[j]) {
        // Run [a, b] at offset cx covers cells cx + offsetX + a … cx + offsetX + b.
        const da = mask.offsetX + a,
          db = mask.offsetX + b;
        let next = cur === this.scratch[0] ? this.scratch[1] : this.scratch[0];
        if (next.length < n + free.length) {
          next = new Int32Array(2 * (n + free.length));
          this.scratch[cur === this.scratch[0] ? 1 : 0] = next;
        }
        let m = 0;
        for (let p = 0, q = 0; p < n && q < free.length;) {
          const s = Math.max(cur[p], free[q] - da),
            e = Math.min(cur[p + 1], free[q + 1] - db);
          if (s <= e) {
            next[m++] = s;
            next[m++] = e;
          }
          if (cur[p + 1] < free[q + 1] - db) p += 2;
          else q += 2;
        }
        cur = next;
        n = m;
        if (n === 0) return 0;
      }
    }
    this.offsets = cur;
    return n;
  }

  exactFree(ring: Ring, box: Box = boundingBox(ring)): boolean {
    return this.placed.freeAt(ring, 0, 0, ring, box);
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
      const free = this.freeIntervals(row);
      this.free[row] = free;
      // Free cells, and the longest free run; runs at either edge go on past it for a mask allowed to hang off.
      let cells = 0,
        longest = 0;
      for (let k = 0; k < free.length; k += 2) {
        const s = Math.max(0, free[k]),
          e = Math.min(this.w - 1, free[k + 1]);
        const inside = Math.max(0, e - s + 1),
          open = free[k] < 0 || free[k + 1] >= this.w ? this.hang : 0;
        cells += inside;
        longest = Math.max(longest, inside + open);
      }
      this.freeCells[row] = cells;
      this.freeRun[row] = longest;
    }
    const box = boundingBox(ring);
    this.placed.add(ring, box);
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
    const trial = mask.ring.map((p) => ({ x: p.x, y: p.y }));
    const box = { x: 0, y: 0, width: mask.maxX - mask.minX, height: mask.maxY - mask.minY };
    // `scanned`: the first row not yet known to be full for this mask.
    for (let cy = Math.max(yMin, from); cy <= yMax; cy++) {
      if (scoreOf(xMin, cy) >= limit) return { spot: null, scanned: cy };
      const row = cy + mask.offsetY + widest;
      if (row >= 0 && row < this.h && this.freeCells[row] < need) continue;
      if (!this.rowsCanTake(mask, cy)) continue;
      const n = this.freeOffsets(mask, cy, xMin, xMax);
      // Read before the next row's search reuses the scratch lists (the exact checks do not touch them).
      const spans = this.offsets;
      for (let k = 0; k < n; k += 2)
        for (let cx = spans[k]; cx <= spans[k + 1]; cx++) {
          // One ring moved from spot to spot (no garbage per try); the found one is copied.
          if (this.freeMoved(mask, cx * cell, cy * cell, trial, box)) {
            const ring = trial.map((p) => ({ x: p.x, y: p.y }));
            return { spot: scoreOf(cx, cy) < limit ? { cx, cy, ring, score: scoreOf(cx, cy) } : null, scanned: cy };
          }
        }
    }
    return { spot: null, scanned: Infinity };
  }

  /**
   * Whether the mask's cut line moved by (dx, dy) keeps the gap to the placed ones. Its box is the
   * mask's, moved, written into the scratch `box` (the same numbers boundingBox gives); the moved
   * ring goes into the scratch `trial`.
   */
  private freeMoved(mask: ShapeMask, dx: number, dy: number, trial: Ring, box: Box): boolean {
    box.x = mask.minX + dx;
    box.y = mask.minY + dy;
    box.width = mask.maxX + dx - box.x;
    box.height = mask.maxY + dy - box.y;
    return this.placed.freeAt(mask.ring, dx, dy, trial, box);
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
    const { mask } = spot;
    const trial = mask.ring.map((p) => ({ x: p.x, y: p.y }));
    const box = { x: 0, y: 0, width: mask.maxX - mask.minX, height: mask.maxY - mask.minY };
    const fits = (nx: number, ny: number) => {
      if (
        nx + mask.minX < margin - 1e-9 ||
        ny + mask.minY < margin - 1e-9 ||
        nx + mask.maxX > width - margin + 1e-9 ||
        ny + mask.maxY > height - margin + 1e-9
      )
        return false;
      return this.freeMoved(mask, nx, ny, trial, box);
    };
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
