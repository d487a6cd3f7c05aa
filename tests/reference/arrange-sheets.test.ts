// The overlap search on sheets: filling a sheet beyond what the constructive pass found room for,
// and spreading a quantity over fewer sheets. Shapes from the ESICUP benchmark (../shared/nesting/,
// read from there) at sticker size; every layout checked with @flatten-js/core (tests/helpers).
import { describe, expect, it } from 'vitest';
import { arrange } from '@shared/arrange/nester';
import { checkLayout, esicupItems, SHEET_H, SHEET_W } from '../helpers/arrange-check';

const sheet = { width: SHEET_W, height: SHEET_H, gap: 3.175, margin: 3.175, rotate: '90' as const, timeMs: 60_000, seed: 1 };

describe('arrange on sheets with the overlap search', () => {
  it('fills the sheet with more pieces than the constructive pass and its sequence search found room for', () => {
    const items = esicupItems('shapes0', { medianSide: 44.45 }).map((i) => ({ ...i, count: 1, rotate: undefined }));
    // The same sequence search with the overlap search left out.
    const sequenceOnly = arrange(items, { ...sheet, fill: true, maxIterations: 40, overlap: false });
    const searched = arrange(items, { ...sheet, fill: true, maxIterations: 40 });
    checkLayout(items, searched, { gap: sheet.gap, margin: sheet.margin });
    expect(searched.placed).toBeGreaterThan(sequenceOnly.placed);
    // Every art keeps its place in the mix.
    for (const i of items) expect(searched.placements.filter((p) => p.key === i.key).length).toBeGreaterThanOrEqual(2);
  }, 120_000);

  it('keeps trying art that failed to fit while tries are left: 42 pieces from 120 tries, where giving up after two failures each stopped at 40', () => {
    const items = esicupItems('shapes0', { medianSide: 44.45 }).map((i) => ({ ...i, count: 1, rotate: undefined }));
    const filled = arrange(items, { ...sheet, seed: 3, fill: true, maxIterations: 120 });
    checkLayout(items, filled, { gap: sheet.gap, margin: sheet.margin });
    expect(filled.placed).toBeGreaterThan(40);
  }, 120_000);

  it('empties the last sheet into the first when the separator can make room: 34 pieces on one sheet, not two', () => {
    const counts = [9, 9, 8, 8];
    const items = esicupItems('shapes0', { medianSide: 44.45 }).map((i, n) => ({ ...i, count: counts[n], rotate: undefined }));
    const constructive = arrange(items, { ...sheet, maxIterations: 1 });
    expect(constructive.sheets).toBe(2);
    expect(arrange(items, { ...sheet, maxIterations: 30, overlap: false }).sheets).toBe(2);
    const searched = arrange(items, { ...sheet, maxIterations: 30 });
    expect(searched.placed).toBe(34);
    expect(searched.sheets).toBe(1);
    checkLayout(items, searched, { gap: sheet.gap, margin: sheet.margin });
  }, 120_000);
});

describe('spreading a quantity over the fewest sheets', () => {
  it('tries again to empty the last sheet when a try fails and time is left: 35 pieces on one sheet (seed 2), where one try left two', () => {
    const counts = [9, 9, 9, 8];
    const items = esicupItems('shapes0', { medianSide: 44.45 }).map((i, n) => ({ ...i, count: counts[n], rotate: undefined }));
    const searched = arrange(items, { ...sheet, seed: 2, maxIterations: 30 });
    expect(searched.placed).toBe(35);
    expect(searched.sheets).toBe(1);
    checkLayout(items, searched, { gap: sheet.gap, margin: sheet.margin });
  }, 120_000);
});
