import sharp from 'sharp';
import type { Rgb } from './background';

export type Frame = { x: number; y: number; width: number; height: number };

/**
 * Paints one finished sticker: the solid border colour wherever the cut line encloses (holes
 * included), the art over it (alpha-composited, clipped to the cut line), transparent outside.
 * The outer edge gets one pixel of coverage anti-aliasing from the same distance field the cut
 * line was traced from, so print and cut agree to the pixel.
 */
export function composeSticker(input: {
  frame: Frame; // in canvas pixels
  canvasWidth: number;
  field: Float32Array; // level − distance, ≥ 0 inside the cut line
  holes: Uint8Array; // enclosed pixels to fill regardless of the field
  art: Buffer; // resampled RGBA
  artWidth: number;
  artHeight: number;
  artOrigin: { x: number; y: number }; // where the art's top-left pixel sits on the canvas
  artVisible: (canvasIndex: number) => boolean;
  border: Rgb;
}): Buffer {
  const { frame, canvasWidth, field, holes, art, artWidth, artHeight, artOrigin, border } = input;
  const out = Buffer.alloc(frame.width * frame.height * 4);
  for (let y = 0; y < frame.height; y++) {
    for (let x = 0; x < frame.width; x++) {
      const cx = x + frame.x,
        cy = y + frame.y;
      const c = cy * canvasWidth + cx;
      const coverage = holes[c] ? 1 : Math.min(1, Math.max(0, field[c] + 0.5));
      if (coverage <= 0) continue;
      let r = border.r,
        g = border.g,
        b = border.b;
      const ax = cx - artOrigin.x,
        ay = cy - artOrigin.y;
      if (ax >= 0 && ay >= 0 && ax < artWidth && ay < artHeight && input.artVisible(c)) {
        const a = (ay * artWidth + ax) * 4;
        const alpha = art[a + 3] / 255;
        r = art[a] * alpha + r * (1 - alpha);
        g = art[a + 1] * alpha + g * (1 - alpha);
        b = art[a + 2] * alpha + b * (1 - alpha);
      }
      const o = (y * frame.width + x) * 4;
      out[o] = Math.round(r);
      out[o + 1] = Math.round(g);
      out[o + 2] = Math.round(b);
      out[o + 3] = Math.round(coverage * 255);
    }
  }
  return out;
}

/** PNG with its physical size in the pHYs chunk (PNG spec §11.3.5.3). */
export function encodePng(rgba: Buffer, width: number, height: number, dpi: number): Promise<Buffer> {
  return sharp(rgba, { raw: { width, height, channels: 4 } })
    .png({ compressionLevel: 6, adaptiveFiltering: false })
    .withMetadata({ density: dpi })
    .toBuffer();
}
