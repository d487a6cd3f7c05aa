// Auto-arrange: packs real cut-line shapes (not their boxes) into the print area with a minimum gap
// between cut lines and a margin to the edge, or into a strip of fixed width as short as possible.
//
// Method. A constructive decoder places pieces one after another in a given sequence, each at the
// lowest, then leftmost free spot for its rotation: the bottom-left-fill rule (Jakobs 1996; here
// top-left with y down). Free spots are found on an occupancy raster that keeps every run of every
// row of each shape, so notches and the insides of U shapes stay open to other pieces; a blocked run
// skips the scan past the cell that blocked it. Each raster hit is confirmed by exact geometry (the
// polygon distance at least the gap, or at a gap of 0 no shared area by Clipper2's intersection) and
// then slid up and left in sub-cell steps while the exact test allows (compaction).
// Improvement builds on the best layout so far: a local search over the sequence and each piece's
// rotation (swap two pieces, move one earlier, turn one; Gomes & Oliveira 2002 use the same
// neighbourhood), accepted by late-acceptance hill climbing (Burke & Bykov 2017), which takes a move
// when it is no worse than the layout of some iterations ago.
// Then the overlap search takes over (separator.ts): in strip packing a sequence of feasibility
// problems, each a shorter strip whose overlap a guided local search removes (strip.ts, after
// Gardeyn, Vanden Berghe & Wauters 2025); on sheets, one more piece at a time while the separator
// can make room for it, or the last sheet emptied into the others (sheet-search.ts). It is anytime:
// progress reports the best so far, `shouldStop` ends it early, and a seed makes it repeatable.
import type { Ring } from '../geometry/polygon';
import { area, boundingBox } from '../geometry/polygon';
import { overlaps } from '../geometry/overlap';
import { closerThan } from '../sheet/placement';
import { seeded } from './prng';
import type { ShapeMask } from './raster';
import { shapeMask } from './raster';
import type { Placed } from './improve';
import { exactlyValid, layoutOf, placementsOf } from './improve';
import { emptyLastSheet, fillSheet } from './sheet-search';
import { variantsOf } from './shapes';
import { shortenStrip } from './strip';

export type Outline = { points: Ring; widthMm: number; heightMm: number };
/** 'none': upright only; '90': quarter turns; a step in degrees (15, 5, …); or an explicit set. */
export type RotateMode = 'none' | '90' | { step: number } | { set: number[] };

export type ArrangeItem = { key: string; name?: string; outline: Outline; count: number; priority?: number; rotate?: RotateMode };
export type LockedPiece = { key: string; x: number; y: number; rotation: number; outline: Outline };

export type ArrangeOptions = {
  width: number;
  height: number;
  gap?: number;
  margin?: number;
  rotate?: RotateMode;
  fill?: boolean;
  /** Strip packing: `height` is only a bound; the layout is scored by the height it uses. */
  strip?: boolean;
  timeMs?: number;
  maxIterations?: number;
  seed?: number;
  maxSheets?: number;
  /** false: the sequence search only, without the overlap search that follows it (quicker, looser). */
  overlap?: boolean;
  /** Search grid cell (mm). */
  cell?: number;
  /** Checked between layouts: true ends the search with the best layout so far. */
  shouldStop?: () => boolean;
  /** Told each new best layout, so a caller that stops the search early keeps the best so far. */
  onBest?: (result: ArrangeResult) => void;
};

export type Placement = { key: string; sheet: number; x: number; y: number; rotation: number };
export type ArrangeProgress = { iteration: number; placed: number; elapsedMs: number; sheets: number; areaUsed: number; length?: number };
export type ArrangeResult = {
  placements: Placement[];
  sheets: number;
  requested: number;
  placed: number;
  unplaced: Array<{ key: string; name: string; count: number; reason: string }>;
  /** Sum of cut-line areas / print area, per sheet. */
  areaUsed: number[];
  /** Strip packing: the height used (mm, from the top edge to the lowest point of any cut line). */
  length?: number;
  iterations: number;
  ms: number;
};

