import { describe, expect, it } from 'vitest';
import { commands } from './commands';
import type { Piece, SheetDocument } from './document';
import { emptyDocument } from './document';
import { History } from './history';

const piece = (id: string, extra: Partial<Piece> = {}): Piece => ({
  id,
  artId: id,
  x: 40,
  y: 40,
  rotation: 0,
  width: 30,
  border: 3,
  borderColour: '#ffffff',
  locked: false,
  ...extra,
});
const sheet = (...pieces: Piece[]): SheetDocument => ({
  ...emptyDocument({ areaWidthMm: 171.45, areaHeightMm: 234.95, safeMarginMm: 3.175, minGapMm: 3.175 }),
  pieces,
});
const get = (doc: SheetDocument, id: string) => doc.pieces.find((p) => p.id === id)!;

describe('undo steps a person expects', () => {
  it('typing "135" into Rotation is one undo step, not three', () => {
    const history = new History();
    let doc = sheet(piece('a', { rotation: 20 }));
    for (const typed of [1, 13, 135]) doc = history.apply(doc, commands.setRotation(doc, ['a'], typed));
    expect(get(doc, 'a').rotation).toBe(135);
    doc = history.undo(doc);
    expect(get(doc, 'a').rotation).toBe(20);
    expect(history.canUndo).toBe(false);
    doc = history.redo(doc);
    expect(get(doc, 'a').rotation).toBe(135);
  });

  it('a mark (the field left) ends the step: the next edit is a step of its own', () => {
    const history = new History();
    let doc = sheet(piece('a'));
    doc = history.apply(doc, commands.setRotation(doc, ['a'], 45));
    history.mark();
    doc = history.apply(doc, commands.setRotation(doc, ['a'], 90));
    doc = history.undo(doc);
    expect(get(doc, 'a').rotation).toBe(45);
    // Other commands never merge, even back to back.
    doc = history.apply(doc, commands.movePieces(doc, ['a'], 1, 0));
    doc = history.apply(doc, commands.movePieces(doc, ['a'], 1, 0));
    doc = history.undo(doc);
    expect(get(doc, 'a').x).toBe(41);
  });

  it('a colour change on a two-piece selection keeps each piece’s own border width; dragging the picker is one step', () => {
    const history = new History();
    let doc = sheet(piece('a', { border: 3, borderColour: '#ffffff' }), piece('b', { border: 5, borderColour: '#fdebd0' }));
    for (let i = 0; i < 20; i++)
      doc = history.apply(doc, commands.setBorderColour(doc, ['a', 'b'], `#00${(i * 12).toString(16).padStart(2, '0')}00`));
    expect(get(doc, 'a')).toMatchObject({ border: 3, borderColour: '#00e400' });
    expect(get(doc, 'b')).toMatchObject({ border: 5, borderColour: '#00e400' });
    doc = history.undo(doc);
    expect(get(doc, 'a').borderColour).toBe('#ffffff');
    expect(get(doc, 'b').borderColour).toBe('#fdebd0');
    expect(history.canUndo).toBe(false);
    // The width alone, likewise, leaves each colour.
    doc = history.apply(doc, commands.setBorder(doc, ['a', 'b'], 2));
    expect([get(doc, 'a').borderColour, get(doc, 'b').borderColour]).toEqual(['#ffffff', '#fdebd0']);
  });

  it('the same field on another selection is another step', () => {
    const history = new History();
    let doc = sheet(piece('a'), piece('b'));
    doc = history.apply(doc, commands.setRotation(doc, ['a'], 30));
    doc = history.apply(doc, commands.setRotation(doc, ['b'], 60));
    doc = history.undo(doc);
    expect([get(doc, 'a').rotation, get(doc, 'b').rotation]).toEqual([30, 0]);
  });
});
