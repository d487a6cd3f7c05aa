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
import { checkInput } from './input';
import type { Gene, Shape } from './decoder';
import { decode, prepare } from './decoder';
import { seeded } from './prng';
import { sheetPhase, stripPhase } from './overlap-phase';

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

export { ArrangeInputError } from './input';

/** Arranges the pieces; problems with single pieces are reported in `unplaced`, naming the piece. */
export function arrange(
  items: ArrangeItem[],
  options: ArrangeOptions,
  locked: LockedPiece[] = [],
  onProgress?: (p: ArrangeProgress) => void,
): ArrangeResult {
  const started = Date.now();
  const o = {
    gap: 3.175,
    margin: 0,
    rotate: '90' as RotateMode,
    fill: false,
    strip: false,
    overlap: true,
    timeMs: 2000,
    seed: 1,
    maxSheets: 10,
    cell: 1,
    ...options,
  };
  const { usable, unplaced } = checkInput(items, o);
  const shapes = prepare(usable, o);
  for (const [key, shape] of shapes) {
    // Too large for the usable area in every allowed rotation: say so and leave it out.
    const fits = shape.masks.some((m) => m.maxX - m.minX <= o.width - 2 * o.margin && m.maxY - m.minY <= o.height - 2 * o.margin);
    if (!fits) {
      const name = shape.item.name ?? key;
      unplaced.push({
        key,
        name,
        count: shape.item.count,
        reason: `${name} (${shape.item.outline.widthMm.toFixed(1)} × ${shape.item.outline.heightMm.toFixed(1)} mm with its border) is larger than the print area less the margin.`,
      });
      shapes.delete(key);
    }
  }
  const requested = usable.reduce((s, i) => s + i.count, 0);
  const random = seeded(o.seed);
  // The constructive start: priority first, then the largest pieces, each at its best rotation.
  const base: Gene[] = [];
  for (const [key, shape] of shapes) for (let i = 0; i < shape.item.count; i++) base.push({ key, turn: -1 });
  base.sort(
    (a, b) =>
      (shapes.get(b.key)!.item.priority ?? 0) - (shapes.get(a.key)!.item.priority ?? 0) ||
      shapes.get(b.key)!.areaMm2 - shapes.get(a.key)!.areaMm2,
  );

  const run = (genes: Gene[]) => decode(genes, shapes, o, locked);

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
      return {
        key,
        name,
        count,
        reason: `${count} × ${name} did not fit on ${o.fill ? 'the sheet' : o.strip ? 'the strip' : `${o.maxSheets} sheets`}.`,
      };
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
    onProgress?.({
      iteration,
      placed: layout.placements.length,
      elapsedMs: Date.now() - started,
      sheets: layout.boards.length,
      areaUsed: layout.boards[0].usedArea / (o.width * o.height),
      length: o.strip ? layout.boards[0].bottom : undefined,
    });
  };

  let current = run(base);
  let best = current;
  let iterations = 1;
  report(best, iterations);
  if (
    o.overlap &&
    o.strip &&
    best.left.length === 0 &&
    base.length > 1 &&
    o.timeMs > Date.now() - started &&
    (o.maxIterations ?? Infinity) > 1
  ) {
    // Strip packing goes on from the constructive layout as a sequence of overlap searches.
    const strip = stripPhase(best.placements, phaseInput(shapes), {
      deadline: started + o.timeMs,
      random,
      shouldStop: o.shouldStop,
      maxTries: o.maxIterations === undefined ? undefined : o.maxIterations - 1,
      onBest: (bottom) =>
        onProgress?.({
          iteration: iterations,
          placed: best.placements.length,
          elapsedMs: Date.now() - started,
          sheets: 1,
          areaUsed: best.boards[0].usedArea / (o.width * o.height),
          length: bottom,
        }),
    });
    if (strip) return { ...resultOf(best, 1 + strip.tries), placements: strip.placements, length: strip.length, ms: Date.now() - started };
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
      const i =
        current.left.length && random() < 0.5
          ? genes.findIndex((g) => g.key === current.left[Math.floor(random() * current.left.length)])
          : Math.floor(random() * n);
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
    const searched = sheetPhase(best.placements, best.boards.length, o.fill, phaseInput(shapes), {
      deadline: started + o.timeMs,
      random,
      maxTries,
      shouldStop: o.shouldStop,
    });
    if (searched) {
      const areaOf = new Map([...shapes].map(([key, s]) => [key, s.areaMm2]));
      const sheets = Math.max(...searched.map((p) => p.sheet)) + 1;
      const areaUsed = Array.from(
        { length: sheets },
        (_, s) => searched.filter((p) => p.sheet === s).reduce((sum, p) => sum + areaOf.get(p.key)!, 0) / (o.width * o.height),
      );
      const result = {
        ...resultOf(best, iterations),
        placements: searched,
        sheets,
        placed: searched.length,
        areaUsed,
        ms: Date.now() - started,
      };
      o.onBest?.(result);
      onProgress?.({ iteration: iterations, placed: result.placed, elapsedMs: result.ms, sheets, areaUsed: areaUsed[0] });
      return result;
    }
  }
  onProgress?.({
    iteration: iterations,
    placed: best.placements.length,
    elapsedMs: Date.now() - started,
    sheets: best.boards.length,
    areaUsed: best.boards[0].usedArea / (o.width * o.height),
    length: o.strip ? best.boards[0].bottom : undefined,
  });
  return resultOf(best, iterations);

  /** What the overlap search needs of this run: every shape's grown turns, the area, the locked pieces. */
  function phaseInput(shapes: Map<string, Shape>) {
    return {
      items: [...shapes.values()].map((s) => s.item),
      locked,
      rotate: o.rotate,
      gap: o.gap,
      margin: o.margin,
      width: o.width,
      height: o.height,
    };
  }
}
