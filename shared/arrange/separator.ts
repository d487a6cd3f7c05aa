// Overlap minimisation on a fixed area: pieces may overlap while the search runs, and a guided local
// search moves them until none does (Egeblad, Nielsen & Odgaard 2007; Umetani et al. 2009; the
// sampling and decaying depth of Gardeyn, Vanden Berghe & Wauters 2025).
//
// Each round moves every colliding piece to the spot (and allowed rotation) where its weighted
// overlap with the others is least: random spots over the whole area and spots near where it is,
// the best refined by coordinate descent. After a round the weight of every pair still overlapping
// grows (more for deeper overlaps) and the others decay back to 1, so the search is pushed out of
// the local minima that plain overlap leaves it in (guided local search, Voudouris & Tsang 1999).
// After rounds without a new least overlap it returns to the best state seen and counts a strike.
import RBush from 'rbush';
import { overlapDepth } from './collide';
import { bestSpot } from './moves';
import type { Variant } from './shapes';

export type LayoutPiece = { variants: Variant[]; v: number; x: number; y: number; fixed?: boolean };
/** Where the cut lines' boxes must stay (the print area less the margin). */
export type Area = { x0: number; y0: number; x1: number; y1: number };
type Entry = { minX: number; minY: number; maxX: number; maxY: number; i: number };

type SeparateOptions = {
  strikes: number;
  roundsWithoutGain: number;
  deadline: number;
  random: () => number;
  shouldStop?: () => boolean;
  /**
   * Move passes a round makes from the same layout, each in its own random order; the one with the
   * least weighted overlap is kept (the paper's parallel workers, Algorithm 10, here one after another).
   */
  passes?: number;
};

const SCAN_LIMIT = 64;

export class Layout {
  readonly pieces: LayoutPiece[] = [];
  private depths = new Float64Array(0);
  private weights = new Float64Array(0);
  private size = 0;
  private tree = new RBush<Entry>();
  private entries: Entry[] = [];
  /**
   * Samples per move: over the whole area, and near the piece (the paper's 50 and 25). Measured at
   * 10 s against 25 and 15, seeds 1–8: jakobs2 0.902 → 0.934 of the reference density, the others
   * within the seeds' spread.
   */
  uniformSamples = 50;
  nearSamples = 25;

  constructor(public area: Area) {}

  get length() {
    return this.pieces.length;
  }

  /** Adds a piece (its spot already chosen) and returns its index. */
  add(piece: LayoutPiece): number {
    const i = this.pieces.length;
    this.pieces.push({ ...piece });
    if (i >= this.size) this.grow(Math.max(16, this.size * 2));
    const entry = { minX: 0, minY: 0, maxX: 0, maxY: 0, i };
    this.entries.push(entry);
    this.index(i, true);
    this.measure(i);
    return i;
  }

  /** Removes the last piece (undoes an `add`). */
  pop() {
    const i = this.pieces.length - 1;
    this.clearDepths(i);
    this.tree.remove(this.entries[i]);
    this.entries.pop();
    this.pieces.pop();
    for (let j = 0; j < this.size; j++) this.weights[i * this.size + j] = this.weights[j * this.size + i] = 1;
  }

  private grow(size: number) {
    const depths = new Float64Array(size * size),
      weights = new Float64Array(size * size).fill(1);
    for (let i = 0; i < this.size; i++) {
      depths.set(this.depths.subarray(i * this.size, (i + 1) * this.size), i * size);
      weights.set(this.weights.subarray(i * this.size, (i + 1) * this.size), i * size);
    }
    this.depths = depths;
    this.weights = weights;
    this.size = size;
  }

  private index(i: number, fresh = false) {
    const p = this.pieces[i],
      s = p.variants[p.v],
      e = this.entries[i];
    if (!fresh) this.tree.remove(e);
    e.minX = s.gx0 + p.x;
    e.minY = s.gy0 + p.y;
    e.maxX = s.gx1 + p.x;
    e.maxY = s.gy1 + p.y;
    this.tree.insert(e);
  }

  private clearDepths(i: number) {
    const n = this.pieces.length,
      size = this.size;
    for (let j = 0; j < n; j++) this.depths[i * size + j] = this.depths[j * size + i] = 0;
  }

  /** Recomputes piece i's overlap with every other piece. */
  private measure(i: number) {
    this.clearDepths(i);
    const p = this.pieces[i],
      s = p.variants[p.v],
      size = this.size;
    for (const e of this.tree.search(this.entries[i])) {
      if (e.i === i) continue;
      const q = this.pieces[e.i],
        t = q.variants[q.v];
      if (p.fixed && q.fixed) continue; // locked pieces are the maker's to place
      const d = overlapDepth(s, p.x, p.y, t, q.x, q.y);
      if (d > 0) this.depths[i * size + e.i] = this.depths[e.i * size + i] = d;
    }
  }

  /** Weighted overlap piece i would have as variant v at (x, y); stops counting once past `bound`. */
  cost(i: number, v: number, x: number, y: number, bound = Infinity): number {
    const s = this.pieces[i].variants[v],
      size = this.size;
    let sum = 0;
    const x0 = s.gx0 + x,
      y0 = s.gy0 + y,
      x1 = s.gx1 + x,
      y1 = s.gy1 + y;
    // Up to a few dozen pieces a plain scan of the boxes beats the tree's search (measured: a
    // quarter less time a move on 25 pieces); beyond that the tree wins.
    const near = this.entries.length <= SCAN_LIMIT ? this.entries : this.tree.search({ minX: x0, minY: y0, maxX: x1, maxY: y1 });
    for (const e of near) {
      if (e.i === i || e.minX > x1 || e.maxX < x0 || e.minY > y1 || e.maxY < y0) continue;
      const q = this.pieces[e.i],
        t = q.variants[q.v];
      const w = this.weights[i * size + e.i];
      const d = overlapDepth(s, x, y, t, q.x, q.y, (bound - sum) / w);
      if (d === 0) continue;
      sum += w * d;
      if (sum >= bound) return sum;
    }
    return sum;
  }

