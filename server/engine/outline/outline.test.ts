import { Clipper, FillRule } from 'clipper2-ts';
import sharp from 'sharp';
import { afterAll, describe, expect, it } from 'vitest';
import { isSimple, signedArea } from '@shared/geometry/polygon';
import { maskArt, pixels, svgArt } from '../../../tests/helpers/art';
import { pngHeaderClaiming, pngPhys, pngSize } from '../../../tests/helpers/png';
import { OutlineInputError } from './errors';
import { outline } from './outline';
import { OutlinePool } from './pool';

const DISK = '<circle cx="500" cy="500" r="400" fill="#b03a2e"/>';
const countPaths = (d: string) => (d.match(/M/g) ?? []).length;

describe('outline: shape guarantees', () => {
  it('gives one simple closed clockwise cut line', async () => {
    const art = await svgArt(
      800,
      600,
      '<path d="M100 500 L400 80 L700 500 Z M380 300 h40 v120 h-40 Z" fill="#145a32" fill-rule="evenodd"/>',
    );
    const { pieces } = await outline(art, { width: '2in' });
    expect(pieces).toHaveLength(1);
    const ring = pieces[0].cutLine.points;
    expect(isSimple(ring)).toBe(true);
    expect(signedArea(ring)).toBeGreaterThan(0); // clockwise on screen, y down
    expect(countPaths(pieces[0].cutLine.svgPath)).toBe(1);
    expect(pieces[0].cutLine.svgPath.endsWith('Z')).toBe(true);
  });

  it('a ring gives one path and no inner hole; the hole is filled with the border colour', async () => {
    const art = await svgArt(1000, 1000, '<circle cx="500" cy="500" r="325" fill="none" stroke="#7d3c98" stroke-width="150"/>');
    const { pieces } = await outline(art, { width: 40, border: 3, borderColour: '#fdfefe' });
    expect(pieces).toHaveLength(1);
    expect(countPaths(pieces[0].cutLine.svgPath)).toBe(1);
    const img = await pixels(pieces[0].png);
    expect(img.at(img.width >> 1, img.height >> 1)).toEqual([253, 254, 254, 255]);
    expect(img.at(0, 0)[3]).toBe(0); // outside the cut line stays transparent
  });

  it('art touching all four edges keeps its full border on every side', async () => {
    // A plus sign that touches the middle of each image edge.
    const art = await maskArt(200, 120, (x, y) => (x >= 80 && x < 120) || (y >= 40 && y < 80));
    const { pieces, art: info } = await outline(art, { width: 40, border: 3 });
    expect(info.printedWidthMm).toBeCloseTo(40, 6);
    expect(info.printedHeightMm).toBeCloseTo(24, 6);
    const px = 25.4 / 300;
    expect(Math.abs(pieces[0].bbox.width - 46)).toBeLessThanOrEqual(px);
    expect(Math.abs(pieces[0].bbox.height - 30)).toBeLessThanOrEqual(px);
    expect(pieces[0].bbox.x).toBeGreaterThan(-px);
    expect(pieces[0].bbox.y).toBeGreaterThan(-px);
  });

  it('a JPEG with EXIF orientation 6 outlines like the same art turned 90° clockwise in a PNG (EXIF 2.32, tag 0x0112)', async () => {
    const W = 300,
      H = 200;
    const raw = Buffer.alloc(W * H * 3, 255);
    for (let y = 0; y < H; y++)
      for (let x = 0; x < W; x++) {
        if ((x > 30 && x < 90 && y > 20 && y < 180) || (x > 30 && x < 270 && y > 120 && y < 180))
          raw.fill(30, (y * W + x) * 3, (y * W + x) * 3 + 3);
      }
    const image = sharp(raw, { raw: { width: W, height: H, channels: 3 } });
    const jpeg = await image.clone().jpeg({ quality: 95 }).withMetadata({ orientation: 6 }).toBuffer();
    expect((await sharp(jpeg).metadata()).orientation).toBe(6);
    const turned = await image.clone().rotate(90).png().toBuffer();
    const upright = await image.clone().png().toBuffer();

    const fromJpeg = (await outline(jpeg, { width: 30 })).pieces[0];
    const fromPng = (await outline(turned, { width: 30 })).pieces[0];
    const ignoringExif = (await outline(upright, { width: 30 })).pieces[0];
    expect(fromJpeg.pixelWidth).toBe(fromPng.pixelWidth);
    expect(fromJpeg.pixelHeight).toBe(fromPng.pixelHeight);
    expect(ignoringExif.pixelHeight).not.toBe(fromPng.pixelHeight);
    const toPaths = (points: Array<{ x: number; y: number }>) => [
      points.map((p) => ({ x: Math.round(p.x * 1000), y: Math.round(p.y * 1000) })),
    ];
    const xor =
      Math.abs(
        Clipper.xor(toPaths(fromJpeg.cutLine.points), toPaths(fromPng.cutLine.points), FillRule.NonZero).reduce(
          (s, p) => s + Clipper.area(p),
          0,
        ),
      ) / 1e6;
    expect(xor / fromPng.areaMm2).toBeLessThan(0.02);
  });
});

