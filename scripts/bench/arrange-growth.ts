// npm run bench:arrange-growth: how one constructive pass (no search) grows with the number of pieces.
// N distinct mixed pieces of 20–40 mm (the benchmark shapes at varied sizes, so no two share a mask),
// quarter turns, 1/8 in gap, in a 600 mm wide strip. The baseline, measured in the same run, is the
// same pass over 10 pieces: the ratio says how far from linear growth the pass is (N/10 when linear).
import { arrange } from '@shared/arrange/nester';
import type { ArrangeItem } from '@shared/arrange/nester';
import { blob, crescent, disk, dumbbell, lShape, star, tShape } from './arrange-shapes';

const makers = [
  (d: number, i: number) => blob(d, i * 0.37),
  (d: number) => star(d, 5),
  (d: number) => lShape(d, d * 0.3),
  (d: number) => tShape(d, d * 0.3),
  (d: number) => crescent(d),
  (d: number) => dumbbell(d * 0.45, d * 0.7),
  (d: number) => disk(d),
  (d: number) => star(d, 6),
];

export function mixedPieces(n: number): ArrangeItem[] {
  // Sizes spread over 20–40 mm by a fixed low-discrepancy sequence: repeatable, no two alike.
  return Array.from({ length: n }, (_, i) => {
    const d = 20 + 20 * ((i * 0.618034) % 1);
    return { key: `p${i}`, outline: makers[i % makers.length](d, i), count: 1 };
  });
}

function pass(n: number) {
  const started = performance.now();
  const r = arrange(mixedPieces(n), {
    width: 600,
    height: 4000,
    strip: true,
    gap: 3.175,
    margin: 0,
    rotate: '90',
    maxIterations: 1,
    seed: 1,
  });
  return { n, placed: r.placed, ms: performance.now() - started };
}

const sizes = (process.argv[2] ?? '10,50,100,200,400').split(',').map(Number);
pass(10); // warm the JIT
const runs = sizes.map(pass);
const base = runs.find((r) => r.n === 10) ?? pass(10);
console.log('one constructive pass, N distinct mixed pieces of 20–40 mm, quarter turns, 3.175 mm gap, 600 mm strip');
for (const r of runs)
  console.log(
    `${String(r.n).padStart(4)} pieces: ${r.placed} placed, ${r.ms.toFixed(0).padStart(6)} ms, ${(r.ms / base.ms).toFixed(1).padStart(6)} × the 10-piece pass (linear would be ${(r.n / 10).toFixed(0)} ×)`,
  );
for (let i = 1; i < runs.length; i++) {
  const a = runs[i - 1],
    b = runs[i];
  console.log(`growth ${a.n}→${b.n}: N^${(Math.log(b.ms / a.ms) / Math.log(b.n / a.n)).toFixed(2)}`);
}
