// npm run bench:outline: outlines generated art of 1, 4 and 16 megapixels and compares each with
// the floor measured in the same run on the same files: sharp decode + raw pixel read alone. The
// outline is timed where the app and `npm run worker` run it, on an outline thread (one thread, the
// file sent in and the stickers sent back), and beside it called in this thread.
import sharp from 'sharp';
import { outline } from '../../server/engine/outline/outline';
import { OutlinePool } from '../../server/engine/outline/pool';

const SIZES = [
  { label: '1 MP', width: 1000, height: 1000 },
  { label: '4 MP', width: 2000, height: 2000 },
  { label: '16 MP', width: 4000, height: 4000 },
];
const RUNS = Number(process.env.BENCH_RUNS ?? 9);
// A worker outlines piece after piece: measured warm (the same warm-up for the floor and for ours).
const WARM_UP = 5;

/** Watercolour-like test art: soft blobs, a hole, a speck, on transparency. */
function makeArt(width: number, height: number): Promise<Buffer> {
  const s = width / 1000;
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}">
    <defs><filter id="soft"><feGaussianBlur stdDeviation="${8 * s}"/></filter></defs>
    <g filter="url(#soft)">
      <ellipse cx="${450 * s}" cy="${520 * s}" rx="${330 * s}" ry="${260 * s}" fill="#5b8c5a" opacity="0.85"/>
      <circle cx="${650 * s}" cy="${330 * s}" r="${170 * s}" fill="#e07a5f" opacity="0.8"/>
      <path d="M${200 * s} ${700 * s} q${150 * s} ${200 * s} ${400 * s} ${120 * s}" stroke="#3d405b" stroke-width="${40 * s}" fill="none"/>
    </g>
    <circle cx="${450 * s}" cy="${520 * s}" r="${60 * s}" fill="none" stroke="#3d405b" stroke-width="${24 * s}"/>
    <circle cx="${940 * s}" cy="${60 * s}" r="${3 * s}" fill="#000"/>
  </svg>`;
  return sharp(Buffer.from(svg)).png().toBuffer();
}

async function time(fn: () => Promise<unknown>): Promise<number> {
  const samples: number[] = [];
  for (let i = 0; i < WARM_UP; i++) await fn();
  for (let i = 0; i < RUNS; i++) {
    const start = performance.now();
    await fn();
    samples.push(performance.now() - start);
  }
  return samples.sort((a, b) => a - b)[samples.length >> 1]; // median
}

sharp.concurrency(1); // one core, as a worker thread has
console.log(`outline benchmark: median of ${RUNS} runs, art printed 2 in wide with a 3 mm border at 300 DPI (the CLI's example)`);
console.log('size   | file KB | floor ms (decode+raw) | outline ms (outline thread) | ratio | outline ms (this thread)');
const pool = new OutlinePool(undefined, 1);
for (const size of SIZES) {
  const file = await makeArt(size.width, size.height);
  const options = { width: '2in', border: '3mm' };
  const floor = await time(() => sharp(file).ensureAlpha().raw().toBuffer());
  const ours = await time(() => pool.run(file, options));
  const here = await time(() => outline(file, options));
  console.log(
    `${size.label.padEnd(6)} | ${String(Math.round(file.length / 1024)).padStart(7)} | ${floor.toFixed(1).padStart(21)} | ${ours.toFixed(1).padStart(27)} | ${(ours / floor).toFixed(2).padStart(5)} | ${here.toFixed(1)}`,
  );
}
await pool.close();
