// The nester's raster masks against brute force: a cell is in a mask when its centre lies inside the
// cut line, or within the grown distance of such a cell's centre (the Euclidean distance, checked
// here cell by cell against every inside cell, with no distance transform and no runs).
import { describe, expect, it } from 'vitest';
import { shapeMask } from '@shared/arrange/raster';
import { pointInRing } from '@shared/sheet/placement';
import { blob, crescent, dumbbell, lShape, star } from '../../scripts/bench/arrange-shapes';

function bruteForce(mask: ReturnType<typeof shapeMask>, cell: number, grow: number): Set<string> {
  const { offsetX, offsetY } = mask;
  const h = mask.rows.length;
  const w = Math.max(1, ...mask.rows.flat().map(([, b]) => b + 1)) + 8;
  const inside: Array<[number, number]> = [];
  for (let j = -4; j < h + 4; j++)
    for (let i = -4; i < w; i++) {
      const centre = { x: (offsetX + i + 0.5) * cell, y: (offsetY + j + 0.5) * cell };
      if (pointInRing(centre, mask.ring)) inside.push([i, j]);
    }
  const limit = (grow / cell) ** 2;
  const set = new Set<string>();
  for (let j = -4; j < h + 4; j++)
    for (let i = -4; i < w; i++) if (inside.some(([a, b]) => (a - i) ** 2 + (b - j) ** 2 <= limit)) set.add(`${i},${j}`);
  return set;
}

function cellsOf(mask: ReturnType<typeof shapeMask>): Set<string> {
  const set = new Set<string>();
  mask.rows.forEach((runs, j) =>
    runs.forEach(([a, b]) => {
      for (let i = a; i <= b; i++) set.add(`${i},${j}`);
    }),
  );
  return set;
}

describe('raster masks of cut lines', () => {
  const shapes = { blob: blob(24, 0.7), star: star(30, 5), l: lShape(22, 7), crescent: crescent(26), bridge: dumbbell(12, 20) };
  for (const [name, outline] of Object.entries(shapes))
    for (const [rotation, grow, cell] of [
      [0, 0, 1],
      [90, 1.5875, 1],
      [37, 2.3, 1],
      [180, 5, 1],
      [15, 1.2, 0.5],
    ])
      it(`${name}, ${rotation}°, grown ${grow} mm on ${cell} mm cells: exactly the brute-force cells`, () => {
        const mask = shapeMask(outline, rotation, cell, grow);
        const got = cellsOf(mask);
        const want = bruteForce(mask, cell, grow);
        expect(got.size).toBeGreaterThan(0);
        expect([...want].filter((c) => !got.has(c))).toEqual([]);
        expect([...got].filter((c) => !want.has(c))).toEqual([]);
        // Every non-empty row is probed once, the widest first.
        const widths = mask.rows.map((r) => r.reduce((s, [a, b]) => s + b - a + 1, 0));
        expect([...mask.order].sort((a, b) => a - b)).toEqual(mask.rows.flatMap((r, j) => (r.length ? [j] : [])));
        expect(widths[mask.order[0]]).toBe(Math.max(...widths));
      });
});
