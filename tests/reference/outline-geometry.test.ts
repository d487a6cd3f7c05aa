import { Clipper, EndType, FillRule, JoinType } from 'clipper2-ts';
import type { Paths64 } from 'clipper2-ts';
import { contours } from 'd3-contour';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import type { Ring } from '@shared/geometry/polygon';
import { outline } from '../../server/engine/outline/outline';
import { maskArt, svgArt } from '../helpers/art';

const PX_PER_MM = 300 / 25.4;

/** Cut-line points (mm, sticker frame) → pixels in the art's own frame (art scaled 1:1). */
function toArtPixels(points: Ring, pixelWidth: number, pixelHeight: number, artW: number, artH: number): Ring {
  const ox = Math.round((pixelWidth - artW) / 2),
    oy = Math.round((pixelHeight - artH) / 2);
  return points.map((p) => ({ x: p.x * PX_PER_MM - ox, y: p.y * PX_PER_MM - oy }));
}

const SCALE = 100; // Clipper64 works in integers: hundredths of a pixel
const toPaths64 = (rings: Ring[]): Paths64 => rings.map((r) => r.map((p) => ({ x: Math.round(p.x * SCALE), y: Math.round(p.y * SCALE) })));
const areaOf = (paths: Paths64) => paths.reduce((sum, path) => sum + Clipper.area(path), 0) / (SCALE * SCALE);

describe("Steiner's formula: area of a convex shape grown by r is A + P·r + π·r²", () => {
  // Source: Steiner's formula; R. Schneider, Convex Bodies: The Brunn–Minkowski Theory, §4.2.
  it('a disk of diameter 40 mm with a 3 mm border', async () => {
    const art = await svgArt(1000, 1000, '<circle cx="500" cy="500" r="400" fill="#b03a2e"/>');
    const { pieces } = await outline(art, { width: 40, border: 3 });
    const R = 20,
      r = 3;
    const expected = Math.PI * R * R + 2 * Math.PI * R * r + Math.PI * r * r;
    expect(Math.abs(pieces[0].areaMm2 - expected) / expected).toBeLessThan(0.01);
    // Circumference of the grown disk, π·d (handbook formula)
    expect(Math.abs(pieces[0].perimeterMm - Math.PI * 2 * (R + r)) / (Math.PI * 2 * (R + r))).toBeLessThan(0.01);
  });

  it('a 40 mm square with a 1/8 in border', async () => {
    const art = await svgArt(1000, 1000, '<rect x="100" y="100" width="800" height="800" fill="#1f618d"/>');
    const { pieces } = await outline(art, { width: 40, border: '0.125in' });
    const s = 40,
      r = 3.175;
    const expected = s * s + 4 * s * r + Math.PI * r * r;
    expect(Math.abs(pieces[0].areaMm2 - expected) / expected).toBeLessThan(0.01);
  });
});

