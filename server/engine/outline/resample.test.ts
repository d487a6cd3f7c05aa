import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import type { Box } from '@shared/geometry/polygon';
import { downscaleArea } from './resample';

/**
 * The area average written straight from its definition (a box filter: each output pixel the
 * integral of the source over the area it covers, divided by that area), premultiplied by alpha as
 * compositing needs (Porter & Duff 1984): one double sum per output pixel over every source pixel it
 * touches, each weighted by the overlap of the two squares.
 */
function areaAverage(src: Uint8Array, width: number, box: Box, outW: number, outH: number): number[] {
  const sx = box.width / outW,
    sy = box.height / outH;
  const out: number[] = [];
  for (let y = 0; y < outH; y++)
    for (let x = 0; x < outW; x++) {
      let r = 0,
        g = 0,
        b = 0,
        a = 0;
      for (let k = Math.floor(y * sy); k < Math.ceil((y + 1) * sy); k++)
        for (let c = Math.floor(x * sx); c < Math.ceil((x + 1) * sx); c++) {
          const overlap = (Math.min(k + 1, (y + 1) * sy) - Math.max(k, y * sy)) * (Math.min(c + 1, (x + 1) * sx) - Math.max(c, x * sx));
          const p = ((box.y + k) * width + box.x + c) * 4;
          const weight = src[p + 3] * overlap;
          r += src[p] * weight;
          g += src[p + 1] * weight;
          b += src[p + 2] * weight;
          a += weight;
        }
      out.push(...(a > 0 ? [r / a, g / a, b / a, a / (sx * sy)].map(Math.round) : [0, 0, 0, 0]));
    }
  return out;
}

/** Noise with every fifth pixel fully transparent, repeatable. */
function noise(width: number, height: number, seed: number): Buffer {
  let s = seed;
  const random = () => (s = (s * 1103515245 + 12345) % 2147483648) >> 16;
  const out = Buffer.alloc(width * height * 4);
  for (let i = 0; i < out.length; i++) out[i] = random() & 0xff;
  for (let i = 3; i < out.length; i += 20) out[i] = 0;
  return out;
}

describe('downscaleArea', () => {
  for (const [outW, outH, box] of [
    [5, 4, { x: 1, y: 2, width: 20, height: 13 }], // 4 × 3.25: straddling rows
    [7, 5, { x: 0, y: 0, width: 23, height: 17 }], // 3.29 × 3.4, the whole image
    [4, 3, { x: 2, y: 1, width: 12, height: 9 }], // exactly 3 × 3
    [9, 7, { x: 3, y: 0, width: 19, height: 15 }], // 2.11 × 2.14, just over the smallest factor used
  ] as const) {
    it(`matches the area average's definition, ${box.width} × ${box.height} px to ${outW} × ${outH}`, () => {
      for (const seed of [1, 2, 3]) {
        const src = noise(23, 17, seed);
        expect([...downscaleArea(src, 23, box, outW, outH)]).toEqual(areaAverage(src, 23, box, outW, outH));
      }
    });
  }

  it('lends no colour from transparent pixels and keeps the coverage as alpha', () => {
    // Two pixels into one: opaque red beside transparent green is red at half coverage.
    const src = Buffer.from([255, 0, 0, 255, 0, 255, 0, 0, 255, 0, 0, 255, 0, 255, 0, 0]);
    expect([...downscaleArea(src, 2, { x: 0, y: 0, width: 2, height: 2 }, 1, 1)]).toEqual([255, 0, 0, 128]);
  });

  it('reads a buffer that does not start on a word boundary the same', () => {
    const src = noise(23, 17, 4);
    const shifted = Buffer.alloc(src.length + 1).subarray(1);
    src.copy(shifted);
    expect(shifted.byteOffset % 4).not.toBe(0);
    const box = { x: 1, y: 1, width: 21, height: 15 };
    expect([...downscaleArea(shifted, 23, box, 8, 6)]).toEqual([...downscaleArea(src, 23, box, 8, 6)]);
  });

  it('agrees with sharp (libvips) Lanczos resampling on soft art to within a few levels', async () => {
    // An independent reference: the same watercolour-like blobs shrunk 2.5 × by libvips's Lanczos 3.
    const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="600" height="500">
      <defs><filter id="soft"><feGaussianBlur stdDeviation="6"/></filter></defs>
      <g filter="url(#soft)"><ellipse cx="280" cy="250" rx="200" ry="160" fill="#5b8c5a" opacity="0.85"/>
      <circle cx="400" cy="170" r="100" fill="#e07a5f" opacity="0.8"/></g></svg>`;
    const raw = await sharp(Buffer.from(svg)).ensureAlpha().raw().toBuffer();
    const box = { x: 40, y: 30, width: 500, height: 420 };
    const ours = downscaleArea(raw, 600, box, 200, 168);
    const lanczos = await sharp(raw, { raw: { width: 600, height: 500, channels: 4 } })
      .extract({ left: box.x, top: box.y, width: box.width, height: box.height })
      .resize(200, 168, { fit: 'fill', kernel: 'lanczos3' })
      .raw()
      .toBuffer();
    let worst = 0,
      total = 0,
      compared = 0;
    for (let i = 0; i < ours.length; i += 4) {
      // Colour only where both are clearly visible; alpha everywhere.
      const channels = ours[i + 3] > 64 && lanczos[i + 3] > 64 ? [0, 1, 2, 3] : [3];
      for (const c of channels) {
        const d = Math.abs(ours[i + c] - lanczos[i + c]);
        worst = Math.max(worst, d);
        total += d;
        compared++;
      }
    }
    expect(worst).toBeLessThanOrEqual(8); // of 255: the box filter is a little softer than Lanczos at edges
    expect(total / compared).toBeLessThan(1);
  });
});
