// The cut lines placed on one board, indexed for the exact checks: every try of the constructive
// decoder that the occupancy raster lets through is confirmed (or refused) here against the real
// polygons, by distance when there is a gap and by overlap at a gap of 0.
import type { Box, Ring } from '../geometry/polygon';
import { overlaps } from '../geometry/overlap';
import { closerThan } from '../sheet/placement';

/** Side of the buckets that index placed cut lines (mm). */
const BUCKET = 24;

export class PlacedLines {
  private readonly lines: Array<{ ring: Ring; box: Box }> = [];
  /** Placed lines by bucket of BUCKET mm (each listed in every bucket its box, grown by the gap, touches). */
  private readonly buckets = new Map<number, number[]>();
  /** Per line, the last check that looked at it (a line listed in several buckets is checked once). */
  private readonly seen: number[] = [];
  private stamp = 0;

  constructor(private readonly gap: number) {}

  add(ring: Ring, box: Box) {
    const index = this.lines.push({ ring, box }) - 1;
    this.seen.push(0);
    const g = this.gap;
    for (let by = Math.floor((box.y - g) / BUCKET); by <= Math.floor((box.y + box.height + g) / BUCKET); by++) {
      for (let bx = Math.floor((box.x - g) / BUCKET); bx <= Math.floor((box.x + box.width + g) / BUCKET); bx++) {
        const list = this.buckets.get(by * 4096 + bx);
        if (list) list.push(index);
        else this.buckets.set(by * 4096 + bx, [index]);
      }
    }
  }

  /**
   * Whether `shape` moved by (dx, dy) keeps the gap to every placed cut line; `box` is the moved
   * box. The moved ring is written into `trial` (the same ring when dx = dy = 0) only when some
   * placed box comes near, or at the end when none does: most tries are settled by the boxes alone.
   */
  freeAt(shape: Ring, dx: number, dy: number, trial: Ring, box: Box): boolean {
    const gap = this.gap;
    const stamp = ++this.stamp;
    let moved = shape === trial;
    // The buckets the ring's box touches, walked inline: this is the nester's innermost loop.
    const x0 = Math.floor(box.x / BUCKET),
      x1 = Math.floor((box.x + box.width) / BUCKET),
      y0 = Math.floor(box.y / BUCKET),
      y1 = Math.floor((box.y + box.height) / BUCKET);
    for (let by = y0; by <= y1; by++) {
      for (let bx = x0; bx <= x1; bx++) {
        const list = this.buckets.get(by * 4096 + bx);
        if (!list) continue;
        for (let k = 0; k < list.length; k++) {
          const index = list[k];
          if (this.seen[index] === stamp) continue;
          this.seen[index] = stamp;
          const placed = this.lines[index],
            b = placed.box;
          if (
            box.x > b.x + b.width + gap ||
            b.x > box.x + box.width + gap ||
            box.y > b.y + b.height + gap ||
            b.y > box.y + box.height + gap
          )
            continue;
          if (!moved) moved = moveInto(shape, dx, dy, trial);
          if (gap > 0 ? closerThan(trial, placed.ring, gap - 1e-6, box, b) : overlaps(trial, placed.ring)) return false;
        }
      }
    }
    if (!moved) moveInto(shape, dx, dy, trial);
    return true;
  }
}

/** Writes `shape` moved by (dx, dy) into `trial` (no ring made per try). */
function moveInto(shape: Ring, dx: number, dy: number, trial: Ring): true {
  for (let i = 0; i < trial.length; i++) {
    trial[i].x = shape[i].x + dx;
    trial[i].y = shape[i].y + dy;
  }
  return true;
}
