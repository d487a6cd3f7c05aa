import { describe, expect, it } from 'vitest';
import { composeSticker } from './raster';

describe('composeSticker', () => {
  it('lays art of every opacity over the border colour as straight-alpha "over", rounded (Porter & Duff 1984)', () => {
    // One row of 256 pixels, art opacity 0..255 from left to right, all inside the cut line.
    const width = 256;
    const art = Buffer.alloc(width * 4);
    for (let x = 0; x < width; x++) art.set([200, 100, 7, x], x * 4);
    const border = { r: 255, g: 250, b: 3 };
    const out = composeSticker({
      frame: { x: 0, y: 0, width, height: 1 },
      canvasWidth: width,
      field: new Float32Array(width).fill(2),
      art,
      artWidth: width,
      artHeight: 1,
      artOrigin: { x: 0, y: 0 },
      artVisible: null,
      border,
    });
    // The handbook formula, worked with plain division: C = (Ca·α + Cb·(255 − α)) / 255.
    const over = (ca: number, cb: number, alpha: number) => Math.round((ca * alpha + cb * (255 - alpha)) / 255);
    for (let x = 0; x < width; x++) {
      expect([...out.subarray(x * 4, x * 4 + 4)], `opacity ${x}`).toEqual([over(200, 255, x), over(100, 250, x), over(7, 3, x), 255]);
    }
  });

  it('gives the cut line one pixel of coverage from the distance field and leaves outside transparent', () => {
    const field = Float32Array.from([-2, -0.5, -0.25, 0, 0.25, 0.5, 2]);
    const out = composeSticker({
      frame: { x: 0, y: 0, width: field.length, height: 1 },
      canvasWidth: field.length,
      field,
      art: Buffer.alloc(4),
      artWidth: 1,
      artHeight: 1,
      artOrigin: { x: 100, y: 0 },
      artVisible: null,
      border: { r: 255, g: 255, b: 255 },
    });
    const alphas = Array.from({ length: field.length }, (_, x) => out[x * 4 + 3]);
    // Coverage min(1, field + 0.5): 0, 0, 64, 128, 191, 255, 255 (rounded to 0..255).
    expect(alphas).toEqual([0, 0, 64, 128, 191, 255, 255]);
  });
});