describe('against a polygon offset by a maintained Clipper2 port (clipper2-ts, round joins)', () => {
  it('a non-convex shape with a hole and a narrow gap: symmetric difference under 1 % of the area', async () => {
    const W = 600,
      H = 480,
      borderPx = 36;
    // A thick U whose arms are 20 px apart (closed by the border), with a 200 × 90 px hole in its base.
    const inside = (x: number, y: number) => {
      const inU =
        (x >= 40 && x < 290 && y >= 20 && y < 460) ||
        (x >= 310 && x < 560 && y >= 20 && y < 460) ||
        (x >= 40 && x < 560 && y >= 260 && y < 460);
      const inHole = x >= 200 && x < 400 && y >= 320 && y < 410;
      return inU && !inHole;
    };
    const art = await maskArt(W, H, inside);
    const artW = 520,
      artH = 440; // the visible part: x 40..560, y 20..460
    const result = await outline(art, { width: artW / PX_PER_MM, border: borderPx / PX_PER_MM, smoothing: 0.02 });
    expect(result.pieces).toHaveLength(1);
    const piece = result.pieces[0];
    const ours = toArtPixels(piece.cutLine.points, piece.pixelWidth, piece.pixelHeight, artW, artH).map((p) => ({
      x: p.x + 40,
      y: p.y + 20,
    }));

    // The reference: trace the same art (marching squares at 0.5 on the mask), offset by the
    // border with Clipper2 round joins, and keep the outer boundary (holes filled).
    const values = new Float64Array(W * H);
    for (let y = 0; y < H; y++) for (let x = 0; x < W; x++) values[y * W + x] = inside(x, y) ? 1 : 0;
    const [layer] = contours().size([W, H]).smooth(false).thresholds([0.5])(values as unknown as number[]);
    const artRings: Ring[] = layer.coordinates.flatMap((polygon) => polygon.map((ring) => ring.slice(0, -1).map(([x, y]) => ({ x, y }))));
    expect(artRings.length).toBe(2); // the U and its hole
    const grown = Clipper.inflatePaths(toPaths64(artRings), borderPx * SCALE, JoinType.Round, EndType.Polygon, 2, 0.25 * SCALE);
    const merged = Clipper.union(grown, FillRule.NonZero);
    const outerSign = Math.sign(Clipper.area(merged.reduce((a, b) => (Math.abs(Clipper.area(b)) > Math.abs(Clipper.area(a)) ? b : a))));
    const reference = merged.filter((path) => Math.sign(Clipper.area(path)) === outerSign);
    expect(reference).toHaveLength(1); // the gap closed and the hole is filled: one outline

    const refArea = Math.abs(areaOf(reference));
    const xor = Math.abs(areaOf(Clipper.xor(toPaths64([ours]), reference, FillRule.NonZero)));
    expect(xor / refArea).toBeLessThan(0.01);
  });
});

describe('every cut-line vertex lies at the border width from the art (brute force)', () => {
  it('± 1 px at 300 DPI on a small irregular image', async () => {
    const W = 48,
      H = 36;
    const inside = (x: number, y: number) =>
      (Math.hypot(x - 14, y - 18) < 12 || Math.hypot(x - 32, y - 14) < 11 || (x > 20 && x < 44 && y > 22 && y < 32)) &&
      !(x > 28 && x < 36 && y > 24);
    const art = await maskArt(W, H, inside);
    const opaque: Array<[number, number]> = [];
    let minX = W,
      minY = H,
      maxX = 0,
      maxY = 0;
    for (let y = 0; y < H; y++)
      for (let x = 0; x < W; x++)
        if (inside(x, y)) {
          opaque.push([x, y]);
          minX = Math.min(minX, x);
          minY = Math.min(minY, y);
          maxX = Math.max(maxX, x);
          maxY = Math.max(maxY, y);
        }
    const artW = maxX - minX + 1,
      artH = maxY - minY + 1;
    const borderMm = 1;
    const { pieces } = await outline(art, { width: artW / PX_PER_MM, border: borderMm, minSpeckArea: 0 });
    const piece = pieces[0];
    const points = toArtPixels(piece.cutLine.points, piece.pixelWidth, piece.pixelHeight, artW, artH);
    const borderPx = borderMm * PX_PER_MM;
    for (const p of points) {
      let best = Infinity;
      for (const [ox, oy] of opaque) {
        // Distance to the pixel's square [x, x+1] × [y, y+1], in the art's own frame.
        const dx = Math.max(ox - minX - p.x, 0, p.x - (ox - minX + 1));
        const dy = Math.max(oy - minY - p.y, 0, p.y - (oy - minY + 1));
        best = Math.min(best, Math.hypot(dx, dy));
      }
      expect(Math.abs(best - borderPx)).toBeLessThanOrEqual(1);
    }
    expect(points.length).toBeGreaterThan(8);
  });
});

describe('sharp renders our test art as expected', () => {
  it('draws the SVG disk at the size asked (sanity check of the fixture itself)', async () => {
    const art = await svgArt(100, 100, '<circle cx="50" cy="50" r="40" fill="#000"/>');
    const { channels } = await sharp(art).stats();
    // Mean alpha ≈ π·40² / 100² = 0.503 (handbook area of a circle)
    expect(channels[3].mean / 255).toBeCloseTo(Math.PI * 0.16, 1);
  });
});
