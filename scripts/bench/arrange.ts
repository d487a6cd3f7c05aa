// npm run bench:arrange: fills a 6.75 × 9.25 in print area (1/8 in gap and margin, 90° turns) with
// a repeating mix of twelve irregular shapes, by our nester and, in the same run, by a bounding-box
// rectangle packer from npm (maxrects-packer) as the baseline. Prints pieces, area used, time, ratio.
import { MaxRectsPacker } from 'maxrects-packer/dist/maxrects-packer.mjs';
import { arrange } from '@shared/arrange/nester';
import { area } from '@shared/geometry/polygon';
import { benchmarkSet } from './arrange-shapes';

const W = 171.45,
  H = 234.95,
  GAP = 3.175,
  MARGIN = 3.175;
const set = benchmarkSet();
const areaOf = new Map(set.map((s) => [s.key, area(s.outline.points)]));

function baseline() {
  const started = performance.now();
  // Each piece as its box grown by the gap; the usable area grows by the gap too (half on each side).
  const packer = new MaxRectsPacker(W - 2 * MARGIN + GAP, H - 2 * MARGIN + GAP, 0, {
    smart: true,
    pot: false,
    square: false,
    allowRotation: true,
  });
  let placed = 0,
    used = 0;
  for (let round = 0; round < 50; round++) {
    let any = false;
    for (const s of set) {
      packer.add(s.outline.widthMm + GAP, s.outline.heightMm + GAP, { key: s.key });
      if (packer.bins.length > 1) {
        packer.bins.pop(); // it opened a second sheet: this piece does not fit on the first
        continue;
      }
      placed++;
      used += areaOf.get(s.key)!;
      any = true;
    }
    if (!any) break;
  }
  return { placed, areaUsed: used / (W * H), ms: performance.now() - started };
}

function ours() {
  const started = performance.now();
  const result = arrange(
    set.map((s) => ({ ...s, count: 1 })),
    { width: W, height: H, gap: GAP, margin: MARGIN, rotate: '90', fill: true, timeMs: 2000, seed: 1 },
  );
  return { placed: result.placed, areaUsed: result.areaUsed[0], ms: performance.now() - started, iterations: result.iterations };
}

const b = baseline();
const o = ours();
console.log('arrange benchmark: fill a 6.75 × 9.25 in area, 1/8 in gap and margin, 12 irregular shapes repeated, 90° turns');
console.log(`bounding boxes (maxrects-packer): ${b.placed} pieces, ${(b.areaUsed * 100).toFixed(1)} % area used, ${b.ms.toFixed(0)} ms`);
console.log(
  `true shapes (Sheetsmith):         ${o.placed} pieces, ${(o.areaUsed * 100).toFixed(1)} % area used, ${o.ms.toFixed(0)} ms, ${o.iterations} layouts tried`,
);
console.log(`ratio: ${(o.placed / b.placed).toFixed(2)} × the pieces (${((o.placed / b.placed - 1) * 100).toFixed(0)} % more)`);
