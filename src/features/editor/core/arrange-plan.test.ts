import { describe, expect, it } from 'vitest';
import { arrange } from '@shared/arrange/nester';
import { applyDiff } from '@shared/sheet/commands';
import type { Piece, SheetDocument } from '@shared/sheet/document';
import type { PieceOutline } from '@shared/sheet/placement';
import { arrangeCommand, arrangeGroups, defaultTurning, furtherSheets, parseQuantity, planArrange } from './arrange-plan';

// A 171.45 × 234.95 mm print area (common practice on Letter), 3.175 mm gap and margin.
const doc = (pieces: Piece[]): SheetDocument => ({
  schemaVersion: 1,
  printArea: { width: 171.45, height: 234.95 },
  safeMargin: 3.175,
  minGap: 3.175,
  pieces,
});
const piece = (id: string, artId: string, extra: Partial<Piece> = {}): Piece => ({
  id,
  artId,
  x: 80,
  y: 100,
  rotation: 0,
  width: 40,
  border: 2,
  borderColour: '#ffffff',
  locked: false,
  ...extra,
});
const square = (side: number): { outline: PieceOutline } => ({
  outline: {
    points: [
      { x: 0, y: 0 },
      { x: side, y: 0 },
      { x: side, y: side },
      { x: 0, y: side },
    ],
    widthMm: side,
    heightMm: side,
  },
});

describe('arrange plan: quantities per art over the fewest sheets', () => {
  const ghost = piece('g1', '1'),
    pumpkin = piece('p1', '2', { width: 30 });
  const d = doc([ghost, pumpkin]);
  const outlines = new Map([
    ['g1', square(44)],
    ['p1', square(34)],
  ]);
  const names = (id: string) => (id === '1' ? 'Ghost' : 'Pumpkin');

  it('lays out 40 ghosts and 25 pumpkins on as many sheets as they need, this one first', () => {
    const groups = arrangeGroups(d, new Set(), 'sheet');
    const [ghostKey, pumpkinKey] = [...groups.keys()];
    const plan = planArrange(
      d,
      new Set(),
      outlines,
      { scope: 'sheet', rotate: 'none', fill: false, seconds: 0.3, seed: 1, quantities: { [ghostKey]: 40, [pumpkinKey]: 25 } },
      names,
    );
    expect(plan.items.map((i) => [i.name, i.count])).toEqual([
      ['Ghost', 40],
      ['Pumpkin', 25],
    ]);
    const result = arrange(plan.items, plan.options, plan.locked);
    expect(result.placed).toBe(65);
    // A 47.175 mm pitch (44 + gap) fits 3 × 4 ghosts on one sheet: 40 ghosts alone need 4 sheets'
    // worth of ghost rows; with the pumpkins the lower bound by area is ⌈65 pieces' area / sheet⌉.
    const perSheetArea = (171.45 - 2 * 3.175 + 3.175) * (234.95 - 2 * 3.175 + 3.175);
    const need = Math.ceil((40 * 47.175 ** 2 + 25 * 37.175 ** 2) / perSheetArea);
    expect(result.sheets).toBeGreaterThanOrEqual(need);
    expect(result.sheets).toBeLessThanOrEqual(need + 1);
    const command = arrangeCommand(plan.groups, result);
    const here = applyDiff(d, command.diff);
    const further = furtherSheets(d, plan.groups, result);
    expect(further).toHaveLength(result.sheets - 1);
    // Every sticker asked for is on exactly one sheet, and this sheet keeps its two pieces' ids.
    const all = [here, ...further].flatMap((s) => s.pieces);
    expect(all.filter((p) => p.artId === '1')).toHaveLength(40);
    expect(all.filter((p) => p.artId === '2')).toHaveLength(25);
    expect(here.pieces.map((p) => p.id)).toEqual(expect.arrayContaining(['g1', 'p1']));
    expect(new Set(all.map((p) => p.id)).size).toBe(65);
  });

  it('a smaller quantity takes the extra copies off this sheet', () => {
    const three = doc([piece('a', '1'), piece('b', '1'), piece('c', '1')]);
    const groups = arrangeGroups(three, new Set(), 'sheet');
    const [key] = groups.keys();
    const plan = planArrange(three, new Set(), new Map(['a', 'b', 'c'].map((id) => [id, square(44)])), {
      scope: 'sheet',
      rotate: 'none',
      fill: false,
      seconds: 0.1,
      seed: 1,
      quantities: { [key]: 1 },
    });
    const after = applyDiff(three, arrangeCommand(plan.groups, arrange(plan.items, plan.options, plan.locked)).diff);
    expect(after.pieces.map((p) => p.id)).toEqual(['a']);
  });

  it('a piece whose outline has not arrived is left alone', () => {
    const plan = planArrange(d, new Set(), new Map([['g1', square(44)]]), {
      scope: 'sheet',
      rotate: 'none',
      fill: false,
      seconds: 0.1,
      seed: 1,
    });
    const after = applyDiff(d, arrangeCommand(plan.groups, arrange(plan.items, plan.options, plan.locked)).diff);
    expect(after.pieces.find((p) => p.id === 'p1')).toEqual(pumpkin);
  });

  it('refuses a quantity that is not a whole number from 1 to 500, naming the art', () => {
    for (const bad of ['', '0', '-3', '2.5', 'abc', '501'])
      expect(parseQuantity(bad, 'Ghost')).toEqual({ error: 'Ghost: give a whole number of stickers from 1 to 500.' });
    expect(parseQuantity(' 40 ', 'Ghost')).toEqual({ value: 40 });
  });
});

describe('arrange plan: the turning follows how the stickers are sold', () => {
  it('keeps kiss-cut sheets upright and lets die-cut singles turn a quarter', () => {
    expect(defaultTurning([piece('a', '1'), piece('b', '1', { cut: 'die' })])).toBe('none');
    expect(defaultTurning([piece('a', '1', { cut: 'die' }), piece('b', '1', { cut: 'die' })])).toBe('90');
    expect(defaultTurning([])).toBe('none');
  });
});