  /** The spot range for piece i as variant v, or null when it cannot fit the area at all. */
  range(i: number, v: number, variants = this.pieces[i].variants) {
    const s = variants[v],
      a = this.area;
    const x0 = a.x0 - s.bx0,
      x1 = a.x1 - s.bx1,
      y0 = a.y0 - s.by0,
      y1 = a.y1 - s.by1;
    return x0 <= x1 && y0 <= y1 ? { x0, x1, y0, y1 } : null;
  }

  moveTo(i: number, v: number, x: number, y: number) {
    const p = this.pieces[i];
    p.v = v;
    p.x = x;
    p.y = y;
    this.index(i);
    this.measure(i);
  }

  overlapOf(i: number): number {
    let sum = 0;
    for (let j = 0; j < this.pieces.length; j++) sum += this.depths[i * this.size + j];
    return sum;
  }

  weightedOverlap(): number {
    const n = this.pieces.length,
      size = this.size;
    let sum = 0;
    for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) sum += this.depths[i * size + j] * this.weights[i * size + j];
    return sum;
  }

  totalOverlap(): number {
    let sum = 0;
    for (let i = 0; i < this.pieces.length; i++) sum += this.overlapOf(i);
    return sum / 2;
  }

  snapshot() {
    return this.pieces.map((p) => ({ v: p.v, x: p.x, y: p.y }));
  }

  restore(state: Array<{ v: number; x: number; y: number }>) {
    state.forEach((s, i) => {
      const p = this.pieces[i];
      p.v = s.v;
      p.x = s.x;
      p.y = s.y;
    });
    this.tree.clear();
    this.pieces.forEach((_, i) => this.index(i, true));
    this.pieces.forEach((_, i) => this.measure(i));
  }

  /** Piece i moved to its least weighted overlap among sampled spots, refined by coordinate descent. */
  relocate(i: number, random: () => number, uniform = this.uniformSamples) {
    const best = bestSpot(this, i, random, uniform, this.nearSamples);
    this.moveTo(i, best.v, best.x, best.y);
  }

  /** Guided local search weights: overlapping pairs grow (deeper ones more), the rest decay to 1. */
  private reweigh() {
    const n = this.pieces.length,
      size = this.size;
    let deepest = 0;
    for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) deepest = Math.max(deepest, this.depths[i * size + j]);
    for (let i = 0; i < n; i++) {
      for (let j = i + 1; j < n; j++) {
        const d = this.depths[i * size + j];
        let w = this.weights[i * size + j];
        w = d > 0 ? w * (1.2 + (0.8 * d) / deepest) : Math.max(1, w * 0.95);
        this.weights[i * size + j] = this.weights[j * size + i] = w;
      }
    }
  }

  resetWeights() {
    this.weights.fill(1);
  }

  /**
   * One round: every colliding piece, in a random order, moved to its least weighted overlap. With
   * several passes each starts from the same layout in its own order, and the one that ends with the
   * least weighted overlap is kept.
   */
  round(random: () => number, passes = 1) {
    const from = passes > 1 ? this.snapshot() : null;
    let kept: ReturnType<Layout['snapshot']> | null = null,
      keptLoss = Infinity;
    for (let pass = 0; pass < passes; pass++) {
      if (pass > 0) this.restore(from!);
      const order: number[] = [];
      for (let i = 0; i < this.pieces.length; i++) if (!this.pieces[i].fixed && this.overlapOf(i) > 0) order.push(i);
      for (let k = order.length - 1; k > 0; k--) {
        const j = Math.floor(random() * (k + 1));
        [order[k], order[j]] = [order[j], order[k]];
      }
      for (const i of order) if (this.overlapOf(i) > 0) this.relocate(i, random);
      if (passes === 1) return;
      const loss = this.weightedOverlap();
      if (loss < keptLoss) {
        keptLoss = loss;
        kept = pass === passes - 1 ? null : this.snapshot(); // the last pass stays as it is
      }
    }
    if (kept) this.restore(kept);
  }

  /** Moves colliding pieces until nothing overlaps (true) or the strikes run out (false, at the least overlap seen). */
  separate(o: SeparateOptions): boolean {
    let total = this.totalOverlap();
    if (total === 0) return true;
    let least = total,
      best = this.snapshot();
    for (let strike = 0; strike < o.strikes;) {
      let gainedThisStrike = false;
      for (let idle = 0; idle < o.roundsWithoutGain;) {
        if (Date.now() > o.deadline || o.shouldStop?.()) {
          this.restore(best);
          return false;
        }
        this.round(o.random, o.passes ?? 1);
        total = this.totalOverlap();
        if (total === 0) return true;
        if (total < least) {
          // Only a real gain (1 %) buys more rounds; crumbs of overlap shaved off do not.
          if (total < least * 0.99) {
            gainedThisStrike = true;
            idle = 0;
          } else idle++;
          least = total;
          best = this.snapshot();
        } else idle++;
        this.reweigh();
      }
      if (!gainedThisStrike) strike++;
      this.restore(best);
    }
    return false;
  }
}
