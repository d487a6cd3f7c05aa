// Several searches at once (one per thread, each with its own seed) and the best of them: more
// pieces, then fewer sheets, then a shorter strip, then more of the first sheet used.
import type { ArrangeResult } from './nester';

export function betterResult(a: ArrangeResult, b: ArrangeResult): boolean {
  if (a.placed !== b.placed) return a.placed > b.placed;
  if (a.sheets !== b.sheets) return a.sheets < b.sheets;
  if (a.length !== undefined && b.length !== undefined && a.length !== b.length) return a.length < b.length;
  return (a.areaUsed[0] ?? 0) > (b.areaUsed[0] ?? 0);
}

/**
 * The best of the threads' answers, given in thread order; of equal answers the first thread's, so
 * that a seed gives the same layout whichever thread finishes first.
 */
export function bestOfThreads(results: ArrangeResult[]): ArrangeResult {
  let best = results[0];
  for (const r of results.slice(1)) if (betterResult(r, best)) best = r;
  return best;
}

/** The seed of thread k: far apart, so no two threads walk the same path. */
export const threadSeed = (seed: number, k: number) => seed + k * 7919;

/** Threads worth starting on a machine with this many cores: one left for the page or the server. */
export const threadsFor = (cores: number, most = 4) => Math.max(1, Math.min(most, cores - 1));
