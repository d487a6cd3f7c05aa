// The overlap search on sheets: after the constructive pass, "fill the sheet" keeps adding pieces
// (the art with the fewest copies first, so the mix stays even) for as long as the separator can make
// room, and a quantity spread over several sheets tries to empty its last sheet into the others.
import type { Area, Placed } from './improve';
import { exactlyValid, layoutOf, placementsOf } from './improve';
import { insertPiece } from './insert';
import type { Layout } from './separator';
import type { Variant } from './shapes';

type SheetSearch = {
  variantsOf: (key: string) => Variant[];
  area: Area;
  gap: number;
  deadline: number;
  random: () => number;
  shouldStop?: () => boolean;
  /** At most this many insertion tries (for repeatable runs). */
  maxTries?: number;
};

const running = (o: SheetSearch, tries: number) => tries < (o.maxTries ?? Infinity) && Date.now() < o.deadline && !o.shouldStop?.();

/** More copies on one sheet; returns the placements when it added any (checked exactly), else null. */
export function fillSheet(
  placed: Placed[],
  fixed: Placed[],
  itemKeys: string[],
  o: SheetSearch,
  onBest?: (placements: Placed[]) => void,
): Placed[] | null {
  const { layout, keys } = layoutOf(placed, o.variantsOf, o.area, fixed);
  const counts = new Map(itemKeys.map((k) => [k, 0]));
  for (const p of placed) counts.set(p.key, (counts.get(p.key) ?? 0) + 1);
  const failures = new Map<string, number>();
  let best: Placed[] | null = null;
  // Each art may fail twice; once every art has, and time is left, each gets two more tries (the
  // separator starts from random spots, so a try that failed may succeed), up to eight in all.
  let allowed = 2;
  const openArt = () => itemKeys.filter((k) => (failures.get(k) ?? 0) < allowed);
  for (let tries = 0; running(o, tries); tries++) {
    if (openArt().length === 0 && allowed < 8) allowed += 2;
    const open = openArt();
    if (open.length === 0) break;
    // The mix stays even within four copies; among those, the smallest art goes first (it fits most often).
    const fewest = Math.min(...open.map((k) => counts.get(k)!));
    const key = open
      .filter((k) => counts.get(k)! <= fewest + 4)
      .reduce((a, b) => (o.variantsOf(b)[0].area < o.variantsOf(a)[0].area ? b : a));
    if (add(layout, keys, key, o)) {
      counts.set(key, counts.get(key)! + 1);
      best = placementsOf(layout, keys);
      onBest?.(best);
    } else failures.set(key, (failures.get(key) ?? 0) + 1);
  }
  return best;
}

/**
 * Moves the pieces of the last sheet onto the earlier ones where the separator can make room;
 * returns the sheets' new placements when the last sheet ends empty, else null.
 */
export function emptyLastSheet(sheets: Placed[][], fixed: Placed[], o: SheetSearch): Placed[][] | null {
  const last = sheets[sheets.length - 1];
  const layouts = sheets.slice(0, -1).map((placed, s) => layoutOf(placed, o.variantsOf, o.area, s === 0 ? fixed : []));
  // Largest first: they are the hardest to fit, and the small ones fill what is left.
  const waiting = [...last].sort((a, b) => o.variantsOf(b.key)[0].area - o.variantsOf(a.key)[0].area);
  let tries = 0;
  for (const piece of waiting) {
    let done = false;
    for (const { layout, keys } of layouts) {
      if (!running(o, tries++)) return null;
      if (add(layout, keys, piece.key, o)) {
        done = true;
        break;
      }
    }
    if (!done) return null;
  }
  return layouts.map(({ layout, keys }) => placementsOf(layout, keys));
}

function add(layout: Layout, keys: string[], key: string, o: SheetSearch): boolean {
  const before = layout.snapshot();
  if (!insertPiece(layout, o.variantsOf(key), o)) return false;
  if (exactlyValid(layout, o.gap)) {
    keys.push(key);
    return true;
  }
  // The grown shapes agreed but the cut lines do not (it should not happen): undo.
  layout.pop();
  layout.restore(before);
  return false;
}
