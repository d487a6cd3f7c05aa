import { describe, expect, it } from 'vitest';
import { distanceTransform } from '@shared/geometry/distance-transform';
import { nearSet } from './morphology';
import { erodeRuns, maskOfRuns, runsOfAlpha, runsOfMask } from './runs';

/** Random blobs and specks on a small canvas, repeatable. */
function randomMask(width: number, height: number, seed: number): Uint8Array {
  let a = seed;
  const random = () => (a = (a * 1103515245 + 12345) % 2147483648) / 2147483648;
  const mask = new Uint8Array(width * height);
  for (let k = 0; k < 12; k++) {
    const cx = random() * width,
      cy = random() * height,
      r = 1 + random() * 9;
    for (let y = 0; y < height; y++) for (let x = 0; x < width; x++) if ((x - cx) ** 2 + (y - cy) ** 2 < r * r) mask[y * width + x] = 1;
  }
  return mask;
}

describe('disk stamping around the edge of a set', () => {
  // The reference: an exact Euclidean distance transform (Felzenszwalb & Huttenlocher 2012)
  // thresholded, over every pixel of the canvas.
  for (const [radius, inclusive] of [
    [6.5, false],
    [6.5, true],
    [3, false],
    [3, true],
    [18.2, false],
    [0.5, false],
    [1, true],
  ] as const) {
    it(`marks exactly the pixels ${inclusive ? 'at most' : 'less than'} ${radius} px from the set`, () => {
      for (const seed of [1, 2, 3, 4]) {
        const width = 61,
          height = 47;
        const set = randomMask(width, height, seed);
        const distance = distanceTransform(set, width, height);
        const ours = nearSet(set, width, height, radius, inclusive);
        for (let i = 0; i < set.length; i++)
          expect(ours[i], `pixel ${i % width}, ${Math.floor(i / width)}`).toBe(
            (inclusive ? distance[i] <= radius : distance[i] < radius) ? 1 : 0,
          );
      }
    });
  }
});

describe('erosion on runs', () => {
  // Reference: the exact distance transform of the outside, thresholded (an inward offset by r
  // keeps the pixels farther than r + 0.5 from every canvas pixel outside the set).
  for (const r of [1, 2.5, 6]) {
    it(`keeps exactly the pixels farther than ${r} + 0.5 px from the outside`, () => {
      for (const seed of [5, 6, 7]) {
        const width = 61,
          height = 47;
        const set = randomMask(width, height, seed);
        const outside = set.map((v) => (v ? 0 : 1));
        const distance = distanceTransform(outside, width, height);
        const ours = maskOfRuns(erodeRuns(runsOfMask(set, width, height), r));
        for (let i = 0; i < set.length; i++)
          expect(ours[i], `pixel ${i % width}, ${Math.floor(i / width)}`).toBe(set[i] && distance[i] >= r + 0.5 ? 1 : 0);
      }
    });
  }
});

describe('runs of alpha', () => {
  it('reads the same runs from whole pixels and from single bytes, at every threshold', () => {
    const width = 37,
      height = 9;
    // Every alpha value appears, including 0 and 255 and the values either side of the thresholds.
    const bytes = new Uint8Array(4 * width * height);
    for (let i = 0; i < width * height; i++) {
      const alpha = (i * 7) % 256;
      bytes.set(i % 3 === 0 ? [0, 0, 0, alpha] : [(i * 31) & 255, (i * 17) & 255, 255 - alpha, alpha], 4 * i);
    }
    const aligned = bytes.subarray(0, 4 * width * height); // read a word at a time
    const unaligned = new Uint8Array(new ArrayBuffer(4 * width * height + 1), 1, 4 * width * height); // a byte at a time
    unaligned.set(aligned);
    for (const threshold of [0, 1, 48, 128, 255]) {
      const rows = (r: ReturnType<typeof runsOfAlpha>) =>
        Array.from({ length: height }, (_, y) =>
          Array.from({ length: width }, (_, x) => {
            for (let k = r.rowStart[y]; k < r.rowStart[y + 1]; k++) if (x >= r.starts[k] && x < r.ends[k]) return 1;
            return 0;
          }).join(''),
        );
      const expected = Array.from({ length: height }, (_, y) =>
        Array.from({ length: width }, (_, x) => (((y * width + x) * 7) % 256 >= threshold ? 1 : 0)).join(''),
      );
      expect(rows(runsOfAlpha(aligned, width, height, threshold))).toEqual(expected);
      expect(rows(runsOfAlpha(unaligned, width, height, threshold))).toEqual(expected);
    }
  });
});
