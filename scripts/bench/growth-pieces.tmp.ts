import { blob, crescent, disk, dumbbell, lShape, star, tShape } from './arrange-shapes';
import type { ArrangeItem } from '../../shared/arrange/nester';
const makers = [(d: number, i: number) => blob(d, i * 0.37), (d: number) => star(d, 5), (d: number) => lShape(d, d * 0.3), (d: number) => tShape(d, d * 0.3), (d: number) => crescent(d), (d: number) => dumbbell(d * 0.45, d * 0.7), (d: number) => disk(d), (d: number) => star(d, 6)];

export function mixedPieces(n: number): ArrangeItem[] {
  // Sizes spread over 20–40 mm by a fixed low-discrepancy sequence: repeatable, no two alike.
  return Array.from({ length: n }, (_, i) => {
    const d = 20 + 20 * ((i * 0.618034) % 1);
    return { key: `p${i}`, outline: makers[i % makers.length](d, i), count: 1 };
  });
}

