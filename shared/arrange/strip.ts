// Strip packing as a sequence of feasibility problems (Gardeyn, Vanden Berghe & Wauters 2025; the
// same idea as Umetani et al. 2009 and Imamichi et al. 2009): from a layout without overlap, make the
// strip a little shorter, push the pieces that now stick out back in, and let the separator remove
// the overlap that made.
//
// Exploring (the first three quarters of the time): after a success the strip is cut by 0.5 % again;
// after a failure the length stays, and the search goes on from one of the failed layouts at that
// length (the least overlapping most often: a rank drawn from a half-normal law), shaken up by two
// large pieces trading places. Failed layouts at the length hold what was learnt about it; going
// back to the last layout without overlap each time threw that away (measured at 60 s on swim,
// seeds 1–4: 0.920 → 0.938 of the reference density, the other instances within the seeds' spread).
// Compressing (the rest): from the best layout, small cuts (0.05 % shrinking to 0.001 %) with more
// patience; a failure goes back to the best.
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

type State = ReturnType<Layout['snapshot']>;
type Search = { best: State; bestLength: number; tries: number };

const EXPLORING_SHARE = 0.75;
const EXPLORING_CUT = 0.005;
// Compressing cuts shrink with time from 0.05 % to 0.001 % of the length, as in the paper. Against
// random cuts of 0.1–0.5 %, at 60 s on swim seeds 1–6 every seed gained (0.9375 → 0.9407 of the
// reference density on average); albano and mao rose, jakobs1 and shapes0 stayed within the seeds' spread.
const COMPRESS_CUT_START = 0.0005,
  COMPRESS_CUT_END = 0.00001;
// Each round of the separator makes two move passes from the same layout in different orders and
// keeps the less overlapping (the paper's parallel workers, one after another on one core). At 60 s
// on seeds 1–4 against one pass: swim 0.940 → 0.946 of the reference density (seeds 5–8 0.948),
// shapes0 0.957 → 0.961, jakobs2 0.947 either way; three passes gave swim 0.946 and shapes0 0.952.
// Other random draws move swim's mean by nearly as much (0.941 over seeds 1–8 in a variant that only
// drew differently); on seeds 9–16, not used to choose, two passes gave 0.947 and one 0.937.
const PASSES = 2;

/** The used length: the lowest point of any cut line (y grows along the strip). */
function usedLength(layout: Layout): number {
  let bottom = layout.area.y0;
  for (const p of layout.pieces) bottom = Math.max(bottom, p.y + p.variants[p.v].by1);
  return bottom;
}

/** The best layout on a strip cut to `target`: pieces past the new end slide back inside. */
function cutTo(layout: Layout, best: State, target: number) {
  layout.restore(best);
  layout.area = { ...layout.area, y1: target };
  for (let i = 0; i < layout.length; i++) {
    const p = layout.pieces[i],
      s = p.variants[p.v];
    if (!p.fixed && p.y + s.by1 > target) layout.moveTo(i, p.v, p.x, Math.max(layout.area.y0 - s.by0, target - s.by1));
  }
  layout.resetWeights();
}

function succeeded(layout: Layout, search: Search, o: StripOptions) {
  search.best = layout.snapshot();
  search.bestLength = usedLength(layout);
  o.onBest?.(search.bestLength);
}

/** Shortens the strip of a layout without overlap for as long as time allows; ends at the best. */
export function shortenStrip(layout: Layout, o: StripOptions): { length: number; tries: number } {
  const started = Date.now(),
    total = Math.max(1, o.deadline - started);
  const search: Search = { best: layout.snapshot(), bestLength: usedLength(layout), tries: 0 };
  layout.area = { ...layout.area, y1: search.bestLength };
  const counted = o.maxTries !== undefined;
  const running = () => search.tries < (o.maxTries ?? Infinity) && Date.now() < o.deadline && !o.shouldStop?.();
  explore(layout, search, o, counted ? o.deadline : started + total * EXPLORING_SHARE, running);
  compress(layout, search, o, total, running);
  layout.restore(search.best);
  layout.area = { ...layout.area, y1: search.bestLength };
  return { length: search.bestLength, tries: search.tries };
}

function explore(layout: Layout, search: Search, o: StripOptions, until: number, running: () => boolean) {
  const limit = o.maxTries === undefined ? Infinity : Math.floor(o.maxTries * EXPLORING_SHARE);
  cutTo(layout, search.best, search.bestLength * (1 - EXPLORING_CUT));
  let failed: Array<{ state: State; overlap: number }> = [];
  for (; search.tries < limit && running() && Date.now() < until; search.tries++) {
    const ok = layout.separate({
      strikes: 3,
      roundsWithoutGain: 100,
      passes: PASSES,
      deadline: until,
      random: o.random,
      shouldStop: o.shouldStop,
    });
    if (ok) {
      succeeded(layout, search, o);
      failed = [];
      cutTo(layout, search.best, search.bestLength * (1 - EXPLORING_CUT));
      continue;
    }
    const overlap = layout.totalOverlap();
    let at = failed.findIndex((f) => f.overlap > overlap);
    if (at < 0) at = failed.length;
    failed.splice(at, 0, { state: layout.snapshot(), overlap });
    // The hundred least overlapping are plenty to draw from, and a long run's memory stays bounded.
    if (failed.length > 100) failed.pop();
    // A rank from |N(0, 0.25)| (Box–Muller) over the failed layouts, the least overlap first.
    const normal = Math.sqrt(-2 * Math.log(1 - o.random())) * Math.cos(2 * Math.PI * o.random());
    const from = failed[Math.floor(Math.min(0.999, Math.abs(normal) * 0.25) * failed.length)];
    layout.restore(from.state);
    layout.resetWeights();
    swapLarge(layout, o.random);
  }
}

function compress(layout: Layout, search: Search, o: StripOptions, total: number, running: () => boolean) {
  const from = Date.now(),
    span = Math.max(1, o.deadline - from),
    firstTry = search.tries;
  // How far through compressing: by the clock, or by the tries when they are counted (so that a
  // seed gives the same layout on any machine).
  const progress = () =>
    o.maxTries === undefined
      ? Math.min(1, (Date.now() - from) / span)
      : Math.min(1, (search.tries - firstTry) / Math.max(1, o.maxTries - firstTry));
  for (; running(); search.tries++) {
    const cut = COMPRESS_CUT_START + (COMPRESS_CUT_END - COMPRESS_CUT_START) * progress();
    cutTo(layout, search.best, search.bestLength * (1 - cut));
    let ok = false;
    // A failed try leaves the least overlap it found; shaking that up (two large pieces trade places)
    // and trying again costs less than starting over.
    for (let attempt = 0; attempt < 3 && !ok && Date.now() < o.deadline; attempt++) {
      if (attempt > 0) swapLarge(layout, o.random);
      // No one try may eat the budget: a hopeless length costs at most a twentieth of the time (not
      // when the tries are counted, so that a seed gives the same layout on any machine).
      const cap = o.maxTries === undefined ? Date.now() + Math.max(500, total / 20) : Infinity;
      ok = layout.separate({
        strikes: 5,
        roundsWithoutGain: 50,
        passes: PASSES,
        deadline: Math.min(o.deadline, cap),
        random: o.random,
        shouldStop: o.shouldStop,
      });
    }
    if (ok) succeeded(layout, search, o);
  }
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