describe('outline: the bordered PNG', () => {
  it('is round(printed size × DPI) px with pHYs 11811 px/m at 300 DPI (PNG spec §11.3.5.3)', async () => {
    const art = await svgArt(1000, 1000, DISK);
    const { pieces } = await outline(art, { width: '2in', border: '0.125in' });
    expect(pngSize(pieces[0].png)).toEqual({ width: 675, height: 675 }); // 2.25 in × 300
    expect(pngPhys(pieces[0].png)).toEqual({ x: 11811, y: 11811, unit: 1 });
    const low = (await outline(art, { width: '2in', border: '0.125in', dpi: 150 })).pieces[0];
    expect(pngSize(low.png)).toEqual({ width: 338, height: 338 }); // round(337.5)
    expect(pngPhys(low.png)).toEqual({ x: 5906, y: 5906, unit: 1 });
  });

  it('paints a solid border (no blur) and the art unchanged in the middle', async () => {
    const art = await svgArt(1000, 1000, DISK);
    const { pieces } = await outline(art, { width: 40, border: 3 });
    const img = await pixels(pieces[0].png);
    const mid = img.height >> 1;
    // 1.5 mm in from the left edge: inside the border ring, outside the art.
    expect(img.at(Math.round((1.5 * 300) / 25.4), mid)).toEqual([255, 255, 255, 255]);
    expect(img.at(img.width >> 1, mid)).toEqual([176, 58, 46, 255]);
  });

  it('art shrunk to a quarter keeps its colour, and its soft edge fades into the border with no dark fringe', async () => {
    // Pure red with a blurred edge on transparent black, 2000 px printed 1 in wide at 300 DPI: each
    // print pixel averages 4 × 4 or more source pixels. Red over white is (255, 255·(1 − α), 255·(1 − α)):
    // averaging colour without weighting by alpha would pull the red channel down where the edge fades.
    const art = await svgArt(
      2000,
      2000,
      '<defs><filter id="s"><feGaussianBlur stdDeviation="40"/></filter></defs><circle cx="1000" cy="1000" r="700" fill="#ff0000" filter="url(#s)"/>',
    );
    const { pieces } = await outline(art, { width: '1in', border: 2 });
    const img = await pixels(pieces[0].png);
    expect(img.at(img.width >> 1, img.height >> 1)).toEqual([255, 0, 0, 255]);
    let faded = 0;
    for (let y = 0; y < img.height; y++)
      for (let x = 0; x < img.width; x++) {
        const [r, g, b, a] = img.at(x, y);
        if (a < 255) continue; // outside the cut line, or its anti-aliased edge
        expect(r, `pixel ${x}, ${y}`).toBeGreaterThanOrEqual(254);
        expect(Math.abs(g - b)).toBeLessThanOrEqual(1);
        if (g > 20 && g < 235) faded++;
      }
    expect(faded).toBeGreaterThan(100); // the soft edge is there, between red and white
  });
});

