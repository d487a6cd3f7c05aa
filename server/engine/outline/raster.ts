import { encodePngAt } from '../png';
import type { Rgb } from './background';
import type { RowRuns } from './runs';
import { LITTLE_ENDIAN, RunsBuilder } from './runs';

export type Frame = { x: number; y: number; width: number; height: number };

/**
 * Squared distances to the art turned, in place, into the border's field: level − distance (px),
 * positive inside the cut line. Far from the cut line only the sign matters (±2); the square root is
 * taken near it. Answers the runs where the field is at least 0 (inside the cut line), found in the
 * same pass.
 */
export function borderField(squared: Float32Array, width: number, height: number, level: number): RowRuns {
  const near2Low = level > 2 ? (level - 2) ** 2 : -1,
    near2High = (level + 2) ** 2;
  const inside = new RunsBuilder(width, height);
  for (let y = 0; y < height; y++) {
    inside.beginRow(y);
    let start = -1;
    for (let x = 0, i = y * width; x < width; x++, i++) {
      const d2 = squared[i];
      const f = d2 <= near2Low ? 2 : d2 >= near2High ? -2 : level - Math.sqrt(d2);
      squared[i] = f;
      if (f >= 0) {
        if (start < 0) start = x;
      } else if (start >= 0) {
        inside.push(start, x);
        start = -1;
      }
    }
    if (start >= 0) inside.push(start, width);
  }
  return inside.done();
}

/**
 * Paints one finished sticker: the solid border colour wherever the cut line encloses (holes
 * included), the art over it (alpha-composited, clipped to the cut line), transparent outside.
 * The outer edge gets one pixel of coverage anti-aliasing from the same distance field the cut
 * line was traced from, so print and cut agree to the pixel.
 */
export function composeSticker(input: {
  into?: Buffer; // frame.width × frame.height × 4 bytes to write into (cleared first)
  frame: Frame; // in canvas pixels
  canvasWidth: number;
  field: Float32Array; // level − distance, ≥ 0 inside the cut line (0.5 in filled holes)
  art: Buffer; // resampled RGBA
  artWidth: number;
  artHeight: number;
  artOrigin: { x: number; y: number }; // where the art's top-left pixel sits on the canvas
  artVisible: ((canvasIndex: number) => boolean) | null; // null: all of the art belongs to this sticker
  border: Rgb;
}): Buffer {
  const { frame, canvasWidth, field, art, artWidth, artHeight, artOrigin, border, artVisible } = input;
  const out = input.into ? input.into.fill(0) : Buffer.alloc(frame.width * frame.height * 4);
  const br = border.r,
    bg = border.g,
    bb = border.b;
  // Whole pixels are written four bytes at a time where the buffers allow it: opaque art copied as
  // it is, other pixels packed as R, G, B, A from the lowest byte (so only on a little-endian machine).
  const aligned = out.byteOffset % 4 === 0 && art.byteOffset % 4 === 0;
  const out32 = aligned ? new Uint32Array(out.buffer, out.byteOffset, out.length >> 2) : null;
  const art32 = aligned ? new Uint32Array(art.buffer, art.byteOffset, art.length >> 2) : null;
  const packed = aligned && LITTLE_ENDIAN;
  for (let y = 0; y < frame.height; y++) {
    const cy = y + frame.y;
    const ay = cy - artOrigin.y;
    const rowC = cy * canvasWidth + frame.x;
    // The frame's columns [xa0, xa1) lie over the art; the art pixel under column x starts at artRowStart + 4x.
    const artRow = ay >= 0 && ay < artHeight;
    const xa0 = artRow ? Math.max(0, artOrigin.x - frame.x) : 0,
      xa1 = artRow ? Math.min(frame.width, artOrigin.x - frame.x + artWidth) : 0;
    const artRowStart = (ay * artWidth + frame.x - artOrigin.x) * 4;
    for (let x = 0, o = y * frame.width * 4; x < frame.width; x++, o += 4) {
      const c = rowC + x;
      const f = field[c];
      if (f <= -0.5) continue;
      const a = artRowStart + x * 4;
      const alpha = x >= xa0 && x < xa1 && (artVisible === null || artVisible(c)) ? art[a + 3] : 0;
      if (alpha === 255 && f >= 0.5) {
        if (out32) out32[o >> 2] = art32![a >> 2];
        else {
          out[o] = art[a];
          out[o + 1] = art[a + 1];
          out[o + 2] = art[a + 2];
          out[o + 3] = 255;
        }
        continue;
      }
      let r = br,
        g = bg,
        b = bb;
      if (alpha === 255) {
        r = art[a];
        g = art[a + 1];
        b = art[a + 2];
      } else if (alpha > 0) {
        // Straight alpha over the border colour, rounded to 0..255: v / 255 rounded is
        // (v + 128 + ((v + 128) >> 8)) >> 8 for every v up to 255², in integers (no division).
        const rest = 255 - alpha;
        let v = art[a] * alpha + br * rest + 128;
        r = (v + (v >> 8)) >> 8;
        v = art[a + 1] * alpha + bg * rest + 128;
        g = (v + (v >> 8)) >> 8;
        v = art[a + 2] * alpha + bb * rest + 128;
        b = (v + (v >> 8)) >> 8;
      }
      const coverage = f >= 0.5 ? 255 : ((f + 0.5) * 255 + 0.5) | 0;
      if (packed) out32![o >> 2] = r | (g << 8) | (b << 16) | (coverage << 24);
      else {
        out[o] = r;
        out[o + 1] = g;
        out[o + 2] = b;
        out[o + 3] = coverage;
      }
    }
  }
  return out;
}

/**
 * PNG with its physical size in the pHYs chunk (PNG spec §11.3.5.3), at deflate level 3: a sticker
 * is a working file that the export composes again, and level 3 took 6.7 ms against level 6's 9.9
 * for a file 5 % larger (a 1 MP sticker, 184 KB against 176 KB).
 */
export function encodePng(rgba: Buffer, width: number, height: number, dpi: number): Promise<Buffer> {
  return encodePngAt(rgba, width, height, dpi, 3);
}
