// drawTurned checked against libvips (sharp's rotate and composite, a separate implementation) and
// against Porter–Duff "source over" worked by hand.
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { drawTurned, snapCentre } from './turn';

/** A 120 × 80 sticker: an opaque ellipse with a soft (graded alpha) edge, coloured by position. */
function sticker() {
  const width = 120,
    height = 80;
  const data = new Uint8Array(width * height * 4);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const r = Math.hypot((x + 0.5 - 60) / 56, (y + 0.5 - 40) / 36);
      const i = (y * width + x) * 4;
      data.set([(x * 2) & 255, (y * 3) & 255, 90, Math.round(255 * Math.min(1, Math.max(0, (1 - r) * 12)))], i);
    }
  }
  return { data, width, height };
}

const canvas = () => ({ data: new Uint8Array(300 * 300 * 4), width: 300, height: 300 });

async function libvips(src: ReturnType<typeof sticker>, degrees: number, cx: number, cy: number) {
  const turned = await sharp(src.data, { raw: { width: src.width, height: src.height, channels: 4 } })
    .rotate(degrees, { background: { r: 0, g: 0, b: 0, alpha: 0 } })
    .raw()
    .toBuffer({ resolveWithObject: true });
  const { width: w, height: h } = turned.info;
  return sharp({ create: { width: 300, height: 300, channels: 4, background: { r: 0, g: 0, b: 0, alpha: 0 } } })
    .composite([
      { input: turned.data, raw: { width: w, height: h, channels: 4 }, left: Math.round(cx - w / 2), top: Math.round(cy - h / 2) },
    ])
    .raw()
    .toBuffer();
}

describe('drawTurned', () => {
  it('a quarter turn copies the pixels exactly as libvips turns them', async () => {
    const src = sticker();
    for (const degrees of [0, 90, 180, 270]) {
      const at = snapCentre(150.3, 149.8, src.width, src.height, degrees);
      const ours = canvas();
      drawTurned(ours, src, at.cx, at.cy, degrees);
      const theirs = await libvips(src, degrees, at.cx, at.cy);
      // Same pixels covered with the same alpha; the same colour wherever the sticker is opaque
      // (libvips premultiplies on the way, so faint pixels' colours are rounded by it).
      let alphaOff = 0,
        colourOff = 0,
        covered = 0;
      for (let i = 0; i < ours.data.length; i += 4) {
        alphaOff = Math.max(alphaOff, Math.abs(ours.data[i + 3] - theirs[i + 3]));
        if (ours.data[i + 3] > 0) covered++;
        if (ours.data[i + 3] === 255)
          for (let k = 0; k < 3; k++) colourOff = Math.max(colourOff, Math.abs(ours.data[i + k] - theirs[i + k]));
      }
      expect([alphaOff, colourOff], `${degrees}°`).toEqual([0, 0]);
      expect(covered).toBeGreaterThan(0.9 * Math.PI * 56 * 36);
    }
  });

  it('any other angle lands where the cut line goes, and keeps the coverage libvips keeps', async () => {
    const src = sticker();
    const sourceAlpha = src.data.reduce((sum, v, i) => (i % 4 === 3 ? sum + v : sum), 0);
    for (const degrees of [37, 135, 200, 315.5]) {
      const ours = canvas();
      drawTurned(ours, src, 150.25, 149.6, degrees);
      // Each print pixel's centre taken back into the sticker by the inverse of the cut line's
      // clockwise turn (shared/sheet/placement.ts), where the sticker's alpha is known exactly.
      const a = (degrees * Math.PI) / 180;
      let worst = 0,
        ourAlpha = 0;
      for (let y = 0; y < 300; y++) {
        for (let x = 0; x < 300; x++) {
          const dx = x + 0.5 - 150.25,
            dy = y + 0.5 - 149.6;
          const u = dx * Math.cos(a) + dy * Math.sin(a) + 60,
            v = -dx * Math.sin(a) + dy * Math.cos(a) + 40;
          const r = Math.hypot((u - 60) / 56, (v - 40) / 36);
          const expected = 255 * Math.min(1, Math.max(0, (1 - r) * 12));
          const got = ours.data[(y * 300 + x) * 4 + 3];
          ourAlpha += got;
          worst = Math.max(worst, Math.abs(got - expected));
        }
      }
      // Bilinear samples of a ramp rising 255 over 4.7 px are off by at most half a pixel's rise
      // where the ramp bends; a placement a pixel off would be off by 54.
      expect(worst, `${degrees}°`).toBeLessThan(32);
      const theirs = await libvips(src, degrees, 150, 150);
      const theirAlpha = theirs.reduce((sum, v, i) => (i % 4 === 3 ? sum + v : sum), 0);
      expect(Math.abs(ourAlpha / sourceAlpha - 1), `${degrees}°`).toBeLessThan(0.005);
      expect(Math.abs(theirAlpha / sourceAlpha - 1), `${degrees}° (libvips)`).toBeLessThan(0.01);
    }
  });

  it('lays a half-transparent sticker over another by Porter–Duff source over', () => {
    const one = { data: new Uint8Array(4 * 4 * 4), width: 4, height: 4 };
    for (let i = 0; i < 16; i++) one.data.set([200, 0, 0, 128], i * 4);
    const two = { data: new Uint8Array(4 * 4 * 4), width: 4, height: 4 };
    for (let i = 0; i < 16; i++) two.data.set([0, 0, 200, 64], i * 4);
    const dst = { data: new Uint8Array(10 * 10 * 4), width: 10, height: 10 };
    drawTurned(dst, one, 5, 5, 0);
    drawTurned(dst, two, 5, 5, 0);
    // αo = αs + αd(1 − αs) = 64 + 128·191/255 = 159.9; Co = (Cs·αs + Cd·αd(1 − αs)) / αo.
    const o = (5 * 10 + 5) * 4;
    const keep = (128 * (255 - 64)) / 255;
    expect([...dst.data.subarray(o, o + 4)]).toEqual([
      Math.round((200 * keep) / (64 + keep)),
      0,
      Math.round((200 * 64) / (64 + keep)),
      Math.round(64 + keep),
    ]);
    expect(dst.data[3]).toBe(0); // outside both: untouched
  });
});