export class ArrangeInputError extends Error {}

export function rotationsOf(mode: RotateMode): number[] {
  if (mode === 'none') return [0];
  if (mode === '90') return [0, 90, 180, 270];
  if ('set' in mode) return mode.set.length ? [...new Set(mode.set.map((r) => ((r % 360) + 360) % 360))] : [0];
  const step = Math.max(1, mode.step);
  return Array.from({ length: Math.max(1, Math.floor(360 / step)) }, (_, i) => i * step);
}

type Shape = { item: ArrangeItem; masks: ShapeMask[]; areaMm2: number };
type Opts = { width: number; height: number; gap: number; margin: number; cell: number };

/** One sheet's occupancy: blocked cells with per-row prefix sums, and the placed rings for exact checks. */
class Board {
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

  constructor(readonly opts: Opts) {
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
    const lo = Math.max(0, a), hi = Math.min(this.w - 1, b);
    if (lo > hi) return -1;
    const base = y * (this.w + 1), top = this.prefix[base + hi + 1];
    if (top - this.prefix[base + lo] === 0) return -1;
    // The smallest t with prefix[t] = top: every cell from t on is free, so t - 1 is blocked.
    let l = lo, r = hi + 1;
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
      if (box.x > b.x + b.width + gap || b.x > box.x + box.width + gap || box.y > b.y + b.height + gap || b.y > box.y + box.height + gap) continue;
      if (gap > 0 ? closerThan(ring, placed.ring, gap - 1e-6, box, b) : overlaps(ring, placed.ring)) return false;
    }
    return true;
  }

  place(mask: ShapeMask, x: number, y: number, ring: Ring, areaMm2: number) {
    const cx = Math.round(x / this.opts.cell), cy = Math.round(y / this.opts.cell);
    for (let j = 0; j < mask.rows.length; j++) {
      const row = cy + mask.offsetY + j;
      if (row < 0 || row >= this.h || mask.rows[j].length === 0) continue;
      for (const [a, b] of mask.rows[j]) {
        const lo = Math.max(0, cx + mask.offsetX + a), hi = Math.min(this.w - 1, cx + mask.offsetX + b);
        if (lo <= hi) this.grid.fill(1, row * this.w + lo, row * this.w + hi + 1);
      }
      const base = row * (this.w + 1);
      for (let i = 0; i < this.w; i++) this.prefix[base + i + 1] = this.prefix[base + i] + this.grid[row * this.w + i];
      let longest = 0, run = 0;
      for (let i = 0; i < this.w; i++) {
        run = this.grid[row * this.w + i] ? 0 : run + 1;
        if (run > longest) longest = run;
      }
      // Runs at either edge go on past it for a mask allowed to hang off.
      let lead = 0, tail = 0;
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
  private findFor(mask: ShapeMask, limit: number, from = -Infinity): { spot: { cx: number; cy: number; ring: Ring; score: number } | null; scanned: number } {
    const { cell, margin, width, height } = this.opts;
    const xMin = Math.ceil((margin - mask.minX) / cell), xMax = Math.floor((width - margin - mask.maxX) / cell);
    const yMin = Math.ceil((margin - mask.minY) / cell), yMax = Math.floor((height - margin - mask.maxY) / cell);
    const scoreOf = (cx: number, cy: number) => (cy * cell + mask.maxY) * 1e6 + cx * cell + mask.minX;
    // The mask's widest row needs that many free cells in the board row it lands on, less what may hang off the board.
    const widest = mask.order[0], need = mask.rows[widest].reduce((s, [a, b]) => s + b - a + 1, 0) - 2 * mask.pad;
    // `scanned`: the first row not yet known to be full for this mask.
    for (let cy = Math.max(yMin, from); cy <= yMax; cy++) {
      if (scoreOf(xMin, cy) >= limit) return { spot: null, scanned: cy };
      const row = cy + mask.offsetY + widest;
      if (row >= 0 && row < this.h && this.w - this.prefix[row * (this.w + 1) + this.w] < need) continue;
      if (!this.rowsCanTake(mask, cy)) continue;
      for (let cx = xMin; cx <= xMax; ) {
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

function prepare(items: ArrangeItem[], opts: { gap: number; cell: number; rotate: RotateMode }): Map<string, Shape> {
  const shapes = new Map<string, Shape>();
  for (const item of items) {
    // The raster is only a quick filter and never refuses a spot the exact test would take: a mask
    // cell is marked only when its centre lies within half the gap of the cut line, so two masks
    // share a cell only when their cut lines are within the gap of each other (triangle inequality).
    // It may take spots that are a little too close; the exact polygon test has the last word.
    const masks = rotationsOf(item.rotate ?? opts.rotate).map((r) => shapeMask(item.outline, r, opts.cell, opts.gap / 2));
    shapes.set(item.key, { item, masks, areaMm2: area(item.outline.points) });
  }
  return shapes;
}

/** One piece of the sequence: which item, and which of its rotations to try first (-1: all, best spot). */
type Gene = { key: string; turn: number };

/** Arranges the pieces; problems with single pieces are reported in `unplaced`, naming the piece. */
export function arrange(items: ArrangeItem[], options: ArrangeOptions, locked: LockedPiece[] = [], onProgress?: (p: ArrangeProgress) => void): ArrangeResult {
  const started = Date.now();
  const o = { gap: 3.175, margin: 0, rotate: '90' as RotateMode, fill: false, strip: false, overlap: true, timeMs: 2000, seed: 1, maxSheets: 10, cell: 1, ...options };
  if (!(o.width > 0 && o.height > 0)) throw new ArrangeInputError('The print area needs a width and a height.');
  if (2 * o.margin >= Math.min(o.width, o.height)) throw new ArrangeInputError(`A margin of ${o.margin} mm leaves no room on a ${o.width} × ${o.height} mm print area.`);
  if (!(o.gap >= 0)) throw new ArrangeInputError('The gap between cut lines cannot be negative.');
  if (o.gap >= Math.min(o.width, o.height) - 2 * o.margin) throw new ArrangeInputError(`A gap of ${o.gap} mm leaves no room on a ${o.width} × ${o.height} mm print area.`);
  const unplaced: ArrangeResult['unplaced'] = [];
  const usable = items.filter((item) => {
    const name = item.name ?? item.key;
    if (!(item.count > 0) || !Number.isInteger(item.count)) {
      unplaced.push({ key: item.key, name, count: 0, reason: `${name}: the quantity must be a whole number above zero.` });
      return false;
    }
    const pts = item.outline.points;
    if (pts.length < 3 || pts.some((p) => !Number.isFinite(p.x) || !Number.isFinite(p.y))) {
      unplaced.push({ key: item.key, name, count: item.count, reason: `${name}: its cut line is not a closed shape.` });
      return false;
    }
    if (selfIntersects(pts)) {
      unplaced.push({ key: item.key, name, count: item.count, reason: `${name}: its cut line crosses itself, so no blade can follow it.` });
      return false;
    }
    if (area(pts) <= 0) {
      unplaced.push({ key: item.key, name, count: item.count, reason: `${name}: its cut line encloses no area.` });
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
  const random = seeded(o.seed);
  // The constructive start: priority first, then the largest pieces, each at its best rotation.
  const base: Gene[] = [];
  for (const [key, shape] of shapes) for (let i = 0; i < shape.item.count; i++) base.push({ key, turn: -1 });
  base.sort((a, b) => (shapes.get(b.key)!.item.priority ?? 0) - (shapes.get(a.key)!.item.priority ?? 0) || shapes.get(b.key)!.areaMm2 - shapes.get(a.key)!.areaMm2);

  const lockedBoard = (board: Board) => {
    for (const l of locked) {
      const turned = shapeMask(l.outline, l.rotation, o.cell, o.gap / 2);
      const ring = turned.ring.map((p) => ({ x: p.x + l.x, y: p.y + l.y }));
      board.place(turned, l.x, l.y, ring, area(l.outline.points));
    }
  };

  const run = (genes: Gene[]) => {
    const boards: Board[] = [];
    const newBoard = () => {
      const board = new Board(o);
      if (boards.length === 0) lockedBoard(board);
      boards.push(board);
      return board;
    };
    newBoard();
    const placements: Placement[] = [];
    const left: string[] = [];
    const chosen: number[] = [];
    for (const gene of genes) {
      const shape = shapes.get(gene.key)!;
      const masks = gene.turn < 0 || gene.turn >= shape.masks.length ? shape.masks : [shape.masks[gene.turn]];
      let done = false;
      for (let s = 0; s < (o.fill || o.strip ? 1 : o.maxSheets) && !done; s++) {
        const board = boards[s] ?? newBoard();
        // The gene's rotation first; any other if it does not fit there.
        const spot = board.find(masks) ?? (masks.length < shape.masks.length ? board.find(shape.masks) : null);
        if (spot) {
          board.place(spot.mask, spot.x, spot.y, spot.ring, shape.areaMm2);
          placements.push({ key: gene.key, sheet: s, x: spot.x, y: spot.y, rotation: spot.mask.rotation });
          chosen.push(shape.masks.indexOf(spot.mask));
          done = true;
        }
      }
      if (!done) {
        left.push(gene.key);
        chosen.push(gene.turn);
      }
    }
    if (o.fill) {
      // Fill the sheet: repeat the set round-robin, keeping the mix balanced, until nothing more fits.
      let active = [...new Set(genes.map((g) => g.key))];
      while (active.length) {
        const still: string[] = [];
        for (const key of active) {
          const shape = shapes.get(key)!;
          const spot = boards[0].find(shape.masks);
          if (!spot) continue;
          boards[0].place(spot.mask, spot.x, spot.y, spot.ring, shape.areaMm2);
          placements.push({ key, sheet: 0, x: spot.x, y: spot.y, rotation: spot.mask.rotation });
          still.push(key);
        }
        active = still;
      }
    }
    const used = boards.filter((b, i) => i === 0 || placements.some((p) => p.sheet === i));
    // The rotations the decoder settled on become the genes' own, so the search builds on them.
    const settled = genes.map((g, i) => ({ key: g.key, turn: chosen[i] }));
    return { placements, left, boards: used, genes: settled };
  };

  type Layout = ReturnType<typeof run>;
  // More pieces, then fewer sheets, then (strip) a shorter strip or (sheets) pieces packed higher up.
  const score = (r: Layout) => {
    const last = r.boards[r.boards.length - 1];
    const compact = o.strip ? -last.bottom / o.height : -last.bottom / (o.height * 10) + r.boards[0].usedArea / (o.width * o.height * 100);
    return r.placements.length * 1e6 - r.boards.length * 1e4 + compact * 100;
  };
  const resultOf = (layout: Layout, iteration: number): ArrangeResult => {
    const counts = new Map<string, number>();
    for (const key of layout.left) counts.set(key, (counts.get(key) ?? 0) + 1);
    const left = [...counts].map(([key, count]) => {
      const name = shapes.get(key)!.item.name ?? key;
      return { key, name, count, reason: `${count} × ${name} did not fit on ${o.fill ? 'the sheet' : o.strip ? 'the strip' : `${o.maxSheets} sheets`}.` };
    });
    return {
      placements: layout.placements,
      sheets: layout.boards.length,
      requested,
      placed: layout.placements.length,
      unplaced: [...unplaced, ...left],
      areaUsed: layout.boards.map((b) => b.usedArea / (o.width * o.height)),
      length: o.strip ? layout.boards[0].bottom : undefined,
      iterations: iteration,
      ms: Date.now() - started,
    };
  };
  const report = (layout: Layout, iteration: number) => {
    o.onBest?.(resultOf(layout, iteration));
    onProgress?.({ iteration, placed: layout.placements.length, elapsedMs: Date.now() - started, sheets: layout.boards.length, areaUsed: layout.boards[0].usedArea / (o.width * o.height), length: o.strip ? layout.boards[0].bottom : undefined });
  };

  let current = run(base);
  let best = current;
  let iterations = 1;
  report(best, iterations);
  if (o.overlap && o.strip && best.left.length === 0 && base.length > 1 && o.timeMs > Date.now() - started && (o.maxIterations ?? Infinity) > 1) {
    // Strip packing goes on from the constructive layout as a sequence of overlap searches.
    const variants = new Map([...shapes].map(([key, shape]) => [key, variantsOf(shape.item.outline, rotationsOf(shape.item.rotate ?? o.rotate), o.gap / 2)]));
    const area = { x0: o.margin, y0: o.margin, x1: o.width - o.margin, y1: o.height - o.margin };
    const fixed = locked.map((l) => ({ key: l.key, x: l.x, y: l.y, rotation: l.rotation }));
    for (const l of locked) if (!variants.has(l.key)) variants.set(l.key, variantsOf(l.outline, [l.rotation], o.gap / 2));
    const { layout, keys } = layoutOf(best.placements, (key) => variants.get(key)!, area, fixed);
    const { length, tries } = shortenStrip(layout, {
      deadline: started + o.timeMs,
      random,
      shouldStop: o.shouldStop,
      maxTries: o.maxIterations === undefined ? undefined : o.maxIterations - 1,
      onBest: (bottom) => onProgress?.({ iteration: iterations, placed: best.placements.length, elapsedMs: Date.now() - started, sheets: 1, areaUsed: best.boards[0].usedArea / (o.width * o.height), length: bottom }),
    });
    if (exactlyValid(layout, o.gap)) {
      const placements = placementsOf(layout, keys).map((p) => ({ ...p, sheet: 0 }));
      return { ...resultOf(best, 1 + tries), placements, length, ms: Date.now() - started };
    }
  }
  const maxIterations = o.maxIterations ?? Infinity;
  // Late acceptance: a move is taken when it is no worse than the current layout or the one L moves ago.
  const L = 50;
  const history = new Array<number>(L).fill(score(current));
  let currentScore = score(current);
  // On sheets the overlap search gets the later part of the time (more pieces, fewer sheets).
  const sequenceMs = o.strip || !o.overlap ? o.timeMs : o.timeMs * 0.4;
  while (iterations < maxIterations && Date.now() - started < sequenceMs && base.length > 1 && !o.shouldStop?.()) {
    const genes = current.genes.map((g) => ({ ...g }));
    const n = genes.length;
    const move = random();
    if (move < 0.4) {
      // Swap two pieces, mostly near each other in the sequence.
      const i = Math.floor(random() * n);
      const j = random() < 0.7 ? Math.min(n - 1, Math.max(0, i + Math.round((random() - 0.5) * 10))) : Math.floor(random() * n);
      [genes[i], genes[j]] = [genes[j], genes[i]];
    } else if (move < 0.7) {
      // Move one piece earlier: what did not fit, or fits badly, gets an earlier turn.
      const i = current.left.length && random() < 0.5 ? genes.findIndex((g) => g.key === current.left[Math.floor(random() * current.left.length)]) : Math.floor(random() * n);
      const j = Math.floor(random() * (i + 1));
      const [g] = genes.splice(i, 1);
      genes.splice(j, 0, g);
    } else {
      // Turn one piece to another of its allowed rotations.
      const i = Math.floor(random() * n);
      const count = shapes.get(genes[i].key)!.masks.length;
      if (count > 1) genes[i].turn = (Math.max(0, genes[i].turn) + 1 + Math.floor(random() * (count - 1))) % count;
      else [genes[i], genes[(i + 1) % n]] = [genes[(i + 1) % n], genes[i]];
    }
    const candidate = run(genes);
    const s = score(candidate);
    const slot = iterations % L;
    if (s >= currentScore || s >= history[slot]) {
      current = candidate;
      currentScore = s;
    }
    history[slot] = currentScore;
    iterations++;
    if (s > score(best)) {
      best = candidate;
      report(best, iterations);
    }
  }
  if (o.overlap && !o.strip && (o.fill || best.boards.length > 1) && maxIterations > 1 && !o.shouldStop?.()) {
    const maxTries = o.maxIterations === undefined ? undefined : o.maxIterations - 1;
    const searched = searchSheets(best, { fill: o.fill, locked, rotate: o.rotate, shapes, random, deadline: started + o.timeMs, maxTries, shouldStop: o.shouldStop });
    if (searched) {
      const areaOf = new Map([...shapes].map(([key, s]) => [key, s.areaMm2]));
      const sheets = Math.max(...searched.map((p) => p.sheet)) + 1;
      const areaUsed = Array.from({ length: sheets }, (_, s) => searched.filter((p) => p.sheet === s).reduce((sum, p) => sum + areaOf.get(p.key)!, 0) / (o.width * o.height));
      const result = { ...resultOf(best, iterations), placements: searched, sheets, placed: searched.length, areaUsed, ms: Date.now() - started };
      o.onBest?.(result);
      onProgress?.({ iteration: iterations, placed: result.placed, elapsedMs: result.ms, sheets, areaUsed: areaUsed[0] });
      return result;
    }
  }
  onProgress?.({ iteration: iterations, placed: best.placements.length, elapsedMs: Date.now() - started, sheets: best.boards.length, areaUsed: best.boards[0].usedArea / (o.width * o.height), length: o.strip ? best.boards[0].bottom : undefined });
  return resultOf(best, iterations);

  /** Fill: more copies on the sheet; quantities: the last sheet emptied into the others. Null when nothing changed. */
  function searchSheets(layout: { placements: Placement[]; boards: unknown[] }, a: { fill: boolean; locked: LockedPiece[]; rotate: RotateMode; shapes: Map<string, Shape>; random: () => number; deadline: number; maxTries?: number; shouldStop?: () => boolean }): Placement[] | null {
    const variants = new Map([...a.shapes].map(([key, shape]) => [key, variantsOf(shape.item.outline, rotationsOf(shape.item.rotate ?? a.rotate), o.gap / 2)]));
    for (const l of a.locked) if (!variants.has(l.key)) variants.set(l.key, variantsOf(l.outline, [l.rotation], o.gap / 2));
    const search = { variantsOf: (key: string) => variants.get(key)!, area: { x0: o.margin, y0: o.margin, x1: o.width - o.margin, y1: o.height - o.margin }, gap: o.gap, deadline: a.deadline, random: a.random, shouldStop: a.shouldStop, maxTries: a.maxTries };
    const fixed = a.locked.map((l) => ({ key: l.key, x: l.x, y: l.y, rotation: l.rotation }));
    if (a.fill) {
      const filled = fillSheet(layout.placements, fixed, [...a.shapes.keys()], search);
      return filled && filled.map((p) => ({ ...p, sheet: 0 }));
    }
    let sheets: Placed[][] = Array.from({ length: layout.boards.length }, (_, s) => layout.placements.filter((p) => p.sheet === s));
    let changed = false;
    while (sheets.length > 1) {
      const fewer = emptyLastSheet(sheets, fixed, search);
      if (!fewer) break;
      sheets = fewer;
      changed = true;
    }
    return changed ? sheets.flatMap((placed, s) => placed.map((p) => ({ ...p, sheet: s }))) : null;
  }
}

/** Whether a ring's edges cross (other than neighbours sharing their end point). */
function selfIntersects(ring: Ring): boolean {
  const n = ring.length;
  if (n > 2000) return false; // checked by the outline engine already; not worth O(n²) here
  const cross = (a: Ring[number], b: Ring[number], c: Ring[number]) => (b.x - a.x) * (c.y - a.y) - (b.y - a.y) * (c.x - a.x);
  for (let i = 0; i < n; i++) {
    const a = ring[i], b = ring[(i + 1) % n];
    for (let j = i + 2; j < n; j++) {
      if (i === 0 && j === n - 1) continue;
      const c = ring[j], d = ring[(j + 1) % n];
      const d1 = cross(a, b, c), d2 = cross(a, b, d), d3 = cross(c, d, a), d4 = cross(c, d, b);
      if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) return true;
    }
  }
  return false;
}
