import { describe, expect, it } from 'vitest';
import { squaredDistanceTransform } from './distance-transform';

/** Every pixel's squared distance equals the least over every feature pixel, found one by one. */
function expectBruteForce(feature: Uint8Array, width: number, height: number) {
  const fast = squaredDistanceTransform(feature, width, height);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      let best = Infinity;
      for (let j = 0; j < height; j++)
        for (let i = 0; i < width; i++) if (feature[j * width + i]) best = Math.min(best, (i - x) ** 2 + (j - y) ** 2);
      expect(fast[y * width + x], `${x}, ${y}`).toBe(best);
    }
  }
}

describe('Euclidean distance transform (Felzenszwalb & Huttenlocher 2012)', () => {
  it('matches brute force on random sparse features', () => {
    const width = 37,
      height = 23;
    let seed = 7;
    const random = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
    const feature = new Uint8Array(width * height).map(() => (random() < 0.03 ? 1 : 0));
    feature[5] = 1;
    expectBruteForce(feature, width, height);
  });

  it('matches brute force on solid shapes (long runs of features, whose inner sites it skips)', () => {
    const width = 41,
      height = 29;
    const feature = new Uint8Array(width * height);
    for (let y = 0; y < height; y++)
      for (let x = 0; x < width; x++)
        if ((x - 12) ** 2 + (y - 10) ** 2 < 49 || (x > 25 && x < 38 && y > 14 && y < 24) || (y === 3 && x > 20)) feature[y * width + x] = 1;
    expectBruteForce(feature, width, height);
  });

  it('with a reach, is exact up to it and above it beyond (features far down a column are left out)', () => {
    const width = 53,
      height = 47;
    let seed = 11;
    const random = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
    const feature = new Uint8Array(width * height);
    for (let y = 0; y < height; y++)
      for (let x = 0; x < width; x++) if ((x - 20) ** 2 + (y - 25) ** 2 < 100 || random() < 0.004) feature[y * width + x] = 1;
    const full = squaredDistanceTransform(feature, width, height);
    for (const reach of [0, 1, 3.5, 7, 12]) {
      const near = squaredDistanceTransform(feature, width, height, undefined, reach);
      let beyond = 0;
      for (let i = 0; i < full.length; i++) {
        if (full[i] <= reach * reach) expect(near[i], `pixel ${i}, reach ${reach}`).toBe(full[i]);
        else {
          expect(near[i], `pixel ${i}, reach ${reach}`).toBeGreaterThan(reach * reach);
          beyond++;
        }
      }
      expect(beyond).toBeGreaterThan(0);
    }
  });

  it('is exact, not a square or diamond kernel: a single point gives (dx² + dy²)', () => {
    const feature = new Uint8Array(21 * 21);
    feature[10 * 21 + 10] = 1;
    const d = squaredDistanceTransform(feature, 21, 21);
    expect(d[0]).toBe(200); // corner: 10² + 10²
    expect(d[10 * 21 + 17]).toBe(49);
    expect(d[13 * 21 + 14]).toBe(25); // 3-4-5 triangle
  });
});