describe('outline: backgrounds, specks, islands, necks, resolution', () => {
  it('removes a flat white background from a JPEG (auto) and keeps it with keep', async () => {
    const jpeg = await sharp(
      Buffer.from(
        `<svg xmlns="http://www.w3.org/2000/svg" width="600" height="600"><rect width="600" height="600" fill="#fff"/><circle cx="300" cy="300" r="200" fill="#1a5276"/></svg>`,
      ),
    )
      .jpeg({ quality: 95 })
      .toBuffer();
    const auto = await outline(jpeg, { width: 40, border: 3 });
    expect(auto.warnings.map((w) => w.code)).toContain('background-removed');
    expect(auto.art.printedHeightMm).toBeCloseTo(40, 0);
    const expected = Math.PI * 23 * 23;
    expect(Math.abs(auto.pieces[0].areaMm2 - expected) / expected).toBeLessThan(0.02);
    const kept = await outline(jpeg, { width: 40, border: 3, background: 'keep' });
    expect(kept.pieces[0].areaMm2).toBeGreaterThan(46 * 46 * 0.95); // the whole square image
    const explicit = await outline(jpeg, { width: 40, border: 3, background: { colour: '#ffffff', tolerance: 30 } });
    expect(Math.abs(explicit.pieces[0].areaMm2 - expected) / expected).toBeLessThan(0.02);
  });

  it('drops specks below the minimum area and says so', async () => {
    const art = await svgArt(1000, 1000, `${DISK}<circle cx="980" cy="20" r="3" fill="#000"/>`);
    const result = await outline(art, { width: 40, border: 3, minSpeckArea: 0.5 });
    expect(result.warnings.map((w) => w.code)).toContain('specks-dropped');
    expect(result.pieces).toHaveLength(1);
    expect(result.art.printedWidthMm).toBeCloseTo(40, 6);
    // The trimmed art is the disk alone: the speck did not widen the visible box.
    expect(result.art.visible.width).toBeLessThan(830);
  });

  it('joins far islands into one piece, or splits them into one piece each', async () => {
    const art = await svgArt(
      1200,
      400,
      '<circle cx="200" cy="200" r="150" fill="#117864"/><circle cx="1000" cy="200" r="150" fill="#b9770e"/>',
    );
    const joined = await outline(art, { width: 60, border: 2, islands: 'join' });
    expect(joined.pieces).toHaveLength(1);
    expect(countPaths(joined.pieces[0].cutLine.svgPath)).toBe(1);
    expect(joined.warnings.map((w) => w.code)).toContain('islands-joined');
    const split = await outline(art, { width: 60, border: 2, islands: 'split' });
    expect(split.pieces).toHaveLength(2);
    const [a, b] = split.pieces;
    expect(Math.abs(a.areaMm2 - b.areaMm2) / a.areaMm2).toBeLessThan(0.02);
    expect(b.offsetMm.x - a.offsetMm.x).toBeCloseTo((800 * 60) / 1100, 1); // centres 800 px apart; the visible 1100 px are 60 mm
    expect(joined.pieces[0].areaMm2).toBeGreaterThan(a.areaMm2 + b.areaMm2);
  });

  it('warns about a neck narrower than the smallest cuttable feature', async () => {
    const art = await svgArt(
      1000,
      400,
      '<circle cx="200" cy="200" r="150" fill="#333"/><circle cx="800" cy="200" r="150" fill="#333"/><rect x="300" y="196" width="400" height="8" fill="#333"/>',
    );
    const thin = await outline(art, { width: 50, border: 0, minFeature: 1 });
    expect(thin.warnings.map((w) => w.code)).toContain('narrow-neck');
    const bordered = await outline(art, { width: 50, border: 2, minFeature: 1 });
    expect(bordered.warnings.map((w) => w.code)).not.toContain('narrow-neck');
  });

  it('reports the effective resolution with notices below 300 and warnings below 150 DPI', async () => {
    const small = await svgArt(100, 100, '<rect width="100" height="100" fill="#000"/>');
    const soft = await outline(small, { width: '2in' });
    expect(soft.effectiveDpi).toBeCloseTo(50, 6);
    expect(soft.warnings.find((w) => w.code === 'very-low-resolution')?.severity).toBe('warning');
    const medium = await svgArt(500, 500, '<rect width="500" height="500" fill="#000"/>');
    const ok = await outline(medium, { width: '2in' });
    expect(ok.effectiveDpi).toBeCloseTo(250, 6);
    expect(ok.warnings.find((w) => w.code === 'low-resolution')?.severity).toBe('notice');
  });
});

