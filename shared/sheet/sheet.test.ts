import { describe, expect, it } from 'vitest';
import type { Ring } from '../geometry/polygon';
import { inchToMm, mmToCssPx } from '../units';
import { applyDiff, commands, invertDiff } from './commands';
import type { Piece, SheetDocument } from './document';
import { emptyDocument, sheetDocumentSchema } from './document';
import { History } from './history';
import { cutLineDistance, placeCutLine } from './placement';

const piece = (id: string, x: number, y: number, extra: Partial<Piece> = {}): Piece => ({
  id,
  artId: '1',
  x,
  y,
  rotation: 0,
  width: 40,
  border: 3,
  borderColour: '#ffffff',
  locked: false,
  ...extra,
});
const doc = (): SheetDocument => ({
  ...emptyDocument({ areaWidthMm: inchToMm(6.75), areaHeightMm: inchToMm(9.25), safeMarginMm: 3, minGapMm: 3.175 }),
  pieces: [piece('a', 30, 30), piece('b', 90, 40, { rotation: 15 }), piece('c', 60, 120, { locked: true })],
});
const half = () => ({ w: 23, h: 23 });

describe('canvas scale', () => {
  it('shows 6.75 in at 100 % as 648 CSS px (CSS Values and Units: 1in = 96px)', () => {
    expect(mmToCssPx(inchToMm(6.75), 1)).toBeCloseTo(648, 9);
    expect(mmToCssPx(25.4, 0.5)).toBeCloseTo(48, 9);
  });
});

describe('commands', () => {
  const cases: Array<[string, (d: SheetDocument) => ReturnType<typeof commands.addPieces>]> = [
    ['add', () => commands.addPieces([piece('n', 10, 10)])],
    ['remove', (d) => commands.removePieces(d, ['a', 'b'])],
    ['duplicate', (d) => commands.duplicatePieces(d, ['a'], 5)],
    ['move', (d) => commands.movePieces(d, ['a', 'b'], 1.5, -2)],
    ['place', (d) => commands.placePieces(d, new Map([['a', { x: 5, y: 6, rotation: 45 }]]))],
    ['rotate', (d) => commands.rotatePieces(d, ['a', 'b'], 90)],
    [
      'patch',
      (d) =>
        commands.patchPieces(
          d,
          'Transform',
          new Map([
            ['a', { width: 61, rotation: 12 }],
            ['b', { x: 1 }],
          ]),
        ),
    ],
    ['set rotation', (d) => commands.setRotation(d, ['b'], -30)],
    ['resize', (d) => commands.resizePieces(d, ['a'], 55)],
    ['border', (d) => commands.setBorder(d, ['a'], 1.5)],
    ['border colour', (d) => commands.setBorderColour(d, ['a', 'b'], '#fdebd0')],
    ['lock', (d) => commands.setLocked(d, ['a', 'c'], true)],
    ['align', (d) => commands.align(d, ['a', 'b'], 'left', half)],
    ['distribute', (d) => commands.distribute(d, ['a', 'b', 'c'], 'x', half)],
  ];

  for (const [name, make] of cases) {
    it(`${name}: applying then undoing gives back the same document`, () => {
      const before = doc();
      const command = make(before);
      const after = applyDiff(before, command.diff);
      expect(sheetDocumentSchema.safeParse(after).success).toBe(true);
      const undone = applyDiff(after, invertDiff(command.diff));
      const sorted = (d: SheetDocument) => ({ ...d, pieces: [...d.pieces].sort((x, y) => x.id.localeCompare(y.id)) });
      expect(sorted(undone)).toEqual(sorted(before));
    });
  }

  it('never moves, deletes or rotates a locked piece (but unlocks it)', () => {
    const d = doc();
    expect(commands.movePieces(d, ['c'], 5, 5).diff.updated).toEqual([]);
    expect(commands.removePieces(d, ['c']).diff.removed).toEqual([]);
    expect(commands.setLocked(d, ['c'], false).diff.updated).toHaveLength(1);
  });

  it('undo and redo walk the history; a new change clears redo', () => {
    const history = new History();
    let d = doc();
    const start = d;
    d = history.apply(d, commands.movePieces(d, ['a'], 10, 0));
    d = history.apply(d, commands.rotatePieces(d, ['a'], 90));
    expect(d.pieces.find((p) => p.id === 'a')).toMatchObject({ x: 40, rotation: 90 });
    d = history.undo(d);
    d = history.undo(d);
    expect(d).toEqual(start);
    d = history.redo(d);
    expect(d.pieces.find((p) => p.id === 'a')?.x).toBe(40);
    history.apply(d, commands.resizePieces(d, ['a'], 20));
    expect(history.canRedo).toBe(false);
  });
});

describe('gap between cut lines', () => {
  const circle = (r: number, n = 720) => ({
    points: Array.from({ length: n }, (_, i) => ({
      x: r + r * Math.cos((2 * Math.PI * i) / n),
      y: r + r * Math.sin((2 * Math.PI * i) / n),
    })) as Ring,
    widthMm: 2 * r,
    heightMm: 2 * r,
  });

  it('equals the analytic distance between two circles: |c1 − c2| − r1 − r2', () => {
    // Two circles of radii 10 and 15 mm, centres (20, 30) and (50, 70): 50 − 25 = 25 mm apart.
    const a = placeCutLine({ x: 20, y: 30, rotation: 0 }, circle(10));
    const b = placeCutLine({ x: 50, y: 70, rotation: 33 }, circle(15));
    // A 720-gon lies inside its circle by at most r(1 − cos(π/720)) < 0.0002 mm.
    expect(cutLineDistance(a, b)).toBeCloseTo(25, 3);
    const touching = placeCutLine({ x: 44.9, y: 30, rotation: 0 }, circle(15));
    expect(cutLineDistance(a, touching)).toBe(0);
  });
});

describe('piece names', () => {
  it('are the art name, numbered in sheet order when the art is on the sheet more than once', async () => {
    const { pieceName } = await import('./document');
    const p = (id: string, artId: string) => ({
      id,
      artId,
      x: 0,
      y: 0,
      rotation: 0,
      width: 10,
      border: 1,
      borderColour: '#ffffff',
      locked: false,
    });
    const sheet = { pieces: [p('a', 'ghost'), p('b', 'moon'), p('c', 'ghost')] };
    const names = (artId: string) => ({ ghost: 'Ghost', moon: 'Moon' })[artId];
    expect(['a', 'b', 'c'].map((id) => pieceName(sheet, id, names))).toEqual(['Ghost 1', 'Moon', 'Ghost 2']);
    expect(pieceName(sheet, 'gone', names)).toBe('A piece');
    expect(pieceName({ pieces: [p('x', 'unknown')] }, 'x', names)).toBe('Piece');
  });
});
