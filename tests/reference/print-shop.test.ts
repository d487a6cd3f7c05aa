import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import type { Ring } from '@shared/geometry/polygon';
import { costPerSheet, cutLength, fullCoverageCost, sheetCost } from '@shared/production/cost';
import { inkCoverage } from '@shared/production/coverage';
import { inchToMm } from '@shared/units';
import { outline } from '../../server/engine/outline/outline';
import { maskArt } from '../helpers/art';

const regularPolygon = (r: number, n: number): Ring =>
  Array.from({ length: n }, (_, i) => ({ x: r * Math.cos((2 * Math.PI * i) / n), y: r * Math.sin((2 * Math.PI * i) / n) }));

describe('cut length', () => {
  it('of a circle of diameter d is π·d within 0.5 % (circumference: any geometry handbook)', async () => {
    expect(Math.abs(cutLength([regularPolygon(20, 360)]) - Math.PI * 40) / (Math.PI * 40)).toBeLessThan(0.005);
    // The engine's own cut line round a disk 40 mm across with a 3 mm border: a circle 46 mm across.
    const art = await maskArt(800, 800, (x, y) => Math.hypot(x + 0.5 - 400, y + 0.5 - 400) <= 400);
    const { pieces } = await outline(art, { width: 40, border: 3 });
    expect(Math.abs(cutLength([pieces[0].cutLine.points]) - Math.PI * 46) / (Math.PI * 46)).toBeLessThan(0.005);
  });

  it('of a square of side s is 4·s, and 4·s + 2πr once grown by a border r (Steiner: perimeter of a parallel body)', async () => {
    const s = 30;
    expect(
      cutLength([
        [
          { x: 0, y: 0 },
          { x: s, y: 0 },
          { x: s, y: s },
          { x: 0, y: s },
        ],
      ]),
    ).toBe(4 * s);
    // Schneider, Convex Bodies §4.2: P(K + rB) = P(K) + 2πr for a convex K.
    const art = await maskArt(600, 600, () => true);
    const { pieces } = await outline(art, { width: s, border: 3 });
    const expected = 4 * s + 2 * Math.PI * 3;
    expect(Math.abs(cutLength([pieces[0].cutLine.points]) - expected) / expected).toBeLessThan(0.005);
  });

  it('adds the perimeters of every cut line on the sheet', () => {
    expect(cutLength([regularPolygon(10, 720), regularPolygon(5, 720)])).toBeCloseTo(Math.PI * 30, 1);
  });
});

describe('ink coverage', () => {
  it('of an image half solid black and half transparent is 50 % ± 0.5, all of it black ink', async () => {
    const png = await maskArt(300, 200, (x) => x < 150, [0, 0, 0]);
    const { data, info } = await sharp(png).ensureAlpha().raw().toBuffer({ resolveWithObject: true });
    const coverage = inkCoverage(data, info.width * info.height);
    expect(Math.abs(coverage.total - 0.5)).toBeLessThanOrEqual(0.005);
    expect(coverage.k).toBeCloseTo(0.5, 3);
    expect(coverage.c + coverage.m + coverage.y).toBe(0);
  });

  it('counts a solid red as full magenta plus full yellow (200 %), white as none, half-transparent black as half', async () => {
    const red = Buffer.from([255, 0, 0, 255]),
      white = Buffer.from([255, 255, 255, 255]),
      faint = Buffer.from([0, 0, 0, 128]);
    expect(inkCoverage(red, 1)).toEqual({ c: 0, m: 1, y: 1, k: 0, total: 2 });
    expect(inkCoverage(white, 1).total).toBe(0);
    expect(inkCoverage(faint, 1).k).toBeCloseTo(128 / 255, 6);
  });
});

describe('cost', () => {
  it('of a sheet from a 100-sheet pack at 18.00 is 0.18 (common practice price level, TRADE.md)', () => {
    expect(costPerSheet(18, 100)).toBeCloseTo(0.18, 10);
  });

  it('of a fully covered page is the cartridge price over its rated yield at 5 % coverage (ISO/IEC 24711, from memory)', () => {
    expect(fullCoverageCost(30, 300)).toBeCloseTo(2, 10);
  });

  it('reproduces the worked example in README.md', () => {
    // README "What a sheet costs": 6.75 × 9.25 in print area on Letter, 24 % coverage, 20 stickers,
    // 3 m of cut, a 9.00 blade replaced at 600 m, a 5 % waste allowance, 6 minutes at 18.00 an hour, 150 % markup.
    const printAreaShare = (inchToMm(6.75) * inchToMm(9.25)) / (inchToMm(8.5) * inchToMm(11));
    const cost = sheetCost({
      stockPerSheet: costPerSheet(18, 100),
      coverage: 0.24,
      printAreaShare,
      inkFullPage: fullCoverageCost(30, 300),
      cutLengthMm: 3000,
      bladePrice: 9,
      bladeLifeM: 600,
      labourMinutes: 6,
      labourRatePerHour: 18,
      pieces: 20,
      markupPercent: 150,
      wastePercent: 5,
    });
    expect(printAreaShare).toBeCloseTo(0.6678, 4);
    expect(cost.stock.toFixed(2)).toBe('0.18');
    expect(cost.ink.toFixed(4)).toBe('0.3205');
    expect(cost.blade.toFixed(3)).toBe('0.045');
    expect(cost.waste.toFixed(4)).toBe('0.0273'); // materials only: labour carries no waste
    expect(cost.labour.toFixed(2)).toBe('1.80');
    expect(cost.sheet.toFixed(2)).toBe('2.37');
    expect(cost.perSticker!.toFixed(3)).toBe('0.119');
    expect(cost.suggestedSheet.toFixed(2)).toBe('5.93');
    expect(cost.suggestedSticker!.toFixed(2)).toBe('0.30');
  });

  it('has no per-sticker figure for an empty sheet and no blade share without a blade life', () => {
    const cost = sheetCost({
      stockPerSheet: 0.2,
      coverage: 0,
      printAreaShare: 1,
      inkFullPage: 1,
      cutLengthMm: 1000,
      bladePrice: 10,
      bladeLifeM: 0,
      labourMinutes: 0,
      labourRatePerHour: 0,
      pieces: 0,
      markupPercent: 100,
      wastePercent: 0,
    });
    expect(cost.perSticker).toBeNull();
    expect(cost.blade).toBe(0);
    expect(cost.suggestedSheet).toBeCloseTo(0.4, 10);
  });
});
