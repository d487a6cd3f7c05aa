import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { DEFAULT_TOLERANCE } from '@shared/schemas/outline';
import { outline } from '../../server/engine/outline/outline';
import { removalPreview } from '../../server/engine/outline/removal-preview';
import { DEFAULT_LIMITS } from '../../server/engine/outline/outline';

// A candy-corn-like piece on a white background with no transparency: a yellow base, an orange
// middle and a light cream tip (#fcf4dc, about 37 from white in RGB): close enough to white that a
// loose tolerance floods into it from the background.
const TIP_TOP = 40,
  TIP_BOTTOM = 200;
const candyCorn = () =>
  sharp(
    Buffer.from(`<svg xmlns="http://www.w3.org/2000/svg" width="600" height="600">
      <rect width="600" height="600" fill="#ffffff"/>
      <clipPath id="c"><polygon points="300,${TIP_TOP} 480,560 120,560"/></clipPath>
      <g clip-path="url(#c)">
        <rect x="0" y="0" width="600" height="${TIP_BOTTOM}" fill="#fcf4dc"/>
        <rect x="0" y="${TIP_BOTTOM}" width="600" height="180" fill="#f28c28"/>
        <rect x="0" y="380" width="600" height="220" fill="#f7c531"/>
      </g>
    </svg>`),
  )
    .flatten({ background: '#ffffff' })
    .png()
    .toBuffer();

const tookArt = (warnings: Array<{ code: string; message: string; severity: string }>) =>
  warnings.filter((w) => w.code === 'background-took-art');

describe('background removal protects the art', () => {
  it('each mode keeps the light tip at its own default tolerance, and says nothing', async () => {
    const art = await candyCorn();
    const auto = await outline(art, { width: '2in', background: 'auto', backgroundTolerance: DEFAULT_TOLERANCE.auto, dpi: 150 });
    // The visible part starts at the tip (SVG anti-aliasing may cost a pixel or two).
    expect(auto.art.visible.y).toBeLessThanOrEqual(TIP_TOP + 3);
    expect(tookArt(auto.warnings)).toEqual([]);
    const picked = await outline(art, { width: '2in', background: { colour: '#ffffff', tolerance: DEFAULT_TOLERANCE.colour }, dpi: 150 });
    expect(picked.art.visible.y).toBeLessThanOrEqual(TIP_TOP + 3);
    expect(tookArt(picked.warnings)).toEqual([]);
  });

  it('a tolerance that eats the tip (42, as measured) says so, in either mode', async () => {
    const art = await candyCorn();
    const auto = await outline(art, { width: '2in', background: 'auto', backgroundTolerance: 42, dpi: 150 });
    expect(auto.art.visible.y).toBeGreaterThan(TIP_BOTTOM - 5); // the tip is gone: the check can fail
    expect(tookArt(auto.warnings)).toHaveLength(1);
    expect(tookArt(auto.warnings)[0]).toMatchObject({ severity: 'warning' });
    expect(tookArt(auto.warnings)[0].message).toMatch(/tolerance 42 also took away \d+(\.\d)? % of the art/);
    const picked = await outline(art, { width: '2in', background: { colour: '#ffffff', tolerance: 42 }, dpi: 150 });
    expect(tookArt(picked.warnings)).toHaveLength(1);
  });

  it('a noisy JPEG background is removed at the default without a false warning', async () => {
    // White paper with grain of ±8 per channel, saved as a JPEG at quality 70, and a plain red disc.
    const W = 400,
      noise = Buffer.alloc(W * W * 3);
    let seed = 7;
    const rand = () => (seed = (seed * 1103515245 + 12345) & 0x7fffffff) / 0x7fffffff;
    for (let i = 0; i < noise.length; i++) noise[i] = 247 + Math.floor(rand() * 9);
    const disc = Buffer.from(
      `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${W}"><circle cx="200" cy="200" r="120" fill="#c0392b"/></svg>`,
    );
    const jpeg = await sharp(noise, { raw: { width: W, height: W, channels: 3 } })
      .composite([{ input: disc }])
      .jpeg({ quality: 70 })
      .toBuffer();
    const result = await outline(jpeg, { width: '2in', background: 'auto', dpi: 150 });
    expect(result.warnings.map((w) => w.code)).toContain('background-removed');
    expect(tookArt(result.warnings)).toEqual([]);
    // The whole disc is kept: its visible box is the disc's 240 px (± anti-aliasing).
    expect(result.art.visible.width).toBeGreaterThanOrEqual(238);
  });

  it('the preview tints the removed background and paints the taken tip magenta', async () => {
    const art = await candyCorn();
    const count = async (tolerance: number) => {
      const { png, takenShare } = await removalPreview(art, { background: 'auto', backgroundTolerance: tolerance }, DEFAULT_LIMITS);
      const { data, info } = await sharp(png).raw().toBuffer({ resolveWithObject: true });
      let magenta = 0,
        tinted = 0;
      for (let i = 0; i < data.length; i += info.channels) {
        // The taken tint over cream is about (208, 37, 135); none of the art's colours is near it.
        if (data[i] > 190 && data[i] < 225 && data[i + 1] < 60 && data[i + 2] > 115 && data[i + 2] < 155) magenta++;
        if (Math.abs(data[i] - 156) < 12 && Math.abs(data[i + 1] - 187) < 12 && Math.abs(data[i + 2] - 216) < 12) tinted++;
      }
      return { magenta, tinted, pixels: info.width * info.height, takenShare };
    };
    const safe = await count(DEFAULT_TOLERANCE.auto);
    expect(safe.magenta).toBe(0);
    expect(safe.tinted / safe.pixels).toBeGreaterThan(0.5); // most of the image is background
    const eaten = await count(42);
    // The tip's area (a triangle 160 px tall of a 520 px one) is about 9 % of the art.
    expect(eaten.magenta).toBeGreaterThan(1000);
    expect(eaten.takenShare).toBeGreaterThan(0.05);
    expect(eaten.takenShare).toBeLessThan(0.15);
  });
});