describe('outline: decoding many kinds of file', () => {
  it('outlines 16-bit, grey-with-alpha, palette, CMYK JPEG and WebP like the 8-bit PNG', async () => {
    const base = await svgArt(1000, 1000, DISK);
    const reference = (await outline(base, { width: 40, border: 3 })).pieces[0].areaMm2;
    const jpegCmyk = await sharp(
      await sharp(
        Buffer.from(
          `<svg xmlns="http://www.w3.org/2000/svg" width="1000" height="1000"><rect width="1000" height="1000" fill="#fff"/>${DISK}</svg>`,
        ),
      )
        .png()
        .toBuffer(),
    )
      .toColourspace('cmyk')
      .jpeg()
      .toBuffer();
    expect((await sharp(jpegCmyk).metadata()).space).toBe('cmyk');
    const variants: Record<string, Buffer> = {
      rgba16: await sharp(base).toColourspace('rgb16').png().toBuffer(),
      greyAlpha: await sharp(base).toColourspace('b-w').png().toBuffer(),
      palette: await sharp(base).png({ palette: true, colours: 16 }).toBuffer(),
      cmykJpeg: jpegCmyk,
      webp: await sharp(base).webp({ lossless: true }).toBuffer(),
    };
    expect((await sharp(variants.rgba16).metadata()).depth).toBe('ushort');
    for (const [name, file] of Object.entries(variants)) {
      const area = (await outline(file, { width: 40, border: 3 })).pieces[0].areaMm2;
      expect({ name, off: Math.abs(area - reference) / reference < 0.02 }).toEqual({ name, off: true });
    }
  });
});

describe('outline: bad input gets a clear error', () => {
  const pool = new OutlinePool({ maxInputPixels: 50_000_000, maxOutputPixels: 40_000_000 }, 1);
  afterAll(() => pool.close());

  const cases: Array<[string, () => Promise<Buffer>, OutlineInputError['code'], RegExp]> = [
    ['not an image', async () => Buffer.from('%PDF-1.7 definitely not a picture'), 'not-an-image', /not an image/],
    ['a truncated PNG', async () => (await svgArt(400, 400, DISK)).subarray(0, 600), 'corrupt', /damaged or cut short/],
    [
      'a 1 × 1 px image',
      () =>
        sharp({ create: { width: 1, height: 1, channels: 4, background: '#000' } })
          .png()
          .toBuffer(),
      'too-small',
      /1 × 1 px/,
    ],
    [
      'fully transparent art',
      () =>
        sharp({ create: { width: 64, height: 64, channels: 4, background: { r: 0, g: 0, b: 0, alpha: 0 } } })
          .png()
          .toBuffer(),
      'no-visible-art',
      /no visible art/,
    ],
    [
      'a 30000 × 30000 px decompression bomb',
      async () => pngHeaderClaiming(30000, 30000),
      'too-many-pixels',
      /30000 × 30000 px.*limit is 50/,
    ],
    [
      'an SVG file',
      async () => Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><rect width="10" height="10"/></svg>'),
      'unsupported-format',
      /SVG files are not supported/,
    ],
  ];

  for (const [label, make, code, message] of cases) {
    it(`${label}: error ${code}, and the worker pool still serves the next request`, async () => {
      const error = await pool.run(await make(), { width: 30 }).catch((e: unknown) => e);
      expect(error).toBeInstanceOf(OutlineInputError);
      expect((error as OutlineInputError).code).toBe(code);
      expect((error as OutlineInputError).message).toMatch(message);
      const next = await pool.run(await svgArt(200, 200, '<circle cx="100" cy="100" r="80"/>'), { width: 20 });
      expect(next.pieces).toHaveLength(1);
    });
  }

  it('the pixel limit is configurable', async () => {
    const art = await svgArt(300, 300, DISK);
    await expect(outline(art, { width: 20 }, { maxInputPixels: 10_000, maxOutputPixels: 40_000_000 })).rejects.toThrow(
      /limit is 0\.0 megapixels|limit is/,
    );
  });

  it('refuses options without a size, with a field message', async () => {
    await expect(outline(await svgArt(100, 100, DISK), {})).rejects.toThrow(/printed width or the printed height/);
  });
});
