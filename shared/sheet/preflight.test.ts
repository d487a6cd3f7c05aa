import { describe, expect, it } from 'vitest';
import type { Ring } from '../geometry/polygon';
import { inchToMm } from '../units';
import type { Piece, SheetDocument } from './document';
import { emptyDocument } from './document';
import type { PreflightInput, PreflightOutline } from './preflight';
import { DEFAULT_PREFLIGHT_LIMITS, countBySeverity, preflight } from './preflight';

const piece = (id: string, x: number, y: number, extra: Partial<Piece> = {}): Piece => ({
  id,
  artId: id,
  x,
  y,
  rotation: 0,
  width: 14,
  border: 3,
  borderColour: '#ffffff',
  locked: false,
  ...extra,
});
const circle = (r: number, extra: Partial<PreflightOutline> = {}): PreflightOutline => ({
  points: Array.from({ length: 720 }, (_, i) => ({
    x: r + r * Math.cos((2 * Math.PI * i) / 720),
    y: r + r * Math.sin((2 * Math.PI * i) / 720),
  })) as Ring,
  widthMm: 2 * r,
  heightMm: 2 * r,
  effectiveDpi: 600,
  narrowNecks: 0,
  ...extra,
});
// Common practice values: 6.75 × 9.25 in print area, 1/8 in gap and margin (TRADE.md).
const doc = (pieces: Piece[]): SheetDocument => ({
  ...emptyDocument({ areaWidthMm: inchToMm(6.75), areaHeightMm: inchToMm(9.25), safeMarginMm: 3.175, minGapMm: 3.175 }),
  pieces,
});
const run = (pieces: Piece[], outlines: Record<string, PreflightOutline>, extra: Partial<PreflightInput> = {}) =>
  preflight({
    doc: doc(pieces),
    outlines: new Map(Object.entries(outlines)),
    unit: 'mm',
    limits: DEFAULT_PREFLIGHT_LIMITS,
    forSale: false,
    licenceOf: () => null,
    name: (p) => `Art ${p.id}`,
    ...extra,
  });

