// Strip packing as a sequence of feasibility problems (Gardeyn, Vanden Berghe & Wauters 2025; the
// same idea as Umetani et al. 2009 and Imamichi et al. 2009): from a layout without overlap, make the
// strip a little shorter, push the pieces that now stick out back in, and let the separator remove
// the overlap that made. Success is the new best; failure goes back to the best and tries again with
// a smaller cut. The first part of the time explores with larger cuts; the rest compresses with small
// ones and more patience.
import type { Layout } from './separator';

export type StripOptions = {
  deadline: number;
  random: () => number;
  shouldStop?: () => boolean;
  /** At most this many shortening tries (a seed then gives the same layout whatever the machine's speed). */
  maxTries?: number;
  /** Told each shorter layout without overlap. */
  onBest?: (length: number) => void;
};

/** The used length: the lowest point of any cut line (y grows along the strip). */
function usedLength(layout: Layout): number {
  let bottom = layout.area.y0;
  for (const p of layout.pieces) bottom = Math.max(bottom, p.y + p.variants[p.v].by1);
  return bottom;
}

/** Shortens the strip of a layout without overlap for as long as time allows; ends at the best. */
export function shortenStrip(layout: Layout, o: StripOptions): { length: number; tries: number } {
  const started = Date.now(),
    total = Math.max(1, o.deadline - started);
  let best = layout.snapshot(),
    bestLength = usedLength(layout);
  layout.area = { ...layout.area, y1: bestLength };
  let ratio = 0.01,
    tries = 0;
  for (; tries < (o.maxTries ?? Infinity) && Date.now() < o.deadline && !o.shouldStop?.(); tries++) {
    const exploring = o.maxTries === undefined ? Date.now() - started < total * 0.75 : tries < o.maxTries * 0.75;
    const cut = exploring ? ratio * (0.5 + o.random()) : 0.001 + o.random() * 0.004;
    const target = bestLength * (1 - cut);
    layout.restore(best);
    layout.area = { ...layout.area, y1: target };
    // Pieces past the new end slide back inside; the overlap this makes is the separator's to remove.
    for (let i = 0; i < layout.length; i++) {
      const p = layout.pieces[i],
        s = p.variants[p.v];
      if (!p.fixed && p.y + s.by1 > target) layout.moveTo(i, p.v, p.x, Math.max(layout.area.y0 - s.by0, target - s.by1));
    }
    layout.resetWeights();
    let ok = false;
    // A failed try leaves the least overlap it found; shaking that up (two large pieces trade places)
    // and trying again costs less than starting over.
    for (let attempt = 0; attempt < 3 && !ok && Date.now() < o.deadline; attempt++) {
      if (attempt > 0) swapLarge(layout, o.random);
      // No one try may eat the budget: a hopeless length costs at most a twentieth of the time (not
      // when the tries are counted, so that a seed gives the same layout on any machine).
      const cap = o.maxTries === undefined ? Date.now() + Math.max(500, total / 20) : Infinity;
      ok = layout.separate({
        strikes: exploring ? 3 : 5,
        roundsWithoutGain: exploring ? 100 : 50,
        deadline: Math.min(o.deadline, cap),
        random: o.random,
        shouldStop: o.shouldStop,
      });
    }
    if (ok) {
      best = layout.snapshot();
      bestLength = usedLength(layout);
      o.onBest?.(bestLength);
      ratio = Math.min(0.03, ratio * 1.1);
    } else ratio = Math.max(0.003, ratio * 0.8);
  }
  layout.restore(best);
  layout.area = { ...layout.area, y1: bestLength };
  return { length: bestLength, tries };
}

/** Two of the larger pieces (area above the median) of different shapes trade places. */
function swapLarge(layout: Layout, random: () => number) {
  const movable = layout.pieces.map((p, i) => ({ p, i })).filter(({ p }) => !p.fixed);
  if (movable.length < 2) return;
  const areas = movable.map(({ p }) => p.variants[p.v].area).sort((a, b) => a - b);
  const median = areas[areas.length >> 1];
  const large = movable.filter(({ p }) => p.variants[p.v].area >= median);
  for (let tries = 0; tries < 10; tries++) {
    const a = large[Math.floor(random() * large.length)],
      b = large[Math.floor(random() * large.length)];
    if (a.i === b.i || a.p.variants === b.p.variants) continue;
    const ra = layout.range(a.i, a.p.v),
      rb = layout.range(b.i, b.p.v);
    if (!ra || !rb) continue;
    const clamp = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v));
    const [ax, ay, bx, by] = [a.p.x, a.p.y, b.p.x, b.p.y];
    layout.moveTo(a.i, a.p.v, clamp(bx, ra.x0, ra.x1), clamp(by, ra.y0, ra.y1));
    layout.moveTo(b.i, b.p.v, clamp(ax, rb.x0, rb.x1), clamp(ay, rb.y0, rb.y1));
    return;
  }
}
