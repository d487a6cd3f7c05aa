import { describe, expect, it } from 'vitest';
import type { Piece } from '@shared/sheet/document';
import { emptyDocument } from '@shared/sheet/document';
import { DragGesture } from './drag-gesture';
import { EditorStore } from './editor-store';

const piece = (id: string, x: number, y: number): Piece => ({
  id,
  artId: id,
  x,
  y,
  rotation: 0,
  width: 30,
  border: 3,
  borderColour: '#ffffff',
  locked: false,
});
const meta = { name: 'Drag', status: 'draft' as const, forSale: false, unit: 'mm' as const, notes: '' };
function storeWith(...pieces: Piece[]) {
  const doc = { ...emptyDocument({ areaWidthMm: 171.45, areaHeightMm: 234.95, safeMarginMm: 3.175, minGapMm: 3.175 }), pieces };
  return new EditorStore(doc, meta, 1);
}

describe('a drag gesture', () => {
  it('moves the whole selection with the piece dragged, as one undo step', () => {
    const store = storeWith(piece('a', 40, 40), piece('b', 100, 40), piece('c', 60, 120));
    store.select(['a', 'b']);
    const drag = new DragGesture(store);
    drag.begin('a');
    expect(drag.positions({ x: 50, y: 45 })).toEqual(
      new Map([
        ['a', { x: 50, y: 45 }],
        ['b', { x: 110, y: 45 }],
      ]),
    );
    drag.end({ x: 50, y: 45 });
    const at = (id: string) => store.getState().doc.pieces.find((p) => p.id === id)!;
    expect([at('a').x, at('b').x, at('c').x]).toEqual([50, 110, 60]);
    store.undo();
    expect([at('a').x, at('b').x]).toEqual([40, 100]);
  });

  it('Escape during a drag restores the start: every piece back, nothing recorded', () => {
    const store = storeWith(piece('a', 40, 40), piece('b', 100, 40));
    store.select(['a', 'b']);
    const before = store.getState().doc;
    const drag = new DragGesture(store);
    drag.begin('a');
    drag.positions({ x: 140, y: 200 }); // drawn there for a while
    expect(drag.cancel()).toEqual(
      new Map([
        ['a', { x: 40, y: 40 }],
        ['b', { x: 100, y: 40 }],
      ]),
    );
    expect(drag.active).toBe(false);
    expect(store.getState().doc).toBe(before);
    store.undo(); // nothing to undo: the history never saw the drag
    expect(store.getState().doc).toEqual(before);
  });

  it('stops a piece dropped far off the sheet at the edge of where pieces may sit', () => {
    const store = storeWith(piece('a', 40, 40));
    const drag = new DragGesture(store);
    drag.begin('a');
    drag.end({ x: 5000, y: 40 });
    expect(store.getState().doc.pieces[0].x).toBeCloseTo(2 * 171.45, 6); // one area width outside at most (shared/sheet/bounds.ts)
  });
});