describe('preflight', () => {
  it('passes a well-spaced sheet with nothing to say', () => {
    expect(run([piece('a', 30, 30), piece('b', 60, 30)], { a: circle(10), b: circle(10) })).toEqual([]);
  });

  it('measures gaps on the real cut lines: circles 22 mm apart centre to centre with r = 10 are 2 mm apart', () => {
    const findings = run([piece('a', 30, 30), piece('b', 52, 30)], { a: circle(10), b: circle(10) });
    expect(findings).toHaveLength(1);
    // 2 mm is above the 1/16 in (1.59 mm) hard floor (common practice): a warning, not an error.
    expect(findings[0]).toMatchObject({ code: 'too-close', severity: 'warning', pieceIds: ['a', 'b'], distanceMm: expect.closeTo(2, 2) });
    expect(findings[0].message).toBe('Art a and Art b are 2 mm apart; the cutter needs 3.2 mm.');
    expect(run([piece('a', 30, 30), piece('b', 51, 30)], { a: circle(10), b: circle(10) })[0]).toMatchObject({
      code: 'too-close',
      severity: 'error',
    });
    expect(run([piece('a', 30, 30), piece('b', 45, 30)], { a: circle(10), b: circle(10) })[0]).toMatchObject({
      code: 'overlap',
      severity: 'error',
    });
  });

  it('flags pieces past the print area (error) and inside the safe margin (warning)', () => {
    const f = run([piece('a', 5, 40), piece('b', 12, 80)], { a: circle(10), b: circle(10) });
    expect(f.map((x) => [x.code, x.severity, x.pieceIds[0]])).toEqual([
      ['outside-print-area', 'error', 'a'],
      ['outside-safe-margin', 'warning', 'b'],
    ]);
  });

  it('flags stickers under the smallest practical size, 0.5 in by default (common practice)', () => {
    const f = run([piece('a', 30, 30)], { a: circle(6) });
    expect(f).toMatchObject([{ code: 'too-small', severity: 'warning' }]);
    expect(f[0].message).toContain('12.7 mm smallest practical sticker');
    expect(run([piece('a', 30, 30)], { a: circle(6.5) })).toEqual([]);
    expect(
      run([piece('a', 30, 30)], { a: circle(10) }, { limits: { smallestStickerMm: 25, minFeatureMm: 1, bridgeWidthMm: 3 } }),
    ).toMatchObject([{ code: 'too-small' }]);
  });

  it('grades resolution: under 300 DPI a notice, under 150 DPI a warning (common practice)', () => {
    expect(run([piece('a', 30, 30)], { a: circle(10, { effectiveDpi: 299 }) })).toMatchObject([
      { code: 'low-resolution', severity: 'notice', dpi: 299 },
    ]);
    expect(run([piece('a', 30, 30)], { a: circle(10, { effectiveDpi: 149 }) })).toMatchObject([
      { code: 'low-resolution', severity: 'warning' },
    ]);
    expect(run([piece('a', 30, 30)], { a: circle(10, { effectiveDpi: 300 }) })).toEqual([]);
  });

  it('passes on the outline engine’s narrow necks', () => {
    expect(run([piece('a', 30, 30)], { a: circle(10, { narrowNecks: 2 }) })).toMatchObject([
      { code: 'narrow-neck', severity: 'warning', message: expect.stringContaining('in 2 places') },
    ]);
  });

  it('refuses personal-use art on a sheet for sale, and only then', () => {
    const licenceOf = (p: Piece) => (p.id === 'a' ? 'personal' : 'commercial');
    const pieces = [piece('a', 30, 30), piece('b', 60, 30)];
    const outlines = { a: circle(10), b: circle(10) };
    expect(run(pieces, outlines, { licenceOf, forSale: true })).toMatchObject([
      { code: 'personal-licence', severity: 'error', pieceIds: ['a'] },
    ]);
    expect(run(pieces, outlines, { licenceOf, forSale: false })).toEqual([]);
  });

  it('asks for bleed with a coloured border: in the editor, and in an export without bleed, but not with it', () => {
    const pieces = [piece('a', 30, 30, { borderColour: '#ff88aa' })];
    expect(run(pieces, { a: circle(10) })).toMatchObject([
      { code: 'border-without-bleed', message: expect.stringContaining('export with a bleed') },
    ]);
    expect(run(pieces, { a: circle(10) }, { bleedMm: 0 })).toMatchObject([
      { code: 'border-without-bleed', message: expect.stringContaining('export has no bleed') },
    ]);
    expect(run(pieces, { a: circle(10) }, { bleedMm: 1 })).toEqual([]);
  });

  it('sorts errors first and counts by severity; speaks inches on an inch sheet', () => {
    const f = run(
      [piece('a', 30, 30), piece('b', 52, 30), piece('c', 5, 120)],
      { a: circle(10, { effectiveDpi: 200 }), b: circle(10), c: circle(10) },
      { unit: 'in' },
    );
    expect(f.map((x) => x.severity)).toEqual(['error', 'warning', 'notice']);
    expect(countBySeverity(f)).toEqual({ error: 1, warning: 1, notice: 1 });
    expect(f[1].message).toContain('0.079 in apart; the cutter needs 0.125 in');
  });
});

describe('preflight at a gap of 0', () => {
  // Squares 20 mm wide; with a gap of 0 they may touch (one cut serves both) but never cross.
  const square = (): PreflightOutline => ({
    points: [
      { x: 0, y: 0 },
      { x: 20, y: 0 },
      { x: 20, y: 20 },
      { x: 0, y: 20 },
    ],
    widthMm: 20,
    heightMm: 20,
    effectiveDpi: 600,
    narrowNecks: 0,
  });
  const atGap0 = (pieces: Piece[]) =>
    preflight({
      doc: { ...doc(pieces), minGap: 0 },
      outlines: new Map(pieces.map((p) => [p.id, square()])),
      unit: 'mm',
      limits: DEFAULT_PREFLIGHT_LIMITS,
      forSale: false,
      licenceOf: () => null,
      name: (p) => `Art ${p.id}`,
    }).filter((f) => f.code === 'overlap' || f.code === 'too-close');

  it('finds two pieces that cross (a distance test alone never could at 0)', () => {
    expect(atGap0([piece('a', 40, 40), piece('b', 55, 40)])).toMatchObject([{ code: 'overlap', severity: 'error', pieceIds: ['a', 'b'] }]);
    // One exactly on top of the other: no edge crosses, the whole area is shared.
    expect(atGap0([piece('a', 40, 40), piece('b', 40, 40)])).toMatchObject([{ code: 'overlap' }]);
  });

  it('lets two pieces touch along an edge, and says nothing of pieces apart', () => {
    expect(atGap0([piece('a', 40, 40), piece('b', 60, 40)])).toEqual([]);
    expect(atGap0([piece('a', 40, 40), piece('b', 61, 40)])).toEqual([]);
  });
});
